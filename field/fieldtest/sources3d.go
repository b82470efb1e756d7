package fieldtest

import (
	"math"

	"farforce/field"
)

// Source3D is a point source of volume flux Q (m³/s) at X; a negative Q is
// a sink.
type Source3D struct {
	X [3]float64
	Q float64
}

// Sources3D is a uniform stream U along +x plus point sources, an
// incompressible, inviscid (μ = 0) potential flow:
//
//	V = U e_x + Σ_k Q_k (x − x_k) / (4π|x − x_k|³),  p = PInf + ½ρ(U² − |V|²).
//
// Exact force on the sources inside any closed surface (Lagally theorem;
// VALIDATION.md §3.2b, checked by lagally3d.py): (−ρU ΣQ_k, 0, 0), with
// mass flux ρΣQ_k out of the surface; the (V − V∞) form misses it. A
// source–sink pair (Rankine ovoid) feels no force.
type Sources3D struct {
	Rho, PInf, U float64
	Sources      []Source3D
}

// PointSource3D returns a single source of flux Q at the origin in a
// stream U: force (−ρUQ, 0, 0) (lagally3d.py: ρ = 1.2, U = 1.5, Q = 2.3 →
// −4.14).
func PointSource3D(rho, U, Q float64) Sources3D {
	return Sources3D{Rho: rho, U: U, Sources: []Source3D{{Q: Q}}}
}

// RankineOvoid returns a source Q at (−b, 0, 0) and a sink at (b, 0, 0) in
// a stream U: zero force on any surface enclosing both (lagally3d.py).
func RankineOvoid(rho, U, Q, b float64) Sources3D {
	return Sources3D{Rho: rho, U: U, Sources: []Source3D{{[3]float64{-b, 0, 0}, Q}, {[3]float64{b, 0, 0}, -Q}}}
}

// State returns the exact state at x.
func (f Sources3D) State(x [3]float64) field.FlowState {
	var st field.FlowState
	st.Rho = f.Rho
	st.V[0] = f.U
	for _, s := range f.Sources {
		d := [3]float64{x[0] - s.X[0], x[1] - s.X[1], x[2] - s.X[2]}
		r2 := dot(d, d)
		r := math.Sqrt(r2)
		c := s.Q / (4 * math.Pi * r2 * r)
		for i := 0; i < 3; i++ {
			st.V[i] += c * d[i]
			for j := 0; j < 3; j++ {
				g := -3 * d[i] * d[j] / r2
				if i == j {
					g++
				}
				st.GradV[i][j] += c * g
			}
		}
	}
	st.P = f.PInf + 0.5*f.Rho*(f.U*f.U-dot(st.V, st.V))
	return st
}

// EvalFlow implements field.FlowEvaluator; the location is ignored.
func (f Sources3D) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}

// Stokeslet2D is the plane Stokes flow of a point force F applied to the
// fluid at the origin (no stream, inertia neglected):
//
//	u = (1/(4πμ)) [ −ln r F + x (x·F)/r² ],  p = PInf + F·x / (2π r²).
//
// The force of the fluid on the singularity is −F through every closed
// contour around it; on a circle it is half pressure, half viscous
// (VALIDATION.md §3.3, checked by visc2d.py). Use it with the convective
// flux switched off; ρ is reported as Rho.
type Stokeslet2D struct {
	Mu, Rho, PInf float64
	F             [2]float64
}

// State returns the exact state at x (x[2] is ignored).
func (f Stokeslet2D) State(x [3]float64) field.FlowState {
	p := [2]float64{x[0], x[1]}
	r2 := p[0]*p[0] + p[1]*p[1]
	xf := p[0]*f.F[0] + p[1]*f.F[1]
	c := 1 / (4 * math.Pi * f.Mu)
	var st field.FlowState
	st.Rho, st.Mu = f.Rho, f.Mu
	st.P = f.PInf + xf/(2*math.Pi*r2)
	lnr := 0.5 * math.Log(r2)
	for i := 0; i < 2; i++ {
		st.V[i] = c * (-lnr*f.F[i] + p[i]*xf/r2)
		for j := 0; j < 2; j++ {
			g := -p[j]*f.F[i]/r2 + p[i]*f.F[j]/r2 - 2*p[i]*xf*p[j]/(r2*r2)
			if i == j {
				g += xf / r2
			}
			st.GradV[i][j] = c * g
		}
	}
	return st
}

// EvalFlow implements field.FlowEvaluator; the location is ignored.
func (f Stokeslet2D) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}
