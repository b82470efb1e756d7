package readers

import (
	"fmt"
	"math"
	"strings"

	"farforce/field"
)

// cgElem describes a CGNS element type (FORMATS.md §2.2): its ElementType_t
// number, nodes per element, the field cell type and the number of corner
// nodes kept (the first ones: CGNS lists corners first).
type cgElem struct {
	name    string
	id      int32
	npe     int
	t       field.CellType
	corners int
}

var cgElems = []cgElem{
	{"NODE", 2, 1, field.Vertex, 1},
	{"BAR_2", 3, 2, field.Line, 2},
	{"BAR_3", 4, 3, field.Line, 2},
	{"TRI_3", 5, 3, field.Triangle, 3},
	{"TRI_6", 6, 6, field.Triangle, 3},
	{"QUAD_4", 7, 4, field.Quad, 4},
	{"QUAD_8", 8, 8, field.Quad, 4},
	{"QUAD_9", 9, 9, field.Quad, 4},
	{"TETRA_4", 10, 4, field.Tetra, 4},
	{"TETRA_10", 11, 10, field.Tetra, 4},
	{"PYRA_5", 12, 5, field.Pyramid, 5},
	{"PYRA_14", 13, 14, field.Pyramid, 5},
	{"PENTA_6", 14, 6, field.Wedge, 6},
	{"PENTA_15", 15, 15, field.Wedge, 6},
	{"PENTA_18", 16, 18, field.Wedge, 6},
	{"HEXA_8", 17, 8, field.Hexa, 8},
	{"HEXA_20", 18, 20, field.Hexa, 8},
	{"HEXA_27", 19, 27, field.Hexa, 8},
	{"MIXED", 20, 0, 0, 0},
	{"PYRA_13", 21, 13, field.Pyramid, 5},
	{"NGON_n", 22, 0, field.Polygon, 0}, // 3- and 4-node polygons become triangles and quads
}

// elemByID returns the element type with CGNS number id.
func elemByID(id int32) (cgElem, bool) {
	for _, e := range cgElems {
		if e.id == id {
			return e, true
		}
	}
	return cgElem{}, false
}

// ffcgSection is an element section converted to cells (0-based nodes,
// corner nodes only).
type ffcgSection struct {
	k           keyLine
	name        string
	first, last int64
	types       []field.CellType
	offsets     []int32 // len(types)+1
	conn        []int32
}

// elements reads an Elements block.
func (p *ffcgParser) elements(z *ffcgZone, k keyLine) error {
	const usage = "Elements NAME TYPE ElementRange=first,last"
	if z.structured {
		return p.errK(k, "no Elements in a structured zone", "Elements", errSyntax)
	}
	st, err := p.split(k, 2, 2, usage, "elementrange")
	if err != nil {
		return err
	}
	var et cgElem
	found := false
	for _, e := range cgElems {
		if strings.EqualFold(st.pos[1], e.name) {
			et, found = e, true
		}
	}
	if !found {
		if strings.EqualFold(st.pos[1], "NFACE_n") {
			return p.errK(k, "an element type other than NFACE_n", "NFACE_n", ErrUnsupported)
		}
		return p.errK(k, "a CGNS element type name (TRI_3, QUAD_4, TETRA_4, PYRA_5, PENTA_6, HEXA_8, MIXED, ...)", quote([]byte(st.pos[1])), ErrUnknownFormat)
	}
	r, err := p.ints(st, "elementrange", 2, "first,last")
	if err != nil {
		return err
	}
	if r == nil {
		return p.errK(k, usage, "no ElementRange", errSyntax)
	}
	if r[0] < 1 || r[1] < r[0] || r[1]-r[0] >= math.MaxInt32 {
		return p.errK(k, "1 <= first <= last, at most 2^31-1 elements", fmt.Sprintf("%d,%d", r[0], r[1]), errSyntax)
	}
	n := r[1] - r[0] + 1
	sec := &ffcgSection{k: k, name: decodeName(st.pos[0]), first: r[0], last: r[1]}
	var conn, offs []int32
	for {
		h, end, err := p.dataStmt("Elements")
		if err != nil {
			return err
		}
		if end {
			break
		}
		k := h.k
		switch h.name {
		case "ElementConnectivity":
			if conn != nil {
				return p.errK(k, "one ElementConnectivity", "a second one", errSyntax)
			}
			if et.npe > 0 {
				if err := p.wantCount(h, n*int64(et.npe), fmt.Sprintf("%d %s elements x %d nodes", n, et.name, et.npe)); err != nil {
					return err
				}
			}
			if conn, err = p.readIndices(h); err != nil {
				return err
			}
		case "ElementStartOffset":
			if offs != nil {
				return p.errK(k, "one ElementStartOffset", "a second one", errSyntax)
			}
			if err := p.wantCount(h, n+1, "element count + 1"); err != nil {
				return err
			}
			if offs, err = p.readIndices(h); err != nil {
				return err
			}
		default:
			return p.errK(k, "ElementConnectivity or ElementStartOffset", quote([]byte(h.name)), ErrUnsupported)
		}
	}
	if conn == nil {
		return p.errK(k, "an ElementConnectivity array", "none", errSyntax)
	}
	if et.name == "NGON_n" && offs == nil {
		return p.errK(k, "an ElementStartOffset array for NGON_n", "none", errSyntax)
	}
	if err := p.convertSection(z, sec, et, int(n), conn, offs); err != nil {
		return err
	}
	z.sections = append(z.sections, sec)
	return nil
}

