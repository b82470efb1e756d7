package fieldtest

import (
	"math"
	"testing"

	"farforce/field"
)

// testFlows lists every closed-form flow with a point away from its
// singularities.
func testFlows() map[string]Flow {
	return map[string]Flow{
		"cylinder":  Cylinder(1.3, 2, 0.7, 3.1),
		"vortex":    PointVortex(1, 1, 1),
		"oval":      RankineOval(1.3, 2, 2.5, 0.8),
		"halfbody":  RankineHalfBody(1.3, 2, 2.5),
		"kovasznay": Kovasznay{Re: 40, PInf: 3},
		"sphere":    SpherePotential{Rho: 1.2, A: 0.6, U: [3]float64{1.5, 0.2, -0.3}},
		"stokes":    StokesSphere{Mu: 0.37, A: 0.6, U: [3]float64{1.5, -0.4, 0.7}},
		"rotating":  RotatingSphere{Mu: 0.37, A: 0.6, Omega: [3]float64{0.3, -1, 1.7}},
		"source3d":  PointSource3D(1.2, 1.5, 2.3),
		"ovoid":     RankineOvoid(1.2, 1.5, 2.3, 0.4),
		"stokeslet": Stokeslet2D{Mu: 0.3, F: [2]float64{1.1, -0.4}},
		"moved": Transformed{Base: StokesSphere{Mu: 0.37, A: 0.6, U: [3]float64{1.5, 0, 0}},
			Rot: RotAxis([3]float64{0.6, 0, 0.8}, 0.7), Shift: [3]float64{0.3, -0.2, 1}},
	}
}

// TestGradients compares every exact velocity gradient with a fourth-order
// central difference of the velocity (error O(h⁴) ≈ 1e-11 at h = 1e-3;
// the tolerance 1e-7 relative allows for rounding of V/h).
func TestGradients(t *testing.T) {
	pts := [][3]float64{{1.1, 0.7, 0.4}, {-0.9, 1.3, -0.6}, {0.5, -1.4, 1.2}}
	const h = 1e-3
	for name, f := range testFlows() {
		for _, x := range pts {
			if _, ok := f.(Potential2D); ok {
				x[2] = 0
			}
			if _, ok := f.(Kovasznay); ok {
				x[2] = 0
			}
			if _, ok := f.(Stokeslet2D); ok {
				x[2] = 0
			}
			s := f.State(x)
			scale := 1e-300
			for i := range s.GradV {
				for j := range s.GradV[i] {
					scale = math.Max(scale, math.Abs(s.GradV[i][j]))
				}
			}
			dims := 3
			if s.V[2] == 0 && s.GradV[2] == [3]float64{} && x[2] == 0 {
				dims = 2
			}
			for j := 0; j < dims; j++ {
				v := func(d float64) [3]float64 { y := x; y[j] += d; return f.State(y).V }
				p1, m1, p2, m2 := v(h), v(-h), v(2*h), v(-2*h)
				for i := 0; i < 3; i++ {
					fd := (8*(p1[i]-m1[i]) - (p2[i] - m2[i])) / (12 * h)
					if d := math.Abs(fd - s.GradV[i][j]); d > 1e-7*scale {
						t.Errorf("%s at %v: dV%d/dx%d = %.12g, finite difference %.12g", name, x, i, j, s.GradV[i][j], fd)
					}
				}
			}
			// Every flow here is incompressible: ∇·V = 0 exactly.
			if div := s.GradV[0][0] + s.GradV[1][1] + s.GradV[2][2]; math.Abs(div) > 1e-12*scale {
				t.Errorf("%s at %v: divergence %g", name, x, div)
			}
		}
	}
}

// TestMomentumEquation checks that the viscous flows satisfy their field
// equations pointwise by finite differences: Stokes (∇p = μ∇²V) for the
// sphere flows and steady Navier–Stokes (ρV·∇V = −∇p + μ∇²V) for
// Kovasznay. Tolerance: second differences with h = 1e-3 carry O(h²)
// truncation, about 1e-6 times the ratio of fourth to second derivatives
// (≲ 10 here), against the size of the terms of the equation.
func TestMomentumEquation(t *testing.T) {
	flows := map[string]Flow{
		"kovasznay": Kovasznay{Re: 40},
		"stokes":    StokesSphere{Mu: 0.37, A: 0.6, U: [3]float64{1.5, -0.4, 0.7}},
		"rotating":  RotatingSphere{Mu: 0.37, A: 0.6, Omega: [3]float64{0.3, -1, 1.7}},
		"stokeslet": Stokeslet2D{Mu: 0.3, F: [2]float64{1.1, -0.4}},
	}
	const h = 1e-3
	for name, f := range flows {
		x := [3]float64{0.9, 0.6, 0.5}
		dims := 3
		if name == "kovasznay" || name == "stokeslet" {
			x[2], dims = 0, 2
		}
		s := f.State(x)
		conv := name == "kovasznay"
		for i := 0; i < dims; i++ {
			var lap, gp, scale float64
			for j := 0; j < dims; j++ {
				at := func(d float64) field.FlowState { y := x; y[j] += d; return f.State(y) }
				p, m := at(h), at(-h)
				d2 := (p.V[i] - 2*s.V[i] + m.V[i]) / (h * h)
				lap += d2
				scale += s.Mu * math.Abs(d2)
				if j == i {
					gp = (p.P - m.P) / (2 * h)
				}
			}
			res := -gp + s.Mu*lap
			if conv {
				for j := 0; j < dims; j++ {
					res -= s.Rho * s.V[j] * s.GradV[i][j]
				}
			}
			for j := 0; j < dims; j++ {
				scale += math.Abs(s.Rho * s.V[j] * s.GradV[i][j])
			}
			scale += math.Abs(gp) + s.Mu*math.Sqrt(dot(s.V, s.V)/dot(x, x))
			if math.Abs(res) > 1e-4*scale {
				t.Errorf("%s: momentum residual %g in component %d (grad p %g)", name, res, i, gp)
			}
		}
	}
}

// TestTransformed checks that a rotated and shifted flow is the base flow
// seen in moved axes: V(Rx₀+T) = R V₀(x₀).
func TestTransformed(t *testing.T) {
	base := SpherePotential{Rho: 1.2, A: 0.6, U: [3]float64{1.5, 0, 0}}
	rot := RotAxis([3]float64{0, 0.6, 0.8}, 1.1)
	tr := Transformed{Base: base, Rot: rot, Shift: [3]float64{1, 2, 3}}
	x0 := [3]float64{0.7, -0.5, 0.9}
	x := MatVec(rot, x0)
	for k := range x {
		x[k] += tr.Shift[k]
	}
	want := MatVec(rot, base.State(x0).V)
	got := tr.State(x).V
	for k := range got {
		if math.Abs(got[k]-want[k]) > 1e-14 {
			t.Fatalf("transformed velocity %v, want %v", got, want)
		}
	}
}
