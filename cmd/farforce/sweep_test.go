package main

import (
	"encoding/csv"
	"encoding/json"
	"encoding/xml"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/integrate"
	"farforce/readers"
)

// The lifting cylinder of VALIDATION.md §3.1a: ρ = 1.3, U = 2, a = 0.7,
// Γ = 3.1, so that the exact force on any contour enclosing the body is
// (0, ρUΓ) = (0, 8.06) N/m (Kutta–Joukowski; Blasius theorem), and on the
// body surface it is all pressure. With --ref-length 1 the coefficients
// are C_D = 0 and C_L = ρUΓ/(½ρU²) = 2Γ/U = 3.1.
const (
	cylRho, cylU, cylA, cylGamma = 1.3, 2.0, 0.7, 3.1
	cylPInf                      = 7.0 // absolute pressure level; must cancel
	cylLift                      = cylRho * cylU * cylGamma
	cylCL                        = 2 * cylGamma / cylU
)

// cylinderFlow is the exact flow of the lifting cylinder.
func cylinderFlow() fieldtest.Potential2D {
	f := fieldtest.Cylinder(cylRho, cylU, cylA, cylGamma)
	f.PInf = cylPInf
	return f
}

// writeCylinderFiles writes the lifting cylinder sampled at the nodes of
// an O-grid (48 × 192 quads from r = a to 5a) to dir/cylinder.vtk, and its
// wall (a 256-sided polygon inscribed in r = a carrying the exact pressure
// and a zero wall shear, since the flow is inviscid) to dir/wall.vtk.
func writeCylinderFiles(t *testing.T, dir string) (vol, wall string) {
	t.Helper()
	flow := cylinderFlow()
	z := fieldtest.Annulus(0, 0, cylA, 5*cylA, 48, 192)
	fieldtest.SampleFlow(z, flow, field.AtPoints)
	w := fieldtest.WallCircle(0, 0, cylA, 0, 256)
	fieldtest.SamplePoints(w, "pressure", 1, func(x [3]float64, d []float64) { d[0] = flow.State(x).P })
	fieldtest.SamplePoints(w, "wall_shear_stress", 3, func(x [3]float64, d []float64) { d[0], d[1], d[2] = 0, 0, 0 })
	vol, wall = filepath.Join(dir, "cylinder.vtk"), filepath.Join(dir, "wall.vtk")
	writeVTKFile(t, vol, z, false)
	writeVTKFile(t, wall, w, true)
	return vol, wall
}

// writeVTKFile writes z to path as binary legacy VTK, POLYDATA when poly.
func writeVTKFile(t *testing.T, path string, z *field.Zone, poly bool) {
	t.Helper()
	out, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	err = readers.WriteVTK(out, z, readers.WriteOptions{Binary: true, PolyData: poly, Title: "farforce cmd test field (closed-form flow, see the test)"})
	if err2 := out.Close(); err == nil {
		err = err2
	}
	if err != nil {
		t.Fatal(err)
	}
}

// cylinderFlags are the flow and reference flags of the lifting cylinder.
func cylinderFlags() []string {
	return []string{"--density", "1.3", "--viscosity", "0", "--freestream-velocity", "2,0,0", "--freestream-pressure", "7", "--ref-length", "1"}
}

// sweepJSON is the part of the sweep report the tests read.
type sweepJSON struct {
	Schema  string `json:"schema"`
	Members []struct {
		Scale         float64        `json:"scale"`
		Spec          string         `json:"spec"`
		Coefficients  integrate.Wind `json:"coefficients"`
		MassImbalance float64        `json:"mass_imbalance"`
		NearFar       *struct {
			DragCounts float64 `json:"drag_counts"`
		} `json:"near_far"`
	} `json:"members"`
	Plateau integrate.Plateau `json:"plateau"`
	Drift   integrate.Drift   `json:"drift"`
	Near    *struct {
		Coefficients integrate.Wind `json:"coefficients"`
	} `json:"near"`
	NearFar *plateauNear `json:"near_far"`
}

