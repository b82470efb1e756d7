package readers_test

import (
	"bytes"
	"encoding/binary"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"runtime"
	"strconv"
	"strings"
	"testing"

	"farforce/field"
	"farforce/readers"
)

// The corpus in ../testdata/malformed is written by
// ../testdata/gen/make_malformed.py: each file breaks one rule of the legacy
// VTK format (FORMATS.md §1; 5.1 layout from VTK 9's vtkDataReader) in one
// known place, or is a cut of a VTK-written fixture. Expected positions are
// those of the construction: lines count from 1 (the version line); a
// binary offset is the byte where the offending block or keyword line
// starts in the (decompressed) stream.

const malformedDir = "../testdata/malformed"

// mfSentinels are the documented error kinds; a nil want means "a syntax
// error": none of them may match.
var mfSentinels = []error{readers.ErrUnknownFormat, readers.ErrTooLarge, readers.ErrUnsupported, readers.ErrTruncated}

type malformedCase struct {
	file   string
	max    int64 // Options.MaxBytes (0: default)
	want   error // sentinel, or nil for a syntax error
	line   int   // expected Error.Line (ASCII), 0 for binary
	offset int64 // expected Error.Offset (binary)
	msg    string
}

var malformedCases = []malformedCase{
	// Format recognition: version line (line 1), format word (line 3), DATASET (line 4).
	{"bad_magic.vtk", 0, readers.ErrUnknownFormat, 1, 0,
		`bad_magic.vtk:1: expected "# vtk DataFile Version x.y", found "# vtk DataFile Versoin 4.2"`},
	{"not_vtk.vtk", 0, readers.ErrUnknownFormat, 1, 0,
		`not_vtk.vtk:1: expected "# vtk DataFile Version x.y", found "solid cube"`},
	{"empty.vtk", 0, readers.ErrUnknownFormat, 1, 0,
		`empty.vtk:1: expected "# vtk DataFile Version x.y", found ""`},
	{"bad_format_word.vtk", 0, readers.ErrUnknownFormat, 3, 0,
		`bad_format_word.vtk:3: expected ASCII or BINARY, found "ASCIX"`},
	{"unknown_dataset.vtk", 0, readers.ErrUnsupported, 4, 0,
		`unknown_dataset.vtk:4: DATASET: expected STRUCTURED_POINTS, STRUCTURED_GRID, RECTILINEAR_GRID, UNSTRUCTURED_GRID or POLYDATA, found "HYPER_GRID" (unsupported)`},
	{"unknown_keyword_header.vtk", 0, readers.ErrUnknownFormat, 4, 0,
		`unknown_keyword_header.vtk:4: DATAZET: expected DATASET, found "DATAZET"`},
	{"unknown_datatype.vtk", 0, readers.ErrUnknownFormat, 5, 0,
		`unknown_datatype.vtk:5: POINTS: expected a VTK data type name, found "quadruple"`},

	// Counts and numbers. A block error is positioned where its data starts
	// (line 6 = first line after "POINTS n type" on line 5).
	{"points_short_eof.vtk", 0, readers.ErrTruncated, 6, 0,
		`points_short_eof.vtk:6: POINTS: expected 12 coordinates, found only 18 bytes left in the file`},
	{"points_short_keyword.vtk", 0, nil, 8, 0,
		`points_short_keyword.vtk:8: POINTS: expected 12 coordinates, found "CELLS" after 9`},
	{"bad_number.vtk", 0, nil, 7, 0,
		`bad_number.vtk:7: POINTS: expected 12 coordinates, found "1.0.0" after 7`},
	{"negative_points.vtk", 0, nil, 5, 0,
		`negative_points.vtk:5: POINTS: expected a non-negative integer count, found "-3"`},
	{"negative_cells.vtk", 0, nil, 8, 0,
		`negative_cells.vtk:8: CELLS: expected a non-negative integer count, found "-1"`},
	{"pointdata_count.vtk", 0, nil, 12, 0,
		`pointdata_count.vtk:12: POINT_DATA: expected 4 (the number of points), found 5`},
	{"cells_size_mismatch.vtk", 0, nil, 10, 0,
		`cells_size_mismatch.vtk:10: CELLS: expected 6 cell entries, found "CELL_TYPES" after 5`},
	{"celltypes_count.vtk", 0, nil, 10, 0,
		`celltypes_count.vtk:10: CELL_TYPES: expected 1 cell types (one per cell), found 2`},

	// Declared counts far beyond the data: must fail before allocating.
	{"huge_points.vtk", 0, readers.ErrTooLarge, 5, 0,
		`huge_points.vtk:5: POINTS: expected at most 2^31-1 points, found 1000000000000 (too large)`},
	{"huge_cells.vtk", 0, readers.ErrTooLarge, 8, 0,
		`huge_cells.vtk:8: CELLS: expected at most 2^31-1 cell entries, found 5000000000000 (too large)`},
	{"points_beyond_file.vtk", 0, readers.ErrTruncated, 6, 0,
		`points_beyond_file.vtk:6: POINTS: expected 300000000 coordinates, found only 12 bytes left in the file`},
	{"binary_points_beyond_file.vtk", 0, readers.ErrTruncated, 0, 102,
		`binary_points_beyond_file.vtk: byte 102: POINTS: expected 300000000 coordinates, found only 49 bytes left in the file`},
	{"binary_huge_points.vtk", 0, readers.ErrTooLarge, 0, 121,
		`binary_huge_points.vtk: byte 121: POINTS: expected at most 2^31-1 points, found 1000000000000 (too large)`},
	{"binary_huge_cells.vtk", 0, readers.ErrTooLarge, 0, 461,
		`binary_huge_cells.vtk: byte 461: OFFSETS: expected at most 2^31-1 offsets entries, found 1000000000001 (too large)`},
	{"v51_huge_offsets.vtk", 0, readers.ErrTooLarge, 9, 0,
		`v51_huge_offsets.vtk:9: OFFSETS: expected at most 2^31-1 offsets entries, found 1000000000001 (too large)`},

	// Topology. Cell checks are positioned at the CELLS / CELL_TYPES keyword
	// line (line 8 / 10) and name the cell.
	{"cell_index_range.vtk", 0, nil, 8, 0,
		`cell_index_range.vtk:8: CELLS: expected cell 1: node indices in [0,4), found 7`},
	{"cell_index_negative.vtk", 0, nil, 8, 0,
		`cell_index_negative.vtk:8: CELLS: expected cell 0: node indices in [0,4), found -1`},
	{"celltype_mismatch.vtk", 0, nil, 8, 0,
		`celltype_mismatch.vtk:8: CELLS: expected cell 0 of type TETRA (10): 4 nodes, found 3 nodes`},
	// Variable-size cell types (POLYGON 7, TRIANGLE_STRIP 6) need at least
	// 3 nodes (FORMATS.md §1.7; vtkPolygon, vtkTriangleStrip); a 0-node
	// cell must not reach the zone (found by FuzzReadVTK, crasher
	// testdata/fuzz/FuzzReadVTK/98ce038aad93b534).
	{"cell_zero_nodes_polygon.vtk", 0, nil, 8, 0,
		`cell_zero_nodes_polygon.vtk:8: CELLS: expected cell 1 of type POLYGON (7): at least 3 nodes, found 0 nodes`},
	{"cell_zero_nodes_strip.vtk", 0, nil, 8, 0,
		`cell_zero_nodes_strip.vtk:8: CELLS: expected cell 1 of type TRIANGLE_STRIP (6): at least 3 nodes, found 0 nodes`},
	{"celltype_unknown.vtk", 0, readers.ErrUnsupported, 10, 0,
		`celltype_unknown.vtk:10: CELL_TYPES: expected cell 0: a supported cell type, found type 99 (unsupported)`},
	{"celltype_polyhedron.vtk", 0, readers.ErrUnsupported, 10, 0,
		`celltype_polyhedron.vtk:10: CELL_TYPES: expected cell 0: a supported cell type, found type 42 (POLYHEDRON) (unsupported)`},
	{"binary_cell_index_range.vtk", 0, nil, 0, 427,
		`binary_cell_index_range.vtk: byte 427: CELLS: expected cell 2: node indices in [0,12), found 99`},

	// 5.1 OFFSETS/CONNECTIVITY (meshio _vtk_51.py asserts offsets[0] == 0
	// and offsets[-1] == len(connectivity)).
	{"v51_offsets_first.vtk", 0, nil, 8, 0,
		`v51_offsets_first.vtk:8: CELLS: expected offsets from 0 to 4, found 1 to 4`},
	{"v51_offsets_last.vtk", 0, nil, 8, 0,
		`v51_offsets_last.vtk:8: CELLS: expected offsets from 0 to 4, found 0 to 3`},
	{"v51_offsets_decreasing.vtk", 0, nil, 8, 0,
		`v51_offsets_decreasing.vtk:8: CELLS: expected non-decreasing offsets, found offset 1 < 3 at cell 1`},
	{"v51_celltypes_count.vtk", 0, nil, 13, 0,
		`v51_celltypes_count.vtk:13: CELL_TYPES: expected 1 cell types (one per cell), found 2`},
	{"binary_offsets_decreasing.vtk", 0, nil, 0, 427,
		`binary_offsets_decreasing.vtk: byte 427: CELLS: expected non-decreasing offsets, found offset 1 < 12 at cell 4`},

	// Truncated binary cuts of ugrid_tri2d_v51_binary.vtk (VTK-written):
	// the POINTS data starts at byte 138, CELL_TYPES data at 894, the last
	// FIELD array ("wall shear", 12 x 2 floats) at 2970.
	{"binary_truncated_points.vtk", 0, readers.ErrTruncated, 0, 138,
		`binary_truncated_points.vtk: byte 138: POINTS: expected 36 coordinates, found only 100 bytes left in the file`},
	{"binary_truncated_celltypes.vtk", 0, readers.ErrTruncated, 0, 894,
		`binary_truncated_celltypes.vtk: byte 894: CELL_TYPES: expected 12 cell types, found only 10 bytes left in the file`},
	{"binary_truncated_tail.vtk", 0, readers.ErrTruncated, 0, 2970,
		`binary_truncated_tail.vtk: byte 2970: wall shear: expected 24 values of "wall shear" (12 × 2), found only 36 bytes left in the file`},

	// Compressed streams over Options.MaxBytes (decompressed size).
	// bomb.vtk.gz declares 5e6 points (>= 2*15e6-1 bytes of ASCII): refused
	// from the declaration, positioned at the data start (line 6).
	{"bomb.vtk.gz", 1 << 20, readers.ErrTooLarge, 6, 0,
		`bomb.vtk.gz:6: POINTS: expected 15000000 coordinates, found a block of at least 29999999 bytes, beyond the 1048576-byte limit (Options.MaxBytes) (too large)`},
	// A plain file larger than Options.MaxBytes is refused from its size
	// (3006 bytes) before reading.
	{"binary_truncated_tail.vtk", 1000, readers.ErrTooLarge, 0, 0,
		`binary_truncated_tail.vtk: byte 0: expected at most 1000 bytes (Options.MaxBytes), found 3006 bytes (too large)`},
	// bomb_whitespace.vtk.gz declares nothing large but inflates to 16 MiB
	// of blank lines: refused when the stream passes the limit.
	{"bomb_whitespace.vtk.gz", 1 << 20, readers.ErrTooLarge, 0, 1 << 20,
		`bomb_whitespace.vtk.gz: byte 1048576: expected at most 1048576 bytes (Options.MaxBytes), found more (too large)`},
	// Compressed streams cut in half (first half of the VTK fixture's .gz
	// and .zst copies). The position is where decompressed data ends:
	// Python's zlib.decompressobj yields exactly 5144 bytes from
	// truncated.vtk.gz; the .zst frame is one compressed block (content
	// 9078 B < 128 KiB, RFC 8878 §3.1.1.2), so nothing precedes the cut.
	{"truncated.vtk.gz", 0, readers.ErrTruncated, 0, 5144,
		`truncated.vtk.gz: byte 5144: expected more data, found the compressed stream cut short (unexpected EOF)`},
	{"truncated.vtk.zst", 0, readers.ErrTruncated, 0, 0,
		`truncated.vtk.zst: byte 0: expected more data, found the compressed stream cut short (unexpected EOF)`},
}

