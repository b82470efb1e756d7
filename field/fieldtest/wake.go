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
func (f EllipticWake) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}

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
func (f GaussianWake) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}

// VortexPair is the crossflow of two Gaussian (Lamb–Oseen) vortices of
// circulation −Gamma at y = −Sep/2 and +Gamma at y = +Sep/2 (z = 0), each
// with vorticity ξ = ±Γ/(2πσ²) e^(−r²/(2σ²)), σ = Sigma, in a stream U
// along +x: a smooth model of a rolled-up wake. Each vortex induces
//
//	u_θ = Γ/(2πr) (1 − e^(−r²/(2σ²)))   (counter-clockwise for Γ > 0);
//
// the pressure is PInf − ½ρ(v² + w²) (uniform total pressure), μ = 0. Its
// lift is ρUΓ·Sep (Kutta–Joukowski per strip) and, for Sep ≫ σ, its
// induced drag is (ρΓ²/2π)[ln(Sep/(2σ)) + γ_E/2 + ½E₁(Sep²/(4σ²))] (see
// InducedDrag).
type VortexPair struct {
	Rho, U, Gamma, Sep, Sigma, PInf float64
}

// vortex adds the velocity and gradient of one vortex of circulation g at
// (yc, 0) to the crossflow at (y, z).
func (f VortexPair) vortex(g, yc, y, z float64, vw *[2]float64, grad *[2][2]float64) {
	dy := y - yc
	q := dy*dy + z*z
	s2 := 2 * f.Sigma * f.Sigma
	var gq, dgq float64 // g(q) = (1 − e^(−q/s2))/q and its derivative
	if q < 1e-6*s2 {
		gq, dgq = (1-q/(2*s2))/s2, -1/(2*s2*s2)
	} else {
		e := math.Exp(-q / s2)
		gq = (1 - e) / q
		dgq = (e/s2*q - (1 - e)) / (q * q)
	}
	k := g / (2 * math.Pi)
	fr, df := k*gq, k*dgq*2 // f = u_θ/r, ∂f/∂y = df·dy, ∂f/∂z = df·z
	vw[0] += -fr * z
	vw[1] += fr * dy
	grad[0][0] += -z * df * dy
	grad[0][1] += -fr - z*df*z
	grad[1][0] += fr + dy*df*dy
	grad[1][1] += dy * df * z
}

// State returns the state at x.
func (f VortexPair) State(x [3]float64) field.FlowState {
	var vw [2]float64
	var g [2][2]float64 // g[0] = (∂v/∂y, ∂v/∂z), g[1] = (∂w/∂y, ∂w/∂z)
	f.vortex(-f.Gamma, -f.Sep/2, x[1], x[2], &vw, &g)
	f.vortex(f.Gamma, f.Sep/2, x[1], x[2], &vw, &g)
	st := field.FlowState{Rho: f.Rho, P: f.PInf - 0.5*f.Rho*(vw[0]*vw[0]+vw[1]*vw[1]), V: [3]float64{f.U, vw[0], vw[1]}}
	st.GradV[1] = [3]float64{0, g[0][0], g[0][1]}
	st.GradV[2] = [3]float64{0, g[1][0], g[1][1]}
	return st
}

// EvalFlow fills dst with the state at x (the location is ignored).
func (f VortexPair) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}

// InducedDrag returns the exact crossflow energy (ρ/2)∬ψξ dS of the
// pair, (ρΓ²/2π)[ln(d/(2σ)) + γ_E/2 + ½E₁(d²/(4σ²))], d = Sep, from
// ∬ψξ = −(1/2π)∬∬ ξξ′ ln|x − x′|: for two Gaussians of variance σ² per
// axis the separation of two samples is Gaussian with variance 2σ², and
// E[ln|Z|²] = ln|μ|² + E₁(|μ|²/(2s²)) for Z ~ N(μ, s²I) in the plane
// (E[ln χ²₂] = ln 2 − γ_E at μ = 0) (derived here from these standard
// facts). E₁ is taken from its asymptotic series, accurate to 1e-12
// relative for d ≥ 8σ.
func (f VortexPair) InducedDrag() float64 {
	const eulerGamma = 0.57721566490153286061
	x := f.Sep * f.Sep / (4 * f.Sigma * f.Sigma)
	e1, term := 0.0, math.Exp(-x)/x
	for k := 1; k < 12 && math.Abs(term) > 1e-300; k++ {
		e1 += term
		term *= -float64(k) / x
	}
	return f.Rho * f.Gamma * f.Gamma / (2 * math.Pi) * (math.Log(f.Sep/(2*f.Sigma)) + eulerGamma/2 + e1/2)
}
