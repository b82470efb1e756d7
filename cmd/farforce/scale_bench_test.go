package main

import (
	"bytes"
	"os"
	"path/filepath"
	"runtime"
	"testing"
	"time"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/integrate"
	"farforce/readers"
	"farforce/surface"
)

// BenchmarkScaleCutVsLoad measures, in one run on the same file, what the
// speed target of the forces command compares: loading a binary legacy VTK
// file of a structured hexahedral box on [-1,1]³ (100³ = 10⁶ cells; 171³ ≈
// 5·10⁶ with FARFORCE_BIG=1) with a point velocity and pressure, against
// cutting one default sphere (radius 0.6, facets following the cell size;
// FARFORCE_FACETS=N fixes about N facets instead) through it and
// integrating the forces. Every phase is timed in process
// CPU time (all threads; a loaded machine does not inflate it) and
// reported per iteration: load, locator build, sampler set-up, cut, and
// the integration with the sampler's lazily recovered gradients built
// (cold, the first call) and already built (warm). ratio is
// (cut + cold integration) / load, the figure whose target is below 0.1;
// ratio-indexed divides by load plus locator build instead, ratio-warm
// uses the warm integration (a further surface of a sweep).
func BenchmarkScaleCutVsLoad(b *testing.B) {
	n := 100
	if os.Getenv("FARFORCE_BIG") == "1" {
		n = 171
	}
	path := scaleFile(b, n)
	if st, err := os.Stat(path); err == nil {
		b.ReportMetric(float64(st.Size())/1e6, "file-MB")
	}
	spec := "sphere center=0.013,-0.007,0.004 radius=0.6"
	if n := os.Getenv("FARFORCE_FACETS"); n != "" {
		spec += " facets=" + n // e.g. 100000, the facet count the speed target names
	}
	shape, err := surface.ParseSpec(spec)
	if err != nil {
		b.Fatal(err)
	}
	fm := field.FlowMap{
		Velocity:  []string{"velocity"},
		Pressure:  "pressure",
		Density:   field.Quantity{Value: 1.2},
		Viscosity: field.Quantity{Value: 1.8e-5},
	}
	opt := integrate.Options{Free: integrate.Freestream{V: integrate.Vec3{1, 0, 0}, Rho: 1.2}, RefArea: 1}
	var t [6]time.Duration // load, locator, sampler, cut, cold, warm
	var facets, pieces, points int
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		phase := func(k int, fn func()) {
			runtime.GC()
			c0 := fieldtest.ProcessCPU()
			fn()
			t[k] += fieldtest.ProcessCPU() - c0
		}
		var f *field.Field
		var l *field.Locator
		var ev *field.FlowSampler
		var c *surface.Cut
		phase(0, func() {
			if f, err = readers.ReadFile(path, readers.Options{}); err != nil {
				b.Fatal(err)
			}
		})
		phase(1, func() {
			if l, err = field.NewLocator(f); err != nil {
				b.Fatal(err)
			}
		})
		phase(2, func() {
			if ev, err = field.NewFlowSampler(field.NewSampler(l), fm); err != nil {
				b.Fatal(err)
			}
		})
		phase(3, func() {
			if c, err = surface.CutSurface(l, shape, surface.CutOptions{}); err != nil {
				b.Fatal(err)
			}
		})
		for k := 4; k <= 5; k++ {
			phase(k, func() {
				if _, err := integrate.Forces(c, ev, opt); err != nil {
					b.Fatal(err)
				}
			})
		}
		facets, pieces, points = c.Facets, len(c.Pieces), len(c.Points)
	}
	ms := func(d time.Duration) float64 { return d.Seconds() * 1e3 / float64(b.N) }
	b.ReportMetric(ms(t[0]), "load-cpu-ms")
	b.ReportMetric(ms(t[1]), "locator-cpu-ms")
	b.ReportMetric(ms(t[2]), "sampler-cpu-ms")
	b.ReportMetric(ms(t[3]), "cut-cpu-ms")
	b.ReportMetric(ms(t[4]), "forces-cold-cpu-ms")
	b.ReportMetric(ms(t[5]), "forces-warm-cpu-ms")
	b.ReportMetric((t[3]+t[4]).Seconds()/t[0].Seconds(), "ratio")
	// The same against loading plus building the point-location index
	// (part of making a file ready), and for a further surface of a sweep
	// (gradients already recovered).
	b.ReportMetric((t[3]+t[4]).Seconds()/(t[0]+t[1]).Seconds(), "ratio-indexed")
	b.ReportMetric((t[3]+t[5]).Seconds()/t[0].Seconds(), "ratio-warm")
	b.ReportMetric(float64(facets), "facets")
	b.ReportMetric(float64(pieces), "pieces")
	b.ReportMetric(float64(points), "points")
	b.ReportMetric(float64(facets)/(t[3].Seconds()/float64(b.N)), "facets/cpu-s")
	b.ReportMetric(float64(pieces)/(t[3].Seconds()/float64(b.N)), "pieces/cpu-s")
}

// scaleFile writes the benchmark's input, a binary VTK 4.2 file of an n³
// hexahedral box with a smooth point velocity and pressure (invented demo
// values), to a temporary directory removed after the benchmark.
func scaleFile(b *testing.B, n int) string {
	b.Helper()
	z := fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{n, n, n})
	fieldtest.SampleBenchFlow(z)
	var buf bytes.Buffer
	if err := readers.WriteVTK(&buf, z, readers.WriteOptions{Binary: true, Version: "4.2", Title: "scale benchmark"}); err != nil {
		b.Fatal(err)
	}
	path := filepath.Join(b.TempDir(), "box.vtk")
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		b.Fatal(err)
	}
	return path
}
