package main

import (
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/integrate"
	"farforce/surface"
)

// ellipticWing is the exact Trefftz-plane crossflow of VALIDATION §3.6
// (ρ = 1.225, U∞ = 50, b = 10, Γ₀ = 12, p∞ = 10⁵ Pa).
var ellipticWing = fieldtest.EllipticWake{Rho: 1.225, U: 50, B: 10, Gamma0: 12, PInf: 1e5}

// ellipticFile writes the crossflow sampled at the nodes of a hexahedral
// slab of n × n cells of 0.5 m over |y|, |z| < r + 0.25, so that its nodes
// in y and z sit at the centres of a grid of spacing 0.5 over |y|, |z| < r
// (none on the sheet z = 0).
func ellipticFile(t *testing.T, r float64, n int) string {
	t.Helper()
	z := fieldtest.BoxHex([3]float64{-1, -r - 0.25, -r - 0.25}, [3]float64{1, r + 0.25, r + 0.25}, [3]int{1, n, n})
	fieldtest.SampleFlow(z, ellipticWing, field.AtPoints)
	path := filepath.Join(t.TempDir(), "wing.vtk")
	writeZoneFile(t, path, z)
	return path
}

// wakeJSON is the part of the wake JSON report the tests read.
type wakeJSON struct {
	Schema string `json:"schema"`
	Planes []struct {
		Spec  string `json:"spec"`
		Drags []struct {
			Key, Name, Formula string
			Value              float64
			Coefficient        float64
			HasCoefficient     bool `json:"has_coefficient"`
		} `json:"drags"`
		Crossflow *struct {
			Maskell        float64 `json:"maskell"`
			Lift           float64 `json:"lift"`
			SpanEfficiency float64 `json:"span_efficiency"`
			Loading        []struct{ S1, Gamma float64 }
		} `json:"crossflow"`
	} `json:"planes"`
}

// TestWakeCommandElliptic runs wake on the sampled elliptic wing: the
// grid points coincide with mesh nodes, so the file round trip, mapping
// and sampling must reproduce integrate.Crossflow on the exact flow over
// the same grid to rounding (1e-9), and the figures lie near the exact
// D_i = πρΓ₀²/8 and L = (π/4)ρU∞bΓ₀ within the first-order grid error
// measured by TestTrefftzElliptic at h = 0.5 (Maskell 7.2 %, lift 0.12 %;
// neither depends on the plane's size once it holds all the vorticity).
func TestWakeCommandElliptic(t *testing.T) {
	path := ellipticFile(t, 10, 41)
	spec := "x=0.3 ymin=-10 ymax=10 zmin=-10 zmax=10"
	var r wakeJSON
	runJSON(t, &r, "wake", path, "--plane", spec, "--speed", "50", "--freestream-density", "1.225",
		"--freestream-pressure", "1e5", "--ref-area", "12", "--span", "10", "--grid", "40x40", "--json")
	if r.Schema != wakeSchema || len(r.Planes) != 1 || r.Planes[0].Crossflow == nil {
		t.Fatalf("schema %q, %d planes", r.Schema, len(r.Planes))
	}
	cf := r.Planes[0].Crossflow
	// Reference: the exact flow on the same grid.
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{fieldtest.BoxHex([3]float64{-1, -10.25, -10.25}, [3]float64{1, 10.25, 10.25}, [3]int{1, 3, 3})}})
	if err != nil {
		t.Fatal(err)
	}
	pl, err := surface.ParsePlane(spec)
	if err != nil {
		t.Fatal(err)
	}
	g, err := surface.PlaneGridOf(l, pl, 40, 40)
	if err != nil {
		t.Fatal(err)
	}
	ref, err := integrate.Crossflow(g, ellipticWing, integrate.WakeOptions{Options: integrate.Options{
		Free: integrate.Freestream{V: integrate.Vec3{50, 0, 0}, Rho: 1.225, P: 1e5}}, Span: 10})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{{"Maskell", cf.Maskell, ref.Maskell}, {"lift", cf.Lift, ref.Lift}, {"e", cf.SpanEfficiency, ref.SpanEfficiency}} {
		if math.Abs(c.got-c.want) > 1e-9*math.Abs(c.want) {
			t.Errorf("%s: command %.15g, direct %.15g", c.name, c.got, c.want)
		}
	}
	if d := cf.Maskell/69.27211801165 - 1; math.Abs(d) > 0.08 {
		t.Errorf("Maskell %g off D_i by %.3g", cf.Maskell, d)
	}
	if d := cf.Lift/5772.67650097 - 1; math.Abs(d) > 0.002 {
		t.Errorf("lift %g off L by %.3g", cf.Lift, d)
	}
	keys := map[string]bool{}
	for _, d := range r.Planes[0].Drags {
		keys[d.Key] = d.HasCoefficient
	}
	for _, k := range []string{integrate.WakeMomentum, integrate.WakeDeficit, integrate.WakeBetz, integrate.WakeJones, integrate.WakeMaskell, integrate.WakeInducedTail} {
		if has, ok := keys[k]; !ok || !has {
			t.Errorf("drag %s missing or without coefficient (%v)", k, ok)
		}
	}
}

