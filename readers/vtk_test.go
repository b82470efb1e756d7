package readers

import (
	"bytes"
	"encoding/binary"
	"errors"
	"fmt"
	"io"
	"math"
	"math/rand"
	"os"
	"path/filepath"
	"reflect"
	"runtime"
	"strconv"
	"strings"
	"testing"

	"github.com/klauspost/compress/gzip"
	"github.com/klauspost/compress/zstd"

	"farforce/field"
	"farforce/field/fieldtest"
)

// Format facts used below come from the VTK legacy file format document
// (Kitware/VTK Documentation/docs/vtk_file_formats/vtk_legacy_file_format.md)
// and vtkDataReader as summarised in FORMATS.md §1; the files are written
// by hand from those rules, and every expected value is the value written.

func readStr(t *testing.T, s string, opt Options) *field.Field {
	t.Helper()
	f, err := ReadVTK(strings.NewReader(s), "case.vtk", opt)
	if err != nil {
		t.Fatalf("ReadVTK: %v", err)
	}
	for _, z := range f.Zones {
		if err := z.Validate(); err != nil {
			t.Fatalf("Validate: %v", err)
		}
	}
	return f
}

func readErr(t *testing.T, s string, opt Options, want error) *Error {
	t.Helper()
	_, err := ReadVTK(strings.NewReader(s), "case.vtk", opt)
	if err == nil {
		t.Fatalf("no error, want %v", want)
	}
	var e *Error
	if !errors.As(err, &e) {
		t.Fatalf("error %v (%T) is not *Error", err, err)
	}
	if want != nil && !errors.Is(err, want) {
		t.Fatalf("error %q does not wrap %v", err, want)
	}
	return e
}

func eqF(t *testing.T, what string, got, want []float64) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("%s: %d values, want %d: %v", what, len(got), len(want), got)
	}
	for i := range got {
		if math.Float64bits(got[i]) != math.Float64bits(want[i]) && !(math.IsNaN(got[i]) && math.IsNaN(want[i])) {
			t.Fatalf("%s[%d] = %v, want %v", what, i, got[i], want[i])
		}
	}
}

func eqI(t *testing.T, what string, got, want []int32) {
	t.Helper()
	if !reflect.DeepEqual(got, want) {
		t.Fatalf("%s = %v, want %v", what, got, want)
	}
}

func eqT(t *testing.T, got []field.CellType, want ...field.CellType) {
	t.Helper()
	if !reflect.DeepEqual(got, want) {
		t.Fatalf("types = %v, want %v", got, want)
	}
}

func arr(t *testing.T, z *field.Zone, name string, loc field.Centering, comps int) []float64 {
	t.Helper()
	a := z.Array(name)
	if a == nil {
		t.Fatalf("no array %q in %v", name, names(z))
	}
	if a.Location != loc || a.Components != comps {
		t.Fatalf("array %q: %v/%d, want %v/%d", name, a.Location, a.Components, loc, comps)
	}
	return a.Data
}

func names(z *field.Zone) []string {
	var n []string
	for _, a := range z.Arrays {
		n = append(n, a.Name)
	}
	return n
}

// f32 returns v rounded to float32, as VTK stores "float" data.
func f32(v ...float64) []float64 {
	out := make([]float64, len(v))
	for i, x := range v {
		out[i] = float64(float32(x))
	}
	return out
}

// A classic (≤4.2) unstructured grid: CELLS n size with "npts i j k ..."
// entries, CELL_TYPES ints (VTK legacy file format document, "Unstructured
// Grid"); a tetrahedron (10) and a wedge (13).
const ugridASCII = `# vtk DataFile Version 4.2
tet and wedge
ASCII
DATASET UNSTRUCTURED_GRID
POINTS 7 float
0 0 0  1 0 0  0 1 0  0 0 1
0.1 0.2 0.3 1.5 -2.5e-1 3E2
-0 0 7
CELLS 2 12
4 0 1 2 3
6 1 2 3 4 5 6
CELL_TYPES 2
10
13
CELL_DATA 2
SCALARS id int 1
LOOKUP_TABLE default
7 -8
POINT_DATA 7
VECTORS vel double
1 2 3 4 5 6 7 8 9 10 11 12 13 14 15 16 17 18 19 20 0.1
`

func TestUnstructuredClassicASCII(t *testing.T) {
	f := readStr(t, ugridASCII, Options{})
	z := f.Zones[0]
	if z.Name != "case.vtk" {
		t.Errorf("zone name %q", z.Name)
	}
	eqF(t, "points", z.Points, f32(0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1, 0.1, 0.2, 0.3, 1.5, -0.25, 300, math.Copysign(0, -1), 0, 7))
	eqT(t, z.Types, field.Tetra, field.Wedge)
	eqI(t, "offsets", z.Offsets, []int32{0, 4, 10})
	eqI(t, "conn", z.Conn, []int32{0, 1, 2, 3, 1, 2, 3, 4, 5, 6})
	eqF(t, "id", arr(t, z, "id", field.AtCells, 1), []float64{7, -8})
	v := arr(t, z, "vel", field.AtPoints, 3)
	eqF(t, "vel", v[18:], []float64{19, 20, 0.1})
	if len(f.Warnings) != 0 {
		t.Errorf("warnings: %v", f.Warnings)
	}
}

// bin builds BINARY test files: keyword lines in ASCII, data big-endian
// (VTK legacy file format document, "Binary files").
type bin struct{ bytes.Buffer }

func (b *bin) line(s string) *bin { b.WriteString(s + "\n"); return b }
func (b *bin) f32(v ...float64) *bin {
	for _, x := range v {
		b.Write(binary.BigEndian.AppendUint32(nil, math.Float32bits(float32(x))))
	}
	return b
}
func (b *bin) f64(v ...float64) *bin {
	for _, x := range v {
		b.Write(binary.BigEndian.AppendUint64(nil, math.Float64bits(x)))
	}
	return b
}
func (b *bin) i32(v ...int32) *bin {
	for _, x := range v {
		b.Write(binary.BigEndian.AppendUint32(nil, uint32(x)))
	}
	return b
}
func (b *bin) i64(v ...int64) *bin {
	for _, x := range v {
		b.Write(binary.BigEndian.AppendUint64(nil, uint64(x)))
	}
	return b
}
func (b *bin) i16(v ...int16) *bin {
	for _, x := range v {
		b.Write(binary.BigEndian.AppendUint16(nil, uint16(x)))
	}
	return b
}
func (b *bin) u8(v ...byte) *bin { b.Write(v); return b }

