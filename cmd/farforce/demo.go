package main

import (
	_ "embed"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/pflag"
)

//go:generate go run gendemo.go

// demoField is the demo solution and demoWall its body surface with the
// wall loads: see gendemo.go for how they were made.
var (
	//go:embed testdata/strut.vtk.gz
	demoField []byte
	//go:embed testdata/strut_wall.vtk
	demoWall []byte
)

var demoCommand = &command{
	name:    "demo",
	summary: "run farforce on a small built-in solution and show what it reports",
	usage:   "[FLAGS]",
	about: `Writes a small built-in 2D solution (an invented scenario: a streamlined
instrument strut in a water channel), its wall surface and a case file to a
folder, then runs 'inspect', a size 'sweep' compared with the wall's near
field (with a plot), and 'check' with its gates and a JUnit report, as you
would on your own files, printing each command line first. Nothing is
downloaded; it finishes in seconds. Exit code 0, or 1 if a gate of the demo
case fails (it should not).`,
	examples: []example{
		{"farforce demo", "write the files to a new temporary folder and run the commands"},
		{"farforce demo --dir demo-out", "keep the files in ./demo-out"},
	},
	newImpl: func() commandImpl { return &demoImpl{} },
}

type demoImpl struct{ dir string }

func (c *demoImpl) define(fs *pflag.FlagSet) {
	fs.StringVar(&c.dir, "dir", "", "folder `DIR` for the demo files (default: a new temporary folder)")
}

// demoScenario describes the built-in solution to the user.
const demoScenario = `The scenario is invented for this demo; the files are not solver results.
A streamlined instrument strut (elliptic section, chord 0.1 m, thickness
24 mm) is held across a water channel running at 1.5 m/s (water at 20 °C:
density 998.2 kg/m³, viscosity 1.002e-3 Pa·s). The field is a 2D cut: the
exact potential flow past the section plus an invented wake whose volume
deficit stands for a drag coefficient of 0.012 on the chord (120 counts), on
an O-grid of 2880 quads reaching 1 m from the strut. The wall file carries
the exact potential-flow pressure and an invented wall shear stress, scaled
so that its drag is exactly 0.012: near and far field agree by construction,
so the demo shows what agreement looks like.`

// demoCase is the case file the demo checks; paths are relative to it.
const demoCase = `# farforce case file written by 'farforce demo': the invented strut in a
# water channel (not a solver result). Paths are relative to this file.
# Run it again with: farforce check strut-case.toml --junit junit.xml
files = ["strut.vtk.gz"]

[flow]
velocity = "U"
pressure = "p"
density = 998.2                       # kg/m³, water at 20 °C
viscosity = 1.002e-3                  # Pa·s
kinematic_eddy_viscosity = "nut"      # m²/s

[freestream]
velocity = [1.5, 0, 0]                # m/s

[reference]
length = 0.1                          # m, the chord

[near]
wall = "strut_wall.vtk"

[[surface]]
name = "circle r=0.5"
spec = "circle center=0,0 radius=0.5"

[[sweep]]
name = "rectangles"
surface = "rect min=-0.15,-0.15 max=0.25,0.15"
scales = "1:3:5"

[[gate]]
name = "far field against the wall"
kind = "near-far"
max = 5                               # counts

[[gate]]
kind = "plateau-spread"
max = 2                               # counts

[[gate]]
kind = "mass-imbalance"
max = 1e-4

[[gate]]
name = "design drag"
kind = "drag"
expected = 0.012
tolerance = 0.0005
`

// demoReading tells the user what to look at in the demo's reports.
const demoReading = `What to look at:
- The sweep: the far-field drag of every circle, and the plateau, the run of
  sizes that agree, whose half-range is the control-surface uncertainty.
  The smallest surfaces read a few counts low and the drag settles as the
  surfaces grow: the invented near wake does not satisfy the momentum
  equations exactly, like a real field near the body on a coarse mesh.
- far - near: the plateau against the wall integral, within a count here.
- The mass closure should be close to zero; a large value means the field
  or its interpolation does not conserve mass there.
- check: each gate passes or fails with its numbers; the exit code (0 here,
  1 when a gate fails) and the JUnit file are what a CI job uses.`

// demoOutputs lists the files the demo leaves, for the closing message.
var demoOutputs = [][2]string{
	{"strut.vtk.gz", "the flow field (legacy VTK, gzip-compressed)"},
	{"strut_wall.vtk", "the strut's wall with pressure and wall shear stress"},
	{"strut-case.toml", "the case file that 'check' ran"},
	{"sweep.svg", "drag and lift against surface size, from 'sweep'"},
	{"check-sweep.svg", "the same for the case's sweep of rectangles"},
	{"junit.xml", "the JUnit report of the gates, one test case per gate"},
}

func (c *demoImpl) run(e *env, args []string) error {
	if len(args) > 0 {
		return usageErr("farforce demo", "demo takes no arguments, got %q", args[0])
	}
	dir := c.dir
	if dir == "" {
		d, err := os.MkdirTemp("", "farforce-demo-")
		if err != nil {
			return err
		}
		dir = d
	} else if err := os.MkdirAll(dir, 0o755); err != nil {
		return inputErr(err)
	}
	path := func(name string) string { return filepath.Join(dir, name) }
	for _, f := range []struct {
		name string
		data []byte
	}{{"strut.vtk.gz", demoField}, {"strut_wall.vtk", demoWall}, {"strut-case.toml", []byte(demoCase)}} {
		if err := writeFileAtomic(path(f.name), func(w io.Writer) error { _, err := w.Write(f.data); return err }); err != nil {
			return inputErr(err)
		}
	}
	fmt.Fprintf(e.stdout, "farforce demo\n\n%s\n\nFiles go to %s\n", demoScenario, dir)
	water := []string{"--density", "998.2", "--viscosity", "1.002e-3", "--speed", "1.5", "--ref-length", "0.1"}
	steps := [][]string{
		{"inspect", path("strut.vtk.gz")},
		append([]string{"sweep", path("strut.vtk.gz"),
			"--surface", "circle center=0,0 radius=0.2", "--scales", "1:4:7",
			"--wall", path("strut_wall.vtk"), "--plot", path("sweep.svg")}, water...),
		{"check", path("strut-case.toml"), "--junit", path("junit.xml"), "--plot", path("check-sweep.svg")},
	}
	for _, s := range steps {
		fmt.Fprintf(e.stdout, "\n$ farforce %s\n\n", shellJoin(s))
		if err := dispatch(e, s); err != nil {
			return err
		}
	}
	fmt.Fprintf(e.stdout, "\n%s\n\nThe demo files are in %s:\n", demoReading, dir)
	for _, o := range demoOutputs {
		fmt.Fprintf(e.stdout, "  %-16s %s\n", o[0], o[1])
	}
	return nil
}

// shellJoin quotes the arguments that need it for a POSIX shell.
func shellJoin(args []string) string {
	q := make([]string, len(args))
	for i, a := range args {
		if a == "" || strings.ContainsAny(a, " \t'\"$;&|<>*?()[]{}\\") {
			a = "'" + strings.ReplaceAll(a, "'", `'\''`) + "'"
		}
		q[i] = a
	}
	return strings.Join(q, " ")
}
