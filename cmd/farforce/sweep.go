package main

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"farforce/integrate"
	"farforce/surface"
)

var sweepCommand = &command{
	name:    "sweep",
	summary: "forces on a family of scaled control surfaces, and whether they agree",
	usage:   "[FLAGS] FILE... --surface SPEC --scales LIST",
	about: `Scales one control surface about its centre by each factor of --scales
and integrates the momentum balance over every member, exactly as 'farforce
forces' does. A far-field force that can be trusted does not depend on where
the surface is; the sweep shows whether it does:

  plateau   the longest run of consecutive members (in size) whose drag and
            lift all agree within the band max(--agree-abs, --agree-rel ×
            force); its mean is the answer and its half-range the
            control-surface uncertainty;
  drift     a steady change of drag with size (slope per unit scale factor),
            reported apart from the scatter: it usually means numerical
            dissipation in the wake or a mass-closure error, while members
            that settle as they grow were too close to the body;
  mass      how the mass imbalance ∮ρV·n / ∮ρ|V·n| changes with size, and
            whether the drag follows it.

LIST is comma-separated factors (1,1.25,1.5,2) or A:B:N for N factors evenly
spaced from A to B. With --wall or --inside (see 'farforce wall') each
member and the plateau are compared with the near-field force: far minus
near in coefficients, drag counts and percent. --plot draws drag and lift
against the scale factor with the plateau band and the near-field value.`,
	examples: []example{
		{"farforce sweep cyl.vtk --surface 'circle center=0.2,0.2 radius=0.1' --scales 0.75:1.75:9 --density 1 --viscosity 1e-3 --freestream-velocity 0.2,0,0 --ref-length 0.1",
			"nine circles of radius 0.075 to 0.175 around a cylinder"},
		{"farforce sweep cyl.vtk --surface 'rect min=0.1,0.1 max=0.3,0.3' --scales 1,1.25,1.5,1.75 --wall cyl_wall.vtk --speed 0.2 --density 1 --viscosity 1e-3 --ref-length 0.1 --plot sweep.svg",
			"squares, compared with the wall file's near field, with a plot"},
		{"farforce sweep wing.vtk --surface 'box min=-1,-2,-1 max=3,2,1' --scales 1:3:6 --speed 50 --alpha 2 --ref-area 4 --json",
			"3D boxes, machine-readable"},
	},
	newImpl: func() commandImpl { return &sweepImpl{} },
}

// sweepImpl holds the flags of sweep.
type sweepImpl struct {
	fs       *pflag.FlagSet
	surface  string
	scales   string
	agreeRel float64
	agreeAbs float64
	flow     flowFlags
	near     nearFlags
	json     bool
	csv      bool
	plot     string
}

func (c *sweepImpl) define(fs *pflag.FlagSet) {
	c.fs = fs
	fs.StringVar(&c.surface, "surface", "", "the control surface `SPEC` to scale (see 'farforce forces --help')")
	fs.StringVar(&c.scales, "scales", "", "scale factors `LIST`: 1,1.25,1.5 or A:B:N (N factors from A to B)")
	fs.Float64Var(&c.agreeRel, "agree-rel", integrate.DefaultSweepRelTol, "members agree when within this `FRACTION` of the force")
	fs.Float64Var(&c.agreeAbs, "agree-abs", integrate.DefaultSweepAbsTol, "... or within this absolute `BAND` (coefficient units; force units without coefficients, where only the relative band applies unless this is given)")
	c.flow.define(fs)
	c.near.define(fs)
	fs.BoolVar(&c.json, "json", false, "print the report as JSON (schema "+sweepSchema+")")
	fs.BoolVar(&c.csv, "csv", false, "print one CSV row per member")
	fs.StringVar(&c.plot, "plot", "", "draw drag and lift against size to `FILE` (.svg, or .png without text labels)")
}

