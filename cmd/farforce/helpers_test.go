package main

import (
	"strings"
	"testing"

	"github.com/spf13/pflag"
)

func TestParseVector(t *testing.T) {
	good := []struct {
		in   string
		two  bool
		want [3]float64
	}{
		{"1,2,3", false, [3]float64{1, 2, 3}},
		{" -1.5, 0 ,2e3", false, [3]float64{-1.5, 0, 2000}},
		{"4,5", true, [3]float64{4, 5, 0}},
	}
	for _, g := range good {
		got, err := parseVector("v", g.in, g.two)
		if err != nil || got != g.want {
			t.Errorf("parseVector(%q) = %v, %v; want %v", g.in, got, err, g.want)
		}
	}
	for _, in := range []string{"", "1,2", "1,2,3,4", "1,x,3", "nan,0,0", "1,inf,0"} {
		if _, err := parseVector("up", in, false); err == nil || !strings.Contains(err.Error(), "--up") {
			t.Errorf("parseVector(%q): error %v, want one naming --up", in, err)
		}
	}
}

func TestParseQuantity(t *testing.T) {
	if q, err := parseQuantity("density", "998.2"); err != nil || q.Name != "" || q.Value != 998.2 {
		t.Errorf("constant: %+v %v", q, err)
	}
	if q, err := parseQuantity("density", "rho"); err != nil || q.Name != "rho" {
		t.Errorf("array: %+v %v", q, err)
	}
	for _, in := range []string{"", "-1", "nan", "inf"} {
		if _, err := parseQuantity("density", in); err == nil {
			t.Errorf("parseQuantity(%q) accepted", in)
		}
	}
}

func TestFixedFormatter(t *testing.T) {
	f := fixedFormatter(1.32567, -0.00016, 2.8e-16)
	for in, want := range map[float64]string{1.32567: "1.32567", -0.00016: "-0.00016", 2.8e-16: "0.00000", -2.8e-16: "0.00000"} {
		if got := f(in); got != want {
			t.Errorf("f(%g) = %q, want %q", in, got, want)
		}
	}
	if got := fixedFormatter(1234.5678)(1234.5678); got != "1234.57" {
		t.Errorf("large: %q", got)
	}
	if got := fixedFormatter(0, 0)(0); got != "0" {
		t.Errorf("all zero: %q", got)
	}
}

func TestSurfaceFileName(t *testing.T) {
	for i, want := range []string{"out/cut.vtk", "out/cut-2.vtk", "out/cut-3.vtk"} {
		if got := surfaceFileName("out/cut.vtk", i); got != want {
			t.Errorf("surface %d: %q, want %q", i, got, want)
		}
	}
}

func TestShellJoin(t *testing.T) {
	got := shellJoin([]string{"forces", "a.vtk", "--surface", "circle center=0,0 radius=1", "it's"})
	want := `forces a.vtk --surface 'circle center=0,0 radius=1' 'it'\''s'`
	if got != want {
		t.Errorf("shellJoin = %s, want %s", got, want)
	}
}

func TestInspectSeveralFiles(t *testing.T) {
	code, out, errs := runCmd(t, "inspect", "testdata/small.vtk", "testdata/small.vtk")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, want := range []string{"zones      2", "points     14", "Zones", "#  name       points", "0  small.vtk"} {
		if !strings.Contains(out, want) {
			t.Errorf("two zones: output lacks %q:\n%s", want, out)
		}
	}
}

// panicImpl is a command whose run panics, standing for a programmer error.
type panicImpl struct{}

func (panicImpl) define(*pflag.FlagSet)    {}
func (panicImpl) run(*env, []string) error { panic("boom") }

func TestInternalErrorExitCode(t *testing.T) {
	saved := commands
	defer func() { commands = saved }()
	commands = append(commands, &command{name: "explode", newImpl: func() commandImpl { return panicImpl{} }})
	code, _, errs := runCmd(t, "explode")
	if code != exitInternal || !strings.Contains(errs, "farforce: internal error: boom") {
		t.Errorf("exit %d, stderr %q; want 3 and an internal error", code, errs)
	}
}
