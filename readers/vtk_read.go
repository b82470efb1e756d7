package readers

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"farforce/field"
)

// vtkFile is the state of one legacy VTK parse: header, geometry as
// declared, cell blocks and attribute arrays. The zone is assembled by
// build once the whole stream has been read.
type vtkFile struct {
	s            *scanner
	opt          Options
	major, minor int
	dataset      string // lower-case DATASET type

	points     []float64 // explicit points (STRUCTURED_GRID, POLYDATA, UNSTRUCTURED_GRID)
	havePoints bool
	dims       [3]int
	haveDims   bool
	origin     [3]float64
	spacing    [3]float64
	coords     [3][]float64 // RECTILINEAR_GRID axes
	haveCoord  [3]bool

	cells     *cellBlock    // UNSTRUCTURED_GRID CELLS
	cellTypes []int32       // UNSTRUCTURED_GRID CELL_TYPES
	typesAt   keyLine       // CELL_TYPES position
	poly      [4]*cellBlock // POLYDATA VERTICES, LINES, POLYGONS, TRIANGLE_STRIPS

	loc         field.Centering // current attribute section
	locN        int             // its declared tuple count
	inAttr      bool
	pointArrays []field.Array
	cellArrays  []field.Array
	ghost       []float64 // cell ghost values (vtkGhostType, vtkGhostLevels)
	backed      int64     // largest tuple count of any attribute array in the stream

	pointsType    dtype // type of POINTS or of the RECTILINEAR_GRID axes
	endianChecked bool  // the little-endian test has run
}

// parseVTK reads a whole legacy VTK stream and returns its zone.
func parseVTK(s *scanner, opt Options) (*field.Zone, error) {
	f := &vtkFile{s: s, opt: opt, spacing: [3]float64{1, 1, 1}}
	if err := f.header(); err != nil {
		return nil, err
	}
	for {
		k, ok, err := s.nextKeyLine()
		if err != nil {
			return nil, err
		}
		if !ok {
			break
		}
		stop, err := f.keyword(k)
		if err != nil {
			return nil, err
		}
		if stop {
			break
		}
	}
	return f.build()
}

// header reads the version line, the title and the format word
// (VTK legacy file format document, "The five parts").
func (f *vtkFile) header() error {
	s := f.s
	if err := s.fill(64); err != nil {
		return err
	}
	l, err := s.rawLine()
	if err != nil {
		return err
	}
	const magic = "# vtk datafile version"
	lw := strings.Join(fields(l), " ")
	if !strings.HasPrefix(lower(lw), magic) {
		return &Error{File: s.name, Line: 1, Expected: `"# vtk DataFile Version x.y"`, Found: quote(l), Err: ErrUnknownFormat}
	}
	v := strings.TrimSpace(lw[len(magic):])
	maj, min, ok := strings.Cut(v, ".")
	f.major, err = strconv.Atoi(maj)
	if err == nil && ok {
		f.minor, err = strconv.Atoi(strings.TrimSpace(min))
	}
	if err != nil || !ok {
		return &Error{File: s.name, Line: 1, Expected: "a version number x.y", Found: quote([]byte(v)), Err: ErrUnknownFormat}
	}
	if f.major < 1 || f.major > 5 {
		return &Error{File: s.name, Line: 1, Expected: "version 1.0 to 5.x", Found: v, Err: ErrUnsupported}
	}
	if _, err := s.rawLine(); err != nil { // title
		return err
	}
	k, ok, err := s.nextKeyLine()
	if err != nil {
		return err
	}
	if !ok {
		return &Error{File: s.name, Line: 3, Expected: "ASCII or BINARY", Found: "EOF", Err: ErrTruncated}
	}
	switch k.key() {
	case "ascii":
		s.ascii = true
	case "binary":
	default:
		return &Error{File: s.name, Line: k.line, Expected: "ASCII or BINARY", Found: quote([]byte(k.f[0])), Err: ErrUnknownFormat}
	}
	return nil
}

// quote shortens and quotes input text for messages.
func quote(b []byte) string {
	if len(b) > 60 {
		b = b[:60]
	}
	return strconv.Quote(string(b))
}

// errKey returns an error positioned at keyword line k.
func (f *vtkFile) errKey(k keyLine, expected, found string, err error) *Error {
	e := &Error{File: f.s.name, Section: strings.ToUpper(k.f[0]), Expected: expected, Found: found, Err: err}
	if f.s.ascii {
		e.Line = k.line
	} else {
		e.Offset = k.off
	}
	return e
}

// argc checks that k has at least n arguments after the keyword.
func (f *vtkFile) argc(k keyLine, n int, what string) error {
	if len(k.f)-1 < n {
		return f.errKey(k, what, fmt.Sprintf("%d fields", len(k.f)-1), errSyntax)
	}
	return nil
}

// count parses argument i of k as a non-negative count.
func (f *vtkFile) count(k keyLine, i int) (int64, error) {
	n, err := strconv.ParseInt(k.f[i], 10, 64)
	if err != nil || n < 0 {
		return 0, f.errKey(k, "a non-negative integer count", quote([]byte(k.f[i])), errSyntax)
	}
	return n, nil
}

