package integrate

import (
	"fmt"
	"math"

	"farforce/field"
	"farforce/surface"
)

// WakeOptions controls Wake and Crossflow.
type WakeOptions struct {
	// Options gives the freestream (V∞, ρ∞ > 0, p∞), the up axis, the
	// reference area (coefficients, aspect ratio) and the workers.
	Options
	// Gamma > 1 is the ratio of specific heats of a perfect gas: it turns
	// on the compressible Jones formula and the entropy drag, which need
	// absolute pressures (p∞ = Free.P > 0). Zero: incompressible only.
	Gamma float64
	// Span (m) is the wing span b for the span efficiency; zero means
	// estimate it from the extent of the loading Γ(y).
	Span float64
	// WakeVorticity is the fraction of the largest vorticity magnitude on
	// the plane above which a point counts as inside the viscous wake for
	// the entropy flag (0: 1e-3). Points with μ_t > μ also count.
	WakeVorticity float64
}

// WakeDrag is one drag figure of a wake plane with the name of its
// formula. Value is in N (N/m in 2D); Coefficient is Value/(q∞ S_ref) when
// HasCoefficient.
type WakeDrag struct {
	Key            string  `json:"key"`
	Name           string  `json:"name"`
	Formula        string  `json:"formula"`
	Value          float64 `json:"value"`
	Coefficient    float64 `json:"coefficient"`
	HasCoefficient bool    `json:"has_coefficient"`
}

// WakeResult is the outcome of Wake for one plane.
type WakeResult struct {
	Spec   string  `json:"spec"`
	Dim    int     `json:"dim"`
	Area   float64 `json:"area"`
	Points int     `json:"points"`
	// Drags lists the drag figures of the plane (see Wake).
	Drags []WakeDrag `json:"drags"`
	// Momentum is the closed-surface style integration of the plane
	// (Forces on the open cut); its drag is the exact wake-plane drag.
	Momentum Result `json:"momentum"`
	// BetzClamped and JonesClamped are the areas (lengths in 2D) where
	// u*² < 0 or the Jones tube cannot reach p∞ (integrands set to 0).
	BetzClamped  float64 `json:"betz_clamped_area"`
	JonesClamped float64 `json:"jones_clamped_area"`
	// EntropyAway is the entropy drag from points with Δs > 0 outside the
	// viscous wake (by the vorticity / eddy-viscosity sensor), and
	// EntropyNegative that from points with Δs < 0; both hint at entropy
	// made by numerical dissipation (spurious drag). Zero without Gamma.
	EntropyAway     float64 `json:"entropy_away"`
	EntropyNegative float64 `json:"entropy_negative"`
	// Flags are plain-language warnings.
	Flags []string `json:"flags"`
	// Crossflow is the crossflow analysis on the plane grid, when made.
	Crossflow *CrossflowResult `json:"crossflow,omitempty"`
}

// Drag returns the figure with the given key and whether it exists.
func (r *WakeResult) Drag(key string) (float64, bool) {
	for _, d := range r.Drags {
		if d.Key == key {
			return d.Value, true
		}
	}
	return 0, false
}

// Wake keys and formula names.
const (
	WakeMomentum    = "momentum"
	WakeDeficit     = "deficit"
	WakeLinear      = "linear_deficit"
	WakeBetz        = "betz_profile"
	WakeCrossKE     = "crossflow_energy"
	WakeBlockage    = "betz_blockage"
	WakeJones       = "jones"
	WakeJonesComp   = "jones_compressible"
	WakeEntropy     = "entropy"
	WakeInducedKE   = "induced_energy"
	WakeInducedTail = "induced_energy_tail"
	WakeMaskell     = "induced_maskell"
	WakeSplitTotal  = "profile_plus_induced"
)

