package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"farforce/integrate"
)

var checkCommand = &command{
	name:    "check",
	summary: "run a case file's surfaces, sweeps and near field, and gate the results (for CI)",
	usage:   "[FLAGS] CASE.toml",
	about: `Reads a TOML case file describing one simulation output, computes everything
it asks for and checks its gates. Exit code 0: every gate passed; 1: a gate
failed; 2: bad input (case file, solution files, a surface leaving the mesh).
Relative paths in the case file are taken from the case file's folder.

Case file keys (all lengths in metres, SI units; keys mirror the flags of
'farforce forces', 'sweep' and 'wall'):

  files = ["solution.vtk"]                  solution files (partitions)
  [flow]        velocity, pressure, density, viscosity, kinematic_viscosity,
                eddy_viscosity, kinematic_eddy_viscosity, reynolds_stress,
                mask (names, or numbers for constants; default: guessed)
  [freestream]  velocity = [X, Y, Z] | speed, alpha, beta; density, pressure
  [reference]   length, area, moment_center = [X, Y, Z], up = [X, Y, Z]
  [options]     form = "deficit"|"plain", no_convection, workers
  [[surface]]   name, spec = "circle center=0,0 radius=1"
  [[sweep]]     name, surface = "SPEC", scales = "0.75:1.75:5" or [1, 1.5, 2],
                agree_rel, agree_abs
  [near]        wall = "wall.vtk" (pressure, shear, skin_friction,
                pressure_coefficient, inside_point) | inside = "SPEC"
  [[gate]]      name, kind, on = "surface or sweep name" (default: all), and
    kind = "near-far"        max: |far - near| drag counts (each surface, each plateau)
    kind = "plateau-spread"  max: plateau drag half-range in counts
    kind = "mass-imbalance"  max: |∮ρV·n / ∮ρ|V·n|| of surfaces and members
    kind = "drag" | "lift"   expected, tolerance: C_D (C_L) of surfaces, plateaus
    kind = "no-drift"        no drift of drag with size flagged in a sweep

With ffcg solution files (docs/cgns-text-format.md) the [flow],
[freestream] and [reference] tables may be left out: the ReferenceState
gives the freestream and references, and without a [near] table the
BCWall-type patches give the near field (keys still override).

Unknown keys are errors, reported with their line. On bad input (exit code
2) no JUnit report or plot is written.`,
	examples: []example{
		{"farforce check cases/cylinder.toml", "run the case, print the summary, exit 0 or 1"},
		{"farforce check cases/cylinder.toml --junit reports/farforce.xml --plot reports/sweep.svg",
			"for CI: one JUnit test case per gate, and the sweep plot"},
		{"farforce check cases/cylinder.toml --json", "machine-readable results"},
	},
	newImpl: func() commandImpl { return &checkImpl{} },
}

// checkSchema versions the JSON report of check.
const checkSchema = "farforce.check/1"

// checkImpl holds the flags of check.
type checkImpl struct {
	json  bool
	junit string
	plot  string
}

func (c *checkImpl) define(fs *pflag.FlagSet) {
	fs.BoolVar(&c.json, "json", false, "print the results as JSON (schema "+checkSchema+")")
	fs.StringVar(&c.junit, "junit", "", "write a JUnit XML report to `FILE`, one test case per gate")
	fs.StringVar(&c.plot, "plot", "", "draw each sweep to `FILE` (.svg or .png; sweep k>1 goes to FILE with -k before the extension)")
}

// caseSurfaceResult is one [[surface]] of a case: its name, the forces
// result and far − near.
type caseSurfaceResult struct {
	Name string `json:"name"`
	integrate.Result
	NearFar *integrate.NearFarDifference `json:"near_far,omitempty"`
}