// dtype resolves argument i of k as a data type name.
func (f *vtkFile) dtype(k keyLine, i int) (dtype, error) {
	if i >= len(k.f) {
		return dtype{}, f.errKey(k, "a data type", "end of line", errSyntax)
	}
	t, ok := lookupType(k.f[i])
	if !ok {
		return t, f.errKey(k, "a VTK data type name", quote([]byte(k.f[i])), ErrUnknownFormat)
	}
	return t, nil
}

// real parses argument i of k as a number.
func (f *vtkFile) real(k keyLine, i int) (float64, error) {
	x, ok := parseNumber([]byte(k.f[i]), false)
	if !ok {
		return 0, f.errKey(k, "a number", quote([]byte(k.f[i])), errSyntax)
	}
	return x, nil
}

// keyword dispatches one keyword line; stop ends the parse (unknown
// trailing keyword, warned).
func (f *vtkFile) keyword(k keyLine) (stop bool, err error) {
	key := k.key()
	switch key {
	case "dataset":
		return false, f.datasetLine(k)
	case "points", "dimensions", "origin", "spacing", "aspect_ratio",
		"x_coordinates", "y_coordinates", "z_coordinates",
		"cells", "cell_types", "vertices", "lines", "polygons", "triangle_strips":
		if f.inAttr {
			return false, f.errKey(k, "attributes only after the geometry (POINT_DATA/CELL_DATA)", "a geometry keyword", errSyntax)
		}
		if f.dataset == "" {
			return false, f.errKey(k, "DATASET before the geometry", "no DATASET line", errSyntax)
		}
		return false, f.geometry(k)
	case "field":
		if f.inAttr {
			return false, f.fieldBlock(k, true)
		}
		if f.dataset == "" {
			return false, f.errKey(k, "DATASET", "a bare FIELD data object", ErrUnsupported)
		}
		return false, f.fieldBlock(k, false)
	case "point_data", "cell_data":
		return false, f.section(k)
	case "metadata":
		return false, f.skipMetadata()
	case "lookup_table":
		return false, f.lookupTable(k)
	case "scalars", "color_scalars", "vectors", "normals", "tensors", "tensors6",
		"texture_coordinates", "global_ids", "pedigree_ids", "edge_flags":
		if !f.inAttr {
			return false, f.errKey(k, "POINT_DATA or CELL_DATA before attributes", "an attribute outside a section", errSyntax)
		}
		return false, f.attribute(k)
	}
	if f.dataset == "" {
		return false, f.errKey(k, "DATASET", quote([]byte(k.f[0])), ErrUnknownFormat)
	}
	where := fmt.Sprintf("byte %d", k.off)
	if f.s.ascii {
		where = fmt.Sprintf("line %d", k.line)
	}
	f.s.warn("%s: unknown keyword %q; the rest of the file is ignored", where, k.f[0])
	return true, nil
}

// datasetLine handles "DATASET type".
func (f *vtkFile) datasetLine(k keyLine) error {
	if err := f.argc(k, 1, "a dataset type"); err != nil {
		return err
	}
	if f.dataset != "" {
		return f.errKey(k, "one DATASET", "a second DATASET line", errSyntax)
	}
	switch t := lower(k.f[1]); t {
	case "structured_points", "structured_grid", "rectilinear_grid", "unstructured_grid", "polydata":
		f.dataset = t
		return nil
	}
	return f.errKey(k, "STRUCTURED_POINTS, STRUCTURED_GRID, RECTILINEAR_GRID, UNSTRUCTURED_GRID or POLYDATA", quote([]byte(k.f[1])), ErrUnsupported)
}

// skipMetadata skips a METADATA block: lines up to the first empty one
// (docs.vtk.org "VTK Legacy Reader/Writer Information Format"). The
// METADATA line itself has been consumed.
func (f *vtkFile) skipMetadata() error {
	for {
		if eof, err := f.s.atEOF(); err != nil || eof {
			return err
		}
		l, err := f.s.rawLine()
		if err != nil {
			return err
		}
		if len(fields(l)) == 0 {
			return nil
		}
	}
}

// afterArray skips an optional METADATA block following an array.
func (f *vtkFile) afterArray() error {
	k, err := f.s.peekKeyAfterSpace()
	if err != nil || k != "metadata" {
		return err
	}
	if _, err := f.s.rawLine(); err != nil {
		return err
	}
	return f.skipMetadata()
}

// decodeName decodes %XX escapes in an array name (VTK legacy file
// format document: names are %-encoded).
func decodeName(s string) string {
	if !strings.Contains(s, "%") {
		return s
	}
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		if s[i] == '%' && i+2 < len(s) {
			if v, err := strconv.ParseUint(s[i+1:i+3], 16, 8); err == nil {
				b.WriteByte(byte(v))
				i += 2
				continue
			}
		}
		b.WriteByte(s[i])
	}
	return b.String()
}

// isGhost reports whether an array name is a VTK ghost array.
func isGhost(name string) bool { return name == "vtkGhostType" || name == "vtkGhostLevels" }

// checkInt32 converts a count to int, refusing more than 2^31-1 items.
func (f *vtkFile) checkInt32(k keyLine, n int64, what string) (int, error) {
	if n > math.MaxInt32 {
		return 0, f.errKey(k, "at most 2^31-1 "+what, fmt.Sprint(n), ErrTooLarge)
	}
	return int(n), nil
}
