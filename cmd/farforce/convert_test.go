package main

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/integrate"
	"farforce/readers"
	"farforce/surface"
)

// convertSameZone compares geometry and arrays bit for bit (arrays by
// location and name).
func convertSameZone(t *testing.T, what string, a, b *field.Zone) {
	t.Helper()
	same := func(x, y []float64) bool {
		if len(x) != len(y) {
			return false
		}
		for i := range x {
			if math.Float64bits(x[i]) != math.Float64bits(y[i]) && !(math.IsNaN(x[i]) && math.IsNaN(y[i])) {
				return false
			}
		}
		return true
	}
	if !same(a.Points, b.Points) || !slices.Equal(a.Types, b.Types) || !slices.Equal(a.Offsets, b.Offsets) || !slices.Equal(a.Conn, b.Conn) {
		t.Fatalf("%s: geometry differs", what)
	}
	if len(a.Arrays) != len(b.Arrays) {
		t.Fatalf("%s: %d vs %d arrays", what, len(a.Arrays), len(b.Arrays))
	}
	for _, x := range a.Arrays {
		var y *field.Array
		for i := range b.Arrays {
			if b.Arrays[i].Name == x.Name && b.Arrays[i].Location == x.Location {
				y = &b.Arrays[i]
			}
		}
		if y == nil || y.Components != x.Components || !same(x.Data, y.Data) {
			t.Errorf("%s: array %q differs", what, x.Name)
		}
	}
}

// VTK (written by VTK 9.1, testdata/vtk/README.md) -> ffcg -> VTK through
// the command, plain and gzip-compressed, keeps geometry and arrays.
func TestConvertRoundTrip(t *testing.T) {
	dir := t.TempDir()
	for _, in := range []string{"../../testdata/vtk/ugrid_mixed_v51_binary.vtk", "../../testdata/vtk/polydata_v42_ascii.vtk", "../../testdata/vtk/sgrid3d_v42_ascii.vtk"} {
		orig, err := readers.ReadFile(in, readers.Options{})
		if err != nil {
			t.Fatal(err)
		}
		mid := filepath.Join(dir, "mid.ffcg.gz")
		out := filepath.Join(dir, "out.vtk")
		for _, args := range [][]string{{"convert", in, mid}, {"convert", mid, out, "--binary", "--vtk-version", "5.1"}} {
			code, stdout, stderr := runCmd(t, args...)
			if code != exitOK || !strings.HasPrefix(stdout, "wrote ") {
				t.Fatalf("%v: exit %d\n%s%s", args, code, stdout, stderr)
			}
		}
		f, err := readers.ReadFile(mid, readers.Options{})
		if err != nil {
			t.Fatal(err)
		}
		convertSameZone(t, in+" as ffcg", orig.Zones[0], f.Zones[0])
		back, err := readers.ReadFile(out, readers.Options{})
		if err != nil {
			t.Fatal(err)
		}
		convertSameZone(t, in+" back to VTK", orig.Zones[0], back.Zones[0])
	}
}

func TestConvertUsageErrors(t *testing.T) {
	dir := t.TempDir()
	for _, args := range [][]string{
		{"convert", "../../testdata/vtk/spoints_v42_ascii.vtk"},
		{"convert", "../../testdata/vtk/spoints_v42_ascii.vtk", filepath.Join(dir, "x.txt")},
		{"convert", "../../testdata/vtk/spoints_v42_ascii.vtk", filepath.Join(dir, "x.vtk"), "--vtk-version", "3.0"},
		{"convert", "../../testdata/ffcg/example.ffcg", filepath.Join(dir, "x.vtk"), "--zone", "9"},
		{"convert", "../../testdata/ffcg/malformed/node_range.ffcg", filepath.Join(dir, "x.vtk")},
	} {
		if code, _, _ := runCmd(t, args...); code != exitBadInput {
			t.Errorf("%v: exit %d, want %d", args[1:], code, exitBadInput)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "x.vtk")); err == nil {
		t.Errorf("a failed conversion left its output")
	}
}