// caseRun is everything check computed for a case, and the gates.
type caseRun struct {
	Schema   string              `json:"schema"`
	Case     string              `json:"case"`
	Setup    setupReport         `json:"setup"`
	Near     *nearReport         `json:"near,omitempty"`
	Surfaces []caseSurfaceResult `json:"surfaces"`
	Sweeps   []*sweepResult      `json:"sweeps"`
	Gates    []gateResult        `json:"gates"`
	Passed   bool                `json:"passed"`
	Failed   int                 `json:"failed"`
	Notice   string              `json:"notice"`
}

// coefficients reports whether the run's forces have coefficients.
func (r *caseRun) coefficients() bool {
	switch {
	case len(r.Surfaces) > 0:
		return r.Surfaces[0].HasCoefficients
	case len(r.Sweeps) > 0:
		return r.Sweeps[0].coefficients()
	}
	return false
}

// forceUnit is N or N/m.
func (r *caseRun) forceUnit() string {
	fu, _, _ := units(r.Setup.Dimension)
	return fu
}

func (c *checkImpl) run(e *env, args []string) error {
	const cmd = "farforce check"
	if len(args) != 1 {
		return usageErr(cmd, "check: give one case file, got %d arguments", len(args))
	}
	if err := checkPlotName(c.plot); err != nil {
		return usageErr(cmd, "%v", err)
	}
	cf, err := loadCase(args[0])
	if err != nil {
		return inputErr(err)
	}
	r, err := runCase(newProgress(e), cf)
	if err != nil {
		return err
	}
	if c.junit != "" {
		if err := writeFileAtomic(c.junit, func(w io.Writer) error { return writeJUnit(w, cf.path, r) }); err != nil {
			return inputErr(err)
		}
	}
	var plots []string
	if c.plot != "" {
		for i, s := range r.Sweeps {
			name := surfaceFileName(c.plot, i)
			if err := writePlot(name, sweepChart(s, r.Near, r.Setup.Dimension)); err != nil {
				return err
			}
			plots = append(plots, name)
		}
	}
	if c.json {
		if err := writeJSON(e.stdout, r); err != nil {
			return err
		}
	} else {
		writeCheckText(e.stdout, r)
		if c.junit != "" {
			fmt.Fprintf(e.stdout, "JUnit report written to %s\n", c.junit)
		}
		if len(plots) > 0 {
			fmt.Fprintf(e.stdout, "Plots written to %s\n", strings.Join(plots, ", "))
		}
	}
	if r.Failed > 0 {
		return &codeError{code: exitGate, err: fmt.Errorf("%s: %d of %d gates failed", cf.path, r.Failed, len(r.Gates))}
	}
	return nil
}