func TestUnstructuredClassicBinary(t *testing.T) {
	var b bin
	b.line("# vtk DataFile Version 3.0").line("binary").line("BINARY").line("DATASET UNSTRUCTURED_GRID")
	b.line("POINTS 7 double").f64(0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1, 0.1, 0.2, 0.3, 1.5, -0.25, 300, 0, 0, 7).line("")
	b.line("CELLS 2 12").i32(4, 0, 1, 2, 3, 6, 1, 2, 3, 4, 5, 6).line("")
	b.line("CELL_TYPES 2").i32(10, 13).line("")
	b.line("CELL_DATA 2").line("SCALARS id int 1").line("LOOKUP_TABLE default").i32(7, -8).line("")
	f := readStr(t, b.String(), Options{})
	z := f.Zones[0]
	eqF(t, "points", z.Points, []float64{0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1, 0.1, 0.2, 0.3, 1.5, -0.25, 300, 0, 0, 7})
	eqT(t, z.Types, field.Tetra, field.Wedge)
	eqI(t, "conn", z.Conn, []int32{0, 1, 2, 3, 1, 2, 3, 4, 5, 6})
	eqF(t, "id", arr(t, z, "id", field.AtCells, 1), []float64{7, -8})
}

// The 5.x layout: CELLS nOffsets nConn, then OFFSETS and CONNECTIVITY
// with their own type (vtkUnstructuredGridReader for FileMajorVersion >= 5;
// FORMATS.md §1.4).
func TestUnstructured51(t *testing.T) {
	ascii := `# vtk DataFile Version 5.1
v5
ASCII
DATASET UNSTRUCTURED_GRID
POINTS 5 double
0 0 0 1 0 0 1 1 0 0 1 0 0.5 0.5 1
CELLS 3 9
OFFSETS vtktypeint64
0 5 9
CONNECTIVITY vtktypeint64
0 1 2 3 4
0 1 2 3
CELL_TYPES 2
14
9
`
	var b bin
	b.line("# vtk DataFile Version 5.1").line("v5").line("BINARY").line("DATASET UNSTRUCTURED_GRID")
	b.line("POINTS 5 float").f32(0, 0, 0, 1, 0, 0, 1, 1, 0, 0, 1, 0, 0.5, 0.5, 1).line("")
	b.line("CELLS 3 9").line("OFFSETS vtktypeint64").i64(0, 5, 9).line("")
	b.line("CONNECTIVITY vtktypeint64").i64(0, 1, 2, 3, 4, 0, 1, 2, 3).line("")
	b.line("CELL_TYPES 2").i32(14, 9).line("")
	for _, s := range []string{ascii, b.String()} {
		z := readStr(t, s, Options{}).Zones[0]
		eqT(t, z.Types, field.Pyramid, field.Quad)
		eqI(t, "offsets", z.Offsets, []int32{0, 5, 9})
		eqI(t, "conn", z.Conn, []int32{0, 1, 2, 3, 4, 0, 1, 2, 3})
		eqF(t, "points", z.Points[12:], []float64{0.5, 0.5, 1})
	}
}

// STRUCTURED_POINTS: points x fastest, origin + i*spacing; ASPECT_RATIO
// is the version-1 name of SPACING; keyword order varies (FORMATS.md
// §1.4). A 3x2x1 grid is 2D: two quads.
func TestStructuredPoints(t *testing.T) {
	s := `# vtk DataFile Version 2.0
sp
ASCII
DATASET STRUCTURED_POINTS
ASPECT_RATIO 0.5 2 1
ORIGIN 1 2 3
DIMENSIONS 3 2 1
CELL_DATA 2
SCALARS c float
LOOKUP_TABLE default
10 20
POINT_DATA 6
SCALARS p double 1
LOOKUP_TABLE default
0 1 2 3 4 5
`
	z := readStr(t, s, Options{}).Zones[0]
	eqF(t, "points", z.Points, []float64{1, 2, 3, 1.5, 2, 3, 2, 2, 3, 1, 4, 3, 1.5, 4, 3, 2, 4, 3})
	eqT(t, z.Types, field.Quad, field.Quad)
	eqI(t, "conn", z.Conn, []int32{0, 1, 4, 3, 1, 2, 5, 4})
	eqF(t, "c", arr(t, z, "c", field.AtCells, 1), []float64{10, 20})
	eqF(t, "p", arr(t, z, "p", field.AtPoints, 1), []float64{0, 1, 2, 3, 4, 5})

	line := strings.Replace(strings.Replace(s, "DIMENSIONS 3 2 1", "DIMENSIONS 1 1 3", 1), "CELL_DATA 2", "CELL_DATA 2", 1)
	line = strings.Replace(line, "POINT_DATA 6", "POINT_DATA 3", 1)
	line = strings.Replace(line, "0 1 2 3 4 5", "0 1 2", 1)
	z = readStr(t, line, Options{}).Zones[0]
	eqT(t, z.Types, field.Line, field.Line)
	eqI(t, "conn", z.Conn, []int32{0, 1, 1, 2})
	eqF(t, "points", z.Points, []float64{1, 2, 3, 1, 2, 4, 1, 2, 5})

	// BINARY, 3D: one voxel-shaped hexahedron, SPACING before ORIGIN.
	var b bin
	b.line("# vtk DataFile Version 3.0").line("sp").line("BINARY").line("DATASET STRUCTURED_POINTS")
	b.line("SPACING 1 2 4").line("ORIGIN 0 0 -1").line("DIMENSIONS 2 2 2")
	b.line("POINT_DATA 8").line("SCALARS p float").line("LOOKUP_TABLE default").f32(0, 1, 2, 3, 4, 5, 6, 7.5).line("")
	z = readStr(t, b.String(), Options{}).Zones[0]
	eqT(t, z.Types, field.Hexa)
	eqI(t, "conn", z.Conn, []int32{0, 1, 3, 2, 4, 5, 7, 6})
	eqF(t, "point 7", z.Points[21:], []float64{1, 2, 3})
	eqF(t, "p", arr(t, z, "p", field.AtPoints, 1), []float64{0, 1, 2, 3, 4, 5, 6, 7.5})
}