func runSweepJSON(t *testing.T, args ...string) sweepJSON {
	t.Helper()
	code, out, errs := runCmd(t, append([]string{"sweep", "--json"}, args...)...)
	if code != exitOK {
		t.Fatalf("sweep: exit %d: %s", code, errs)
	}
	if errs != "" {
		t.Errorf("stderr is not a terminal, yet sweep wrote to it: %q", errs)
	}
	var r sweepJSON
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatalf("bad JSON: %v", err)
	}
	return r
}

// TestSweepExactCylinder sweeps circles and squares around the lifting
// cylinder: every member must give C_D = 0 and C_L = 3.1 (Kutta–Joukowski)
// to the interpolation error, so the plateau covers all members and no
// drift is flagged. The lift tolerance 2e-3 (0.07 % of C_L; about 6e-4 is
// reached) allows for linear interpolation with recovered gradients on
// this grid (the integrate package checks the order); drag vanishes to
// rounding because grid and flow are symmetric about the x axis.
func TestSweepExactCylinder(t *testing.T) {
	vol, wall := writeCylinderFiles(t, t.TempDir())
	for _, base := range []string{"circle center=0,0 radius=1.5", "rect min=-1.2,-1.2 max=1.2,1.2"} {
		r := runSweepJSON(t, append([]string{vol, "--surface", base, "--scales", "0.8:1.6:5", "--wall", wall}, cylinderFlags()...)...)
		if r.Schema != sweepSchema || len(r.Members) != 5 {
			t.Fatalf("%s: schema %q, %d members", base, r.Schema, len(r.Members))
		}
		for _, m := range r.Members {
			if math.Abs(m.Coefficients.Drag) > 1e-9 || math.Abs(m.Coefficients.Lift-cylCL) > 2e-3 {
				t.Errorf("%s scale %g: C_D %.5f C_L %.5f, want 0 and %g", base, m.Scale, m.Coefficients.Drag, m.Coefficients.Lift, cylCL)
			}
			if m.NearFar == nil {
				t.Errorf("%s scale %g: no far - near", base, m.Scale)
			}
		}
		p := r.Plateau
		if p.Members != 5 || p.FirstScale != 0.8 || p.LastScale != 1.6 || r.Members[2].Scale != 1.2 {
			t.Errorf("%s: plateau %+v, want all 5 members", base, p)
		}
		if math.Abs(p.Drag) > 1e-9 || math.Abs(p.Lift-cylCL) > 2e-3 {
			t.Errorf("%s: plateau C_D %.5f C_L %.5f, want 0 and %g", base, p.Drag, p.Lift, cylCL)
		}
		if r.Drift.Flagged {
			t.Errorf("%s: drift flagged on an exact field: %+v", base, r.Drift)
		}
		// Near field on the inscribed 256-gon: all pressure, ρUΓ to O(h²).
		if r.Near == nil || math.Abs(r.Near.Coefficients.Lift-cylCL) > 2e-3 || math.Abs(r.Near.Coefficients.Drag) > 1e-9 {
			t.Errorf("%s: near field %+v, want C_L %g", base, r.Near, cylCL)
		}
		if r.NearFar == nil || math.Abs(r.NearFar.DragCounts) > 20 {
			t.Errorf("%s: plateau - near %+v, want within 20 counts", base, r.NearFar)
		}
	}
}

