package fieldtest

import (
	"math"

	"farforce/field"
)

// SpherePotential is the potential flow past a sphere of radius A centred
// at the origin in a uniform stream U (any direction), incompressible and
// inviscid (μ = 0):
//
//	V = U + (A³/2)(U/r³ − 3x(x·U)/r⁵),  p = PInf + ½ρ(|U|² − |V|²).
//
// (Lamb, Hydrodynamics §92; VALIDATION.md §3.2a, checked by sph.py.) The
// force and moment on any closed surface enclosing the sphere are zero
// (d'Alembert).
type SpherePotential struct {
	Rho, PInf, A float64
	U            [3]float64
}

// State returns the exact state at x.
func (f SpherePotential) State(x [3]float64) field.FlowState {
	_, r3, r5, r7 := radialPowers(x)
	s := dot(x, f.U)
	c := f.A * f.A * f.A / 2
	var st field.FlowState
	st.Rho = f.Rho
	for i := 0; i < 3; i++ {
		st.V[i] = f.U[i] + c*(f.U[i]/r3-3*x[i]*s/r5)
		for j := 0; j < 3; j++ {
			g := -3*f.U[i]*x[j]/r5 - 3*x[i]*f.U[j]/r5 + 15*x[i]*x[j]*s/r7
			if i == j {
				g -= 3 * s / r5
			}
			st.GradV[i][j] = c * g
		}
	}
	st.P = f.PInf + 0.5*f.Rho*(dot(f.U, f.U)-dot(st.V, st.V))
	return st
}

// EvalFlow implements field.FlowEvaluator; the location is ignored.
func (f SpherePotential) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}

// StokesSphere is Stokes' creeping flow past a fixed sphere of radius A
// centred at the origin in a stream U (Stokes 1851; Happel & Brenner 1965;
// VALIDATION.md §3.3, checked by sph.py), with s = x·U:
//
//	V_i = U_i − (3A/4)(U_i/r + x_i s/r³) − (A³/4)(U_i/r³ − 3x_i s/r⁵),
//	p = PInf − (3/2) μ A s / r³.
//
// It solves the Stokes equations, not Navier–Stokes: integrate it with the
// convective flux switched off (ρ is reported as Rho, normally 0). Exact
// facts: force 6πμAU on every enclosing closed surface; pressure part
// 2πμAU and viscous part 4πμAU on every concentric sphere; on a centred box
// of half-sides (Lx, Ly, Lz) with U along x the pressure part is
// 12μUA·atan(LyLz/(Lx√(Lx²+Ly²+Lz²))).
type StokesSphere struct {
	Mu, Rho, PInf, A float64
	U                [3]float64
}

// State returns the exact state at x.
func (f StokesSphere) State(x [3]float64) field.FlowState {
	r, r3, r5, r7 := radialPowers(x)
	s := dot(x, f.U)
	a, a3 := f.A, f.A*f.A*f.A
	var st field.FlowState
	st.Rho = f.Rho
	st.Mu = f.Mu
	st.P = f.PInf - 1.5*f.Mu*a*s/r3
	for i := 0; i < 3; i++ {
		st.V[i] = f.U[i] - 0.75*a*(f.U[i]/r+x[i]*s/r3) - 0.25*a3*(f.U[i]/r3-3*x[i]*s/r5)
		for j := 0; j < 3; j++ {
			d := 0.0
			if i == j {
				d = 1
			}
			g1 := -f.U[i]*x[j]/r3 + d*s/r3 + x[i]*f.U[j]/r3 - 3*x[i]*x[j]*s/r5
			g2 := -3*f.U[i]*x[j]/r5 - 3*(d*s/r5+x[i]*f.U[j]/r5-5*x[i]*x[j]*s/r7)
			st.GradV[i][j] = -0.75*a*g1 - 0.25*a3*g2
		}
	}
	return st
}

// EvalFlow implements field.FlowEvaluator; the location is ignored.
func (f StokesSphere) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}

// RotatingSphere is the creeping flow around a sphere of radius A at the
// origin rotating with angular velocity Omega in fluid at rest:
//
//	V = (A³/r³) Ω × x,  p = PInf.
//
// The torque of the fluid on the sphere is −8πμA³Ω on every enclosing
// closed surface (Lamb; VALIDATION.md §3.3, checked by sph.py); the force
// is zero. Use it with the convective flux switched off.
type RotatingSphere struct {
	Mu, Rho, PInf, A float64
	Omega            [3]float64
}

// State returns the exact state at x.
func (f RotatingSphere) State(x [3]float64) field.FlowState {
	r2 := dot(x, x)
	r := math.Sqrt(r2)
	a3 := f.A * f.A * f.A
	k := a3 / (r2 * r)
	w := cross(f.Omega, x)
	var st field.FlowState
	st.Rho, st.Mu, st.P = f.Rho, f.Mu, f.PInf
	// ∂_j (Ω×x)_i = ε_ikj Ω_k, the matrix [Ω]_× ; ∂_j r⁻³ = −3x_j/r⁵.
	om := [3][3]float64{
		{0, -f.Omega[2], f.Omega[1]},
		{f.Omega[2], 0, -f.Omega[0]},
		{-f.Omega[1], f.Omega[0], 0},
	}
	for i := 0; i < 3; i++ {
		st.V[i] = k * w[i]
		for j := 0; j < 3; j++ {
			st.GradV[i][j] = k * (om[i][j] - 3*w[i]*x[j]/r2)
		}
	}
	return st
}

// EvalFlow implements field.FlowEvaluator; the location is ignored.
func (f RotatingSphere) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}

func dot(a, b [3]float64) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }

func cross(a, b [3]float64) [3]float64 {
	return [3]float64{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}

// radialPowers returns r = |x| and r³, r⁵, r⁷, the powers the sphere
// flows divide by.
func radialPowers(x [3]float64) (r, r3, r5, r7 float64) {
	r2 := dot(x, x)
	r = math.Sqrt(r2)
	r3 = r2 * r
	r5 = r3 * r2
	r7 = r5 * r2
	return r, r3, r5, r7
}