// cylinderOGrid returns an ffcg file holding the potential flow past a
// circular cylinder with circulation (fieldtest.Cylinder: radius a, stream
// U, clockwise circulation gamma) on an O-grid of nt x nr cells between r = a
// and r = 5a, split into four structured blocks of 90 degrees each. The
// flow is written in conservative variables (Density, MomentumX/Y) plus
// Pressure at the vertices; each block has a BCWall patch at r = a and a
// BCFarfield patch at r = 5a; the reference state is the free stream.
func cylinderOGrid(flow fieldtest.Potential2D, a float64, nt, nr int) string {
	var b strings.Builder
	num := func(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }
	fmt.Fprintf(&b, "ffcg 1\n# potential flow past a cylinder with circulation, 4-block O-grid\n")
	fmt.Fprintf(&b, "base Cylinder CellDimension=2 PhysicalDimension=2\n  DataClass Dimensional\n  DimensionalUnits Kilogram Meter Second Kelvin Radian\n")
	fmt.Fprintf(&b, "  ReferenceState\n    Density = %s\n    VelocityX = %s\n    VelocityY = 0\n    Pressure = %s\n    LengthReference = %s\n  end\n", num(flow.Rho), num(flow.U), num(flow.PInf), num(2*a))
	ni, nj := nt/4+1, nr+1
	for blk := 0; blk < 4; blk++ {
		var x, y, rho, mx, my, p []string
		for j := 0; j < nj; j++ {
			r := a * (1 + 4*float64(j)/float64(nr))
			for i := 0; i < ni; i++ {
				th := 2 * math.Pi * float64((blk*(ni-1)+i)%nt) / float64(nt)
				pt := [3]float64{r * math.Cos(th), r * math.Sin(th), 0}
				s := flow.State(pt)
				x, y = append(x, num(pt[0])), append(y, num(pt[1]))
				rho = append(rho, num(s.Rho))
				mx, my = append(mx, num(s.Rho*s.V[0])), append(my, num(s.Rho*s.V[1]))
				p = append(p, num(s.P))
			}
		}
		fmt.Fprintf(&b, "  zone Block%d Structured VertexSize=%d,%d\n    GridCoordinates\n", blk+1, ni, nj)
		for _, d := range []struct {
			name string
			v    []string
		}{{"CoordinateX", x}, {"CoordinateY", y}} {
			fmt.Fprintf(&b, "      data %s R8 %d\n        %s\n", d.name, len(d.v), strings.Join(d.v, " "))
		}
		fmt.Fprintf(&b, "    end GridCoordinates\n    FlowSolution Flow GridLocation=Vertex\n")
		for _, d := range []struct {
			name string
			v    []string
		}{{"Density", rho}, {"MomentumX", mx}, {"MomentumY", my}, {"Pressure", p}} {
			fmt.Fprintf(&b, "      data %s R8 %d\n        %s\n", d.name, len(d.v), strings.Join(d.v, " "))
		}
		fmt.Fprintf(&b, "    end FlowSolution\n    ZoneBC\n      BC Wall BCWall PointRange=1,1,%d,1\n      end BC\n", ni)
		fmt.Fprintf(&b, "      BC Far BCFarfield PointRange=1,%d,%d,%d\n      end BC\n    end ZoneBC\n  end zone\n", nj, ni, nj)
	}
	b.WriteString("end base\n")
	return b.String()
}

