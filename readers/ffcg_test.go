package readers

import (
	"bytes"
	"errors"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"farforce/field"
)

// The values checked here come from the files themselves: the example of
// docs/cgns-text-format.md §4 (testdata/ffcg/example.ffcg, written by
// hand) and the VTK-written fixtures of testdata/vtk (VTK 9.1, see its
// README). Conventions (rind, DataConversion, structured order, MIXED) are
// those of the CGNS SIDS as summarised in FORMATS.md §2.

func readFFCGString(t *testing.T, s string, opt Options) (*field.Field, *CaseInfo) {
	t.Helper()
	f, info, err := ReadFFCG(strings.NewReader(s), "t.ffcg", opt)
	if err != nil {
		t.Fatal(err)
	}
	for _, z := range f.Zones {
		if err := z.Validate(); err != nil {
			t.Fatal(err)
		}
	}
	return f, info
}

func ffcgErr(t *testing.T, s string, want error) *Error {
	t.Helper()
	_, _, err := ReadFFCG(strings.NewReader(s), "t.ffcg", Options{})
	var e *Error
	if !errors.As(err, &e) {
		t.Fatalf("want *Error, got %v", err)
	}
	if want != nil && !errors.Is(err, want) {
		t.Fatalf("error %v does not wrap %v", err, want)
	}
	return e
}

func closeTo(a, b, rel float64) bool { return math.Abs(a-b) <= rel*math.Max(math.Abs(a), math.Abs(b)) }

// The example of the specification: every feature it shows arrives in
// the field and the case information.
func TestFFCGExample(t *testing.T) {
	f, info, err := ReadCase("../testdata/ffcg/example.ffcg", Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Zones) != 2 || f.Zones[0].Name != "Left" || f.Zones[1].Name != "Right" {
		t.Fatalf("zones %v", f.Zones)
	}
	if f.Dim() != 2 {
		t.Errorf("PhysicalDimension 2 should give a 2D field")
	}
	l, r := f.Zones[0], f.Zones[1]
	// Structured 3x2: two quads, i fastest (FORMATS.md §2.4).
	eqI(t, "Left conn", l.Conn, []int32{0, 1, 4, 3, 1, 2, 5, 4})
	eqT(t, l.Types, field.Quad, field.Quad)
	eqF(t, "Left points", l.Points, []float64{0, 0, 0, 0.5, 0, 0, 1, 0, 0, 0, 1, 0, 0.5, 1, 0, 1, 1, 0})
	// Conservative variables: VelocityX = MomentumX / Density = 12 / 1.2.
	vx := l.Array("VelocityX")
	if vx == nil || vx.Location != field.AtPoints {
		t.Fatalf("VelocityX not derived: %v", names(l))
	}
	for _, v := range vx.Data {
		if !closeTo(v, 10, 1e-15) {
			t.Errorf("VelocityX %v, want 10", v)
		}
	}
	// DataConversion on an R4 array: float32(101.325) * 1000.
	want := float64(float32(101.325)) * 1000
	if p := l.Array("Pressure"); p == nil || p.Data[0] != want {
		t.Errorf("Pressure %v, want %v", p, want)
	}
	// CellCenter with Rind=1,1,0,0: the rind values -1 are dropped.
	eqF(t, "ViscosityEddy", arr(t, l, "ViscosityEddy", field.AtCells, 1), []float64{0.001, 0.002})
	// MIXED section: a QUAD_4 (7) and a TRI_3 (5); BAR_2 section above CellSize is not cells.
	eqT(t, r.Types, field.Quad, field.Triangle)
	eqI(t, "Right conn", r.Conn, []int32{0, 1, 2, 3, 1, 4, 2})
	if info.Reference["Density"] != 1.2 || info.Reference["VelocityX"] != 10 || info.Reference["Reynolds"] != 6.8e5 || len(info.Reference) != 7 {
		t.Errorf("reference %v", info.Reference)
	}
	if info.DataClass != "Dimensional" || info.Units != [5]string{"Kilogram", "Meter", "Second", "Kelvin", "Radian"} {
		t.Errorf("class %q units %v", info.DataClass, info.Units)
	}
	type pw struct {
		name, typ string
		zone      int
		points    []int32
		conn      []int32
		wall      bool
	}
	wantP := []pw{
		{"Bottom", "BCWall", 0, []int32{0, 1, 2}, []int32{0, 1, 1, 2}, true},
		{"Top", "BCFarfield", 0, []int32{3, 4, 5}, []int32{3, 4, 4, 5}, false},
		{"Floor", "BCWallViscous", 1, []int32{0, 1, 4}, []int32{0, 1, 1, 4}, true},
		{"Outlet", "BCOutflow", 1, []int32{2, 4}, []int32{4, 2}, false},
	}
	if len(info.Patches) != len(wantP) {
		t.Fatalf("%d patches", len(info.Patches))
	}
	for i, w := range wantP {
		p := info.Patches[i]
		if p.Name != w.name || p.Type != w.typ || p.Zone != w.zone || p.IsWall() != w.wall {
			t.Errorf("patch %d: %+v", i, p)
		}
		eqI(t, w.name+" points", p.Points, w.points)
		if p.Faces == nil {
			t.Fatalf("%s: no faces", w.name)
		}
		eqI(t, w.name+" faces", p.Faces.Conn, w.conn)
		if err := p.Faces.Validate(); err != nil {
			t.Error(err)
		}
	}
}

