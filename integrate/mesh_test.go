package integrate

import (
	"fmt"
	"math"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/surface"
)

// meshCase is one end-to-end check: an exact flow sampled on a mesh at
// several resolutions, a surface cut through it, and the exact force.
type meshCase struct {
	name  string
	flow  fieldtest.Flow
	mesh  func(n int) *field.Zone // mesh at resolution n (cells per unit-ish length)
	ns    []int                   // three resolutions
	shape surface.Shape           // the control surface, cut through the mesh
	opt   Options
	err   func(r Result) float64 // error against the exact answer
	// band[0] and band[1] are the accepted ranges of the observed order
	// for point and cell data.
	band [2][2]float64
	// pointsOnly skips cell data (to keep the package test fast).
	pointsOnly bool
	// flowMap, when it names a velocity, replaces fieldtest.FlowMap().
	flowMap field.FlowMap
}

// sampledFlow samples f on z at points or cells and returns the field's
// flow evaluator and locator. The flow map is fieldtest.FlowMap(), or m
// when given.
func sampledFlow(t testing.TB, z *field.Zone, f fieldtest.Flow, at field.Centering, m ...field.FlowMap) (*field.Locator, field.FlowEvaluator) {
	t.Helper()
	fieldtest.SampleFlow(z, f, at)
	fl := &field.Field{Zones: []*field.Zone{z}}
	loc, err := field.NewLocator(fl)
	if err != nil {
		t.Fatal(err)
	}
	fm := fieldtest.FlowMap()
	if len(m) > 0 {
		fm = m[0]
	}
	ev, err := field.NewFlowSampler(field.NewSampler(loc), fm)
	if err != nil {
		t.Fatal(err)
	}
	return loc, ev
}

// runMeshCase computes the errors at every resolution, fits the order and
// checks it against the band.
func runMeshCase(t *testing.T, mc meshCase, at field.Centering) {
	var hs, errs []float64
	for _, n := range mc.ns {
		z := mc.mesh(n)
		var maps []field.FlowMap
		if mc.flowMap.Velocity != nil {
			maps = append(maps, mc.flowMap)
		}
		loc, ev := sampledFlow(t, z, mc.flow, at, maps...)
		c, err := surface.CutSurface(loc, mc.shape, surface.CutOptions{})
		if err != nil {
			t.Fatalf("%s n=%d: %v", mc.name, n, err)
		}
		r, err := Forces(c, ev, mc.opt)
		if err != nil {
			t.Fatalf("%s n=%d: %v", mc.name, n, err)
		}
		hs = append(hs, 1/float64(n))
		errs = append(errs, mc.err(r))
	}
	p := fitOrder(hs, errs)
	band := mc.band[at]
	t.Logf("%s, %s data: errors %.3g, observed order %.2f", mc.name, at, errs, p)
	if p < band[0] || p > band[1] {
		t.Errorf("%s, %s data: observed order %.2f outside [%g, %g]", mc.name, at, p, band[0], band[1])
	}
}

func meshCases2D() []meshCase {
	cyl := fieldtest.Cylinder(cylRho, cylU, cylA, cylGamma)
	liftErr := func(r Result) float64 { return math.Hypot(r.Force[0], r.Force[1]-cylLift) }
	body := fieldtest.OutsideBall([3]float64{}, cylA)
	kov := fieldtest.Kovasznay{Re: 40}
	kovErr := func(r Result) float64 {
		// visc2d.py: momentum (0.13740456, −0.01861553), pressure
		// (−0.14887698, 0), viscous (0.01147242, 0.01861553).
		d := []float64{r.Terms.Momentum[0] - 0.13740456, r.Terms.Momentum[1] + 0.01861553, r.Terms.Pressure[0] + 0.14887698,
			r.Terms.Viscous[0] - 0.01147242, r.Terms.Viscous[1] - 0.01861553}
		var s float64
		for _, v := range d {
			s += v * v
		}
		return math.Sqrt(s)
	}
	cases := []meshCase{{name: "cylinder circle, annulus", flow: cyl,
		mesh: func(n int) *field.Zone { return fieldtest.Annulus(0, 0, cylA, 3, n, 4*n) },
		ns:   []int{8, 16, 32, 64}, shape: surface.Circle{Center: [2]float64{0.1, -0.05}, Radius: 1.6},
		// The polar grid follows the circle, so the error constant varies
		// more between levels (point data: 2.14 over four levels) and cell
		// data superconverge (5.0 measured): the cell band is one-sided.
		opt: cylinderOpt(), err: liftErr, band: [2][2]float64{{1.8, 2.4}, {2.7, 5.5}}}}
	for _, mk := range []struct {
		name string
		mesh func(lo, hi [2]float64, n [2]int) *field.Zone
	}{{"quads", fieldtest.RectQuad}, {"triangles", fieldtest.RectTri}} {
		cases = append(cases,
			meshCase{name: "cylinder circle, " + mk.name, flow: cyl,
				mesh: func(n int) *field.Zone {
					return fieldtest.Carve(mk.mesh([2]float64{-2.5, -2.5}, [2]float64{2.5, 2.5}, [2]int{5 * n, 5 * n}), body)
				},
				ns: []int{8, 16, 32}, shape: surface.Circle{Center: [2]float64{0.1, -0.05}, Radius: 1.6},
				opt: cylinderOpt(), err: liftErr, band: [2][2]float64{{1.8, 2.2}, {2.7, 3.8}}},
			meshCase{name: "Kovasznay rectangle, " + mk.name, flow: kov,
				mesh: func(n int) *field.Zone { return kovMesh(mk.mesh, n) },
				ns:   []int{1, 2, 4, 8}, shape: surface.Rect{Min: [2]float64{-0.3, 0.1}, Max: [2]float64{0.2, 0.37}},
				opt: Options{Free: Freestream{V: Vec3{1, 0, 0}, Rho: 1}}, err: kovErr, band: [2][2]float64{{1.8, 2.2}, {1.8, 2.2}}},
		)
	}
	return cases
}

