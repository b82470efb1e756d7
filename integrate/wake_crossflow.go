package integrate

import (
	"fmt"
	"math"

	"farforce/field"
	"farforce/surface"
)

// LoadingPoint is the circulation Γ (m²/s) at spanwise plane coordinate S1
// (m).
type LoadingPoint struct {
	S1    float64 `json:"s1"`
	Gamma float64 `json:"gamma"`
}

// CrossflowResult is the crossflow (Trefftz-plane) analysis of a wake
// plane grid; see Crossflow. Forces in N, circulations in m²/s.
type CrossflowResult struct {
	Grid [2]int     `json:"grid"`
	H    [2]float64 `json:"spacing"`
	// Energy is (ρ∞/2)∬(v²+w²)dS over the plane (midpoint rule), Tail the
	// dipole estimate of the same integral outside the plane and
	// EnergyTail their sum.
	Energy     float64 `json:"energy"`
	Tail       float64 `json:"tail"`
	EnergyTail float64 `json:"energy_tail"`
	// Dipole is the crossflow dipole strength μ (m³/s, as re, im) of the
	// far field F ≈ μ/ζ, ζ = (s1 − c1) + i(s2 − c2) about the plane centre.
	Dipole [2]float64 `json:"dipole"`
	// NetCirculation ∬ξ dS and NetSource ∬σ dS (m²/s).
	NetCirculation float64 `json:"net_circulation"`
	NetSource      float64 `json:"net_source"`
	// MaskellVortex (ρ∞/2)∬ψξ dS, MaskellSource −(ρ∞/2)∬φσ dS and their
	// sum Maskell, the induced drag.
	MaskellVortex float64 `json:"maskell_vortex"`
	MaskellSource float64 `json:"maskell_source"`
	Maskell       float64 `json:"maskell"`
	// Loading is Γ(s1) at the grid columns; Lift = ρ∞U∞∫Γ ds1.
	Loading []LoadingPoint `json:"loading"`
	Lift    float64        `json:"lift"`
	// Span is the span used for the efficiency (given, or the extent of
	// |Γ| ≥ 1 % of its peak when SpanEstimated).
	Span          float64 `json:"span"`
	SpanEstimated bool    `json:"span_estimated"`
	// SpanEfficiency e = L²/(π q∞ b² D_i) (from C_Di = C_L²/(π e AR)),
	// with D_i = Maskell; 0 when not computable.
	SpanEfficiency float64 `json:"span_efficiency"`
	// CL, CDi and AR = b²/S_ref when a reference area is given.
	CL              float64  `json:"cl"`
	CDi             float64  `json:"cdi"`
	AR              float64  `json:"aspect_ratio"`
	HasCoefficients bool     `json:"has_coefficients"`
	Flags           []string `json:"flags"`
}