// STRUCTURED_GRID: implicit hexahedra (i,j,k),(i+1,j,k),(i+1,j+1,k),
// (i,j+1,k) then the same at k+1 (VTK_HEXAHEDRON order; FORMATS.md §1.4).
func TestStructuredGridHex(t *testing.T) {
	var pts []string
	for k := 0; k < 2; k++ {
		for j := 0; j < 2; j++ {
			for i := 0; i < 3; i++ {
				pts = append(pts, fmt.Sprintf("%d %d %d", i, j, k))
			}
		}
	}
	s := "# vtk DataFile Version 3.0\nsg\nASCII\nDATASET STRUCTURED_GRID\nDIMENSIONS 3 2 2\nPOINTS 12 double\n" + strings.Join(pts, "\n") + "\n"
	z := readStr(t, s, Options{}).Zones[0]
	eqT(t, z.Types, field.Hexa, field.Hexa)
	eqI(t, "conn", z.Conn, []int32{0, 1, 4, 3, 6, 7, 10, 9, 1, 2, 5, 4, 7, 8, 11, 10})
	eqF(t, "point 11", z.Points[33:], []float64{2, 1, 1})
}

func TestRectilinearGrid(t *testing.T) {
	var b bin
	b.line("# vtk DataFile Version 3.0").line("rg").line("BINARY").line("DATASET RECTILINEAR_GRID").line("DIMENSIONS 2 3 1")
	b.line("X_COORDINATES 2 float").f32(0, 1).line("")
	b.line("Y_COORDINATES 3 double").f64(0, 0.5, 2).line("")
	b.line("Z_COORDINATES 1 int").i32(-4).line("")
	z := readStr(t, b.String(), Options{}).Zones[0]
	eqF(t, "points", z.Points, []float64{0, 0, -4, 1, 0, -4, 0, 0.5, -4, 1, 0.5, -4, 0, 2, -4, 1, 2, -4})
	eqT(t, z.Types, field.Quad, field.Quad)
	eqI(t, "conn", z.Conn, []int32{0, 1, 3, 2, 2, 3, 5, 4})
}

// POLYDATA: cells numbered VERTICES, LINES, POLYGONS, TRIANGLE_STRIPS in
// that order whatever the file order (vtkPolyData); polylines split into
// lines, strips into triangles (odd ones with the first two nodes
// swapped, vtkTriangleStrip), polygons of 3/4 nodes are triangles/quads.
func TestPolyData(t *testing.T) {
	s := `# vtk DataFile Version 4.2
pd
ASCII
DATASET POLYDATA
POINTS 6 float
0 0 0 1 0 0 2 0 0 0 1 0 1 1 0 2 1 0
TRIANGLE_STRIPS 1 6
5 0 3 1 4 2
POLYGONS 3 15
3 0 1 4
4 0 1 4 3
5 0 1 2 5 4
LINES 1 4
3 0 1 2
VERTICES 1 3
2 5 4
CELL_DATA 6
SCALARS c int
LOOKUP_TABLE default
10 11 12 13 14 15
`
	f := readStr(t, s, Options{})
	z := f.Zones[0]
	eqT(t, z.Types, field.Vertex, field.Vertex, field.Line, field.Line, field.Triangle, field.Quad, field.Polygon,
		field.Triangle, field.Triangle, field.Triangle)
	eqI(t, "conn", z.Conn, []int32{5, 4, 0, 1, 1, 2, 0, 1, 4, 0, 1, 4, 3, 0, 1, 2, 5, 4, 0, 3, 1, 1, 3, 4, 1, 4, 2})
	eqF(t, "c", arr(t, z, "c", field.AtCells, 1), []float64{10, 10, 11, 11, 12, 13, 14, 15, 15, 15})
}

// The real solution's wall file is a POLYDATA polyline (copied in spirit:
// 5.1 polydata sections use OFFSETS/CONNECTIVITY like CELLS).
func TestPolyData51Binary(t *testing.T) {
	var b bin
	b.line("# vtk DataFile Version 5.1").line("pd").line("BINARY").line("DATASET POLYDATA")
	b.line("POINTS 3 double").f64(0, 0, 0, 1, 0, 0, 1, 1, 0).line("")
	b.line("POLYGONS 2 3").line("OFFSETS vtktypeint64").i64(0, 3).line("").line("CONNECTIVITY vtktypeint64").i64(0, 1, 2).line("")
	b.line("LINES 2 2").line("OFFSETS vtktypeint32").i32(0, 2).line("").line("CONNECTIVITY vtktypeint32").i32(2, 0).line("")
	z := readStr(t, b.String(), Options{}).Zones[0]
	eqT(t, z.Types, field.Line, field.Triangle)
	eqI(t, "conn", z.Conn, []int32{2, 0, 0, 1, 2})
}

// Attribute blocks of the VTK legacy file format document ("Dataset
// attribute format") and vtkDataReader: SCALARS with components and a
// lookup table, COLOR_SCALARS, NORMALS, TENSORS, TENSORS6,
// TEXTURE_COORDINATES, FIELD with NULL_ARRAY, a standalone LOOKUP_TABLE,
// METADATA after an array, a dataset-level FIELD, %-encoded names.
func TestAttributesASCII(t *testing.T) {
	s := `# vtk DataFile Version 4.2
attrs
ASCII
DATASET POLYDATA
FIELD FieldData 2
TIME 1 1 double
1.5
CYCLE 1 1 int
3
POINTS 2 double
0 0 0 1 0 0
LINES 1 3
2 0 1
POINT_DATA 2
SCALARS two%20comp float 2
LOOKUP_TABLE my_table
1 2 3 4
METADATA
COMPONENT_NAMES
a
b

LOOKUP_TABLE my_table 2
0 0 0 1
1 1 1 1
COLOR_SCALARS rgb 3
0 0.5 1 1 1 1
NORMALS n double
0 0 1 0 1 0
TENSORS T double
1 2 3 4 5 6 7 8 9
-1 -2 -3 -4 -5 -6 -7 -8 -9
TENSORS6 S double
11 22 33 12 23 13
1 2 3 4 5 6
TEXTURE_COORDINATES uv 2 float
0 0 1 1
CELL_DATA 1
FIELD FieldData 3
NULL_ARRAY
pres%25 1 1 double
101325
METADATA
INFORMATION 0

str 1 1 string
hello%20world
GLOBAL_IDS gid int
42
`
	f := readStr(t, s, Options{})
	z := f.Zones[0]
	eqF(t, "two comp", arr(t, z, "two comp", field.AtPoints, 2), []float64{1, 2, 3, 4})
	eqF(t, "rgb", arr(t, z, "rgb", field.AtPoints, 3), []float64{0, 0.5, 1, 1, 1, 1})
	eqF(t, "n", arr(t, z, "n", field.AtPoints, 3), []float64{0, 0, 1, 0, 1, 0})
	eqF(t, "T", arr(t, z, "T", field.AtPoints, 9)[9:], []float64{-1, -2, -3, -4, -5, -6, -7, -8, -9})
	eqF(t, "S", arr(t, z, "S", field.AtPoints, 6), []float64{11, 22, 33, 12, 23, 13, 1, 2, 3, 4, 5, 6})
	eqF(t, "uv", arr(t, z, "uv", field.AtPoints, 2), []float64{0, 0, 1, 1})
	eqF(t, "pres%", arr(t, z, "pres%", field.AtCells, 1), []float64{101325})
	eqF(t, "gid", arr(t, z, "gid", field.AtCells, 1), []float64{42})
	if z.Array("str") != nil || z.Array("TIME") != nil {
		t.Errorf("string or dataset-level arrays kept: %v", names(z))
	}
	w := strings.Join(f.Warnings, "\n")
	if !strings.Contains(w, `string array "str" skipped`) || !strings.Contains(w, "TIME, CYCLE") {
		t.Errorf("warnings %q", w)
	}
}

