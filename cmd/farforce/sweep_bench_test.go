package main

import (
	"os"
	"testing"

	"github.com/spf13/pflag"

	"farforce/integrate"
	"farforce/readers"
	"farforce/surface"
)

// BenchmarkSweepReal runs a 9-member sweep of circles over the 2D-1
// benchmark solution (testdata/real at the module root), the field loaded
// and prepared once: the cost of cutting and integrating per sweep.
func BenchmarkSweepReal(b *testing.B) {
	file := "../../testdata/real/dfg2d1_coarse_tri_p2refined_binary.vtk"
	if _, err := os.Stat(file); err != nil {
		b.Skipf("real solution not found: %v", err)
	}
	f, err := readers.ReadFile(file, readers.Options{})
	if err != nil {
		b.Fatal(err)
	}
	var fl flowFlags
	fs := pflag.NewFlagSet("bench", pflag.ContinueOnError)
	fl.define(fs)
	if err := fs.Parse([]string{"--density=1", "--viscosity=1e-3", "--freestream-velocity=0.2,0,0", "--ref-length=0.1"}); err != nil {
		b.Fatal(err)
	}
	if err := fl.check(fs); err != nil {
		b.Fatal(err)
	}
	p, err := fl.prepare(fs, []string{file}, f)
	if err != nil {
		b.Fatal(err)
	}
	base, err := surface.ParseSpec("circle center=0.2,0.2 radius=0.1")
	if err != nil {
		b.Fatal(err)
	}
	scales, _ := parseScales("0.75:1.75:9")
	spec := sweepSpec{Base: base, Scales: scales, Verdict: integrate.VerdictOptions{}}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := runSweep(&progress{}, p, spec, nil); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N*len(scales))/b.Elapsed().Seconds(), "members/s")
}
