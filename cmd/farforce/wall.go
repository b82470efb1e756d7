package main

import (
	"fmt"
	"math"
	"strings"

	"github.com/spf13/pflag"

	"farforce/integrate"
	"farforce/readers"
)

var wallCommand = &command{
	name:    "wall",
	summary: "near-field force: integrate pressure and wall friction over the body surface",
	usage:   "[FLAGS] --wall FILE | [FLAGS] FILE... --inside SPEC | [FLAGS] FILE.ffcg...",
	about: `Integrates the surface loads over the body itself, the classical near-field
force that far-field numbers are checked against (per unit span in 2D):

    F = ∮ [ -(p - p∞) n + τ·n ] dA,   n out of the body into the fluid

reported as its pressure and friction parts, in mesh and wind axes, with
coefficients. The loads come from one of

  --wall FILE     a surface file (VTK POLYDATA: polygons in 3D, lines in 2D)
                  with a pressure (or C_p) array and a wall-shear traction
                  (or skin-friction coefficient) vector array; the names are
                  guessed and --wall-pressure, --wall-shear, --skin-friction
                  override them. Normals are oriented out of the body from
                  the geometry (closed walls by their enclosed volume), never
                  from the node order.
  --inside SPEC   the volume mesh FILE...: its boundary faces whose centre
                  lies inside the surface SPEC (which must enclose the body
                  wall and no other boundary), with p and τ taken from the
                  adjacent cells.
  (neither)       an ffcg volume FILE... (docs/cgns-text-format.md): the
                  faces of its BCWall-type patches (BCWall, BCWallViscous,
                  BCWallInviscid, ...), with p and τ from the adjacent cells
                  as for --inside; its ReferenceState gives the freestream
                  and references that no flag sets (see 'farforce forces').

The freestream and reference flags set the wind axes and coefficients as in
'farforce forces'; with --wall alone no volume file is needed, and the
density for the coefficients comes from --freestream-density or a constant
--density.`,
	examples: []example{
		{"farforce wall --wall cyl_wall.vtk --freestream-velocity 0.2,0,0 --freestream-density 1 --ref-length 0.1",
			"2D wall polyline with pressure and wall shear: drag and lift coefficients on D = 0.1"},
		{"farforce wall cyl.vtk --inside 'circle center=0.2,0.2 radius=0.08' --density 1 --viscosity 1e-3 --freestream-velocity 0.2,0,0 --ref-length 0.1",
			"the same from the volume mesh: the boundary edges inside the circle are the wall"},
		{"farforce wall --wall wing_surface.vtk --skin-friction cf --wall-pressure cp --wall-pressure-coefficient --speed 50 --alpha 4 --freestream-density 1.2 --ref-area 2.5 --json",
			"3D surface with coefficient arrays, machine-readable"},
	},
	newImpl: func() commandImpl { return &wallImpl{} },
}

// wallSchema versions the JSON report of wall.
const wallSchema = "farforce.wall/1"

// wallImpl holds the flags of wall.
type wallImpl struct {
	fs   *pflag.FlagSet
	flow flowFlags
	near nearFlags
	json bool
}

func (c *wallImpl) define(fs *pflag.FlagSet) {
	c.fs = fs
	c.near.define(fs)
	c.flow.define(fs)
	fs.BoolVar(&c.json, "json", false, "print the report as JSON (schema "+wallSchema+")")
}

// wallReport is what wall prints.
type wallReport struct {
	Schema string      `json:"schema"`
	Setup  setupReport `json:"setup"`
	Near   *nearReport `json:"near"`
	Notice string      `json:"notice"`
}

func (c *wallImpl) run(e *env, args []string) error {
	const cmd = "farforce wall"
	if err := c.near.check(); err != nil {
		return usageErr(cmd, "%v", err)
	}
	if !c.near.given() && len(args) == 0 {
		return usageErr(cmd, "wall: give --wall FILE, the volume FILE... with --inside SPEC, or an ffcg FILE with BCWall patches")
	}
	if c.near.wall != "" && len(args) > 0 {
		return usageErr(cmd, "wall: --wall FILE takes no volume files (got %q); use --inside SPEC to take the wall from a volume mesh", args[0])
	}
	if c.near.inside != "" && len(args) == 0 {
		return usageErr(cmd, "wall: --inside needs the volume FILE...")
	}
	if err := c.flow.check(c.fs); err != nil {
		return usageErr(cmd, "%v", err)
	}
	rep, err := wallRun(e, c.fs, &c.flow, &c.near, args)
	if err != nil {
		return err
	}
	if c.json {
		return writeJSON(e.stdout, rep)
	}
	writeWallText(e.stdout, rep)
	return nil
}