// Kutta–Joukowski across zone boundaries: the force per unit span on a
// circle r = 3a crossing all four blocks of an O-grid in the ffcg format is
// (0, ρUΓ) (Kutta 1902, Joukowski 1906; VALIDATION.md §3.1a), with the
// free stream taken from the file's ReferenceState and the velocity derived
// from its conservative variables. The error must fall at second order
// (bilinear vertex data on quads; band [1.5, 2.7] allows for the pre-
// asymptotic range of three refinements) and be below 2% of ρUΓ on the
// finest grid.
func TestFFCGCylinderKuttaJoukowski(t *testing.T) {
	const a, rho, U = 1.0, 1.2, 2.0
	gamma := 2 * math.Pi * a * U * 0.8 // below 4πaU: stagnation points on the body
	flow := fieldtest.Cylinder(rho, U, a, gamma)
	flow.PInf = 100
	lift := rho * U * gamma
	dir := t.TempDir()
	var hs, errs []float64
	for _, n := range []int{32, 64, 128} {
		path := filepath.Join(dir, fmt.Sprintf("cyl%d.ffcg", n))
		if err := os.WriteFile(path, []byte(cylinderOGrid(flow, a, n, n/4)), 0o644); err != nil {
			t.Fatal(err)
		}
		f, info, err := readers.ReadCase(path, readers.Options{})
		if err != nil {
			t.Fatal(err)
		}
		if len(f.Zones) != 4 || len(info.Patches) != 8 || !info.Patches[0].IsWall() || info.Patches[0].Faces.NumCells() != n/4 {
			t.Fatalf("zones %d, patches %d", len(f.Zones), len(info.Patches))
		}
		loc, err := field.NewLocator(f)
		if err != nil {
			t.Fatal(err)
		}
		m, _ := field.GuessFlowMap(f)
		if strings.Join(m.Velocity, ",") != "VelocityX,VelocityY" || m.Pressure != "Pressure" || m.Density.Name != "Density" {
			t.Fatalf("flow map %+v", m)
		}
		ev, err := field.NewFlowSampler(field.NewSampler(loc), m)
		if err != nil {
			t.Fatal(err)
		}
		cut, err := surface.CutSurface(loc, surface.Circle{Radius: 3 * a}, surface.CutOptions{})
		if err != nil {
			t.Fatal(err)
		}
		ref := info.Reference
		free := integrate.Freestream{V: integrate.Vec3{ref["VelocityX"], ref["VelocityY"], 0}, Rho: ref["Density"], P: ref["Pressure"]}
		r, err := integrate.Forces(cut, ev, integrate.Options{Free: free})
		if err != nil {
			t.Fatal(err)
		}
		e := math.Hypot(r.Force[0], r.Force[1]-lift) / lift
		t.Logf("n=%d: force (%.6g, %.6g), ρUΓ = %.6g, relative error %.3g", n, r.Force[0], r.Force[1], lift, e)
		hs, errs = append(hs, 1/float64(n)), append(errs, e)
	}
	p := math.Log(errs[0]/errs[2]) / math.Log(hs[0]/hs[2])
	t.Logf("observed order %.2f", p)
	if p < 1.5 || p > 2.7 {
		t.Errorf("observed order %.2f outside [1.5, 2.7]", p)
	}
	if errs[2] > 0.02 {
		t.Errorf("finest error %.3g above 2%%", errs[2])
	}
}

// A multi-zone ffcg file converts to one merged VTK zone holding every
// cell and every array of the blocks.
func TestConvertMergesZonesForVTK(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "cyl.ffcg")
	if err := os.WriteFile(in, []byte(cylinderOGrid(fieldtest.Cylinder(1, 1, 1, 1), 1, 16, 4)), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "cyl.vtk")
	if code, _, stderr := runCmd(t, "convert", in, out); code != exitOK || !strings.Contains(stderr, "4 zones merged") {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	src, _ := readers.ReadFiles([]string{in}, readers.Options{})
	got, err := readers.ReadFile(out, readers.Options{})
	if err != nil {
		t.Fatal(err)
	}
	z := got.Zones[0]
	if z.NumCells() != src.NumCells() || z.NumPoints() != src.NumPoints() || len(z.Arrays) != len(src.Zones[0].Arrays) {
		t.Fatalf("merged: %d cells %d points %d arrays", z.NumCells(), z.NumPoints(), len(z.Arrays))
	}
	off := 0
	for i, sz := range src.Zones {
		n := sz.NumPoints()
		if !slices.Equal(z.Array("VelocityX").Data[off:off+n], sz.Array("VelocityX").Data) {
			t.Errorf("block %d: data misplaced", i)
		}
		off += n
	}
}
