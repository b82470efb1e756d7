package integrate

import (
	"encoding/json"
	"errors"
	"math"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/surface"
)

// moved returns a copy of c rotated by rot and then shifted by shift.
func moved(c *surface.Cut, rot [3][3]float64, shift Vec3) *surface.Cut {
	out := *c
	out.Points = make([]surface.QuadPoint, len(c.Points))
	for i, q := range c.Points {
		q.X = add(fieldtest.MatVec(rot, q.X), shift)
		q.N = fieldtest.MatVec(rot, q.N)
		out.Points[i] = q
	}
	out.Closure = fieldtest.MatVec(rot, c.Closure)
	return &out
}

func add(a, b Vec3) Vec3 { return Vec3{a[0] + b[0], a[1] + b[1], a[2] + b[2]} }

// closeVec reports whether a and b agree within tol·(1 + |b|).
func closeVec(a, b Vec3, tol float64) bool { return norm(sub(a, b)) <= tol*(1+norm(b)) }

// TestRigidMotion: moving field, surface, stream and moment centre by the
// same rotation and translation rotates every force and moment term
// (frame indifference of the momentum balance); agreement to rounding
// (1e-12 relative).
func TestRigidMotion(t *testing.T) {
	cases := []struct {
		name string
		flow fieldtest.Flow
		cut  *surface.Cut
		rot  [3][3]float64
		opt  Options
	}{
		{"cylinder", fieldtest.Cylinder(cylRho, cylU, cylA, cylGamma), rect(-1, 5, -3, 2, 0.2, 8), fieldtest.RotZ(0.6),
			Options{Free: Freestream{V: Vec3{cylU, 0, 0}, Rho: cylRho}, MomentCenter: Vec3{0.4, -0.3, 0}}},
		{"kovasznay", fieldtest.Kovasznay{Re: 40}, rect(-0.3, 0.2, 0.1, 0.37, 0.02, 8), fieldtest.RotZ(-2.2),
			Options{Free: Freestream{V: Vec3{1, 0, 0}, Rho: 1}, MomentCenter: Vec3{0.1, 0.2, 0}}},
		{"stokes", stokesFlow(), box(Vec3{-1, -2, -0.9}, Vec3{1.5, 2, 0.9}, 0.25), fieldtest.RotAxis(Vec3{0.48, 0.6, 0.64}, 1.3),
			Options{Free: Freestream{V: Vec3{stkU, 0, 0}}, NoConvection: true, MomentCenter: Vec3{0.2, 0.1, -0.3}}},
		{"sphere", fieldtest.SpherePotential{Rho: 1.2, A: 0.6, U: [3]float64{1.5, 0, 0}}, sphere(Vec3{0.1, 0, 0}, 1, 8),
			fieldtest.RotAxis(Vec3{0, 0.6, 0.8}, 2.1), Options{Free: Freestream{V: Vec3{1.5, 0, 0}, Rho: 1.2}}},
	}
	for _, tc := range cases {
		shift := Vec3{1.5, -0.7, 0}
		if tc.cut.Dim == 3 {
			shift[2] = 2.3
		}
		r0 := mustForces(t, tc.cut, tc.flow, tc.opt)
		opt := tc.opt
		opt.Free.V = fieldtest.MatVec(tc.rot, opt.Free.V)
		opt.MomentCenter = add(fieldtest.MatVec(tc.rot, opt.MomentCenter), shift)
		flow := fieldtest.Transformed{Base: tc.flow, Rot: tc.rot, Shift: shift}
		r1 := mustForces(t, moved(tc.cut, tc.rot, shift), flow, opt)
		rot := func(v Vec3) Vec3 { return fieldtest.MatVec(tc.rot, v) }
		pairs := [][2]Vec3{
			{r1.Force, rot(r0.Force)}, {r1.Moment, rot(r0.Moment)},
			{r1.Terms.Momentum, rot(r0.Terms.Momentum)}, {r1.Terms.Pressure, rot(r0.Terms.Pressure)},
			{r1.Terms.Viscous, rot(r0.Terms.Viscous)}, {r1.MomentTerms.Pressure, rot(r0.MomentTerms.Pressure)},
		}
		for i, p := range pairs {
			if !closeVec(p[0], p[1], 1e-12) {
				t.Errorf("%s: quantity %d after motion %v, want rotated %v", tc.name, i, p[0], p[1])
			}
		}
		if !near(r1.Wind.Drag, r0.Wind.Drag, 1e-12*(1+math.Abs(r0.Wind.Drag))) || !near(r1.MassFlux, r0.MassFlux, 1e-12) {
			t.Errorf("%s: drag %g → %g, mass %g → %g", tc.name, r0.Wind.Drag, r1.Wind.Drag, r0.MassFlux, r1.MassFlux)
		}
	}
}

