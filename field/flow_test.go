package field_test

import (
	"cmp"
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"slices"
	"strings"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// zoneWith returns a one-triangle zone carrying point arrays of the given
// names and component counts.
func zoneWith(arrays map[string]int) *field.Field {
	z := &field.Zone{Name: "z", Points: []float64{0, 0, 0, 1, 0, 0, 0, 1, 0}}
	z.AddCell(field.Triangle, 0, 1, 2)
	for name, comps := range arrays {
		z.Arrays = append(z.Arrays, field.Array{Name: name, Location: field.AtPoints, Components: comps, Data: make([]float64, 3*comps)})
	}
	return &field.Field{Zones: []*field.Zone{z}}
}

// TestGuessFlowMap checks the guess against the array names that common
// solvers write (common practice: U/p/nut in finite-volume codes, Velocity/
// Pressure/Density in many exporters, VelocityX/Y/Z and u/v/w as scalar
// components, ViscosityEddy as a dynamic eddy viscosity).
func TestGuessFlowMap(t *testing.T) {
	tests := []struct {
		name   string
		arrays map[string]int
		want   field.FlowMap
	}{
		{"finite-volume incompressible", map[string]int{"U": 3, "p": 1, "nut": 1, "nu": 1},
			field.FlowMap{Velocity: []string{"U"}, Pressure: "p", Viscosity: field.Quantity{Name: "nu"}, KinematicViscosity: true,
				EddyViscosity: field.Quantity{Name: "nut"}, EddyKinematic: true}},
		{"capitalised exporter names", map[string]int{"Velocity": 3, "Pressure": 1, "Density": 1, "ViscosityMolecular": 1, "ViscosityEddy": 1},
			field.FlowMap{Velocity: []string{"Velocity"}, Pressure: "Pressure", Density: field.Quantity{Name: "Density"},
				Viscosity: field.Quantity{Name: "ViscosityMolecular"}, EddyViscosity: field.Quantity{Name: "ViscosityEddy"}}},
		{"scalar components XYZ", map[string]int{"VelocityX": 1, "VelocityY": 1, "VelocityZ": 1, "pressure": 1, "rho": 1, "mu": 1, "mut": 1},
			field.FlowMap{Velocity: []string{"VelocityX", "VelocityY", "VelocityZ"}, Pressure: "pressure", Density: field.Quantity{Name: "rho"},
				Viscosity: field.Quantity{Name: "mu"}, EddyViscosity: field.Quantity{Name: "mut"}}},
		{"SIDS kinematic viscosities (CGNS SIDS Appendix A names)", map[string]int{"VelocityX": 1, "VelocityY": 1, "Pressure": 1, "ViscosityKinematic": 1, "ViscosityEddyKinematic": 1},
			field.FlowMap{Velocity: []string{"VelocityX", "VelocityY"}, Pressure: "Pressure", Viscosity: field.Quantity{Name: "ViscosityKinematic"}, KinematicViscosity: true,
				EddyViscosity: field.Quantity{Name: "ViscosityEddyKinematic"}, EddyKinematic: true}},
		{"2D scalar components u v", map[string]int{"u": 1, "v": 1, "p": 1, "density": 1},
			field.FlowMap{Velocity: []string{"u", "v"}, Pressure: "p", Density: field.Quantity{Name: "density"}}},
		{"vel vector and mask", map[string]int{"vel": 2, "p": 1, "solid": 1},
			field.FlowMap{Velocity: []string{"vel"}, Pressure: "p", Mask: "solid"}},
		{"ghost cells and Reynolds stress", map[string]int{"U": 3, "p": 1, "vtkGhostType": 1, "ReynoldsStress": 6},
			field.FlowMap{Velocity: []string{"U"}, Pressure: "p", Mask: "vtkGhostType", ReynoldsStress: "ReynoldsStress"}},
		{"scalar U is not a velocity vector", map[string]int{"U": 1, "V": 1, "p": 1},
			field.FlowMap{Velocity: []string{"U", "V"}, Pressure: "p"}},
		{"nothing recognisable", map[string]int{"temperature": 1},
			field.FlowMap{}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, notes := field.GuessFlowMap(zoneWith(tc.arrays))
			if !reflect.DeepEqual(got, tc.want) {
				t.Errorf("GuessFlowMap = %+v, want %+v", got, tc.want)
			}
			if len(notes) < 4 {
				t.Errorf("want a note for velocity, pressure, density and viscosity at least, got %q", notes)
			}
		})
	}
}

