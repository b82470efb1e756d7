package integrate

import (
	"math"
	"testing"
)

// TestPoissonSolve checks the DST Poisson solver on the manufactured
// solution u = x²y + cos(2x)eʸ (∇²u = 2y − 3cos(2x)eʸ, elementary calculus)
// on [0.3, 1.7] × [−0.5, 0.9]: the discrete residual vanishes to rounding,
// and the error against u falls at the second order of the 5-point
// Laplacian (±0.1: the error is a smooth O(h²) series at these sizes).
func TestPoissonSolve(t *testing.T) {
	exact := func(x, y float64) float64 { return x*x*y + math.Cos(2*x)*math.Exp(y) }
	lap := func(x, y float64) float64 { return 2*y - 3*math.Cos(2*x)*math.Exp(y) }
	var hs, errs []float64
	for _, n := range []int{16, 32, 64} {
		g := poissonGrid{m1: n - 1, m2: n + 7, h1: 1.4 / float64(n), h2: 1.4 / float64(n+8)}
		nn := (g.m1 + 2) * (g.m2 + 2)
		f, frame, want := make([]float64, nn), make([]float64, nn), make([]float64, nn)
		for j := 0; j < g.m2+2; j++ {
			for i := 0; i < g.m1+2; i++ {
				x, y := 0.3+float64(i)*g.h1, -0.5+float64(j)*g.h2
				k := g.idx(i, j)
				want[k], f[k] = exact(x, y), lap(x, y)
				frame[k] = want[k]
			}
		}
		u := g.solve(f, frame)
		var maxErr, maxRes float64
		for j := 1; j <= g.m2; j++ {
			for i := 1; i <= g.m1; i++ {
				k := g.idx(i, j)
				res := (u[k-1]-2*u[k]+u[k+1])/(g.h1*g.h1) + (u[g.idx(i, j-1)]-2*u[k]+u[g.idx(i, j+1)])/(g.h2*g.h2) - f[k]
				maxRes = math.Max(maxRes, math.Abs(res))
				maxErr = math.Max(maxErr, math.Abs(u[k]-want[k]))
			}
		}
		if maxRes > 1e-8 {
			t.Errorf("n=%d: discrete residual %g", n, maxRes)
		}
		hs, errs = append(hs, g.h1), append(errs, maxErr)
	}
	if ord := fitOrder(hs, errs); !(math.Abs(ord-2) <= 0.1) {
		t.Errorf("Poisson solver order %.3f (errors %v), want 2", ord, errs)
	}
}