// TestMalformedExactErrors reads each malformed file and checks the exact
// error: the *Error type, its sentinel, its position and its message.
func TestMalformedExactErrors(t *testing.T) {
	for _, c := range malformedCases {
		t.Run(c.file, func(t *testing.T) {
			_, err := readers.ReadFile(filepath.Join(malformedDir, c.file), readers.Options{MaxBytes: c.max})
			mfCheck(t, err, c)
		})
	}
}

func mfCheck(t *testing.T, err error, c malformedCase) {
	t.Helper()
	if err == nil {
		t.Fatalf("no error, want %q", c.msg)
	}
	var e *readers.Error
	if !errors.As(err, &e) {
		t.Fatalf("error %T (%v) is not a *readers.Error", err, err)
	}
	if e.File != c.file {
		t.Errorf("Error.File = %q, want %q", e.File, c.file)
	}
	if e.Line != c.line || e.Offset != c.offset {
		t.Errorf("position line %d offset %d, want line %d offset %d", e.Line, e.Offset, c.line, c.offset)
	}
	for _, s := range mfSentinels {
		if is := errors.Is(err, s); is != (s == c.want) {
			t.Errorf("errors.Is(err, %v) = %v", s, is)
		}
	}
	if err.Error() != c.msg {
		t.Errorf("message\n got %s\nwant %s", err.Error(), c.msg)
	}
}