func TestGuessFlowMapEmpty(t *testing.T) {
	m, notes := field.GuessFlowMap(&field.Field{})
	if !reflect.DeepEqual(m, field.FlowMap{}) || len(notes) != 1 {
		t.Errorf("empty field: got %+v %q", m, notes)
	}
}

// linearFlow is an affine velocity V = V0 + B x with affine pressure,
// density and eddy viscosity: every interpolation that reproduces linear
// functions (all shape functions here; Zienkiewicz & Taylor, The Finite
// Element Method vol. 1, 2000, §8.2, completeness requirement) must return
// them, and their gradients, to rounding.
var (
	linV0 = [3]float64{1.5, -0.25, 0.5}
	linB  = [3][3]float64{{0.3, -0.2, 0.1}, {0.05, 0.4, -0.3}, {-0.15, 0.2, -0.7}}
)

func linVel(x [3]float64) [3]float64 {
	var v [3]float64
	for i := 0; i < 3; i++ {
		v[i] = linV0[i] + linB[i][0]*x[0] + linB[i][1]*x[1] + linB[i][2]*x[2]
	}
	return v
}

func linP(x [3]float64) float64   { return 100 + 3*x[0] - 2*x[1] + 0.5*x[2] }
func linRho(x [3]float64) float64 { return 1.2 + 0.1*x[0] + 0.05*x[1] - 0.02*x[2] }
func linNut(x [3]float64) float64 { return 1e-3 * (2 + x[0] + x[1] + x[2]) }

// linearZone samples the linear flow on z: U as one vector, u/v/w as
// scalars, p, rho and nut at points, pc (pressure) at cells, and a
// constant 6-component Reynolds stress R.
func linearZone(z *field.Zone, comps int) {
	fieldtest.SamplePoints(z, "U", comps, func(x [3]float64, d []float64) { v := linVel(x); copy(d, v[:comps]) })
	for i, n := range []string{"u", "v", "w"}[:comps] {
		fieldtest.SamplePoints(z, n, 1, func(x [3]float64, d []float64) { d[0] = linVel(x)[i] })
	}
	fieldtest.SamplePoints(z, "p", 1, func(x [3]float64, d []float64) { d[0] = linP(x) })
	fieldtest.SamplePoints(z, "rho", 1, func(x [3]float64, d []float64) { d[0] = linRho(x) })
	fieldtest.SamplePoints(z, "nut", 1, func(x [3]float64, d []float64) { d[0] = linNut(x) })
	fieldtest.SampleCells(z, "pc", 1, func(x [3]float64, d []float64) { d[0] = linP(x) })
	fieldtest.SamplePoints(z, "R", 6, func(x [3]float64, d []float64) { copy(d, []float64{1, 2, 3, 4, 5, 6}) })
}

