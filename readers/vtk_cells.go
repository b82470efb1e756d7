package readers

import (
	"fmt"
	"math"
	"sort"

	"farforce/field"
)

// VTK cell type ids used by name (vtkCellType.h).
const (
	vtkEmpty         = 0
	vtkPolyVertex    = 2
	vtkPolyLine      = 4
	vtkTriangleStrip = 6
	vtkPolygon       = 7
	vtkQuadPolygon   = 36
)

// cellInfo describes how a VTK cell type maps to a field cell: the field
// type, the node count in the file (0 = variable), the corner nodes kept
// (an index map into the VTK nodes) and whether it is a reduced
// higher-order cell.
type cellInfo struct {
	name      string
	out       field.CellType
	nodes     int
	keep      []int
	quadratic bool
}

var (
	keep1   = []int{0}
	keep2   = []int{0, 1}
	keep3   = []int{0, 1, 2}
	keep4   = []int{0, 1, 2, 3}
	keep5   = []int{0, 1, 2, 3, 4}
	keep6   = []int{0, 1, 2, 3, 4, 5}
	keep8   = []int{0, 1, 2, 3, 4, 5, 6, 7}
	pixelQ  = []int{0, 1, 3, 2}             // VTK pixel -> quad (FORMATS.md §1.8)
	voxelH  = []int{0, 1, 3, 2, 4, 5, 7, 6} // VTK voxel -> hexahedron
	vtkInfo = map[int32]cellInfo{
		1:  {"VERTEX", field.Vertex, 1, keep1, false},
		2:  {"POLY_VERTEX", field.Vertex, 0, nil, false},
		3:  {"LINE", field.Line, 2, keep2, false},
		4:  {"POLY_LINE", field.Line, 0, nil, false},
		5:  {"TRIANGLE", field.Triangle, 3, keep3, false},
		6:  {"TRIANGLE_STRIP", field.Triangle, 0, nil, false},
		7:  {"POLYGON", field.Polygon, 0, nil, false},
		8:  {"PIXEL", field.Quad, 4, pixelQ, false},
		9:  {"QUAD", field.Quad, 4, keep4, false},
		10: {"TETRA", field.Tetra, 4, keep4, false},
		11: {"VOXEL", field.Hexa, 8, voxelH, false},
		12: {"HEXAHEDRON", field.Hexa, 8, keep8, false},
		13: {"WEDGE", field.Wedge, 6, keep6, false},
		14: {"PYRAMID", field.Pyramid, 5, keep5, false},
		21: {"QUADRATIC_EDGE", field.Line, 3, keep2, true},
		22: {"QUADRATIC_TRIANGLE", field.Triangle, 6, keep3, true},
		23: {"QUADRATIC_QUAD", field.Quad, 8, keep4, true},
		24: {"QUADRATIC_TETRA", field.Tetra, 10, keep4, true},
		25: {"QUADRATIC_HEXAHEDRON", field.Hexa, 20, keep8, true},
		26: {"QUADRATIC_WEDGE", field.Wedge, 15, keep6, true},
		27: {"QUADRATIC_PYRAMID", field.Pyramid, 13, keep5, true},
		28: {"BIQUADRATIC_QUAD", field.Quad, 9, keep4, true},
		29: {"TRIQUADRATIC_HEXAHEDRON", field.Hexa, 27, keep8, true},
		30: {"QUADRATIC_LINEAR_QUAD", field.Quad, 6, keep4, true},
		31: {"QUADRATIC_LINEAR_WEDGE", field.Wedge, 12, keep6, true},
		32: {"BIQUADRATIC_QUADRATIC_WEDGE", field.Wedge, 18, keep6, true},
		33: {"BIQUADRATIC_QUADRATIC_HEXAHEDRON", field.Hexa, 24, keep8, true},
		34: {"BIQUADRATIC_TRIANGLE", field.Triangle, 7, keep3, true},
		35: {"CUBIC_LINE", field.Line, 4, keep2, true},
		36: {"QUADRATIC_POLYGON", field.Polygon, 0, nil, true},
		37: {"TRIQUADRATIC_PYRAMID", field.Pyramid, 19, keep5, true},
	}
)

// cellBlock is a block of cells as stored in the file, normalised to the
// 5.x layout: the nodes of cell c are conn[offsets[c]:offsets[c+1]].
// fixed is the VTK type of every cell of a POLYDATA section, 0 when types
// come from CELL_TYPES.
type cellBlock struct {
	n       int
	offsets []int32
	conn    []int32
	fixed   int32
	at      keyLine
	checked int // node indices already checked against this many points (0: not yet)
}

