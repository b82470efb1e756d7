package field_test

import (
	"math"
	"math/rand/v2"
	"runtime"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// Benchmarks on about a million cells: a 100³ hexahedral box (10⁶ cells)
// and a 55³ box of Kuhn tetrahedra (~1.0·10⁶ cells), both perturbed so
// that cells are not axis-aligned.

var benchZones = map[string]func() *field.Zone{
	"hexa": func() *field.Zone {
		z := fieldtest.BoxHex(unitLo, unitHi, [3]int{100, 100, 100})
		fieldtest.Perturb(z, 0.1/100, 1)
		return z
	},
	"tetra": func() *field.Zone {
		z := fieldtest.BoxTet(unitLo, unitHi, [3]int{55, 55, 55})
		fieldtest.Perturb(z, 0.1/55, 1)
		return z
	},
}

var benchCache = map[string]*field.Zone{}

func benchZone(b *testing.B, name string) *field.Zone {
	b.Helper()
	if z, ok := benchCache[name]; ok {
		return z
	}
	z := benchZones[name]()
	benchCache[name] = z
	return z
}

func benchmarkBuild(b *testing.B, name string) {
	z := benchZone(b, name)
	f := &field.Field{Zones: []*field.Zone{z}}
	b.ReportAllocs()
	cpu0 := fieldtest.ProcessCPU()
	b.ResetTimer()
	var l *field.Locator
	for b.Loop() {
		var err error
		if l, err = field.NewLocator(f); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(field.IndexBytes(l))/float64(z.NumCells()), "index-B/cell")
	cells := float64(b.N) * float64(z.NumCells())
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/cells, "ns/cell")
	b.ReportMetric(float64((fieldtest.ProcessCPU()-cpu0).Nanoseconds())/cells, "cpu-ns/cell")
	b.ReportMetric(cells/b.Elapsed().Seconds(), "cells/s")
}

func BenchmarkLocatorBuildHexa(b *testing.B)  { benchmarkBuild(b, "hexa") }
func BenchmarkLocatorBuildTetra(b *testing.B) { benchmarkBuild(b, "tetra") }

// benchmarkLocate times Locate (or CellSize, when size is set) on random
// points (every query a cache miss) or on points along a fine spiral over
// a sphere (coherent queries, as a surface cut makes them). Besides wall
// time it reports the CPU time of the benchmark thread, which a loaded
// machine does not inflate.
func benchmarkLocate(b *testing.B, name string, coherent, size bool) {
	z := benchZone(b, name)
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		b.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	pts := make([][3]float64, 1<<16)
	for i := range pts {
		if coherent {
			// Spiral on the sphere of radius 0.3 about the box centre.
			u := float64(i) / float64(len(pts))
			th := math.Acos(1 - 2*u)
			ph := 400 * math.Pi * u
			pts[i] = [3]float64{0.5 + 0.3*math.Sin(th)*math.Cos(ph), 0.5 + 0.3*math.Sin(th)*math.Sin(ph), 0.5 + 0.3*math.Cos(th)}
		} else {
			pts[i] = [3]float64{rng.Float64(), rng.Float64(), rng.Float64()}
		}
	}
	runtime.LockOSThread()
	defer runtime.UnlockOSThread()
	b.ReportAllocs()
	cpu0 := fieldtest.ThreadCPU()
	b.ResetTimer()
	i := 0
	for b.Loop() {
		if size {
			if h := l.CellSize(pts[i&(len(pts)-1)]); !(h > 0) {
				b.Fatal("no cell size")
			}
		} else if _, ok := l.Locate(pts[i&(len(pts)-1)]); !ok {
			b.Fatal("not located")
		}
		i++
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N), "ns/query")
	b.ReportMetric(float64((fieldtest.ThreadCPU()-cpu0).Nanoseconds())/float64(b.N), "cpu-ns/query")
}

func BenchmarkLocateHexaRandom(b *testing.B)      { benchmarkLocate(b, "hexa", false, false) }
func BenchmarkLocateTetraRandom(b *testing.B)     { benchmarkLocate(b, "tetra", false, false) }
func BenchmarkLocateHexaCoherent(b *testing.B)    { benchmarkLocate(b, "hexa", true, false) }
func BenchmarkLocateTetraCoherent(b *testing.B)   { benchmarkLocate(b, "tetra", true, false) }
func BenchmarkCellSizeHexaCoherent(b *testing.B)  { benchmarkLocate(b, "hexa", true, true) }
func BenchmarkCellSizeTetraCoherent(b *testing.B) { benchmarkLocate(b, "tetra", true, true) }

// benchmarkSample times Value plus Gradient of a scalar at 4096 random
// located points of a perturbed 40³ hexahedral box, with the per-cell or
// per-node fits already built (warm) or built during the pass (cold: a new
// Sampler per pass, so every fit the points need is computed once).
func benchmarkSample(b *testing.B, at field.Centering, cold bool) {
	z := fieldtest.BoxHex(unitLo, unitHi, [3]int{40, 40, 40})
	fieldtest.Perturb(z, 0.1/40, 3)
	fn := func(x [3]float64, dst []float64) { dst[0], _ = smooth(x) }
	if at == field.AtCells {
		fieldtest.SampleCells(z, "f", 1, fn)
	} else {
		fieldtest.SamplePoints(z, "f", 1, fn)
	}
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		b.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(5, 6))
	_, locs := randomInside(b, l, rng, 4096)
	v, g := make([]float64, 1), make([]float64, 3)
	newSampler := func() (*field.Sampler, field.ArrayID) {
		s := field.NewSampler(l)
		id, err := s.Prepare("f")
		if err != nil {
			b.Fatal(err)
		}
		return s, id
	}
	s, id := newSampler()
	for _, loc := range locs {
		s.Gradient(id, loc, g)
	}
	runtime.LockOSThread()
	defer runtime.UnlockOSThread()
	b.ReportAllocs()
	cpu0 := fieldtest.ThreadCPU()
	b.ResetTimer()
	for b.Loop() {
		if cold {
			b.StopTimer()
			s, id = newSampler()
			b.StartTimer()
		}
		for _, loc := range locs {
			s.Value(id, loc, v)
			s.Gradient(id, loc, g)
		}
	}
	n := float64(b.N * len(locs))
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/n, "ns/sample")
	b.ReportMetric(float64((fieldtest.ThreadCPU()-cpu0).Nanoseconds())/n, "cpu-ns/sample")
}

func BenchmarkSamplePointDataWarm(b *testing.B) { benchmarkSample(b, field.AtPoints, false) }
func BenchmarkSamplePointDataCold(b *testing.B) { benchmarkSample(b, field.AtPoints, true) }
func BenchmarkSampleCellDataWarm(b *testing.B)  { benchmarkSample(b, field.AtCells, false) }
func BenchmarkSampleCellDataCold(b *testing.B)  { benchmarkSample(b, field.AtCells, true) }