// Every VTK-written fixture survives VTK -> ffcg -> VTK with identical
// geometry and arrays (bit for bit), and the ffcg read equals the VTK read.
func TestFFCGRoundTripVTK(t *testing.T) {
	files, _ := filepath.Glob("../testdata/vtk/*.vtk")
	if len(files) < 10 {
		t.Fatalf("only %d fixtures", len(files))
	}
	for _, p := range files {
		orig, err := ReadFile(p, Options{})
		if err != nil {
			t.Fatal(err)
		}
		orig.Warnings = nil
		var buf bytes.Buffer
		if err := WriteFFCG(&buf, orig, nil); err != nil {
			t.Fatalf("%s: %v", p, err)
		}
		back, _, err := ReadFFCG(bytes.NewReader(buf.Bytes()), "rt.ffcg", Options{})
		if err != nil {
			t.Fatalf("%s: %v", p, err)
		}
		if len(back.Warnings) != 0 {
			t.Errorf("%s: warnings %v", p, back.Warnings)
		}
		cmp := func(stage string, got *field.Field) {
			a, b := *orig.Zones[0], *got.Zones[0]
			b.Name = a.Name
			for _, z := range []*field.Zone{&a, &b} {
				fuzzSortArrays(z)
				fuzzNormaliseNaN(z)
			}
			if d := fuzzDiffFields(&field.Field{Zones: []*field.Zone{&a}}, &field.Field{Zones: []*field.Zone{&b}}); d != "" {
				t.Errorf("%s %s: %s", filepath.Base(p), stage, d)
			}
		}
		cmp("ffcg", back)
		var vb bytes.Buffer
		if err := WriteVTK(&vb, back.Zones[0], WriteOptions{}); err != nil {
			t.Fatalf("%s: %v", p, err)
		}
		again, err := ReadVTK(bytes.NewReader(vb.Bytes()), "rt.vtk", Options{})
		if err != nil {
			t.Fatalf("%s: %v", p, err)
		}
		cmp("ffcg->vtk", again)
	}
}

// A structured 3-D zone: hexahedra in VTK order, CellCenter rind in i and
// j stripped, Vertex rind in k stripped, a PointRange face patch.
func TestFFCGStructured3D(t *testing.T) {
	var b strings.Builder
	b.WriteString("ffcg 1\nbase B CellDimension=3 PhysicalDimension=3\n zone Z Structured VertexSize=3,3,2\n  GridCoordinates\n")
	for ax, n := range coordNames {
		b.WriteString("   data " + n + " R8 18\n")
		for k := 0; k < 2; k++ {
			for j := 0; j < 3; j++ {
				for i := 0; i < 3; i++ {
					b.WriteString(" " + []string{itoa(i), itoa(j), itoa(k)}[ax])
				}
			}
		}
		b.WriteString("\n")
	}
	b.WriteString("  end\n  FlowSolution C GridLocation=CellCenter Rind=1,1,1,0,0,0\n   data Q R8 12\n")
	// full 4 x 3 x 1 (i rind 1+1, j rind 1+0); value 10*j + i of the full index.
	for j := 0; j < 3; j++ {
		for i := 0; i < 4; i++ {
			b.WriteString(" " + itoa(10*j+i))
		}
	}
	b.WriteString("\n  end\n  FlowSolution V Rind=0,0,0,0,0,2\n   data T R4 36 DataConversion=2,1\n")
	for i := 0; i < 36; i++ {
		b.WriteString(" " + itoa(i))
	}
	b.WriteString("\n  end\n  ZoneBC\n   BC Floor BCWallInviscid PointRange=1,1,1,3,3,1\n   end\n   BC Side BCSymmetryPlane GridLocation=IFaceCenter PointRange=3,1,1,3,2,1\n   end\n  end ZoneBC\n end zone\nend base\n")
	f, info := readFFCGString(t, b.String(), Options{})
	z := f.Zones[0]
	eqT(t, z.Types, field.Hexa, field.Hexa, field.Hexa, field.Hexa)
	eqI(t, "hex 0", z.CellNodes(0), []int32{0, 1, 4, 3, 9, 10, 13, 12})
	eqF(t, "Q", arr(t, z, "Q", field.AtCells, 1), []float64{11, 12, 21, 22})
	want := make([]float64, 18)
	for i := range want {
		want[i] = 2*float64(i) + 1
	}
	eqF(t, "T", arr(t, z, "T", field.AtPoints, 1), want)
	fl := info.Patches[0]
	eqI(t, "floor faces", fl.Faces.Conn, []int32{0, 1, 4, 3, 1, 2, 5, 4, 3, 4, 7, 6, 4, 5, 8, 7})
	side := info.Patches[1]
	// i = 3 plane, j cells 1..2 -> vertices j 1..3, k cell 1 -> k 1..2.
	eqI(t, "side points", side.Points, []int32{2, 5, 8, 11, 14, 17})
	if side.Faces.NumCells() != 2 {
		t.Errorf("side faces %d", side.Faces.NumCells())
	}
}

