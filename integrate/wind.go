package integrate

import (
	"fmt"
	"math"
)

// FreestreamFromAngles returns the freestream velocity of the given speed
// (m/s) at angle of attack alphaDeg and sideslip betaDeg (degrees) in body
// axes with x pointing downstream at zero angles and z (3D) or y (2D) up:
//
//	3D: V∞ = speed (cos α cos β, −sin β, sin α cos β)
//	2D: V∞ = speed (cos α, sin α, 0)
//
// A positive α tilts the stream towards +z (+y in 2D), so that lift, taken
// ⊥ V∞ on the up side, tilts towards −x. A positive β makes the stream
// arrive from the +y side (its y component is negative) — the aeronautical
// sense when +y is the starboard side (x aft, z up; common practice). In
// 2D betaDeg must be 0.
//
// Errors: dim not 2 or 3, non-finite arguments, a negative speed, or
// non-zero sideslip in 2D (all wrap ErrOption).
func FreestreamFromAngles(speed, alphaDeg, betaDeg float64, dim int) (Vec3, error) {
	if !finite(speed) || speed < 0 || !finite(alphaDeg) || !finite(betaDeg) {
		return Vec3{}, fmt.Errorf("%w: freestream speed %g, alpha %g°, beta %g°: want finite values and speed ≥ 0", ErrOption, speed, alphaDeg, betaDeg)
	}
	sa, ca := math.Sincos(alphaDeg * math.Pi / 180)
	switch dim {
	case 2:
		if betaDeg != 0 {
			return Vec3{}, fmt.Errorf("%w: sideslip %g° given for a 2D field", ErrOption, betaDeg)
		}
		return Vec3{speed * ca, speed * sa, 0}, nil
	case 3:
		sb, cb := math.Sincos(betaDeg * math.Pi / 180)
		return Vec3{speed * ca * cb, -speed * sb, speed * sa * cb}, nil
	}
	return Vec3{}, fmt.Errorf("%w: dimension %d, want 2 or 3", ErrOption, dim)
}

// windAxes returns the wind-axis triad (see Axes) for stream v and up
// direction up (zero: +z in 3D, +y in 2D). ok is false, with zero axes,
// when v = 0. An up axis parallel to v (or zero after projection) is an
// error.
func windAxes(v, up Vec3, dim int) (Axes, bool, error) {
	speed := norm(v)
	if speed == 0 {
		return Axes{}, false, nil
	}
	if up == (Vec3{}) {
		if dim == 2 {
			up = Vec3{0, 1, 0}
		} else {
			up = Vec3{0, 0, 1}
		}
	}
	var a Axes
	a.Drag = scale(v, 1/speed)
	l := sub(up, scale(a.Drag, dot(up, a.Drag)))
	ln := norm(l)
	if ln <= 1e-9*norm(up) {
		return Axes{}, false, fmt.Errorf("%w: up axis (%g, %g, %g) is parallel to the stream (%g, %g, %g): lift is undefined",
			ErrOption, up[0], up[1], up[2], v[0], v[1], v[2])
	}
	a.Lift = scale(l, 1/ln)
	a.Side = cross(a.Lift, a.Drag)
	return a, true, nil
}

// applyWind fills the wind components, dynamic pressure and coefficients
// of r from its force and moment. Coefficients that would not be finite
// (a vanishing or tiny reference) are left out, with their flags false.
func applyWind(r *Result, opt *Options) {
	if !r.HasWind {
		return
	}
	r.Wind = Wind{Drag: dot(r.Force, r.Axes.Drag), Lift: dot(r.Force, r.Axes.Lift), Side: dot(r.Force, r.Axes.Side)}
	v := opt.Free.V
	r.DynamicPressure = 0.5 * opt.Free.Rho * dot(v, v)
	sref := opt.RefArea
	if r.Dim == 2 {
		sref = opt.RefLength
	}
	q := r.DynamicPressure
	if !(q*sref > 0) || !finite(q*sref) {
		return // no reference, no stream density, or out of range
	}
	c := Wind{Drag: r.Wind.Drag / (q * sref), Lift: r.Wind.Lift / (q * sref), Side: r.Wind.Side / (q * sref)}
	if !finite(1e4*c.Drag) || !finite(c.Lift) || !finite(c.Side) {
		return // a reference so small that the coefficients overflow
	}
	r.HasCoefficients, r.Coefficients, r.DragCounts = true, c, 1e4*c.Drag
	if d := q * sref * opt.RefLength; d > 0 && finite(d) {
		if m := scale(r.Moment, 1/d); finiteVec(m) {
			r.HasMomentCoefficients, r.MomentCoefficients = true, m
		}
	}
}

func norm(v Vec3) float64 { return math.Sqrt(dot(v, v)) }

func scale(v Vec3, s float64) Vec3 { return Vec3{v[0] * s, v[1] * s, v[2] * s} }
