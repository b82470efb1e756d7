package integrate

import (
	"math"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/surface"
)

// moveZone rotates the points of z by rot and shifts them by shift.
func moveZone(z *field.Zone, rot [3][3]float64, shift Vec3) {
	for i := 0; i < z.NumPoints(); i++ {
		p := add(fieldtest.MatVec(rot, z.Point(int32(i))), shift)
		copy(z.Points[3*i:3*i+3], p[:])
	}
}

// meshForces samples flow on z, cuts shape through it and integrates.
func meshForces(t *testing.T, z *field.Zone, flow fieldtest.Flow, at field.Centering, shape surface.Shape, opt Options) Result {
	t.Helper()
	loc, ev := sampledFlow(t, z, flow, at)
	c, err := surface.CutSurface(loc, shape, surface.CutOptions{})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Forces(c, ev, opt)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// TestMeshPressureLevel: adding 1e5 to the sampled pressure changes the
// force only by rounding, because the cut surface closes exactly
// (Σ A n ≈ 0; VALIDATION.md §1.3). Rounding bound: 1e5 × 1e-16 per point
// times ~10⁴ points, so 1e-7.
func TestMeshPressureLevel(t *testing.T) {
	shape := surface.Rect{Min: [2]float64{-0.3, 0.1}, Max: [2]float64{0.2, 0.37}}
	opt := Options{Free: Freestream{V: Vec3{1, 0, 0}, Rho: 1}}
	for _, at := range []field.Centering{field.AtPoints, field.AtCells} {
		r0 := meshForces(t, kovMesh(fieldtest.RectTri, 2), fieldtest.Kovasznay{Re: 40}, at, shape, opt)
		r1 := meshForces(t, kovMesh(fieldtest.RectTri, 2), fieldtest.Kovasznay{Re: 40, PInf: 1e5}, at, shape, opt)
		if !closeVec(r1.Force, r0.Force, 1e-7) || !closeVec(r1.Moment, r0.Moment, 1e-7) {
			t.Errorf("%s data: force %v → %v, moment %v → %v with p + 1e5", at, r0.Force, r1.Force, r0.Moment, r1.Moment)
		}
		if norm(r0.Closure) > 1e-12*r0.Area {
			t.Errorf("closure %v", r0.Closure)
		}
	}
}

// TestMeshRigidMotion: rotating and shifting mesh, flow, surface, stream
// and moment centre together rotates the force and moment (frame
// indifference). Linear/multilinear interpolation of point data commutes
// with rigid motions, so for inviscid flows the agreement is to rounding
// amplified by the geometric predicates of the cut (1e-9 relative). The
// field package's recovered gradients and cell-data reconstructions are not
// exactly invariant (their fitting stencils depend on the axes), so where
// they enter the force may change by up to its discretisation error; the
// test allows twice the error of the unmoved result.
func TestMeshRigidMotion(t *testing.T) {
	// 2D: cylinder on a carved quad mesh, polygon contour.
	rot2, shift2 := fieldtest.RotZ(0.7), Vec3{1.3, -0.4, 0}
	poly := [][2]float64{{-1.4, -1.1}, {1.7, -1.3}, {1.5, 1.2}, {-1.2, 1.6}}
	moved2 := make([][2]float64, len(poly))
	for i, p := range poly {
		q := add(fieldtest.MatVec(rot2, Vec3{p[0], p[1], 0}), shift2)
		moved2[i] = [2]float64{q[0], q[1]}
	}
	s0, err := surface.NewPolygon(poly, surface.Resolution{})
	if err != nil {
		t.Fatal(err)
	}
	s1, err := surface.NewPolygon(moved2, surface.Resolution{})
	if err != nil {
		t.Fatal(err)
	}
	var kp [][2]float64
	for _, p := range [][2]float64{{-0.3, 0.1}, {0.2, 0.1}, {0.2, 0.37}, {-0.3, 0.37}} {
		q := add(fieldtest.MatVec(rot2, Vec3{p[0], p[1], 0}), shift2)
		kp = append(kp, [2]float64{q[0], q[1]})
	}
	kovPoly, err := surface.NewPolygon(kp, surface.Resolution{})
	if err != nil {
		t.Fatal(err)
	}
	cyl := fieldtest.Cylinder(cylRho, cylU, cylA, cylGamma)
	mesh2 := func() *field.Zone {
		return fieldtest.Carve(fieldtest.RectQuad([2]float64{-2.5, -2.5}, [2]float64{2.5, 2.5}, [2]int{40, 40}),
			fieldtest.OutsideBall([3]float64{}, cylA))
	}
	opt := cylinderOpt()
	opt.MomentCenter = Vec3{0.3, 0.2, 0}
	// 3D: Stokes sphere on a carved tetrahedral box, rotated box surface.
	angles := Vec3{20, -35, 50}
	rx, ry, rz := fieldtest.RotAxis(Vec3{1, 0, 0}, angles[0]*math.Pi/180), fieldtest.RotAxis(Vec3{0, 1, 0}, angles[1]*math.Pi/180),
		fieldtest.RotAxis(Vec3{0, 0, 1}, angles[2]*math.Pi/180)
	r3 := fieldtest.MatMul(rz, fieldtest.MatMul(ry, rx)) // the documented order of surface.Box rotations
	shift3 := Vec3{0.4, -0.3, 0.25}
	L := Vec3{1.3, 1.1, 1.2}
	mesh3 := func() *field.Zone {
		return fieldtest.Carve(fieldtest.BoxTet(Vec3{-2, -2, -2}, Vec3{2, 2, 2}, [3]int{10, 10, 10}), fieldtest.OutsideBall([3]float64{}, 0.45))
	}
	opt3 := stokesOpt()
	opt3.MomentCenter = Vec3{0.1, 0.2, -0.1}

	pot := fieldtest.SpherePotential{Rho: 1.2, A: stkA, U: [3]float64{1.5, 0, 0}}
	potOpt := Options{Free: Freestream{V: Vec3{1.5, 0, 0}, Rho: 1.2}, MomentCenter: Vec3{0.1, 0.2, -0.1}}
	box0, box1 := surface.Box{Min: sub(Vec3{}, L), Max: L}, surface.Box{Min: sub(shift3, L), Max: add(shift3, L), Rotate: angles}
	kovRect := surface.Rect{Min: [2]float64{-0.3, 0.1}, Max: [2]float64{0.2, 0.37}}
	kovOpt := Options{Free: Freestream{V: Vec3{1, 0, 0}, Rho: 1}}
	kovZone := func() *field.Zone { return kovMesh(fieldtest.RectTri, 1) }
	type motionCase struct {
		name   string
		flow   fieldtest.Flow
		mesh   func() *field.Zone
		s0, s1 surface.Shape
		rot    [3][3]float64
		shift  Vec3
		opt    Options
		at     field.Centering
		exact  Vec3 // exact force before the motion
		// commutes: the sampling commutes with the motion (point data,
		// no gradients), so agreement to rounding is expected.
		commutes bool
	}
	cases := []motionCase{
		{"cylinder", cyl, mesh2, s0, s1, rot2, shift2, opt, field.AtPoints, Vec3{0, cylLift}, true},
		{"potential sphere", pot, mesh3, box0, box1, r3, shift3, potOpt, field.AtPoints, Vec3{}, true},
		{"cylinder", cyl, mesh2, s0, s1, rot2, shift2, opt, field.AtCells, Vec3{0, cylLift}, false},
		{"potential sphere", pot, mesh3, box0, box1, r3, shift3, potOpt, field.AtCells, Vec3{}, false},
		{"Kovasznay", fieldtest.Kovasznay{Re: 40}, kovZone, kovRect, kovPoly, rot2, shift2, kovOpt, field.AtPoints, Vec3{}, false},
		{"Kovasznay", fieldtest.Kovasznay{Re: 40}, kovZone, kovRect, kovPoly, rot2, shift2, kovOpt, field.AtCells, Vec3{}, false},
		{"Stokes", stokesFlow(), mesh3, box0, box1, r3, shift3, opt3, field.AtPoints, Vec3{stkDrag}, false},
	}
	for _, tc := range cases {
		r0 := meshForces(t, tc.mesh(), tc.flow, tc.at, tc.s0, tc.opt)
		z := tc.mesh()
		moveZone(z, tc.rot, tc.shift)
		o := tc.opt
		o.Free.V = fieldtest.MatVec(tc.rot, o.Free.V)
		o.MomentCenter = add(fieldtest.MatVec(tc.rot, o.MomentCenter), tc.shift)
		r1 := meshForces(t, z, fieldtest.Transformed{Base: tc.flow, Rot: tc.rot, Shift: tc.shift}, tc.at, tc.s1, o)
		rot := func(v Vec3) Vec3 { return fieldtest.MatVec(tc.rot, v) }
		if tc.commutes {
			for _, p := range [][2]Vec3{{r1.Force, rot(r0.Force)}, {r1.Moment, rot(r0.Moment)}, {r1.Terms.Pressure, rot(r0.Terms.Pressure)}} {
				if !closeVec(p[0], p[1], 1e-9) {
					t.Errorf("%s, %s data: after motion %v, want %v", tc.name, tc.at, p[0], p[1])
				}
			}
			continue
		}
		diff, err0 := norm(sub(r1.Force, rot(r0.Force))), norm(sub(r0.Force, tc.exact))
		t.Logf("%s, %s data: force change under motion %.3g, discretisation error %.3g", tc.name, tc.at, diff, err0)
		if diff > 2*err0+1e-12 {
			t.Errorf("%s, %s data: force changes by %.3g under a rigid motion, more than twice its error %.3g", tc.name, tc.at, diff, err0)
		}
	}
}

// TestMeshWorkersBitIdentical: on a sampled field the result has the same
// bits for 1, 2 and 7 workers.
func TestMeshWorkersBitIdentical(t *testing.T) {
	L := [3]float64{2, 1.5, 1.5}
	loc, ev := sampledFlow(t, boxMesh(fieldtest.BoxHex, L, 0.25, [3]float64{}), stokesFlow(), field.AtCells)
	c, err := surface.CutSurface(loc, surface.Box{Min: sub(Vec3{}, L), Max: L}, surface.CutOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(c.Points) < 7*ChunkSize {
		t.Fatalf("only %d points: too few chunks to exercise the workers", len(c.Points))
	}
	opt := stokesOpt()
	opt.Workers = 1
	ref, err := Forces(c, ev, opt)
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range []int{2, 7} {
		opt.Workers = w
		if r, err := Forces(c, ev, opt); err != nil || r != ref {
			t.Errorf("workers=%d: %v, result differs:\n%+v\n%+v", w, err, r, ref)
		}
	}
}