func TestFlowSamplerLinear(t *testing.T) {
	type mesh struct {
		name  string
		zone  *field.Zone
		comps int
	}
	meshes := []mesh{
		{"hex", fieldtest.BoxHex([3]float64{0, 0, 0}, [3]float64{1, 2, 1.5}, [3]int{3, 4, 3}), 3},
		{"tet", fieldtest.BoxTet([3]float64{-1, 0, 0}, [3]float64{1, 1, 1}, [3]int{3, 2, 2}), 3},
		{"quad", fieldtest.RectQuad([2]float64{0, 0}, [2]float64{2, 1}, [2]int{4, 3}), 2},
		{"tri", fieldtest.RectTri([2]float64{0, 0}, [2]float64{2, 1}, [2]int{4, 3}), 2},
	}
	for _, ms := range meshes {
		linearZone(ms.zone, ms.comps)
		f := &field.Field{Zones: []*field.Zone{ms.zone}}
		loc, err := field.NewLocator(f)
		if err != nil {
			t.Fatalf("%s: %v", ms.name, err)
		}
		lo, hi := f.Bounds()
		for _, vel := range [][]string{{"U"}, []string{"u", "v", "w"}[:ms.comps]} {
			for _, pressure := range []string{"p", "pc"} {
				m := field.FlowMap{Velocity: vel, Pressure: pressure, Density: field.Quantity{Name: "rho"},
					Viscosity: field.Quantity{Value: 1.8e-5}, EddyViscosity: field.Quantity{Name: "nut"}, EddyKinematic: true,
					ReynoldsStress: "R"}
				fs, err := field.NewFlowSampler(field.NewSampler(loc), m)
				if err != nil {
					t.Fatalf("%s %v: %v", ms.name, vel, err)
				}
				rng := rand.New(rand.NewPCG(1, uint64(len(vel))))
				for k := 0; k < 50; k++ {
					var x [3]float64
					for d := 0; d < 3; d++ {
						x[d] = lo[d] + (0.01+0.98*rng.Float64())*(hi[d]-lo[d])
					}
					at, ok := loc.Locate(x)
					if !ok {
						t.Fatalf("%s: %v not located", ms.name, x)
					}
					var st field.FlowState
					fs.EvalFlow(at, x, &st)
					checkLinearState(t, ms.name+" "+pressure, x, ms.comps, &st)
				}
			}
		}
	}
}

func checkLinearState(t *testing.T, name string, x [3]float64, comps int, st *field.FlowState) {
	t.Helper()
	// Tolerance: a few hundred ulps of values of order 1-100 (rounding in
	// the shape functions and the least-squares reconstruction).
	const tol = 1e-10
	near := func(what string, got, want float64) {
		if math.Abs(got-want) > tol*(1+math.Abs(want)) {
			t.Errorf("%s at %v: %s = %.15g, want %.15g", name, x, what, got, want)
		}
	}
	v := linVel(x)
	for i := 0; i < 3; i++ {
		wantV := v[i]
		if i >= comps {
			wantV = 0
		}
		near(fmt.Sprintf("V[%d]", i), st.V[i], wantV)
		for j := 0; j < 3; j++ {
			want := linB[i][j]
			if i >= comps || j >= comps { // 2D: w = 0 and nothing varies with z
				want = 0
			}
			near(fmt.Sprintf("GradV[%d][%d]", i, j), st.GradV[i][j], want)
		}
	}
	near("P", st.P, linP(x))
	near("Rho", st.Rho, linRho(x))
	near("Mu", st.Mu, 1.8e-5)
	near("MuT", st.MuT, linRho(x)*linNut(x))
	// R holds XX,YY,ZZ,XY,YZ,XZ = 1..6 everywhere: a symmetric tensor.
	wantR := [3][3]float64{{1, 4, 6}, {4, 2, 5}, {6, 5, 3}}
	if !st.HasR {
		t.Errorf("%s: HasR false with a Reynolds stress mapped", name)
	}
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			near(fmt.Sprintf("R[%d][%d]", i, j), st.R[i][j], wantR[i][j])
		}
	}
}

