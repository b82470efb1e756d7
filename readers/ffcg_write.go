package readers

import (
	"bufio"
	"fmt"
	"io"
	"maps"
	"slices"
	"strconv"
	"strings"

	"farforce/field"
)

// WriteFFCG writes f as an ffcg file (docs/cgns-text-format.md): one base
// (CellDimension = the largest cell dimension, PhysicalDimension 3), one
// unstructured zone per field zone with CoordinateX/Y/Z, its cells as
// element sections in cell order (runs of one type as that type, mixed runs
// as MIXED, polygons as NGON_n), point arrays in a Vertex FlowSolution and
// cell arrays (and Zone.Blank as Iblank) in a CellCenter one. Values are
// written as R8 in the shortest form that reads back to the same bits, so
// ReadFFCG returns the same zones. info may be nil; otherwise its
// DataClass, Units and Reference are written at base level and each patch
// with faces becomes a boundary section and a BC (FaceCenter in 3-D,
// EdgeCenter in 2-D), a patch without faces a Vertex PointList.
//
// Errors: a zone that fails Validate, and write errors.
func WriteFFCG(w io.Writer, f *field.Field, info *CaseInfo) error {
	cellDim := 1
	for _, z := range f.Zones {
		if err := z.Validate(); err != nil {
			return fmt.Errorf("ffcg: %w", err)
		}
		for _, t := range z.Types {
			cellDim = max(cellDim, t.Dim())
		}
	}
	fw := &ffcgWriter{w: bufio.NewWriterSize(w, 1<<16)}
	fw.line(0, ffcgMagic)
	fw.line(0, "# written by farforce; format: docs/cgns-text-format.md")
	fw.line(0, fmt.Sprintf("base Base CellDimension=%d PhysicalDimension=3", cellDim))
	if info != nil {
		fw.caseInfo(info)
	}
	used := map[string]bool{}
	for zi, z := range f.Zones {
		name := ffcgName(z.Name)
		for used[name] {
			name += "_" + strconv.Itoa(zi)
		}
		used[name] = true
		fw.zone(z, zi, name, cellDim, info)
	}
	fw.line(0, "end base")
	if fw.err == nil {
		fw.err = fw.w.Flush()
	}
	return fw.err
}

// ffcgName %-encodes a name into one ffcg token (docs §1).
func ffcgName(s string) string {
	if s == "" {
		return "unnamed"
	}
	return strings.NewReplacer("#", "%23", "=", "%3D", ",", "%2C").Replace(encodeName(s))
}

// ffcgWriter writes indented statements and value blocks, keeping the
// first error.
type ffcgWriter struct {
	w   *bufio.Writer
	buf []byte
	err error
}

func (fw *ffcgWriter) line(depth int, s string) {
	if fw.err != nil {
		return
	}
	fw.buf = append(fw.buf[:0], strings.Repeat("  ", depth)...)
	fw.buf = append(fw.buf, s...)
	fw.buf = append(fw.buf, '\n')
	_, fw.err = fw.w.Write(fw.buf)
}

// values writes a value block, perLine values per line.
func (fw *ffcgWriter) values(depth int, d []float64, perLine int) {
	ind := strings.Repeat("  ", depth)
	fw.buf = fw.buf[:0]
	for i, x := range d {
		if i%perLine == 0 {
			fw.buf = append(fw.buf, ind...)
		} else {
			fw.buf = append(fw.buf, ' ')
		}
		fw.buf = appendFloat(fw.buf, x)
		if i%perLine == perLine-1 || i == len(d)-1 {
			fw.buf = append(fw.buf, '\n')
		}
		if len(fw.buf) > 1<<15 {
			fw.flush()
		}
	}
	fw.flush()
}

func (fw *ffcgWriter) flush() {
	if fw.err == nil {
		_, fw.err = fw.w.Write(fw.buf)
	}
	fw.buf = fw.buf[:0]
}

