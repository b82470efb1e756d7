package readers_test

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"sort"
	"strings"
	"testing"

	"farforce/field"
	"farforce/readers"
)

// The fixtures in ../testdata/vtk were written by VTK 9.1.0's own legacy
// writers, and each JSON file beside them records what VTK's own legacy
// reader (vtkDataSetReader) holds after reading that file back; see
// ../testdata/vtk/README.md and ../testdata/gen/make_vtk_fixtures.py. The
// expected values therefore come from an independent general-purpose library.

const fixtureDir = "../testdata/vtk"

// fxJSON is the companion JSON of a fixture.
type fxJSON struct {
	File      string         `json:"file"`
	Dataset   string         `json:"dataset"`
	Version   string         `json:"version"`
	Format    string         `json:"format"`
	Points    int            `json:"points"`
	Cells     int            `json:"cells"`
	TypeCount map[string]int `json:"cell_type_counts"`
	Coords    []float64      `json:"coords"`
	CellList  []struct {
		Type   int     `json:"type"`
		Points []int32 `json:"points"`
	} `json:"cell_list"`
	Arrays    []fxArray `json:"arrays"`
	DataField []fxArray `json:"dataset_field_data"`
	Bounds    [2][3]float64
}

type fxArray struct {
	Name       string    `json:"name"`
	Location   string    `json:"location"`
	Kind       string    `json:"kind"`
	VTKType    string    `json:"vtk_type"`
	Components int       `json:"components"`
	Tuples     int       `json:"tuples"`
	First      []float64 `json:"first"`
	Last       []float64 `json:"last"`
	Sum        []float64 `json:"sum"`
	NaNCount   int       `json:"nan_count"`
	Data       []float64 `json:"data"`
}

func loadFixtureJSON(t *testing.T, path string) *fxJSON {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var j fxJSON
	if err := json.Unmarshal(b, &j); err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return &j
}

// fixtureFiles returns the .vtk fixtures (uncompressed) in dir.
func fixtureFiles(t testing.TB, dir string) []string {
	t.Helper()
	m, err := filepath.Glob(filepath.Join(dir, "*.vtk"))
	if err != nil || len(m) == 0 {
		t.Fatalf("no fixtures in %s (%v)", dir, err)
	}
	sort.Strings(m)
	return m
}

// fxCell is one field cell expected from a VTK cell.
type fxCell struct {
	t     field.CellType
	nodes []int32
}

// fxExpectedCells maps one VTK cell (type id from vtkCellType.h, point ids in
// VTK order) to the field cells the reader must produce, and reports
// whether the reader must warn (quadratic cells reduced to corners).
// Mapping (FORMATS.md §1.7-1.8 and the reader contract): pixel -> quad with
// nodes [0,1,3,2]; voxel -> hexa [0,1,3,2,4,5,7,6]; poly-vertex -> vertices;
// polyline -> its segments; triangle strip -> its n-2 triangles (VTK
// vtkTriangleStrip::DecomposeStrip: odd triangles reversed); quadratic cells
// -> the linear cell of their corner nodes (corners come first).
func fxExpectedCells(vtkType int, p []int32) (cells []fxCell, warn bool) {
	one := func(t field.CellType, nodes ...int32) []fxCell { return []fxCell{{t, nodes}} }
	switch vtkType {
	case 1:
		return one(field.Vertex, p...), false
	case 2:
		for _, q := range p {
			cells = append(cells, fxCell{field.Vertex, []int32{q}})
		}
		return cells, false
	case 3:
		return one(field.Line, p...), false
	case 4:
		for i := 0; i+1 < len(p); i++ {
			cells = append(cells, fxCell{field.Line, []int32{p[i], p[i+1]}})
		}
		return cells, false
	case 5:
		return one(field.Triangle, p...), false
	case 6:
		for i := 0; i+2 < len(p); i++ {
			if i%2 == 0 {
				cells = append(cells, fxCell{field.Triangle, []int32{p[i], p[i+1], p[i+2]}})
			} else {
				cells = append(cells, fxCell{field.Triangle, []int32{p[i+1], p[i], p[i+2]}})
			}
		}
		return cells, false
	case 7:
		return one(field.Polygon, p...), false
	case 8:
		return one(field.Quad, p[0], p[1], p[3], p[2]), false
	case 9:
		return one(field.Quad, p...), false
	case 10:
		return one(field.Tetra, p...), false
	case 11:
		return one(field.Hexa, p[0], p[1], p[3], p[2], p[4], p[5], p[7], p[6]), false
	case 12:
		return one(field.Hexa, p...), false
	case 13:
		return one(field.Wedge, p...), false
	case 14:
		return one(field.Pyramid, p...), false
	case 21:
		return one(field.Line, p[:2]...), true
	case 22:
		return one(field.Triangle, p[:3]...), true
	case 23:
		return one(field.Quad, p[:4]...), true
	case 24:
		return one(field.Tetra, p[:4]...), true
	case 25:
		return one(field.Hexa, p[:8]...), true
	case 26:
		return one(field.Wedge, p[:6]...), true
	case 27:
		return one(field.Pyramid, p[:5]...), true
	}
	panic(fmt.Sprintf("fixture uses VTK cell type %d, not mapped by the test", vtkType))
}

