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

// demoVTK is the demo solution: see gendemo.go for how it was made.
//
//go:embed testdata/strut.vtk
var demoVTK []byte

var demoCommand = &command{
	name:    "demo",
	summary: "run farforce on a small built-in solution and show what it reports",
	usage:   "[FLAGS]",
	about: `Writes a small built-in 2D solution (an invented scenario: a streamlined
instrument strut in a water channel) to a folder, then runs 'inspect' and
'forces' on it as you would on your own files, printing each command line
first. Nothing is downloaded; it finishes in seconds.`,
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
const demoScenario = `The scenario is invented for this demo; the field is not a solver result.
A streamlined instrument strut (elliptic section, chord 0.1 m, thickness
24 mm) is held across a water channel running at 1.5 m/s (water at 20 °C:
density 998.2 kg/m³, viscosity 1.002e-3 Pa·s). The file is a 2D cut through
it: the exact potential flow past the section plus an invented turbulent
wake standing for a drag coefficient near 0.012 on the chord, on a coarse
O-grid of 1536 quads reaching 1 m from the strut.`

// demoReading tells the user what to look at in the demo's reports.
const demoReading = `What to look at:
- The two surfaces enclose the same strut, so their drag should agree: the
  spread between surfaces of different size is the uncertainty of the
  far-field number. Here the wake is invented and does not satisfy the flow
  equations exactly, so they differ by a few counts.
- The mass closure should be close to zero; a large value means the field
  or its interpolation does not conserve mass there.
- The scenario was built for a drag coefficient near 0.012 (120 counts).`

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
	file := filepath.Join(dir, "strut.vtk")
	if err := writeFileAtomic(file, func(w io.Writer) error { _, err := w.Write(demoVTK); return err }); err != nil {
		return inputErr(err)
	}
	fmt.Fprintf(e.stdout, "farforce demo\n\n%s\n\nFiles go to %s\n", demoScenario, dir)
	steps := [][]string{
		{"inspect", file},
		{"forces", file,
			"--surface", "circle center=0,0 radius=0.3",
			"--surface", "rect min=-0.4,-0.3 max=0.7,0.3",
			"--density", "998.2", "--viscosity", "1.002e-3",
			"--speed", "1.5", "--ref-length", "0.1",
			"--write-surface", filepath.Join(dir, "strut-surface.vtk")},
	}
	for _, s := range steps {
		fmt.Fprintf(e.stdout, "\n$ farforce %s\n\n", shellJoin(s))
		if err := dispatch(e, s); err != nil {
			return err
		}
	}
	fmt.Fprintf(e.stdout, "\n%s\n\nThe demo files are in %s: strut.vtk (the solution) and\nstrut-surface.vtk, strut-surface-2.vtk (the cut surfaces with the force\ndensity of each term, for a VTK viewer).\n", demoReading, dir)
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
