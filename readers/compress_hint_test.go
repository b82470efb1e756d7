package readers

import (
	"bytes"
	"encoding/binary"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"runtime"
	"testing"

	"github.com/klauspost/compress/gzip"
	"github.com/klauspost/compress/zstd"

	"farforce/field"
	"farforce/field/fieldtest"
)

// TestStepCapBounds checks the two promises of stepCap on growth sequences
// with chunks of 1 to 2^20 values: every array given up on the way sums
// with the final one to at most total·8/7 + minGrow (the geometric series
// total·(1 + 1/8 + 1/64 + ...) plus the first minGrow-value step), and no
// step exceeds 8 times the values it must hold (or 8·minGrow).
func TestStepCapBounds(t *testing.T) {
	for _, total := range []int{0, 1, 100, minGrow - 1, minGrow, minGrow + 1, 8*minGrow + 1, 1_000_000, 12_345_678, 64 << 20} {
		for _, chunk := range []int{1, 1000, 4093, 1 << 20} {
			if total/chunk > 1<<16 {
				continue // too many steps to simulate; other chunks cover it
			}
			c := min(total, minGrow)
			alloc := c
			for got := 0; got < total; {
				need := min(got+chunk, total)
				if need > c {
					nc := stepCap(need, total)
					if nc < need || nc > total {
						t.Fatalf("total %d: stepCap(%d) = %d outside [need, total]", total, need, nc)
					}
					if nc > 8*max(need, minGrow) {
						t.Errorf("total %d: stepCap(%d) = %d, more than 8 times the values", total, need, nc)
					}
					c = nc
					alloc += nc
				}
				got = need
			}
			if c != total {
				t.Errorf("total %d chunk %d: ends at capacity %d", total, chunk, c)
			}
			if alloc > total+total/7+minGrow {
				t.Errorf("total %d chunk %d: allocated %d values, more than total·8/7 + minGrow", total, chunk, alloc)
			}
		}
	}
}

// TestReadFloatsAllocation measures what reading one block of n float32
// values allocates besides the scanner's buffer: exactly the 8n-byte
// result when the stream size is known or a size hint covers the block,
// and at most 8/7 of it (plus the minGrow first step) when the block grows
// as data arrives (no hint, or a hint the stream outgrows). Doubling, the
// former growth, allocated about twice the result.
func TestReadFloatsAllocation(t *testing.T) {
	const n = 1_500_000
	data := make([]byte, 4*n)
	for i := range n {
		binary.BigEndian.PutUint32(data[4*i:], math.Float32bits(float32(i)/7))
	}
	exact := uint64(8 * n)
	grown := exact + exact/7 + 8*minGrow
	for _, c := range []struct {
		name       string
		size, hint int64
		limit      uint64
	}{
		{"sized", int64(len(data)), -1, exact + 64<<10},
		{"hint-covers", -1, int64(len(data)), exact + 64<<10},
		{"hint-short", -1, int64(len(data) / 2), grown},
		{"no-hint", -1, -1, grown},
	} {
		t.Run(c.name, func(t *testing.T) {
			s := newScanner(struct{ io.Reader }{bytes.NewReader(data)}, "block", c.size, Options{Workers: 1})
			s.hint = c.hint
			s.buf = make([]byte, s.maxBuf) // the buffer is not the block's cost
			var m0, m1 runtime.MemStats
			runtime.GC()
			runtime.ReadMemStats(&m0)
			d, err := s.readFloats(n, dtypes["float"], "POINTS", "coordinates")
			runtime.ReadMemStats(&m1)
			if err != nil {
				t.Fatal(err)
			}
			if a := m1.TotalAlloc - m0.TotalAlloc; a > c.limit {
				t.Errorf("allocated %d bytes for %d bytes of values, limit %d", a, exact, c.limit)
			}
			for i, x := range d {
				if x != float64(float32(i)/7) {
					t.Fatalf("value %d = %v, want %v", i, x, float32(i)/7)
				}
			}
			if len(d) != n {
				t.Errorf("%d values, want %d", len(d), n)
			}
		})
	}
}