// fxSameCell reports whether got equals want, allowing a cyclic rotation for
// triangles (a strip's odd triangle may be written starting at any node,
// the orientation is what matters).
func fxSameCell(gt field.CellType, got []int32, want fxCell) bool {
	if gt != want.t || len(got) != len(want.nodes) {
		return false
	}
	if reflect.DeepEqual(got, want.nodes) {
		return true
	}
	if gt != field.Triangle {
		return false
	}
	for r := 1; r < 3; r++ {
		if got[0] == want.nodes[r] && got[1] == want.nodes[(r+1)%3] && got[2] == want.nodes[(r+2)%3] {
			return true
		}
	}
	return false
}

// fxRelTol returns the relative tolerance for values of a VTK data type.
// float: the reader parses ASCII text to float64 while VTK rounds it to
// float32, a relative difference up to 2^-24 ~ 6e-8, so 1e-6 (the brief's
// float32 tolerance). double: both parse the same decimal text with correct
// rounding or copy the same 8 bytes, so 1e-14 only absorbs the JSON round
// trip. Integer types: exact.
func fxRelTol(vtkType string) float64 {
	switch vtkType {
	case "float":
		return 1e-6
	case "double":
		return 1e-14
	}
	return 0
}

func fxCloseRel(a, b, rel float64) bool {
	if a == b || (math.IsNaN(a) && math.IsNaN(b)) {
		return true
	}
	return math.Abs(a-b) <= rel*math.Max(math.Abs(a), math.Abs(b))
}