func (c *sweepImpl) run(e *env, args []string) error {
	const cmd = "farforce sweep"
	if len(args) == 0 {
		return usageErr(cmd, "sweep: no input file given")
	}
	if c.surface == "" || c.scales == "" {
		return usageErr(cmd, "sweep: give --surface SPEC and --scales LIST")
	}
	if c.json && c.csv {
		return usageErr(cmd, "sweep: --json and --csv exclude each other")
	}
	scales, err := parseScales(c.scales)
	if err != nil {
		return usageErr(cmd, "--scales: %v", err)
	}
	if err := checkPlotName(c.plot); err != nil {
		return usageErr(cmd, "%v", err)
	}
	for _, t := range []struct {
		name string
		v    float64
	}{{"agree-rel", c.agreeRel}, {"agree-abs", c.agreeAbs}} {
		if err := checkNumber(t.name, t.v, false); err != nil {
			return usageErr(cmd, "%v", err)
		}
	}
	if err := c.flow.check(c.fs); err != nil {
		return usageErr(cmd, "%v", err)
	}
	if err := c.near.check(); err != nil {
		return usageErr(cmd, "%v", err)
	}
	base, err := parseShape(cmd, c.surface)
	if err != nil {
		return err
	}
	prog := newProgress(e)
	p, err := loadPrepared(prog, c.fs, &c.flow, args)
	if err != nil {
		return err
	}
	var near *nearReport
	if c.near.active(p) {
		prog.step("near field")
		if near, err = c.near.compute(p); err != nil {
			return err
		}
		prog.done()
	}
	spec := sweepSpec{Base: base, Scales: scales, Verdict: integrate.VerdictOptions{RelTol: c.agreeRel}}
	if c.fs.Changed("agree-abs") {
		spec.Verdict.AbsTol = c.agreeAbs
	}
	sw, err := runSweep(prog, p, spec, near)
	if err != nil {
		return err
	}
	rep := &sweepReport{Schema: sweepSchema, Setup: p.setup, Near: near, sweepResult: sw, Notice: notice}
	if c.plot != "" {
		if err := writePlot(c.plot, sweepChart(sw, near, p.setup.Dimension)); err != nil {
			return err
		}
	}
	return writeReport(e, rep, c.json, c.csv,
		func(w io.Writer) error { return writeSweepCSV(w, rep) },
		func(w io.Writer) {
			writeSweepText(w, rep)
			if c.plot != "" {
				fmt.Fprintf(w, "Plot written to %s\n", c.plot)
			}
		})
}

// maxScales bounds the member count of a sweep.
const maxScales = 1000

// parseScales reads a scale list: comma-separated positive factors, or
// A:B:N for N ≥ 2 factors evenly spaced from A to B. Factors must be
// distinct.
func parseScales(s string) ([]float64, error) {
	num := func(t string) (float64, error) {
		x, err := strconv.ParseFloat(strings.TrimSpace(t), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) || x <= 0 {
			return 0, fmt.Errorf("%q: %q is not a positive number", s, t)
		}
		return x, nil
	}
	var out []float64
	if parts := strings.Split(s, ":"); len(parts) > 1 {
		if len(parts) != 3 {
			return nil, fmt.Errorf("%q: want A:B:N", s)
		}
		a, err := num(parts[0])
		if err != nil {
			return nil, err
		}
		b, err := num(parts[1])
		if err != nil {
			return nil, err
		}
		n, err := strconv.Atoi(strings.TrimSpace(parts[2]))
		if err != nil || n < 2 || n > maxScales {
			return nil, fmt.Errorf("%q: N = %q, want a whole number from 2 to %d", s, parts[2], maxScales)
		}
		for i := 0; i < n; i++ {
			// Rounded to 12 digits so that 0.8:1.6:5 gives 1.2, not
			// 1.2000000000000002, in reports and surface specs.
			x := a + (b-a)*float64(i)/float64(n-1)
			x, _ = strconv.ParseFloat(strconv.FormatFloat(x, 'g', 12, 64), 64)
			out = append(out, x)
		}
		out[n-1] = b
	} else {
		for _, t := range strings.Split(s, ",") {
			x, err := num(t)
			if err != nil {
				return nil, err
			}
			out = append(out, x)
		}
		if len(out) > maxScales {
			return nil, fmt.Errorf("%d factors, at most %d", len(out), maxScales)
		}
	}
	seen := map[float64]bool{}
	for _, x := range out {
		if seen[x] {
			return nil, fmt.Errorf("%q: factor %g appears twice", s, x)
		}
		seen[x] = true
	}
	return out, nil
}

// sweepSpec is one sweep to run: the base surface, its scale factors and
// the agreement band of the verdict (zero fields: the defaults of
// integrate.VerdictOptions, except that without coefficients a zero AbsTol
// leaves the relative band alone).
type sweepSpec struct {
	Name    string
	Base    surface.Shape
	Scales  []float64
	Verdict integrate.VerdictOptions
}

// sweepMember is one member of a sweep: the scale factor and every number
// forces gives for that surface, plus far − near when a near field is
// given.
type sweepMember struct {
	Scale float64 `json:"scale"`
	integrate.Result
	NearFar *integrate.NearFarDifference `json:"near_far,omitempty"`
}