// TestSizeHint checks the hint against what the containers record: the
// gzip ISIZE (RFC 1952 §2.3.1) and the zstd Frame_Content_Size (RFC 8878
// §3.1.1.1.4) written by klauspost/compress, the caps (Options.MaxBytes
// and 1032 bytes per compressed byte) and the cases without a hint.
func TestSizeHint(t *testing.T) {
	// 300 KB of numbers: more than one 128 KiB zstd block, so that the
	// streaming encoder leaves the content size out unless told it, and
	// compressible far less than 1032 times.
	var text bytes.Buffer
	x := uint32(1)
	for text.Len() < 300_000 {
		x = x*1664525 + 1013904223 // Numerical Recipes LCG (Press et al. 1992, §7.1)
		fmt.Fprintf(&text, "%d.%03d\n", x>>20, x%1000)
	}
	raw := text.Bytes()
	gz := gzipBytes(t, raw, 1)
	zs := zstdBytes(t, raw, 1, true)
	n := int64(len(raw))
	for _, c := range []struct {
		name string
		r    io.Reader
		comp []byte
		gzip bool
		max  int64
		want int64
	}{
		{"gzip", bytes.NewReader(gz), gz, true, 1 << 30, n},
		{"gzip-max", bytes.NewReader(gz), gz, true, 1000, 1000},
		{"gzip-stream", struct{ io.Reader }{bytes.NewReader(gz)}, gz, true, 1 << 30, -1},
		{"zstd", bytes.NewReader(zs), zs, false, 1 << 30, n},
		{"zstd-max", bytes.NewReader(zs), zs, false, 1000, 1000},
		{"zstd-no-size", bytes.NewReader(zstdBytes(t, raw, 1, false)), zstdBytes(t, raw, 1, false), false, 1 << 30, -1},
	} {
		size := int64(-1)
		if _, ok := c.r.(*bytes.Reader); ok {
			size = int64(len(c.comp))
		}
		head := c.comp[:min(len(c.comp), zstd.HeaderMaxSize)]
		if got := sizeHint(c.r, head, size, c.gzip, c.max); got != c.want {
			t.Errorf("%s: hint %d, want %d", c.name, got, c.want)
		}
	}
	// A claim beyond 1032 bytes per compressed byte is cut to that.
	lie := append([]byte(nil), gz...)
	binary.LittleEndian.PutUint32(lie[len(lie)-4:], math.MaxUint32)
	if got, want := sizeHint(bytes.NewReader(lie), lie[:10], int64(len(lie)), true, 1<<40), int64(len(lie))*maxInflate; got != want {
		t.Errorf("lying ISIZE: hint %d, want %d", got, want)
	}
}

// gzipBytes compresses raw as members gzip members (cut at equal
// lengths), as concatenating gzip files (or bgzip) does.
func gzipBytes(t *testing.T, raw []byte, members int) []byte {
	var out bytes.Buffer
	for i := range members {
		w := gzip.NewWriter(&out)
		if _, err := w.Write(raw[len(raw)*i/members : len(raw)*(i+1)/members]); err != nil {
			t.Fatal(err)
		}
		if err := w.Close(); err != nil {
			t.Fatal(err)
		}
	}
	return out.Bytes()
}

// zstdBytes compresses raw as frames zstd frames, with the content size
// in each frame header (withSize, as the zstd command writes files) or
// without (as it writes a pipe).
func zstdBytes(t *testing.T, raw []byte, frames int, withSize bool) []byte {
	var out bytes.Buffer
	for i := range frames {
		part := raw[len(raw)*i/frames : len(raw)*(i+1)/frames]
		e, err := zstd.NewWriter(nil)
		if err != nil {
			t.Fatal(err)
		}
		if withSize {
			e.ResetContentSize(&out, int64(len(part)))
		} else {
			e.Reset(&out)
		}
		if _, err := e.Write(part); err != nil {
			t.Fatal(err)
		}
		if err := e.Close(); err != nil {
			t.Fatal(err)
		}
	}
	return out.Bytes()
}