// TestMalformedStreaming reads the same corpus through ReadVTK from a
// reader of unknown size (the streaming path: counts checked against
// Options.MaxBytes, slices grown as data arrives). Errors must still be
// positioned *Errors with a sentinel where the file has one; the exact
// wording may differ where the sized check (bytes left in the file) and the
// streaming check (data ends early) meet the problem at different points.
func TestMalformedStreaming(t *testing.T) {
	for _, c := range malformedCases {
		t.Run(c.file, func(t *testing.T) {
			b, err := os.ReadFile(filepath.Join(malformedDir, c.file))
			if err != nil {
				t.Fatal(err)
			}
			max := c.max
			if max == 0 {
				max = 64 << 20
			}
			_, err = readers.ReadVTK(struct{ io.Reader }{bytes.NewReader(b)}, c.file, readers.Options{MaxBytes: max})
			var e *readers.Error
			if !errors.As(err, &e) {
				t.Fatalf("error %T (%v) is not a *readers.Error", err, err)
			}
			if !strings.HasPrefix(err.Error(), c.file+":") {
				t.Errorf("message %q does not start with the file name", err)
			}
			if e.Line == 0 && e.Offset == 0 && c.offset != 0 {
				t.Errorf("no position in %q", err)
			}
			if c.want != nil && c.want != readers.ErrTruncated && c.want != readers.ErrTooLarge && !errors.Is(err, c.want) {
				t.Errorf("errors.Is(%v) false: %v", c.want, err)
			}
			if (c.want == readers.ErrTruncated || c.want == readers.ErrTooLarge) &&
				!errors.Is(err, readers.ErrTruncated) && !errors.Is(err, readers.ErrTooLarge) {
				t.Errorf("want ErrTruncated or ErrTooLarge, got %v", err)
			}
		})
	}
}

