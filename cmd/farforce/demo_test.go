package main

import (
	"bytes"
	"encoding/xml"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"farforce/integrate"
	"farforce/readers"
)

// demoPlaceholder stands for the demo folder in the golden file, so the
// comparison does not depend on where the temporary folder is.
const demoPlaceholder = "$DEMO_DIR"

// TestDemoGolden runs the demo into a temporary folder and compares its
// report, with the folder replaced by a placeholder, with
// testdata/golden/demo.golden (regenerate with -update). It also checks
// that every announced file was written, that the JUnit report is well
// formed with one passing case per gate, and that the plots are SVG.
func TestDemoGolden(t *testing.T) {
	dir := t.TempDir()
	code, out, errs := runCmd(t, "demo", "--dir", dir)
	if code != exitOK {
		t.Fatalf("exit %d: %s\n%s", code, errs, out)
	}
	if errs != "" {
		t.Errorf("stderr not empty when it is not a terminal: %q", errs)
	}
	out = strings.ReplaceAll(out, dir, demoPlaceholder)
	golden := filepath.Join("testdata", "golden", "demo.golden")
	checkGolden(t, golden, out, "demo output")
	for _, o := range demoOutputs {
		if _, err := os.Stat(filepath.Join(dir, o[0])); err != nil {
			t.Errorf("demo file not written: %v", err)
		}
		if !strings.Contains(out, o[0]) {
			t.Errorf("the demo does not mention %s", o[0])
		}
	}
	for _, svg := range []string{"sweep.svg", "check-sweep.svg"} {
		b, err := os.ReadFile(filepath.Join(dir, svg))
		if err != nil {
			continue // reported above
		}
		if !bytes.Contains(b, []byte("<svg")) || !bytes.HasSuffix(bytes.TrimSpace(b), []byte("</svg>")) {
			t.Errorf("%s is not a complete SVG document", svg)
		}
	}
	b, err := os.ReadFile(filepath.Join(dir, "junit.xml"))
	if err != nil {
		return
	}
	var suites struct {
		Suites []struct {
			Cases []struct {
				Name    string    `xml:"name,attr"`
				Failure *struct{} `xml:"failure"`
			} `xml:"testcase"`
		} `xml:"testsuite"`
	}
	if err := xml.Unmarshal(b, &suites); err != nil {
		t.Fatalf("junit.xml is not well-formed XML: %v", err)
	}
	gates := strings.Count(demoCase, "[[gate]]")
	if len(suites.Suites) != 1 || len(suites.Suites[0].Cases) != gates {
		t.Fatalf("junit.xml: %+v, want one suite of %d cases (one per gate)", suites, gates)
	}
	for _, c := range suites.Suites[0].Cases {
		if c.Failure != nil {
			t.Errorf("junit.xml: gate %q failed", c.Name)
		}
	}
}

// TestDemoWallDrag checks the embedded wall file against the design drag
// it was built for by gendemo.go (invented demo data): pressure drag zero
// (potential flow on a fore-aft symmetric polyline), friction drag
// C_D = 0.012 on the chord 0.1 m at 1.5 m/s in water of density 998.2
// kg/m³, to rounding; no lift (the section and the loads are symmetric).
func TestDemoWallDrag(t *testing.T) {
	f, err := readers.ReadVTK(bytes.NewReader(demoWall), "strut_wall.vtk", readers.Options{})
	if err != nil {
		t.Fatal(err)
	}
	opt := integrate.Options{Free: integrate.Freestream{V: integrate.Vec3{1.5, 0, 0}, Rho: 998.2}, RefLength: 0.1}
	r, err := integrate.NearField(f.Zones[0], integrate.WallOptions{Pressure: "pressure", Traction: "wall_shear_stress"}, opt)
	if err != nil {
		t.Fatal(err)
	}
	const design = 0.012 // gendemo.go: dragCoef
	if got := r.Coefficients.Drag; math.Abs(got-design) > 1e-12 {
		t.Errorf("wall C_D = %.15g, want %g (the design drag, built in exactly)", got, design)
	}
	if got := r.PressureCoefficients.Drag; math.Abs(got) > 1e-12 {
		t.Errorf("pressure C_D = %g, want 0 (potential flow, symmetric nodes)", got)
	}
	if got := r.Coefficients.Lift; math.Abs(got) > 1e-12 {
		t.Errorf("C_L = %g, want 0 (symmetric section and loads)", got)
	}
}
