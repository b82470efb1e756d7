package integrate

import (
	"math"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/surface"
)

// Gaussian far wake of VALIDATION §3.5 (Schlichting, laminar plane wake,
// re-derived there; wake.py): c_D = 1.5, Re_d = Ud/ν = 100, d = 1, ρ = U = 1,
// so D′ = ½ρU²d c_D = 0.75 and at x/d = 50 the momentum thickness gives
// 2θ/d = 1.18264336.
var gaussWake = fieldtest.GaussianWake{Rho: 1, U: 1, D: 1, Nu: 0.01, CD: 1.5, PInf: 0}

const (
	gaussDrag   = 0.75       // D′ = ½ρU²d c_D
	gaussTheta2 = 1.18264336 // 2θ/d at x/d = 50 (VALIDATION §3.5)
)

// wakeCut2D samples the Gaussian wake at the points of an nx × ny quad
// mesh of [49, 51] × [−10, 10] and cuts the line x = 50 through it.
func wakeCut2D(t testing.TB, ny int) (*surface.Cut, field.FlowEvaluator) {
	t.Helper()
	z := fieldtest.RectQuad([2]float64{49, -10}, [2]float64{51, 10}, [2]int{2, ny})
	fieldtest.SampleFlow(z, gaussWake, field.AtPoints)
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		t.Fatal(err)
	}
	flow, err := field.NewFlowSampler(field.NewSampler(l), fieldtest.FlowMap())
	if err != nil {
		t.Fatal(err)
	}
	p, err := surface.ParsePlane("x=50 ymin=-10 ymax=10")
	if err != nil {
		t.Fatal(err)
	}
	c, _, err := surface.CutPlane(l, p, surface.CutOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return c, flow
}

func wakeOpt(rho, u, p float64) WakeOptions {
	return WakeOptions{Options: Options{Free: Freestream{V: Vec3{u, 0, 0}, Rho: rho, P: p}, RefLength: 1}}
}

func mustDrag(t *testing.T, r *WakeResult, key string) float64 {
	t.Helper()
	v, ok := r.Drag(key)
	if !ok {
		t.Fatalf("%s: no %s drag", r.Spec, key)
	}
	return v
}

// TestGaussianWake samples the wake on three meshes: the linearised
// deficit ρU∫u₁dy tends to D′ and the momentum deficit ρ∫u(U − u)dy to
// D′ − ρA²√(2πν/(Ux)) (i.e. 2θ/d = 1.18264336), both at the second order of
// bilinear interpolation (±0.2: the Gaussian is resolved by 2–7 cells per
// half-width) for the deficit, to rounding for the linear one (see below). With p = p∞ and v = 0, Jones's formula and Betz's profile
// drag reduce exactly to the momentum deficit (VALIDATION §2.3–2.4).
func TestGaussianWake(t *testing.T) {
	a := gaussWake.Amplitude()
	deficit := gaussDrag - gaussWake.Rho*a*a*math.Sqrt(2*math.Pi*gaussWake.Nu/(gaussWake.U*50))
	if got := 2 * deficit; math.Abs(got-gaussTheta2) > 5e-9 {
		t.Fatalf("closed form 2θ/d = %.10f, VALIDATION gives %.8f", got, gaussTheta2)
	}
	var hs, eDef, eLin []float64
	for _, ny := range []int{25, 50, 100} {
		c, flow := wakeCut2D(t, ny)
		r, err := Wake(c, flow, wakeOpt(1, 1, 0))
		if err != nil {
			t.Fatal(err)
		}
		def := mustDrag(t, &r, WakeDeficit)
		for _, k := range []string{WakeJones, WakeBetz} {
			if v := mustDrag(t, &r, k); math.Abs(v-def) > 1e-12 {
				t.Errorf("ny=%d: %s %.15g differs from the deficit %.15g", ny, k, v, def)
			}
		}
		hs = append(hs, 20/float64(ny))
		eDef = append(eDef, math.Abs(def-deficit))
		eLin = append(eLin, math.Abs(mustDrag(t, &r, WakeLinear)-gaussDrag))
		t.Logf("ny=%d: deficit %.10f (exact %.10f), linear %.10f (exact %g), momentum %.10f", ny, def, deficit, mustDrag(t, &r, WakeLinear), gaussDrag, mustDrag(t, &r, WakeMomentum))
	}
	if ord := fitOrder(hs, eDef); !(math.Abs(ord-2) <= 0.2) {
		t.Errorf("deficit: order %.3f (errors %v), want 2", ord, eDef)
	}
	// ρU∫u₁dy of the piecewise-linear interpolant is the trapezoid rule,
	// exponentially accurate for a Gaussian on a wide interval (Trefethen
	// & Weideman 2014, SIAM Review 56:385–458): no order to fit.
	for i, e := range eLin {
		if e > 1e-12 {
			t.Errorf("h=%g: linear deficit error %g", hs[i], e)
		}
	}
	if eDef[2] > 1e-3*deficit {
		t.Errorf("finest deficit error %g", eDef[2])
	}
}

