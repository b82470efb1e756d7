package main

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"farforce/cmd/internal/svgplot"
	"farforce/integrate"
	"farforce/surface"
)

var wakeCommand = &command{
	name:    "wake",
	summary: "split the drag on wake planes: profile, induced and entropy drag, spanwise loading",
	usage:   "[FLAGS] FILE... --plane SPEC [--plane SPEC ...]",
	about: `Cuts planes normal to the freestream through the wake and evaluates the
classical wake-plane drag formulas on each, every figure labelled with its
formula (u along V∞, v and w across it, p0 the total pressure):

  exact wake-plane momentum   ∬[ρu(U∞−u) + (p∞−p) + τxx]dS   total drag, any station
  far-wake momentum deficit   ρ∬u(U∞−u)dS                    profile drag far downstream
  Betz profile drag           ∬[(p0∞−p0) + ½ρ(u*−u)(u*+u−2U∞)]dS
  Jones                       2∬√(p0−p)(√(p0∞−p∞)−√(p0−p∞))dS  (and compressible, --gamma)
  Oswatitsch entropy drag     (T∞/U∞)∬ρuΔs dS                 (--gamma; absolute pressures)
  induced drag                ½ρ∞∬(v²+w²)dS (+ dipole tail) and Maskell's ½ρ∞∬(ψξ − φσ)dS

Profile drag sits where the total pressure is lost; induced drag is the
crossflow energy left by the trailing vorticity. Maskell's form needs data
only where there is vorticity, so it does not depend on the plane's size;
the energy form misses the crossflow outside the plane (the tail estimate
adds it back). The spanwise loading Γ(y) comes from the shed vorticity, the
lift from ρU∞∫Γdy and the span efficiency from C_Di = C_L²/(π e AR).
Several --plane flags show how the split moves as the plane moves back:
numerical diffusion turns induced drag into profile drag.

Plane specs (our own words; y and z are the plane's span and up axes):
  x=X [ymin=A ymax=B zmin=C zmax=D]   normal to +x; no bounds = mesh section
  x=X radius=R [center=Y,Z]           a disc (no crossflow grid)
  origin=X,Y,Z normal=NX,NY,NZ [ymin=.. ymax=.. zmin=.. zmax=..]
In 2D only ymin and ymax. The crossflow analyses need a rectangular plane in
a 3D field.`,
	examples: []example{
		{"farforce wake wing.vtk --plane 'x=3 ymin=-8 ymax=8 zmin=-4 zmax=4' --speed 50 --density 1.225 --ref-area 12 --span 10",
			"profile and induced drag one span behind a wing, with its span efficiency"},
		{"farforce wake wing.vtk --plane x=2 --plane x=4 --plane x=8 --speed 50 --density 1.225 --csv",
			"a streamwise sequence of mesh sections, one CSV row per figure"},
		{"farforce wake transonic.vtk --plane 'x=5' --speed 240 --density 0.41 --freestream-pressure 26500 --gamma 1.4",
			"compressible: entropy drag and the compressible Jones formula"},
	},
	newImpl: func() commandImpl { return &wakeImpl{} },
}

// wakeImpl holds the flags of wake.
type wakeImpl struct {
	fs        *pflag.FlagSet
	planes    []string
	flow      flowFlags
	gamma     float64
	span      float64
	grid      string
	noCross   bool
	json, csv bool
	writePl   string
	plot      string
}

func (c *wakeImpl) define(fs *pflag.FlagSet) {
	c.fs = fs
	fs.StringArrayVar(&c.planes, "plane", nil, "wake plane `SPEC` (repeatable; see above)")
	c.flow.define(fs)
	fs.Float64Var(&c.gamma, "gamma", 0, "ratio of specific heats `G` > 1: compressible Jones and entropy drag (needs absolute pressures)")
	fs.Float64Var(&c.span, "span", 0, "wing span `B` (m) for the span efficiency (default: the extent of the loading)")
	fs.StringVar(&c.grid, "grid", "", "crossflow grid `N1xN2` (default: about the cell size, at most 400 a side)")
	fs.BoolVar(&c.noCross, "no-crossflow", false, "skip the crossflow (induced drag, loading) analyses")
	fs.BoolVar(&c.json, "json", false, "print the report as JSON (schema "+wakeSchema+")")
	fs.BoolVar(&c.csv, "csv", false, "print one CSV row per figure")
	fs.StringVar(&c.writePl, "write-plane", "", "write the cut plane(s) with their force densities as legacy VTK to `FILE` (plane k>1 to FILE-k)")
	fs.StringVar(&c.plot, "plot", "", "plot the spanwise loading Γ(y) of every plane to `FILE` (.svg or .png)")
}

