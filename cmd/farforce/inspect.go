package main

import (
	"github.com/spf13/pflag"

	"farforce/readers"
)

var inspectCommand = &command{
	name:    "inspect",
	summary: "show what a solution file holds: zones, cells, arrays, ranges, flow mapping",
	usage:   "[FLAGS] FILE...",
	about: `Reads one or more solution files (several files load as the zones of one
partitioned solution) and prints the zones, the point and cell counts by cell
type, the bounds, whether the field is 2D (all z equal) or 3D, every array
with its location, components, range and count of NaN/Inf values, the flow
mapping guessed from the array names, and any warnings from the reader.

Legacy VTK and ffcg files (docs/cgns-text-format.md) are read, plain or
gzip/zstd compressed (detected from the bytes, not the file name). For ffcg
files the report also lists the ReferenceState quantities and the BC
patches with their role: BCWall-type patches are the near field that
forces, sweep, wall and check use without flags; far-field, symmetry,
inflow and outflow patches are listed for information.`,
	examples: []example{
		{"farforce inspect solution.vtk", "the human-readable summary"},
		{"farforce inspect part0.vtk part1.vtk part2.vtk.gz", "a solution in three partitions"},
		{"farforce inspect --json solution.vtk | jq .arrays", "the machine-readable report (schema " + inspectSchema + ")"},
		{"farforce inspect case.ffcg", "an ffcg file: also its reference state and BC patches"},
	},
	newImpl: func() commandImpl { return &inspectImpl{} },
}

type inspectImpl struct {
	json    bool
	workers int
}

func (c *inspectImpl) define(fs *pflag.FlagSet) {
	fs.BoolVar(&c.json, "json", false, "print the report as JSON (schema "+inspectSchema+")")
	fs.IntVar(&c.workers, "workers", 0, "parallel workers `N` for reading (0 = number of CPUs)")
}

func (c *inspectImpl) run(e *env, args []string) error {
	if len(args) == 0 {
		return usageErr("farforce inspect", "inspect: no input file given")
	}
	if c.workers < 0 {
		return usageErr("farforce inspect", "inspect: --workers must be >= 0, got %d", c.workers)
	}
	prog := newProgress(e)
	prog.step("reading %d file(s)", len(args))
	f, cd, err := loadWithCase(args, readers.Options{Workers: c.workers})
	if err != nil {
		return err
	}
	prog.done()
	rep := buildInspectReport(args, f)
	rep.addCase(cd)
	if c.json {
		return writeJSON(e.stdout, rep)
	}
	writeInspectText(e.stdout, rep)
	return nil
}
