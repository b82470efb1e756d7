package fieldtest

import (
	"math"

	"farforce/field"
)

// Flow is a closed-form flow: it fills the exact state at x, ignoring the
// cell location. Every Flow in this package is a field.FlowEvaluator, so it
// can be handed straight to the force integration in tests, and can be
// sampled onto a mesh with SampleFlow. Implementations are value types and
// safe for concurrent use.
//
// Pressure is absolute: P = PInf + (p − p∞), so tests can check that a
// constant pressure level changes nothing.
type Flow interface {
	field.FlowEvaluator
	// State returns the exact state at x.
	State(x [3]float64) field.FlowState
}

// Array names written by SampleFlow, and the flow map that reads them back.
const (
	VelocityName  = "velocity"
	PressureName  = "pressure"
	DensityName   = "density"
	ViscosityName = "viscosity"
)

// FlowMap returns the field.FlowMap that reads the arrays written by
// SampleFlow: a 3-component velocity vector, pressure, density and dynamic
// viscosity arrays.
func FlowMap() field.FlowMap {
	return field.FlowMap{
		Velocity:  []string{VelocityName},
		Pressure:  PressureName,
		Density:   field.Quantity{Name: DensityName},
		Viscosity: field.Quantity{Name: ViscosityName},
	}
}

// SampleFlow adds the arrays velocity (3 components), pressure, density and
// viscosity of f to z, at its points (at == field.AtPoints) or at the node
// centroids of its cells (field.AtCells, what a cell-centred solver stores
// to second order).
func SampleFlow(z *field.Zone, f Flow, at field.Centering) {
	sample := SamplePoints
	if at == field.AtCells {
		sample = SampleCells
	}
	sample(z, VelocityName, 3, func(x [3]float64, dst []float64) {
		s := f.State(x)
		copy(dst, s.V[:])
	})
	sample(z, PressureName, 1, func(x [3]float64, dst []float64) { dst[0] = f.State(x).P })
	sample(z, DensityName, 1, func(x [3]float64, dst []float64) { dst[0] = f.State(x).Rho })
	sample(z, ViscosityName, 1, func(x [3]float64, dst []float64) { dst[0] = f.State(x).Mu })
}

// Transformed is Base rotated by Rot and then translated by Shift: a point
// x of the new flow corresponds to x₀ = Rotᵀ(x − Shift) of Base, and
//
//	V(x) = Rot V₀(x₀),  ∇V(x) = Rot ∇V₀(x₀) Rotᵀ,  p, ρ, μ unchanged.
//
// Rot must be a proper rotation matrix (use RotZ for 2D flows, which stay
// in their plane). Forces on a surface transformed the same way are rotated
// by Rot; moments about a transformed centre likewise.
type Transformed struct {
	Base  Flow
	Rot   [3][3]float64
	Shift [3]float64
}

// State returns the state of the transformed flow at x.
func (t Transformed) State(x [3]float64) field.FlowState {
	var d, x0 [3]float64
	for k := range d {
		d[k] = x[k] - t.Shift[k]
	}
	for i := 0; i < 3; i++ {
		for k := 0; k < 3; k++ {
			x0[i] += t.Rot[k][i] * d[k]
		}
	}
	s := t.Base.State(x0)
	out := s
	out.V = MatVec(t.Rot, s.V)
	out.GradV = MatMul(MatMul(t.Rot, s.GradV), Transpose(t.Rot))
	if s.HasR {
		out.R = MatMul(MatMul(t.Rot, s.R), Transpose(t.Rot))
	}
	return out
}

// EvalFlow implements field.FlowEvaluator; the location is ignored.
func (t Transformed) EvalFlow(_ field.Location, x [3]float64, dst *field.FlowState) {
	*dst = t.State(x)
}

// RotZ returns the rotation by angle radians about the z axis.
func RotZ(angle float64) [3][3]float64 {
	c, s := math.Cos(angle), math.Sin(angle)
	return [3][3]float64{{c, -s, 0}, {s, c, 0}, {0, 0, 1}}
}

// RotAxis returns the rotation by angle radians about the unit axis u
// (Rodrigues' formula).
func RotAxis(u [3]float64, angle float64) [3][3]float64 {
	c, s := math.Cos(angle), math.Sin(angle)
	var r [3][3]float64
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			r[i][j] = (1 - c) * u[i] * u[j]
			if i == j {
				r[i][j] += c
			}
		}
	}
	r[0][1] -= s * u[2]
	r[0][2] += s * u[1]
	r[1][0] += s * u[2]
	r[1][2] -= s * u[0]
	r[2][0] -= s * u[1]
	r[2][1] += s * u[0]
	return r
}

// MatVec returns a v.
func MatVec(a [3][3]float64, v [3]float64) [3]float64 {
	var r [3]float64
	for i := 0; i < 3; i++ {
		r[i] = a[i][0]*v[0] + a[i][1]*v[1] + a[i][2]*v[2]
	}
	return r
}

// MatMul returns a b.
func MatMul(a, b [3][3]float64) [3][3]float64 {
	var r [3][3]float64
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			r[i][j] = a[i][0]*b[0][j] + a[i][1]*b[1][j] + a[i][2]*b[2][j]
		}
	}
	return r
}

// Transpose returns aᵀ.
func Transpose(a [3][3]float64) [3][3]float64 {
	var r [3][3]float64
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			r[i][j] = a[j][i]
		}
	}
	return r
}
