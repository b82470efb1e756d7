package main

import (
	"math"
	"os"
	"strings"
	"testing"

	"farforce/integrate"
	"farforce/surface"
)

// wallJSON is the part of the wall report the tests read.
type wallJSON struct {
	Schema string `json:"schema"`
	Near   struct {
		Source               string            `json:"source"`
		Arrays               map[string]string `json:"arrays"`
		Pressure             [3]float64        `json:"pressure"`
		Friction             [3]float64        `json:"friction"`
		Coefficients         integrate.Wind    `json:"coefficients"`
		PressureCoefficients integrate.Wind    `json:"pressure_coefficients"`
		FrictionCoefficients integrate.Wind    `json:"friction_coefficients"`
		Facets               int               `json:"facets"`
	} `json:"near"`
}

func runWallJSON(t *testing.T, args ...string) wallJSON {
	t.Helper()
	var r wallJSON
	runJSON(t, &r, append([]string{"wall", "--json"}, args...)...)
	return r
}

// TestWallExactCylinder: on the body of the lifting cylinder the force is
// all pressure, (0, ρUΓ) (Kutta–Joukowski; VALIDATION.md §3.1a, "near
// field on r = a"), both from the wall file (exact pressure on an
// inscribed 256-gon: O(h²) error, within 3e-4 relative) and from the
// volume mesh, whose boundary edges inside r = 1.05 a are the body's
// (sampled, interpolated pressure: within 2e-3 relative).
func TestWallExactCylinder(t *testing.T) {
	dir := t.TempDir()
	vol, wall := writeCylinderFiles(t, dir)
	r := runWallJSON(t, "--wall", wall, "--freestream-density", "1.3", "--freestream-velocity", "2,0,0", "--freestream-pressure", "7", "--ref-length", "1")
	if r.Schema != wallSchema || r.Near.Source != "wall file" || r.Near.Arrays["pressure"] != "pressure" || r.Near.Arrays["shear"] != "wall_shear_stress" {
		t.Errorf("report %+v", r)
	}
	if math.Abs(r.Near.Coefficients.Lift-cylCL) > 3e-4*cylCL || math.Abs(r.Near.Coefficients.Drag) > 1e-12 || r.Near.Friction != [3]float64{} {
		t.Errorf("wall file: C_D %g C_L %.6f friction %v; want 0, %g, 0", r.Near.Coefficients.Drag, r.Near.Coefficients.Lift, r.Near.Friction, cylCL)
	}
	r = runWallJSON(t, append([]string{vol, "--inside", "circle center=0,0 radius=0.735"}, cylinderFlags()...)...)
	if r.Near.Source != "volume mesh" || r.Near.Facets != 192 {
		t.Errorf("volume: source %q, %d faces; want 192 (the inner ring)", r.Near.Source, r.Near.Facets)
	}
	if math.Abs(r.Near.Coefficients.Lift-cylCL) > 2e-3*cylCL || math.Abs(r.Near.Coefficients.Drag) > 1e-9 {
		t.Errorf("volume: C_D %g C_L %.6f, want 0, %g", r.Near.Coefficients.Drag, r.Near.Coefficients.Lift, cylCL)
	}
}