// mfBoundedFiles declare far more than their bytes can hold.
// spoints_blank_bomb.vtk.gz is 267 bytes of gzip inflating to 130 KB of
// blank lines and "DIMENSIONS 100 100 100" with no data: nothing backs 10^6
// implicit points and ~10^6 hexahedra (~60 MB of coordinates and
// connectivity), so it must be refused (or read lazily) within the budget.
var mfBoundedFiles = []string{"huge_points.vtk", "huge_cells.vtk", "binary_huge_points.vtk",
	"binary_huge_cells.vtk", "v51_huge_offsets.vtk", "points_beyond_file.vtk",
	"binary_points_beyond_file.vtk", "bomb.vtk.gz", "bomb_whitespace.vtk.gz", "spoints_blank_bomb.vtk.gz"}

// TestMalformedHugeCountsBoundedMemory checks house rule 6 (never allocate
// from an unchecked declared count): files declaring up to 10^12 points or
// cells in a few hundred bytes must fail while allocating < 10 MB in total
// (the reader's own buffers are a few MB; 10^12 float32 points would be
// 12 TB), through both the sized and the streaming path.
func TestMalformedHugeCountsBoundedMemory(t *testing.T) {
	for _, name := range mfBoundedFiles {
		b, err := os.ReadFile(filepath.Join(malformedDir, name))
		if err != nil {
			t.Fatal(err)
		}
		for _, streaming := range []bool{false, true} {
			var r io.Reader = bytes.NewReader(b)
			if streaming {
				r = struct{ io.Reader }{r}
			}
			var m0, m1 runtime.MemStats
			runtime.GC()
			runtime.ReadMemStats(&m0)
			_, err := readers.ReadVTK(r, name, readers.Options{MaxBytes: 1 << 20, Workers: 1})
			runtime.ReadMemStats(&m1)
			if err == nil {
				t.Errorf("%s: no error", name)
			}
			if d := m1.TotalAlloc - m0.TotalAlloc; d > 10<<20 {
				t.Errorf("%s (streaming %v): allocated %d bytes (limit 10 MB)", name, streaming, d)
			}
		}
	}
}