// BINARY attributes: COLOR_SCALARS and LOOKUP_TABLE are unsigned chars
// (FORMATS.md §1.2), METADATA may follow a binary array.
func TestAttributesBinary(t *testing.T) {
	var b bin
	b.line("# vtk DataFile Version 4.2").line("attrs").line("BINARY").line("DATASET POLYDATA")
	b.line("POINTS 2 float").f32(0, 0, 0, 1, 0, 0).line("")
	b.line("VERTICES 2 4").i32(1, 0, 1, 1).line("")
	b.line("CELL_DATA 2").line("COLOR_SCALARS rgba 4").u8(0, 51, 255, 255, 255, 0, 0, 255).line("")
	b.line("LOOKUP_TABLE lut 1").u8(1, 2, 3, 4).line("")
	b.line("FIELD FieldData 1").line("w 2 2 short").i16(-1, 2, 3, -4).line("").line("METADATA").line("INFORMATION 0").line("")
	b.line("POINT_DATA 2").line("TENSORS6 s float").f32(1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12).line("")
	z := readStr(t, b.String(), Options{}).Zones[0]
	eqT(t, z.Types, field.Vertex, field.Vertex)
	eqF(t, "rgba", arr(t, z, "rgba", field.AtCells, 4), []float64{0, 51.0 / 255, 1, 1, 1, 0, 0, 1})
	eqF(t, "w", arr(t, z, "w", field.AtCells, 2), []float64{-1, 2, 3, -4})
	eqF(t, "s", arr(t, z, "s", field.AtPoints, 6), []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12})
}

// Every data type name of vtkDataReader::ReadArray (FORMATS.md §1.3),
// BINARY with its byte size and ASCII, including packed bits (most
// significant bit first, vtkBitArray).
func TestDataTypes(t *testing.T) {
	type tc struct {
		name string
		data func(b *bin)
		want []float64
	}
	be := func(size int, v ...int64) func(b *bin) {
		return func(b *bin) {
			for _, x := range v {
				var buf [8]byte
				binary.BigEndian.PutUint64(buf[:], uint64(x))
				b.Write(buf[8-size:])
			}
		}
	}
	cases := []tc{
		{"bit", func(b *bin) { b.u8(0xa0) }, []float64{1, 0, 1}},
		{"unsigned_char", be(1, 0, 200, 255), []float64{0, 200, 255}},
		{"char", be(1, -128, 5, -1), []float64{-128, 5, -1}},
		{"signed_char", be(1, -2, 5, 127), []float64{-2, 5, 127}},
		{"short", be(2, -32768, 7, 32767), []float64{-32768, 7, 32767}},
		{"unsigned_short", be(2, 65535, 0, 1), []float64{65535, 0, 1}},
		{"int", be(4, math.MinInt32, 0, math.MaxInt32), []float64{math.MinInt32, 0, math.MaxInt32}},
		{"unsigned_int", be(4, math.MaxUint32, 0, 1), []float64{math.MaxUint32, 0, 1}},
		{"long", be(8, -1<<40, 0, 3), []float64{-1 << 40, 0, 3}},
		{"unsigned_long", be(8, 1<<50, 0, 3), []float64{1 << 50, 0, 3}},
		{"vtktypeint64", be(8, -5, 1<<53, 3), []float64{-5, 1 << 53, 3}},
		{"vtktypeuint64", be(8, 5, 1<<53, 3), []float64{5, 1 << 53, 3}},
		{"vtktypeint8", be(1, -5, 6, 7), []float64{-5, 6, 7}},
		{"vtktypeuint16", be(2, 5, 60000, 7), []float64{5, 60000, 7}},
		{"vtktypeint32", be(4, -5, 6, 7), []float64{-5, 6, 7}},
		{"vtkIdType", be(4, 1, 2, 3), []float64{1, 2, 3}},
		{"float", func(b *bin) { b.f32(0.1, -2.5, 1e30) }, f32(0.1, -2.5, 1e30)},
		{"double", func(b *bin) { b.f64(0.1, -2.5, 1e300) }, []float64{0.1, -2.5, 1e300}},
	}
	head := func(format string) string {
		return "# vtk DataFile Version 3.0\ntypes\n" + format + "\nDATASET POLYDATA\nPOINTS 3 double\n"
	}
	for _, c := range cases {
		var b bin
		b.WriteString(head("BINARY"))
		b.f64(0, 0, 0, 1, 0, 0, 2, 0, 0).line("")
		b.line("POINT_DATA 3").line("SCALARS a " + c.name).line("LOOKUP_TABLE default")
		c.data(&b)
		b.line("")
		z := readStr(t, b.String(), Options{}).Zones[0]
		eqF(t, c.name+" binary", arr(t, z, "a", field.AtPoints, 1), c.want)

		var vals []string
		for _, v := range c.want {
			vals = append(vals, strconv.FormatFloat(v, 'g', -1, 64))
		}
		if c.name == "float" {
			vals = []string{"0.1", "-2.5", "1e30"}
		}
		a := head("ASCII") + "0 0 0 1 0 0 2 0 0\nPOINT_DATA 3\nFIELD f 1\na 1 3 " + c.name + "\n" + strings.Join(vals, " ") + "\n"
		z = readStr(t, a, Options{}).Zones[0]
		eqF(t, c.name+" ascii", arr(t, z, "a", field.AtPoints, 1), c.want)
	}
}