// Wake integrates the wake-plane drag formulas over the cut c of a plane
// normal to the stream (VALIDATION §2.1–2.6), with u = V·d the velocity
// along the drag axis d = V∞/|V∞|, U∞ = |V∞|, crossflow v² + w² = |V|² − u²,
// incompressible total pressure p₀ = p + ½ρ|V|², p₀∞ = p∞ + ½ρ∞U∞²:
//
//	momentum        exact wake-plane momentum ∬[ρu(U∞−u) + (p∞−p) + τ_xx]dS (Forces on the plane; + Reynolds stress)
//	deficit         far-wake momentum deficit ρ∬u(U∞−u)dS
//	linear_deficit  linearised far wake ρU∞∬(U∞−u)dS
//	betz_profile    Betz profile drag ∬[(p₀∞−p₀) + ½ρ(u*−u)(u*+u−2U∞)]dS, u* = √(u² + 2(p₀∞−p₀)/ρ)
//	crossflow_energy ½ρ∬(v²+w²)dS on the cut (the Betz split's induced part)
//	betz_blockage   −½ρ∬(U∞−u*)²dS
//	jones           Jones 2∬√(p₀−p)(√(p₀∞−p∞) − √(p₀−p∞))dS
//	jones_compressible (Gamma set) the exact compressible survey formula
//	entropy         (Gamma set) Oswatitsch (T∞/U∞)∬ρuΔs dS = (p∞/(ρ∞U∞))∬ρu Δs/R dS
//
// ρ is the local density except in p₀∞. The plane should be normal to
// V∞ (the formulas take u along the stream and integrate dS = W); a tilt
// of more than 2.6° is flagged. Errors: Plain or NoConvection set (the
// plane is open: only the deficit flux accounts for the lateral outflow);
// those of Forces; a freestream speed or density of zero; with Gamma, a
// non-positive p∞, or a non-positive p or ρ at a point (*ValueError).
// Deterministic for any number of workers.
func Wake(c *surface.Cut, flow field.FlowEvaluator, opt WakeOptions) (WakeResult, error) {
	if err := opt.checkWake(); err != nil {
		return WakeResult{}, err
	}
	mom, err := Forces(c, flow, opt.Options)
	if err != nil {
		return WakeResult{}, err
	}
	r := WakeResult{Spec: c.Spec, Dim: c.Dim, Area: c.Area, Points: len(c.Points), Momentum: mom}
	s, err := wakeSums(c, flow, &opt)
	if err != nil {
		return WakeResult{}, err
	}
	add := func(key, name, formula string, v float64) {
		r.Drags = append(r.Drags, WakeDrag{Key: key, Name: name, Formula: formula, Value: v})
	}
	add(WakeMomentum, "exact wake-plane momentum", "∬[ρu(U∞−u) + (p∞−p) + τxx]dS", mom.Wind.Drag)
	add(WakeDeficit, "far-wake momentum deficit", "ρ∬u(U∞−u)dS", s[wDeficit].Value())
	add(WakeLinear, "linearised far-wake deficit", "ρU∞∬(U∞−u)dS", s[wLinear].Value())
	add(WakeBetz, "Betz profile drag", "∬[(p0∞−p0) + ½ρ(u*−u)(u*+u−2U∞)]dS", s[wBetz].Value())
	add(WakeCrossKE, "crossflow kinetic energy (cut)", "½ρ∬(v²+w²)dS", s[wCross].Value())
	add(WakeBlockage, "Betz blockage term", "−½ρ∬(U∞−u*)²dS", s[wBlock].Value())
	add(WakeJones, "Jones (incompressible)", "2∬√(p0−p)(√(p0∞−p∞)−√(p0−p∞))dS", s[wJones].Value())
	r.BetzClamped, r.JonesClamped = s[wBetzClamp].Value(), s[wJonesClamp].Value()
	if opt.Gamma > 0 {
		add(WakeJonesComp, "Jones (compressible, point by point)", "ρ∞U∞²∬(ρ/ρ∞)(u/U∞)(1−u1/U∞)dS", s[wJonesC].Value())
		add(WakeEntropy, "Oswatitsch entropy drag", "(T∞/U∞)∬ρuΔs dS", s[wEntropy].Value())
		r.EntropyAway, r.EntropyNegative = s[wEntAway].Value(), s[wEntNeg].Value()
		if e := s[wEntropy].Value(); math.Abs(r.EntropyAway) > 0.01*math.Abs(e) && r.EntropyAway > 0 {
			r.Flags = append(r.Flags, fmt.Sprintf("%.3g of the entropy drag (%.1f %%) comes from points outside the viscous wake: entropy made away from the wake (shocks, or numerical dissipation: spurious drag)",
				r.EntropyAway, 100*r.EntropyAway/math.Abs(e)))
		}
		if r.EntropyNegative < 0 {
			r.Flags = append(r.Flags, fmt.Sprintf("entropy below the freestream's gives %.3g of entropy drag: non-physical, a sign of numerical error", r.EntropyNegative))
		}
	}
	if r.BetzClamped > 0 {
		r.Flags = append(r.Flags, fmt.Sprintf("total pressure above the freestream's on %.3g of the plane: Betz's u* is imaginary there (set to 0)", r.BetzClamped))
	}
	if r.JonesClamped > 0 {
		r.Flags = append(r.Flags, fmt.Sprintf("on %.3g of the plane a stream tube cannot expand to p∞ (p0 < p∞ or p0 < p): left out of the Jones integrals", r.JonesClamped))
	}
	if len(c.Points) > 0 {
		if fl := tiltFlag(c.Points[0].N, opt.Free.V); fl != "" {
			r.Flags = append(r.Flags, fl)
		}
	}
	r.applyCoefficients(&opt.Options, c.Dim)
	return r, nil
}