func itoa(i int) string { return strconv.Itoa(i) }

// Unstructured sections: NGON_n with offsets, MIXED with
// ElementStartOffset, a quadratic section reduced with a warning, cell
// rind, sections out of order, FaceCenter PointList patches.
func TestFFCGUnstructuredSections(t *testing.T) {
	s := `ffcg 1
base B CellDimension=2 PhysicalDimension=2
zone U Unstructured VertexSize=9 CellSize=4
GridCoordinates
data CoordinateX R8 9
0 1 2 0 1 2 0 1 2
data CoordinateY R8 9
0 0 0 1 1 1 2 2 2
end
Elements Poly NGON_n ElementRange=3,4  # two polygons
data ElementConnectivity I4 8
5 6 9 8
4 5 8 7
data ElementStartOffset I4 3
0 4 8
end
Elements Quads MIXED ElementRange=1,2
data ElementConnectivity I8 9
7 1 2 5 4
5 2 3 6
data ElementStartOffset I4 3
0 5 9
end
Elements Wall BAR_3 ElementRange=5,6
data ElementConnectivity I4 6
1 3 2
3 9 6
end
FlowSolution S GridLocation=CellCenter Rind=1,2
data Id R8 7
-9 1 2 3 4 -9 -9
end
ZoneBC
BC W BCWall GridLocation=EdgeCenter
data PointList I4 1
6
end
end
end
end
`
	// MIXED entries: 7 = QUAD_4, 5 = TRI_3 (FORMATS.md §2.2); NGON_n of
	// 4 nodes become quads, as polygons do in the VTK reader.
	f, info := readFFCGString(t, s, Options{})
	z := f.Zones[0]
	eqT(t, z.Types, field.Quad, field.Triangle, field.Quad, field.Quad)
	eqI(t, "conn", z.Conn, []int32{0, 1, 4, 3, 1, 2, 5, 4, 5, 8, 7, 3, 4, 7, 6})
	eqF(t, "Id", arr(t, z, "Id", field.AtCells, 1), []float64{1, 2, 3, 4})
	if len(f.Warnings) != 1 || !strings.Contains(f.Warnings[0], "BAR_3 elements reduced to their 2 corner nodes") {
		t.Errorf("warnings %q", f.Warnings)
	}
	eqI(t, "wall face", info.Patches[0].Faces.Conn, []int32{2, 8})
}

// Several bases: zone names are prefixed with the base name; the case
// information is the first base's.
func TestFFCGMultiBase(t *testing.T) {
	one := func(b string, x float64) string {
		return "base " + b + " CellDimension=1 PhysicalDimension=1\nReferenceState\nMach = " + strconv.FormatFloat(x, 'g', -1, 64) +
			"\nend\nzone Z Structured VertexSize=2\nGridCoordinates\ndata CoordinateX R8 2\n0 1\nend\nend zone\nend base\n"
	}
	f, info := readFFCGString(t, "ffcg 1\n"+one("A", 0.5)+one("B", 0.7), Options{})
	if len(f.Zones) != 2 || f.Zones[0].Name != "A/Z" || f.Zones[1].Name != "B/Z" {
		t.Fatalf("zones %q %q", f.Zones[0].Name, f.Zones[1].Name)
	}
	eqT(t, f.Zones[0].Types, field.Line)
	if info.Reference["Mach"] != 0.5 {
		t.Errorf("reference %v", info.Reference)
	}
}