// convertSection turns connectivity into cells: 1-based node numbers are
// checked against the zone's vertex count and made 0-based; quadratic
// elements keep their corners (one warning per type).
func (p *ffcgParser) convertSection(z *ffcgZone, sec *ffcgSection, et cgElem, n int, conn, offs []int32) error {
	k := sec.k
	if offs != nil {
		if offs[0] != 0 || int(offs[n]) != len(conn) {
			return p.errK(k, fmt.Sprintf("ElementStartOffset from 0 to %d", len(conn)), fmt.Sprintf("%d to %d", offs[0], offs[n]), errSyntax)
		}
		for e := 0; e < n; e++ {
			if offs[e+1] < offs[e] {
				return p.errK(k, "non-decreasing ElementStartOffset", fmt.Sprintf("%d after %d at element %d", offs[e+1], offs[e], sec.first+int64(e)), errSyntax)
			}
		}
	}
	if et.npe > 0 && et.corners == et.npe {
		return p.fixedSection(z, sec, et, n, conn)
	}
	sec.types = make([]field.CellType, 0, n)
	sec.offsets = make([]int32, 1, n+1)
	sec.conn = make([]int32, 0, len(conn))
	reduced := map[string]bool{}
	pos := 0
	for e := 0; e < n; e++ {
		id := sec.first + int64(e)
		t := et
		var nodes []int32
		switch {
		case et.name == "MIXED":
			if pos >= len(conn) {
				return p.errK(k, fmt.Sprintf("%d elements", n), fmt.Sprintf("connectivity for %d", e), errSyntax)
			}
			var ok bool
			t, ok = elemByID(conn[pos])
			if !ok || t.npe == 0 {
				return p.errK(k, fmt.Sprintf("element %d: a CGNS element type number of a fixed-size type", id), fmt.Sprint(conn[pos]), ErrUnsupported)
			}
			if pos+1+t.npe > len(conn) {
				return p.errK(k, fmt.Sprintf("element %d: %d nodes", id, t.npe), fmt.Sprintf("%d before the end of ElementConnectivity", len(conn)-pos-1), errSyntax)
			}
			nodes = conn[pos+1 : pos+1+t.npe]
			pos += 1 + t.npe
			if offs != nil && int(offs[e+1]) != pos {
				return p.errK(k, fmt.Sprintf("element %d: ElementStartOffset %d", id, pos), fmt.Sprint(offs[e+1]), errSyntax)
			}
		case et.name == "NGON_n":
			nodes = conn[offs[e]:offs[e+1]]
			if len(nodes) < 3 {
				return p.errK(k, fmt.Sprintf("element %d: a polygon of at least 3 nodes", id), fmt.Sprint(len(nodes)), errSyntax)
			}
		default:
			nodes = conn[e*et.npe : (e+1)*et.npe]
		}
		if t.corners > 0 && t.corners < t.npe {
			nodes = nodes[:t.corners]
			if !reduced[t.name] {
				reduced[t.name] = true
				p.s.warn("line %d: %s elements reduced to their %d corner nodes", k.line, t.name, t.corners)
			}
		}
		for _, v := range nodes {
			if v < 1 || int(v) > z.nv {
				return p.errK(k, fmt.Sprintf("element %d: node numbers in 1..%d", id, z.nv), fmt.Sprint(v), errSyntax)
			}
			sec.conn = append(sec.conn, v-1)
		}
		if et.name == "NGON_n" {
			t.t = polygonType(len(nodes))
		}
		sec.types = append(sec.types, t.t)
		sec.offsets = append(sec.offsets, int32(len(sec.conn)))
	}
	if et.name == "MIXED" && pos != len(conn) {
		return p.errK(k, fmt.Sprintf("%d connectivity values for %d elements", pos, n), fmt.Sprint(len(conn)), errSyntax)
	}
	return nil
}

// fixedSection converts a section of one linear element type in place:
// conn becomes the 0-based connectivity, offsets run in steps of the
// element's node count.
func (p *ffcgParser) fixedSection(z *ffcgZone, sec *ffcgSection, et cgElem, n int, conn []int32) error {
	for i, v := range conn {
		if v < 1 || int(v) > z.nv {
			return p.errK(sec.k, fmt.Sprintf("element %d: node numbers in 1..%d", sec.first+int64(i/et.npe), z.nv), fmt.Sprint(v), errSyntax)
		}
		conn[i] = v - 1
	}
	sec.conn = conn
	sec.types = make([]field.CellType, n)
	sec.offsets = make([]int32, n+1)
	for e := range n {
		sec.types[e] = et.t
		sec.offsets[e+1] = int32((e + 1) * et.npe)
	}
	return nil
}
