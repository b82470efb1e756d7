package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// vtkFacts is what testdata/vtk/X.json says about X.vtk: written by VTK
// 9.1's own legacy reader when it read the file back (see
// testdata/vtk/README.md and testdata/gen/make_vtk_fixtures.py at the
// module root).
type vtkFacts struct {
	Points   int       `json:"points"`
	Cells    int       `json:"cells"`
	Coords   []float64 `json:"coords"` // x, y, z per point
	CellList []struct {
		Type   int   `json:"type"`
		Points []int `json:"points"`
	} `json:"cell_list"`
	Arrays []struct {
		Name       string `json:"name"`
		Location   string `json:"location"`
		Components int    `json:"components"`
		VTKType    string `json:"vtk_type"`
		NaNCount   int    `json:"nan_count"`
	} `json:"arrays"`
}

// fieldCells returns the number of cells the field model holds for the
// cells VTK listed: poly-vertices (VTK type 2), polylines (4) and triangle
// strips (6) become one vertex, line or triangle per member (the readers'
// documented conversion; a strip of n points holds n-2 triangles, VTK file
// format documentation).
func (v *vtkFacts) fieldCells() int {
	n := 0
	for _, c := range v.CellList {
		switch c.Type {
		case 2:
			n += len(c.Points)
		case 4:
			n += len(c.Points) - 1
		case 6:
			n += len(c.Points) - 2
		default:
			n++
		}
	}
	return n
}

// TestInspectJSONAgainstVTK runs 'inspect --json' on every file written by
// VTK itself and compares points, cells, dimension and arrays with what
// VTK's reader reported for the same file.
func TestInspectJSONAgainstVTK(t *testing.T) {
	files, err := filepath.Glob("../../testdata/vtk/*.vtk")
	if err != nil || len(files) == 0 {
		t.Fatalf("no VTK-written fixtures found in testdata/vtk at the module root (%v)", err)
	}
	compared := 0
	for _, vtk := range files {
		raw, err := os.ReadFile(strings.TrimSuffix(vtk, ".vtk") + ".json")
		if err != nil {
			continue
		}
		compared++
		var want vtkFacts
		if err := json.Unmarshal(raw, &want); err != nil {
			t.Fatalf("%s: %v", vtk, err)
		}
		code, out, errs := runCmd(t, "inspect", "--json", vtk)
		if code != exitOK {
			t.Errorf("%s: exit %d: %s", vtk, code, errs)
			continue
		}
		var got struct {
			Points    int `json:"points"`
			Cells     int `json:"cells"`
			Dimension int `json:"dimension"`
			Arrays    []struct {
				Name       string `json:"name"`
				Location   string `json:"location"`
				Components int    `json:"components"`
				NaN        int    `json:"nan"`
			} `json:"arrays"`
		}
		if err := json.Unmarshal([]byte(out), &got); err != nil {
			t.Fatalf("%s: bad JSON: %v", vtk, err)
		}
		wantDim := 2
		for i := 2; i < len(want.Coords); i += 3 {
			if want.Coords[i] != want.Coords[2] {
				wantDim = 3
			}
		}
		name := filepath.Base(vtk)
		if got.Points != want.Points || got.Cells != want.fieldCells() || got.Dimension != wantDim {
			t.Errorf("%s: points %d cells %d dimension %d; from VTK's reader %d %d %d", name, got.Points, got.Cells, got.Dimension, want.Points, want.fieldCells(), wantDim)
		}
		for _, wa := range want.Arrays {
			if strings.HasPrefix(wa.Name, "vtkGhost") || wa.VTKType == "string" {
				continue // the blank mask; string arrays are not numbers
			}
			found := false
			for _, ga := range got.Arrays {
				if ga.Name == wa.Name && ga.Location == wa.Location {
					found = true
					if ga.Components != wa.Components || ga.NaN != wa.NaNCount {
						t.Errorf("%s: array %q components %d NaN %d; VTK says %d %d", name, wa.Name, ga.Components, ga.NaN, wa.Components, wa.NaNCount)
					}
				}
			}
			if !found {
				t.Errorf("%s: array %q (%s) missing from inspect", name, wa.Name, wa.Location)
			}
		}
	}
	if compared == 0 {
		t.Errorf("none of the %d VTK files has its .json facts beside it: nothing was compared", len(files))
	}
}

// TestForcesRealCylinder runs forces from the command line on the real
// finite-element solution of the 2D-1 cylinder benchmark (Schäfer & Turek
// 1996; testdata/real/README.md at the module root). Reference
// c_D = 5.57953523384 (John & Matthies 2001, quoted there); the README of
// that solution states that a far-field integral on this P2-refined file
// should land within ±0.016 of it on circles (radius 0.075-0.175) and
// squares (side 0.15-0.35) around the cylinder. (Closer surfaces are still
// outside that band: radius 0.1 gives 5.598; see the integrate package.) Coefficients use the mean inflow Ū = 0.2 m/s, ρ = 1, D = 0.1.
func TestForcesRealCylinder(t *testing.T) {
	file := "../../testdata/real/dfg2d1_coarse_tri_p2refined_binary.vtk"
	if _, err := os.Stat(file); err != nil {
		t.Fatalf("committed fixture missing (testdata/real at the module root): %v", err)
	}
	var r forcesJSON
	runJSON(t, &r, "forces", file,
		"--surface", "circle center=0.2,0.2 radius=0.15", "--surface", "rect min=0.05,0.05 max=0.35,0.35",
		"--density", "1", "--viscosity", "1e-3", "--freestream-velocity", "0.2,0,0", "--ref-length", "0.1", "--json")
	const cdRef, tol = 5.57953523384, 0.016
	for _, s := range r.Surfaces {
		if math.Abs(s.Coefficients.Drag-cdRef) > tol {
			t.Errorf("%s: c_D = %.5f, want %.5f ± %g", s.Spec, s.Coefficients.Drag, cdRef, tol)
		}
		// c_L = 0.010618948146 (same source); the solution's own surface
		// and volume integrals give 0.00856 and 0.010448, so only the
		// sign and the order of magnitude are asserted here.
		if s.Coefficients.Lift < 0.005 || s.Coefficients.Lift > 0.02 {
			t.Errorf("%s: c_L = %.5f, want about 0.0106", s.Spec, s.Coefficients.Lift)
		}
		if math.Abs(s.MassImbalance) > 1e-3 {
			t.Errorf("%s: mass imbalance %g on a divergence-free P2 solution", s.Spec, s.MassImbalance)
		}
	}
}
