package integrate

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"farforce/field"
)

// SweepMember is one member of a control-surface size sweep: the surface
// size Scale (the factor the base surface was scaled by, or any length that
// grows with it), its drag and lift (coefficients or forces; the same kind
// for every member), its mass imbalance (Result.MassImbalance, a fraction)
// and its net mass flux (Result.MassFlux, optional: zero for every member
// means not given).
type SweepMember struct {
	Scale         float64 `json:"scale"`
	Drag          float64 `json:"drag"`
	Lift          float64 `json:"lift"`
	MassImbalance float64 `json:"mass_imbalance"`
	MassFlux      float64 `json:"mass_flux"`
}

// VerdictOptions sets the agreement band of a sweep verdict. Two values
// agree when they differ by at most the band
//
//	B = max(AbsTol, RelTol·S),  S = median over members of √(Drag² + Lift²)
//
// used for drag and lift alike (a lift tolerance relative to the lift alone
// would be meaningless for a non-lifting body). Zero fields take the
// defaults: RelTol 0.005 (0.5 % of the force) and AbsTol 1e-4 (one drag
// count when Drag and Lift are coefficients; set AbsTol in newtons when they
// are forces). B is never below 1e-12·S, so values equal to rounding agree.
//
// DriftTol is the change of drag across the sweep (slope × scale range,
// units of Drag) above which a trend that stands out of the scatter is
// flagged as a drift; zero means B/4: a systematic change of a quarter of
// the band already moves the plateau mean depending on which members it
// holds, so it is reported even when every member lies inside the band.
type VerdictOptions struct {
	RelTol   float64
	AbsTol   float64
	DriftTol float64
}

// Default agreement band of VerdictOptions.
const (
	DefaultSweepRelTol = 0.005
	DefaultSweepAbsTol = 1e-4
)

// Plateau is the longest run of members, consecutive in scale, whose drag
// and lift all agree within the band (max − min ≤ B for each). First and
// Last index the members slice given to Verdict (smallest and largest scale
// of the run), Members counts the run. Drag and Lift are the means over the
// run and DragSpread, LiftSpread the half-ranges (max − min)/2: the
// control-surface uncertainty of the plateau value.
type Plateau struct {
	First      int     `json:"first"`
	Last       int     `json:"last"`
	FirstScale float64 `json:"first_scale"`
	LastScale  float64 `json:"last_scale"`
	Members    int     `json:"members"`
	Drag       float64 `json:"drag"`
	DragSpread float64 `json:"drag_spread"`
	Lift       float64 `json:"lift"`
	LiftSpread float64 `json:"lift_spread"`
}

// Drift describes the trend of drag and lift with surface size over all
// members, from a least-squares line value = a + slope·scale:
//
//   - DragSlope, LiftSlope: the slopes (units of Drag per unit of Scale);
//     DragSlopeErr the standard error of DragSlope;
//   - Change = DragSlope·(largest − smallest scale): the drift across the sweep;
//   - Scatter, LiftScatter: the residual standard deviation about the line,
//     √(Σ r²/(n − 2)), i.e. the noise left once the trend is removed;
//   - Monotone: drag strictly increases (or decreases) from member to member
//     in scale order;
//   - Flagged: a drift worth reporting: |Change| exceeds the drift
//     tolerance (VerdictOptions.DriftTol) and the slope exceeds three
//     standard errors (it stands out of the scatter);
//   - Settling: a flagged drift that fades with size (at least 4 members;
//     the slope over the larger half of the members has the sign of, and
//     less than half the magnitude of, the slope over the smaller half):
//     the signature of surfaces too close to the body rather than of
//     spurious drag, which grows steadily.
type Drift struct {
	DragSlope    float64 `json:"drag_slope"`
	DragSlopeErr float64 `json:"drag_slope_err"`
	LiftSlope    float64 `json:"lift_slope"`
	Change       float64 `json:"change"`
	Scatter      float64 `json:"scatter"`
	LiftScatter  float64 `json:"lift_scatter"`
	Monotone     bool    `json:"monotone"`
	Flagged      bool    `json:"flagged"`
	Settling     bool    `json:"settling"`
}

