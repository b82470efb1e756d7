package fieldtest

import (
	"math"
	"testing"
)

// TestWakeFlowGradients compares the exact velocity gradients of the wake
// flows with fourth-order central differences (error O(h⁴); tolerance 1e-7
// relative for the rounding of V/h, as in TestGradients).
func TestWakeFlowGradients(t *testing.T) {
	const h = 1e-4
	for name, c := range map[string]struct {
		f   Flow
		pts [][3]float64
	}{
		"elliptic": {EllipticWake{Rho: 1.225, U: 50, B: 10, Gamma0: 12}, [][3]float64{{0, 1, 0.5}, {0, 6, -1}, {0, -4.5, 0.3}}},
		"gaussian": {GaussianWake{Rho: 1, U: 1, D: 1, Nu: 0.01, CD: 1.5}, [][3]float64{{50, 0.3, 0}, {80, -1.2, 0}}},
		"pair":     {VortexPair{Rho: 1.2, U: 30, Gamma: 5, Sep: 4, Sigma: 0.5}, [][3]float64{{0, 1.7, 0.2}, {0, -2.4, -0.6}, {0, 0.1, 1.5}}},
	} {
		for _, x := range c.pts {
			s := c.f.State(x)
			scale := 1e-300
			for i := range s.GradV {
				for j := range s.GradV[i] {
					scale = math.Max(scale, math.Abs(s.GradV[i][j]))
				}
			}
			for j := 0; j < 3; j++ {
				v := func(d float64) [3]float64 { y := x; y[j] += d; return c.f.State(y).V }
				p1, m1, p2, m2 := v(h), v(-h), v(2*h), v(-2*h)
				for i := 0; i < 3; i++ {
					fd := (8*(p1[i]-m1[i]) - (p2[i] - m2[i])) / (12 * h)
					if d := math.Abs(fd - s.GradV[i][j]); d > 1e-7*scale {
						t.Errorf("%s at %v: dV%d/dx%d = %.12g, finite difference %.12g", name, x, i, j, s.GradV[i][j], fd)
					}
				}
			}
		}
	}
}

// TestEllipticWakeSheet checks the Trefftz-plane downwash on the sheet,
// w = −Γ₀/b = −1.2 above and below (VALIDATION §3.6, trefftz.py), and the
// jump of v across it, 2Wy/√(s² − y²) (so that ∫ of the sheet vorticity
// gives Γ(y) = Γ₀√(1 − (2y/b)²)).
func TestEllipticWakeSheet(t *testing.T) {
	f := EllipticWake{Rho: 1.225, U: 50, B: 10, Gamma0: 12}
	for _, y := range []float64{-4, 0, 3} {
		up, dn := f.State([3]float64{0, y, 1e-9}), f.State([3]float64{0, y, -1e-9})
		if math.Abs(up.V[2]+1.2) > 1e-6 || math.Abs(dn.V[2]+1.2) > 1e-6 {
			t.Errorf("y=%g: w above %g below %g, want -1.2", y, up.V[2], dn.V[2])
		}
		want := 2 * 1.2 * y / math.Sqrt(25-y*y)
		if math.Abs((dn.V[1]-up.V[1])-want) > 1e-6 {
			t.Errorf("y=%g: v jump %g, want %g", y, dn.V[1]-up.V[1], want)
		}
	}
}