// TestPressureLevel: adding a constant to p changes nothing beyond rounding
// because ∮n dA = 0 on a closed surface (VALIDATION.md §1.3), whether or
// not p_ref follows it. Rounding bound: c·ε per point times the number of
// points, far below 1e-8 for c = 1e5.
func TestPressureLevel(t *testing.T) {
	c := rect(-0.3, 0.2, 0.1, 0.37, 0.02, 8)
	opt := Options{Free: Freestream{V: Vec3{1, 0, 0}, Rho: 1}}
	r0 := mustForces(t, c, fieldtest.Kovasznay{Re: 40}, opt)
	r1 := mustForces(t, c, fieldtest.Kovasznay{Re: 40, PInf: 1e5}, opt) // p_ref stays 0
	opt.Free.P = 1e5
	r2 := mustForces(t, c, fieldtest.Kovasznay{Re: 40, PInf: 1e5}, opt)
	for _, r := range []Result{r1, r2} {
		if !closeVec(r.Terms.Pressure, r0.Terms.Pressure, 1e-8) || !closeVec(r.Moment, r0.Moment, 1e-8) {
			t.Errorf("pressure part %v moment %v, want %v %v", r.Terms.Pressure, r.Moment, r0.Terms.Pressure, r0.Moment)
		}
	}
	if norm(c.Closure) > 1e-12*c.Area {
		t.Errorf("closure %v", c.Closure)
	}
}

// TestWorkersBitIdentical: the chunked compensated sum gives the same bits
// for any number of workers (DESIGN.md §3; house rule 7).
func TestWorkersBitIdentical(t *testing.T) {
	c := sphere(Vec3{0.05, -0.1, 0.02}, 1.3, 16) // 14336 points, 14 chunks
	flow := fieldtest.Transformed{Base: fieldtest.SpherePotential{Rho: 1.2, A: 0.6, U: [3]float64{1.5, 0.3, -0.2}}, Rot: fieldtest.RotZ(0)}
	opt := Options{Free: Freestream{V: Vec3{1.5, 0.3, -0.2}, Rho: 1.2}, RefArea: 1.1, RefLength: 0.6}
	opt.Workers = 1
	ref := mustForces(t, c, flow, opt)
	for _, w := range []int{2, 7, 0} {
		opt.Workers = w
		if r := mustForces(t, c, flow, opt); r != ref {
			t.Errorf("workers=%d: result differs from 1 worker:\n%+v\n%+v", w, r, ref)
		}
	}
}

// withReynolds adds a Reynolds stress R_xx = K x (other components 0) and
// moves a fraction of μ into μ_t.
type withReynolds struct {
	base    fieldtest.Flow
	k, eddy float64
}

func (w withReynolds) EvalFlow(at field.Location, x [3]float64, dst *field.FlowState) {
	w.base.EvalFlow(at, x, dst)
	dst.R = [3][3]float64{{w.k * x[0]}}
	dst.HasR = w.k != 0
	dst.MuT = w.eddy * dst.Mu
	dst.Mu -= dst.MuT
}

// TestReynoldsAndEddy: the Reynolds term is −∮R·n dA = −∫∇·R dV; for
// R_xx = Kx that is (−K·volume, 0, 0), integrated exactly by the
// degree-5 rule. Moving part of μ into μ_t leaves the viscous term
// unchanged (τ uses μ + μ_t).
func TestReynoldsAndEddy(t *testing.T) {
	c := box(Vec3{-1, -1.5, -0.5}, Vec3{2, 1.5, 0.5}, 0.25) // volume 9
	opt := stokesOpt()
	r0 := mustForces(t, c, stokesFlow(), opt)
	r1, err := Forces(c, withReynolds{stokesFlow(), 0.7, 0.4}, opt)
	if err != nil {
		t.Fatal(err)
	}
	if !closeVec(r1.Terms.Reynolds, Vec3{-0.7 * 9, 0, 0}, 1e-12) {
		t.Errorf("Reynolds term %v, want (−6.3, 0, 0)", r1.Terms.Reynolds)
	}
	if !closeVec(r1.Terms.Viscous, r0.Terms.Viscous, 1e-13) || !closeVec(r1.Force, add(r0.Force, r1.Terms.Reynolds), 1e-12) {
		t.Errorf("viscous %v force %v, want %v and %v", r1.Terms.Viscous, r1.Force, r0.Terms.Viscous, add(r0.Force, r1.Terms.Reynolds))
	}
}

// nanFlow returns NaN pressure where x > xBad.
type nanFlow struct {
	base fieldtest.Flow
	xBad float64
}

func (f nanFlow) EvalFlow(at field.Location, x [3]float64, dst *field.FlowState) {
	f.base.EvalFlow(at, x, dst)
	if x[0] > f.xBad {
		dst.P = math.NaN()
	}
}