// Crossflow analyses the crossflow (v, w) = ((V − V∞)·E1, (V − V∞)·E2)
// (the freestream's part drops out when the plane is normal to it, as it
// should be; a tilt of more than 2.6° is flagged) sampled at the
// points of g (VALIDATION §2.4–2.5, §3.6), with ρ∞ and U∞ = |V∞| from opt:
//
//   - energy form (ρ∞/2)∬(v²+w²)dS by the midpoint rule, plus the
//     truncation estimate of a 2D dipole far field, (ρ∞/2)|μ|²∬_outside r⁻⁴dS
//     (closed form for the rectangle), which for a circle of radius R is the
//     relative deficit (s/R)²/4 of an elliptic wing of semi-span s;
//   - Maskell's form (ρ∞/2)∬ψξ dS − (ρ∞/2)∬φσ dS with ∇²ψ = −ξ, ∇²φ = σ,
//     ξ = ∂w/∂y − ∂v/∂z, σ = ∂v/∂y + ∂w/∂z at the grid corners (the
//     circulation / outflow of each dual cell, by the trapezoid rule) and
//     the Poisson problems solved by discrete sine transforms with the
//     free-space values ψ = −(1/2π)∬ξ ln r dS, φ = (1/2π)∬σ ln r dS on the
//     plane edge, so no truncation error arises from vorticity inside the
//     plane;
//   - the loading Γ(s1) = −∮ around the strip s1' < s1 (the vorticity
//     shed inboard of s1, which telescopes exactly over the dual cells),
//     lift L = ρ∞U∞∫Γ ds1 (never ∬w dS, which is conditionally convergent),
//     span efficiency e = L²/(π q∞ b² D_i).
//
// Concurrency: evaluates the flow and the edge values on opt.Workers
// goroutines; the result does not depend on their number. Errors: invalid
// options, a non-finite flow value at a grid point (*ValueError with
// Point the grid index).
func Crossflow(g *surface.PlaneGrid, flow field.FlowEvaluator, opt WakeOptions) (CrossflowResult, error) {
	if err := opt.check(); err != nil {
		return CrossflowResult{}, err
	}
	if err := opt.checkWake(); err != nil {
		return CrossflowResult{}, err
	}
	e1, e2, _, err := g.Plane.Axes()
	if err != nil {
		return CrossflowResult{}, fmt.Errorf("%w: %v", ErrOption, err)
	}
	n1, n2 := g.N1, g.N2
	n := n1 * n2
	v, w := make([]float64, n), make([]float64, n)
	spec := g.Plane.String()
	err = forChunks(n2, opt.Workers, func(j int) error {
		var st field.FlowState
		var cache field.FlowCache
		for i := 0; i < n1; i++ {
			k := j*n1 + i
			evalFlow(flow, g.At[k], g.X[k], &st, &cache)
			if name, val, ok := checkState(&st); !ok {
				return &ValueError{Spec: spec, Point: k, X: g.X[k], Cell: g.At[k].Ref(), Quantity: name, Value: val}
			}
			d := sub(st.V, opt.Free.V)
			v[k], w[k] = dot(d, e1), dot(d, e2)
		}
		return nil
	})
	if err != nil {
		return CrossflowResult{}, err
	}
	rho, uInf := opt.Free.Rho, norm(opt.Free.V)
	h1, h2 := g.H1, g.H2
	da := h1 * h2
	r := CrossflowResult{Grid: [2]int{n1, n2}, H: [2]float64{h1, h2}}

	var ke field.CompensatedSum
	for k := 0; k < n; k++ {
		ke.Add(0.5 * rho * (v[k]*v[k] + w[k]*w[k]) * da)
	}
	r.Energy = ke.Value()

	// Vorticity and divergence at the corners.
	pg := poissonGrid{m1: n1 - 1, m2: n2 - 1, h1: h1, h2: h2}
	nn := (n1 + 1) * (n2 + 1)
	xi, sig := make([]float64, nn), make([]float64, nn)
	for j := 1; j < n2; j++ {
		for i := 1; i < n1; i++ {
			a, b, c, d := (j-1)*n1+i-1, (j-1)*n1+i, j*n1+i, j*n1+i-1 // SW, SE, NE, NW
			dwdy := (w[b] + w[c] - w[a] - w[d]) / (2 * h1)
			dvdz := (v[c] + v[d] - v[a] - v[b]) / (2 * h2)
			dvdy := (v[b] + v[c] - v[a] - v[d]) / (2 * h1)
			dwdz := (w[c] + w[d] - w[a] - w[b]) / (2 * h2)
			xi[pg.idx(i, j)], sig[pg.idx(i, j)] = dwdy-dvdz, dvdy+dwdz
		}
	}
	c1, c2 := (g.Plane.Min[0]+g.Plane.Max[0])/2, (g.Plane.Min[1]+g.Plane.Max[1])/2
	corner := func(i, j int) (float64, float64) {
		return g.Plane.Min[0] + float64(i)*h1 - c1, g.Plane.Min[1] + float64(j)*h2 - c2
	}
	var circ, src, mre, mim field.CompensatedSum
	for j := 1; j < n2; j++ {
		for i := 1; i < n1; i++ {
			k := pg.idx(i, j)
			a, b := corner(i, j)
			circ.Add(xi[k] * da)
			src.Add(sig[k] * da)
			mre.Add(-(sig[k]*a + xi[k]*b) * da / (2 * math.Pi))
			mim.Add(-(sig[k]*b - xi[k]*a) * da / (2 * math.Pi))
		}
	}
	r.NetCirculation, r.NetSource = circ.Value(), src.Value()
	r.Dipole = [2]float64{mre.Value(), mim.Value()}
	ha, hb := (g.Plane.Max[0]-g.Plane.Min[0])/2, (g.Plane.Max[1]-g.Plane.Min[1])/2
	r.Tail = 0.5 * rho * (sq(r.Dipole[0]) + sq(r.Dipole[1])) * rectExteriorR4(ha, hb)
	r.EnergyTail = r.Energy + r.Tail

	// Poisson solves with free-space edge values.
	psiB, phiB, err := edgeValues(pg, xi, sig, corner, opt.Workers)
	if err != nil {
		return CrossflowResult{}, err
	}
	negXi := make([]float64, nn)
	for k := range xi {
		negXi[k] = -xi[k]
	}
	psi := pg.solve(negXi, psiB)
	phi := pg.solve(sig, phiB)
	var mv, ms field.CompensatedSum
	for j := 1; j < n2; j++ {
		for i := 1; i < n1; i++ {
			k := pg.idx(i, j)
			mv.Add(0.5 * rho * psi[k] * xi[k] * da)
			ms.Add(-0.5 * rho * phi[k] * sig[k] * da)
		}
	}
	r.MaskellVortex, r.MaskellSource = mv.Value(), ms.Value()
	r.Maskell = r.MaskellVortex + r.MaskellSource

	// Loading: Γ at column i is minus the vorticity of corner columns 1..i.
	r.Loading = make([]LoadingPoint, n1)
	var gam, lift field.CompensatedSum
	for i := 0; i < n1; i++ {
		if i > 0 {
			for j := 1; j < n2; j++ {
				gam.Add(-xi[pg.idx(i, j)] * da)
			}
		}
		r.Loading[i] = LoadingPoint{S1: g.S1(i), Gamma: gam.Value()}
		lift.Add(rho * uInf * gam.Value() * h1)
	}
	r.Lift = lift.Value()
	r.finish(&opt)
	if fl := tiltFlag(g.Plane.Normal, opt.Free.V); fl != "" {
		r.Flags = append(r.Flags, fl)
	}
	for _, x := range []float64{r.Energy, r.Tail, r.Maskell, r.Lift, r.NetCirculation, r.NetSource} {
		if !finite(x) {
			return CrossflowResult{}, fmt.Errorf("%w: wake plane %q: a crossflow integral is %g", ErrOverflow, spec, x)
		}
	}
	return r, nil
}