// wallRun computes the near field selected by near (flags already
// checked): from the wall file alone, or from the volume files (the
// boundary inside --inside, else the wall patches of ffcg files).
func wallRun(e *env, fs *pflag.FlagSet, fl *flowFlags, near *nearFlags, files []string) (*wallReport, error) {
	prog := newProgress(e)
	if near.wall != "" {
		prog.step("integrating the wall file %s", near.wall)
		r, setup, err := near.wallOnly(fs, fl)
		if err != nil {
			return nil, err
		}
		prog.done()
		return &wallReport{Schema: wallSchema, Setup: setup, Near: r, Notice: notice}, nil
	}
	p, err := loadPrepared(prog, fs, fl, files)
	if err != nil {
		return nil, err
	}
	if !near.active(p) {
		return nil, usageErr("farforce wall", "wall: no near field: %s has no BCWall patch (or --no-bc-wall was given): give --inside SPEC (the boundary faces around the body) or --wall FILE", strings.Join(files, ", "))
	}
	prog.step("integrating the wall loads from the volume mesh")
	r, err := near.compute(p)
	if err != nil {
		return nil, err
	}
	prog.done()
	return &wallReport{Schema: wallSchema, Setup: p.setup, Near: r, Notice: notice}, nil
}

// loadPrepared reads the solution files with their case information
// (loadWithCase) and prepares them for cutting and integrating, with progress.
func loadPrepared(prog *progress, fs *pflag.FlagSet, fl *flowFlags, files []string) (*preparedFlow, error) {
	prog.step("reading %d file(s)", len(files))
	f, cd, err := loadWithCase(files, readers.Options{Workers: fl.workers, Arrays: fl.arrays()})
	if err != nil {
		return nil, err
	}
	prog.done()
	prog.step("indexing %d cells and preparing the arrays", f.NumCells())
	p, err := fl.prepareCase(fs, files, f, cd)
	if err != nil {
		return nil, err
	}
	prog.done()
	return p, nil
}

// wallOnly integrates the wall file without a volume mesh: the options come
// from the freestream and reference flags alone.
func (n *nearFlags) wallOnly(fs *pflag.FlagSet, fl *flowFlags) (*nearReport, setupReport, error) {
	var setup setupReport
	f, err := loadField([]string{n.wall}, readers.Options{Workers: fl.workers})
	if err != nil {
		return nil, setup, err
	}
	dim := 3
	for _, z := range f.Zones {
		for _, t := range z.Types {
			if t.Dim() == 1 {
				dim = 2
			}
		}
	}
	opt, err := fl.wallOptions(fs, dim)
	if err != nil {
		return nil, setup, inputErr(err)
	}
	r, err := n.fromWallField(f, opt)
	if err != nil {
		return nil, setup, err
	}
	setup = setupReport{
		Files: []string{n.wall}, Dimension: dim,
		Freestream: freestreamEcho{Velocity: opt.Free.V, Speed: norm(opt.Free.V), Density: opt.Free.Rho, Pressure: opt.Free.P},
		Up:         opt.Up, RefArea: opt.RefArea, RefLength: opt.RefLength, MomentCenter: opt.MomentCenter,
		Workers: fl.workers, Warnings: f.Warnings,
	}
	return r, setup, nil
}

// wallOptions builds the integration options of a wall file integrated
// without a volume field (dimension dim): the freestream, up axis, moment
// centre and references of the flags (already checked, which parses the
// vectors); the density is --freestream-density or the --density
// constant. It mirrors the option part of flowFlags.prepare, which needs
// the volume field.
func (fl *flowFlags) wallOptions(fs *pflag.FlagSet, dim int) (integrate.Options, error) {
	opt := integrate.Options{RefArea: fl.refArea, RefLength: fl.refLength, Workers: fl.workers}
	opt.Free.P = fl.freePressure
	var err error
	if opt.Free.V, err = fl.freestream(fs, dim, nil, nil); err != nil {
		return opt, err
	}
	switch {
	case fs.Changed("freestream-density"):
		opt.Free.Rho = fl.freeDensity
	case fl.density != "":
		q, err := parseQuantity("density", fl.density)
		if err != nil || q.Name != "" {
			return opt, fmt.Errorf("--density %q: a wall file alone needs a constant density (or --freestream-density)", fl.density)
		}
		opt.Free.Rho = q.Value
	case fl.refArea > 0 || fl.refLength > 0 || fs.Changed("wall-pressure-coefficient") || fs.Changed("skin-friction"):
		return opt, fmt.Errorf("give --freestream-density (or a constant --density) for the dynamic pressure")
	}
	if fl.up != "" {
		opt.Up = fl.upV
	}
	opt.MomentCenter = fl.centerV
	return opt, nil
}

// norm is the Euclidean length of v.
func norm(v [3]float64) float64 { return math.Sqrt(dot(v, v)) }