func (c *wakeImpl) run(e *env, args []string) error {
	const cmd = "farforce wake"
	switch {
	case len(args) == 0:
		return usageErr(cmd, "wake: no input file given")
	case len(c.planes) == 0:
		return usageErr(cmd, "wake: no --plane given")
	case c.json && c.csv:
		return usageErr(cmd, "wake: --json and --csv exclude each other")
	case c.flow.form != "deficit" || c.flow.noConvection:
		return usageErr(cmd, "wake: the wake-plane formulas use the deficit momentum flux; drop --form and --no-convection")
	}
	if err := c.flow.check(c.fs); err != nil {
		return usageErr(cmd, "%v", err)
	}
	if err := checkNumber("span", c.span, false); err != nil {
		return usageErr(cmd, "%v", err)
	}
	if c.gamma != 0 && !(c.gamma > 1) || math.IsInf(c.gamma, 0) {
		return usageErr(cmd, "--gamma %g: want a ratio of specific heats > 1", c.gamma)
	}
	if err := checkPlotName(c.plot); err != nil {
		return usageErr(cmd, "%v", err)
	}
	grid, err := parseGrid(c.grid)
	if err != nil {
		return usageErr(cmd, "%v", err)
	}
	planes := make([]surface.Plane, len(c.planes))
	for i, spec := range c.planes {
		if planes[i], err = surface.ParsePlane(spec); err != nil {
			return usageErr(cmd, "--plane %q: %v", spec, err)
		}
	}
	prog := newProgress(e)
	p, err := loadPrepared(prog, c.fs, &c.flow, args)
	if err != nil {
		return err
	}
	wopt := integrate.WakeOptions{Options: p.opt, Gamma: c.gamma, Span: c.span}
	rep := &wakeReport{Schema: wakeSchema, Setup: p.setup, Gamma: c.gamma, Span: c.span, Notice: notice}
	for i, pl := range planes {
		// The plane's up axis follows --up (its default is +z already).
		if pl.Up == ([3]float64{}) && !pl.Dim2 && p.setup.Dimension == 3 && p.opt.Up != [3]float64{0, 0, 1} {
			pl.Up = p.opt.Up
		}
		prog.step("plane %d: cutting and integrating", i+1)
		cut, fitted, err := surface.CutPlane(p.loc, pl, surface.CutOptions{Workers: c.flow.workers})
		if err != nil {
			return inputErr(err)
		}
		res, err := integrate.Wake(cut, p.flow, wopt)
		if err != nil {
			return inputErr(err)
		}
		prog.done()
		if !c.noCross && !fitted.Dim2 && fitted.Radius == 0 {
			prog.step("plane %d: crossflow solves", i+1)
			n1, n2 := grid[0], grid[1]
			if n1 == 0 {
				n1, n2 = defaultGrid(p, fitted)
			}
			g, err := surface.PlaneGridOf(p.loc, fitted, n1, n2)
			if err != nil {
				return inputErr(err)
			}
			cf, err := integrate.Crossflow(g, p.flow, wopt)
			if err != nil {
				return inputErr(err)
			}
			res.AddCrossflow(cf, &wopt.Options)
			prog.done()
		}
		rep.Planes = append(rep.Planes, res)
		if c.writePl != "" {
			if err := p.writeCutFile(surfaceFileName(c.writePl, i), cut); err != nil {
				return err
			}
		}
	}
	if c.plot != "" {
		chart, ok := loadingChart(rep)
		if !ok {
			return usageErr(cmd, "--plot: no plane has a crossflow analysis to plot")
		}
		if err := writePlot(c.plot, chart); err != nil {
			return err
		}
	}
	return writeReport(e, rep, c.json, c.csv,
		func(w io.Writer) error { writeWakeCSV(w, rep); return nil },
		func(w io.Writer) { writeWakeText(w, rep) })
}

// parseGrid reads "N1xN2" (or one number for both); "" gives zeros.
func parseGrid(s string) ([2]int, error) {
	if s == "" {
		return [2]int{}, nil
	}
	a, b, ok := strings.Cut(strings.ToLower(s), "x")
	if !ok {
		b = a
	}
	n1, err1 := strconv.Atoi(strings.TrimSpace(a))
	n2, err2 := strconv.Atoi(strings.TrimSpace(b))
	if err1 != nil || err2 != nil || n1 < 2 || n2 < 2 || float64(n1)*float64(n2) > surface.MaxGridPoints {
		return [2]int{}, fmt.Errorf("--grid %q: want N1xN2 with 2 ≤ N and at most %d points", s, surface.MaxGridPoints)
	}
	return [2]int{n1, n2}, nil
}

// defaultGrid sizes the crossflow grid of a plane by the mesh cell size
// at its centre: between 16 and 400 points a side.
func defaultGrid(p *preparedFlow, pl surface.Plane) (int, int) {
	h := p.loc.CellSize(pl.Pivot())
	n := func(l float64) int {
		if !(h > 0) {
			return 64
		}
		return int(math.Min(400, math.Max(16, math.Round(l/h))))
	}
	return n(pl.Max[0] - pl.Min[0]), n(pl.Max[1] - pl.Min[1])
}

// loadingChart plots Γ(y) of every plane with a crossflow analysis.
func loadingChart(r *wakeReport) (*svgplot.Chart, bool) {
	var panel svgplot.Panel
	panel.YLabel = "circulation Γ (m²/s)"
	for _, pl := range r.Planes {
		cf := pl.Crossflow
		if cf == nil {
			continue
		}
		s := svgplot.Series{Name: pl.Spec}
		for _, l := range cf.Loading {
			s.X, s.Y = append(s.X, l.S1), append(s.Y, l.Gamma)
		}
		panel.Series = append(panel.Series, s)
	}
	if len(panel.Series) == 0 {
		return nil, false
	}
	return &svgplot.Chart{Title: "Spanwise loading from the shed vorticity", XLabel: "span coordinate y (m)", Panels: []svgplot.Panel{panel}}, true
}