// finish sets the span, efficiency, coefficients and flags.
func (r *CrossflowResult) finish(opt *WakeOptions) {
	var peak float64
	for _, p := range r.Loading {
		peak = math.Max(peak, math.Abs(p.Gamma))
	}
	if math.Abs(r.NetCirculation) > 0.01*peak && peak > 0 {
		r.Flags = append(r.Flags, fmt.Sprintf("net crossflow circulation %.3g m²/s (%.1f %% of the peak loading): vorticity leaves the plane edge; the energy form and its dipole tail are unreliable",
			r.NetCirculation, 100*math.Abs(r.NetCirculation)/peak))
	}
	r.Span = opt.Span
	if r.Span == 0 && peak > 0 {
		r.Span, r.SpanEstimated = loadingExtent(r.Loading, 0.01*peak), true
	}
	uInf := norm(opt.Free.V)
	q := 0.5 * opt.Free.Rho * uInf * uInf
	if d := math.Pi * q * r.Span * r.Span * r.Maskell; d > 0 && finite(d) {
		r.SpanEfficiency = r.Lift * r.Lift / d
	}
	if s := opt.RefArea; s > 0 && q > 0 {
		r.CL, r.CDi, r.AR, r.HasCoefficients = r.Lift/(q*s), r.Maskell/(q*s), r.Span*r.Span/s, true
	}
}

// loadingExtent returns the distance between the outermost crossings of
// |Γ| = t, interpolated linearly between columns.
func loadingExtent(l []LoadingPoint, t float64) float64 {
	first, last := -1, -1
	for i, p := range l {
		if math.Abs(p.Gamma) >= t {
			if first < 0 {
				first = i
			}
			last = i
		}
	}
	if first < 0 {
		return 0
	}
	cross := func(a, b LoadingPoint) float64 { // where |Γ| reaches t between a (below) and b
		ga, gb := math.Abs(a.Gamma), math.Abs(b.Gamma)
		return a.S1 + (t-ga)/(gb-ga)*(b.S1-a.S1)
	}
	lo, hi := l[first].S1, l[last].S1
	if first > 0 {
		lo = cross(l[first-1], l[first])
	}
	if last < len(l)-1 {
		hi = cross(l[last+1], l[last])
	}
	return hi - lo
}