func TestNewFlowSamplerErrors(t *testing.T) {
	z := fieldtest.RectQuad([2]float64{0, 0}, [2]float64{1, 1}, [2]int{2, 2})
	linearZone(z, 2)
	loc, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		t.Fatal(err)
	}
	ok := field.FlowMap{Velocity: []string{"U"}, Pressure: "p", Density: field.Quantity{Value: 1}}
	tests := []struct {
		name string
		edit func(m *field.FlowMap)
		want string
	}{
		{"no velocity", func(m *field.FlowMap) { m.Velocity = nil }, "velocity"},
		{"missing velocity array", func(m *field.FlowMap) { m.Velocity = []string{"nope"} }, "nope"},
		{"scalar as vector", func(m *field.FlowMap) { m.Velocity = []string{"p"} }, "components"},
		{"four velocity arrays", func(m *field.FlowMap) { m.Velocity = []string{"u", "v", "u", "v"} }, "velocity"},
		{"no pressure", func(m *field.FlowMap) { m.Pressure = "" }, "pressure"},
		{"vector pressure", func(m *field.FlowMap) { m.Pressure = "U" }, "components"},
		{"no density", func(m *field.FlowMap) { m.Density = field.Quantity{} }, "density"},
		{"negative viscosity", func(m *field.FlowMap) { m.Viscosity = field.Quantity{Value: -1} }, "viscosity"},
		{"Reynolds stress of 1 component", func(m *field.FlowMap) { m.ReynoldsStress = "p" }, "Reynolds"},
	}
	for _, tc := range tests {
		m := ok
		tc.edit(&m)
		_, err := field.NewFlowSampler(field.NewSampler(loc), m)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want one mentioning %q", tc.name, err, tc.want)
		}
	}
	if _, err := field.NewFlowSampler(field.NewSampler(loc), ok); err != nil {
		t.Errorf("valid map: %v", err)
	}
}

func TestApplyMask(t *testing.T) {
	z := fieldtest.RectQuad([2]float64{0, 0}, [2]float64{3, 1}, [2]int{3, 1}) // cells 0,1,2 left to right
	fieldtest.SampleCells(z, "solid", 1, func(x [3]float64, d []float64) {
		if x[0] > 2 {
			d[0] = 1
		}
	})
	fieldtest.SamplePoints(z, "blank", 1, func(x [3]float64, d []float64) {
		if x[0] < 1.5 { // only the nodes of cell 0 all flagged
			d[0] = 1
		}
	})
	f := &field.Field{Zones: []*field.Zone{z}}
	if n, err := field.ApplyMask(f, "solid"); err != nil || n != 1 || !reflect.DeepEqual(z.Blank, []bool{false, false, true}) {
		t.Errorf("cell mask: n=%d err=%v blank=%v", n, err, z.Blank)
	}
	if n, err := field.ApplyMask(f, "blank"); err != nil || n != 1 || !reflect.DeepEqual(z.Blank, []bool{true, false, true}) {
		t.Errorf("point mask: n=%d err=%v blank=%v", n, err, z.Blank)
	}
	if _, err := field.ApplyMask(f, "missing"); err == nil || !strings.Contains(err.Error(), "missing") {
		t.Errorf("missing mask array: %v", err)
	}
}

// BenchmarkEvalFlow measures FlowSampler.EvalFlow (velocity value and
// gradient, pressure, constant density and viscosity) on point data of a
// hexahedral box, beside the bare Sampler calls it is made of.
func BenchmarkEvalFlow(b *testing.B) {
	z := fieldtest.BoxHex([3]float64{0, 0, 0}, [3]float64{1, 1, 1}, [3]int{20, 20, 20})
	linearZone(z, 3)
	loc, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		b.Fatal(err)
	}
	s := field.NewSampler(loc)
	fs, err := field.NewFlowSampler(s, field.FlowMap{Velocity: []string{"U"}, Pressure: "p",
		Density: field.Quantity{Value: 1.2}, Viscosity: field.Quantity{Value: 1.8e-5}})
	if err != nil {
		b.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(7, 7))
	ats := make([]field.Location, 4096)
	for i := range ats {
		at, ok := loc.Locate([3]float64{rng.Float64(), rng.Float64(), rng.Float64()})
		if !ok {
			b.Fatal("point not located")
		}
		ats[i] = at
	}
	var warm field.FlowState
	for _, at := range ats { // build the lazily cached gradient fits first
		fs.EvalFlow(at, [3]float64{}, &warm)
	}
	b.Run("EvalFlow", func(b *testing.B) {
		b.ReportAllocs()
		var st field.FlowState
		for i := 0; i < b.N; i++ {
			fs.EvalFlow(ats[i%len(ats)], [3]float64{}, &st)
		}
		b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "points/s")
	})
	b.Run("bare-sampler", func(b *testing.B) {
		b.ReportAllocs()
		u, _ := s.Prepare("U")
		p, _ := s.Prepare("p")
		var v [3]float64
		var g [9]float64
		var q [1]float64
		for i := 0; i < b.N; i++ {
			at := ats[i%len(ats)]
			s.Value(u, at, v[:])
			s.Gradient(u, at, g[:])
			s.Value(p, at, q[:])
		}
		b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "points/s")
	})
}