// Options.Arrays keeps the wanted velocity even when it is derived from
// momentum and density, which are then dropped.
func TestFFCGArraySelection(t *testing.T) {
	f, err := ReadFile("../testdata/ffcg/example.ffcg", Options{Arrays: []string{"VelocityX"}})
	if err != nil {
		t.Fatal(err)
	}
	for _, z := range f.Zones {
		if got := names(z); !slices.Equal(got, []string{"VelocityX"}) {
			t.Errorf("%s: arrays %v", z.Name, got)
		}
	}
}

// Compressed copies (gzip, zstd) read the same; ReadFile recognises ffcg
// by its first line whatever the name; ReadFFCG refuses VTK.
func TestFFCGCompressedAndDispatch(t *testing.T) {
	plain, err := os.ReadFile("../testdata/ffcg/example.ffcg")
	if err != nil {
		t.Fatal(err)
	}
	want, _, err := ReadFFCG(bytes.NewReader(plain), "example.ffcg", Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range [][]byte{gzipped(t, plain), zstded(t, plain)} {
		for _, r := range []func() (*field.Field, error){
			func() (*field.Field, error) {
				f, _, err := ReadFFCG(fuzzUnsized{bytes.NewReader(c)}, "example.ffcg", Options{})
				return f, err
			},
			func() (*field.Field, error) {
				return ReadFile(writeTemp(t, "case.dat", c), Options{})
			},
		} {
			got, err := r()
			if err != nil {
				t.Fatal(err)
			}
			if d := fuzzDiffFields(want, got); d != "" {
				t.Error(d)
			}
		}
	}
	_, _, err = ReadFFCG(strings.NewReader("# vtk DataFile Version 4.2\nx\nASCII\n"), "a.vtk", Options{})
	if !errors.Is(err, ErrUnknownFormat) || err.Error() != `a.vtk:1: expected "ffcg 1", found "# vtk DataFile Version 4.2"` {
		t.Errorf("got %v", err)
	}
}

// 1, 2 and 4 workers give bit-identical fields on a file with value blocks
// much larger than a parse chunk.
func TestFFCGWorkersIdentical(t *testing.T) {
	data := benchFFCG(t, 40) // 40^3 hexahedra
	var ref *field.Field
	for _, w := range []int{1, 2, 4} {
		f, _, err := ReadFFCG(bytes.NewReader(data), "big.ffcg", Options{Workers: w})
		if err != nil {
			t.Fatal(err)
		}
		if ref == nil {
			ref = f
		} else if d := fuzzDiffFields(ref, f); d != "" {
			t.Errorf("workers %d: %s", w, d)
		}
	}
	if ref.NumCells() != 40*40*40 {
		t.Errorf("%d cells", ref.NumCells())
	}
}

// Conservative variables without pressure: p = (γ−1)(ρE − ½ρ|V|²) (perfect
// gas), with γ from the ReferenceState, else 1.4 and a warning. Chosen
// values: ρ = 1.2, ρu = 12 (u = 10), p = 1000, γ = 1.4 give
// ρE = p/(γ−1) + ½ρu² = 2500 + 60 = 2560.
func TestFFCGPressureFromEnergy(t *testing.T) {
	file := func(ref string) string {
		return "ffcg 1\nbase B CellDimension=2 PhysicalDimension=2\n" + ref +
			"zone U Unstructured VertexSize=3 CellSize=1\nGridCoordinates\ndata CoordinateX R8 3\n0 1 0\ndata CoordinateY R8 3\n0 0 1\nend\n" +
			"Elements T TRI_3 ElementRange=1,1\ndata ElementConnectivity I4 3\n1 2 3\nend\n" +
			"FlowSolution S GridLocation=CellCenter\ndata Density R8 1\n1.2\ndata MomentumX R8 1\n12\ndata MomentumY R8 1\n0\n" +
			"data EnergyStagnationDensity R8 1\n2560\nend\nend zone\nend base\n"
	}
	for _, c := range []struct {
		ref  string
		warn int
	}{{"ReferenceState\nSpecificHeatRatio = 1.4\nend\n", 0}, {"", 1}} {
		f, _ := readFFCGString(t, file(c.ref), Options{Arrays: []string{"Pressure"}})
		z := f.Zones[0]
		if got := names(z); !slices.Equal(got, []string{"Pressure"}) {
			t.Fatalf("arrays %v", got)
		}
		if p := z.Arrays[0].Data[0]; !closeTo(p, 1000, 1e-12) || z.Arrays[0].Location != field.AtCells {
			t.Errorf("pressure %v", p)
		}
		if len(f.Warnings) != c.warn {
			t.Errorf("warnings %q", f.Warnings)
		}
	}
}