// TestMalformedNaNKept: NaN and Inf are legal ASCII values (VTK's
// TestLegacyArrayInfNan reads "nan", "-nan", "inf", "-inf" in any case);
// the reader keeps them so that later stages can report them by index.
func TestMalformedNaNKept(t *testing.T) {
	f, err := readers.ReadFile(filepath.Join(malformedDir, "nan_values.vtk"), readers.Options{})
	if err != nil {
		t.Fatal(err)
	}
	z := f.Zones[0]
	p, q := z.Array("p"), z.Array("q")
	if p == nil || q == nil || p.Components != 1 || q.Components != 2 {
		t.Fatalf("arrays p, q missing or misshaped: %+v", z.Arrays)
	}
	// File: p = nan -nan inf 1.5 ; q = (0, NaN) (-Inf, 2) (3, 4) (5, 6).
	if !math.IsNaN(p.Data[0]) || !math.IsNaN(p.Data[1]) || !math.IsInf(p.Data[2], 1) || p.Data[3] != 1.5 {
		t.Errorf("p = %v", p.Data)
	}
	want := []float64{0, math.NaN(), math.Inf(-1), 2, 3, 4, 5, 6}
	for i, v := range q.Data {
		if !(v == want[i] || (math.IsNaN(v) && math.IsNaN(want[i]))) {
			t.Errorf("q[%d] = %v, want %v", i, v, want[i])
		}
	}
	nan := 0
	for _, a := range z.Arrays {
		for _, v := range a.Data {
			if math.IsNaN(v) {
				nan++
			}
		}
	}
	if nan != 3 {
		t.Errorf("%d NaN values visible, want 3", nan)
	}
}

// TestMalformedUnknownKeywordWarns: an unknown keyword after DATASET ends
// the parse with a warning naming the line and the keyword (FORMATS.md §1.9:
// VTK reports unsupported attribute types; "warn and stop" recommended);
// what was read before it is kept.
func TestMalformedUnknownKeywordWarns(t *testing.T) {
	cases := []struct {
		file          string
		points, cells int
		arrays        int
		warning       string
	}{
		{"unknown_keyword.vtk", 4, 0, 0, `unknown_keyword.vtk: line 8: unknown keyword "CELLZ"; the rest of the file is ignored`},
		{"unknown_keyword_attr.vtk", 4, 1, 0, `unknown_keyword_attr.vtk: line 13: unknown keyword "SCALARZ"; the rest of the file is ignored`},
	}
	for _, c := range cases {
		f, err := readers.ReadFile(filepath.Join(malformedDir, c.file), readers.Options{})
		if err != nil {
			t.Errorf("%s: %v", c.file, err)
			continue
		}
		z := f.Zones[0]
		if z.NumPoints() != c.points || z.NumCells() != c.cells || len(z.Arrays) != c.arrays {
			t.Errorf("%s: %d points %d cells %d arrays", c.file, z.NumPoints(), z.NumCells(), len(z.Arrays))
		}
		if len(f.Warnings) != 1 || f.Warnings[0] != c.warning {
			t.Errorf("%s: warnings %q, want [%q]", c.file, f.Warnings, c.warning)
		}
	}
}