// TestWakeMomentumIsForces checks that the exact wake-plane momentum drag
// on the Gaussian wake equals the deficit plus the viscous normal stress
// ∫2μ ∂u/∂x dy (p = p∞ there), i.e. that it is the momentum balance of
// VALIDATION §2.1 term by term.
func TestWakeMomentumIsForces(t *testing.T) {
	c, flow := wakeCut2D(t, 50)
	r, err := Wake(c, flow, wakeOpt(1, 1, 0))
	if err != nil {
		t.Fatal(err)
	}
	m := r.Momentum
	if math.Abs(m.Terms.Pressure[0]) > 1e-15 || math.Abs(m.Terms.Momentum[0]-mustDrag(t, &r, WakeDeficit)) > 1e-13 {
		t.Errorf("momentum terms %+v, deficit %g", m.Terms, mustDrag(t, &r, WakeDeficit))
	}
	if d := mustDrag(t, &r, WakeMomentum); math.Abs(d-(m.Terms.Momentum[0]+m.Terms.Viscous[0])) > 1e-13 {
		t.Errorf("momentum drag %g, terms %+v", d, m.Terms)
	}
}

// TestJonesCompressibleLimit: the exact compressible survey formula tends
// to Jones's as M∞ → 0 (VALIDATION §2.3, jones.py), with a difference of
// order M∞² (the first compressibility correction of the isentropic
// relations; ±0.15). The wake is the synthetic one of jones.py: p₀ = p₀∞ −
// 0.3q e^(−(y/0.05)²), p = p∞ − 0.02q e^(−(y/0.08)²), γ = 1.4, p∞ = 1.
func TestJonesCompressibleLimit(t *testing.T) {
	const g = 1.4
	var ms, diffs []float64
	for _, m := range []float64{0.05, 0.1, 0.2} {
		pinf := 1.0
		p0inf := pinf * math.Pow(1+(g-1)/2*m*m, g/(g-1))
		q := 0.5 * g * pinf * m * m
		rhoInf := 1.0
		u2 := g * pinf / rhoInf * m * m
		var jc, ji field.CompensatedSum
		for k := 0; k <= 4000; k++ {
			y := -0.2 + 0.4*float64(k)/4000
			p0 := p0inf - 0.3*q*math.Exp(-sq(y/0.05))
			p := pinf - 0.02*q*math.Exp(-sq(y/0.08))
			a, ok1 := JonesCompressible(p0, p, p0inf, pinf, rhoInf*u2, g)
			b, ok2 := Jones(p0, p, p0inf, pinf)
			if !ok1 || !ok2 {
				t.Fatalf("M=%g y=%g: formula refused", m, y)
			}
			jc.Add(a)
			ji.Add(b)
		}
		ms = append(ms, m)
		diffs = append(diffs, math.Abs(jc.Value()/ji.Value()-1))
	}
	if ord := fitOrder(ms, diffs); !(math.Abs(ord-2) <= 0.15) {
		t.Errorf("compressible − incompressible Jones: order %.3f in M (differences %v), want 2", ord, diffs)
	}
}

