package readers

import (
	"errors"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// The corpus in ../testdata/ffcg/malformed is written by
// ../testdata/ffcg/make_malformed.py: each file is one small valid case with
// one rule of docs/cgns-text-format.md broken in one known place (the
// script's CASES table). Lines count from 1 (the "ffcg 1" line); the
// expected line is the statement or value that breaks the rule, or the
// statement whose declared count or content it contradicts. A nil sentinel
// means a syntax error that wraps none of the exported sentinels.

type ffcgMalformed struct {
	file string
	want error
	line int
	msg  string
}

var ffcgMalformedCases = []ffcgMalformed{
	{"bad_dimension.ffcg", nil, 3,
		`bad_dimension.ffcg:3: base B: expected 1 <= CellDimension <= PhysicalDimension <= 3, found 3 and 2`},
	{"bad_magic.ffcg", ErrUnknownFormat, 1,
		`bad_magic.ffcg:1: expected "ffcg 1", found "ffcg one"`},
	{"bad_number.ffcg", nil, 7,
		`bad_number.ffcg:7: data CoordinateX: expected 6 values, found "1x" after 4`},
	{"bc_range.ffcg", nil, 16,
		`bc_range.ffcg:16: BC Wall: expected PointRange inside 1..3 in direction 1, found 1..4`},
	{"bc_type.ffcg", ErrUnknownFormat, 16,
		`bc_type.ffcg:16: BC Wall: expected a BCType_t value (BCWall, BCFarfield, BCSymmetryPlane, ...), found "BCWal"`},
	{"bomb.ffcg.gz", ErrTooLarge, 0,
		`bomb.ffcg.gz: byte 1048576: expected at most 1048576 bytes (Options.MaxBytes), found more (too large)`},
	{"cellsize_gap.ffcg", nil, 20,
		`cellsize_gap.ffcg:20: zone U: expected Elements numbered 1..3 (CellSize), found cells up to 2`},
	{"comment_in_values.ffcg", nil, 9,
		`comment_in_values.ffcg:9: data CoordinateY: expected 6 values, found "#" after 3`},
	{"connectivity_count.ffcg", nil, 28,
		`connectivity_count.ffcg:28: data ElementConnectivity: expected 6 values (2 TRI_3 elements x 3 nodes), found 5`},
	{"coordinate_count.ffcg", nil, 6,
		`coordinate_count.ffcg:6: data CoordinateX: expected 6 values (VertexSize), found 5`},
	{"duplicate_array.ffcg", nil, 35,
		`duplicate_array.ffcg:35: data Density: expected each array name once per zone, found "Density" again`},
	{"element_type.ffcg", ErrUnknownFormat, 27,
		`element_type.ffcg:27: Elements Tris: expected a CGNS element type name (TRI_3, QUAD_4, TETRA_4, PYRA_5, PENTA_6, HEXA_8, MIXED, ...), found "TRI_4"`},
	{"end_mismatch.ffcg", nil, 10,
		`end_mismatch.ffcg:10: end FlowSolution: expected end or end GridCoordinates, found "end FlowSolution"`},
	{"extra_values.ffcg", nil, 7,
		`extra_values.ffcg:7: expected data or end, found "7" (more values than the data statement declares?)`},
	{"float_connectivity.ffcg", nil, 28,
		`float_connectivity.ffcg:28: data ElementConnectivity: expected an integer data type I4 or I8, found R8`},
	{"gridlocation.ffcg", ErrUnsupported, 11,
		`gridlocation.ffcg:11: FlowSolution C: expected GridLocation Vertex or CellCenter, found FaceCenter (unsupported)`},
	{"huge_count.ffcg", ErrTooLarge, 28,
		`huge_count.ffcg:28: data ElementConnectivity: expected at most 2^31-1 values, found 6000000000000 (too large)`},
	{"huge_structured.ffcg", ErrTooLarge, 4,
		`huge_structured.ffcg:4: zone S: expected at most 2^31-1 vertices, found VertexSize=100000,100000 (too large)`},
	{"huge_vertices.ffcg", ErrTruncated, 23,
		`huge_vertices.ffcg:23: data CoordinateX: expected 2000000000 values, found only 348 bytes left in the file`},
	{"missing_coordinate.ffcg", nil, 20,
		`missing_coordinate.ffcg:20: zone U: expected CoordinateY in GridCoordinates (PhysicalDimension 2), found none`},
	{"missing_end.ffcg", ErrTruncated, 39,
		`missing_end.ffcg:39: expected end of base B, found end of file`},
	{"mixed_short.ffcg", nil, 27,
		`mixed_short.ffcg:27: Elements Tris: expected element 2: 3 nodes, found 2 before the end of ElementConnectivity`},
	{"mixed_type.ffcg", ErrUnsupported, 27,
		`mixed_type.ffcg:27: Elements Tris: expected element 1: a CGNS element type number of a fixed-size type, found 22 (unsupported)`},
	{"nface.ffcg", ErrUnsupported, 27,
		`nface.ffcg:27: Elements Tris: expected an element type other than NFACE_n, found NFACE_n (unsupported)`},
	{"ngon_offsets.ffcg", nil, 27,
		`ngon_offsets.ffcg:27: Elements Tris: expected an ElementStartOffset array for NGON_n, found none`},
	{"node_range.ffcg", nil, 27,
		`node_range.ffcg:27: Elements Tris: expected element 2: node numbers in 1..4, found 5`},
	{"not_base.ffcg", ErrUnknownFormat, 3,
		`not_base.ffcg:3: bass B: expected base, found "bass"`},
	{"range_gap.ffcg", nil, 27,
		`range_gap.ffcg:27: Elements Tris: expected a section inside 1..CellSize=2 or above it, found 2,3`},
	{"rind_count.ffcg", nil, 12,
		`rind_count.ffcg:12: data Pressure: expected 4 values (4 cell entries with rind x 1 components), found 2`},
	{"rind_list.ffcg", nil, 11,
		`rind_list.ffcg:11: FlowSolution C: expected Rind=4 rind plane counts, found "1,1"`},
	{"truncated.ffcg", ErrTruncated, 36,
		`truncated.ffcg:36: data MomentumX: expected 4 values, found 2 before EOF`},
	{"truncated.ffcg.gz", ErrTruncated, 0,
		`truncated.ffcg.gz: byte 299: expected more data, found the compressed stream cut short (unexpected EOF)`},
	{"unknown_attribute.ffcg", nil, 4,
		`unknown_attribute.ffcg:4: zone S: expected zone NAME Structured VertexSize=ni,nj[,nk] or zone NAME Unstructured VertexSize=nv CellSize=nc, found "VertexSiz=3,2"`},
	{"unknown_type.ffcg", ErrUnknownFormat, 8,
		`unknown_type.ffcg:8: data CoordinateY: expected a data type R4, R8, I4, I8 or C1, found "R16"`},
	{"vertexsize_count.ffcg", nil, 4,
		`vertexsize_count.ffcg:4: zone S: expected VertexSize=2 sizes (CellDimension), found "3,2,2"`},
	{"zero_density.ffcg", nil, 33,
		`zero_density.ffcg:33: data Density: expected a positive Density to derive VelocityX from MomentumX, found 0 at point 2`},
}

func TestFFCGMalformedExactErrors(t *testing.T) {
	for _, c := range ffcgMalformedCases {
		t.Run(c.file, func(t *testing.T) {
			f, err := os.Open(filepath.Join("../testdata/ffcg/malformed", c.file))
			if err != nil {
				t.Fatal(err)
			}
			defer f.Close()
			_, _, err = ReadFFCG(f, c.file, Options{MaxBytes: 1 << 20})
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("want *Error, got %T %v", err, err)
			}
			if e.Line != c.line || err.Error() != c.msg {
				t.Errorf("got  line %d %s\nwant line %d %s", e.Line, err, c.line, c.msg)
			}
			for _, s := range mfSentinelList {
				if errors.Is(err, s) != (s == c.want) {
					t.Errorf("errors.Is(err, %v) = %v", s, errors.Is(err, s))
				}
			}
		})
	}
}