// plateauNear compares the plateau mean with the near field: differences
// of the verdict's quantity (coefficients, or forces without references),
// drag counts (with coefficients) and drag percent of the near field.
type plateauNear struct {
	Drag        float64  `json:"drag"`
	Lift        float64  `json:"lift"`
	DragCounts  float64  `json:"drag_counts"`
	DragPercent *float64 `json:"drag_percent"` // nil (null) when undefined: see integrate.DragPercentDefined
}

// sweepResult is a computed sweep and its verdict. Quantity says what
// drag and lift of the verdict are: "coefficients" or "force".
type sweepResult struct {
	Name     string                 `json:"name,omitempty"`
	Base     string                 `json:"base"`
	Pivot    [3]float64             `json:"pivot"`
	Quantity string                 `json:"quantity"`
	Members  []sweepMember          `json:"members"`
	Plateau  integrate.Plateau      `json:"plateau"`
	Drift    integrate.Drift        `json:"drift"`
	Verdict  integrate.SweepVerdict `json:"verdict"`
	NearFar  *plateauNear           `json:"near_far,omitempty"`
}

// coefficients reports whether the verdict is on coefficients.
func (s *sweepResult) coefficients() bool { return s.Quantity == "coefficients" }

// runSweep cuts and integrates every member of spec through the prepared
// field p, then judges the sweep; near, when not nil, is compared with
// each member and with the plateau. Errors are bad input (a member that
// leaves the mesh, a sweep of fewer than 3 members, no freestream speed).
// It is the whole of the sweep command except parsing and printing, so
// other commands (check, demo) call it.
func runSweep(prog *progress, p *preparedFlow, spec sweepSpec, near *nearReport) (*sweepResult, error) {
	sw := &sweepResult{Name: spec.Name, Base: spec.Base.String(), Pivot: spec.Base.Pivot()}
	members := make([]integrate.SweepMember, 0, len(spec.Scales))
	for i, k := range spec.Scales {
		prog.step("member %d of %d (scale %g): cutting and integrating", i+1, len(spec.Scales), k)
		res, _, err := p.forces(surface.Scale(spec.Base, k))
		if err != nil {
			return nil, fmt.Errorf("sweep member %d (scale %g): %w", i+1, k, err)
		}
		prog.done()
		if !res.HasWind {
			return nil, inputErr(fmt.Errorf("sweep: the freestream speed is zero, so drag and lift are undefined"))
		}
		m := sweepMember{Scale: k, Result: res}
		if near != nil {
			d := integrate.CompareNearFar(res, near.NearResult)
			m.NearFar = &d
		}
		sw.Members = append(sw.Members, m)
		drag, lift := res.Wind.Drag, res.Wind.Lift
		if res.HasCoefficients {
			drag, lift = res.Coefficients.Drag, res.Coefficients.Lift
		}
		members = append(members, integrate.SweepMember{Scale: k, Drag: drag, Lift: lift, MassImbalance: res.MassImbalance, MassFlux: res.MassFlux})
	}
	sw.Quantity = "force"
	vopt := spec.Verdict
	if sw.Members[0].HasCoefficients {
		sw.Quantity = "coefficients"
	} else if vopt.AbsTol == 0 {
		// The default band of one drag count has no meaning for forces:
		// keep the relative band alone unless a band was given.
		vopt.AbsTol = math.SmallestNonzeroFloat64
	}
	v, err := integrate.Verdict(members, vopt)
	if err != nil {
		return nil, inputErr(err)
	}
	sw.Verdict, sw.Plateau, sw.Drift = v, v.Plateau, v.Drift
	if near != nil {
		sw.NearFar = comparePlateau(sw, near)
	}
	return sw, nil
}

// comparePlateau returns plateau mean minus near field, in the verdict's
// quantity.
func comparePlateau(sw *sweepResult, near *nearReport) *plateauNear {
	nd, nl := near.Wind.Drag, near.Wind.Lift
	if sw.coefficients() {
		nd, nl = near.Coefficients.Drag, near.Coefficients.Lift
	}
	d := &plateauNear{Drag: sw.Plateau.Drag - nd, Lift: sw.Plateau.Lift - nl}
	if sw.coefficients() {
		d.DragCounts = 1e4 * d.Drag
	}
	if percentMeaningful(near) {
		p := 100 * d.Drag / math.Abs(nd)
		d.DragPercent = &p
	}
	return d
}