// kovMesh returns a mesh around the rectangle [−0.3,0.2]×[0.1,0.37] with
// cell sizes 0.025/k × 0.27/(11 k), placed so that every side of the
// rectangle lies at 1/3 or 2/3 of a cell at every refinement k = 1, 2, 4, …:
// the interpolation error along a side, ∝ t(1−t)h² at fraction t, then
// keeps the same constant and the fitted order is not polluted by the
// sides sliding through the cells.
func kovMesh(mesh func(lo, hi [2]float64, n [2]int) *field.Zone, k int) *field.Zone {
	hx, hy := 0.025/float64(k), 0.27/11/float64(k)
	lo := [2]float64{-0.3 - (4*float64(k)+1.0/3)*hx, 0.1 - (4*float64(k)+1.0/3)*hy}
	n := [2]int{29 * k, 20 * k}
	return mesh(lo, [2]float64{lo[0] + float64(n[0])*hx, lo[1] + float64(n[1])*hy}, n)
}

// TestMesh2D: exact 2D flows sampled on quad and triangle meshes at three
// resolutions, point and cell data, surfaces cut by surface.CutSurface.
// Expected orders (DESIGN.md §4; field package notes): point data are
// interpolated linearly/bilinearly and their recovered gradients are second
// order, so 2 (band [1.8, 2.2]; measured 1.99–2.03); cell data are
// reconstructed by quadratic fits, values O(h³) and gradients O(h²), so 3
// for the inviscid cylinder (band [2.7, 3.8], measured 3.40–3.49, still
// pre-asymptotic) and 2 for Kovasznay, whose viscous term needs gradients
// (band [1.8, 2.2], measured 1.99). The circle's position relative to the
// cells varies along it, so its error constant is stable; the rectangle is
// placed by kovMesh.
func TestMesh2D(t *testing.T) {
	for _, mc := range meshCases2D() {
		for _, at := range []field.Centering{field.AtPoints, field.AtCells} {
			t.Run(fmt.Sprintf("%s/%s", mc.name, at), func(t *testing.T) { runMeshCase(t, mc, at) })
		}
	}
}

// boxMesh returns a box mesh around the control box [−L, L] with cells of
// size h in every direction, placed so that every face of the control box
// lies at 1/3 of a cell (the interpolation error on a face, ∝ t(1−t)h² at
// fraction t, then keeps its constant under refinement), with a margin of
// at least one cell, and the ball r < 0.45 carved out (it keeps the
// singular point out of the mesh; inside r < a the flows are their smooth
// analytic continuation) about body.
func boxMesh(mesh func(lo, hi [3]float64, n [3]int) *field.Zone, L [3]float64, h float64, body [3]float64) *field.Zone {
	var lo, hi [3]float64
	var n [3]int
	for i := range L {
		cells := int(math.Round(2 * L[i] / h))
		lo[i] = -L[i] - (1+1.0/3)*h
		n[i] = cells + 3
		hi[i] = lo[i] + float64(n[i])*h
	}
	return fieldtest.Carve(mesh(lo, hi, n), fieldtest.OutsideBall(body, 0.45))
}