// lyingDir holds compressed files whose container lies about the
// decompressed size; they are written by testdata/malformed/make_lying.py
// (see its docstring). Each declares 10^7 float points (240 MB as float64)
// in a 151-byte stream holding 12.
const lyingDir = "testdata/malformed"

// lyingCases: the gzip trailer claims 4 GiB - 1 (RFC 1952 ISIZE), the zstd
// frame 2^40 bytes (RFC 8878 Frame_Content_Size). The decompressors find
// the lie only when the data ends: the gzip ISIZE check after the 151
// bytes; klauspost/compress zstd checks the content size when the frame
// ends, before delivering its last block (the data), hence byte 103, where
// the header block ends.
var lyingCases = []malformedCase{
	{"lying_isize.vtk.gz", 0, nil, 0, 151,
		`lying_isize.vtk.gz: byte 151: expected more data, found a read error (gzip: invalid checksum)`},
	{"lying_fcs.vtk.zst", 0, nil, 0, 103,
		`lying_fcs.vtk.zst: byte 103: expected more data, found a read error (frame size does not match size on stream)`},
}

// TestMalformedLyingContainer reads the lying files with the default
// Options.MaxBytes (64 GiB), so that only the reader's own cap on a size
// hint (1032 decompressed bytes per compressed byte, deflate's largest
// expansion) stands between the claim and an allocation of the declared
// 240 MB. Through ReadFile and a bytes.Reader (hint read) and a plain
// io.Reader (no hint), each read must give the exact error and allocate
// less than 4 MB: the reader's buffers shrink to what the capped hint
// allows (a few hundred KB), the first step of a growing array is 64 Ki
// values (512 KB) and the decoders keep a window of at most 1 MiB.
func TestMalformedLyingContainer(t *testing.T) {
	for _, c := range lyingCases {
		path := filepath.Join(lyingDir, c.file)
		b, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		for _, how := range []string{"ReadFile", "bytes.Reader", "io.Reader"} {
			t.Run(c.file+"/"+how, func(t *testing.T) {
				var m0, m1 runtime.MemStats
				runtime.GC()
				runtime.ReadMemStats(&m0)
				switch how {
				case "ReadFile":
					_, err = readers.ReadFile(path, readers.Options{Workers: 1})
				case "bytes.Reader":
					_, err = readers.ReadVTK(bytes.NewReader(b), c.file, readers.Options{Workers: 1})
				default:
					_, err = readers.ReadVTK(struct{ io.Reader }{bytes.NewReader(b)}, c.file, readers.Options{Workers: 1})
				}
				runtime.ReadMemStats(&m1)
				mfCheck(t, err, c)
				if d := m1.TotalAlloc - m0.TotalAlloc; d > 4<<20 {
					t.Errorf("allocated %d bytes (limit 4 MB)", d)
				}
			})
		}
	}
}

// TestMalformedCorpusCovered makes sure every file of the corpus is checked
// by one of the tests above.
func TestMalformedCorpusCovered(t *testing.T) {
	seen := map[string]bool{"nan_values.vtk": true, "unknown_keyword.vtk": true, "unknown_keyword_attr.vtk": true}
	for _, c := range malformedCases {
		seen[c.file] = true
	}
	for _, f := range mfBoundedFiles {
		seen[f] = true
	}
	for _, c := range lyingCases {
		seen[c.file] = true
	}
	m, _ := filepath.Glob(filepath.Join(malformedDir, "*"))
	l, _ := filepath.Glob(filepath.Join(lyingDir, "*"))
	for _, p := range append(m, l...) {
		if b := filepath.Base(p); !seen[b] && b != "README.md" && !strings.HasSuffix(b, ".py") {
			t.Errorf("%s is not checked by any test", p)
		}
	}
}