// cellBlock reads "CELLS a b" (or a POLYDATA section line) and its data,
// in the classic layout (a cells, b = a + Σ nodes, each cell "n i j …")
// or the 5.x layout (a offsets, b connectivity entries, OFFSETS and
// CONNECTIVITY sub-blocks) (VTK legacy file format document; FORMATS.md
// §1.4).
func (f *vtkFile) cellBlock(k keyLine) (*cellBlock, error) {
	if err := f.argc(k, 2, k.f[0]+" n size"); err != nil {
		return nil, err
	}
	a, err := f.count(k, 1)
	if err != nil {
		return nil, err
	}
	b, err := f.count(k, 2)
	if err != nil {
		return nil, err
	}
	sec := k.f[0]
	next, err := f.s.peekKey()
	if err != nil {
		return nil, err
	}
	if next == "offsets" {
		return f.cellBlock5(k, a, b)
	}
	if a > b {
		return nil, f.errKey(k, fmt.Sprintf("a size of at least %d for %d cells", a, a), fmt.Sprint(b), errSyntax)
	}
	if _, err := f.checkInt32(k, b, "cell entries"); err != nil {
		return nil, err
	}
	if a > 0 {
		if err := f.checkEndian(dtypes["int"], 0, b); err != nil {
			return nil, err
		}
	}
	raw, err := f.s.readInts(b, dtypes["int"], sec, "cell entries")
	if err != nil {
		return nil, err
	}
	// Compact "n i j k ..." in place into connectivity and offsets; when
	// the points are known, check the node indices on the way.
	offsets := make([]int32, a+1)
	np := uint32(math.MaxUint32)
	if f.havePoints {
		np = uint32(len(f.points) / 3)
	}
	r, w := 0, 0
	for c := 0; c < int(a); c++ {
		if r >= len(raw) {
			return nil, f.errKey(k, fmt.Sprintf("%d cells in %d entries", a, b), fmt.Sprintf("only %d", c), errSyntax)
		}
		m := int(raw[r])
		if m < 0 || m > len(raw)-r-1 {
			return nil, f.errKey(k, fmt.Sprintf("cell %d: a node count within the %d entries", c, b), fmt.Sprint(m), errSyntax)
		}
		src := raw[r+1 : r+1+m]
		dst := raw[w : w+len(src)]
		for i, v := range src {
			if uint32(v) >= np {
				return nil, f.errKey(k, fmt.Sprintf("cell %d: node indices in [0,%d)", c, np), fmt.Sprint(v), errSyntax)
			}
			dst[i] = v
		}
		r += 1 + m
		w += m
		offsets[c+1] = int32(w)
	}
	if r != len(raw) {
		return nil, f.errKey(k, fmt.Sprintf("%d entries for %d cells", b, a), fmt.Sprintf("%d used", r), errSyntax)
	}
	blk := &cellBlock{n: int(a), offsets: offsets, conn: raw[:w], at: k}
	if f.havePoints {
		blk.checked = int(np)
	}
	return blk, f.afterArray()
}

// cellBlock5 reads the OFFSETS and CONNECTIVITY sub-blocks of a 5.x cell
// block with a offsets and b connectivity entries.
func (f *vtkFile) cellBlock5(k keyLine, a, b int64) (*cellBlock, error) {
	var arrays [2][]int32
	for i, want := range []string{"offsets", "connectivity"} {
		sk, ok, err := f.s.nextKeyLine()
		if err != nil {
			return nil, err
		}
		if !ok || sk.key() != want {
			found := "EOF"
			if ok {
				found = quote([]byte(sk.f[0]))
			}
			return nil, f.errKey(k, "an "+want+" line", found, errSyntax)
		}
		t, err := f.dtype(sk, 1)
		if err != nil {
			return nil, err
		}
		n := a
		if i == 1 {
			n = b
		}
		if _, err := f.checkInt32(sk, n, want+" entries"); err != nil {
			return nil, err
		}
		if i == 0 && n > 1 {
			if err := f.checkEndian(t, 1, b); err != nil {
				return nil, err
			}
		}
		arrays[i], err = f.s.readInts(n, t, sk.f[0], want+" entries")
		if err != nil {
			return nil, err
		}
		if err := f.afterArray(); err != nil {
			return nil, err
		}
	}
	off, conn := arrays[0], arrays[1]
	if len(off) == 0 {
		if len(conn) != 0 {
			return nil, f.errKey(k, "no connectivity without offsets", fmt.Sprint(len(conn)), errSyntax)
		}
		off = []int32{0}
	}
	if off[0] != 0 || int(off[len(off)-1]) != len(conn) {
		return nil, f.errKey(k, fmt.Sprintf("offsets from 0 to %d", len(conn)), fmt.Sprintf("%d to %d", off[0], off[len(off)-1]), errSyntax)
	}
	for c := 1; c < len(off); c++ {
		if off[c] < off[c-1] {
			return nil, f.errKey(k, "non-decreasing offsets", fmt.Sprintf("offset %d < %d at cell %d", off[c], off[c-1], c-1), errSyntax)
		}
	}
	return &cellBlock{n: len(off) - 1, offsets: off, conn: conn, at: k}, nil
}

