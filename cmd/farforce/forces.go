package main

import (
	"fmt"
	"io"

	"github.com/spf13/pflag"

	"farforce/readers"
	"farforce/surface"
)

var forcesCommand = &command{
	name:    "forces",
	summary: "integrate the momentum balance over control surfaces: drag, lift, side force, moment",
	usage:   "[FLAGS] FILE... --surface SPEC [--surface SPEC ...]",
	about: `Cuts each control surface through the mesh and integrates the steady momentum
balance over it, giving the force of the fluid on whatever the surface
encloses (per unit span for 2D fields):

    F = -∮ [ ρ(V - V∞)(V·n) + (p - p∞) n - τ·n ] dA

reported term by term (momentum flux, pressure, viscous, Reynolds stress), in
mesh axes and in wind axes (drag along V∞, lift perpendicular to it towards
--up, side completing a right-handed triad), with coefficients, drag counts,
the moment about --moment-center and the mass-closure figure ∮ρV·n / ∮ρ|V·n|.

Surface specs are a shape word and key=value fields, vectors comma-separated:
  sphere center=X,Y,Z radius=R           box min=X,Y,Z max=X,Y,Z [rotate=AX,AY,AZ]
  cylinder center=X,Y,Z axis=X,Y,Z radius=R length=L
  circle center=X,Y radius=R             rect min=X,Y max=X,Y
  polygon points=X,Y;X,Y;...             file path=P
Any shape takes facets=N or size=H to fix the tessellation; by default
facets are about twice the local cell size. A surface that leaves the mesh or cuts into the
body is an error (exit code 2), never a partial sum.

The flow mapping is guessed from the array names (see 'farforce inspect');
every flag below overrides it. NAME|VALUE flags take an array name or a
constant in SI units. Every constant used is echoed in the report.

With --wall FILE (a wall surface file) or --inside SPEC (the mesh boundary
inside SPEC), see 'farforce wall', the near-field force on the body is
computed too and each surface is compared with it: far minus near in
coefficients, drag counts and percent of the near-field drag.

An ffcg file (docs/cgns-text-format.md) needs none of these flags: its
ReferenceState gives what no flag sets (VelocityX/Y/Z the freestream,
Density the density for q∞ and, without a density array, of the flow,
Pressure p∞, LengthReference the reference length, AreaReference the
reference area, ViscosityMolecular a constant μ), and its BCWall-type
patches give the near field, with p and τ from the adjacent cells
(--no-bc-wall turns that off). The report says where each constant came
from.`,
	examples: []example{
		{"farforce forces cyl.vtk --surface 'circle center=0.2,0.2 radius=0.1' --speed 0.2 --density 1 --viscosity 0.001 --ref-length 0.1",
			"2D: drag and lift per unit span on a circle of radius 0.1, coefficients on a 0.1 m chord"},
		{"farforce forces wing.vtk.gz --surface 'box min=-1,-1,-1 max=3,1,1' --speed 50 --alpha 4 --ref-area 2.5 --json",
			"3D at 4° angle of attack, machine-readable"},
		{"farforce forces case.vtk --surface 'sphere center=0,0,0 radius=2' --surface 'sphere center=0,0,0 radius=4' --csv",
			"two surfaces, one CSV row each"},
		{"farforce forces cyl.vtk --surface 'circle center=0.2,0.2 radius=0.15' --wall cyl_wall.vtk --speed 0.2 --density 1 --viscosity 0.001 --ref-length 0.1",
			"far field against the near field of a wall file"},
		{"farforce forces stokes.vtk --surface 'sphere center=0,0,0 radius=3 facets=20000' --freestream-velocity 0,0,1 --no-convection",
			"creeping flow: drop the momentum flux"},
	},
	newImpl: func() commandImpl { return &forcesImpl{} },
}

// forcesImpl holds the flags of forces.
type forcesImpl struct {
	fs       *pflag.FlagSet
	surfaces []string
	flow     flowFlags
	near     nearFlags
	json     bool
	csv      bool
	writeSur string
}

func (c *forcesImpl) define(fs *pflag.FlagSet) {
	c.fs = fs
	fs.StringArrayVar(&c.surfaces, "surface", nil, "control surface `SPEC` (repeatable; see above)")
	c.flow.define(fs)
	c.near.define(fs)
	fs.BoolVar(&c.json, "json", false, "print the report as JSON (schema "+forcesSchema+")")
	fs.BoolVar(&c.csv, "csv", false, "print one CSV row per surface")
	fs.StringVar(&c.writeSur, "write-surface", "", "write the cut surface(s) as legacy VTK POLYDATA to `FILE` (surface k>1 goes to FILE with -k before the extension)")
}

func (c *forcesImpl) run(e *env, args []string) error {
	const cmd = "farforce forces"
	if len(args) == 0 {
		return usageErr(cmd, "forces: no input file given")
	}
	if len(c.surfaces) == 0 {
		return usageErr(cmd, "forces: no --surface given")
	}
	if c.json && c.csv {
		return usageErr(cmd, "forces: --json and --csv exclude each other")
	}
	if err := c.flow.check(c.fs); err != nil {
		return usageErr(cmd, "%v", err)
	}
	if err := c.near.check(); err != nil {
		return usageErr(cmd, "%v", err)
	}
	shapes := make([]surface.Shape, len(c.surfaces))
	for i, spec := range c.surfaces {
		s, err := parseShape(cmd, spec)
		if err != nil {
			return err
		}
		shapes[i] = s
	}
	prog := newProgress(e)
	p, err := loadPrepared(prog, c.fs, &c.flow, args)
	if err != nil {
		return err
	}
	rep := &forcesReport{Schema: forcesSchema, Setup: p.setup, Notice: notice}
	for i, s := range shapes {
		prog.step("surface %d: cutting and integrating", i+1)
		res, cut, err := p.forces(s)
		if err != nil {
			return err
		}
		prog.done()
		rep.Surfaces = append(rep.Surfaces, res)
		if c.writeSur != "" {
			if err := p.writeCutFile(surfaceFileName(c.writeSur, i), cut); err != nil {
				return err
			}
		}
	}
	if c.near.active(p) {
		return c.near.printForcesWithNear(e, p, rep, c.json, c.csv)
	}
	return writeReport(e, rep, c.json, c.csv,
		func(w io.Writer) error { writeForcesCSV(w, rep); return nil },
		func(w io.Writer) { writeForcesText(w, rep) })
}

// parseShape parses a --surface spec; a file surface is read and loaded
// here (relative paths are taken from the working folder).
func parseShape(cmd, spec string) (surface.Shape, error) {
	s, err := surface.ParseSpec(spec)
	if err != nil {
		return nil, usageErr(cmd, "--surface %q: %v", spec, err)
	}
	fsur, ok := s.(surface.FileSurface)
	if !ok {
		return s, nil
	}
	f, err := loadField([]string{fsur.Path}, readers.Options{})
	if err != nil {
		return nil, err
	}
	if len(f.Zones) != 1 {
		return nil, inputErr(fmt.Errorf("--surface %q: %s holds %d zones, want one surface", spec, fsur.Path, len(f.Zones)))
	}
	loaded, err := fsur.Load(f.Zones[0])
	if err != nil {
		return nil, inputErr(fmt.Errorf("--surface %q: %w", spec, err))
	}
	return loaded, nil
}