// applyCoefficients fills the coefficients of the drags when a reference
// is given: S_ref in 3D, the reference length in 2D.
func (r *WakeResult) applyCoefficients(opt *Options, dim int) {
	v := opt.Free.V
	q := 0.5 * opt.Free.Rho * dot(v, v)
	sref := opt.RefArea
	if dim == 2 {
		sref = opt.RefLength
	}
	if !(q*sref > 0) || !finite(q*sref) {
		return
	}
	for i := range r.Drags {
		r.Drags[i].Coefficient, r.Drags[i].HasCoefficient = r.Drags[i].Value/(q*sref), true
	}
}

// checkWake validates the options the wake analyses add.
func (o *WakeOptions) checkWake() error {
	if o.Plain || o.NoConvection {
		return fmt.Errorf("%w: the wake-plane formulas need the deficit momentum flux (Plain and NoConvection unset): the plane is open", ErrOption)
	}
	if !(norm(o.Free.V) > 0) || !(o.Free.Rho > 0) {
		return fmt.Errorf("%w: the wake analyses need a freestream speed and density > 0 (got %g m/s, %g kg/m³)", ErrOption, norm(o.Free.V), o.Free.Rho)
	}
	if o.Gamma != 0 && !(o.Gamma > 1 && finite(o.Gamma)) {
		return fmt.Errorf("%w: gamma = %g, want > 1 (or 0 for incompressible analyses only)", ErrOption, o.Gamma)
	}
	if o.Gamma > 0 && !(o.Free.P > 0) {
		return fmt.Errorf("%w: the compressible analyses need the absolute freestream pressure > 0 (got %g Pa)", ErrOption, o.Free.P)
	}
	if !finite(o.Span) || o.Span < 0 {
		return fmt.Errorf("%w: span = %g, want ≥ 0 (0 = estimate)", ErrOption, o.Span)
	}
	if !finite(o.WakeVorticity) || o.WakeVorticity < 0 || o.WakeVorticity >= 1 {
		return fmt.Errorf("%w: wake vorticity fraction = %g, want in [0, 1)", ErrOption, o.WakeVorticity)
	}
	return nil
}

// Layout of the wake sums.
const (
	wDeficit = iota
	wLinear
	wBetz
	wCross
	wBlock
	wJones
	wJonesC
	wEntropy
	wEntAway
	wEntNeg
	wBetzClamp
	wJonesClamp
	nWake
)

type wakeAcc [nWake]field.CompensatedSum