// TestWallRealCylinder integrates the wall file of the 2D-1 benchmark
// solution and the same wall taken from the volume mesh. The README of
// the solution (testdata/real/README.md at the module root) gives the
// solver's own surface integral, c_D = 5.56159, c_L = 0.00856, and the
// published c_D = 5.57953523384 (Nabh 1998; John & Matthies 2001). The
// wall file (nodal P2 values, integrated piecewise linearly) must match
// the solver's surface integral to 0.005 (0.1 %), and both must be
// within 0.03 (0.5 %) of the published value: a coarse solution's wall
// integral converges slower than its volume integral (Giles, Larson,
// Levenstam & Süli 1997, from memory).
func TestWallRealCylinder(t *testing.T) {
	const dir = "../../testdata/real/"
	if _, err := os.Stat(dir + "dfg2d1_coarse_tri_p2refined_binary.vtk"); err != nil {
		t.Fatalf("committed fixture missing (testdata/real at the module root): %v", err)
	}
	ref := []string{"--freestream-velocity", "0.2,0,0", "--ref-length", "0.1"}
	w := runWallJSON(t, append([]string{"--wall", dir + "dfg2d1_coarse_wall_ascii.vtk", "--freestream-density", "1"}, ref...)...)
	v := runWallJSON(t, append([]string{dir + "dfg2d1_coarse_tri_p2refined_binary.vtk", "--inside", "circle center=0.2,0.2 radius=0.07", "--density", "1", "--viscosity", "1e-3"}, ref...)...)
	t.Logf("wall file: C_D %.5f (pressure %.5f, friction %.5f), C_L %.5f; volume mesh: C_D %.5f (pressure %.5f, friction %.5f), C_L %.5f",
		w.Near.Coefficients.Drag, w.Near.PressureCoefficients.Drag, w.Near.FrictionCoefficients.Drag, w.Near.Coefficients.Lift,
		v.Near.Coefficients.Drag, v.Near.PressureCoefficients.Drag, v.Near.FrictionCoefficients.Drag, v.Near.Coefficients.Lift)
	if d := w.Near.Coefficients.Drag; math.Abs(d-5.56159) > 0.005 {
		t.Errorf("wall file C_D %.5f, want 5.56159 ± 0.005", d)
	}
	if d := w.Near.Coefficients.Lift; math.Abs(d-0.00856) > 0.001 {
		t.Errorf("wall file C_L %.5f, want 0.00856 ± 0.001", d)
	}
	for _, r := range []wallJSON{w, v} {
		if d := r.Near.Coefficients.Drag; math.Abs(d-5.57953523384) > 0.03 {
			t.Errorf("%s: C_D %.5f, want 5.5795 ± 0.03", r.Near.Source, d)
		}
	}
}

// TestWallBadInput: conflicting or missing sources and unusable wall
// files exit with code 2.
func TestWallBadInput(t *testing.T) {
	dir := t.TempDir()
	vol, wall := writeCylinderFiles(t, dir)
	fl := cylinderFlags()
	for _, tc := range []struct {
		args []string
		want string
	}{
		{fl, "give --wall FILE"},
		{append([]string{"--wall", wall, "--inside", "circle center=0,0 radius=1"}, fl...), "not both"},
		{append([]string{vol, "--wall", wall}, fl...), "takes no volume files"},
		{append([]string{"--inside", "circle center=0,0 radius=1"}, fl...), "needs the volume"},
		{append([]string{"--wall", wall, "--wall-pressure", "nosuch"}, fl...), "nosuch"},
		{append([]string{"--wall", vol}, fl...), "wall"},
		{append([]string{vol, "--inside", "circle center=5,5 radius=0.1"}, fl...), "encloses no boundary face"},
		{append([]string{vol, "--wall-shear", "tau"}, fl...), "need --wall"},
		{[]string{"--wall", wall, "--freestream-velocity", "2,0,0", "--ref-length", "1"}, "--freestream-density"},
	} {
		code, _, errs := runCmd(t, append([]string{"wall"}, tc.args...)...)
		if code != exitBadInput || !strings.Contains(errs, tc.want) {
			t.Errorf("%v: exit %d, stderr %q; want 2 and %q", tc.args, code, errs, tc.want)
		}
	}
}

// TestInsideTest checks the inside test of --inside against the exact
// shapes: points at 0.98 and 1.02 of the radius, the centre and a far
// point.
func TestInsideTest(t *testing.T) {
	for _, spec := range []string{"circle center=1,0.5 radius=2", "sphere center=0.5,0,-0.5 radius=2"} {
		s, err := surface.ParseSpec(spec)
		if err != nil {
			t.Fatal(err)
		}
		dim, c := s.Dim(), s.Pivot()
		in, err := newInsideTest(s, dim)
		if err != nil {
			t.Fatal(err)
		}
		for _, d := range [][3]float64{{1, 0, 0}, {0, -1, 0}, {0.6, 0.8, 0}, {0, 0.6, 0.8}} {
			if dim == 2 && d[2] != 0 {
				continue
			}
			for _, k := range []struct {
				r    float64
				want bool
			}{{0.98 * 2, true}, {1.02 * 2, false}, {0, true}, {5, false}} {
				p := [3]float64{c[0] + k.r*d[0], c[1] + k.r*d[1], c[2] + k.r*d[2]}
				if got := in(p); got != k.want {
					t.Errorf("%s: inside(%v) = %v, want %v", spec, p, got, k.want)
				}
			}
		}
	}
}