// cellRows writes the 1-based nodes of cells lo..end-1 of z, one cell per
// line, each preceded by its CGNS type number when mixed.
func (fw *ffcgWriter) cellRows(depth int, z *field.Zone, lo, end int, mixed bool) {
	ind := strings.Repeat("  ", depth)
	fw.buf = fw.buf[:0]
	for c := lo; c < end; c++ {
		fw.buf = append(fw.buf, ind...)
		if mixed {
			fw.buf = strconv.AppendInt(fw.buf, int64(cgTypeOf(z.Types[c]).id), 10)
			fw.buf = append(fw.buf, ' ')
		}
		for i, v := range z.CellNodes(c) {
			if i > 0 {
				fw.buf = append(fw.buf, ' ')
			}
			fw.buf = strconv.AppendInt(fw.buf, int64(v)+1, 10)
		}
		fw.buf = append(fw.buf, '\n')
		if len(fw.buf) > 1<<15 {
			fw.flush()
		}
	}
	fw.flush()
}

// caseInfo writes the base-level DataClass, units and reference state.
func (fw *ffcgWriter) caseInfo(info *CaseInfo) {
	if info.DataClass != "" {
		fw.line(1, "DataClass "+info.DataClass)
	}
	if info.Units != [5]string{} {
		u := info.Units
		for i := range u {
			if u[i] == "" {
				u[i] = "Null"
			}
		}
		fw.line(1, "DimensionalUnits "+strings.Join(u[:], " "))
	}
	if len(info.Reference) > 0 {
		fw.line(1, "ReferenceState")
		for _, n := range slices.Sorted(maps.Keys(info.Reference)) {
			fw.line(2, ffcgName(n)+" = "+string(appendFloat(nil, info.Reference[n])))
		}
		fw.line(1, "end ReferenceState")
	}
}

// cgTypeOf maps a field cell type to its CGNS element type.
func cgTypeOf(t field.CellType) cgElem {
	for _, e := range cgElems {
		if e.t == t && e.npe == e.corners {
			return e
		}
	}
	return cgElem{}
}

// zone writes one zone.
func (fw *ffcgWriter) zone(z *field.Zone, zi int, name string, cellDim int, info *CaseInfo) {
	fw.line(1, fmt.Sprintf("zone %s Unstructured VertexSize=%d CellSize=%d", name, z.NumPoints(), z.NumCells()))
	fw.line(2, "GridCoordinates")
	c := make([]float64, z.NumPoints())
	for ax, cn := range coordNames {
		for i := range c {
			c[i] = z.Points[3*i+ax]
		}
		fw.line(3, fmt.Sprintf("data %s R8 %d", cn, len(c)))
		fw.values(4, c, 8)
	}
	fw.line(2, "end GridCoordinates")
	next := fw.sections(z, "Cells", 0, z.NumCells(), 1)
	if info != nil {
		fw.bcs(z, zi, cellDim, info, next)
	}
	fw.solution(z, "VertexData", "Vertex", field.AtPoints)
	fw.solution(z, "CellData", "CellCenter", field.AtCells)
	fw.line(1, "end zone")
}

// sections writes cells lo..hi-1 of src as element sections numbered from
// first: maximal runs of one type, MIXED runs, NGON_n runs for polygons.
// It returns the next free element number.
func (fw *ffcgWriter) sections(src *field.Zone, name string, lo, hi int, first int64) int64 {
	k := 0
	for lo < hi {
		end, mixed := lo+1, false
		poly := src.Types[lo] == field.Polygon
		for end < hi && (src.Types[end] == field.Polygon) == poly {
			if src.Types[end] != src.Types[lo] {
				mixed = true
			}
			end++
		}
		if !poly && mixed {
			// Keep a leading single-type run separate when it is long.
			run := lo + 1
			for run < end && src.Types[run] == src.Types[lo] {
				run++
			}
			if run-lo >= 64 {
				end, mixed = run, false
			}
		}
		secName := name
		if k > 0 {
			secName = name + strconv.Itoa(k)
		}
		k++
		last := first + int64(end-lo) - 1
		var offs []float64
		typ := "MIXED"
		switch {
		case poly:
			typ = "NGON_n"
			offs = append(offs, 0)
		case !mixed:
			typ = cgTypeOf(src.Types[lo]).name
		}
		total := int(src.Offsets[end] - src.Offsets[lo])
		if typ == "MIXED" {
			total += end - lo
		}
		fw.line(2, fmt.Sprintf("Elements %s %s ElementRange=%d,%d", ffcgName(secName), typ, first, last))
		fw.line(3, fmt.Sprintf("data ElementConnectivity I4 %d", total))
		fw.cellRows(4, src, lo, end, typ == "MIXED")
		for c := lo; poly && c < end; c++ {
			offs = append(offs, float64(src.Offsets[c+1]-src.Offsets[lo]))
		}
		if poly {
			fw.line(3, fmt.Sprintf("data ElementStartOffset I4 %d", len(offs)))
			fw.values(4, offs, 8)
		}
		fw.line(2, "end Elements")
		first = last + 1
		lo = end
	}
	return first
}