// fxCheckFixture compares f (one zone) with the VTK description j.
func fxCheckFixture(t *testing.T, f *field.Field, j *fxJSON) {
	t.Helper()
	if len(f.Zones) != 1 {
		t.Fatalf("%d zones, want 1", len(f.Zones))
	}
	z := f.Zones[0]
	if err := z.Validate(); err != nil {
		t.Errorf("zone does not validate: %v", err)
	}
	// Points: VTK's point count and coordinates.
	if z.NumPoints() != j.Points {
		t.Fatalf("%d points, VTK reads %d", z.NumPoints(), j.Points)
	}
	pointTol := 1e-6 // points are float32 in most fixtures (see fxRelTol)
	for i, want := range j.Coords {
		if !fxCloseRel(z.Points[i], want, pointTol) {
			t.Fatalf("point %d coordinate %d = %v, VTK reads %v", i/3, i%3, z.Points[i], want)
		}
	}
	// Cells: expand every VTK cell into its field cells.
	var want []fxCell
	var parent []int // VTK cell of each expected field cell
	warn := false
	for c, vc := range j.CellList {
		cs, w := fxExpectedCells(vc.Type, vc.Points)
		warn = warn || w
		for range cs {
			parent = append(parent, c)
		}
		want = append(want, cs...)
	}
	if z.NumCells() != len(want) {
		t.Fatalf("%d cells, want %d (from VTK's %d cells)", z.NumCells(), len(want), j.Cells)
	}
	for c := range want {
		if !fxSameCell(z.Types[c], z.CellNodes(c), want[c]) {
			t.Errorf("cell %d = %v %v, want %v %v (VTK cell %d, type %d)", c, z.Types[c], z.CellNodes(c),
				want[c].t, want[c].nodes, parent[c], j.CellList[parent[c]].Type)
		}
	}
	if warn && len(f.Warnings) == 0 {
		t.Errorf("quadratic cells reduced without a warning")
	}
	// Arrays: same names, locations, components and values as VTK, except
	// string arrays (no place in the field model: skipped) and the cell
	// ghost array vtkGhostType (becomes Zone.Blank, nonzero = blank; VTK
	// vtkDataSetAttributes ghost bits).
	var gotNames, wantNames []string
	for _, a := range z.Arrays {
		gotNames = append(gotNames, a.Location.String()+":"+a.Name)
	}
	var numeric []fxArray
	var wantBlank []bool
	for _, a := range j.Arrays {
		switch {
		case a.VTKType == "string":
		case a.Name == "vtkGhostType" && a.Location == "cell":
			for _, p := range parent {
				wantBlank = append(wantBlank, a.Data[p] != 0)
			}
		default:
			numeric = append(numeric, a)
			wantNames = append(wantNames, a.Location+":"+a.Name)
		}
	}
	if !reflect.DeepEqual(z.Blank, wantBlank) {
		t.Errorf("Blank = %v, want %v (from vtkGhostType)", z.Blank, wantBlank)
	}
	sort.Strings(gotNames)
	sort.Strings(wantNames)
	if !reflect.DeepEqual(gotNames, wantNames) {
		t.Errorf("arrays %q, VTK reads %q", gotNames, wantNames)
	}
	for _, wa := range numeric {
		ga := z.Array(wa.Name)
		if ga == nil {
			continue
		}
		fxCheckArray(t, z, ga, &wa, parent)
	}
}

func fxCheckArray(t *testing.T, z *field.Zone, ga *field.Array, wa *fxArray, parent []int) {
	t.Helper()
	if ga.Location.String() != wa.Location {
		t.Errorf("array %q at %v, VTK: %s", wa.Name, ga.Location, wa.Location)
		return
	}
	if ga.Components != wa.Components {
		t.Errorf("array %q has %d components, VTK: %d", wa.Name, ga.Components, wa.Components)
		return
	}
	nc := wa.Components
	want := wa.Data
	if wa.Location == "cell" {
		// A VTK cell split into several field cells carries its value to each.
		want = make([]float64, 0, len(parent)*nc)
		for _, p := range parent {
			want = append(want, wa.Data[p*nc:(p+1)*nc]...)
		}
	}
	if len(ga.Data) != len(want) {
		t.Errorf("array %q: %d values, want %d", wa.Name, len(ga.Data), len(want))
		return
	}
	tol := fxRelTol(wa.VTKType)
	colour := wa.VTKType == "unsigned char" && wa.Kind == "SCALARS"
	if colour {
		// vtkDataWriter writes unsigned char scalars as COLOR_SCALARS:
		// ASCII floats in [0,1] ("%g", 6 digits), BINARY bytes. VTK reads
		// both back as bytes 0..255; the reader's documented convention is
		// [0,1] in both cases, i.e. VTK's value / 255. ASCII printing
		// rounds to 6 significant digits of a value <= 1: abs error <= 5e-7.
		scaled := make([]float64, len(want))
		for i, v := range want {
			scaled[i] = v / 255
		}
		want = scaled
	}
	nan := 0
	for i, v := range ga.Data {
		if math.IsNaN(v) {
			nan++
		}
		if colour && math.Abs(v-want[i]) <= 5e-7 {
			continue
		}
		if !fxCloseRel(v, want[i], tol) {
			t.Errorf("array %q (%s) value %d (tuple %d comp %d) = %v, VTK reads %v", wa.Name, wa.VTKType, i, i/nc, i%nc, v, want[i])
			return
		}
	}
	if wa.Location == "point" && !colour {
		// Summary values from the same JSON: first/last tuple and sums.
		n := ga.Len()
		for k := 0; k < nc; k++ {
			if !fxCloseRel(ga.Data[k], wa.First[k], tol) || !fxCloseRel(ga.Data[(n-1)*nc+k], wa.Last[k], tol) {
				t.Errorf("array %q: first/last tuple differ from VTK", wa.Name)
			}
			s := 0.0
			for i := 0; i < n; i++ {
				s += ga.Data[i*nc+k]
			}
			// Each term may differ from VTK's by the float32 tolerance
			// of fxRelTol (1e-6 relative) and this plain float64 sum adds
			// one rounding per term, against the script's exact fsum: a
			// loose bound of 1e-6 per term, scaled by 1 + |sum|.
			if math.Abs(s-wa.Sum[k]) > 1e-6*(1+math.Abs(wa.Sum[k]))*float64(n) {
				t.Errorf("array %q comp %d: sum %v, VTK %v", wa.Name, k, s, wa.Sum[k])
			}
		}
	}
	if nan != wa.NaNCount {
		t.Errorf("array %q: %d NaN, VTK %d", wa.Name, nan, wa.NaNCount)
	}
}

