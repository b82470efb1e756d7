package integrate

import (
	"fmt"
	"math"

	"farforce/field"
	"farforce/surface"
)

// ChunkSize is the number of quadrature points summed together before
// chunk sums are combined; it fixes the summation order independently of
// the number of workers.
const ChunkSize = 1024

// Layout of the running sums of one chunk.
const (
	sMom  = 0  // force terms: 4 × 3
	sPrs  = 3  //
	sVis  = 6  //
	sRey  = 9  //
	sMom2 = 12 // moment terms: 4 × 3
	sMass = 24 // ∮ρV·n
	sAbs  = 25 // ∮ρ|V·n|
	nSums = 26
)

type sums [nSums]field.CompensatedSum

// Forces integrates the momentum balance over the cut c with the flow
// given by flow and returns forces, their parts, the moment about
// opt.MomentCenter, wind-axis components, coefficients and mass closure
// (formulas in the package documentation). The forces are those of the
// fluid on the enclosed body; the normals of c must point out of the
// control volume, away from the body.
//
// flow must be safe for concurrent use: it is called from opt.Workers
// goroutines. The result is bit-identical for any number of workers.
//
// Errors: a nil, empty or non-finite cut or one of dimension other than 2
// or 3 (ErrCut); a nil flow or invalid options (ErrOption); a NaN or
// infinite flow value at a quadrature point (*ValueError naming the point,
// its position and cell; the lowest such point index is reported); finite
// values so large that an integral overflows (ErrOverflow).
func Forces(c *surface.Cut, flow field.FlowEvaluator, opt Options) (Result, error) {
	if c == nil {
		return Result{}, fmt.Errorf("%w: nil cut", ErrCut)
	}
	if flow == nil {
		return Result{}, fmt.Errorf("%w: nil flow evaluator", ErrOption)
	}
	if c.Dim != 2 && c.Dim != 3 {
		return Result{}, fmt.Errorf("%w: surface %q has dimension %d, want 2 or 3", ErrCut, c.Spec, c.Dim)
	}
	if len(c.Points) == 0 {
		return Result{}, fmt.Errorf("%w: surface %q has no quadrature points", ErrCut, c.Spec)
	}
	if err := opt.check(); err != nil {
		return Result{}, err
	}
	axes, hasWind, err := windAxes(opt.Free.V, opt.Up, c.Dim)
	if err != nil {
		return Result{}, err
	}
	total, err := integrate(c, flow, &opt)
	if err != nil {
		return Result{}, err
	}
	for i := range total {
		if v := total[i].Value(); !finite(v) {
			return Result{}, fmt.Errorf("%w: surface %q: an integral is %g", ErrOverflow, c.Spec, v)
		}
	}

	r := Result{Spec: c.Spec, Dim: c.Dim, MomentCenter: opt.MomentCenter}
	switch {
	case opt.NoConvection:
		r.Form = "no-convection"
	case opt.Plain:
		r.Form = "plain"
	default:
		r.Form = "deficit"
	}
	for k := 0; k < 3; k++ {
		r.Terms.Momentum[k] = total[sMom+k].Value()
		r.Terms.Pressure[k] = total[sPrs+k].Value()
		r.Terms.Viscous[k] = total[sVis+k].Value()
		r.Terms.Reynolds[k] = total[sRey+k].Value()
		r.MomentTerms.Momentum[k] = total[sMom2+sMom+k].Value()
		r.MomentTerms.Pressure[k] = total[sMom2+sPrs+k].Value()
		r.MomentTerms.Viscous[k] = total[sMom2+sVis+k].Value()
		r.MomentTerms.Reynolds[k] = total[sMom2+sRey+k].Value()
	}
	r.Force = r.Terms.Sum()
	r.Moment = r.MomentTerms.Sum()
	r.MassFlux = total[sMass].Value()
	r.MassAbs = total[sAbs].Value()
	if r.MassAbs > 0 {
		r.MassImbalance = r.MassFlux / r.MassAbs
	}
	r.Facets, r.Pieces, r.Points = c.Facets, len(c.Pieces), len(c.Points)
	r.Area, r.ExactArea, r.Closure = c.Area, c.ExactArea, c.Closure
	if c.ExactArea != 0 {
		r.AreaError = (c.Area - c.ExactArea) / c.ExactArea
	}
	r.HasWind, r.Axes = hasWind, axes
	applyWind(&r, &opt)
	return r, nil
}

// integrate sums the integrands over all quadrature points of c in fixed
// chunks, in parallel, and combines the chunk sums in chunk order.
func integrate(c *surface.Cut, flow field.FlowEvaluator, opt *Options) (sums, error) {
	n := len(c.Points)
	nChunks := (n + ChunkSize - 1) / ChunkSize
	partial := make([]sums, nChunks)
	err := forChunks(nChunks, opt.Workers, func(k int) error {
		var st field.FlowState
		lo, hi := k*ChunkSize, min((k+1)*ChunkSize, n)
		return sumChunk(c, flow, opt, lo, hi, &st, &partial[k])
	})
	var total sums
	if err != nil {
		return total, err
	}
	for k := range partial {
		for i := range total {
			total[i].Merge(partial[k][i])
		}
	}
	return total, nil
}