// rectExteriorR4 returns ∬ r⁻⁴ dS over the plane outside the rectangle
// |s1| ≤ a, |s2| ≤ b:
//
//	2[(θc/2 + sin2θc/4)/a² + ((π/2 − θc)/2 + sin2θc/4)/b²],  θc = atan(b/a),
//
// from ∫ from r_edge(θ) to ∞ of r⁻³ dr = 1/(2 r_edge²) in polar coordinates
// (derived here; for a disc of radius R the same integral is π/R²).
func rectExteriorR4(a, b float64) float64 {
	tc := math.Atan2(b, a)
	s := math.Sin(2*tc) / 4
	return 2 * ((tc/2+s)/(a*a) + ((math.Pi/2-tc)/2+s)/(b*b))
}

// edgeValues returns the free-space values on the frame of pg of
// ψ = −(1/2π)∬ξ ln r dS and φ = (1/2π)∬σ ln r dS, summed directly over
// the interior corners (each frame node on its own, so the result does not
// depend on the workers).
func edgeValues(pg poissonGrid, xi, sig []float64, corner func(i, j int) (float64, float64), workers int) (psi, phi []float64, err error) {
	nn := (pg.m1 + 2) * (pg.m2 + 2)
	psi, phi = make([]float64, nn), make([]float64, nn)
	var frame [][2]int
	for j := 0; j < pg.m2+2; j++ {
		for i := 0; i < pg.m1+2; i++ {
			if i == 0 || j == 0 || i == pg.m1+1 || j == pg.m2+1 {
				frame = append(frame, [2]int{i, j})
			}
		}
	}
	type src struct{ a, b, xi, sig float64 }
	var srcs []src
	da := pg.h1 * pg.h2 / (2 * math.Pi)
	for j := 1; j <= pg.m2; j++ {
		for i := 1; i <= pg.m1; i++ {
			k := pg.idx(i, j)
			if xi[k] != 0 || sig[k] != 0 {
				a, b := corner(i, j)
				srcs = append(srcs, src{a, b, xi[k] * da, sig[k] * da})
			}
		}
	}
	const chunk = 64
	err = forChunks((len(frame)+chunk-1)/chunk, workers, func(c int) error {
		for _, f := range frame[c*chunk : min((c+1)*chunk, len(frame))] {
			a, b := corner(f[0], f[1])
			var sp, sf field.CompensatedSum
			for _, s := range srcs {
				lr := 0.5 * math.Log(sq(a-s.a)+sq(b-s.b))
				sp.Add(-s.xi * lr)
				sf.Add(s.sig * lr)
			}
			k := pg.idx(f[0], f[1])
			psi[k], phi[k] = sp.Value(), sf.Value()
		}
		return nil
	})
	return psi, phi, err
}

// AddCrossflow appends the crossflow figures to the drags of r (induced
// drag by the energy form, with its dipole tail, and by Maskell's form;
// the decomposition total Betz profile + Maskell induced, to set beside
// the exact momentum drag, from which it differs by the blockage term and
// the crossflow energy outside the plane's vorticity) and refreshes the
// coefficients.
func (r *WakeResult) AddCrossflow(cf CrossflowResult, opt *Options) {
	r.Crossflow = &cf
	betz, _ := r.Drag(WakeBetz)
	r.Drags = append(r.Drags,
		WakeDrag{Key: WakeInducedKE, Name: "induced drag, crossflow energy (plane grid)", Formula: "½ρ∞∬(v²+w²)dS", Value: cf.Energy},
		WakeDrag{Key: WakeInducedTail, Name: "induced drag, energy + dipole tail", Formula: "½ρ∞∬(v²+w²)dS + ½ρ∞|μ|²∬out r⁻⁴dS", Value: cf.EnergyTail},
		WakeDrag{Key: WakeMaskell, Name: "induced drag, Maskell", Formula: "½ρ∞∬ψξ dS − ½ρ∞∬φσ dS", Value: cf.Maskell},
		WakeDrag{Key: WakeSplitTotal, Name: "profile + induced (Betz + Maskell)", Formula: "Dp(Betz) + Di(Maskell)", Value: betz + cf.Maskell},
	)
	r.Flags = append(r.Flags, cf.Flags...)
	r.applyCoefficients(opt, r.Dim)
}

// tiltFlag returns a warning when the plane normal n is more than 2.6°
// (cos > 0.999) away from the stream v, else "".
func tiltFlag(n, v Vec3) string {
	c := dot(n, v) / (norm(n) * norm(v))
	if c >= 0.999 {
		return ""
	}
	return fmt.Sprintf("the plane normal is %.1f° away from the freestream: the wake-plane formulas assume a plane normal to V∞ (give origin= and normal= along the stream)",
		math.Acos(math.Max(-1, math.Min(1, c)))*180/math.Pi)
}
