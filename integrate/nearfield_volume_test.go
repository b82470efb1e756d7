package integrate_test

import (
	"fmt"
	"math"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/integrate"
	"farforce/surface"
)

// volumeNear extracts the body faces of f (boundary faces with centroid
// inside the ball |x| < rBody) and integrates the wall loads of flow, or of
// the field's own arrays through a FlowSampler when flow is nil.
func volumeNear(t *testing.T, f *field.Field, rBody float64, flow field.FlowEvaluator, opt integrate.Options) integrate.NearResult {
	t.Helper()
	faces, err := field.BoundaryFaces(f, func(p [3]float64) bool { return p[0]*p[0]+p[1]*p[1]+p[2]*p[2] < rBody*rBody })
	if err != nil {
		t.Fatal(err)
	}
	loc, err := field.NewLocator(f)
	if err != nil {
		t.Fatal(err)
	}
	if flow == nil {
		fs, err := field.NewFlowSampler(field.NewSampler(loc), fieldtest.FlowMap())
		if err != nil {
			t.Fatal(err)
		}
		flow = fs
	}
	r, err := integrate.NearFieldVolume(loc, flow, faces, opt)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// Stokes sphere (Stokes 1851; VALIDATION.md §3.3) on a body-fitted shell of
// hexahedra: the wall is extracted from the volume mesh and p, τ come from
// the adjacent cells. Pressure 2πμaU, friction 4πμaU; second order with
// the exact flow evaluated on the faces (geometry and quadrature); with the
// flow sampled at the nodes (trilinear values, recovered gradients) the
// pressure stays second order and the friction is first order.
func TestNearFieldVolumeStokesSphere(t *testing.T) {
	flow := fieldtest.StokesSphere{Mu: stMu, Rho: 1, PInf: 7, A: stA, U: [3]float64{stU, 0, 0}}
	pExact := 2 * math.Pi * stMu * stA * stU
	fExact := 4 * math.Pi * stMu * stA * stU
	opt := integrate.Options{Free: integrate.Freestream{V: [3]float64{stU, 0, 0}, Rho: 1, P: 7}}
	for _, sampled := range []bool{false, true} {
		var ep, ef [3]float64
		for i, n := range []int{4, 8, 16} {
			z := fieldtest.WallShell([3]float64{}, stA, 4*stA, n, n)
			var ev field.FlowEvaluator = flow
			if sampled {
				fieldtest.SampleFlow(z, flow, field.AtPoints)
				ev = nil
			}
			r := volumeNear(t, &field.Field{Zones: []*field.Zone{z}}, 2*stA, ev, opt)
			if r.Facets != 6*n*n {
				t.Errorf("n=%d: %d wall faces, want %d", n, r.Facets, 6*n*n)
			}
			ep[i] = math.Abs(r.Pressure[0]-pExact) / pExact
			ef[i] = math.Abs(r.Friction[0]-fExact) / fExact
			t.Logf("sampled=%v n=%2d: pressure %.8f (exact %.8f) friction %.8f (exact %.8f) F=%v M=%v",
				sampled, n, r.Pressure[0], pExact, r.Friction[0], fExact, r.Force, r.Moment)
			if math.Abs(r.Force[1]) > 1e-9*fExact || math.Abs(r.Force[2]) > 1e-9*fExact {
				t.Errorf("n=%d: cross-stream force %v, want 0 by symmetry", n, r.Force)
			}
		}
		for _, c := range []struct {
			name string
			e    [3]float64
		}{{"pressure", ep}, {"friction", ef}} {
			q := observedOrder(c.e)
			t.Logf("sampled=%v: %s relative errors %.3g %.3g %.3g, order %.3f", sampled, c.name, c.e[0], c.e[1], c.e[2], q)
			// Second order (band ±0.2 as for the wall-file tests), except
			// the friction of sampled data: the velocity gradient at the
			// wall comes from one layer of cells on one side, so it is
			// first order in the wall-normal spacing whatever the gradient
			// method (a one-sided difference; measured: shape-function
			// gradients −26 %, −14 %, −7 %; recovered −44 %, −22 %, −11 %).
			want := 2.0
			if sampled && c.name == "friction" {
				want = 1
			}
			if math.Abs(q-want) > 0.2 {
				t.Errorf("sampled=%v: %s order %.3f, want %g ± 0.2", sampled, c.name, q, want)
			}
		}
	}
}

// Cylinder with circulation (VALIDATION.md §3.1a) on a polar grid of
// quads: the near field from the mesh boundary r = a is (0, ρUΓ), all
// pressure, second order in the cell size.
func TestNearFieldVolumeCylinder2D(t *testing.T) {
	const rho, u, a, gam = 1.3, 2.0, 0.7, 3.1
	flow := fieldtest.Cylinder(rho, u, a, gam)
	lift := rho * u * gam
	var e [3]float64
	for i, n := range []int{32, 64, 128} {
		z := fieldtest.Annulus(0, 0, a, 4*a, n/4, n)
		fieldtest.SampleFlow(z, flow, field.AtPoints)
		r := volumeNear(t, &field.Field{Zones: []*field.Zone{z}}, 2*a, nil, integrate.Options{Free: integrate.Freestream{V: [3]float64{u, 0, 0}, Rho: rho}})
		e[i] = math.Abs(r.Force[1]-lift) / lift
		t.Logf("n=%3d: F=%v (pressure %v) M=%v", n, r.Force, r.Pressure, r.Moment)
		if r.Facets != n || math.Abs(r.Force[0]) > 1e-9*lift {
			t.Errorf("n=%d: %d faces, drag %g; want %d faces and no drag", n, r.Facets, r.Force[0], n)
		}
	}
	q := observedOrder(e)
	t.Logf("lift relative errors %.3g %.3g %.3g, order %.3f", e[0], e[1], e[2], q)
	if math.Abs(q-2) > 0.2 {
		t.Errorf("lift order %.3f, want 2 ± 0.2", q)
	}
}

// Far field against near field on the Stokes sphere (VALIDATION.md §3.3):
// the far field through a sphere of radius 1.5a cut through a shell mesh
// (exact flow, convective flux off) and the near field of the wall file
// with the exact loads both tend to 6πμaU; their difference, from
// CompareNearFar, falls at second order with the resolution (both
// tessellations refined together).
func TestCompareNearFarStokes(t *testing.T) {
	flow := fieldtest.StokesSphere{Mu: stMu, PInf: 7, A: stA, U: [3]float64{stU, 0, 0}}
	opt := integrate.Options{Free: integrate.Freestream{V: [3]float64{stU, 0, 0}, Rho: 1, P: 7}, RefArea: math.Pi * stA * stA, NoConvection: true}
	exact := 6 * math.Pi * stMu * stA * stU
	// The far-field surface only needs cells to lie in: a coarse shell.
	shell := fieldtest.WallShell([3]float64{}, stA, 2*stA, 4, 2)
	loc, err := field.NewLocator(&field.Field{Zones: []*field.Zone{shell}})
	if err != nil {
		t.Fatal(err)
	}
	var e [3]float64
	for i, n := range []int{4, 8, 16} {
		sp, err := surface.ParseSpec(fmt.Sprintf("sphere center=0,0,0 radius=%g facets=%d", 1.5*stA, 24*n*n))
		if err != nil {
			t.Fatal(err)
		}
		cut, err := surface.CutSurface(loc, sp, surface.CutOptions{})
		if err != nil {
			t.Fatal(err)
		}
		far, err := integrate.Forces(cut, flow, opt)
		if err != nil {
			t.Fatal(err)
		}
		wall := fieldtest.WallSphere([3]float64{}, stA, n)
		fieldtest.SampleFlow(wall, flow, field.AtPoints)
		fieldtest.SamplePoints(wall, "tau", 3, func(x [3]float64, dst []float64) {
			// Exact τ·n_b of the flow at the wall node, n_b radial.
			s := flow.State(x)
			r := math.Sqrt(x[0]*x[0] + x[1]*x[1] + x[2]*x[2])
			n := [3]float64{x[0] / r, x[1] / r, x[2] / r}
			div := s.GradV[0][0] + s.GradV[1][1] + s.GradV[2][2]
			for k := 0; k < 3; k++ {
				dst[k] = 0
				for j := 0; j < 3; j++ {
					dst[k] += s.Mu * (s.GradV[k][j] + s.GradV[j][k]) * n[j]
				}
				dst[k] -= 2.0 / 3 * s.Mu * div * n[k]
			}
		})
		near, err := integrate.NearField(wall, integrate.WallOptions{Pressure: fieldtest.PressureName, Traction: "tau"}, opt)
		if err != nil {
			t.Fatal(err)
		}
		d := integrate.CompareNearFar(far, near)
		e[i] = math.Abs(d.Wind.Drag) / exact
		t.Logf("n=%2d: far %.8f (%d facets), near %.8f, exact %.8f; far − near: %.3g N, %.2f counts, %.4f %%",
			n, far.Wind.Drag, far.Facets, near.Wind.Drag, exact, d.Wind.Drag, d.DragCounts, d.DragPercent)
		if math.Abs(d.DragCounts-1e4*(far.Coefficients.Drag-near.Coefficients.Drag)) > 1e-9 ||
			math.Abs(d.DragPercent-100*d.Wind.Drag/near.Wind.Drag) > 1e-9 {
			t.Errorf("difference %+v inconsistent with far %+v near %+v", d, far.Coefficients, near.Coefficients)
		}
	}
	q := observedOrder(e)
	t.Logf("|far − near|/exact: %.3g %.3g %.3g, order %.3f", e[0], e[1], e[2], q)
	if q < 1.8 { // both sides are second order (±0.2 band as above)
		t.Errorf("far − near order %.3f, want ≥ 1.8", q)
	}
}

// BenchmarkNearFieldVolume: boundary extraction and the volume near field
// of the Stokes sphere on a 6·16²·8 hexahedron shell (sampled data);
// reports wall faces per second.
func BenchmarkNearFieldVolume(b *testing.B) {
	flow := fieldtest.StokesSphere{Mu: stMu, Rho: 1, A: stA, U: [3]float64{stU, 0, 0}}
	z := fieldtest.WallShell([3]float64{}, stA, 4*stA, 16, 8)
	fieldtest.SampleFlow(z, flow, field.AtPoints)
	f := &field.Field{Zones: []*field.Zone{z}}
	loc, err := field.NewLocator(f)
	if err != nil {
		b.Fatal(err)
	}
	fs, err := field.NewFlowSampler(field.NewSampler(loc), fieldtest.FlowMap())
	if err != nil {
		b.Fatal(err)
	}
	inside := func(p [3]float64) bool { return p[0]*p[0]+p[1]*p[1]+p[2]*p[2] < 4*stA*stA }
	b.ReportAllocs()
	var nf int
	for b.Loop() {
		faces, err := field.BoundaryFaces(f, inside)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := integrate.NearFieldVolume(loc, fs, faces, integrate.Options{}); err != nil {
			b.Fatal(err)
		}
		nf = len(faces)
	}
	b.ReportMetric(float64(nf)*float64(b.N)/b.Elapsed().Seconds(), "faces/s")
}

// The real benchmark solution (Schäfer & Turek 1996, case 2D-1; files and
// provenance in ../testdata/real): the body is extracted from the volume
// mesh (boundary edges within 0.06 of the cylinder axis) and p, τ are
// evaluated in the adjacent triangles. Tolerances, with c_D = 5.57953523384
// (Nabh 1998; John & Matthies 2001):
//   - P2-refined file: the wall values are the same P2 nodes as the wall
//     file, so c_D is held to 0.5 % of the reference as there
//     (TestNearFieldDFG2D1Wall) and to 0.2 % of the wall file's 5.558367
//     (only the friction differs: recovered gradients against the solver's
//     own; measured 5.5555);
//   - vertex-only file: the wall gradient comes from linear triangles, first
//     order (see TestNearFieldVolumeStokesSphere); held to ±0.12, the
//     accuracy ../testdata/real/README.md expects on this file (measured
//     5.5280).
func TestNearFieldVolumeDFG2D1(t *testing.T) {
	opt := integrate.Options{Free: integrate.Freestream{V: [3]float64{0.2, 0, 0}, Rho: 1}, RefLength: 0.1}
	// Wall edge counts: the wall file's 128 P2 nodes are 64 element edges,
	// each split in two in the P2-refined file.
	type check struct{ ref, tol float64 }
	for _, c := range []struct {
		file   string
		faces  int
		checks []check
	}{
		{"dfg2d1_coarse_tri_p2refined_binary.vtk", 128, []check{{5.57953523384, 0.005 * 5.57953523384}, {5.558367, 0.002 * 5.558367}}},
		{"dfg2d1_coarse_tri_vertices_binary.vtk", 64, []check{{5.57953523384, 0.12}}},
	} {
		f, loc, flow := dfgFlow(t, c.file)
		faces, err := field.BoundaryFaces(f, func(p [3]float64) bool {
			return (p[0]-0.2)*(p[0]-0.2)+(p[1]-0.2)*(p[1]-0.2) < 0.06*0.06
		})
		if err != nil {
			t.Fatal(err)
		}
		r, err := integrate.NearFieldVolume(loc, flow, faces, opt)
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("%s: %d wall edges, c_D = %.5f (pressure %.5f, friction %.5f), c_L = %.5f",
			c.file, len(faces), r.Coefficients.Drag, r.PressureCoefficients.Drag, r.FrictionCoefficients.Drag, r.Coefficients.Lift)
		if len(faces) != c.faces {
			t.Errorf("%s: %d wall edges, want %d", c.file, len(faces), c.faces)
		}
		for _, k := range c.checks {
			if math.Abs(r.Coefficients.Drag-k.ref) > k.tol {
				t.Errorf("%s: c_D = %.5f, want %.5f ± %.3g", c.file, r.Coefficients.Drag, k.ref, k.tol)
			}
		}
	}
}