// SweepVerdict is the domain-independence verdict of a sweep (VALIDATION.md
// §5.3, §5.5): the plateau and its spread as the control-surface
// uncertainty, the drift with size separately from the scatter, the trend
// of the mass imbalance with size (MassTrend, per unit scale, and the
// correlation of drag with mass imbalance, MassDragCorrelation, 0 when
// either is constant), the band used, and plain-words notes.
type SweepVerdict struct {
	Members             int      `json:"members"`
	Band                float64  `json:"band"`
	DriftTol            float64  `json:"drift_tol"`
	Plateau             Plateau  `json:"plateau"`
	Drift               Drift    `json:"drift"`
	MassTrend           float64  `json:"mass_trend"`
	MassDragCorrelation float64  `json:"mass_drag_correlation"`
	Notes               []string `json:"notes"`
}

// ErrSweep is wrapped by errors about an unusable sweep (too few members,
// non-finite values, repeated sizes, bad options).
var ErrSweep = errors.New("unusable sweep")

// Verdict judges a size sweep: see SweepVerdict, Plateau and Drift for
// the definitions and VerdictOptions for the band. Members may come in any
// order; they are taken in increasing Scale. Ties between equally long
// plateaus go to the smaller drag spread, then to the smaller scales.
//
// Errors (wrapping ErrSweep): fewer than 3 members, a non-finite value
// (naming the member), two members of the same scale, negative or
// non-finite options. members is not modified.
func Verdict(members []SweepMember, opt VerdictOptions) (SweepVerdict, error) {
	var v SweepVerdict
	n := len(members)
	if n < 3 {
		return v, fmt.Errorf("%w: %d members, need at least 3 to tell a plateau from a drift", ErrSweep, n)
	}
	for _, x := range []float64{opt.RelTol, opt.AbsTol, opt.DriftTol} {
		if !finite(x) || x < 0 {
			return v, fmt.Errorf("%w: tolerances rel %g, abs %g, drift %g: want finite and ≥ 0", ErrSweep, opt.RelTol, opt.AbsTol, opt.DriftTol)
		}
	}
	if opt.RelTol == 0 {
		opt.RelTol = DefaultSweepRelTol
	}
	if opt.AbsTol == 0 {
		opt.AbsTol = DefaultSweepAbsTol
	}
	for i, m := range members {
		if !finite(m.Scale) || !finite(m.Drag) || !finite(m.Lift) || !finite(m.MassImbalance) || !finite(m.MassFlux) {
			return v, fmt.Errorf("%w: member %d (scale %g): drag %g, lift %g, mass imbalance %g, mass flux %g: want finite values",
				ErrSweep, i, m.Scale, m.Drag, m.Lift, m.MassImbalance, m.MassFlux)
		}
	}
	order := make([]int, n)
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return members[order[a]].Scale < members[order[b]].Scale })
	s, d, l, mi, mf := make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	mag := make([]float64, n)
	hasFlux := false
	for k, i := range order {
		s[k], d[k], l[k], mi[k], mf[k] = members[i].Scale, members[i].Drag, members[i].Lift, members[i].MassImbalance, members[i].MassFlux
		hasFlux = hasFlux || mf[k] != 0
		mag[k] = math.Hypot(d[k], l[k])
		if k > 0 && s[k] == s[k-1] {
			return v, fmt.Errorf("%w: members %d and %d have the same scale %g", ErrSweep, order[k-1], i, s[k])
		}
	}
	sort.Float64s(mag)
	med := mag[n/2]
	if n%2 == 0 {
		med = 0.5 * (mag[n/2-1] + mag[n/2])
	}
	v.Members = n
	v.Band = math.Max(math.Max(opt.AbsTol, opt.RelTol*med), 1e-12*med)

	v.Plateau = plateau(s, d, l, order, v.Band)
	if opt.DriftTol == 0 {
		opt.DriftTol = v.Band / 4
	}
	v.DriftTol = opt.DriftTol
	v.Drift = drift(s, d, l, opt.DriftTol)
	v.MassTrend, _, _ = lineFit(s, mi)
	if hasFlux {
		v.MassDragCorrelation = correlation(d, mf)
	} else {
		v.MassDragCorrelation = correlation(d, mi)
	}
	v.Notes = verdictNotes(&v, s)
	return v, nil
}