// TestEntropyWeakShock checks EntropyRise on the Rankine–Hugoniot normal
// shock (p₂/p₁ = 1 + 2γ(M²−1)/(γ+1), ρ₂/ρ₁ = (γ+1)M²/((γ−1)M² + 2);
// Anderson, Modern Compressible Flow, eqs. 3.57 and 3.53, from memory)
// against the weak-shock series of VALIDATION §2.6 for γ = 1.4,
// Δs/R = (35/216)m³ − (245/864)m⁴ + (329/864)m⁵ + O(m⁶), m = M₁² − 1: the
// difference must fall as m⁶ (±0.3, the next term's coefficient varies)
// and the leading term alone must be 19 % high at M₁ = 1.05 (as stated
// there).
func TestEntropyWeakShock(t *testing.T) {
	const g = 1.4
	rh := func(m1 float64) float64 {
		p21 := 1 + 2*g/(g+1)*(m1*m1-1)
		r21 := (g + 1) * m1 * m1 / ((g-1)*m1*m1 + 2)
		return EntropyRise(p21, r21, 1, 1, g)
	}
	var ms, errs []float64
	for _, m := range []float64{0.08, 0.04, 0.02} {
		series := 35.0/216*m*m*m - 245.0/864*math.Pow(m, 4) + 329.0/864*math.Pow(m, 5)
		ms, errs = append(ms, m), append(errs, math.Abs(rh(math.Sqrt(1+m))-series))
	}
	if ord := fitOrder(ms, errs); !(math.Abs(ord-6) <= 0.3) {
		t.Errorf("series error order %.3f (errors %v), want 6", ord, errs)
	}
	m := 1.05*1.05 - 1
	lead := 2 * g / (3 * sq(g+1)) * m * m * m
	if r := lead/rh(1.05) - 1; math.Abs(r-0.19) > 0.01 {
		t.Errorf("leading term %.3f high at M = 1.05, want 0.19", r)
	}
}

// TestEntropyDragSmallLoss: in a wake at p = p∞ with uniform total
// enthalpy, Oswatitsch's entropy drag equals the momentum deficit to first
// order in the loss (VALIDATION §2.6, §2.8: f_s1 = −1/(γM∞²)), so their
// relative difference falls linearly with the wake amplitude (±0.1).
func TestEntropyDragSmallLoss(t *testing.T) {
	const g, pinf, rhoInf, uInf = 1.4, 1e5, 1.2, 100.0
	cp := g / (g - 1) * pinf / rhoInf // c_p T∞ (R T∞ = p∞/ρ∞)
	h0 := cp + uInf*uInf/2
	var amps, rel []float64
	for _, amp := range []float64{0.04, 0.02, 0.01} {
		var ent, def field.CompensatedSum
		for k := -2000; k <= 2000; k++ {
			y := float64(k) / 1000
			u := uInf * (1 - amp*math.Exp(-y*y))
			cpT := h0 - u*u/2 // c_p T from uniform total enthalpy
			rho := pinf / (cpT * (g - 1) / g)
			ent.Add(pinf / (rhoInf * uInf) * rho * u * EntropyRise(pinf, rho, pinf, rhoInf, g))
			def.Add(rho * u * (uInf - u))
		}
		amps, rel = append(amps, amp), append(rel, math.Abs(ent.Value()/def.Value()-1))
	}
	if ord := fitOrder(amps, rel); !(math.Abs(ord-1) <= 0.1) {
		t.Errorf("entropy vs deficit drag: order %.3f in the amplitude (relative differences %v), want 1", ord, rel)
	}
}

// TestWakeDeterministic checks that the wake sums do not depend on the
// number of workers.
func TestWakeDeterministic(t *testing.T) {
	c, flow := wakeCut2D(t, 50)
	var first WakeResult
	for i, w := range []int{1, 2, 7} {
		opt := wakeOpt(1, 1, 0)
		opt.Workers = w
		r, err := Wake(c, flow, opt)
		if err != nil {
			t.Fatal(err)
		}
		if i == 0 {
			first = r
			continue
		}
		for k := range r.Drags {
			if r.Drags[k] != first.Drags[k] {
				t.Errorf("workers %d: %+v, want %+v", w, r.Drags[k], first.Drags[k])
			}
		}
	}
}

// TestWakeOptionErrors checks the option errors.
func TestWakeOptionErrors(t *testing.T) {
	c, flow := wakeCut2D(t, 10)
	for _, o := range []WakeOptions{wakeOpt(0, 1, 0), wakeOpt(1, 0, 0), {Options: wakeOpt(1, 1, 0).Options, Gamma: 0.5},
		{Options: wakeOpt(1, 1, 0).Options, Gamma: 1.4}, {Options: wakeOpt(1, 1, 1).Options, Span: -1}, {Options: Options{Free: Freestream{V: Vec3{1, 0, 0}, Rho: 1}, Plain: true}}} {
		if _, err := Wake(c, flow, o); err == nil {
			t.Errorf("%+v: no error", o)
		}
	}
}

