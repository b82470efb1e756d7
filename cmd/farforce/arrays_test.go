package main

import (
	"os"
	"path/filepath"
	"slices"
	"testing"

	"github.com/spf13/pflag"
)

// TestLoadPreparedSkipsUnneededArrays checks that a flow command keeps only
// the arrays its mapping can use (issue requirement: arrays the command
// does not need are skipped, not converted). The file carries an extra
// array "dye" that no flag names and no guess picks, plus a named one.
func TestLoadPreparedSkipsUnneededArrays(t *testing.T) {
	const vtk = `# vtk DataFile Version 4.2
two triangles
ASCII
DATASET UNSTRUCTURED_GRID
POINTS 4 double
0 0 0 1 0 0 1 1 0 0 1 0
CELLS 2 8
3 0 1 2
3 0 2 3
CELL_TYPES 2
5
5
POINT_DATA 4
VECTORS U double
1 0 0 1 0 0 1 0 0 1 0 0
SCALARS p double 1
LOOKUP_TABLE default
0 0 0 0
SCALARS dye double 1
LOOKUP_TABLE default
1 2 3 4
SCALARS visc double 1
LOOKUP_TABLE default
1e-3 1e-3 1e-3 1e-3
`
	path := filepath.Join(t.TempDir(), "tri.vtk")
	if err := os.WriteFile(path, []byte(vtk), 0o644); err != nil {
		t.Fatal(err)
	}
	var fl flowFlags
	fs := pflag.NewFlagSet("t", pflag.ContinueOnError)
	fl.define(fs)
	if err := fs.Parse([]string{"--viscosity", "visc", "--density", "1", "--speed", "1"}); err != nil {
		t.Fatal(err)
	}
	if err := fl.check(fs); err != nil {
		t.Fatal(err)
	}
	p, err := loadPrepared(&progress{}, fs, &fl, []string{path})
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, a := range p.loc.Field().Zones[0].Arrays {
		names = append(names, a.Name)
	}
	slices.Sort(names)
	if want := []string{"U", "p", "visc"}; !slices.Equal(names, want) {
		t.Errorf("arrays kept %v, want %v", names, want)
	}
}