// NaN and infinity spellings accepted by current VTK (TestLegacyArrayInfNan:
// any case, optional sign, token ends at whitespace; FORMATS.md §1.9).
func TestNaNInf(t *testing.T) {
	s := "# vtk DataFile Version 4.2\nnan\nASCII\nDATASET POLYDATA\nPOINTS 3 double\n0 0 0 1 0 0 2 0 0\nPOINT_DATA 3\n" +
		"SCALARS a double 4\nLOOKUP_TABLE default\nnan NaN -nan +NAN inf -inf +Infinity INF -INFINITY infinity 1e400 -1e400\n"
	z := readStr(t, s, Options{}).Zones[0]
	got := arr(t, z, "a", field.AtPoints, 4)
	for i := 0; i < 4; i++ {
		if !math.IsNaN(got[i]) {
			t.Errorf("value %d = %v, want NaN", i, got[i])
		}
	}
	inf, ninf := math.Inf(1), math.Inf(-1)
	eqF(t, "inf", got[4:], []float64{inf, ninf, inf, inf, ninf, inf, inf, ninf})
	for _, bad := range []string{"nan5", "infini", "0x1p-2", "1_000", "1.2.3", "--1", "1e", "e5", "."} {
		e := readErr(t, strings.Replace(s, "-nan", bad, 1), Options{}, nil)
		if e.Line != 10 || !strings.Contains(e.Error(), strconv.Quote(bad)) {
			t.Errorf("%s: error %q, want line 10 naming the token", bad, e)
		}
	}
}

func TestCRLF(t *testing.T) {
	crlf := strings.ReplaceAll(ugridASCII, "\n", "\r\n")
	a := readStr(t, ugridASCII, Options{}).Zones[0]
	b := readStr(t, crlf, Options{}).Zones[0]
	if !reflect.DeepEqual(a, b) {
		t.Fatal("CRLF file differs from LF file")
	}
	var bb bin
	bb.WriteString("# vtk DataFile Version 3.0\r\nx\r\nBINARY\r\nDATASET POLYDATA\r\nPOINTS 1 double\r\n")
	bb.f64(1, 2, 3).WriteString("\r\nVERTICES 1 2\r\n")
	bb.i32(1, 0).WriteString("\r\n")
	z := readStr(t, bb.String(), Options{}).Zones[0]
	eqF(t, "points", z.Points, []float64{1, 2, 3})
}

// Pixels and voxels are lexicographic; quad = pixel[0,1,3,2], hexahedron
// = voxel[0,1,3,2,4,5,7,6] (FORMATS.md §1.8). Quadratic cells keep their
// corner nodes, which come first (vtkQuadraticTetra etc.).
func TestReorderAndQuadratic(t *testing.T) {
	pts := make([]string, 27)
	for i := range pts {
		pts[i] = fmt.Sprintf("%d 0 0", i)
	}
	s := "# vtk DataFile Version 4.2\nq\nASCII\nDATASET UNSTRUCTURED_GRID\nPOINTS 27 double\n" + strings.Join(pts, " ") + `
CELLS 6 66
4 0 1 2 3
8 0 1 2 3 4 5 6 7
10 0 1 2 3 4 5 6 7 8 9
10 9 8 7 6 5 4 3 2 1 0
20 0 1 2 3 4 5 6 7 8 9 10 11 12 13 14 15 16 17 18 19
8 0 1 2 3 4 5 6 7
CELL_TYPES 6
8 11 24 24 25 36
`
	f := readStr(t, s, Options{})
	z := f.Zones[0]
	eqT(t, z.Types, field.Quad, field.Hexa, field.Tetra, field.Tetra, field.Hexa, field.Quad)
	eqI(t, "conn", z.Conn, []int32{0, 1, 3, 2, 0, 1, 3, 2, 4, 5, 7, 6, 0, 1, 2, 3, 9, 8, 7, 6, 0, 1, 2, 3, 4, 5, 6, 7, 0, 1, 2, 3})
	if len(f.Warnings) != 3 || !strings.Contains(f.Warnings[0], "2 QUADRATIC_TETRA (24)") {
		t.Errorf("warnings %q, want one per quadratic type", f.Warnings)
	}
}

func TestUnsupportedAndBadCells(t *testing.T) {
	base := "# vtk DataFile Version 4.2\nq\nASCII\nDATASET UNSTRUCTURED_GRID\nPOINTS 4 double\n0 0 0 1 0 0 0 1 0 0 0 1\nCELLS 2 10\n4 0 1 2 3\n4 0 1 2 3\nCELL_TYPES 2\n10\n%s\n"
	e := readErr(t, fmt.Sprintf(base, "42"), Options{}, ErrUnsupported)
	if !strings.Contains(e.Error(), "cell 1") || !strings.Contains(e.Error(), "42 (POLYHEDRON)") {
		t.Errorf("error %q should name cell 1 and type 42", e)
	}
	e = readErr(t, fmt.Sprintf(base, "12"), Options{}, nil)
	if !strings.Contains(e.Error(), "cell 1 of type HEXAHEDRON (12): 8 nodes, found 4 nodes") || e.Line != 7 {
		t.Errorf("error %q (line %d)", e, e.Line)
	}
	// A polygon (7) needs at least 3 nodes; one with none is an error
	// (classic layout: the entry "0").
	zero := strings.Replace(strings.Replace(fmt.Sprintf(base, "7"), "CELLS 2 10", "CELLS 2 6", 1), "4 0 1 2 3\nCELL_TYPES", "0\nCELL_TYPES", 1)
	e = readErr(t, zero, Options{}, nil)
	if !strings.Contains(e.Error(), "cell 1 of type POLYGON (7): at least 3 nodes, found 0 nodes") {
		t.Errorf("error %q", e)
	}
	bad := strings.Replace(fmt.Sprintf(base, "10"), "4 0 1 2 3\nCELL_TYPES", "4 0 1 2 4\nCELL_TYPES", 1)
	e = readErr(t, bad, Options{}, nil)
	if !strings.Contains(e.Error(), "cell 1: node indices in [0,4), found 4") {
		t.Errorf("error %q", e)
	}
}

// vtkGhostType cell values != 0 mark ghost cells (vtkDataSetAttributes:
// DUPLICATECELL = 1, ...); the array becomes Zone.Blank.
func TestGhostCells(t *testing.T) {
	s := "# vtk DataFile Version 4.2\ng\nASCII\nDATASET STRUCTURED_POINTS\nDIMENSIONS 4 2 1\nCELL_DATA 3\n" +
		"SCALARS vtkGhostType unsigned_char\nLOOKUP_TABLE default\n0 1 32\nPOINT_DATA 8\nFIELD f 1\nvtkGhostType 1 8 unsigned_char\n0 0 0 0 1 1 1 1\n"
	z := readStr(t, s, Options{Arrays: []string{}}).Zones[0]
	if !reflect.DeepEqual(z.Blank, []bool{false, true, true}) || len(z.Arrays) != 0 {
		t.Fatalf("blank %v arrays %v", z.Blank, names(z))
	}
}

