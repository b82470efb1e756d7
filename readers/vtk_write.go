package readers

import (
	"bufio"
	"encoding/binary"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"farforce/field"
)

// WriteOptions control WriteVTK.
type WriteOptions struct {
	// Binary selects BINARY (big-endian) instead of ASCII.
	Binary bool
	// Version is "4.2" (classic CELLS layout; the default when empty) or
	// "5.1" (OFFSETS/CONNECTIVITY as vtktypeint64).
	Version string
	// Title is the header's title line (newlines become spaces, at most
	// 255 bytes kept).
	Title string
	// PolyData writes a POLYDATA dataset instead of UNSTRUCTURED_GRID. The
	// zone must hold vertices, lines, triangles, quads and polygons only;
	// cells are written grouped as VERTICES, LINES, POLYGONS (the order
	// VTK numbers them), so cell arrays follow that order.
	PolyData bool
}

// WriteVTK writes z as a legacy VTK file: points and arrays in double
// precision, 1-component arrays as SCALARS, 3-component arrays as
// VECTORS, others in a FIELD block, and z.Blank as the cell array
// vtkGhostType (1 = blanked). Array names are %-encoded. ASCII numbers are
// written with the shortest representation that parses back to the same
// float64, so reading the output with ReadVTK returns z exactly (cells
// regrouped for PolyData, polygons of 3 or 4 nodes as triangles or quads,
// and NaN payloads normalised in ASCII). The zone is checked with
// Validate first. w is not closed.
func WriteVTK(w io.Writer, z *field.Zone, opt WriteOptions) error {
	if err := z.Validate(); err != nil {
		return err
	}
	v5 := false
	switch opt.Version {
	case "", "4.2":
	case "5.1":
		v5 = true
	default:
		return fmt.Errorf("readers: WriteVTK: version %q not supported (4.2 or 5.1)", opt.Version)
	}
	for _, a := range z.Arrays {
		if a.Name == "" {
			return errors.New("readers: WriteVTK: array without a name")
		}
	}
	vw := &vtkWriter{w: bufio.NewWriterSize(w, 1<<20), binary: opt.Binary}
	version := "4.2"
	if v5 {
		version = "5.1"
	}
	title := strings.Map(func(r rune) rune {
		if r == '\n' || r == '\r' {
			return ' '
		}
		return r
	}, opt.Title)
	if len(title) > 255 {
		title = title[:255]
	}
	format := "ASCII"
	if opt.Binary {
		format = "BINARY"
	}
	vw.printf("# vtk DataFile Version %s\n%s\n%s\n", version, title, format)

	perm, err := cellOrder(z, opt.PolyData)
	if err != nil {
		return err
	}
	if opt.PolyData {
		vw.printf("DATASET POLYDATA\n")
	} else {
		vw.printf("DATASET UNSTRUCTURED_GRID\n")
	}
	vw.printf("POINTS %d double\n", z.NumPoints())
	vw.floats(z.Points)
	if opt.PolyData {
		for _, sec := range polySections {
			var cells []int
			for _, c := range perm {
				if sec.has(z.Types[c]) {
					cells = append(cells, c)
				}
			}
			if len(cells) > 0 {
				vw.cells(sec.name, z, cells, v5)
			}
		}
	} else {
		vw.cells("CELLS", z, perm, v5)
		vw.printf("CELL_TYPES %d\n", z.NumCells())
		t := make([]int64, z.NumCells())
		for c, ct := range z.Types {
			t[c] = vtkTypeOf[ct]
		}
		vw.ints(t, 4)
	}
	var cellArrays, pointArrays []field.Array
	for _, a := range z.Arrays {
		if a.Location == field.AtCells {
			if perm != nil {
				a.Data = permute(a.Data, a.Components, perm)
			}
			cellArrays = append(cellArrays, a)
		} else {
			pointArrays = append(pointArrays, a)
		}
	}
	if z.Blank != nil {
		g := make([]float64, len(z.Blank))
		for i, b := range z.Blank {
			if b {
				g[i] = 1
			}
		}
		if perm != nil {
			g = permute(g, 1, perm)
		}
		cellArrays = append(cellArrays, field.Array{Name: "vtkGhostType", Location: field.AtCells, Components: 1, Data: g})
	}
	// Sections are written even for zero cells or points (a file whose only
	// cells were empty cells), so that the arrays survive a round trip.
	if len(cellArrays) > 0 {
		vw.printf("CELL_DATA %d\n", z.NumCells())
		vw.arrays(cellArrays, z.NumCells())
	}
	if len(pointArrays) > 0 {
		vw.printf("POINT_DATA %d\n", z.NumPoints())
		vw.arrays(pointArrays, z.NumPoints())
	}
	if vw.err != nil {
		return vw.err
	}
	return vw.w.Flush()
}

