package integrate

import "testing"

// BenchmarkCrossflow measures the crossflow analysis (evaluation, two
// Poisson solves with free-space edge values) on a 160 × 160 grid.
func BenchmarkCrossflow(b *testing.B) {
	opt := ellipseOpt()
	b.ReportAllocs()
	for b.Loop() {
		cf := ellipseCrossflow(b, 20, 160, opt)
		b.ReportMetric(float64(cf.Grid[0]*cf.Grid[1]), "points/op")
	}
}

// BenchmarkWakePlane measures the wake-plane quadrature analyses on the
// Gaussian wake cut (per quadrature point).
func BenchmarkWakePlane(b *testing.B) {
	c, flow := wakeCut2D(b, 400)
	opt := wakeOpt(1, 1, 0)
	b.ReportAllocs()
	b.SetBytes(int64(len(c.Points)) * 8)
	for b.Loop() {
		if _, err := Wake(c, flow, opt); err != nil {
			b.Fatal(err)
		}
	}
}
