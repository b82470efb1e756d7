package fieldtest

import (
	"math"
	"math/cmplx"

	"farforce/field"
)

// Source2D is a plane source of volume flux M per unit span (m²/s) at
// (X, Y); a negative M is a sink.
type Source2D struct{ X, Y, M float64 }

// Potential2D is a steady, incompressible, inviscid plane flow (in z = 0)
// made of a uniform stream U along +x, a doublet and a clockwise point
// vortex at the origin, and point sources. Its complex velocity, with
// z = x + iy, is
//
//	W(z) = u − iv = U − D/z² + iΓ/(2πz) + Σ_k m_k / (2π(z − z_k)),
//
// so u = Re W, v = −Im W, ∂u/∂x = Re W′, ∂u/∂y = −Im W′, ∂v/∂x = −Im W′,
// ∂v/∂y = −Re W′, and Bernoulli gives p = PInf + ½ρ(U² − u² − v²). μ = 0.
// (Standard potential-flow superposition, e.g. Batchelor 1967 §6.4-6.6;
// VALIDATION.md §3.1, checked by pot2d.py.)
//
// The exact force per unit span on the singularities inside a closed
// contour (Kutta–Joukowski and Lagally theorems, VALIDATION.md §3.1):
// (−ρU Σm_k, ρUΓ) summed over enclosed singularities; zero for a doublet or
// a source–sink pair of zero net flux in a stream.
type Potential2D struct {
	Rho, PInf float64
	U         float64 // stream speed along +x (m/s)
	Doublet   float64 // D (m³/s); a cylinder of radius a in a stream U has D = U a²
	Gamma     float64 // clockwise circulation Γ (m²/s): lift +ρUΓ along +y
	Sources   []Source2D
}

// Cylinder returns the flow past a circular cylinder of radius a centred at
// the origin in a stream U along +x with clockwise circulation Γ:
//
//	u − iv = U(1 − a²/z²) + iΓ/(2πz).
//
// Force on any contour enclosing r = a: (0, ρUΓ) (Kutta–Joukowski); on a
// centred circle of radius R the momentum-flux and pressure parts are
// (ρUΓ/2)(1 − a²/R²) and (ρUΓ/2)(1 + a²/R²) (VALIDATION.md §3.1a, pot2d.py).
func Cylinder(rho, U, a, gamma float64) Potential2D {
	return Potential2D{Rho: rho, U: U, Doublet: U * a * a, Gamma: gamma}
}

// PointVortex returns a clockwise point vortex Γ at the origin in a stream
// U along +x (a cylinder of radius 0). On a centred rectangle |x| ≤ A,
// |y| ≤ B the lift ρUΓ splits exactly into (2/π)atan(B/A)ρUΓ of momentum
// flux and (2/π)atan(A/B)ρUΓ of pressure (VALIDATION.md §3.1b, visc2d.py).
func PointVortex(rho, U, gamma float64) Potential2D {
	return Potential2D{Rho: rho, U: U, Gamma: gamma}
}

// RankineOval returns a source of flux m at (−b, 0) and a sink at (b, 0) in
// a stream U: zero force on any contour enclosing both
// (VALIDATION.md §3.1c, pot2d.py).
func RankineOval(rho, U, m, b float64) Potential2D {
	return Potential2D{Rho: rho, U: U, Sources: []Source2D{{-b, 0, m}, {b, 0, -m}}}
}

// RankineHalfBody returns a single source of flux m at the origin in a
// stream U. Exact force on the source (Lagally): (−ρUm, 0); mass flux out of
// any enclosing contour ρm. The (V − V∞) form of the balance gives 0, which
// is wrong here (VALIDATION.md §1.4 and §3.1d, pot2d.py).
func RankineHalfBody(rho, U, m float64) Potential2D {
	return Potential2D{Rho: rho, U: U, Sources: []Source2D{{0, 0, m}}}
}

// State returns the exact state at x (x[2] is ignored).
func (f Potential2D) State(x [3]float64) field.FlowState {
	z := complex(x[0], x[1])
	w := complex(f.U, 0)
	var dw complex128
	if f.Doublet != 0 {
		z2 := z * z
		w -= complex(f.Doublet, 0) / z2
		dw += complex(2*f.Doublet, 0) / (z2 * z)
	}
	if f.Gamma != 0 {
		g := complex(0, f.Gamma/(2*math.Pi))
		w += g / z
		dw -= g / (z * z)
	}
	for _, s := range f.Sources {
		d := z - complex(s.X, s.Y)
		c := complex(s.M/(2*math.Pi), 0)
		w += c / d
		dw -= c / (d * d)
	}
	u, v := real(w), -imag(w)
	var st field.FlowState
	st.Rho = f.Rho
	st.V = [3]float64{u, v, 0}
	st.GradV[0][0], st.GradV[0][1] = real(dw), -imag(dw)
	st.GradV[1][0], st.GradV[1][1] = -imag(dw), -real(dw)
	q := cmplx.Abs(w)
	st.P = f.PInf + 0.5*f.Rho*(f.U*f.U-q*q)
	return st
}

// EvalFlow implements field.FlowEvaluator; the location is ignored.
func (f Potential2D) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}

// Kovasznay is Kovasznay's exact steady solution of the plane
// incompressible Navier–Stokes equations (Kovasznay 1948, Proc. Camb. Phil.
// Soc. 44:58; VALIDATION.md §3.7, visc2d.py), with ρ = 1, μ = 1/Re and
// λ = Re/2 − √(Re²/4 + 4π²):
//
//	u = 1 − e^{λx} cos 2πy,  v = (λ/2π) e^{λx} sin 2πy,  p = PInf + ½(1 − e^{2λx}).
//
// No body: the net force on any closed contour is 0 while its momentum,
// pressure and viscous parts are not.
type Kovasznay struct{ Re, PInf float64 }

// Lambda returns λ = Re/2 − √(Re²/4 + 4π²).
func (f Kovasznay) Lambda() float64 {
	return f.Re/2 - math.Sqrt(f.Re*f.Re/4+4*math.Pi*math.Pi)
}

// State returns the exact state at x.
func (f Kovasznay) State(x [3]float64) field.FlowState {
	lam := f.Lambda()
	e := math.Exp(lam * x[0])
	s, c := math.Sincos(2 * math.Pi * x[1])
	var st field.FlowState
	st.Rho = 1
	st.Mu = 1 / f.Re
	st.P = f.PInf + 0.5*(1-e*e)
	st.V = [3]float64{1 - e*c, lam / (2 * math.Pi) * e * s, 0}
	st.GradV[0][0] = -lam * e * c
	st.GradV[0][1] = 2 * math.Pi * e * s
	st.GradV[1][0] = lam * lam / (2 * math.Pi) * e * s
	st.GradV[1][1] = lam * e * c
	return st
}

// EvalFlow implements field.FlowEvaluator; the location is ignored.
func (f Kovasznay) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = f.State(x)
}
