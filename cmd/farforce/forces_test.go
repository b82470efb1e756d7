package main

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/readers"
)

// restZone is a 2D field at rest (V = 0) with the linear pressure
// p = 5 - 3x + 2y on quads over [0,2]×[0,1]. By Gauss's divergence theorem
// the force on the region inside any closed contour of area A is
// F = -∮ p n dl = -∫ ∇p dA = (3, -2)·A.
func restZone() *field.Zone {
	z := fieldtest.RectQuad([2]float64{0, 0}, [2]float64{2, 1}, [2]int{8, 4})
	fieldtest.SamplePoints(z, "U", 3, func(x [3]float64, d []float64) { d[0], d[1], d[2] = 0, 0, 0 })
	fieldtest.SamplePoints(z, "p", 1, func(x [3]float64, d []float64) { d[0] = 5 - 3*x[0] + 2*x[1] })
	return z
}

// writeZoneFile writes z as legacy VTK to path.
func writeZoneFile(t *testing.T, path string, z *field.Zone) {
	t.Helper()
	f, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := readers.WriteVTK(f, z, readers.WriteOptions{Title: "farforce cmd test: fluid at rest, p = 5 - 3x + 2y"}); err != nil {
		t.Fatal(err)
	}
	if err := f.Close(); err != nil {
		t.Fatal(err)
	}
}

// pressureBoxFile writes restZone to a temporary file and returns its path.
func pressureBoxFile(t *testing.T) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "rest.vtk")
	writeZoneFile(t, path, restZone())
	return path
}

// TestForcesGolden pins the text report on testdata/rest.vtk (restZone;
// both regenerated with -update). The force there is exact: (1.5, -1) on
// the 1 × 0.5 rectangle.
func TestForcesGolden(t *testing.T) {
	file := filepath.Join("testdata", "rest.vtk")
	golden := filepath.Join("testdata", "forces_rest.golden")
	if *update {
		writeZoneFile(t, file, restZone())
	}
	code, out, errs := runCmd(t, "forces", file, "--surface", "rect min=0.5,0.25 max=1.5,0.75",
		"--density", "1", "--speed", "2", "--alpha", "30", "--ref-length", "0.5", "--moment-center", "1,0.5,0")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	checkGolden(t, golden, out, "forces output")
}

// forcesJSON is the part of the forces JSON report the tests read.
type forcesJSON struct {
	Schema string `json:"schema"`
	Setup  struct {
		Dimension  int `json:"dimension"`
		Freestream struct {
			Velocity [3]float64 `json:"velocity"`
			Density  float64    `json:"density"`
		} `json:"freestream"`
	} `json:"setup"`
	Surfaces []struct {
		Spec  string     `json:"spec"`
		Force [3]float64 `json:"force"`
		Terms struct {
			Momentum, Pressure, Viscous [3]float64
		} `json:"terms"`
		Moment        [3]float64 `json:"moment"`
		Wind          struct{ Drag, Lift, Side float64 }
		Coefficients  struct{ Drag, Lift, Side float64 }
		MassImbalance float64 `json:"mass_imbalance"`
		Facets        int     `json:"facets"`
	} `json:"surfaces"`
	Notice string `json:"notice"`
}

func TestForcesPressureOnlyJSON(t *testing.T) {
	path := pressureBoxFile(t)
	var r forcesJSON
	runJSON(t, &r, "forces", path, "--surface", "rect min=0.5,0.25 max=1.5,0.75",
		"--surface", "circle center=1,0.5 radius=0.4 facets=64", "--density", "1", "--speed", "2", "--ref-length", "0.5", "--json")
	if r.Schema != forcesSchema || r.Setup.Dimension != 2 || len(r.Surfaces) != 2 || r.Notice != notice {
		t.Fatalf("schema %q dimension %d surfaces %d notice %q", r.Schema, r.Setup.Dimension, len(r.Surfaces), r.Notice)
	}
	if r.Setup.Freestream.Velocity != [3]float64{2, 0, 0} || r.Setup.Freestream.Density != 1 {
		t.Errorf("freestream echoed as %+v", r.Setup.Freestream)
	}
	// Areas: the rectangle 1 × 0.5; the inscribed 64-gon of radius 0.4,
	// A = ½ N r² sin(2π/N) (elementary geometry). Tolerance: rounding of
	// sums of a few hundred terms of order 1.
	areas := []float64{0.5, 0.5 * 64 * 0.16 * math.Sin(2*math.Pi/64)}
	for i, s := range r.Surfaces {
		want := [3]float64{3 * areas[i], -2 * areas[i], 0}
		for k := 0; k < 3; k++ {
			if math.Abs(s.Force[k]-want[k]) > 1e-12 || math.Abs(s.Terms.Pressure[k]-want[k]) > 1e-12 {
				t.Errorf("%s: force %v pressure term %v, want %v (divergence theorem)", s.Spec, s.Force, s.Terms.Pressure, want)
			}
			if s.Terms.Momentum[k] != 0 || s.Terms.Viscous[k] != 0 {
				t.Errorf("%s: fluid at rest and inviscid, but momentum %v viscous %v", s.Spec, s.Terms.Momentum, s.Terms.Viscous)
			}
		}
		// Drag along +x, lift along +y (2D default up axis); C = F/(q S)
		// with q = ½·1·2² = 2 and S = 0.5 (DESIGN §2).
		if math.Abs(s.Wind.Drag-want[0]) > 1e-12 || math.Abs(s.Wind.Lift-want[1]) > 1e-12 ||
			math.Abs(s.Coefficients.Drag-want[0]/1) > 1e-12 || math.Abs(s.Coefficients.Lift-want[1]/1) > 1e-12 {
			t.Errorf("%s: wind %+v coefficients %+v, want drag %g lift %g, C = F/1", s.Spec, s.Wind, s.Coefficients, want[0], want[1])
		}
		if s.Facets == 0 {
			t.Errorf("%s: no facets reported", s.Spec)
		}
	}
}