var mfSentinelList = []error{ErrUnknownFormat, ErrTooLarge, ErrUnsupported, ErrTruncated}

// Every file of the corpus is checked, and valid.ffcg (the unbroken case)
// reads.
func TestFFCGMalformedCorpusCovered(t *testing.T) {
	files, _ := filepath.Glob("../testdata/ffcg/malformed/*")
	seen := map[string]bool{"valid.ffcg": true}
	for _, c := range ffcgMalformedCases {
		seen[c.file] = true
	}
	for _, p := range files {
		if !seen[filepath.Base(p)] {
			t.Errorf("%s is not in ffcgMalformedCases", p)
		}
	}
	if _, err := ReadFile("../testdata/ffcg/malformed/valid.ffcg", Options{}); err != nil {
		t.Fatal(err)
	}
}

// Declared counts far beyond the data fail before anything of their size
// is allocated, on the sized and the streaming path.
func TestFFCGHugeCountsBoundedMemory(t *testing.T) {
	for _, name := range []string{"huge_vertices.ffcg", "huge_count.ffcg", "huge_structured.ffcg"} {
		b, err := os.ReadFile(filepath.Join("../testdata/ffcg/malformed", name))
		if err != nil {
			t.Fatal(err)
		}
		for _, unsized := range []bool{false, true} {
			var m0, m1 runtime.MemStats
			runtime.GC()
			runtime.ReadMemStats(&m0)
			var err error
			if unsized {
				_, _, err = ReadFFCG(fuzzUnsized{strings.NewReader(string(b))}, name, Options{})
			} else {
				_, _, err = ReadFFCG(strings.NewReader(string(b)), name, Options{})
			}
			runtime.ReadMemStats(&m1)
			if err == nil {
				t.Fatalf("%s: no error", name)
			}
			if d := m1.TotalAlloc - m0.TotalAlloc; d > 64<<20 {
				t.Errorf("%s (unsized %v): allocated %d bytes", name, unsized, d)
			}
		}
	}
}