// cellTypesBlock reads "CELL_TYPES n" (always 4-byte int).
func (f *vtkFile) cellTypesBlock(k keyLine) error {
	if f.dataset != "unstructured_grid" {
		return f.errKey(k, "CELL_TYPES only in UNSTRUCTURED_GRID", f.dataset, errSyntax)
	}
	if f.cells == nil {
		return f.errKey(k, "CELLS before CELL_TYPES", "CELL_TYPES first", errSyntax)
	}
	if f.cellTypes != nil {
		return f.errKey(k, "one CELL_TYPES block", "a second one", errSyntax)
	}
	if err := f.argc(k, 1, "CELL_TYPES n"); err != nil {
		return err
	}
	n, err := f.count(k, 1)
	if err != nil {
		return err
	}
	if n != int64(f.cells.n) {
		return f.errKey(k, fmt.Sprintf("%d cell types (one per cell)", f.cells.n), fmt.Sprint(n), errSyntax)
	}
	if n > 0 {
		if err := f.checkEndian(dtypes["int"], 0, 81); err != nil {
			return err
		}
	}
	t, err := f.s.readInts(n, dtypes["int"], "CELL_TYPES", "cell types")
	if err != nil {
		return err
	}
	if t == nil {
		t = []int32{}
	}
	f.cellTypes, f.typesAt = t, k
	return f.afterArray()
}

// convertedCells is the result of converting file cells to field cells.
// orig maps each field cell to the file cell it came from; nil means the
// identity.
type convertedCells struct {
	types   []field.CellType
	offsets []int32
	conn    []int32
	orig    []int32
}

// typeOf returns the VTK type of cell c of b.
func (f *vtkFile) typeOf(b *cellBlock, c int) int32 {
	if b.fixed != 0 {
		return b.fixed
	}
	return f.cellTypes[c]
}

// produced returns how many field cells and nodes a VTK cell of type t
// with m nodes becomes, or an error naming the cell.
func (f *vtkFile) produced(b *cellBlock, c int, t int32, m int) (cells, nodes int, err error) {
	info, ok := vtkInfo[t]
	bad := func(want string) error {
		return f.errKey(b.at, fmt.Sprintf("cell %d of type %s (%d): %s", c, info.name, t, want), fmt.Sprintf("%d nodes", m), errSyntax)
	}
	switch {
	case t == vtkEmpty:
		return 0, 0, nil
	case !ok:
		at := b.at
		if b.fixed == 0 {
			at = f.typesAt
		}
		return 0, 0, f.errKey(at, fmt.Sprintf("cell %d: a supported cell type", c), fmt.Sprintf("type %d%s", t, vtkTypeName(t)), ErrUnsupported)
	case info.nodes > 0:
		if m != info.nodes {
			return 0, 0, bad(fmt.Sprintf("%d nodes", info.nodes))
		}
		return 1, len(info.keep), nil
	case t == vtkPolyVertex:
		if m < 1 {
			return 0, 0, bad("at least 1 node")
		}
		return m, m, nil
	case t == vtkPolyLine:
		if m < 2 {
			return 0, 0, bad("at least 2 nodes")
		}
		return m - 1, 2 * (m - 1), nil
	case t == vtkTriangleStrip:
		if m < 3 {
			return 0, 0, bad("at least 3 nodes")
		}
		return m - 2, 3 * (m - 2), nil
	case t == vtkPolygon:
		if m < 3 {
			return 0, 0, bad("at least 3 nodes")
		}
		return 1, m, nil
	default: // quadratic polygon
		if m < 6 || m%2 != 0 {
			return 0, 0, bad("an even number of at least 6 nodes")
		}
		return 1, m / 2, nil
	}
}

// vtkTypeName names unsupported VTK cell types for messages.
func vtkTypeName(t int32) string {
	switch t {
	case 15:
		return " (PENTAGONAL_PRISM)"
	case 16:
		return " (HEXAGONAL_PRISM)"
	case 41:
		return " (CONVEX_POINT_SET)"
	case 42:
		return " (POLYHEDRON)"
	}
	switch {
	case t >= 51 && t <= 56:
		return " (parametric)"
	case t >= 60 && t <= 81:
		return " (higher-order Lagrange/Bezier)"
	}
	return ""
}