// wakeSums evaluates the flow at every quadrature point of c (in
// parallel, in fixed chunks) and sums the wake integrands in point order.
func wakeSums(c *surface.Cut, flow field.FlowEvaluator, opt *WakeOptions) (wakeAcc, error) {
	n := len(c.Points)
	vort := make([]float64, n) // |ω| per point, for the wake sensor
	turb := make([]bool, n)    // μ_t > μ
	ent := make([]float64, n)  // entropy drag contribution per point
	nChunks := (n + ChunkSize - 1) / ChunkSize
	partial := make([]wakeAcc, nChunks)
	err := forChunks(nChunks, opt.Workers, func(k int) error {
		var st field.FlowState
		var cache field.FlowCache
		for i := k * ChunkSize; i < min((k+1)*ChunkSize, n); i++ {
			q := &c.Points[i]
			evalFlow(flow, q.At, q.X, &st, &cache)
			if name, v, ok := checkState(&st); !ok {
				return &ValueError{Spec: c.Spec, Point: i, X: q.X, Cell: q.At.Ref(), Quantity: name, Value: v}
			}
			g := &st.GradV
			vort[i] = math.Sqrt(sq(g[2][1]-g[1][2]) + sq(g[0][2]-g[2][0]) + sq(g[1][0]-g[0][1]))
			turb[i] = st.MuT > st.Mu && st.MuT > 0
			e, err := wakePoint(&st, q, opt, &partial[k])
			if err != nil {
				return &ValueError{Spec: c.Spec, Point: i, X: q.X, Cell: q.At.Ref(), Quantity: err.Error(), Value: e}
			}
			ent[i] = e
		}
		return nil
	})
	var total wakeAcc
	if err != nil {
		return total, err
	}
	for k := range partial {
		for i := range total {
			total[i].Merge(partial[k][i])
		}
	}
	var vmax float64
	for _, v := range vort {
		vmax = math.Max(vmax, v)
	}
	frac := opt.WakeVorticity
	if frac == 0 {
		frac = 1e-3
	}
	for i, e := range ent {
		switch {
		case e < 0:
			total[wEntNeg].Add(e)
		case e > 0 && !turb[i] && !(vort[i] > frac*vmax):
			total[wEntAway].Add(e)
		}
	}
	for i := range total {
		if v := total[i].Value(); !finite(v) {
			return total, fmt.Errorf("%w: wake plane %q: an integral is %g", ErrOverflow, c.Spec, v)
		}
	}
	return total, nil
}

// wakePoint adds the integrands of one quadrature point to acc and returns
// its entropy drag contribution. A non-nil error names the bad quantity
// (the returned value is then that quantity's value).
func wakePoint(st *field.FlowState, q *surface.QuadPoint, opt *WakeOptions, acc *wakeAcc) (float64, error) {
	vinf := opt.Free.V
	uInf := norm(vinf)
	d := scale(vinf, 1/uInf)
	w := q.W
	rho, p := st.Rho, st.P
	u := dot(st.V, d)
	v2 := dot(st.V, st.V)
	cross := math.Max(v2-u*u, 0)
	p0 := p + 0.5*rho*v2
	p0Inf := opt.Free.P + 0.5*opt.Free.Rho*uInf*uInf
	acc[wDeficit].Add(rho * u * (uInf - u) * w)
	acc[wLinear].Add(rho * uInf * (uInf - u) * w)
	acc[wCross].Add(0.5 * rho * cross * w)
	if !(rho > 0) {
		return rho, fmt.Errorf("density")
	}
	if us, ok := BetzVelocity(u, p0, p0Inf, rho); ok {
		acc[wBetz].Add(BetzProfile(u, us, p0, p0Inf, rho, uInf) * w)
		acc[wBlock].Add(-0.5 * rho * sq(uInf-us) * w)
	} else {
		acc[wBetzClamp].Add(w)
	}
	if j, ok := Jones(p0, p, p0Inf, opt.Free.P); ok {
		acc[wJones].Add(j * w)
	} else {
		acc[wJonesClamp].Add(w)
	}
	if opt.Gamma == 0 {
		return 0, nil
	}
	if !(p > 0) {
		return p, fmt.Errorf("pressure (absolute, for the compressible analyses)")
	}
	g := opt.Gamma
	p0c := TotalPressureCompressible(p, rho, v2, g)
	p0cInf := TotalPressureCompressible(opt.Free.P, opt.Free.Rho, uInf*uInf, g)
	if j, ok := JonesCompressible(p0c, p, p0cInf, opt.Free.P, opt.Free.Rho*uInf*uInf, g); ok {
		acc[wJonesC].Add(j * w)
	}
	e := opt.Free.P / (opt.Free.Rho * uInf) * rho * u * EntropyRise(p, rho, opt.Free.P, opt.Free.Rho, g) * w
	acc[wEntropy].Add(e)
	return e, nil
}

func sq(x float64) float64 { return x * x }