// TestFixturesMatchVTK reads every VTK-written fixture and compares it with
// what VTK itself reads from the same file.
func TestFixturesMatchVTK(t *testing.T) {
	for _, path := range fixtureFiles(t, fixtureDir) {
		name := filepath.Base(path)
		t.Run(name, func(t *testing.T) {
			j := loadFixtureJSON(t, strings.TrimSuffix(path, ".vtk")+".json")
			f, err := readers.ReadFile(path, readers.Options{})
			if err != nil {
				t.Fatalf("ReadFile: %v", err)
			}
			fxCheckFixture(t, f, j)
		})
	}
}

// TestFixturesWorkersIdentical checks that the parse is bit-identical for
// 1 and 2 workers (house rule 7) on every fixture.
func TestFixturesWorkersIdentical(t *testing.T) {
	for _, path := range fixtureFiles(t, fixtureDir) {
		f1, err1 := readers.ReadFile(path, readers.Options{Workers: 1})
		f2, err2 := readers.ReadFile(path, readers.Options{Workers: 2})
		if (err1 == nil) != (err2 == nil) || (err1 != nil && err1.Error() != err2.Error()) {
			t.Errorf("%s: errors differ: %v / %v", path, err1, err2)
			continue
		}
		if !reflect.DeepEqual(f1, f2) {
			t.Errorf("%s: fields differ between 1 and 2 workers", path)
		}
	}
}

// TestFixturesCompressedIdentical reads the .gz (python gzip) and .zst
// (zstd CLI) copies and requires the same field as the plain file (STYLE
// point 8), up to the zone name, which may follow the file name.
func TestFixturesCompressedIdentical(t *testing.T) {
	for _, base := range []string{"ugrid_mixed_v51_binary.vtk", "polydata_v42_ascii.vtk"} {
		plain, err := readers.ReadFile(filepath.Join(fixtureDir, base), readers.Options{})
		if err != nil {
			t.Fatal(err)
		}
		for _, ext := range []string{".gz", ".zst"} {
			path := filepath.Join(fixtureDir, base+ext)
			f, err := readers.ReadFile(path, readers.Options{})
			if err != nil {
				t.Errorf("%s: %v", path, err)
				continue
			}
			if !fxSameFieldButNames(plain, f) {
				t.Errorf("%s: field differs from %s", path, base)
			}
			j := loadFixtureJSON(t, filepath.Join(fixtureDir, strings.TrimSuffix(base, ".vtk")+".json"))
			t.Run(base+ext, func(t *testing.T) { fxCheckFixture(t, f, j) })
		}
	}
}

