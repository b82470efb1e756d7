package main

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"strings"
	"testing"
)

// TestForcesWithNear: forces with --wall (and with --inside) reports the
// near field and far − near per surface. On the lifting cylinder
// (VALIDATION.md §3.1a) both are ρUΓ in lift and 0 in drag, so far − near
// is the interpolation error: below 1e-2 in C_L (0.3 %) and 1 drag count
// (about 0.3 counts on the off-centre rectangle, 0 to rounding on the
// centred circle by symmetry).
func TestForcesWithNear(t *testing.T) {
	vol, wall := writeCylinderFiles(t, t.TempDir())
	base := append([]string{"forces", vol, "--surface", "circle center=0,0 radius=1.5", "--surface", "rect min=-2,-1.5 max=2.5,1.5"}, cylinderFlags()...)
	for _, src := range [][]string{{"--wall", wall}, {"--inside", "circle center=0,0 radius=0.735"}} {
		code, out, errs := runCmd(t, append(append(base, src...), "--json")...)
		if code != exitOK {
			t.Fatalf("%v: exit %d: %s", src, code, errs)
		}
		var r struct {
			Surfaces []json.RawMessage `json:"surfaces"`
			Near     struct {
				Source       string `json:"source"`
				Coefficients struct{ Drag, Lift float64 }
			} `json:"near"`
			NearFar []struct {
				Coefficients struct{ Drag, Lift float64 }
				DragCounts   float64 `json:"drag_counts"`
			} `json:"near_far"`
		}
		if err := json.Unmarshal([]byte(out), &r); err != nil {
			t.Fatal(err)
		}
		// The near field itself: 2e-3 relative in C_L, the band
		// TestWallExactCylinder gives the volume-mesh source (the wall
		// file is within 3e-4 there).
		if len(r.Surfaces) != 2 || len(r.NearFar) != 2 || math.Abs(r.Near.Coefficients.Lift-cylCL) > 2e-3*cylCL {
			t.Fatalf("%v: %d surfaces, %d differences, near %+v", src, len(r.Surfaces), len(r.NearFar), r.Near)
		}
		for i, d := range r.NearFar {
			if math.Abs(d.Coefficients.Lift) > 1e-2 || math.Abs(d.DragCounts) > 1 {
				t.Errorf("%v surface %d: far - near %+v, want ≈ 0", src, i+1, d)
			}
		}
	}
	code, out, _ := runCmd(t, append(base, "--wall", wall, "--csv")...)
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if code != exitOK || err != nil || len(rows) != 3 || rows[0][len(rows[0])-1] != "near_diff_percent" || len(rows[1]) != len(rows[0]) {
		t.Errorf("csv: exit %d, %v, rows %v", code, err, rows)
	}
	code, out, _ = runCmd(t, append(base, "--wall", wall)...)
	for _, want := range []string{"Near field: wall file", "Far field against near field", "far - near (surface 2)", notice} {
		if code != exitOK || !strings.Contains(out, want) {
			t.Errorf("text output lacks %q", want)
		}
	}
	if strings.Count(out, notice) != 1 {
		t.Errorf("the notice appears %d times", strings.Count(out, notice))
	}
}