func meshCases3D() []meshCase {
	L := [3]float64{2, 1.5, 1.5}
	ctl := surface.Box{Min: [3]float64{-L[0], -L[1], -L[2]}, Max: L}
	// Stokes box split (VALIDATION.md §3.3, sph.py): pressure
	// 12μUa·atan(LyLz/(Lx√(Lx²+Ly²+Lz²))), viscous 6πμaU minus that.
	prs := 12 * stkMu * stkU * stkA * math.Atan(L[1]*L[2]/(L[0]*math.Sqrt(L[0]*L[0]+L[1]*L[1]+L[2]*L[2])))
	stokesErr := func(r Result) float64 {
		return math.Hypot(r.Terms.Pressure[0]-prs, r.Terms.Viscous[0]-(stkDrag-prs)) + math.Hypot(r.Force[1], r.Force[2])
	}
	// Potential sphere, off the box centre so that no symmetry cancels
	// errors: total 0 (VALIDATION.md §3.2a); its momentum and pressure
	// parts on this box are taken from the exact field on the exact box
	// (the analytic tests check that integration to 1e-9).
	shift := [3]float64{0.27, -0.13, 0.11}
	pot := fieldtest.Transformed{Base: fieldtest.SpherePotential{Rho: 1.2, A: stkA, U: [3]float64{1.5, 0, 0}},
		Rot: fieldtest.RotZ(0), Shift: shift}
	potOpt := Options{Free: Freestream{V: Vec3{1.5, 0, 0}, Rho: 1.2}}
	ref, err := Forces(box(ctl.Min, ctl.Max, 0.05), pot, potOpt)
	if err != nil {
		panic(err)
	}
	potErr := func(r Result) float64 {
		return norm(sub(r.Terms.Momentum, ref.Terms.Momentum)) + norm(sub(r.Terms.Pressure, ref.Terms.Pressure))
	}
	// Constant density and viscosity for the Stokes flow halve the cost of
	// cell-data reconstruction (ρ only scales the mass flux here).
	stokesMap := fieldtest.FlowMap()
	stokesMap.Density, stokesMap.Viscosity = field.Quantity{Value: 1}, field.Quantity{Value: stkMu}
	var cases []meshCase
	for _, mk := range []struct {
		name string
		mesh func(lo, hi [3]float64, n [3]int) *field.Zone
	}{{"hexahedra", fieldtest.BoxHex}, {"tetrahedra", fieldtest.BoxTet}} {
		ns := []int{2, 4, 6}
		if mk.name == "tetrahedra" {
			ns = []int{2, 3, 4} // cell-data reconstruction on many tetrahedra is slow
		}
		cases = append(cases,
			meshCase{name: "Stokes sphere, " + mk.name, flow: stokesFlow(), ns: ns, shape: ctl,
				mesh: func(n int) *field.Zone { return boxMesh(mk.mesh, L, 1/float64(n), [3]float64{}) },
				opt:  stokesOpt(), err: stokesErr, band: [2][2]float64{{1.8, 2.3}, {1.8, 2.3}}, flowMap: stokesMap},
			meshCase{name: "potential sphere, " + mk.name, flow: pot, ns: ns, shape: ctl,
				mesh: func(n int) *field.Zone { return boxMesh(mk.mesh, L, 1/float64(n), shift) },
				opt:  potOpt, err: potErr, band: [2][2]float64{{1.8, 2.3}, {2.7, 4.2}}, pointsOnly: mk.name == "tetrahedra"},
		)
	}
	return cases
}

// TestMesh3D: the Stokes sphere (viscous stress and pressure, convective
// flux off) and the potential sphere (momentum flux and pressure) sampled
// on hexahedral and tetrahedral boxes with the body carved out, at three
// resolutions, point and cell data, through a control box cut by
// surface.CutSurface. The error is that of the force parts, whose exact
// values are known (VALIDATION.md §3.2a, §3.3). Expected orders as in
// TestMesh2D: 2 wherever gradients or point data enter (band [1.8, 2.3];
// measured 1.95–2.23), 3 for cell data of the inviscid flow (band
// [2.7, 4.2]; measured 3.51 on hexahedra, still pre-asymptotic). The
// potential flow on tetrahedra is run with point data only: cell-data
// reconstruction on ~10⁵ tetrahedra costs tens of seconds.
func TestMesh3D(t *testing.T) {
	for _, mc := range meshCases3D() {
		for _, at := range []field.Centering{field.AtPoints, field.AtCells} {
			if at == field.AtCells && mc.pointsOnly {
				continue
			}
			t.Run(fmt.Sprintf("%s/%s", mc.name, at), func(t *testing.T) { runMeshCase(t, mc, at) })
		}
	}
}
