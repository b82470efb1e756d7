package readers

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"math/rand"
	"os"
	"path/filepath"
	"runtime"
	"runtime/metrics"
	"strconv"
	"sync"
	"testing"
	"time"

	"github.com/klauspost/compress/gzip"
	"github.com/klauspost/compress/zstd"

	"farforce/field"
	"farforce/field/fieldtest"
)

// benchFiles caches the synthetic benchmark inputs, written once per
// process to a temporary directory.
var (
	benchMu    sync.Mutex
	benchDir   string
	benchPaths = map[string]string{}
)

// benchZone returns a hexahedral or tetrahedral box of about cells cells
// with a point vector "velocity", a point scalar "pressure" and a cell
// scalar "nut", with values from a fixed-seed generator.
func benchZone(kind string, cells int) *field.Zone {
	var z *field.Zone
	if kind == "hex" {
		n := int(math.Round(math.Cbrt(float64(cells))))
		z = fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{n, n, n})
	} else {
		n := int(math.Round(math.Cbrt(float64(cells) / 6)))
		z = fieldtest.BoxTet([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{n, n, n})
	}
	rng := rand.New(rand.NewSource(1))
	v := make([]float64, 3*z.NumPoints())
	p := make([]float64, z.NumPoints())
	nut := make([]float64, z.NumCells())
	for i := range v {
		v[i] = rng.NormFloat64()
	}
	for i := range p {
		p[i] = rng.NormFloat64() * 1e5
	}
	for i := range nut {
		nut[i] = rng.Float64() * 1e-3
	}
	z.Arrays = []field.Array{
		{Name: "velocity", Location: field.AtPoints, Components: 3, Data: v},
		{Name: "pressure", Location: field.AtPoints, Components: 1, Data: p},
		{Name: "nut", Location: field.AtCells, Components: 1, Data: nut},
	}
	return z
}

// benchFile writes (once) and returns the path of a benchmark input.
func benchFile(b *testing.B, kind string, cells int, binary bool) string {
	key := fmt.Sprintf("%s-%d-%v", kind, cells, binary)
	benchMu.Lock()
	defer benchMu.Unlock()
	if p, ok := benchPaths[key]; ok {
		return p
	}
	if benchDir == "" {
		d, err := os.MkdirTemp("", "farforce-vtk-bench")
		if err != nil {
			b.Fatal(err)
		}
		benchDir = d
	}
	z := benchZone(kind, cells)
	var buf bytes.Buffer
	if err := WriteVTK(&buf, z, WriteOptions{Binary: binary, Version: "4.2", Title: "benchmark"}); err != nil {
		b.Fatal(err)
	}
	p := filepath.Join(benchDir, key+".vtk")
	if err := os.WriteFile(p, buf.Bytes(), 0o644); err != nil {
		b.Fatal(err)
	}
	benchPaths[key] = p
	return p
}

// TestMain removes the benchmark inputs.
func TestMain(m *testing.M) {
	code := m.Run()
	if benchDir != "" {
		os.RemoveAll(benchDir)
	}
	os.Exit(code)
}

// peakHeap samples the live heap every few milliseconds until stop is
// closed and returns the largest value seen.
func peakHeap(stop <-chan struct{}) <-chan uint64 {
	out := make(chan uint64, 1)
	go func() {
		s := []metrics.Sample{{Name: "/memory/classes/heap/objects:bytes"}}
		var peak uint64
		t := time.NewTicker(2 * time.Millisecond)
		defer t.Stop()
		for {
			metrics.Read(s)
			if v := s[0].Value.Uint64(); v > peak {
				peak = v
			}
			select {
			case <-stop:
				out <- peak
				return
			case <-t.C:
			}
		}
	}()
	return out
}

// benchRead measures ReadFile on one synthetic input.
func benchRead(b *testing.B, kind string, cells int, binary bool, workers int) {
	p := benchFile(b, kind, cells, binary)
	st, err := os.Stat(p)
	if err != nil {
		b.Fatal(err)
	}
	b.SetBytes(st.Size())
	benchLoop(b, p, Options{Workers: workers})
	b.ReportMetric(float64(st.Size())/(1<<20), "file-MB")
}

// benchLoop reads path b.N times and reports CPU time, cells per second,
// the peak live heap and alloc/kept: the bytes allocated per read over the
// bytes of the arrays the zone keeps (1 would be a read that allocates
// nothing but its result).
func benchLoop(b *testing.B, path string, opt Options) {
	runtime.GC()
	b.ReportAllocs()
	stop := make(chan struct{})
	peak := peakHeap(stop)
	cpu0 := fieldtest.ProcessCPU()
	alloc0 := heapAllocs()
	b.ResetTimer()
	var nc int
	var kept int64
	for i := 0; i < b.N; i++ {
		f, err := ReadFile(path, opt)
		if err != nil {
			b.Fatal(err)
		}
		nc, kept = f.NumCells(), keptBytes(f)
	}
	b.StopTimer()
	alloc := heapAllocs() - alloc0
	close(stop)
	// CPU time of the process per read: on a shared machine wall time
	// depends on other load, CPU time much less.
	b.ReportMetric((fieldtest.ProcessCPU()-cpu0).Seconds()*1000/float64(b.N), "cpu-ms/op")
	b.ReportMetric(float64(nc)*float64(b.N)/b.Elapsed().Seconds(), "cells/s")
	b.ReportMetric(float64(<-peak)/(1<<20), "peak-heap-MB")
	b.ReportMetric(float64(kept)/(1<<20), "kept-MB")
	b.ReportMetric(float64(alloc)/float64(b.N)/float64(kept), "alloc/kept")
}