// plateau finds the longest run of consecutive members (in scale order)
// whose drag and lift ranges are within band.
func plateau(s, d, l []float64, order []int, band float64) Plateau {
	n := len(s)
	bi, bj, bspread := 0, 0, math.Inf(1)
	for i := 0; i < n; i++ {
		dlo, dhi, llo, lhi := d[i], d[i], l[i], l[i]
		for j := i; j < n; j++ {
			dlo, dhi = math.Min(dlo, d[j]), math.Max(dhi, d[j])
			llo, lhi = math.Min(llo, l[j]), math.Max(lhi, l[j])
			if dhi-dlo > band || lhi-llo > band {
				break
			}
			long, best := j-i, bj-bi
			if long > best || (long == best && dhi-dlo < bspread) {
				bi, bj, bspread = i, j, dhi-dlo
			}
		}
	}
	p := Plateau{First: order[bi], Last: order[bj], FirstScale: s[bi], LastScale: s[bj], Members: bj - bi + 1}
	p.Drag, p.DragSpread = meanHalfRange(d[bi : bj+1])
	p.Lift, p.LiftSpread = meanHalfRange(l[bi : bj+1])
	return p
}

func meanHalfRange(x []float64) (mean, half float64) {
	var acc field.CompensatedSum
	lo, hi := x[0], x[0]
	for _, v := range x {
		acc.Add(v)
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	return acc.Value() / float64(len(x)), (hi - lo) / 2
}

// drift fits the drag and lift trends (see Drift); tol is the drift
// tolerance.
func drift(s, d, l []float64, tol float64) Drift {
	var dr Drift
	n := len(s)
	dr.DragSlope, dr.DragSlopeErr, dr.Scatter = lineFit(s, d)
	dr.LiftSlope, _, dr.LiftScatter = lineFit(s, l)
	dr.Change = dr.DragSlope * (s[n-1] - s[0])
	up, down := true, true
	for k := 1; k < n; k++ {
		up = up && d[k] > d[k-1]
		down = down && d[k] < d[k-1]
	}
	dr.Monotone = up || down
	dr.Flagged = math.Abs(dr.Change) > tol && math.Abs(dr.DragSlope) > 3*dr.DragSlopeErr
	if dr.Flagged && n >= 4 {
		h := n / 2
		small, _, _ := lineFit(s[:h+1], d[:h+1])
		large, _, _ := lineFit(s[h:], d[h:])
		dr.Settling = small*large > 0 && math.Abs(large) < 0.5*math.Abs(small)
	}
	return dr
}

// lineFit returns the least-squares slope b of y = a + b x, its standard
// error and the residual standard deviation √(Σ r²/(n − 2)) (both 0 when
// n ≤ 2). x must hold at least two distinct values.
func lineFit(x, y []float64) (slope, slopeErr, resid float64) {
	n := float64(len(x))
	var sx, sy field.CompensatedSum
	for i := range x {
		sx.Add(x[i])
		sy.Add(y[i])
	}
	mx, my := sx.Value()/n, sy.Value()/n
	var sxx, sxy field.CompensatedSum
	for i := range x {
		sxx.Add((x[i] - mx) * (x[i] - mx))
		sxy.Add((x[i] - mx) * (y[i] - my))
	}
	slope = sxy.Value() / sxx.Value()
	if len(x) <= 2 {
		return slope, 0, 0
	}
	var ssr field.CompensatedSum
	for i := range x {
		r := y[i] - my - slope*(x[i]-mx)
		ssr.Add(r * r)
	}
	resid = math.Sqrt(ssr.Value() / (n - 2))
	return slope, resid / math.Sqrt(sxx.Value()), resid
}

// correlation returns Pearson's correlation coefficient of x and y, or 0
// when either is constant to rounding (range ≤ 1e-12 of its largest
// magnitude), where the coefficient would only correlate rounding errors.
func correlation(x, y []float64) float64 {
	if flat(x) || flat(y) {
		return 0
	}
	n := float64(len(x))
	var mx, my float64
	for i := range x {
		mx += x[i]
		my += y[i]
	}
	mx, my = mx/n, my/n
	var sxx, syy, sxy float64
	for i := range x {
		sxx += (x[i] - mx) * (x[i] - mx)
		syy += (y[i] - my) * (y[i] - my)
		sxy += (x[i] - mx) * (y[i] - my)
	}
	return sxy / math.Sqrt(sxx*syy)
}

// flat reports whether x is constant to rounding.
func flat(x []float64) bool {
	lo, hi, big := x[0], x[0], 0.0
	for _, v := range x {
		lo, hi, big = math.Min(lo, v), math.Max(hi, v), math.Max(big, math.Abs(v))
	}
	return hi-lo <= 1e-12*big
}

// verdictNotes explains the verdict in plain words (VALIDATION.md §5.3).
func verdictNotes(v *SweepVerdict, s []float64) []string {
	var notes []string
	p, dr := &v.Plateau, &v.Drift
	n := v.Members
	switch {
	case p.Members == n && !dr.Flagged:
		notes = append(notes, fmt.Sprintf("All %d surfaces agree within the band %.3g: the force does not depend on where the control surface is; the plateau spread ±%.3g is the control-surface uncertainty.",
			n, v.Band, p.DragSpread))
	case p.Members == n:
		notes = append(notes, fmt.Sprintf("All %d surfaces agree within the band %.3g, but not by chance: the drag follows a trend (below), so the plateau value %.6g ± %.3g depends on the sizes chosen.",
			n, v.Band, p.Drag, p.DragSpread))
	default:
		notes = append(notes, fmt.Sprintf("The plateau holds %d of %d surfaces (scales %g to %g) within the band %.3g; drag %.6g ± %.3g.",
			p.Members, n, p.FirstScale, p.LastScale, v.Band, p.Drag, p.DragSpread))
		if p.Members < 3 {
			notes = append(notes, "No three consecutive surfaces agree: the force still depends on the surface; do not trust any single member. Try more members, finer cells along the surfaces, or check the solution's convergence.")
		}
		// With a flagged drift the plateau ends are set by the trend, which
		// the drift note explains; the near/far notes would mislead.
		if p.FirstScale > s[0] && !dr.Flagged {
			notes = append(notes, fmt.Sprintf("The surfaces smaller than scale %g disagree with the plateau: surfaces close to the body cut the boundary layer and near wake, where interpolated pressure and velocity gradients are least accurate and viscous terms are large; their values are scatter, not the answer.",
				p.FirstScale))
		}
		if p.LastScale < s[n-1] && !dr.Flagged {
			notes = append(notes, fmt.Sprintf("The surfaces larger than scale %g leave the plateau: they may reach coarse cells, the far wake or the outer boundary, where numerical dissipation and boundary conditions distort the field.",
				p.LastScale))
		}
	}
	if dr.Settling {
		notes = append(notes, fmt.Sprintf("Drag changes with surface size (%.4g across the sweep) but the change fades as the surfaces grow: the smaller surfaces are too close to the body, where the interpolated gradients are least accurate; the larger members are nearer the answer.",
			dr.Change))
	} else if dr.Flagged {
		how := "steadily"
		if dr.Monotone {
			how = "monotonically"
		}
		// The likely cause depends on the sign: dissipation adds drag as
		// larger surfaces take in more of the wake; a loss points at the
		// wake's deficit being smeared or at mass leaving.
		cause := "numerical dissipation in the wake (spurious drag added as the surfaces take in more, coarser cells) or a mass-closure error"
		if dr.DragSlope < 0 {
			cause = "drag lost as the surfaces reach coarser cells farther out, where the wake's momentum deficit is not carried faithfully (numerical dissipation, interpolation of a smeared wake), or a mass-closure error"
		}
		notes = append(notes, fmt.Sprintf("Drag drifts %s with surface size: slope %.4g per unit scale (± %.2g), a change of %.4g across the sweep against a scatter of %.3g. A drift usually means %s; it is not physics.",
			how, dr.DragSlope, dr.DragSlopeErr, dr.Change, dr.Scatter, cause))
		if math.Abs(v.MassDragCorrelation) > 0.9 {
			notes = append(notes, fmt.Sprintf("The mass flux through the surfaces changes with size as well and follows the drag (correlation %.2f; imbalance trend %.3g per unit scale): the drift is most likely a mass error (interpolation, or mass sources in the field); compare the plain and deficit forms.",
				v.MassDragCorrelation, v.MassTrend))
		}
	}
	if !dr.Flagged && dr.Scatter > v.Band/2 {
		notes = append(notes, fmt.Sprintf("No drift stands out, but the members scatter by %.3g about the trend, more than half the band: interpolation noise, largest where surfaces cut the wake at a grazing angle; finer cells there or smoother surfaces reduce it.",
			dr.Scatter))
	}
	return notes
}