// TestSweepRealCylinder sweeps circles and squares around the 2D-1
// benchmark cylinder (Schäfer & Turek 1996; testdata/real/README.md at the
// module root) and compares with the wall file. The README states that a
// far-field integral on the P2-refined file should land within ±0.016 of
// c_D = 5.57953523384 (Nabh 1998; John & Matthies 2001) on circles of
// radius 0.075-0.175 and squares of side 0.15-0.35 centred on the
// cylinder, and that the tool should explain the rest: the plateau mean
// must be within that band; members outside it must be left out of the
// plateau or explained by the verdict's notes. Coefficients: ρ = 1,
// Ū = 0.2, D = 0.1.
func TestSweepRealCylinder(t *testing.T) {
	const dir = "../../testdata/real/"
	file := dir + "dfg2d1_coarse_tri_p2refined_binary.vtk"
	if _, err := os.Stat(file); err != nil {
		t.Fatalf("committed fixture missing (testdata/real at the module root): %v", err)
	}
	const cdRef, tol = 5.57953523384, 0.016
	flags := []string{"--density", "1", "--viscosity", "1e-3", "--freestream-velocity", "0.2,0,0", "--ref-length", "0.1", "--wall", dir + "dfg2d1_coarse_wall_ascii.vtk"}
	for _, base := range []string{"circle center=0.2,0.2 radius=0.1", "rect min=0.1,0.1 max=0.3,0.3"} {
		r := runSweepJSON(t, append([]string{file, "--surface", base, "--scales", "0.75:1.75:9"}, flags...)...)
		p := r.Plateau
		t.Logf("%s: plateau members %d-%d (scale %g-%g), C_D %.5f ± %.5f, C_L %.5f; drift %.4g per unit scale (flagged %v); near C_D %.5f",
			base, p.First+1, p.Last+1, p.FirstScale, p.LastScale, p.Drag, p.DragSpread, p.Lift, r.Drift.DragSlope, r.Drift.Flagged, r.Near.Coefficients.Drag)
		if math.Abs(p.Drag-cdRef) > tol {
			t.Errorf("%s: plateau C_D %.5f, want %.5f ± %g", base, p.Drag, cdRef, tol)
		}
		if p.Members < 3 {
			t.Errorf("%s: plateau of %d members, want at least 3", base, p.Members)
		}
		for i, m := range r.Members {
			if math.Abs(m.Coefficients.Drag-cdRef) > tol && i >= p.First && i <= p.Last && !r.Drift.Flagged {
				t.Errorf("%s: member %d (C_D %.5f) outside the README band sits in the plateau without a flagged drift", base, i, m.Coefficients.Drag)
			}
		}
		// The solver's own surface integral is c_D = 5.56159 (README);
		// the wall file integrated with linear interpolation of its P2
		// nodal values must agree to 0.005 (0.1 %).
		if math.Abs(r.Near.Coefficients.Drag-5.56159) > 0.005 {
			t.Errorf("near field C_D %.5f, want 5.56159 ± 0.005", r.Near.Coefficients.Drag)
		}
	}
}

func TestParseScales(t *testing.T) {
	good := map[string][]float64{
		"1,1.25,1.5,2": {1, 1.25, 1.5, 2},
		"1:2:5":        {1, 1.25, 1.5, 1.75, 2},
		" 2 : 1 : 3 ":  {2, 1.5, 1},
	}
	for in, want := range good {
		got, err := parseScales(in)
		if err != nil || len(got) != len(want) {
			t.Errorf("parseScales(%q) = %v, %v; want %v", in, got, err, want)
			continue
		}
		for i := range want {
			if math.Abs(got[i]-want[i]) > 1e-15 {
				t.Errorf("parseScales(%q)[%d] = %g, want %g", in, i, got[i], want[i])
			}
		}
	}
	for _, in := range []string{"", "1,,2", "0,1", "-1,2", "1:2", "1:2:1", "1:2:x", "1:2:3:4", "1,1", "nan,1", "1:2:100000"} {
		if _, err := parseScales(in); err == nil {
			t.Errorf("parseScales(%q) accepted", in)
		}
	}
}

