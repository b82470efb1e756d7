package integrate

import "fmt"

// Vec3 is a Cartesian vector (x, y, z).
type Vec3 = [3]float64

// Freestream is the undisturbed flow: velocity V (m/s), density Rho
// (kg/m³) and pressure P (Pa). P is the reference pressure p_ref subtracted
// from p; V is the stream of the deficit form and the drag direction; Rho
// and |V| give the dynamic pressure q∞ = ½ρ∞|V∞|² of the coefficients.
type Freestream struct {
	V      Vec3
	Rho, P float64
}

// Options controls Forces.
type Options struct {
	// Free is the freestream (reference pressure, deficit velocity,
	// coefficient scaling).
	Free Freestream
	// Up is the "up" direction that, with the stream, defines lift; zero
	// means +z in 3D and +y in 2D.
	Up Vec3
	// RefArea (m²) scales force coefficients in 3D; RefLength (m) scales
	// force coefficients in 2D (per unit span) and moment coefficients in
	// both. Zero means "not given": the corresponding coefficients are
	// then not computed (see Result.HasCoefficients).
	RefArea, RefLength float64
	// MomentCenter is the point moments are taken about.
	MomentCenter Vec3
	// Plain selects the plain momentum flux ρV(V·n) instead of the
	// default deficit form ρ(V − V∞)(V·n); required when mass is created
	// inside the surface.
	Plain bool
	// NoConvection drops the momentum flux (creeping-flow fields).
	NoConvection bool
	// Workers is the number of goroutines; ≤ 0 means runtime.GOMAXPROCS.
	// The result does not depend on it.
	Workers int
}

// check validates the options: finite values, non-negative density and
// reference quantities.
func (o *Options) check() error {
	bad := func(what string, v float64) error {
		return fmt.Errorf("%w: %s = %g, want a finite value", ErrOption, what, v)
	}
	for k := 0; k < 3; k++ {
		if !finite(o.Free.V[k]) {
			return bad("freestream velocity component", o.Free.V[k])
		}
		if !finite(o.Up[k]) {
			return bad("up component", o.Up[k])
		}
		if !finite(o.MomentCenter[k]) {
			return bad("moment centre component", o.MomentCenter[k])
		}
	}
	if !finite(o.Free.P) {
		return bad("freestream pressure", o.Free.P)
	}
	if !finite(o.Free.Rho) || o.Free.Rho < 0 {
		return fmt.Errorf("%w: freestream density = %g, want finite and ≥ 0", ErrOption, o.Free.Rho)
	}
	if !finite(o.RefArea) || o.RefArea < 0 {
		return fmt.Errorf("%w: reference area = %g, want finite and ≥ 0 (0 = not given)", ErrOption, o.RefArea)
	}
	if !finite(o.RefLength) || o.RefLength < 0 {
		return fmt.Errorf("%w: reference length = %g, want finite and ≥ 0 (0 = not given)", ErrOption, o.RefLength)
	}
	return nil
}

// finite reports whether v is neither NaN nor infinite (v − v is NaN
// exactly for those).
func finite(v float64) bool { return v-v == 0 }