// mfBigASCII returns an ASCII STRUCTURED_POINTS file of n = 100*100*30
// points with a SCALARS array s[i] = i/2 - 1000.25 and a VECTORS array
// v[i] = (i, -i/4, 3), all exactly representable, 9 values per line as VTK
// writes them. It is larger than the reader's 4 MiB buffer, so blocks are
// cut across refills and split between workers. If bad >= 0, the token of
// s[bad] is replaced by "1.2.3" and the line of that token is returned.
func mfBigASCII(bad int) ([]byte, int) {
	var b bytes.Buffer
	b.WriteString("# vtk DataFile Version 4.2\nbig\nASCII\nDATASET STRUCTURED_POINTS\nDIMENSIONS 100 100 30\nORIGIN 0 0 0\nSPACING 1 1 1\n")
	const n = 100 * 100 * 30
	b.WriteString("POINT_DATA 300000\nSCALARS s double 1\nLOOKUP_TABLE default\n")
	line := 0
	for i := 0; i < n; i++ {
		if i == bad {
			line = bytes.Count(b.Bytes(), []byte{'\n'}) + 1
			b.WriteString("1.2.3")
		} else {
			b.WriteString(strconv.FormatFloat(float64(i)/2-1000.25, 'g', -1, 64))
		}
		if i%9 == 8 {
			b.WriteByte('\n')
		} else {
			b.WriteByte(' ')
		}
	}
	b.WriteString("\nVECTORS v float\n")
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "%d %g 3\n", i, -float64(i)/4)
	}
	return b.Bytes(), line
}

// mfReadAllWays reads data with 1, 2 and 3 workers, each through the sized
// and the streaming path: check vets the first field read, and every
// other must be reflect.DeepEqual to it (house rule 7).
func mfReadAllWays(t *testing.T, data []byte, check func(f *field.Field)) {
	t.Helper()
	var first *field.Field
	for _, w := range []int{1, 2, 3} {
		for _, streaming := range []bool{false, true} {
			var r io.Reader = bytes.NewReader(data)
			if streaming {
				r = struct{ io.Reader }{r}
			}
			f, err := readers.ReadVTK(r, "big.vtk", readers.Options{Workers: w})
			if err != nil {
				t.Fatalf("workers %d streaming %v: %v", w, streaming, err)
			}
			if first == nil {
				first = f
				check(f)
				continue
			}
			if !reflect.DeepEqual(first, f) {
				t.Errorf("workers %d streaming %v: field differs from workers 1", w, streaming)
			}
		}
	}
}

// TestLargeASCIIWorkers reads an 8 MB ASCII file with 1, 2 and 3 workers
// and through the streaming path: every value equals the formula it was
// written from, and an error planted deep in the block is reported at the
// same exact line with the same message whatever the worker count.
func TestLargeASCIIWorkers(t *testing.T) {
	if testing.Short() {
		t.Skip("8 MB input")
	}
	data, _ := mfBigASCII(-1)
	mfReadAllWays(t, data, func(f *field.Field) {
		z := f.Zones[0]
		s, v := z.Array("s"), z.Array("v")
		if s == nil || v == nil || s.Len() != 300000 || v.Len() != 300000 {
			t.Fatalf("arrays s, v missing or short")
		}
		for i := 0; i < 300000; i++ {
			if s.Data[i] != float64(i)/2-1000.25 || v.Data[3*i] != float64(i) || v.Data[3*i+1] != -float64(i)/4 || v.Data[3*i+2] != 3 {
				t.Fatalf("tuple %d: s=%v v=%v", i, s.Data[i], v.Data[3*i:3*i+3])
			}
		}
	})
	for _, bad := range []int{5, 150001, 299999} {
		data, line := mfBigASCII(bad)
		var msg string
		for _, w := range []int{1, 2, 3} {
			_, err := readers.ReadVTK(bytes.NewReader(data), "big.vtk", readers.Options{Workers: w})
			var e *readers.Error
			if !errors.As(err, &e) {
				t.Fatalf("bad token at %d, workers %d: %v", bad, w, err)
			}
			if e.Line != line {
				t.Errorf("bad token at %d, workers %d: line %d, want %d (%v)", bad, w, e.Line, line, err)
			}
			if want := fmt.Sprintf(`found "1.2.3" after %d`, bad); !strings.Contains(err.Error(), want) {
				t.Errorf("bad token at %d: %q does not contain %q", bad, err, want)
			}
			if msg == "" {
				msg = err.Error()
			} else if err.Error() != msg {
				t.Errorf("workers %d: %q, workers 1: %q", w, err, msg)
			}
		}
	}
}

