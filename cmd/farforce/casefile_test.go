package main

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/BurntSushi/toml"
)

// writeCase writes a case file into dir and returns its path.
func writeCase(t *testing.T, dir, name, text string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// minimalCase is a valid case body (the files need not exist to load it).
const minimalCase = `files = ["sol.vtk"]
[freestream]
speed = 1
[[surface]]
spec = "circle center=0,0 radius=1"
`

// TestCaseErrorsWithLine: unknown keys and bad values are reported with
// the case file and the line they are on.
func TestCaseErrorsWithLine(t *testing.T) {
	dir := t.TempDir()
	tests := []struct {
		name, text string
		line       int
		want       string
	}{
		{"top-level key", "files = [\"a.vtk\"]\nsurfaces = 3\n", 2, `unknown key "surfaces"`},
		{"table key", minimalCase + "[flow]\npressure = \"p\"\nvelocty = \"U\"\n", 8, `unknown key "flow.velocty"`},
		{"array of tables", minimalCase + "[[gate]]\nkind = \"drag\"\nexpected = 1\ntolerance = 0.1\n\n[[gate]]\nkind = \"lift\"\nexpected = 0\ntolerance = 1\nlimit = 3\n", 15, `unknown key "gate.limit"`},
		{"unknown table", minimalCase + "\n[solver]\nname = \"x\"\n", 7, `unknown key "solver"`},
		{"syntax", "files = [\"a.vtk\"\n[flow]\n", 2, "expected"},
		{"wrong type", minimalCase + "[reference]\nlength = \"long\"\n", 7, "length"},
		{"bad scales", minimalCase + "[[sweep]]\nsurface = \"circle center=0,0 radius=1\"\nscales = \"1:2\"\n", 8, "A:B:N"},
		{"gate kind", minimalCase + "[[gate]]\nkind = \"drag\"\nexpected = 1\ntolerance = 0.1\n[[gate]]\nkind = \"speed\"\nmax = 1\n", 10, `kind "speed"`},
		{"gate needs max", minimalCase + "[[gate]]\nkind = \"mass-imbalance\"\n", 6, "needs max"},
		{"gate needs near", minimalCase + "[[gate]]\nkind = \"near-far\"\nmax = 10\n", 6, "needs a [near]"},
		{"gate on unknown", minimalCase + "[[gate]]\nkind = \"drag\"\nexpected = 1\ntolerance = 1\non = \"wing\"\n", 6, `"wing" names no surface`},
		{"sweep gate without sweep", minimalCase + "[[gate]]\nkind = \"no-drift\"\n", 6, "needs a [[sweep]]"},
		{"near both", minimalCase + "[near]\nwall = \"w.vtk\"\ninside = \"circle center=0,0 radius=0.5\"\n", 6, "exactly one"},
		{"no files", "[[surface]]\nspec = \"circle center=0,0 radius=1\"\n", 0, "no solution files"},
		{"nothing to do", "files = [\"a.vtk\"]\n", 0, "nothing to compute"},
		{"bad spec", "files = [\"a.vtk\"]\n[[surface]]\nspec = \"circle center=0,0 radius=1\"\n[[surface]]\nspec = \"teapot size=1\"\n", 4, "teapot"},
		{"same name", minimalCase + "[[sweep]]\nname = \"surface 1\"\nsurface = \"circle center=0,0 radius=1\"\nscales = [1, 2, 3]\n", 6, "used twice"},
	}
	for _, tc := range tests {
		p := writeCase(t, dir, "case.toml", tc.text)
		_, err := loadCase(p)
		var ce *caseError
		if !errors.As(err, &ce) {
			t.Errorf("%s: error %v, want a *caseError", tc.name, err)
			continue
		}
		if ce.File != p || ce.Line != tc.line || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: %q (line %d); want line %d and %q", tc.name, err, ce.Line, tc.line, tc.want)
		}
	}
}

// TestCaseRelativePaths: files, the wall file and file surfaces are taken
// from the case file's folder; absolute paths stay.
func TestCaseRelativePaths(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "cases")
	if err := os.Mkdir(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	abs := filepath.Join(t.TempDir(), "abs.vtk")
	p := writeCase(t, dir, "c.toml", `files = ["../data/sol.vtk", "`+filepath.ToSlash(abs)+`"]
[freestream]
speed = 1
[near]
wall = "wall.vtk"
[[surface]]
spec = "file path=body/cv.vtk scale=2"
[[sweep]]
surface = "file path=/abs/cv.vtk"
scales = [1, 2, 3]
`)
	c, err := loadCase(p)
	if err != nil {
		t.Fatal(err)
	}
	want := []string{filepath.Join(dir, "..", "data", "sol.vtk"), abs}
	if len(c.Files) != 2 || c.Files[0] != want[0] || c.Files[1] != want[1] {
		t.Errorf("files %q, want %q", c.Files, want)
	}
	if c.Near.Wall != filepath.Join(dir, "wall.vtk") {
		t.Errorf("wall %q", c.Near.Wall)
	}
	if want := "path=" + filepath.Join(dir, "body", "cv.vtk"); !strings.Contains(c.Surfaces[0].Spec, want) || !strings.Contains(c.Surfaces[0].Spec, "scale=2") {
		t.Errorf("surface spec %q, want %s and scale=2", c.Surfaces[0].Spec, want)
	}
	if !strings.Contains(c.Sweeps[0].Surface, "path=/abs/cv.vtk") {
		t.Errorf("absolute file surface changed: %q", c.Sweeps[0].Surface)
	}
	if c.Surfaces[0].Name != "surface 1" || c.Sweeps[0].Name != "sweep 1" {
		t.Errorf("default names %q %q", c.Surfaces[0].Name, c.Sweeps[0].Name)
	}
}

// TestCaseFlagArgs: the tables become the flags of the same meaning.
func TestCaseFlagArgs(t *testing.T) {
	p := writeCase(t, t.TempDir(), "c.toml", `files = ["a.vtk"]
[flow]
velocity = ["u", "v"]
density = 998.2
viscosity = "mu"
[freestream]
velocity = [1.5, 0, 0]
pressure = -3
[reference]
length = 0.1
up = [0, 1, 0]
[options]
form = "plain"
no_convection = true
[[surface]]
spec = "circle center=0,0 radius=1"
`)
	c, err := loadCase(p)
	if err != nil {
		t.Fatal(err)
	}
	got := strings.Join(c.flagArgs(), " ")
	want := "--velocity=u,v --density=998.2 --viscosity=mu --freestream-velocity=1.5,0,0 --freestream-pressure=-3 --ref-length=0.1 --up=0,1,0 --form=plain --no-convection"
	if got != want {
		t.Errorf("flags\n %s\nwant\n %s", got, want)
	}
}

func TestKeyLine(t *testing.T) {
	src := []byte("a = 1\n[t]\nb = 2 # c = 3\n[[g]]\nk = 1\n[[g]]\n k = 2\n[t.s]\n\"q\" = 4\n")
	for _, tc := range []struct {
		key  toml.Key
		nth  int
		want int
	}{{toml.Key{"a"}, 0, 1}, {toml.Key{"t", "b"}, 0, 3}, {toml.Key{"g", "k"}, 1, 7}, {toml.Key{"g"}, 1, 6}, {toml.Key{"t", "s", "q"}, 0, 9}, {toml.Key{"c"}, 0, 0}} {
		if got := keyLineN(src, tc.key, tc.nth); got != tc.want {
			t.Errorf("%v #%d: line %d, want %d", tc.key, tc.nth, got, tc.want)
		}
	}
}
