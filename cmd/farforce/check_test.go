package main

import (
	"encoding/json"
	"encoding/xml"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// exactCase gates the lifting cylinder of writeCylinderFiles with one gate
// of every kind, each met by the exact answer (VALIDATION.md §3.1a): drag
// 0, C_L = 2Γ/U = 3.1 (Kutta–Joukowski), no mass imbalance (the flow is
// divergence-free, and symmetric grid and flow cancel it to rounding), far
// and near field agreeing, and a flat sweep. Paths are relative to the
// case file.
const exactCase = `# lifting cylinder, VALIDATION.md 3.1a
files = ["cylinder.vtk"]

[flow]
density = 1.3
viscosity = 0

[freestream]
velocity = [2, 0, 0]
pressure = 7

[reference]
length = 1

[near]
wall = "wall.vtk"

[[surface]]
name = "circle"
spec = "circle center=0,0 radius=1.5"

[[sweep]]
name = "squares"
surface = "rect min=-1.2,-1.2 max=1.2,1.2"
scales = "0.8:1.6:3"

[[gate]]
kind = "drag"
expected = 0
tolerance = 1e-6

[[gate]]
name = "Kutta-Joukowski lift"
kind = "lift"
expected = 3.1
tolerance = 2e-3

[[gate]]
kind = "near-far"
max = 0.01

[[gate]]
kind = "plateau-spread"
max = 0.01

[[gate]]
kind = "mass-imbalance"
max = 1e-9

[[gate]]
kind = "no-drift"
`

// junitDoc is the JUnit XML as check writes it, read back.
type junitDoc struct {
	XMLName  xml.Name `xml:"testsuites"`
	Tests    int      `xml:"tests,attr"`
	Failures int      `xml:"failures,attr"`
	Suites   []struct {
		Tests    int `xml:"tests,attr"`
		Failures int `xml:"failures,attr"`
		Cases    []struct {
			Name    string `xml:"name,attr"`
			Class   string `xml:"classname,attr"`
			Failure *struct {
				Message string `xml:"message,attr"`
				Type    string `xml:"type,attr"`
				Text    string `xml:",chardata"`
			} `xml:"failure"`
			Out string `xml:"system-out"`
		} `xml:"testcase"`
	} `xml:"testsuite"`
}

// readJUnit parses a JUnit file strictly with encoding/xml.
func readJUnit(t *testing.T, path string) junitDoc {
	t.Helper()
	raw, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var doc junitDoc
	dec := xml.NewDecoder(strings.NewReader(string(raw)))
	dec.Strict = true
	if err := dec.Decode(&doc); err != nil {
		t.Fatalf("JUnit XML not well formed: %v\n%s", err, raw)
	}
	if len(doc.Suites) != 1 {
		t.Fatalf("%d test suites, want 1", len(doc.Suites))
	}
	return doc
}

// TestCheckExactCasePasses runs a case with one gate of each kind on an
// exact field: exit 0, and a JUnit report with one passing test case per
// gate. The case file lives in a temporary folder and names its files
// relative to it, so the run also checks the path resolution.
func TestCheckExactCasePasses(t *testing.T) {
	dir := t.TempDir()
	writeCylinderFiles(t, dir)
	cf := writeCase(t, dir, "exact.toml", exactCase)
	junit := filepath.Join(dir, "report", "junit.xml")
	if err := os.Mkdir(filepath.Dir(junit), 0o755); err != nil {
		t.Fatal(err)
	}
	code, out, errs := runCmd(t, "check", cf, "--junit", junit)
	if code != exitOK {
		t.Fatalf("exit %d, want 0: %s\n%s", code, errs, out)
	}
	if !strings.Contains(out, "Result: 6 of 6 gates passed") || strings.Contains(out, "FAIL") {
		t.Errorf("summary:\n%s", out)
	}
	doc := readJUnit(t, junit)
	s := doc.Suites[0]
	if doc.Tests != 6 || doc.Failures != 0 || s.Tests != 6 || len(s.Cases) != 6 {
		t.Fatalf("JUnit: %d tests, %d failures, %d cases; want 6, 0, 6", doc.Tests, doc.Failures, len(s.Cases))
	}
	names := []string{"drag", "Kutta-Joukowski lift", "near-far", "plateau-spread", "mass-imbalance", "no-drift"}
	for i, c := range s.Cases {
		if c.Name != names[i] || c.Failure != nil || c.Class != "farforce.check.exact" || c.Out == "" {
			t.Errorf("case %d: %+v, want %q passing with its numbers", i, c, names[i])
		}
	}
	// No temporary files are left next to the report.
	if entries, _ := os.ReadDir(filepath.Dir(junit)); len(entries) != 1 {
		t.Errorf("report folder holds %d entries, want the report alone", len(entries))
	}
}

// TestCheckGatesFail runs testdata/cases/cylinder_fail.toml (the 2D-1
// benchmark solution held to limits it cannot meet): exit 1, every gate
// failing in the summary, the JSON and the JUnit report, each failure
// carrying its numbers.
func TestCheckGatesFail(t *testing.T) {
	if _, err := os.Stat("../../testdata/real/dfg2d1_coarse_tri_p2refined_binary.vtk"); err != nil {
		t.Fatalf("committed fixture missing (testdata/real at the module root): %v", err)
	}
	dir := t.TempDir()
	junit, plot := filepath.Join(dir, "j.xml"), filepath.Join(dir, "sweep.svg")
	code, out, errs := runCmd(t, "check", "testdata/cases/cylinder_fail.toml", "--junit", junit, "--plot", plot)
	if code != exitGate {
		t.Fatalf("exit %d, want 1: %s", code, errs)
	}
	if !strings.Contains(errs, "6 of 6 gates failed") || !strings.Contains(out, "Result: 0 of 6 gates passed") {
		t.Errorf("stderr %q, summary:\n%s", errs, out)
	}
	doc := readJUnit(t, junit)
	if doc.Failures != 6 || len(doc.Suites[0].Cases) != 6 {
		t.Fatalf("JUnit: %d failures, %d cases; want 6 and 6", doc.Failures, len(doc.Suites[0].Cases))
	}
	wantNumbers := map[string]string{
		"drag": "expected 5 ± 0.01", "lift": "expected 0 ± 0.001", "near-far": "limit 100",
		"plateau-spread": "limit 50", "mass-imbalance": "limit 1e-06", "no-drift": "flagged",
	}
	for _, c := range doc.Suites[0].Cases {
		if c.Failure == nil {
			t.Errorf("%s: no failure element", c.Name)
			continue
		}
		if w := wantNumbers[c.Failure.Type]; w == "" || !strings.Contains(c.Failure.Message, w) || !strings.Contains(c.Failure.Text, w) {
			t.Errorf("%s (%s): failure %q / %q lacks %q", c.Name, c.Failure.Type, c.Failure.Message, c.Failure.Text, w)
		}
	}
	if _, err := os.Stat(plot); err != nil {
		t.Errorf("plot not written: %v", err)
	}
	code, out, _ = runCmd(t, "check", "testdata/cases/cylinder_fail.toml", "--json")
	var r struct {
		Schema string `json:"schema"`
		Passed bool   `json:"passed"`
		Failed int    `json:"failed"`
		Gates  []struct {
			Kind   string `json:"kind"`
			Passed bool   `json:"passed"`
			Checks []struct {
				Value, Limit float64
			} `json:"checks"`
		} `json:"gates"`
		Sweeps []struct {
			Members []struct {
				Scale float64 `json:"scale"`
			} `json:"members"`
		} `json:"sweeps"`
	}
	if err := json.Unmarshal([]byte(out), &r); err != nil || code != exitGate {
		t.Fatalf("JSON: exit %d, %v", code, err)
	}
	if r.Schema != checkSchema || r.Passed || r.Failed != 6 || len(r.Gates) != 6 || len(r.Sweeps) != 1 || len(r.Sweeps[0].Members) != 5 {
		t.Errorf("JSON summary %+v", r)
	}
}

// TestCheckGolden compares the text summary of the case files in
// testdata/cases with testdata/golden (regenerate with -update).
func TestCheckGolden(t *testing.T) {
	if _, err := os.Stat("../../testdata/real/dfg2d1_coarse_tri_p2refined_binary.vtk"); err != nil {
		t.Fatalf("committed fixture missing (testdata/real at the module root): %v", err)
	}
	for _, tc := range []struct {
		name string
		code int
	}{{"cylinder", exitOK}, {"cylinder_fail", exitGate}} {
		code, out, errs := runCmd(t, "check", filepath.Join("testdata", "cases", tc.name+".toml"))
		if code != tc.code {
			t.Fatalf("%s: exit %d, want %d: %s", tc.name, code, tc.code, errs)
		}
		golden := filepath.Join("testdata", "golden", "check_"+tc.name+".golden")
		checkGolden(t, golden, out, tc.name+": output")
	}
}

// TestCheckBadInput: bad case files, missing solution files and surfaces
// that leave the mesh exit with code 2 and a message naming the problem.
func TestCheckBadInput(t *testing.T) {
	dir := t.TempDir()
	writeCylinderFiles(t, dir)
	cases := map[string]struct{ text, want string }{
		"unknown key":   {strings.Replace(exactCase, "[reference]\n", "[reference]\nlenght = 2\n", 1), `line 13: unknown key "reference.lenght"`},
		"missing file":  {strings.Replace(exactCase, "cylinder.vtk", "nosuch.vtk", 1), "nosuch.vtk"},
		"missing wall":  {strings.Replace(exactCase, "\"wall.vtk\"", "\"nowall.vtk\"", 1), "nowall.vtk"},
		"outside mesh":  {strings.Replace(exactCase, "radius=1.5", "radius=9", 1), "surface \"circle\""},
		"no freestream": {strings.Replace(exactCase, "velocity = [2, 0, 0]\n", "", 1), "no freestream"},
	}
	for name, tc := range cases {
		cf := writeCase(t, dir, "bad.toml", tc.text)
		junit := filepath.Join(dir, name+".xml")
		code, _, errs := runCmd(t, "check", cf, "--junit", junit)
		if code != exitBadInput || !strings.Contains(errs, tc.want) {
			t.Errorf("%s: exit %d, stderr %q; want 2 and %q", name, code, errs, tc.want)
		}
		if _, err := os.Stat(junit); err == nil {
			t.Errorf("%s: a JUnit report was written for bad input", name)
		}
	}
	for _, args := range [][]string{{"check"}, {"check", "a.toml", "b.toml"}, {"check", filepath.Join(dir, "none.toml")}, {"check", "x.toml", "--plot", "x.gif"}} {
		if code, _, errs := runCmd(t, args...); code != exitBadInput {
			t.Errorf("%v: exit %d, want 2 (%s)", args, code, errs)
		}
	}
}

// TestJUnitEscapes: gate names and messages with XML special characters
// survive a round trip through encoding/xml.
func TestJUnitEscapes(t *testing.T) {
	r := &caseRun{Failed: 1, Gates: []gateResult{
		{Name: `drag < 0.1 & "lift" > 0`, Kind: "drag", Passed: false, Message: "a <b> & c",
			Checks: []gateCheck{{Subject: "s", Passed: false, Text: "x < y & z"}}},
		{Name: "ok", Kind: "lift", Passed: true, Checks: []gateCheck{{Subject: "s", Passed: true, Text: "fine"}}},
	}}
	path := filepath.Join(t.TempDir(), "j.xml")
	if err := writeFileAtomic(path, func(w io.Writer) error { return writeJUnit(w, "dir/case.toml", r) }); err != nil {
		t.Fatal(err)
	}
	doc := readJUnit(t, path)
	c := doc.Suites[0].Cases
	if len(c) != 2 || c[0].Name != `drag < 0.1 & "lift" > 0` || c[0].Failure == nil || c[0].Failure.Message != "a <b> & c" ||
		c[0].Failure.Text != "x < y & z" || c[1].Failure != nil || c[0].Class != "farforce.check.case" || doc.Failures != 1 {
		t.Errorf("round trip: %+v", doc)
	}
}
