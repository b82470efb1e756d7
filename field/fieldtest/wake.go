package fieldtest

import (
	"math"
	"math/cmplx"

	"farforce/field"
)

// EllipticWake is the exact far-wake (Trefftz-plane) crossflow of an
// elliptically loaded wing of span B and root circulation Gamma0 in a
// stream U along +x, z up (VALIDATION §3.6): with s = B/2, W = Gamma0/B,
// ζ = y + iz,
//
//	v − iw = −iW (ζ/√(ζ² − s²) − 1),  √(ζ² − s²) = √(ζ − s)·√(ζ + s),
//
// the flow of a flat plate of width B moving down at W, with the vortex
// sheet (branch cut) on |y| < s, z = 0. The streamwise velocity is U, the
// pressure PInf − ½ρ(v² + w²) (uniform total pressure), μ = 0. Exact
// results: D_i = πρΓ₀²/8, L = (π/4)ρUBΓ₀, w = −W on the sheet.
type EllipticWake struct {
	Rho, U, B, Gamma0, PInf float64
}

// crossflow returns G = v − iw and dG/dζ at (y, z).
func (f EllipticWake) crossflow(y, z float64) (g, dg complex128) {
	s := f.B / 2
	w := complex(f.Gamma0/f.B, 0)
	zeta := complex(y, z)
	sq := cmplx.Sqrt(zeta-complex(s, 0)) * cmplx.Sqrt(zeta+complex(s, 0))
	g = -1i * w * (zeta/sq - 1)
	dg = -1i * w * complex(-s*s, 0) / (sq * sq * sq)
	return g, dg
}

// State returns the state at x.
func (f EllipticWake) State(x [3]float64) field.FlowState {
	g, dg := f.crossflow(x[1], x[2])
	v, w := real(g), -imag(g)
	st := field.FlowState{Rho: f.Rho, P: f.PInf - 0.5*f.Rho*(v*v+w*w), V: [3]float64{f.U, v, w}}
	// ∂v/∂y − i∂w/∂y = G′, ∂v/∂z − i∂w/∂z = iG′.
	st.GradV[1] = [3]float64{0, real(dg), -imag(dg)}
	st.GradV[2] = [3]float64{0, -imag(dg), -real(dg)}
	return st
}

// EvalFlow fills dst with the state at x (the location is ignored).
func (f EllipticWake) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) { *dst = f.State(x) }

// GaussianWake is the linearised laminar far wake of a 2D body of size D
// and drag coefficient CD in a stream U along +x with kinematic viscosity
// Nu (Schlichting; VALIDATION §3.5): u = U − u₁,
//
//	u₁ = A/√x · exp(−U y²/(4νx)),  A = U CD √(U D/ν · D)/(4√π),
//
// v = 0, p = PInf, μ = ρν; defined for x > 0. Exact properties:
// ρU∫u₁dy = D′ = ½ρU²D·CD and ρ∫u(U − u)dy = D′ − ρA²√(2πν/(Ux)).
type GaussianWake struct {
	Rho, U, D, Nu, CD, PInf float64
}

// Amplitude returns A.
func (f GaussianWake) Amplitude() float64 {
	return f.U * f.CD * math.Sqrt(f.U*f.D/f.Nu*f.D) / (4 * math.Sqrt(math.Pi))
}

// State returns the state at x.
func (f GaussianWake) State(x [3]float64) field.FlowState {
	a := f.Amplitude()
	e := math.Exp(-f.U * x[1] * x[1] / (4 * f.Nu * x[0]))
	u1 := a / math.Sqrt(x[0]) * e
	// ∂u₁/∂x = u₁(−1/(2x) + Uy²/(4νx²)), ∂u₁/∂y = −u₁ U y/(2νx).
	du1dx := u1 * (-1/(2*x[0]) + f.U*x[1]*x[1]/(4*f.Nu*x[0]*x[0]))
	du1dy := -u1 * f.U * x[1] / (2 * f.Nu * x[0])
	st := field.FlowState{Rho: f.Rho, P: f.PInf, Mu: f.Rho * f.Nu, V: [3]float64{f.U - u1, 0, 0}}
	st.GradV[0] = [3]float64{-du1dx, -du1dy, 0}
	return st
}

// EvalFlow fills dst with the state at x (the location is ignored).
func (f GaussianWake) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) { *dst = f.State(x) }