// vtkTypeOf maps field cell types to VTK cell type ids.
var vtkTypeOf = map[field.CellType]int64{
	field.Vertex: 1, field.Line: 3, field.Triangle: 5, field.Quad: 9, field.Polygon: 7,
	field.Tetra: 10, field.Hexa: 12, field.Wedge: 13, field.Pyramid: 14,
}

// polySections are the POLYDATA cell sections in VTK's cell numbering
// order.
var polySections = []struct {
	name string
	has  func(field.CellType) bool
}{
	{"VERTICES", func(t field.CellType) bool { return t == field.Vertex }},
	{"LINES", func(t field.CellType) bool { return t == field.Line }},
	{"POLYGONS", func(t field.CellType) bool { return t.Dim() == 2 }},
}

// cellOrder returns the written order of the cells: all of them in order
// for an unstructured grid; grouped by POLYDATA section otherwise.
func cellOrder(z *field.Zone, poly bool) ([]int, error) {
	perm := make([]int, 0, z.NumCells())
	if !poly {
		for c := range z.Types {
			perm = append(perm, c)
		}
		return perm, nil
	}
	for _, sec := range polySections {
		for c, t := range z.Types {
			if sec.has(t) {
				perm = append(perm, c)
			}
		}
	}
	if len(perm) != z.NumCells() {
		return nil, fmt.Errorf("readers: WriteVTK: zone %q has volume cells; POLYDATA holds vertices, lines and polygons only", z.Name)
	}
	return perm, nil
}

// permute reorders tuples: out[i] = d[perm[i]].
func permute(d []float64, comps int, perm []int) []float64 {
	out := make([]float64, len(d))
	for i, p := range perm {
		copy(out[i*comps:(i+1)*comps], d[p*comps:(p+1)*comps])
	}
	return out
}

// vtkWriter writes keyword lines and number blocks, keeping the first
// error.
type vtkWriter struct {
	w      *bufio.Writer
	binary bool
	buf    []byte
	err    error
}

func (v *vtkWriter) printf(format string, a ...any) {
	if v.err == nil {
		_, v.err = fmt.Fprintf(v.w, format, a...)
	}
}

func (v *vtkWriter) flushBuf() {
	if v.err == nil {
		_, v.err = v.w.Write(v.buf)
	}
	v.buf = v.buf[:0]
}

// floats writes a block of doubles, nine per line in ASCII, followed by
// a newline.
func (v *vtkWriter) floats(d []float64) {
	bin := func(b []byte, x float64) []byte { return binary.BigEndian.AppendUint64(b, math.Float64bits(x)) }
	writeBlock(v, d, bin, appendFloat)
}

// ints writes a block of integers of size bytes (4 or 8) each.
func (v *vtkWriter) ints(d []int64, size int) {
	bin := func(b []byte, x int64) []byte { return binary.BigEndian.AppendUint32(b, uint32(int32(x))) }
	if size == 8 {
		bin = func(b []byte, x int64) []byte { return binary.BigEndian.AppendUint64(b, uint64(x)) }
	}
	txt := func(b []byte, x int64) []byte { return strconv.AppendInt(b, x, 10) }
	writeBlock(v, d, bin, txt)
}