// runCase computes the near field, surfaces and sweeps of a loaded case
// and evaluates its gates. Errors are bad input. It is the whole of check
// except printing, so other commands (demo) can call it.
func runCase(prog *progress, cf *caseFile) (*caseRun, error) {
	fs := pflag.NewFlagSet("case file", pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	var fl flowFlags
	var nf nearFlags
	fl.define(fs)
	nf.define(fs)
	if err := fs.Parse(cf.flagArgs()); err != nil {
		return nil, inputErr(fmt.Errorf("case file %s: %v", cf.path, err))
	}
	if err := fl.check(fs); err != nil {
		return nil, inputErr(fmt.Errorf("case file %s: %v (case keys mirror these flags)", cf.path, err))
	}
	if err := nf.check(); err != nil {
		return nil, inputErr(fmt.Errorf("case file %s: [near]: %v", cf.path, err))
	}
	p, err := loadPrepared(prog, fs, &fl, cf.Files)
	if err != nil {
		return nil, err
	}
	r := &caseRun{Schema: checkSchema, Case: cf.path, Setup: p.setup, Notice: notice}
	if nf.active(p) {
		prog.step("near field")
		if r.Near, err = nf.compute(p); err != nil {
			return nil, err
		}
		prog.done()
	}
	if r.Near == nil {
		for _, g := range cf.Gates {
			if gateKinds[g.Kind].near {
				return nil, inputErr(fmt.Errorf("case file %s: gate %q needs a near field: add a [near] table, or BCWall patches to the ffcg files", cf.path, g.Name))
			}
		}
	}
	for _, s := range cf.Surfaces {
		shape, err := parseShape("farforce check", s.Spec)
		if err != nil {
			return nil, inputErr(fmt.Errorf("case file %s: surface %q: %w", cf.path, s.Name, err))
		}
		prog.step("surface %s: cutting and integrating", s.Name)
		res, _, err := p.forces(shape)
		if err != nil {
			return nil, fmt.Errorf("surface %q: %w", s.Name, err)
		}
		prog.done()
		r.Surfaces = append(r.Surfaces, caseSurfaceResult{Name: s.Name, Result: res, NearFar: nearFarOf(res, r.Near)})
	}
	for _, s := range cf.Sweeps {
		shape, err := parseShape("farforce check", s.Surface)
		if err != nil {
			return nil, inputErr(fmt.Errorf("case file %s: sweep %q: %w", cf.path, s.Name, err))
		}
		spec := sweepSpec{Name: s.Name, Base: shape, Scales: s.Scales, Verdict: integrate.VerdictOptions{RelTol: s.AgreeRel, AbsTol: s.AgreeAbs}}
		sw, err := runSweep(prog, p, spec, r.Near)
		if err != nil {
			return nil, fmt.Errorf("sweep %q: %w", s.Name, err)
		}
		r.Sweeps = append(r.Sweeps, sw)
	}
	if r.Gates, err = evalGates(cf, r); err != nil {
		return nil, err
	}
	r.Failed = gateSummary(r.Gates)
	r.Passed = r.Failed == 0
	return r, nil
}

// flagArgs turns the flow, freestream, reference, options and near tables
// into the equivalent command-line flags, so a case means exactly what
// the same flags mean.
func (c *caseFile) flagArgs() []string {
	var a []string
	str := func(flag, v string) {
		if v != "" {
			a = append(a, "--"+flag+"="+v)
		}
	}
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	ptr := func(flag string, v *float64) {
		if v != nil {
			a = append(a, "--"+flag+"="+g(*v))
		}
	}
	vec := func(flag string, v []float64) {
		if v != nil {
			parts := make([]string, len(v))
			for i, x := range v {
				parts[i] = g(x)
			}
			a = append(a, "--"+flag+"="+strings.Join(parts, ","))
		}
	}
	f := &c.Flow
	str("velocity", strings.Join(f.Velocity, ","))
	str("pressure", f.Pressure)
	str("density", string(f.Density))
	str("viscosity", string(f.Viscosity))
	str("kinematic-viscosity", string(f.KinematicViscosity))
	str("eddy-viscosity", string(f.EddyViscosity))
	str("kinematic-eddy-viscosity", string(f.KinematicEddyViscosity))
	str("reynolds-stress", f.ReynoldsStress)
	str("mask", f.Mask)
	s := &c.Freestream
	vec("freestream-velocity", s.Velocity)
	ptr("speed", s.Speed)
	ptr("alpha", s.Alpha)
	ptr("beta", s.Beta)
	ptr("freestream-density", s.Density)
	ptr("freestream-pressure", s.Pressure)
	r := &c.Reference
	ptr("ref-length", r.Length)
	ptr("ref-area", r.Area)
	vec("moment-center", r.MomentCenter)
	vec("up", r.Up)
	o := &c.Options
	str("form", o.Form)
	if o.NoConvection {
		a = append(a, "--no-convection")
	}
	if o.Workers != 0 {
		a = append(a, "--workers="+strconv.Itoa(o.Workers))
	}
	if n := c.Near; n != nil {
		str("wall", n.Wall)
		str("wall-pressure", n.Pressure)
		str("wall-shear", n.Shear)
		str("skin-friction", n.SkinFriction)
		if n.PressureCoefficient {
			a = append(a, "--wall-pressure-coefficient")
		}
		vec("wall-inside-point", n.InsidePoint)
		str("inside", n.Inside)
	}
	return a
}