// boxWake is a synthetic 3D flow that is the freestream (U, 0, 0), p∞,
// except for an axisymmetric deficit and a pressure dip that grow from
// zero at x = 0 like x²: u = U − A(x/L)²e^(−r²/σ²), p = p∞ − P(x/L)²e^(−r²/σ²),
// μ constant. It is not a solution of the flow equations; it serves the
// algebraic identity of VALIDATION §2.1: on a box whose upstream and side
// faces see the freestream (σ ≪ box half-width, so e^(−r²/σ²) < 1e-40
// there), the closed-surface drag is the downstream face's, i.e. the
// exact wake-plane momentum drag of that face.
type boxWake struct{ U, A, P, L, Sigma, Rho, Mu float64 }

func (f boxWake) EvalFlow(_ field.Location, x [3]float64, st *field.FlowState) {
	r2 := x[1]*x[1] + x[2]*x[2]
	e := math.Exp(-r2 / (f.Sigma * f.Sigma))
	s := x[0] / f.L
	*st = field.FlowState{Rho: f.Rho, Mu: f.Mu, P: 1e5 - f.P*s*s*e, V: [3]float64{f.U - f.A*s*s*e, 0, 0}}
	st.GradV[0] = [3]float64{-2 * f.A * s / f.L * e, f.A * s * s * e * 2 * x[1] / (f.Sigma * f.Sigma), f.A * s * s * e * 2 * x[2] / (f.Sigma * f.Sigma)}
}

// TestWakePlaneIsClosedSurface checks that the exact wake-plane momentum
// drag of the downstream face equals the closed-surface drag of the box
// (to quadrature rounding, 1e-10 relative).
func TestWakePlaneIsClosedSurface(t *testing.T) {
	flow := boxWake{U: 20, A: 3, P: 40, L: 4, Sigma: 0.2, Rho: 1.2, Mu: 0.01}
	z := fieldtest.BoxTet([3]float64{-1, -3, -3}, [3]float64{5, 3, 3}, [3]int{6, 6, 6})
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		t.Fatal(err)
	}
	box, err := surface.ParseSpec("box min=0,-2,-2 max=4,2,2")
	if err != nil {
		t.Fatal(err)
	}
	bc, err := surface.CutSurface(l, box, surface.CutOptions{})
	if err != nil {
		t.Fatal(err)
	}
	opt := WakeOptions{Options: Options{Free: Freestream{V: Vec3{20, 0, 0}, Rho: 1.2, P: 1e5}}}
	closed, err := Forces(bc, flow, opt.Options)
	if err != nil {
		t.Fatal(err)
	}
	p, err := surface.ParsePlane("x=4 ymin=-2 ymax=2 zmin=-2 zmax=2")
	if err != nil {
		t.Fatal(err)
	}
	pc, _, err := surface.CutPlane(l, p, surface.CutOptions{})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Wake(pc, flow, opt)
	if err != nil {
		t.Fatal(err)
	}
	d := mustDrag(t, &r, WakeMomentum)
	if math.Abs(d-closed.Wind.Drag) > 1e-10*math.Abs(closed.Wind.Drag) || closed.Wind.Drag == 0 {
		t.Errorf("wake-plane drag %.15g, closed box %.15g", d, closed.Wind.Drag)
	}
}

// TestCrossflowDeterministic checks that the crossflow figures do not
// depend on the number of workers.
func TestCrossflowDeterministic(t *testing.T) {
	var first CrossflowResult
	for i, w := range []int{1, 3} {
		opt := ellipseOpt()
		opt.Workers = w
		cf := ellipseCrossflow(t, 20, 40, opt)
		if i == 0 {
			first = cf
			continue
		}
		if cf.Maskell != first.Maskell || cf.Lift != first.Lift || cf.Energy != first.Energy {
			t.Errorf("workers %d: %v %v %v, want %v %v %v", w, cf.Maskell, cf.Lift, cf.Energy, first.Maskell, first.Lift, first.Energy)
		}
	}
}

// entropyWake is a 2D compressible test state at p = p∞ with uniform
// total enthalpy: u = U(1 − a e^(−y²)) (a vortical wake, Shear = true) or
// uniform u = U with the same temperature bump carried by a density dip
// (no vorticity anywhere: entropy made away from any wake).
type entropyWake struct {
	U, A, Gamma, PInf, RhoInf float64
	Shear                     bool
}

