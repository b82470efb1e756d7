package surface

import (
	"os"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// BenchmarkCutSphere cuts a sphere of about 100k facets through a
// structured mesh of 100³ hexahedra (171³ ≈ 5M with FARFORCE_BIG=1) and
// reports facets/s, pieces/s and quadrature points/s of wall time, and the
// CPU time of one cut (all threads; what a loaded machine does not
// inflate) with facets and pieces per CPU second.
func BenchmarkCutSphere(b *testing.B) {
	n := 100
	if os.Getenv("FARFORCE_BIG") == "1" {
		n = 171
	}
	l := locator(b, fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{n, n, n}))
	benchmarkCut(b, l)
}

// BenchmarkCutSpherePerturbed is BenchmarkCutSphere on the same mesh with
// nodes moved randomly by up to 0.1 h: no cell is affine, so every
// quadrature point needs Newton iterations.
func BenchmarkCutSpherePerturbed(b *testing.B) {
	z := fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{100, 100, 100})
	fieldtest.Perturb(z, 0.1*2/100, 1)
	benchmarkCut(b, locator(b, z))
}

// BenchmarkCutSphereTet is the same on a tetrahedral mesh of 6·50³ cells,
// where every cell is clipped as a simplex.
func BenchmarkCutSphereTet(b *testing.B) {
	l := locator(b, fieldtest.BoxTet([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{50, 50, 50}))
	benchmarkCut(b, l)
}

// BenchmarkCutSphereCellSize cuts the default sphere of radius 0.6, its
// facets following the cell size (about 23k facets), through the 100³
// hexahedra of BenchmarkCutSphere: the cut of the forces command's scale
// benchmark, without the file.
func BenchmarkCutSphereCellSize(b *testing.B) {
	l := locator(b, fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{100, 100, 100}))
	benchmarkCutShape(b, l, Sphere{Center: [3]float64{0.013, -0.007, 0.004}, Radius: 0.6})
}

func benchmarkCut(b *testing.B, l *field.Locator) {
	benchmarkCutShape(b, l, Sphere{Center: [3]float64{0.013, -0.007, 0.004}, Radius: 0.6, Res: Resolution{Facets: 100_000}})
}

func benchmarkCutShape(b *testing.B, l *field.Locator, s Shape) {
	b.ReportAllocs()
	cpu0 := fieldtest.ProcessCPU()
	b.ResetTimer()
	var c *Cut
	for i := 0; i < b.N; i++ {
		var err error
		if c, err = CutSurface(l, s, CutOptions{}); err != nil {
			b.Fatal(err)
		}
	}
	sec := b.Elapsed().Seconds() / float64(b.N)
	cpu := (fieldtest.ProcessCPU() - cpu0).Seconds() / float64(b.N)
	b.ReportMetric(float64(c.Facets)/sec, "facets/s")
	b.ReportMetric(float64(len(c.Pieces))/sec, "pieces/s")
	b.ReportMetric(float64(len(c.Points))/sec, "points/s")
	b.ReportMetric(float64(len(c.Pieces)), "pieces")
	b.ReportMetric(float64(len(c.Points)), "points")
	b.ReportMetric(cpu*1e3, "cpu-ms/op")
	b.ReportMetric(float64(c.Facets)/cpu, "facets/cpu-s")
	b.ReportMetric(float64(len(c.Pieces))/cpu, "pieces/cpu-s")
}
