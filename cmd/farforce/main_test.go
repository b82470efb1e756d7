package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// runCmd runs the program with args and returns the exit code and both
// streams.
func runCmd(t *testing.T, args ...string) (int, string, string) {
	t.Helper()
	var out, errb bytes.Buffer
	code := run(args, strings.NewReader(""), &out, &errb)
	return code, out.String(), errb.String()
}

// runJSON runs the program with args, fails the test unless it exits with
// exitOK, and decodes its standard output (a JSON report) into dst.
func runJSON(t *testing.T, dst any, args ...string) {
	t.Helper()
	code, out, errs := runCmd(t, args...)
	if code != exitOK {
		t.Fatalf("%v: exit %d: %s", args, code, errs)
	}
	if err := json.Unmarshal([]byte(out), dst); err != nil {
		t.Fatalf("%v: bad JSON: %v\n%s", args, err, out)
	}
}

// checkGolden compares out with the golden file, first rewriting that
// file with out under -update; what names the output in the failure.
func checkGolden(t *testing.T, golden, out, what string) {
	t.Helper()
	if *update {
		if err := os.WriteFile(golden, []byte(out), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatalf("%v (run with -update to create it)", err)
	}
	if out != string(want) {
		t.Errorf("%s differs from %s:\n--- got\n%s--- want\n%s", what, golden, out, want)
	}
}

func TestHelpOfEveryCommand(t *testing.T) {
	for _, c := range commands {
		for _, args := range [][]string{{c.name, "--help"}, {c.name, "-h"}, {"help", c.name}} {
			code, out, errs := runCmd(t, args...)
			if code != exitOK {
				t.Errorf("%v: exit %d, stderr %q", args, code, errs)
			}
			if !strings.Contains(out, "Examples:") || !strings.Contains(out, "farforce "+c.name) || !strings.Contains(out, "--help") {
				t.Errorf("%v: help lacks examples, usage or flags:\n%s", args, out)
			}
		}
	}
	for _, args := range [][]string{{"--help"}, {"-h"}, {"help"}} {
		code, out, _ := runCmd(t, args...)
		if code != exitOK || !strings.Contains(out, "Commands:") || !strings.Contains(out, "Examples:") {
			t.Errorf("%v: exit %d, output:\n%s", args, code, out)
		}
	}
}

func TestVersion(t *testing.T) {
	for _, args := range [][]string{{"--version"}, {"-V"}, {"version"}} {
		code, out, _ := runCmd(t, args...)
		if code != exitOK || !strings.HasPrefix(out, "farforce "+version) {
			t.Errorf("%v: exit %d, output %q", args, code, out)
		}
	}
}

func TestBadUsage(t *testing.T) {
	tests := [][]string{
		{},
		{"frobnicate"},
		{"--frobnicate"},
		{"inspect", "--no-such-flag", "x.vtk"},
		{"inspect"},
		{"inspect", "--workers", "-1", "x.vtk"},
		{"forces", "testdata/small.vtk"},
		{"forces", "testdata/small.vtk", "--surface", "circle center=0.5,0.5 radius=0.2"},
		{"forces", "testdata/small.vtk", "--surface", "circle center=0.5,0.5 radius=0.2", "--speed", "1", "--form", "sideways"},
		{"forces", "testdata/small.vtk", "--surface", "circle center=0.5,0.5 radius=0.2", "--freestream-velocity", "1,0"},
		{"forces", "testdata/small.vtk", "--surface", "circle center=0.5,0.5 radius=0.2", "--speed", "1", "--json", "--csv"},
		{"forces", "testdata/small.vtk", "--surface", "circle center=0.5,0.5 radius=0.2", "--speed", "nan"},
		{"forces", "testdata/small.vtk", "--surface", "teapot size=3", "--speed", "1"},
		{"version", "extra"},
		{"help", "nosuchcommand"},
		{"demo", "extra"},
	}
	for _, args := range tests {
		code, _, errs := runCmd(t, args...)
		if code != exitBadInput {
			t.Errorf("%q: exit %d, want %d (stderr %q)", args, code, exitBadInput, errs)
		}
		if !strings.HasPrefix(errs, "farforce: ") && !strings.Contains(errs, "\nfarforce: ") {
			t.Errorf("%q: stderr %q lacks the 'farforce: ' message", args, errs)
		}
	}
}

func TestMissingFile(t *testing.T) {
	missing := filepath.Join(t.TempDir(), "no-such-solution.vtk")
	for _, args := range [][]string{
		{"inspect", missing},
		{"forces", missing, "--surface", "circle center=0,0 radius=1", "--speed", "1"},
	} {
		code, _, errs := runCmd(t, args...)
		if code != exitBadInput || !strings.Contains(errs, "no-such-solution.vtk") {
			t.Errorf("%v: exit %d, stderr %q: want exit 2 naming the file", args[0], code, errs)
		}
	}
}

// TestInspectGolden compares the text report on a hand-written file with
// testdata/inspect_small.golden (regenerate with -update).
func TestInspectGolden(t *testing.T) {
	code, out, errs := runCmd(t, "inspect", "testdata/small.vtk")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	golden := filepath.Join("testdata", "inspect_small.golden")
	checkGolden(t, golden, out, "inspect output")
}

// TestInspectJSON checks the JSON fields against what testdata/small.vtk
// declares: 7 points, 2 quads and a triangle, all z = 0, arrays U (point,
// 3), p (point, 1, one nan, range -2..2) and solid (cell, 1).
func TestInspectJSON(t *testing.T) {
	code, out, errs := runCmd(t, "inspect", "--json", "testdata/small.vtk")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var r struct {
		Schema    string         `json:"schema"`
		Points    int            `json:"points"`
		Cells     int            `json:"cells"`
		Dimension int            `json:"dimension"`
		CellTypes map[string]int `json:"cell_types"`
		Bounds    struct{ Min, Max [3]float64 }
		Arrays    []struct {
			Name       string   `json:"name"`
			Location   string   `json:"location"`
			Components int      `json:"components"`
			Min        *float64 `json:"min"`
			Max        *float64 `json:"max"`
			NaN        int      `json:"nan"`
		} `json:"arrays"`
		Mapping struct {
			Velocity []string `json:"velocity"`
			Pressure string   `json:"pressure"`
			Mask     string   `json:"mask"`
		} `json:"mapping"`
		Zones    []json.RawMessage `json:"zones"`
		Warnings []string          `json:"warnings"`
	}
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatalf("bad JSON: %v\n%s", err, out)
	}
	if r.Schema != inspectSchema || r.Points != 7 || r.Cells != 3 || r.Dimension != 2 || len(r.Zones) != 1 {
		t.Errorf("schema %q points %d cells %d dimension %d zones %d; want %q 7 3 2 1", r.Schema, r.Points, r.Cells, r.Dimension, len(r.Zones), inspectSchema)
	}
	if r.CellTypes["quad"] != 2 || r.CellTypes["triangle"] != 1 {
		t.Errorf("cell types %v, want quad 2 triangle 1", r.CellTypes)
	}
	if r.Bounds.Min != [3]float64{0, 0, 0} || r.Bounds.Max != [3]float64{3, 1, 0} {
		t.Errorf("bounds %v %v, want (0,0,0) (3,1,0)", r.Bounds.Min, r.Bounds.Max)
	}
	want := map[string]struct {
		loc   string
		comps int
	}{"U": {"point", 3}, "p": {"point", 1}, "solid": {"cell", 1}}
	for _, a := range r.Arrays {
		w, ok := want[a.Name]
		if !ok || a.Location != w.loc || a.Components != w.comps {
			t.Errorf("array %+v unexpected", a)
		}
		delete(want, a.Name)
		if a.Name == "p" && (a.NaN != 1 || a.Min == nil || *a.Min != -2 || *a.Max != 2) {
			t.Errorf("p: nan %d min %v max %v, want 1, -2, 2", a.NaN, a.Min, a.Max)
		}
	}
	if len(want) > 0 {
		t.Errorf("arrays missing from the report: %v", want)
	}
	if len(r.Mapping.Velocity) != 1 || r.Mapping.Velocity[0] != "U" || r.Mapping.Pressure != "p" || r.Mapping.Mask != "solid" {
		t.Errorf("mapping %+v, want U, p, solid", r.Mapping)
	}
}