// singleType is the field type of a variable-size VTK cell of type t with
// m nodes that becomes a single field cell.
func singleType(t int32, m int) field.CellType {
	switch t {
	case vtkPolygon:
		return polygonType(m)
	case vtkQuadPolygon:
		return polygonType(m / 2)
	}
	return vtkInfo[t].out // a poly-vertex, polyline or strip of one piece
}

// polygonType is Triangle, Quad or Polygon by node count.
func polygonType(m int) field.CellType {
	switch m {
	case 3:
		return field.Triangle
	case 4:
		return field.Quad
	}
	return field.Polygon
}

// cellTab is vtkInfo indexed by type id, with identity set for types
// kept node for node.
var cellTab = func() (t [64]struct {
	cellInfo
	ok, identity bool
}) {
	for id, info := range vtkInfo {
		e := &t[id]
		e.cellInfo, e.ok = info, true
		e.identity = info.nodes > 0 && len(info.keep) == info.nodes
		for i, k := range info.keep {
			if k != i {
				e.identity = false
			}
		}
	}
	return t
}()

// convert turns the cell blocks (concatenated in order) into field cells
// with node indices checked against np. When every file cell becomes one
// field cell with no more nodes, the block's own arrays are reused in
// place (no copy at all when every cell keeps all its nodes in order).
func (f *vtkFile) convert(blocks []*cellBlock, np int) (convertedCells, error) {
	var nCells, nNodes int64
	expand := len(blocks) > 1
	identity := true
	quad := map[int32]int{}
	// ft holds the field types for the common case of one block whose
	// cells map one to one; it is dropped if any cell splits.
	var ft []field.CellType
	if !expand {
		ft = make([]field.CellType, blocks[0].n)
	}
	for _, b := range blocks {
		for c := 0; c < b.n; c++ {
			t := f.typeOf(b, c)
			m := int(b.offsets[c+1] - b.offsets[c])
			if uint32(t) < uint32(len(cellTab)) {
				if e := &cellTab[t]; e.nodes == m && m > 0 && e.ok {
					if e.quadratic {
						quad[t]++
					}
					identity = identity && e.identity
					nCells++
					nNodes += int64(len(e.keep))
					if ft != nil {
						ft[c] = e.out
					}
					continue
				}
			}
			pc, pn, err := f.produced(b, c, t, m)
			if err != nil {
				return convertedCells{}, err
			}
			if pc != 1 || pn > m {
				expand = true
			} else if ft != nil {
				ft[c] = singleType(t, m)
			}
			if pn != m {
				identity = false
			}
			if t == vtkEmpty || vtkInfo[t].quadratic {
				quad[t]++
			}
			nCells += int64(pc)
			nNodes += int64(pn)
		}
	}
	if nNodes > math.MaxInt32 || nCells > math.MaxInt32 {
		return convertedCells{}, f.errKey(blocks[0].at, "at most 2^31-1 cells and connectivity entries", fmt.Sprintf("%d cells, %d entries", nCells, nNodes), ErrTooLarge)
	}
	for _, b := range blocks {
		if b.checked == np && np > 0 {
			continue
		}
		for i, p := range b.conn {
			if uint32(p) >= uint32(np) {
				c := sort.Search(b.n, func(c int) bool { return int(b.offsets[c+1]) > i })
				return convertedCells{}, f.errKey(b.at, fmt.Sprintf("cell %d: node indices in [0,%d)", c, np), fmt.Sprint(p), errSyntax)
			}
		}
	}
	f.warnQuadratic(quad)
	var out convertedCells
	if !expand && identity {
		out.types, out.offsets, out.conn = ft, blocks[0].offsets, blocks[0].conn
		return out, nil
	}
	out.types = make([]field.CellType, 0, nCells)
	if expand {
		out.offsets = make([]int32, 1, nCells+1)
		out.conn = make([]int32, 0, nNodes)
		out.orig = make([]int32, 0, nCells)
	} else {
		out.offsets = blocks[0].offsets[:1]
		out.conn = blocks[0].conn[:0]
	}
	base := 0
	var tmp [8]int32
	for _, b := range blocks {
		lo := b.offsets[0]
		for c := 0; c < b.n; c++ {
			hi := b.offsets[c+1]
			nodes := b.conn[lo:hi]
			lo = hi
			t := f.typeOf(b, c)
			first := len(out.types)
			switch {
			case t == vtkEmpty:
			case t == vtkPolyVertex:
				for _, p := range nodes {
					out.add(field.Vertex, p)
				}
			case t == vtkPolyLine:
				for i := 0; i+1 < len(nodes); i++ {
					out.add(field.Line, nodes[i], nodes[i+1])
				}
			case t == vtkTriangleStrip:
				// Triangle i of a strip is (i, i+1, i+2), with the first
				// two swapped for odd i to keep one orientation
				// (vtkTriangleStrip::Triangulate).
				for i := 0; i+2 < len(nodes); i++ {
					if i%2 == 0 {
						out.add(field.Triangle, nodes[i], nodes[i+1], nodes[i+2])
					} else {
						out.add(field.Triangle, nodes[i+1], nodes[i], nodes[i+2])
					}
				}
			case t == vtkPolygon:
				out.add(polygonType(len(nodes)), nodes...)
			case t == vtkQuadPolygon:
				// Corner nodes come first (FORMATS.md §1.8).
				out.add(polygonType(len(nodes)/2), nodes[:len(nodes)/2]...)
			default:
				e := &cellTab[t]
				k := tmp[:len(e.keep)]
				for i, j := range e.keep {
					k[i] = nodes[j]
				}
				out.add(e.out, k...)
			}
			if expand {
				for range len(out.types) - first {
					out.orig = append(out.orig, int32(base+c))
				}
			}
		}
		base += b.n
	}
	return out, nil
}