// TestEvalFlowCachedSameBits checks that evaluating through a FlowCache,
// with runs of points in one cell and caches shared between two samplers,
// gives exactly the bits of EvalFlow (the cache must only save work), for
// vector and scalar velocities, point and cell data, named density and
// eddy viscosity, and a Reynolds stress.
func TestEvalFlowCachedSameBits(t *testing.T) {
	meshes := []struct {
		name  string
		zone  *field.Zone
		comps int
	}{
		{"hex", fieldtest.BoxHex([3]float64{0, 0, 0}, [3]float64{1, 2, 1.5}, [3]int{3, 4, 3}), 3},
		{"tet", fieldtest.BoxTet([3]float64{-1, 0, 0}, [3]float64{1, 1, 1}, [3]int{3, 2, 2}), 3},
		{"quad", fieldtest.RectQuad([2]float64{0, 0}, [2]float64{2, 1}, [2]int{4, 3}), 2},
	}
	for _, ms := range meshes {
		fieldtest.Perturb(ms.zone, 0.05, 3)
		linearZone(ms.zone, ms.comps)
		// A curved velocity, so that nodal gradients differ from node to node.
		fieldtest.SamplePoints(ms.zone, "Uq", ms.comps, func(x [3]float64, d []float64) {
			for i := range d {
				d[i] = x[0]*x[1] + float64(i)*x[0]*x[0] - x[2]*x[2]
			}
		})
		fieldtest.SampleCells(ms.zone, "Uc", ms.comps, func(x [3]float64, d []float64) { v := linVel(x); copy(d, v[:ms.comps]) })
		f := &field.Field{Zones: []*field.Zone{ms.zone}}
		loc, err := field.NewLocator(f)
		if err != nil {
			t.Fatal(err)
		}
		lo, hi := f.Bounds()
		rng := rand.New(rand.NewPCG(5, 6))
		var locs []field.Location
		for len(locs) < 300 {
			var x [3]float64
			for d := 0; d < 3; d++ {
				x[d] = lo[d] + rng.Float64()*(hi[d]-lo[d])
			}
			if at, ok := loc.Locate(x); ok {
				locs = append(locs, at)
			}
		}
		slices.SortStableFunc(locs, func(a, b field.Location) int { return cmp.Compare(a.Cell, b.Cell) })
		for _, vel := range [][]string{{"U"}, {"Uq"}, {"Uc"}, []string{"u", "v", "w"}[:ms.comps]} {
			m := field.FlowMap{Velocity: vel, Pressure: "p", Density: field.Quantity{Name: "rho"},
				Viscosity: field.Quantity{Value: 1.8e-5}, EddyViscosity: field.Quantity{Name: "nut"}, EddyKinematic: true,
				ReynoldsStress: "R"}
			a, errA := field.NewFlowSampler(field.NewSampler(loc), m)
			m.Pressure, m.ReynoldsStress = "pc", ""
			b, errB := field.NewFlowSampler(field.NewSampler(loc), m)
			if errA != nil || errB != nil {
				t.Fatal(errA, errB)
			}
			var cache field.FlowCache
			for i, at := range locs {
				fs := a
				if i%7 == 3 { // switch samplers now and then on one cache
					fs = b
				}
				var want, got field.FlowState
				fs.EvalFlow(at, [3]float64{}, &want)
				fs.EvalFlowCached(at, [3]float64{}, &got, &cache)
				if got != want {
					t.Fatalf("%s %v point %d (cell %d): cached %+v, want %+v", ms.name, vel, i, at.Cell, got, want)
				}
			}
		}
	}
}