// TestSweepOutputs checks the CSV (header plus one row per member, the
// scale first and the far - near columns last) and the plot files: the
// SVG parses as XML, the PNG decodes.
func TestSweepOutputs(t *testing.T) {
	dir := t.TempDir()
	vol, wall := writeCylinderFiles(t, dir)
	args := append([]string{"sweep", vol, "--surface", "circle center=0,0 radius=1.5", "--scales", "1,1.2,1.4", "--wall", wall}, cylinderFlags()...)
	code, out, errs := runCmd(t, append(args, "--csv")...)
	if code != exitOK {
		t.Fatalf("csv: exit %d: %s", code, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(rows) != 4 {
		t.Fatalf("csv: %d rows, %v", len(rows), err)
	}
	if rows[0][0] != "scale" || rows[0][len(rows[0])-1] != "near_diff_percent" || rows[2][0] != "1.2" {
		t.Errorf("csv header %v, row %v", rows[0], rows[2])
	}
	for _, name := range []string{"sweep.svg", "sweep.png"} {
		plot := filepath.Join(dir, name)
		code, out, errs = runCmd(t, append(args, "--plot", plot)...)
		if code != exitOK || !strings.Contains(out, "Plot written to "+plot) {
			t.Fatalf("%s: exit %d: %s", name, code, errs)
		}
		f, err := os.Open(plot)
		if err != nil {
			t.Fatal(err)
		}
		if strings.HasSuffix(name, ".svg") {
			d := xml.NewDecoder(f)
			for err == nil {
				_, err = d.Token()
			}
			if err.Error() != "EOF" {
				t.Errorf("%s: %v", name, err)
			}
		} else if _, err := png.Decode(f); err != nil {
			t.Errorf("%s: %v", name, err)
		}
		f.Close()
	}
	for _, bad := range [][]string{
		{"--plot", filepath.Join(dir, "x.pdf")},
		{"--scales", "1"},
		{"--json", "--csv"},
		{"--agree-rel", "-1"},
		{"--inside", "circle center=0,0 radius=0.8"}, // with --wall too
	} {
		if code, _, errs := runCmd(t, append(args, bad...)...); code != exitBadInput {
			t.Errorf("%v: exit %d, want 2 (%s)", bad, code, errs)
		}
	}
}

// TestSweepProgressOnTerminal: with stderr a terminal, each step is
// announced on stderr (DESIGN §5); stdout holds the report alone.
func TestSweepProgressOnTerminal(t *testing.T) {
	vol, _ := writeCylinderFiles(t, t.TempDir())
	var out, errb strings.Builder
	e := &env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb, tty: true}
	args := append([]string{"sweep", vol, "--surface", "circle center=0,0 radius=1.5", "--scales", "1,1.2,1.4", "--json"}, cylinderFlags()...)
	if err := dispatch(e, args); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"reading 1 file(s)", "member 1 of 3 (scale 1)", "member 3 of 3 (scale 1.4)"} {
		if !strings.Contains(errb.String(), want) {
			t.Errorf("progress lacks %q:\n%s", want, errb.String())
		}
	}
	if strings.Contains(out.String(), "member 1") || !strings.HasPrefix(out.String(), "{") {
		t.Errorf("progress leaked into stdout")
	}
}

// TestSweepForcesWithoutReferences: without a reference length the
// verdict works on forces (N/m) with the relative band alone: the plateau
// still covers every member at the Kutta–Joukowski lift ρUΓ = 8.06 N/m
// (VALIDATION.md §3.1a; tolerance as in TestSweepExactCylinder, 0.07 %).
func TestSweepForcesWithoutReferences(t *testing.T) {
	vol, _ := writeCylinderFiles(t, t.TempDir())
	code, out, errs := runCmd(t, "sweep", vol, "--surface", "circle center=0,0 radius=1.5", "--scales", "0.8:1.6:4",
		"--density", "1.3", "--viscosity", "0", "--freestream-velocity", "2,0,0", "--freestream-pressure", "7", "--json")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var r struct {
		Quantity string            `json:"quantity"`
		Plateau  integrate.Plateau `json:"plateau"`
		Verdict  struct {
			Band float64 `json:"band"`
		} `json:"verdict"`
	}
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatal(err)
	}
	if r.Quantity != "force" || r.Plateau.Members != 4 || math.Abs(r.Plateau.Lift-cylLift) > 7e-4*cylLift {
		t.Errorf("quantity %q, plateau %+v; want force, 4 members, lift %g", r.Quantity, r.Plateau, cylLift)
	}
	// Band = 0.5 % of the median force (integrate.VerdictOptions).
	if math.Abs(r.Verdict.Band-0.005*r.Plateau.Lift) > 1e-3*r.Verdict.Band {
		t.Errorf("band %g, want 0.5 %% of %g", r.Verdict.Band, r.Plateau.Lift)
	}
}