// bcs writes the patches of zone zi: faces as boundary sections numbered
// from next, then the ZoneBC block.
func (fw *ffcgWriter) bcs(z *field.Zone, zi, cellDim int, info *CaseInfo, next int64) {
	type bcRange struct{ first, last int64 }
	var ranges []bcRange
	var pts []*Patch
	for i := range info.Patches {
		pt := &info.Patches[i]
		if pt.Zone != zi {
			continue
		}
		pts = append(pts, pt)
		r := bcRange{}
		if pt.Faces != nil && pt.Faces.NumCells() > 0 {
			r.first = next
			next = fw.sections(pt.Faces, pt.Name+"Faces", 0, pt.Faces.NumCells(), next)
			r.last = next - 1
		}
		ranges = append(ranges, r)
	}
	if len(pts) == 0 {
		return
	}
	loc := "FaceCenter"
	if cellDim < 3 {
		loc = "EdgeCenter"
	}
	fw.line(2, "ZoneBC")
	for i, pt := range pts {
		head := "BC " + ffcgName(pt.Name) + " " + pt.Type
		if pt.Family != "" {
			head += " FamilyName=" + ffcgName(pt.Family)
		}
		if r := ranges[i]; r.first > 0 {
			fw.line(3, fmt.Sprintf("%s GridLocation=%s ElementRange=%d,%d", head, loc, r.first, r.last))
		} else {
			fw.line(3, head+" GridLocation=Vertex")
			fw.line(4, fmt.Sprintf("data PointList I4 %d", len(pt.Points)))
			d := make([]float64, len(pt.Points))
			for j, v := range pt.Points {
				d[j] = float64(v) + 1
			}
			fw.values(5, d, 8)
		}
		fw.line(3, "end BC")
	}
	fw.line(2, "end ZoneBC")
}

// solution writes the arrays of z at loc (and Iblank for cells) as one
// FlowSolution; nothing when there are none.
func (fw *ffcgWriter) solution(z *field.Zone, name, loc string, at field.Centering) {
	var list []*field.Array
	for i := range z.Arrays {
		if z.Arrays[i].Location == at {
			list = append(list, &z.Arrays[i])
		}
	}
	blank := at == field.AtCells && z.Blank != nil
	if len(list) == 0 && !blank {
		return
	}
	fw.line(2, fmt.Sprintf("FlowSolution %s GridLocation=%s", name, loc))
	for _, a := range list {
		head := fmt.Sprintf("data %s R8 %d", ffcgName(a.Name), len(a.Data))
		if a.Components != 1 {
			head += fmt.Sprintf(" Components=%d", a.Components)
		}
		fw.line(3, head)
		fw.values(4, a.Data, max(a.Components, 6))
	}
	if blank {
		fw.line(3, fmt.Sprintf("data Iblank I4 %d", len(z.Blank)))
		d := make([]float64, len(z.Blank))
		for i, b := range z.Blank {
			if !b {
				d[i] = 1
			}
		}
		fw.values(4, d, 20)
	}
	fw.line(2, "end FlowSolution")
}
