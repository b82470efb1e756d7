package integrate_test

import (
	"errors"
	"fmt"
	"math"
	"math/rand"
	"strings"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/integrate"
	"farforce/readers"
	"farforce/surface"
)

// cylinderSplit returns the momentum-flux and pressure parts of the lift
// through a centred circle of radius R around a cylinder of radius a with
// circulation (VALIDATION.md §3.1a, derived there and checked numerically):
//
//	F_y^mom = (ρUΓ/2)(1 − a²/R²),  F_y^p = (ρUΓ/2)(1 + a²/R²)
func cylinderSplit(rhoUGamma, a, r float64) (mom, prs float64) {
	return rhoUGamma / 2 * (1 - a*a/(r*r)), rhoUGamma / 2 * (1 + a*a/(r*r))
}

// Members from an exact field: the parts change with the radius but their
// sum is ρUΓ to rounding, so the plateau covers every member and nothing
// drifts.
func TestVerdictExactFieldPlateau(t *testing.T) {
	const lift, a = 8.06, 0.7 // ρ = 1.3, U = 2, Γ = 3.1 (VALIDATION.md §3.1a)
	// The oracle itself: the split quoted in VALIDATION.md §3.1a.
	for _, c := range []struct{ r, mom, prs float64 }{{1, 2.0553, 6.0047}, {2, 3.536325, 4.523675}, {10, 4.010253, 4.049747}} {
		m, p := cylinderSplit(lift, a, c.r)
		if math.Abs(m-c.mom) > 1e-6 || math.Abs(p-c.prs) > 1e-6 {
			t.Fatalf("R=%g: split %g/%g, VALIDATION §3.1a gives %g/%g", c.r, m, p, c.mom, c.prs)
		}
	}
	var members []integrate.SweepMember
	for k := 0; k < 8; k++ {
		r := 0.8 * math.Pow(1.3, float64(k))
		m, p := cylinderSplit(lift, a, r)
		members = append(members, integrate.SweepMember{Scale: r, Drag: 0, Lift: m + p})
	}
	v, err := integrate.Verdict(members, integrate.VerdictOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("%+v", v)
	if v.Plateau.Members != 8 || v.Plateau.First != 0 || v.Plateau.Last != 7 {
		t.Errorf("plateau %+v, want all 8 members", v.Plateau)
	}
	if math.Abs(v.Plateau.Lift-lift) > 1e-13*lift || v.Plateau.LiftSpread > 1e-14*lift {
		t.Errorf("plateau lift %g ± %g, want %g to rounding", v.Plateau.Lift, v.Plateau.LiftSpread, lift)
	}
	if v.Drift.Flagged {
		t.Errorf("drift flagged on an exact field: %+v", v.Drift)
	}
	if v.Band != integrate.DefaultSweepRelTol*lift {
		t.Errorf("band %g, want 0.5 %% of |F| = %g", v.Band, integrate.DefaultSweepRelTol*lift)
	}
}

// A known linear spurious drift, drag = D0 + k·scale (the DFG 2D-1 c_D as
// D0, Schäfer & Turek 1996), with a mass imbalance growing in step: the
// drift is flagged with slope k to rounding, and the note blames mass error.
func TestVerdictLinearDrift(t *testing.T) {
	const d0, k, mk = 5.57953523384, 0.0123, 2e-4 // mk: imbalance per unit scale
	var members []integrate.SweepMember
	// Given largest first: Verdict sorts by scale and reports input indices.
	for i := 6; i >= 0; i-- {
		s := 1 + 0.25*float64(i)
		members = append(members, integrate.SweepMember{Scale: s, Drag: d0 + k*s, Lift: 0.0106, MassImbalance: mk * s})
	}
	v, err := integrate.Verdict(members, integrate.VerdictOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("%+v", v)
	if math.Abs(v.Drift.DragSlope-k) > 1e-12*k || !v.Drift.Flagged || !v.Drift.Monotone || v.Drift.Settling {
		t.Errorf("drift %+v, want slope %g, flagged and monotone", v.Drift, k)
	}
	if math.Abs(v.Drift.Change-k*1.5) > 1e-12 || v.Drift.Scatter > 1e-13 {
		t.Errorf("change %g scatter %g, want %g and 0", v.Drift.Change, v.Drift.Scatter, k*1.5)
	}
	if math.Abs(v.MassTrend-mk) > 1e-12*mk || math.Abs(v.MassDragCorrelation-1) > 1e-12 {
		t.Errorf("mass trend %g correlation %g, want %g and 1", v.MassTrend, v.MassDragCorrelation, mk)
	}
	// Band 0.5 % of 5.59 ≈ 0.028 holds 0.028/(0.25 k) ≈ 9 steps: the
	// whole sweep is one plateau, yet the drift is still reported apart.
	if !hasNote(v, "drifts monotonically") || !hasNote(v, "mass error") {
		t.Errorf("notes %q lack the drift and mass explanations", v.Notes)
	}
	// With a tight band (1 count absolute, no relative part to speak of)
	// the plateau shrinks to the members within 1e-4: none agree.
	v, err = integrate.Verdict(members, integrate.VerdictOptions{RelTol: 1e-9, AbsTol: 1e-4})
	if err != nil {
		t.Fatal(err)
	}
	if v.Plateau.Members != 1 || !v.Drift.Flagged || !hasNote(v, "No three consecutive") {
		t.Errorf("tight band: plateau %+v, flagged %v, notes %q", v.Plateau, v.Drift.Flagged, v.Notes)
	}
}

// Noise only: scatter is reported, no drift. Fixed seed; noise uniform in
// ±0.3 band, so every pair agrees and the plateau covers all; with ±2 band
// noise the scatter note appears and still no drift is flagged.
func TestVerdictNoiseOnly(t *testing.T) {
	const d0 = 2.0
	rng := rand.New(rand.NewSource(7))
	band := integrate.DefaultSweepRelTol * d0
	for _, amp := range []float64{0.3, 2} {
		var members []integrate.SweepMember
		for i := 0; i < 10; i++ {
			members = append(members, integrate.SweepMember{Scale: 1 + 0.2*float64(i), Drag: d0 + amp*band*(2*rng.Float64()-1)})
		}
		v, err := integrate.Verdict(members, integrate.VerdictOptions{})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("amp %g band: %+v", amp, v)
		if v.Drift.Flagged {
			t.Errorf("amp %g: drift flagged on noise: %+v", amp, v.Drift)
		}
		// Uniform noise in ±A has standard deviation A/√3; the residual
		// estimate from 10 samples is within a factor 2 of it.
		sd := amp * band / math.Sqrt(3)
		if v.Drift.Scatter < sd/2 || v.Drift.Scatter > 2*sd {
			t.Errorf("amp %g: scatter %g, want about %g", amp, v.Drift.Scatter, sd)
		}
		if amp < 0.5 && v.Plateau.Members != 10 {
			t.Errorf("amp %g: plateau %+v, want all 10", amp, v.Plateau)
		}
		if amp > 1 && !hasNote(v, "scatter") {
			t.Errorf("amp %g: notes %q lack the scatter explanation", amp, v.Notes)
		}
	}
}

// Surfaces too close to the body scatter; the plateau starts after them and
// the note says why.
func TestVerdictCloseSurfaces(t *testing.T) {
	drag := []float64{5.2, 5.9, 5.58, 5.581, 5.579, 5.5805, 5.58}
	var members []integrate.SweepMember
	for i, d := range drag {
		members = append(members, integrate.SweepMember{Scale: 0.1 + 0.05*float64(i), Drag: d})
	}
	v, err := integrate.Verdict(members, integrate.VerdictOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if v.Plateau.First != 2 || v.Plateau.Last != 6 || math.Abs(v.Plateau.Drag-5.5801) > 1e-12 || math.Abs(v.Plateau.DragSpread-0.001) > 1e-12 {
		t.Errorf("plateau %+v, want members 2..6, drag 5.5801 ± 0.001", v.Plateau)
	}
	if !hasNote(v, "close to the body") {
		t.Errorf("notes %q lack the too-close explanation", v.Notes)
	}
}

// A near-body error that decays with size, drag = D0 + c/s² (the
// far-field error of a surface at distance s from a body falls off with s;
// invented amplitude), is a drift that settles: flagged as settling, with
// the too-close explanation, and no blame on dissipation.
func TestVerdictSettlingDrift(t *testing.T) {
	var members []integrate.SweepMember
	for i := 0; i < 8; i++ {
		s := 1 + 0.3*float64(i)
		members = append(members, integrate.SweepMember{Scale: s, Drag: 2 + 0.05/(s*s)})
	}
	v, err := integrate.Verdict(members, integrate.VerdictOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("%+v", v)
	if !v.Drift.Flagged || !v.Drift.Settling || !hasNote(v, "too close to the body") || hasNote(v, "dissipation") {
		t.Errorf("drift %+v notes %q: want a settling drift explained by surfaces too close to the body", v.Drift, v.Notes)
	}
}

func TestVerdictErrors(t *testing.T) {
	ok := []integrate.SweepMember{{Scale: 1, Drag: 1}, {Scale: 2, Drag: 1}, {Scale: 3, Drag: 1}}
	bad := func(i int, f func(m *integrate.SweepMember)) []integrate.SweepMember {
		m := append([]integrate.SweepMember(nil), ok...)
		f(&m[i])
		return m
	}
	cases := map[string]struct {
		m   []integrate.SweepMember
		opt integrate.VerdictOptions
	}{
		"too few":        {ok[:2], integrate.VerdictOptions{}},
		"NaN drag":       {bad(1, func(m *integrate.SweepMember) { m.Drag = math.NaN() }), integrate.VerdictOptions{}},
		"infinite scale": {bad(2, func(m *integrate.SweepMember) { m.Scale = math.Inf(1) }), integrate.VerdictOptions{}},
		"same scale":     {bad(2, func(m *integrate.SweepMember) { m.Scale = 1 }), integrate.VerdictOptions{}},
		"negative tol":   {ok, integrate.VerdictOptions{RelTol: -1}},
	}
	for name, c := range cases {
		_, err := integrate.Verdict(c.m, c.opt)
		if !errors.Is(err, integrate.ErrSweep) {
			t.Errorf("%s: err = %v, want ErrSweep", name, err)
		} else {
			t.Logf("%s: %v", name, err)
		}
	}
}

func hasNote(v integrate.SweepVerdict, s string) bool {
	for _, n := range v.Notes {
		if strings.Contains(n, s) {
			return true
		}
	}
	return false
}

// lagallyDrag is the exact x-force on the plane sources enclosed by a
// closed contour in a stream U (Lagally's theorem; VALIDATION.md §3.1d
// for one source, −ρUm): each enclosed source m_i feels −ρ m_i times the
// velocity there of the stream and of the sources outside (forces between
// enclosed sources cancel in pairs). All sources lie on the x axis here.
func lagallyDrag(rho, u float64, src []fieldtest.Source2D, enclosed func(s fieldtest.Source2D) bool) float64 {
	var f float64
	for _, si := range src {
		if !enclosed(si) {
			continue
		}
		v := u
		for _, sj := range src {
			if !enclosed(sj) {
				v += sj.M / (2 * math.Pi * (si.X - sj.X))
			}
		}
		f -= rho * si.M * v
	}
	return f
}

// sweepCircles cuts circles of radius radii[j] about the origin through a
// square mesh and returns the plain-form wind forces of flow as members.
func sweepCircles(t *testing.T, flow fieldtest.Potential2D, radii []float64) []integrate.SweepMember {
	t.Helper()
	mesh := fieldtest.RectQuad([2]float64{-3, -3}, [2]float64{3, 3}, [2]int{96, 96})
	loc, err := field.NewLocator(&field.Field{Zones: []*field.Zone{mesh}})
	if err != nil {
		t.Fatal(err)
	}
	base, err := surface.ParseSpec(fmt.Sprintf("circle center=0,0 radius=%g size=0.02", radii[0]))
	if err != nil {
		t.Fatal(err)
	}
	opt := integrate.Options{Free: integrate.Freestream{V: [3]float64{flow.U, 0, 0}, Rho: flow.Rho, P: flow.PInf}, Plain: true}
	var members []integrate.SweepMember
	for _, r := range radii {
		cut, err := surface.CutSurface(loc, base.Scaled(r/radii[0]), surface.CutOptions{})
		if err != nil {
			t.Fatal(err)
		}
		res, err := integrate.Forces(cut, flow, opt)
		if err != nil {
			t.Fatal(err)
		}
		members = append(members, integrate.SweepMember{Scale: r, Drag: res.Wind.Drag, Lift: res.Wind.Lift, MassImbalance: res.MassImbalance, MassFlux: res.MassFlux})
	}
	return members
}

// Physics: the plain-form drag of a Rankine half body, −ρUm (VALIDATION.md
// §3.1d: ρ = 1.3, U = 2, m = 2.5 → −6.5), does not depend on the size of
// the surface: the plateau holds every member. A spurious line of small
// sources along the wake (a model of a mass error spread through the wake,
// VALIDATION.md §5.3) adds −ρU m_s per source each surface encloses, so the
// drag falls steadily with size; Verdict flags the drift with the slope of
// the exact (Lagally) drags.
func TestVerdictSpuriousSourceDrift(t *testing.T) {
	const rho, u, m = 1.3, 2.0, 2.5
	radii := []float64{1.05, 1.25, 1.45, 1.65, 1.85, 2.05, 2.25, 2.45}
	clean := fieldtest.RankineHalfBody(rho, u, m)
	v, err := integrate.Verdict(sweepCircles(t, clean, radii), integrate.VerdictOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("clean: %+v", v)
	// Quadrature of the exact field on 0.02 facets: ~1e-9 relative.
	if v.Plateau.Members != len(radii) || math.Abs(v.Plateau.Drag+6.5) > 1e-6 || v.Drift.Flagged || v.MassDragCorrelation != 0 {
		t.Errorf("clean half body: plateau %+v drift %+v, want all members at −6.5 and no drift", v.Plateau, v.Drift)
	}

	// Spurious sources of m_s = 2e-3 every 0.1 from x = 0.5: each radius
	// lies midway between two of them, and encloses 2 more than the last.
	dirty := clean
	const ms = 2e-3
	for k := 0; k <= 40; k++ {
		dirty.Sources = append(dirty.Sources, fieldtest.Source2D{X: 0.5 + 0.1*float64(k), M: ms})
	}
	members := sweepCircles(t, dirty, radii)
	exact := make([]integrate.SweepMember, len(radii))
	for j, r := range radii {
		d := lagallyDrag(rho, u, dirty.Sources, func(s fieldtest.Source2D) bool { return math.Abs(s.X) < r })
		exact[j] = integrate.SweepMember{Scale: r, Drag: d}
		t.Logf("R = %.2f: drag %.9f, Lagally %.9f, mass imbalance %.3g", r, members[j].Drag, d, members[j].MassImbalance)
		if math.Abs(members[j].Drag-d) > 1e-6 {
			t.Errorf("R = %.2f: drag %.9f, Lagally %.9f", r, members[j].Drag, d)
		}
	}
	v, err = integrate.Verdict(members, integrate.VerdictOptions{})
	if err != nil {
		t.Fatal(err)
	}
	ve, err := integrate.Verdict(exact, integrate.VerdictOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("dirty: %+v", v)
	// Leading order: −ρU m_s per source, 10 sources per unit radius.
	lead := -rho * u * ms / 0.1
	if !v.Drift.Flagged || v.Drift.Settling || math.Abs(v.Drift.DragSlope-ve.Drift.DragSlope) > 1e-5 || math.Abs(v.Drift.DragSlope/lead-1) > 0.5 {
		t.Errorf("drift %+v: want flagged, slope %g (Lagally) ≈ %g (leading order)", v.Drift, ve.Drift.DragSlope, lead)
	}
	// The plain-form drag changes by −U∞ Δṁ (VALIDATION.md §1.4): the
	// drag falls as the enclosed flux grows, correlation −1 up to the
	// Lagally interaction terms.
	if v.MassDragCorrelation > -0.99 || !hasNote(v, "mass error") || hasNote(v, "close to the body") {
		t.Errorf("correlation %g, notes %q: want the drift tied to the mass flux, no too-close note", v.MassDragCorrelation, v.Notes)
	}
}

// The real benchmark solution (Schäfer & Turek 1996, case 2D-1; the
// P2-refined file of ../testdata/real, provenance there): a size sweep of
// circles about the cylinder reports a plateau at the published c_D, and the
// far field agrees with the near field of the wall file.
//
// Tolerances, from ../testdata/real/README.md: an independent far-field
// check on this file found c_D between 5.576 and 5.590 over circles of
// radius 0.075–0.175, so "a tool that does the job well" is within 0.016 of
// the reference 5.57953523384 and explains the rest in its sweep report.
// Measured here: 5.6111, 5.5977, 5.5886, 5.5815, 5.5742 (R = 0.075 …
// 0.175): the two smallest circles, 0.025 and 0.05 from the wall, are
// 0.03 and 0.02 high (their viscous term, from recovered gradients in the
// boundary layer, is the difference), so members are held to 0.016 from
// R = 0.125 and to 0.04 (0.7 %) closer in; the plateau must be at the
// reference within 0.016. The wall file's own integral is 0.38 % low
// (TestNearFieldDFG2D1Wall) and the far field up to 0.2 % high, so
// far − near stays below 0.6 % (≈ 330 counts).
func TestSweepDFG2D1(t *testing.T) {
	_, loc, flow := dfgFlow(t, "dfg2d1_coarse_tri_p2refined_binary.vtk")
	// c = 2F/(ρŪ²D): ρ = 1, Ū = 0.2, D = 0.1 (2D reference length).
	opt := integrate.Options{Free: integrate.Freestream{V: [3]float64{0.2, 0, 0}, Rho: 1}, RefLength: 0.1, MomentCenter: [3]float64{0.2, 0.2, 0}}
	base, err := surface.ParseSpec("circle center=0.2,0.2 radius=0.075")
	if err != nil {
		t.Fatal(err)
	}
	var members []integrate.SweepMember
	var last integrate.Result
	for _, r := range []float64{0.075, 0.1, 0.125, 0.15, 0.175} {
		cut, err := surface.CutSurface(loc, base.Scaled(r/0.075), surface.CutOptions{})
		if err != nil {
			t.Fatal(err)
		}
		res, err := integrate.Forces(cut, flow, opt)
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("R = %.3f: c_D = %.5f, c_L = %.5f, mass imbalance %.2g (%d facets)", r, res.Coefficients.Drag, res.Coefficients.Lift, res.MassImbalance, res.Facets)
		tol := 0.016
		if r < 0.12 {
			tol = 0.04
		}
		if math.Abs(res.Coefficients.Drag-5.57953523384) > tol {
			t.Errorf("R = %.3f: c_D = %.5f, want 5.5795 ± %g", r, res.Coefficients.Drag, tol)
		}
		members = append(members, integrate.SweepMember{Scale: r, Drag: res.Coefficients.Drag, Lift: res.Coefficients.Lift,
			MassImbalance: res.MassImbalance, MassFlux: res.MassFlux})
		last = res
	}
	v, err := integrate.Verdict(members, integrate.VerdictOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("verdict: %+v", v)
	if v.Plateau.Members < 3 || math.Abs(v.Plateau.Drag-5.57953523384) > 0.016 {
		t.Errorf("plateau %+v, want ≥ 3 members at 5.5795 ± 0.016", v.Plateau)
	}

	wf, err := readers.ReadFile("testdata/dfg2d1_coarse_wall_ascii.vtk", readers.Options{})
	if err != nil {
		t.Fatal(err)
	}
	near, err := integrate.NearField(wf.Zones[0], integrate.WallOptions{Pressure: "pressure", Traction: "wall_shear_stress"}, opt)
	if err != nil {
		t.Fatal(err)
	}
	d := integrate.CompareNearFar(last, near)
	t.Logf("far (R = 0.175) − near: Δc_D = %.5f (%.1f counts, %.3f %%), Δc_L = %.5f", d.Coefficients.Drag, d.DragCounts, d.DragPercent, d.Coefficients.Lift)
	if math.Abs(d.DragPercent) > 0.6 {
		t.Errorf("far − near = %.3f %%, want within 0.6 %%", d.DragPercent)
	}
}