func (f entropyWake) EvalFlow(_ field.Location, x [3]float64, st *field.FlowState) {
	e := math.Exp(-x[1] * x[1])
	cp := f.Gamma / (f.Gamma - 1) * f.PInf / f.RhoInf
	uw := f.U * (1 - f.A*e)
	cpT := cp + f.U*f.U/2 - uw*uw/2
	*st = field.FlowState{P: f.PInf, Rho: f.PInf / (cpT * (f.Gamma - 1) / f.Gamma), V: [3]float64{f.U, 0, 0}}
	if f.Shear {
		st.V[0] = uw
		st.GradV[0][1] = f.U * f.A * 2 * x[1] * e
	}
}

// TestEntropyAwayFlag checks the spurious-entropy flag: entropy carried
// where there is no vorticity is flagged (all of it counts as away from
// the wake), entropy inside a vortical wake is not.
func TestEntropyAwayFlag(t *testing.T) {
	z := fieldtest.RectQuad([2]float64{-1, -8}, [2]float64{1, 8}, [2]int{2, 40})
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		t.Fatal(err)
	}
	p, _ := surface.ParsePlane("x=0.5 ymin=-8 ymax=8")
	c, _, err := surface.CutPlane(l, p, surface.CutOptions{})
	if err != nil {
		t.Fatal(err)
	}
	opt := WakeOptions{Options: Options{Free: Freestream{V: Vec3{100, 0, 0}, Rho: 1.2, P: 1e5}}, Gamma: 1.4}
	for _, shear := range []bool{false, true} {
		r, err := Wake(c, entropyWake{U: 100, A: 0.02, Gamma: 1.4, PInf: 1e5, RhoInf: 1.2, Shear: shear}, opt)
		if err != nil {
			t.Fatal(err)
		}
		ent := mustDrag(t, &r, WakeEntropy)
		if !(ent > 0) {
			t.Fatalf("shear %v: entropy drag %g", shear, ent)
		}
		away := r.EntropyAway / ent
		if shear && (away > 0.01 || len(r.Flags) != 0) || !shear && (math.Abs(away-1) > 1e-12 || len(r.Flags) != 1) {
			t.Errorf("shear %v: away fraction %g, flags %q", shear, away, r.Flags)
		}
	}
}

// TestBetzIdentity checks the algebraic split of VALIDATION §2.4 point by
// point on an incompressible field (ρ = ρ∞): Betz profile drag + crossflow
// energy + blockage term = ∬[ρu(U∞−u) + (p∞−p)]dS, the exact wake-plane
// drag without τxx (here the momentum and pressure terms of Forces), to
// rounding.
func TestBetzIdentity(t *testing.T) {
	flow := boxWake{U: 20, A: 3, P: 40, L: 4, Sigma: 0.5, Rho: 1.2, Mu: 0.01}
	z := fieldtest.BoxTet([3]float64{-1, -3, -3}, [3]float64{5, 3, 3}, [3]int{6, 6, 6})
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		t.Fatal(err)
	}
	p, _ := surface.ParsePlane("x=3.3 ymin=-2 ymax=2 zmin=-2 zmax=2")
	c, _, err := surface.CutPlane(l, p, surface.CutOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		flow field.FlowEvaluator
		opt  WakeOptions
	}{
		{flow, WakeOptions{Options: Options{Free: Freestream{V: Vec3{20, 0, 0}, Rho: 1.2, P: 1e5}}}},
		{ellipse, ellipseOpt()}, // crossflow, uniform total pressure
	} {
		r, err := Wake(c, tc.flow, tc.opt)
		if err != nil {
			t.Fatal(err)
		}
		split := mustDrag(t, &r, WakeBetz) + mustDrag(t, &r, WakeCrossKE) + mustDrag(t, &r, WakeBlockage)
		want := r.Momentum.Terms.Momentum[0] + r.Momentum.Terms.Pressure[0]
		if math.Abs(split-want) > 1e-10*math.Abs(want) || r.BetzClamped != 0 || want == 0 {
			t.Errorf("Betz split %.15g, momentum + pressure %.15g (clamped %g)", split, want, r.BetzClamped)
		}
	}
}