// fxSameFieldButNames compares two fields ignoring zone names and the file
// names inside warnings.
func fxSameFieldButNames(a, b *field.Field) bool {
	if len(a.Zones) != len(b.Zones) || len(a.Warnings) != len(b.Warnings) {
		return false
	}
	for i := range a.Zones {
		za, zb := *a.Zones[i], *b.Zones[i]
		za.Name, zb.Name = "", ""
		if !reflect.DeepEqual(za, zb) {
			return false
		}
	}
	return true
}

// TestReadVTKMatchesReadFile checks that the io.Reader entry point (no
// known size) gives the field ReadFile gives, for every fixture.
func TestReadVTKMatchesReadFile(t *testing.T) {
	for _, path := range fixtureFiles(t, fixtureDir) {
		b, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		want, err := readers.ReadFile(path, readers.Options{})
		if err != nil {
			t.Fatalf("%s: %v", path, err)
		}
		got, err := readers.ReadVTK(bytes.NewReader(b), filepath.Base(path), readers.Options{})
		if err != nil {
			t.Errorf("%s: ReadVTK: %v", path, err)
			continue
		}
		if !fxSameFieldButNames(want, got) {
			t.Errorf("%s: ReadVTK and ReadFile differ", path)
		}
	}
}

// TestFixturesArrayFilter checks Options.Arrays: only the named arrays are
// kept, with the same values as in a full read.
func TestFixturesArrayFilter(t *testing.T) {
	path := filepath.Join(fixtureDir, "ugrid_mixed_v42_binary.vtk")
	keep := []string{"velocity", "material", "wall shear"}
	f, err := readers.ReadFile(path, readers.Options{Arrays: keep})
	if err != nil {
		t.Fatal(err)
	}
	full, err := readers.ReadFile(path, readers.Options{})
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, a := range f.Zones[0].Arrays {
		got = append(got, a.Name)
		if !reflect.DeepEqual(a, *full.Zones[0].Array(a.Name)) {
			t.Errorf("filtered array %q differs from the full read", a.Name)
		}
	}
	sort.Strings(got)
	if want := []string{"material", "velocity", "wall shear"}; !reflect.DeepEqual(got, want) {
		t.Errorf("kept arrays %q, want %q", got, want)
	}
}