// TestWakeCommandOutputs checks the text and CSV forms and the usage
// errors.
func TestWakeCommandOutputs(t *testing.T) {
	path := ellipticFile(t, 10, 41)
	plot, vtk := filepath.Join(t.TempDir(), "loading.svg"), filepath.Join(t.TempDir(), "plane.vtk")
	base := []string{"wake", path, "--plane", "x=0.3 ymin=-10 ymax=10 zmin=-10 zmax=10", "--plane", "x=-0.2 ymin=-8 ymax=8 zmin=-5 zmax=5",
		"--speed", "50", "--freestream-density", "1.225", "--freestream-pressure", "1e5", "--grid", "40"}
	code, out, errs := runCmd(t, append(base, "--plot", plot, "--write-plane", vtk)...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, f := range []string{plot, vtk, strings.TrimSuffix(vtk, ".vtk") + "-2.vtk"} {
		if st, err := os.Stat(f); err != nil || st.Size() == 0 {
			t.Errorf("%s not written: %v", f, err)
		}
	}
	for _, s := range []string{"Plane 1: plane x=0.3", "Plane 2: plane x=-0.2", "induced drag, Maskell", "Betz profile drag", "span efficiency", notice} {
		if !strings.Contains(out, s) {
			t.Errorf("text report lacks %q:\n%s", s, out)
		}
	}
	code, out, errs = runCmd(t, append(base, "--csv")...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	// Header, then per plane 7 cut figures + 3 induced + the split total + lift + e.
	if len(rows) != 1+2*13 || rows[0][0] != "plane" {
		t.Errorf("%d CSV rows:\n%s", len(rows), out)
	}
	for _, bad := range [][]string{
		{"wake", path, "--speed", "50"},
		{"wake", path, "--plane", "x=1 ymin=3", "--speed", "50"},
		{"wake", path, "--plane", "x=0", "--speed", "50", "--form", "plain"},
		{"wake", path, "--plane", "x=0", "--speed", "50", "--grid", "1x5"},
		{"wake", path, "--plane", "x=0", "--speed", "50", "--gamma", "0.9"},
		{"wake", path, "--plane", "x=0 ymin=-30 ymax=30 zmin=-1 zmax=1", "--speed", "50", "--freestream-density", "1.2"},
		{"wake", path, "--plane", "x=0", "--speed", "50", "--plot", "a.pdf"},
	} {
		if code, _, errs := runCmd(t, bad...); code != exitBadInput {
			t.Errorf("%v: exit %d (%s), want %d", bad[2:], code, errs, exitBadInput)
		}
	}
}