// mfBigBinary returns a BINARY 5.1 UNSTRUCTURED_GRID of n vertex cells
// (point i at (i, 2i, -i), float; cell i = vertex i) with a POINT_DATA
// double array d[i] = i*0.25 - 7. OFFSETS and CONNECTIVITY are vtktypeint64
// (800 KB each), so their conversion is split between workers. If bad >= 0,
// connectivity[bad] is set to 2^40 and the byte offset of that value is
// returned.
func mfBigBinary(bad int) ([]byte, int64) {
	const n = 100000
	var b bytes.Buffer
	fmt.Fprintf(&b, "# vtk DataFile Version 5.1\nbig\nBINARY\nDATASET UNSTRUCTURED_GRID\nPOINTS %d float\n", n)
	for i := 0; i < n; i++ {
		for _, x := range []float32{float32(i), float32(2 * i), float32(-i)} {
			binary.Write(&b, binary.BigEndian, x)
		}
	}
	fmt.Fprintf(&b, "\nCELLS %d %d\nOFFSETS vtktypeint64\n", n+1, n)
	for i := 0; i <= n; i++ {
		binary.Write(&b, binary.BigEndian, int64(i))
	}
	b.WriteString("\nCONNECTIVITY vtktypeint64\n")
	var off int64
	for i := 0; i < n; i++ {
		v := int64(i)
		if i == bad {
			off, v = int64(b.Len()), 1<<40
		}
		binary.Write(&b, binary.BigEndian, v)
	}
	fmt.Fprintf(&b, "\nCELL_TYPES %d\n", n)
	for i := 0; i < n; i++ {
		binary.Write(&b, binary.BigEndian, int32(1))
	}
	fmt.Fprintf(&b, "\nPOINT_DATA %d\nSCALARS d double 1\nLOOKUP_TABLE default\n", n)
	for i := 0; i < n; i++ {
		binary.Write(&b, binary.BigEndian, float64(i)*0.25-7)
	}
	b.WriteString("\n")
	return b.Bytes(), off
}

// TestLargeBinaryWorkers: the same checks as TestLargeASCIIWorkers for
// BINARY blocks converted in parallel; an out-of-range index planted in
// the second half of CONNECTIVITY must be reported at its exact byte.
func TestLargeBinaryWorkers(t *testing.T) {
	data, _ := mfBigBinary(-1)
	mfReadAllWays(t, data, func(f *field.Field) {
		z := f.Zones[0]
		d := z.Array("d")
		if z.NumPoints() != 100000 || z.NumCells() != 100000 || d == nil {
			t.Fatalf("%d points %d cells", z.NumPoints(), z.NumCells())
		}
		for i := 0; i < 100000; i++ {
			if z.Points[3*i] != float64(i) || z.Points[3*i+1] != float64(2*i) || z.Points[3*i+2] != -float64(i) ||
				z.Types[i] != field.Vertex || z.Conn[i] != int32(i) || d.Data[i] != float64(i)*0.25-7 {
				t.Fatalf("point/cell/value %d wrong", i)
			}
		}
	})
	for _, bad := range []int{3, 70001, 99999} {
		data, off := mfBigBinary(bad)
		for _, w := range []int{1, 2, 3} {
			_, err := readers.ReadVTK(bytes.NewReader(data), "big.vtk", readers.Options{Workers: w})
			var e *readers.Error
			if !errors.As(err, &e) {
				t.Fatalf("bad index at %d, workers %d: %v", bad, w, err)
			}
			// The value is 2^40 = 1099511627776 (the reader prints it as a float).
			want := fmt.Sprintf("big.vtk: byte %d: CONNECTIVITY: expected a 32-bit integer, found 1.099511627776e+12", off)
			if e.Offset != off || err.Error() != want {
				t.Errorf("bad index at %d, workers %d:\n got %v\nwant %s", bad, w, err, want)
			}
		}
	}
}