// Options.Arrays: unlisted arrays are skipped without conversion, so a
// malformed token inside one is not an error.
func TestArraySelection(t *testing.T) {
	s := strings.Replace(ugridASCII, "7 -8", "7 oops", 1)
	z := readStr(t, s, Options{Arrays: []string{"vel"}}).Zones[0]
	if !reflect.DeepEqual(names(z), []string{"vel"}) {
		t.Fatalf("arrays %v", names(z))
	}
	var b bin
	b.line("# vtk DataFile Version 3.0").line("x").line("BINARY").line("DATASET POLYDATA")
	b.line("POINTS 2 double").f64(0, 0, 0, 1, 0, 0).line("")
	b.line("POINT_DATA 2").line("VECTORS skip double").f64(1, 2, 3, 4, 5, 6).line("")
	b.line("SCALARS keep float 1").line("LOOKUP_TABLE default").f32(7, 8).line("")
	z = readStr(t, b.String(), Options{Arrays: []string{"keep"}}).Zones[0]
	if !reflect.DeepEqual(names(z), []string{"keep"}) {
		t.Fatalf("arrays %v", names(z))
	}
	eqF(t, "keep", z.Arrays[0].Data, []float64{7, 8})
}

// writeTemp writes data to a file in t's temporary directory.
func writeTemp(t *testing.T, name string, data []byte) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, data, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func gzipped(t *testing.T, b []byte) []byte {
	var out bytes.Buffer
	w := gzip.NewWriter(&out)
	w.Write(b)
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	return out.Bytes()
}

func zstded(t *testing.T, b []byte) []byte {
	w, err := zstd.NewWriter(nil)
	if err != nil {
		t.Fatal(err)
	}
	return w.EncodeAll(b, nil)
}

// Compressed copies are recognised by magic bytes, not by name, and decode
// to the same field.
func TestCompressed(t *testing.T) {
	var bb bytes.Buffer
	z0 := fieldtest.BoxHex([3]float64{0, 0, 0}, [3]float64{1, 1, 1}, [3]int{3, 3, 3})
	fieldtest.SamplePoints(z0, "p", 1, func(x [3]float64, d []float64) { d[0] = x[0] + 2*x[1] })
	if err := WriteVTK(&bb, z0, WriteOptions{Binary: true}); err != nil {
		t.Fatal(err)
	}
	plain := bb.Bytes()
	want, err := ReadFile(writeTemp(t, "a.vtk", plain), Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name string
		data []byte
	}{{"a.vtk.gz", gzipped(t, plain)}, {"a.vtk", zstded(t, plain)}, {"a.dat", gzipped(t, []byte(ugridASCII))}} {
		got, err := ReadFile(writeTemp(t, c.name, c.data), Options{})
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if c.name == "a.dat" {
			want = readStr(t, ugridASCII, Options{})
		}
		got.Zones[0].Name = want.Zones[0].Name
		if !reflect.DeepEqual(got, want) {
			t.Fatalf("%s decodes differently", c.name)
		}
	}
	// A stream larger than MaxBytes after decompression.
	_, err = ReadFile(writeTemp(t, "big.gz", gzipped(t, plain)), Options{MaxBytes: 1000})
	if !errors.Is(err, ErrTooLarge) {
		t.Fatalf("MaxBytes: error %v, want ErrTooLarge", err)
	}
}

