package integrate

import (
	"math"
	"testing"

	"farforce/field/fieldtest"
)

// TestFreestreamFromAngles checks the documented angle conventions:
// 2D V∞ = U(cos α, sin α) (VALIDATION.md §1.6); 3D
// V∞ = U(cos α cos β, −sin β, sin α cos β).
func TestFreestreamFromAngles(t *testing.T) {
	v, err := FreestreamFromAngles(10, 30, 0, 2)
	if err != nil || !closeVec(v, Vec3{10 * math.Sqrt(3) / 2, 5, 0}, 1e-15) {
		t.Errorf("2D: %v %v", v, err)
	}
	v, err = FreestreamFromAngles(2, 90, 0, 3)
	if err != nil || !closeVec(v, Vec3{0, 0, 2}, 1e-15) {
		t.Errorf("3D α = 90°: %v %v", v, err)
	}
	v, err = FreestreamFromAngles(2, 0, 90, 3)
	if err != nil || !closeVec(v, Vec3{0, -2, 0}, 1e-15) {
		t.Errorf("3D β = 90°: %v %v", v, err)
	}
	for _, a := range [][4]float64{{-1, 0, 0, 3}, {1, math.NaN(), 0, 3}, {1, 0, 5, 2}, {1, 0, 0, 4}} {
		if _, err := FreestreamFromAngles(a[0], a[1], a[2], int(a[3])); err == nil {
			t.Errorf("%v: no error", a)
		}
	}
}

// TestWindAxes2D: a cylinder with circulation whose stream comes at angle
// of attack α feels lift ρUΓ ⊥ V∞ and no drag. In body axes the force is
// (−sin α, cos α)ρUΓ and D = F_x cos α + F_y sin α, L = −F_x sin α +
// F_y cos α (VALIDATION.md §1.6); c_l = ρUΓ/(½ρU²c) = 2Γ/(Uc).
func TestWindAxes2D(t *testing.T) {
	const alpha, chord = 7.5, 1.4
	v, err := FreestreamFromAngles(cylU, alpha, 0, 2)
	if err != nil {
		t.Fatal(err)
	}
	a := alpha * math.Pi / 180
	flow := fieldtest.Transformed{Base: fieldtest.Cylinder(cylRho, cylU, cylA, cylGamma), Rot: fieldtest.RotZ(a)}
	r := mustForces(t, circle(0, 0, 2, 256, 8), flow, Options{Free: Freestream{V: v, Rho: cylRho}, RefLength: chord})
	wantF := Vec3{-math.Sin(a) * cylLift, math.Cos(a) * cylLift, 0}
	if !closeVec(r.Force, wantF, 1e-11) {
		t.Errorf("force %v, want %v", r.Force, wantF)
	}
	D := r.Force[0]*math.Cos(a) + r.Force[1]*math.Sin(a)
	L := -r.Force[0]*math.Sin(a) + r.Force[1]*math.Cos(a)
	if !near(r.Wind.Drag, D, 1e-12) || !near(r.Wind.Lift, L, 1e-12) || !near(L, cylLift, 1e-10) || r.Wind.Side != 0 {
		t.Errorf("wind %+v, want drag %g lift %g", r.Wind, D, L)
	}
	cl := 2 * cylGamma / (cylU * chord)
	if !r.HasCoefficients || !near(r.Coefficients.Lift, cl, 1e-10) || !near(r.DragCounts, 1e4*r.Coefficients.Drag, 1e-12) {
		t.Errorf("coefficients %+v counts %g, want c_l %g", r.Coefficients, r.DragCounts, cl)
	}
	if !r.HasMomentCoefficients || !near(r.MomentCoefficients[2], r.Moment[2]/(r.DynamicPressure*chord*chord), 1e-15) {
		t.Errorf("moment coefficients %v", r.MomentCoefficients)
	}
	if !closeVec(r.Axes.Side, Vec3{0, 0, -1}, 1e-15) {
		t.Errorf("2D side axis %v, want (0, 0, −1)", r.Axes.Side)
	}
}

// TestWindAxes3D: Stokes drag 6πμa|U| lies along any stream direction
// (VALIDATION.md §3.3), so in wind axes it is pure drag; the triad is
// orthonormal and (drag, side, lift) right-handed; at α = β = 0 it is
// (x, y, z). C_D = 6πμa|U|/(q∞ S) with S = πa².
func TestWindAxes3D(t *testing.T) {
	v, err := FreestreamFromAngles(stkU, 12, -8, 3)
	if err != nil {
		t.Fatal(err)
	}
	flow := fieldtest.StokesSphere{Mu: stkMu, A: stkA, U: v}
	sref := math.Pi * stkA * stkA
	r := mustForces(t, box(Vec3{-1, -1.2, -0.9}, Vec3{1.3, 1, 1.1}, 0.1), flow,
		Options{Free: Freestream{V: v, Rho: 1}, NoConvection: true, RefArea: sref})
	if !near(r.Wind.Drag, stkDrag, 1e-9) || math.Abs(r.Wind.Lift) > 1e-9 || math.Abs(r.Wind.Side) > 1e-9 {
		t.Errorf("wind %+v, want drag %.12f only", r.Wind, stkDrag)
	}
	if cd := stkDrag / (0.5 * stkU * stkU * sref); !near(r.Coefficients.Drag, cd, 1e-9) || r.HasMomentCoefficients {
		t.Errorf("C_D %g, want %g (no moment coefficients without a reference length)", r.Coefficients.Drag, cd)
	}
	ax := r.Axes
	if !closeVec(cross(ax.Drag, ax.Side), ax.Lift, 1e-15) || math.Abs(dot(ax.Drag, ax.Lift)) > 1e-15 || ax.Lift[2] <= 0 {
		t.Errorf("axes %+v not right-handed (drag, side, lift) with lift up", ax)
	}
	a0, _, err := windAxes(Vec3{3, 0, 0}, Vec3{}, 3)
	if err != nil || a0 != (Axes{Drag: Vec3{1, 0, 0}, Lift: Vec3{0, 0, 1}, Side: Vec3{0, 1, 0}}) {
		t.Errorf("axes at zero angles %+v", a0)
	}
	// Without a reference area there are no coefficients, and no NaN.
	r = mustForces(t, sphere(Vec3{}, 1, 4), flow, Options{Free: Freestream{V: v, Rho: 1}, NoConvection: true})
	if r.HasCoefficients || r.Coefficients != (Wind{}) || r.DragCounts != 0 {
		t.Errorf("coefficients without reference area: %+v", r.Coefficients)
	}
}