// writeBlock writes d with bin (binary files) or txt (ASCII, nine values
// a line), then a newline, flushing the buffer every 64 KiB.
func writeBlock[T any](v *vtkWriter, d []T, bin, txt func([]byte, T) []byte) {
	for i, x := range d {
		if v.binary {
			v.buf = bin(v.buf, x)
		} else {
			v.buf = txt(v.buf, x)
			if i%9 == 8 || i == len(d)-1 {
				v.buf = append(v.buf, '\n')
			} else {
				v.buf = append(v.buf, ' ')
			}
		}
		if len(v.buf) > 1<<16 {
			v.flushBuf()
		}
	}
	if v.binary {
		v.buf = append(v.buf, '\n')
	}
	v.flushBuf()
}

// appendFloat formats x so that parseNumber reads back the same float64.
func appendFloat(b []byte, x float64) []byte {
	switch {
	case math.IsNaN(x):
		return append(b, "nan"...)
	case math.IsInf(x, 1):
		return append(b, "inf"...)
	case math.IsInf(x, -1):
		return append(b, "-inf"...)
	}
	return strconv.AppendFloat(b, x, 'g', -1, 64)
}

// cells writes a cell section for the listed cells: classic "n i j …"
// entries (4.2) or OFFSETS/CONNECTIVITY as vtktypeint64 (5.1).
func (v *vtkWriter) cells(sec string, z *field.Zone, cells []int, v5 bool) {
	nconn := 0
	for _, c := range cells {
		nconn += len(z.CellNodes(c))
	}
	if v5 {
		v.printf("%s %d %d\nOFFSETS vtktypeint64\n", sec, len(cells)+1, nconn)
		off := make([]int64, 1, len(cells)+1)
		conn := make([]int64, 0, nconn)
		for _, c := range cells {
			for _, p := range z.CellNodes(c) {
				conn = append(conn, int64(p))
			}
			off = append(off, int64(len(conn)))
		}
		v.ints(off, 8)
		v.printf("CONNECTIVITY vtktypeint64\n")
		v.ints(conn, 8)
		return
	}
	v.printf("%s %d %d\n", sec, len(cells), len(cells)+nconn)
	d := make([]int64, 0, len(cells)+nconn)
	for _, c := range cells {
		nodes := z.CellNodes(c)
		d = append(d, int64(len(nodes)))
		for _, p := range nodes {
			d = append(d, int64(p))
		}
	}
	v.ints(d, 4)
}

// arrays writes the arrays of one location: SCALARS (1 component),
// VECTORS (3), and a FIELD block for the rest.
func (v *vtkWriter) arrays(list []field.Array, n int) {
	var rest []field.Array
	for _, a := range list {
		switch {
		case a.Name == "vtkGhostType" && a.Components == 1:
			v.printf("SCALARS vtkGhostType unsigned_char 1\nLOOKUP_TABLE default\n")
			if v.binary {
				for _, x := range a.Data {
					v.buf = append(v.buf, byte(x))
				}
				v.buf = append(v.buf, '\n')
				v.flushBuf()
			} else {
				d := make([]int64, len(a.Data))
				for i, x := range a.Data {
					d[i] = int64(x)
				}
				v.ints(d, 1)
			}
		case a.Components == 1:
			v.printf("SCALARS %s double 1\nLOOKUP_TABLE default\n", encodeName(a.Name))
			v.floats(a.Data)
		case a.Components == 3:
			v.printf("VECTORS %s double\n", encodeName(a.Name))
			v.floats(a.Data)
		default:
			rest = append(rest, a)
		}
	}
	if len(rest) == 0 {
		return
	}
	v.printf("FIELD FieldData %d\n", len(rest))
	for _, a := range rest {
		v.printf("%s %d %d double\n", encodeName(a.Name), a.Components, n)
		v.floats(a.Data)
	}
}

// encodeName %-encodes the bytes of an array name that would break a
// token: whitespace, control and non-ASCII bytes, and '%'.
func encodeName(s string) string {
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c <= ' ' || c >= 0x7f || c == '%' {
			fmt.Fprintf(&b, "%%%02X", c)
			continue
		}
		b.WriteByte(c)
	}
	return b.String()
}