// TestCompressedHintsIdentical reads binary and ASCII files big enough for
// arrays to grow in several steps (point vectors of 108 Ki values,
// connectivity of 295 Ki, against a first step of 64 Ki) from containers whose size hint is exact (one
// gzip member, one zstd frame with its content size), too small (several
// members or frames: only the last member's ISIZE, the first frame's size)
// or absent (no content size; a plain io.Reader), and requires fields
// identical to the plain file's, bit for bit.
func TestCompressedHintsIdentical(t *testing.T) {
	z := fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{32, 32, 32})
	fieldtest.SamplePoints(z, "velocity", 3, func(x [3]float64, d []float64) {
		d[0], d[1], d[2] = math.Sin(3*x[0])/3, x[1]*x[2]/7, math.Exp(x[2])
	})
	dir := t.TempDir()
	for _, bin := range []bool{true, false} {
		var buf bytes.Buffer
		if err := WriteVTK(&buf, z, WriteOptions{Binary: bin, Version: "4.2"}); err != nil {
			t.Fatal(err)
		}
		raw := buf.Bytes()
		want, err := ReadVTK(bytes.NewReader(raw), "box", Options{})
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range []struct {
			name string
			data []byte
		}{
			{"gzip", gzipBytes(t, raw, 1)},
			{"gzip-3-members", gzipBytes(t, raw, 3)},
			{"zstd", zstdBytes(t, raw, 1, true)},
			{"zstd-3-frames", zstdBytes(t, raw, 3, true)},
			{"zstd-no-size", zstdBytes(t, raw, 1, false)},
		} {
			path := filepath.Join(dir, "box")
			if err := os.WriteFile(path, c.data, 0o644); err != nil {
				t.Fatal(err)
			}
			for _, how := range []struct {
				name    string
				workers int
			}{{"ReadFile", 2}, {"bytes.Reader", 2}, {"io.Reader", 1}, {"io.Reader", 2}} {
				opt := Options{Workers: how.workers}
				var f *field.Field
				var err error
				switch how.name {
				case "ReadFile":
					f, err = ReadFile(path, opt)
				case "bytes.Reader":
					f, err = ReadVTK(bytes.NewReader(c.data), "box", opt)
				default:
					f, err = ReadVTK(struct{ io.Reader }{bytes.NewReader(c.data)}, "box", opt)
				}
				if err != nil {
					t.Fatalf("binary %v %s %s: %v", bin, c.name, how.name, err)
				}
				if !reflect.DeepEqual(f, want) {
					t.Errorf("binary %v %s %s workers %d: field differs from the plain file's", bin, c.name, how.name, how.workers)
				}
			}
		}
	}
}

// fuzzZstd encodes the inputs of FuzzReadCompressed; EncodeAll may be
// called concurrently and records the content size in the frame header.
var fuzzZstd, _ = zstd.NewWriter(nil, zstd.WithEncoderLevel(zstd.SpeedFastest))

// FuzzReadCompressed wraps each input in containers whose size hint is
// exact (one gzip member, one zstd frame with its content size) or too
// small (two gzip members cut at a byte the fuzzer picks: the hint is the
// second member's ISIZE), reads each with the hint (bytes.Reader) and
// without (streaming), and requires every read to agree with the plain
// read: both succeed with bit-identical fields, or both fail with an
// *Error. Inputs that are themselves compressed are skipped (the reader
// unwraps one container).
func FuzzReadCompressed(f *testing.F) {
	for _, p := range fuzzSeedFiles(f) {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(b, uint16(len(b)/3))
	}
	f.Fuzz(func(t *testing.T, data []byte, cut uint16) {
		if bytes.HasPrefix(data, magicGzip) || bytes.HasPrefix(data, magicZstd) {
			return
		}
		opt := Options{MaxBytes: fuzzMaxBytes, Workers: 2}
		want, werr := fuzzRead(t, bytes.NewReader(data), opt)
		c := min(int(cut), len(data))
		for _, z := range [][]byte{
			fuzzGzip(t, data), append(fuzzGzip(t, data[:c]), fuzzGzip(t, data[c:])...),
			fuzzZstd.EncodeAll(data, nil),
		} {
			for _, r := range []io.Reader{bytes.NewReader(z), fuzzUnsized{bytes.NewReader(z)}} {
				got, err := fuzzRead(t, r, opt)
				var e *Error
				if err != nil && !errors.As(err, &e) {
					t.Fatalf("error is %T, not *Error: %v", err, err)
				}
				if (err == nil) != (werr == nil) {
					t.Fatalf("plain vs compressed (%T): %v\n%v", r, werr, err)
				}
				if err == nil {
					if d := fuzzDiffFields(want, got); d != "" {
						t.Fatalf("plain vs compressed (%T): %s", r, d)
					}
				}
			}
		}
	})
}

// fuzzGzip compresses b as one gzip member at the fastest level.
func fuzzGzip(t *testing.T, b []byte) []byte {
	var out bytes.Buffer
	w, err := gzip.NewWriterLevel(&out, gzip.BestSpeed)
	if err != nil {
		t.Fatal(err)
	}
	w.Write(b)
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	return out.Bytes()
}