func TestReadFiles(t *testing.T) {
	dir := t.TempDir()
	var paths []string
	for i := 0; i < 3; i++ {
		z := fieldtest.BoxTet([3]float64{float64(i), 0, 0}, [3]float64{float64(i + 1), 1, 1}, [3]int{1, 1, 1})
		var b bytes.Buffer
		if err := WriteVTK(&b, z, WriteOptions{Binary: i%2 == 0}); err != nil {
			t.Fatal(err)
		}
		p := filepath.Join(dir, fmt.Sprintf("part%d.vtk", i))
		if err := os.WriteFile(p, b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		paths = append(paths, p)
	}
	f, err := ReadFiles(paths, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Zones) != 3 || f.Zones[2].Name != "part2.vtk" || f.NumCells() != 18 {
		t.Fatalf("zones %d, last %q, cells %d", len(f.Zones), f.Zones[2].Name, f.NumCells())
	}
	if lo, _ := f.Bounds(); lo[0] != 0 {
		t.Errorf("bounds lo %v", lo)
	}
}

// Serial and parallel parsing give identical fields: the file is large
// enough to be cut into many parts.
func TestWorkersIdentical(t *testing.T) {
	z := fieldtest.BoxTet([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{20, 20, 20})
	rng := rand.New(rand.NewSource(7))
	fieldtest.SamplePoints(z, "v", 3, func(x [3]float64, d []float64) {
		d[0], d[1], d[2] = rng.NormFloat64(), rng.Float64()*1e-7, float64(rng.Intn(1000))
	})
	fieldtest.SampleCells(z, "c", 1, func(x [3]float64, d []float64) { d[0] = rng.ExpFloat64() })
	for _, binary := range []bool{false, true} {
		var b bytes.Buffer
		if err := WriteVTK(&b, z, WriteOptions{Binary: binary, Version: "5.1"}); err != nil {
			t.Fatal(err)
		}
		if !binary && b.Len() < 1<<20 {
			t.Fatalf("test file of %d bytes too small to split", b.Len())
		}
		var ref *field.Field
		for _, w := range []int{1, 2, 3, 8} {
			f, err := ReadVTK(bytes.NewReader(b.Bytes()), "w.vtk", Options{Workers: w})
			if err != nil {
				t.Fatal(err)
			}
			if ref == nil {
				ref = f
			} else if !reflect.DeepEqual(f, ref) {
				t.Fatalf("binary=%v: workers=%d differs from workers=1", binary, w)
			}
		}
		if !reflect.DeepEqual(ref.Zones[0].Arrays, z.Arrays) {
			t.Fatalf("binary=%v: arrays differ from the written zone", binary)
		}
	}
}

// parseNumber must give the bits of strconv.ParseFloat (64 and 32 bits)
// for every decimal token (differential test over random tokens of all
// shapes: short and long mantissas, exponents near the fast-path limits,
// subnormals, overflow, float32 halfway cases).
func TestParseNumberDifferential(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	digits := func(n int) string {
		b := make([]byte, n)
		for i := range b {
			b[i] = byte('0' + rng.Intn(10))
		}
		return string(b)
	}
	toks := []string{"0", "-0", "+0", "0.0", "1", "1.", ".5", "-.5", "00012", "1e22", "1e23", "9007199254740993",
		"4.9406564584124654e-324", "2.2250738585072011e-308", "1.7976931348623157e308", "1e-400", "3.4028235e38",
		"1.00000005960464477539062500", "1.0000000596046448", "16777217", "0.16864630957366789", "123456789012345678901234"}
	for f := range 20000 {
		var s string
		switch f % 5 {
		case 0:
			s = strconv.FormatFloat(rng.NormFloat64()*math.Pow(10, float64(rng.Intn(40)-20)), 'g', -1, 64)
		case 1:
			s = strconv.FormatFloat(float64(float32(rng.Float64())), 'e', rng.Intn(12), 64)
		case 2:
			s = digits(1+rng.Intn(25)) + "." + digits(rng.Intn(25)) + "e" + strconv.Itoa(rng.Intn(700)-350)
		case 3:
			s = strconv.FormatFloat(rng.Float64()*1e6, 'f', rng.Intn(20), 64)
		default:
			// float32 midpoints written exactly: (2m+1)·2^(e-1)
			m := float64(1<<23 + rng.Intn(1<<23))
			s = strconv.FormatFloat((2*m+1)*math.Pow(2, float64(rng.Intn(40)-60)), 'g', -1, 64)
		}
		if rng.Intn(3) == 0 && s[0] != '-' {
			s = "-" + s
		}
		toks = append(toks, s)
	}
	for _, s := range toks {
		for _, bits := range []int{64, 32} {
			want, err := strconv.ParseFloat(s, bits)
			if err != nil && !isRange(err) {
				t.Fatalf("strconv rejects %q: %v", s, err)
			}
			got, ok := parseNumber([]byte(s), bits == 32)
			if !ok || math.Float64bits(got) != math.Float64bits(want) {
				t.Fatalf("parseNumber(%q, %d bits) = %v (%v), strconv %v", s, bits, got, ok, want)
			}
		}
	}
	if n := testing.AllocsPerRun(100, func() {
		parseNumber([]byte("0.16864630957366789"), false)
		parseNumber([]byte("-1.5e-5"), true)
	}); n != 0 {
		t.Errorf("parseNumber allocates %v times", n)
	}
}

// Writer -> reader round trips are exact: every format, version, dataset.
func TestRoundTrip(t *testing.T) {
	vol := fieldtest.BoxHex([3]float64{-1, 0, 0}, [3]float64{1, 1, 2}, [3]int{3, 2, 2})
	tet := fieldtest.BoxTet([3]float64{0, 0, 0}, [3]float64{1, 1, 1}, [3]int{2, 1, 1})
	off := int32(vol.NumPoints())
	vol.Points = append(vol.Points, tet.Points...)
	for c := range tet.Types {
		n := tet.CellNodes(c)
		vol.AddCell(field.Tetra, n[0]+off, n[1]+off, n[2]+off, n[3]+off)
	}
	vol.AddCell(field.Wedge, 0, 1, 2, 3, 4, 5)
	vol.AddCell(field.Pyramid, 0, 1, 2, 3, 4)
	rng := rand.New(rand.NewSource(5))
	fill := func(z *field.Zone, name string, loc field.Centering, comps int) {
		n := z.NumPoints()
		if loc == field.AtCells {
			n = z.NumCells()
		}
		d := make([]float64, n*comps)
		for i := range d {
			d[i] = rng.NormFloat64() * math.Pow(10, float64(rng.Intn(60)-30))
		}
		d[0], d[len(d)-1] = math.Inf(-1), math.Copysign(0, -1)
		z.Arrays = append(z.Arrays, field.Array{Name: name, Location: loc, Components: comps, Data: d})
	}
	fill(vol, "pressure", field.AtPoints, 1)
	fill(vol, "velocity vector", field.AtPoints, 3)
	fill(vol, "R%", field.AtCells, 6)
	fill(vol, "grad", field.AtCells, 9)
	vol.Blank = make([]bool, vol.NumCells())
	vol.Blank[1] = true

	surf := &field.Zone{Points: []float64{0, 0, 0, 1, 0, 0, 1, 1, 0, 0, 1, 0, 2, 0.5, 0}}
	surf.AddCell(field.Line, 0, 1)
	surf.AddCell(field.Quad, 0, 1, 2, 3)
	surf.AddCell(field.Line, 2, 3)
	surf.AddCell(field.Polygon, 0, 1, 4, 2, 3)
	surf.AddCell(field.Triangle, 1, 4, 2)
	surf.AddCell(field.Vertex, 4)
	fill(surf, "cp", field.AtCells, 1)
	fill(surf, "uv", field.AtPoints, 2)

	for _, binary := range []bool{false, true} {
		for _, v := range []string{"4.2", "5.1"} {
			for _, poly := range []bool{false, true} {
				z := vol
				if poly {
					z = surf
				}
				var b bytes.Buffer
				if err := WriteVTK(&b, z, WriteOptions{Binary: binary, Version: v, Title: "round\ntrip", PolyData: poly}); err != nil {
					t.Fatal(err)
				}
				got := readStr(t, b.String(), Options{}).Zones[0]
				want := *z
				if poly {
					// VTK numbers POLYDATA cells vertices, lines, polygons.
					want = field.Zone{Points: surf.Points}
					perm := []int{5, 0, 2, 1, 3, 4}
					cp := make([]float64, 6)
					for i, c := range perm {
						want.AddCell(surf.Types[c], surf.CellNodes(c)...)
						cp[i] = surf.Arrays[0].Data[c]
					}
					want.Arrays = []field.Array{surf.Arrays[1], {Name: "cp", Location: field.AtCells, Components: 1, Data: cp}}
				}
				want.Name = "case.vtk"
				sortArrays(&want)
				sortArrays(got)
				if !reflect.DeepEqual(got, &want) {
					t.Fatalf("binary=%v version %s poly=%v: round trip differs\n%v\n%v", binary, v, poly, got, &want)
				}
			}
		}
	}
	if err := WriteVTK(&bytes.Buffer{}, vol, WriteOptions{PolyData: true}); err == nil {
		t.Error("volume cells written as POLYDATA")
	}
}

func sortArrays(z *field.Zone) {
	a := append([]field.Array(nil), z.Arrays...)
	for i := range a {
		for j := i + 1; j < len(a); j++ {
			if a[j].Location < a[i].Location || (a[j].Location == a[i].Location && a[j].Name < a[i].Name) {
				a[i], a[j] = a[j], a[i]
			}
		}
	}
	z.Arrays = a
}

// Errors are positioned: line for ASCII, byte offset for BINARY, with
// what was expected and found.
func TestErrors(t *testing.T) {
	// Cut after 18 of 21 coordinates: enough bytes remain for the
	// size check, so the parse runs into the end of the data (line 9).
	trunc := ugridASCII[:strings.Index(ugridASCII, "-0 0 7")]
	e := readErr(t, trunc, Options{}, ErrTruncated)
	if got := e.Error(); got != "case.vtk:8: POINTS: expected 21 coordinates, found 18 before EOF" {
		t.Errorf("message %q", got)
	}
	// Far too little left: refused from the declaration, at the data start.
	e = readErr(t, ugridASCII[:strings.Index(ugridASCII, "0.1 0.2")], Options{}, ErrTruncated)
	if got := e.Error(); got != "case.vtk:6: POINTS: expected 21 coordinates, found only 27 bytes left in the file" {
		t.Errorf("message %q", got)
	}
	var b bin
	b.line("# vtk DataFile Version 3.0").line("x").line("BINARY").line("DATASET POLYDATA")
	b.line("POINTS 4 double").f64(0, 0, 0, 1)
	e = readErr(t, b.String(), Options{}, ErrTruncated)
	if e.Line != 0 || e.Offset != int64(b.Len()-32) || !strings.Contains(e.Error(), "byte ") {
		t.Errorf("binary error %q offset %d", e, e.Offset)
	}
	if _, err := ReadVTK(strings.NewReader("hello\n"), "x", Options{}); !errors.Is(err, ErrUnknownFormat) {
		t.Errorf("bad magic: %v", err)
	}
	e = readErr(t, strings.Replace(ugridASCII, "POINT_DATA 7", "POINT_DATA 8", 1), Options{}, nil)
	if e.Line != 19 || !strings.Contains(e.Error(), "expected 7 (the number of points), found 8") {
		t.Errorf("count mismatch: %q", e)
	}
	e = readErr(t, strings.Replace(ugridASCII, "DATASET UNSTRUCTURED_GRID", "DATASET UNSTRUCTURED_GRID\nFIELD x 1\nt 1 1 complex", 1), Options{}, ErrUnknownFormat)
	if e.Line != 6 {
		t.Errorf("unknown type line %d: %q", e.Line, e)
	}
}

// A huge declared count in a tiny input fails at once, before any
// allocation: against the file size for plain input, against MaxBytes for
// a stream of unknown size.
func TestHugeDeclarations(t *testing.T) {
	for _, s := range []string{
		"# vtk DataFile Version 3.0\nx\nBINARY\nDATASET POLYDATA\nPOINTS 1000000000000 double\n\x00\x00",
		"# vtk DataFile Version 3.0\nx\nASCII\nDATASET UNSTRUCTURED_GRID\nPOINTS 1 double\n0 0 0\nCELLS 2000000000 2000000000\n1 0\n",
		"# vtk DataFile Version 3.0\nx\nASCII\nDATASET POLYDATA\nPOINTS 0 double\nPOINT_DATA 0\nFIELD f 1\na 1000000 1000000000 double\n",
		"# vtk DataFile Version 3.0\nx\nASCII\nDATASET STRUCTURED_POINTS\nDIMENSIONS 1000 1000 1000\n",
	} {
		var ms1, ms2 runtime.MemStats
		readMem(&ms1)
		_, err := ReadVTK(strings.NewReader(s), "x", Options{})
		if err == nil || !(errors.Is(err, ErrTruncated) || errors.Is(err, ErrTooLarge)) {
			t.Errorf("%q: error %v", s[40:], err)
		}
		_, err = ReadVTK(io.MultiReader(strings.NewReader(s)), "x", Options{MaxBytes: 1 << 20})
		if err == nil || !(errors.Is(err, ErrTruncated) || errors.Is(err, ErrTooLarge)) {
			t.Errorf("stream %q: error %v", s[40:], err)
		}
		readMem(&ms2)
		if d := ms2.TotalAlloc - ms1.TotalAlloc; d > 64<<20 {
			t.Errorf("%q: allocated %d bytes", s[40:], d)
		}
	}
}

func readMem(m *runtime.MemStats) { runtime.ReadMemStats(m) }

// Little-endian BINARY files (against the format's big-endian rule) are
// recognised from the cell data (FORMATS.md §1.9) and read with a warning;
// points read before the switch are reinterpreted.
func TestLittleEndian(t *testing.T) {
	le := binary.LittleEndian
	for _, v5 := range []bool{false, true} {
		var b bytes.Buffer
		b.WriteString("# vtk DataFile Version 4.2\nle\nBINARY\nDATASET UNSTRUCTURED_GRID\nPOINTS 3 float\n")
		for _, x := range []float32{0, 0, 0, 1, 0, 0, 0, 1, 0.5} {
			b.Write(le.AppendUint32(nil, math.Float32bits(x)))
		}
		if v5 {
			b.WriteString("\nCELLS 2 3\nOFFSETS vtktypeint64\n")
			for i, x := range []uint64{0, 3, 0, 1, 2} {
				b.Write(le.AppendUint64(nil, x))
				if i == 1 {
					b.WriteString("\nCONNECTIVITY vtktypeint64\n")
				}
			}
		} else {
			b.WriteString("\nCELLS 1 4\n")
			for _, x := range []uint32{3, 0, 1, 2} {
				b.Write(le.AppendUint32(nil, x))
			}
		}
		b.WriteString("\nCELL_TYPES 1\n")
		b.Write(le.AppendUint32(nil, 5))
		b.WriteString("\nPOINT_DATA 3\nSCALARS p double\nLOOKUP_TABLE default\n")
		for _, x := range []float64{1.5, -2, 1e-300} {
			b.Write(le.AppendUint64(nil, math.Float64bits(x)))
		}
		f := readStr(t, b.String(), Options{})
		z := f.Zones[0]
		eqF(t, "points", z.Points, f32(0, 0, 0, 1, 0, 0, 0, 1, 0.5))
		eqT(t, z.Types, field.Triangle)
		eqI(t, "conn", z.Conn, []int32{0, 1, 2})
		eqF(t, "p", arr(t, z, "p", field.AtPoints, 1), []float64{1.5, -2, 1e-300})
		if len(f.Warnings) != 1 || !strings.Contains(f.Warnings[0], "little-endian") {
			t.Errorf("warnings %q", f.Warnings)
		}
	}
}