// add appends one field cell.
func (o *convertedCells) add(t field.CellType, nodes ...int32) {
	o.types = append(o.types, t)
	o.conn = append(o.conn, nodes...)
	o.offsets = append(o.offsets, int32(len(o.conn)))
}

// warnQuadratic records one warning per reduced higher-order cell type
// and for dropped empty cells.
func (f *vtkFile) warnQuadratic(count map[int32]int) {
	ts := make([]int32, 0, len(count))
	for t := range count {
		ts = append(ts, t)
	}
	sort.Slice(ts, func(i, j int) bool { return ts[i] < ts[j] })
	for _, t := range ts {
		if t == vtkEmpty {
			f.s.warn("%d EMPTY_CELL (0) cells dropped", count[t])
			continue
		}
		f.s.warn("%d %s (%d) cells reduced to their %d corner nodes", count[t], vtkInfo[t].name, t, cornerCount(t))
	}
}

func cornerCount(t int32) int {
	if t == vtkQuadPolygon {
		return 0
	}
	return len(vtkInfo[t].keep)
}

// structuredCells returns the implicit cells of a structured grid of
// dims points, x fastest: hexahedra in 3D, quads on the two axes with
// more than one point in 2D, lines in 1D, one vertex for a single point
// (VTK cell ids run i fastest over max(n-1,1) per axis).
func structuredCells(dims [3]int) convertedCells {
	var axes []int
	for a, n := range dims {
		if n > 1 {
			axes = append(axes, a)
		}
	}
	stride := [3]int32{1, int32(dims[0]), int32(dims[0] * dims[1])}
	nc := [3]int{max(dims[0]-1, 1), max(dims[1]-1, 1), max(dims[2]-1, 1)}
	total := nc[0] * nc[1] * nc[2]
	var t field.CellType
	var corner [][3]int32 // offsets of the cell nodes in units of axes
	switch len(axes) {
	case 0:
		t, corner = field.Vertex, [][3]int32{{0, 0, 0}}
	case 1:
		t, corner = field.Line, [][3]int32{{0, 0, 0}, {1, 0, 0}}
	case 2:
		t, corner = field.Quad, [][3]int32{{0, 0, 0}, {1, 0, 0}, {1, 1, 0}, {0, 1, 0}}
	default:
		t, corner = field.Hexa, [][3]int32{{0, 0, 0}, {1, 0, 0}, {1, 1, 0}, {0, 1, 0}, {0, 0, 1}, {1, 0, 1}, {1, 1, 1}, {0, 1, 1}}
	}
	rel := make([]int32, len(corner))
	for i, c := range corner {
		for j, a := range axes {
			rel[i] += c[j] * stride[a]
		}
	}
	out := convertedCells{
		types:   make([]field.CellType, total),
		offsets: make([]int32, total+1),
		conn:    make([]int32, 0, total*len(rel)),
	}
	c := 0
	for k := 0; k < nc[2]; k++ {
		for j := 0; j < nc[1]; j++ {
			for i := 0; i < nc[0]; i++ {
				base := int32(i) + int32(j)*stride[1] + int32(k)*stride[2]
				for _, r := range rel {
					out.conn = append(out.conn, base+r)
				}
				out.types[c] = t
				c++
				out.offsets[c] = int32(len(out.conn))
			}
		}
	}
	return out
}