// TestValueError: a NaN in the flow is an error naming the quantity and
// the lowest failing point, whatever the number of workers.
func TestValueError(t *testing.T) {
	c := sphere(Vec3{}, 1, 16)
	var first int = -1
	for i, q := range c.Points {
		if q.X[0] > 0.9 {
			first = i
			break
		}
	}
	for _, w := range []int{1, 2, 7} {
		_, err := Forces(c, nanFlow{fieldtest.SpherePotential{Rho: 1, A: 0.5, U: [3]float64{1, 0, 0}}, 0.9}, Options{Workers: w})
		var ve *ValueError
		if !errors.As(err, &ve) || ve.Quantity != "pressure" || ve.Point != first || ve.X[0] <= 0.9 {
			t.Fatalf("workers=%d: error %v, want a pressure ValueError at point %d", w, err, first)
		}
	}
}

// hugeFlow returns finite but enormous pressure and density.
type hugeFlow struct{}

func (hugeFlow) EvalFlow(_ field.Location, _ [3]float64, dst *field.FlowState) {
	*dst = field.FlowState{Rho: 1e308, P: 1e308, V: [3]float64{1, 0, 0}}
}

// TestOverflow: finite values whose integrals overflow give ErrOverflow,
// not a result holding Inf or NaN.
func TestOverflow(t *testing.T) {
	_, err := Forces(circle(0, 0, 1, 64, 4), hugeFlow{}, Options{Free: Freestream{V: Vec3{1, 0, 0}}})
	var ve *ValueError
	if !errors.Is(err, ErrOverflow) || errors.As(err, &ve) {
		t.Errorf("error %v, want ErrOverflow", err)
	}
}

// TestOptionErrors: bad options and cuts are errors, not panics.
func TestOptionErrors(t *testing.T) {
	c := circle(0, 0, 1, 16, 2)
	flow := fieldtest.Cylinder(1, 1, 0.5, 1)
	bad := []Options{
		{RefArea: -1},
		{Free: Freestream{V: Vec3{math.NaN(), 0, 0}}},
		{Free: Freestream{V: Vec3{1, 0, 0}}, Up: Vec3{2, 0, 0}},
		{Free: Freestream{Rho: math.Inf(1)}},
		{RefLength: math.NaN()},
	}
	for i, o := range bad {
		if _, err := Forces(c, flow, o); !errors.Is(err, ErrOption) {
			t.Errorf("options %d: error %v, want ErrOption", i, err)
		}
	}
	if _, err := Forces(nil, flow, Options{}); !errors.Is(err, ErrCut) {
		t.Errorf("nil cut: %v", err)
	}
	c3 := *c
	c3.Dim = 1
	if _, err := Forces(&c3, flow, Options{}); !errors.Is(err, ErrCut) {
		t.Errorf("dim 1: %v", err)
	}
	c4 := *c
	c4.Points = append([]surface.QuadPoint(nil), c.Points...)
	c4.Points[3].W = math.Inf(1)
	if _, err := Forces(&c4, flow, Options{}); !errors.Is(err, ErrCut) {
		t.Errorf("infinite weight: %v", err)
	}
	c5 := *c
	c5.Points = nil
	if _, err := Forces(&c5, flow, Options{}); !errors.Is(err, ErrCut) {
		t.Errorf("no points: %v", err)
	}
	if _, err := Forces(c, nil, Options{}); err == nil {
		t.Errorf("nil flow: no error")
	}
}

// TestJSON: the Result marshals with the field names of the report schema.
func TestJSON(t *testing.T) {
	r := mustForces(t, circle(0, 0, 2, 64, 4), fieldtest.Cylinder(cylRho, cylU, cylA, cylGamma),
		Options{Free: Freestream{V: Vec3{cylU, 0, 0}, Rho: cylRho}, RefLength: 1})
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatal(err)
	}
	var m map[string]any
	if err := json.Unmarshal(b, &m); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"spec", "force", "terms", "moment", "wind", "coefficients", "drag_counts", "mass_flux",
		"mass_imbalance", "facets", "pieces", "area", "exact_area", "area_error", "closure", "axes"} {
		if _, ok := m[k]; !ok {
			t.Errorf("JSON lacks %q: %s", k, b)
		}
	}
	terms, _ := m["terms"].(map[string]any)
	for _, k := range []string{"momentum", "pressure", "viscous", "reynolds"} {
		if _, ok := terms[k]; !ok {
			t.Errorf("terms lack %q", k)
		}
	}
	wind, _ := m["wind"].(map[string]any)
	if lift, _ := wind["lift"].(float64); !near(lift, cylLift, 1e-9) {
		t.Errorf("wind.lift = %v, want %g", wind["lift"], cylLift)
	}
}