// TestForcesWorkersIdentical checks the same bits for 1 and 2 workers
// (rules.md point 7).
func TestForcesWorkersIdentical(t *testing.T) {
	var outs []string
	for _, w := range []string{"1", "2"} {
		code, out, errs := runCmd(t, "forces", "testdata/strut.vtk.gz", "--surface", "circle center=0,0 radius=0.3",
			"--density", "998.2", "--viscosity", "1.002e-3", "--speed", "1.5", "--ref-length", "0.1", "--csv", "--workers", w)
		if code != exitOK {
			t.Fatalf("workers %s: exit %d: %s", w, code, errs)
		}
		outs = append(outs, out)
	}
	if outs[0] != outs[1] {
		t.Errorf("1 and 2 workers differ:\n%s\n%s", outs[0], outs[1])
	}
}

func TestForcesTextAndCSV(t *testing.T) {
	path := pressureBoxFile(t)
	args := []string{"forces", path, "--surface", "rect min=0.5,0.25 max=1.5,0.75", "--density", "1", "--speed", "2"}
	code, out, errs := runCmd(t, args...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, want := range []string{"freestream velocity", "(2, 0, 0) m/s", "density", "1 kg/m³", "wind axes", "Surface 1: rect",
		"momentum flux", "pressure", "viscous", "total", "1.50000", "-1.00000", "mass closure", "coefficients: none"} {
		if !strings.Contains(out, want) {
			t.Errorf("text report lacks %q:\n%s", want, out)
		}
	}
	if !strings.HasSuffix(out, notice+"\n") {
		t.Errorf("text report does not end with the notice")
	}
	code, out, errs = runCmd(t, append(args, "--csv")...)
	if code != exitOK {
		t.Fatalf("csv: exit %d: %s", code, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(rows) != 2 || len(rows[1]) != len(csvHeader) {
		t.Fatalf("csv: %v, rows %q", err, rows)
	}
	col := map[string]string{}
	for i, h := range rows[0] {
		col[h] = rows[1][i]
	}
	// F_x = 3·A with A = 0.5 (divergence theorem, see pressureBoxFile).
	if fx, err := strconv.ParseFloat(col["force_x"], 64); err != nil || math.Abs(fx-1.5) > 1e-12 {
		t.Errorf("csv force_x = %q, want 1.5", col["force_x"])
	}
	if col["cd"] != "" {
		t.Errorf("csv cd = %q without a reference length, want blank", col["cd"])
	}
	if !strings.Contains(errs, notice) {
		t.Errorf("csv: the notice should go to stderr, got %q", errs)
	}
}

func TestForcesBadInput(t *testing.T) {
	path := pressureBoxFile(t)
	tests := []struct {
		name string
		args []string
		want string
	}{
		{"surface leaves the mesh", []string{"--surface", "circle center=1,0.5 radius=0.8", "--density", "1", "--speed", "1"}, "surface"},
		{"no density", []string{"--surface", "circle center=1,0.5 radius=0.3", "--speed", "1"}, "density"},
		{"missing velocity array", []string{"--surface", "circle center=1,0.5 radius=0.3", "--density", "1", "--speed", "1", "--velocity", "W"}, "W"},
		{"3D surface in 2D field", []string{"--surface", "sphere center=1,0.5,0 radius=0.3", "--density", "1", "--speed", "1"}, "2D"},
	}
	for _, tc := range tests {
		code, _, errs := runCmd(t, append([]string{"forces", path}, tc.args...)...)
		if code != exitBadInput || !strings.Contains(errs, tc.want) {
			t.Errorf("%s: exit %d, stderr %q; want exit 2 mentioning %q", tc.name, code, errs, tc.want)
		}
	}
}

// TestWriteSurface checks that the written cut surface holds one cell per
// piece whose force densities times areas add up to the reported force.
func TestWriteSurface(t *testing.T) {
	path := pressureBoxFile(t)
	out := filepath.Join(t.TempDir(), "cut.vtk")
	code, stdout, errs := runCmd(t, "forces", path, "--surface", "circle center=1,0.5 radius=0.4", "--density", "1", "--speed", "2",
		"--json", "--write-surface", out)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var r forcesJSON
	if err := json.Unmarshal([]byte(stdout), &r); err != nil {
		t.Fatal(err)
	}
	f, err := readers.ReadFile(out, readers.Options{})
	if err != nil {
		t.Fatal(err)
	}
	z := f.Zones[0]
	area, total := z.Array("area"), z.Array("total")
	if area == nil || total == nil || z.NumCells() == 0 {
		t.Fatalf("written surface lacks arrays or cells: %d cells", z.NumCells())
	}
	var sum [3]float64
	for c := 0; c < z.NumCells(); c++ {
		if z.Types[c] != field.Line {
			t.Fatalf("cell %d is a %s, want a line in 2D", c, z.Types[c])
		}
		for k := 0; k < 3; k++ {
			sum[k] += total.Data[3*c+k] * area.Data[c]
		}
	}
	for k := 0; k < 3; k++ {
		if math.Abs(sum[k]-r.Surfaces[0].Force[k]) > 1e-12 {
			t.Errorf("Σ density·area = %v, reported force %v", sum, r.Surfaces[0].Force)
		}
	}
	matches, _ := filepath.Glob(filepath.Join(filepath.Dir(out), ".cut.vtk.tmp*"))
	if len(matches) > 0 {
		t.Errorf("temporary files left behind: %v", matches)
	}
}

// TestForces3DPressureOnly checks the 3D path (box surface, reference area,
// side force) on a fluid at rest with p = 1 + 2x - y + 3z on hexahedra:
// F = -∫∇p dV = -(2, -1, 3)·V by the divergence theorem, V the box volume.
func TestForces3DPressureOnly(t *testing.T) {
	z := fieldtest.BoxHex([3]float64{0, 0, 0}, [3]float64{2, 2, 2}, [3]int{4, 4, 4})
	fieldtest.SamplePoints(z, "U", 3, func(x [3]float64, d []float64) { d[0], d[1], d[2] = 0, 0, 0 })
	fieldtest.SamplePoints(z, "p", 1, func(x [3]float64, d []float64) { d[0] = 1 + 2*x[0] - x[1] + 3*x[2] })
	path := filepath.Join(t.TempDir(), "rest3d.vtk")
	writeZoneFile(t, path, z)
	var r forcesJSON
	runJSON(t, &r, "forces", path, "--surface", "box min=0.5,0.5,0.5 max=1.5,1.25,1.75",
		"--density", "1", "--freestream-velocity", "1,0,0", "--ref-area", "0.5", "--json")
	if r.Setup.Dimension != 3 || len(r.Surfaces) != 1 {
		t.Fatalf("dimension %d, %d surfaces", r.Setup.Dimension, len(r.Surfaces))
	}
	s := r.Surfaces[0]
	const vol = 1 * 0.75 * 1.25
	want := [3]float64{-2 * vol, vol, -3 * vol}
	for k := 0; k < 3; k++ {
		if math.Abs(s.Force[k]-want[k]) > 1e-12 {
			t.Errorf("force %v, want %v", s.Force, want)
		}
	}
	// Wind axes for V∞ = +x and up = +z: drag +x, lift +z, side = lift ×
	// drag = +y (DESIGN §2); q∞ = ½·1·1², C = F/(q∞·0.5).
	qs := 0.5 * 0.5
	if math.Abs(s.Wind.Drag-want[0]) > 1e-12 || math.Abs(s.Wind.Lift-want[2]) > 1e-12 || math.Abs(s.Wind.Side-want[1]) > 1e-12 {
		t.Errorf("wind %+v, want drag %g lift %g side %g", s.Wind, want[0], want[2], want[1])
	}
	if math.Abs(s.Coefficients.Drag-want[0]/qs) > 1e-12 || math.Abs(s.Coefficients.Side-want[1]/qs) > 1e-12 {
		t.Errorf("coefficients %+v, want C_D %g C_S %g", s.Coefficients, want[0]/qs, want[1]/qs)
	}
}