// sumChunk adds the integrands of points lo..hi-1 to acc.
func sumChunk(c *surface.Cut, flow field.FlowEvaluator, opt *Options, lo, hi int, st *field.FlowState, acc *sums) error {
	vinf := opt.Free.V
	if opt.Plain {
		vinf = Vec3{}
	}
	var cache field.FlowCache
	// run holds plain sums over the current run of consecutive points in
	// one cell (a piece's quadrature points), added to acc when the run
	// ends: one compensated addition per run instead of per point.
	var run [nSums]float64
	flush := func() {
		for k, v := range run {
			acc[k].Add(v)
		}
		run = [nSums]float64{}
	}
	for i := lo; i < hi; i++ {
		q := &c.Points[i]
		if i > lo && q.At.Ref() != c.Points[i-1].At.Ref() {
			flush()
		}
		// Weights are not required to be positive: clipping can leave
		// sliver pieces whose rule has weights of rounding size and
		// either sign.
		if !finite(q.W) || !finiteVec(q.X) || !finiteVec(q.N) {
			return fmt.Errorf("%w: surface %q: quadrature point %d has a non-finite position, normal or weight (%g)", ErrCut, c.Spec, i, q.W)
		}
		evalFlow(flow, q.At, q.X, st, &cache)
		if name, v, ok := checkState(st); !ok {
			return &ValueError{Spec: c.Spec, Point: i, X: q.X, Cell: q.At.Ref(), Quantity: name, Value: v}
		}
		r := sub(q.X, opt.MomentCenter)
		if c.Dim == 2 {
			r[2] = 0
		}
		w, n := q.W, q.N
		vn := dot(st.V, n)
		run[sMass] += st.Rho * vn * w
		run[sAbs] += st.Rho * math.Abs(vn) * w

		var mom, momPlain, prs, vis, rey Vec3
		if !opt.NoConvection {
			f := -st.Rho * vn * w
			for k := 0; k < 3; k++ {
				mom[k] = f * (st.V[k] - vinf[k])
				momPlain[k] = f * st.V[k]
			}
		}
		dp := -(st.P - opt.Free.P) * w
		mu := st.Mu + st.MuT
		g := &st.GradV
		div := g[0][0] + g[1][1] + g[2][2]
		for k := 0; k < 3; k++ {
			prs[k] = dp * n[k]
			var t float64
			for j := 0; j < 3; j++ {
				t += (g[k][j] + g[j][k]) * n[j]
			}
			vis[k] = mu * (t - 2.0/3.0*div*n[k]) * w
			if st.HasR {
				rey[k] = -(st.R[k][0]*n[0] + st.R[k][1]*n[1] + st.R[k][2]*n[2]) * w
			}
		}
		for k := 0; k < 3; k++ {
			run[sMom+k] += mom[k]
			run[sPrs+k] += prs[k]
			run[sVis+k] += vis[k]
			run[sRey+k] += rey[k]
		}
		addMoment(&run, sMom2+sMom, r, &momPlain)
		addMoment(&run, sMom2+sPrs, r, &prs)
		addMoment(&run, sMom2+sVis, r, &vis)
		if st.HasR {
			addMoment(&run, sMom2+sRey, r, &rey)
		}
	}
	flush()
	return nil
}

// checkState reports the first non-finite quantity of s. The fast path
// sums every value once: the sum is finite unless some value is NaN or
// infinite (or the sum overflows, which the detailed pass then clears).
func checkState(s *field.FlowState) (string, float64, bool) {
	sum := s.Rho + s.P + s.Mu + s.MuT
	for i := 0; i < 3; i++ {
		sum += s.V[i] + s.GradV[i][0] + s.GradV[i][1] + s.GradV[i][2]
		if s.HasR {
			sum += s.R[i][0] + s.R[i][1] + s.R[i][2]
		}
	}
	if finite(sum) {
		return "", 0, true
	}
	for _, q := range [...]struct {
		name string
		v    float64
	}{{"density", s.Rho}, {"pressure", s.P}, {"viscosity", s.Mu}, {"eddy viscosity", s.MuT}} {
		if !finite(q.v) {
			return q.name, q.v, false
		}
	}
	if !finiteVec(s.V) {
		return "velocity", firstBad(s.V[:]), false
	}
	for i := range s.GradV {
		if !finiteVec(s.GradV[i]) {
			return "velocity gradient", firstBad(s.GradV[i][:]), false
		}
		if s.HasR && !finiteVec(s.R[i]) {
			return "Reynolds stress", firstBad(s.R[i][:]), false
		}
	}
	return "", 0, true
}

func firstBad(v []float64) float64 {
	for _, x := range v {
		if !finite(x) {
			return x
		}
	}
	return 0
}

func finiteVec(v Vec3) bool { return finite(v[0]) && finite(v[1]) && finite(v[2]) }

func dot(a, b Vec3) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }

func sub(a, b Vec3) Vec3 { return Vec3{a[0] - b[0], a[1] - b[1], a[2] - b[2]} }

func cross(a, b Vec3) Vec3 {
	return Vec3{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}

// evalFlow evaluates flow at x (located at at), through cache when the
// evaluator can reuse per-cell work (consecutive points of one piece share
// their cell); the result is the same either way.
func evalFlow(flow field.FlowEvaluator, at field.Location, x [3]float64, st *field.FlowState, cache *field.FlowCache) {
	if cf, ok := flow.(field.CachedFlowEvaluator); ok {
		cf.EvalFlowCached(at, x, st, cache)
		return
	}
	flow.EvalFlow(at, x, st)
}

// addMoment adds r × f to run[at:at+3].
func addMoment(run *[nSums]float64, at int, r Vec3, f *Vec3) {
	run[at] += r[1]*f[2] - r[2]*f[1]
	run[at+1] += r[2]*f[0] - r[0]*f[2]
	run[at+2] += r[0]*f[1] - r[1]*f[0]
}