// TestReadFilesAppendsZones checks ReadFiles: one zone per file, in order,
// each identical to its single-file read.
func TestReadFilesAppendsZones(t *testing.T) {
	paths := []string{
		filepath.Join(fixtureDir, "ugrid_tri2d_v51_binary.vtk"),
		filepath.Join(fixtureDir, "ugrid_mixed_v42_ascii.vtk"),
	}
	f, err := readers.ReadFiles(paths, readers.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(f.Zones) != len(paths) {
		t.Fatalf("%d zones, want %d", len(f.Zones), len(paths))
	}
	for i, p := range paths {
		one, err := readers.ReadFile(p, readers.Options{})
		if err != nil {
			t.Fatal(err)
		}
		za, zb := *one.Zones[0], *f.Zones[i]
		za.Name, zb.Name = "", ""
		if !reflect.DeepEqual(za, zb) {
			t.Errorf("zone %d differs from ReadFile(%s)", i, p)
		}
	}
}

// TestRealSolutionFiles reads the real benchmark files (Schäfer & Turek
// 1996, case 2D-1; ../testdata/real/PROVENANCE.md). Counts come from that
// README (20456 triangles; 2713 vertices and 5114 triangles; a 128-point
// polyline with pressure and wall_shear_stress); array summaries (first/last
// tuple, sums) come from VTK 9.1's own reader (the .json beside each file).
func TestRealSolutionFiles(t *testing.T) {
	cases := []struct {
		file          string
		points, cells int
		cellType      field.CellType
		arrays        []string
		lo, hi        [3]float64 // domain: channel [0,2.2]x[0,0.41], or the cylinder wall
	}{
		{"dfg2d1_coarse_tri_p2refined_binary.vtk", 10540, 20456, field.Triangle,
			[]string{"pressure", "velocity"}, [3]float64{0, 0, 0}, [3]float64{2.2, 0.41, 0}},
		{"dfg2d1_coarse_tri_vertices_binary.vtk", 2713, 5114, field.Triangle,
			[]string{"pressure", "velocity"}, [3]float64{0, 0, 0}, [3]float64{2.2, 0.41, 0}},
		// Closed polyline of 129 ids = 128 segments; cylinder D = 0.1 at (0.2, 0.2).
		{"dfg2d1_coarse_wall_ascii.vtk", 128, 128, field.Line,
			[]string{"normals", "pressure", "wall_shear_stress"}, [3]float64{0.15, 0.15, 0}, [3]float64{0.25, 0.25, 0}},
	}
	for _, c := range cases {
		t.Run(c.file, func(t *testing.T) {
			path := filepath.Join("../testdata/real", c.file)
			f, err := readers.ReadFile(path, readers.Options{})
			if err != nil {
				t.Fatal(err)
			}
			if len(f.Zones) != 1 {
				t.Fatalf("%d zones", len(f.Zones))
			}
			z := f.Zones[0]
			if err := z.Validate(); err != nil {
				t.Fatal(err)
			}
			if z.NumPoints() != c.points || z.NumCells() != c.cells {
				t.Fatalf("%d points, %d cells; want %d, %d", z.NumPoints(), z.NumCells(), c.points, c.cells)
			}
			for i, ty := range z.Types {
				if ty != c.cellType {
					t.Fatalf("cell %d is %v, want %v", i, ty, c.cellType)
				}
			}
			if f.Dim() != 2 {
				t.Errorf("Dim = %d, want 2", f.Dim())
			}
			lo, hi := f.Bounds()
			for k := 0; k < 3; k++ {
				if math.Abs(lo[k]-c.lo[k]) > 1e-9 || math.Abs(hi[k]-c.hi[k]) > 1e-9 {
					t.Errorf("bounds %v %v, want %v %v", lo, hi, c.lo, c.hi)
					break
				}
			}
			var names []string
			for _, a := range z.Arrays {
				names = append(names, a.Name)
			}
			sort.Strings(names)
			if !reflect.DeepEqual(names, c.arrays) {
				t.Errorf("arrays %q, want %q", names, c.arrays)
			}
			j := loadFixtureJSON(t, strings.TrimSuffix(path, ".vtk")+".json")
			if j.Points != c.points {
				t.Fatalf("VTK summary says %d points", j.Points)
			}
			for _, wa := range j.Arrays {
				ga := z.Array(wa.Name)
				if ga == nil || ga.Components != wa.Components || ga.Len() != wa.Tuples {
					t.Errorf("array %q missing or misshaped", wa.Name)
					continue
				}
				n, nc := ga.Len(), ga.Components
				for k := 0; k < nc; k++ {
					// double data: both readers copy the same 8 bytes or parse
					// the same 13-digit text; 1e-14 absorbs the JSON round trip.
					if !fxCloseRel(ga.Data[k], wa.First[k], 1e-14) || !fxCloseRel(ga.Data[(n-1)*nc+k], wa.Last[k], 1e-14) {
						t.Errorf("array %q comp %d: first/last %v %v, VTK %v %v", wa.Name, k, ga.Data[k], ga.Data[(n-1)*nc+k], wa.First[k], wa.Last[k])
					}
					s, sa := 0.0, 0.0
					for i := 0; i < n; i++ {
						s += ga.Data[i*nc+k]
						sa += math.Abs(ga.Data[i*nc+k])
					}
					// Summation order may differ: n ulps of the absolute sum.
					if math.Abs(s-wa.Sum[k]) > float64(n)*1e-16*sa+1e-300 {
						t.Errorf("array %q comp %d: sum %v, VTK %v", wa.Name, k, s, wa.Sum[k])
					}
				}
			}
		})
	}
}