// heapAllocs returns the bytes allocated on the heap since the process
// started (runtime/metrics /gc/heap/allocs:bytes).
func heapAllocs() uint64 {
	s := []metrics.Sample{{Name: "/gc/heap/allocs:bytes"}}
	metrics.Read(s)
	return s[0].Value.Uint64()
}

// keptBytes returns the bytes of the slices a field keeps: points, cell
// types, offsets, connectivity, arrays and blank mask, counted by length.
func keptBytes(f *field.Field) int64 {
	var n int64
	for _, z := range f.Zones {
		n += 8*int64(len(z.Points)) + int64(len(z.Types)) + 4*int64(len(z.Offsets)+len(z.Conn)) + int64(len(z.Blank))
		for _, a := range z.Arrays {
			n += 8 * int64(len(a.Data))
		}
	}
	return n
}

// benchBaseline measures os.ReadFile on the same input: the cost of
// merely getting the bytes into memory.
func benchBaseline(b *testing.B, kind string, cells int, binary bool) {
	p := benchFile(b, kind, cells, binary)
	st, err := os.Stat(p)
	if err != nil {
		b.Fatal(err)
	}
	b.SetBytes(st.Size())
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := os.ReadFile(p); err != nil {
			b.Fatal(err)
		}
	}
}

// bigSizes are the mesh sizes benchmarked: 1M cells, plus 5M when
// FARFORCE_BIG=1 and not -short.
func bigSizes() []int {
	s := []int{1_000_000}
	if os.Getenv("FARFORCE_BIG") == "1" && !testing.Short() {
		s = append(s, 5_000_000)
	}
	return s
}

func BenchmarkReadVTK(b *testing.B) {
	for _, n := range bigSizes() {
		for _, kind := range []string{"hex", "tet"} {
			for _, bin := range []bool{true, false} {
				format := "ascii"
				if bin {
					format = "binary"
				}
				name := fmt.Sprintf("%s/%s/%dk", format, kind, n/1000)
				b.Run(name+"/baseline-os.ReadFile", func(b *testing.B) { benchBaseline(b, kind, n, bin) })
				b.Run(name+"/read", func(b *testing.B) { benchRead(b, kind, n, bin, 0) })
				b.Run(name+"/read-1worker", func(b *testing.B) { benchRead(b, kind, n, bin, 1) })
			}
		}
	}
}

// BenchmarkParseNumber compares the ASCII number parser with
// strconv.ParseFloat on typical tokens.
func BenchmarkParseNumber(b *testing.B) {
	toks := [][]byte{[]byte("0.12345678"), []byte("-1.5e-05"), []byte("123456"), []byte("0.16864630957366789"), []byte("-4.115132267498709e-06")}
	b.Run("parseNumber", func(b *testing.B) {
		b.ReportAllocs()
		for i := 0; i < b.N; i++ {
			for _, t := range toks {
				parseNumber(t, false)
			}
		}
	})
	b.Run("strconv", func(b *testing.B) {
		b.ReportAllocs()
		for i := 0; i < b.N; i++ {
			for _, t := range toks {
				strconvParse(t)
			}
		}
	})
}

func strconvParse(t []byte) {
	_, _ = strconv.ParseFloat(string(t), 64)
}

// BenchmarkReadCompressed reads gzip and zstd copies of the 1M-cell
// binary and ASCII hexahedral inputs (throughput in decompressed bytes);
// the decompressor runs ahead of the parser in its own goroutine. "zstd"
// records the content size in the frame header, as the zstd command does
// for a file; "zstd-stream" does not, as when it compresses a pipe, so the
// reader has no size hint and arrays grow as data arrives.
func BenchmarkReadCompressed(b *testing.B) {
	for _, bin := range []bool{true, false} {
		format := "ascii"
		if bin {
			format = "binary"
		}
		plain := benchFile(b, "hex", 1_000_000, bin)
		for _, c := range []string{"gzip", "zstd", "zstd-stream"} {
			b.Run(format+"/"+c, func(b *testing.B) {
				p, raw, size := benchCompressed(b, plain, c)
				b.SetBytes(raw)
				benchLoop(b, p, Options{})
				b.ReportMetric(float64(size)/(1<<20), "compressed-MB")
			})
		}
	}
}

// benchCompressed writes (once) the gzip or zstd copy of the file plain
// and returns its path, the plain size and the compressed size. The plain
// bytes are not kept, so that the peak heap is the read's.
func benchCompressed(b *testing.B, plain, c string) (string, int64, int64) {
	key := plain + "." + c
	benchMu.Lock()
	defer benchMu.Unlock()
	p, ok := benchPaths[key]
	if !ok {
		raw, err := os.ReadFile(plain)
		if err != nil {
			b.Fatal(err)
		}
		var buf bytes.Buffer
		var w io.WriteCloser
		switch c {
		case "gzip":
			w = gzip.NewWriter(&buf)
		case "zstd":
			e, _ := zstd.NewWriter(nil)
			e.ResetContentSize(&buf, int64(len(raw)))
			w = e
		default:
			w, _ = zstd.NewWriter(&buf)
		}
		if _, err := w.Write(raw); err != nil {
			b.Fatal(err)
		}
		if err := w.Close(); err != nil {
			b.Fatal(err)
		}
		p = key
		if err := os.WriteFile(p, buf.Bytes(), 0o644); err != nil {
			b.Fatal(err)
		}
		benchPaths[key] = p
	}
	st, err := os.Stat(p)
	if err != nil {
		b.Fatal(err)
	}
	pst, err := os.Stat(plain)
	if err != nil {
		b.Fatal(err)
	}
	return p, pst.Size(), st.Size()
}
