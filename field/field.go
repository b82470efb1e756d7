package field

import (
	"fmt"
	"math"
)

// CellType is the kind of a cell. The node order of every type is the
// legacy VTK order (see FORMATS notes in DEVELOPERS.md); orientation is never
// trusted: geometry code orients faces by comparing with the cell centroid.
type CellType uint8

// Cell types known to the field model.
const (
	Vertex   CellType = iota + 1 // 1 node
	Line                         // 2 nodes
	Triangle                     // 3 nodes
	Quad                         // 4 nodes, around the perimeter
	Polygon                      // n >= 3 nodes, surfaces only (POLYDATA)
	Tetra                        // 4 nodes
	Hexa                         // 8 nodes: 0-3 bottom, 4-7 top, 4 above 0
	Wedge                        // 6 nodes: triangles (0,1,2) and (3,4,5), 3 above 0
	Pyramid                      // 5 nodes: base 0-3, apex 4
)

var cellNames = [...]string{"", "vertex", "line", "triangle", "quad", "polygon", "tetra", "hexa", "wedge", "pyramid"}

// String returns the lower-case name of the cell type.
func (t CellType) String() string {
	if int(t) < len(cellNames) && t > 0 {
		return cellNames[t]
	}
	return fmt.Sprintf("celltype(%d)", uint8(t))
}

// NumNodes returns the number of nodes of a cell of type t, or 0 for
// Polygon, whose node count varies.
func (t CellType) NumNodes() int {
	switch t {
	case Vertex:
		return 1
	case Line:
		return 2
	case Triangle:
		return 3
	case Quad, Tetra:
		return 4
	case Pyramid:
		return 5
	case Wedge:
		return 6
	case Hexa:
		return 8
	}
	return 0
}

// Dim returns the topological dimension of t: 0 for vertices, 1 for lines,
// 2 for triangles, quads and polygons, 3 for volume cells.
func (t CellType) Dim() int {
	switch t {
	case Vertex:
		return 0
	case Line:
		return 1
	case Triangle, Quad, Polygon:
		return 2
	}
	return 3
}

// Faces returns the faces of a volume cell type as lists of local node
// indices (VTK face tables), or the edges of a 2D cell type. The slices are
// shared and must not be modified. Orientation is not guaranteed outward.
func (t CellType) Faces() [][]int {
	switch t {
	case Triangle:
		return triEdges
	case Quad:
		return quadEdges
	case Tetra:
		return tetFaces
	case Hexa:
		return hexFaces
	case Wedge:
		return wedgeFaces
	case Pyramid:
		return pyramidFaces
	}
	return nil
}

var (
	triEdges     = [][]int{{0, 1}, {1, 2}, {2, 0}}
	quadEdges    = [][]int{{0, 1}, {1, 2}, {2, 3}, {3, 0}}
	tetFaces     = [][]int{{0, 1, 3}, {1, 2, 3}, {2, 0, 3}, {0, 2, 1}}
	hexFaces     = [][]int{{0, 4, 7, 3}, {1, 2, 6, 5}, {0, 1, 5, 4}, {3, 7, 6, 2}, {0, 3, 2, 1}, {4, 5, 6, 7}}
	wedgeFaces   = [][]int{{0, 1, 2}, {3, 5, 4}, {0, 3, 4, 1}, {1, 4, 5, 2}, {2, 5, 3, 0}}
	pyramidFaces = [][]int{{0, 3, 2, 1}, {0, 1, 4}, {1, 2, 4}, {2, 3, 4}, {3, 0, 4}}
)

// Centering says whether an array holds one tuple per point or per cell.
type Centering uint8

// Array locations.
const (
	AtPoints Centering = iota
	AtCells
)

// String returns "point" or "cell".
func (l Centering) String() string {
	if l == AtCells {
		return "cell"
	}
	return "point"
}

// Array is a named array of tuples at the points or cells of a zone.
// Data holds Len*Components values, tuple by tuple (interleaved).
type Array struct {
	Name       string
	Location   Centering
	Components int
	Data       []float64
}

// Len returns the number of tuples in a.
func (a *Array) Len() int {
	if a.Components <= 0 {
		return 0
	}
	return len(a.Data) / a.Components
}

// Zone is one block of a mesh: points, cells and arrays. Storage is flat and
// pointer-free: Points holds x,y,z per point; the nodes of cell c are
// Conn[Offsets[c]:Offsets[c+1]] (0-based point indices).
type Zone struct {
	Name    string
	Points  []float64  // 3 per point
	Types   []CellType // one per cell
	Offsets []int32    // len(Types)+1, Offsets[0] == 0
	Conn    []int32
	Arrays  []Array
	// Blank marks cells that are not fluid (solid, blanked or ghost cells);
	// nil means every cell is fluid.
	Blank []bool
}

// NumPoints returns the number of points of z.
func (z *Zone) NumPoints() int { return len(z.Points) / 3 }

// NumCells returns the number of cells of z.
func (z *Zone) NumCells() int { return len(z.Types) }

// Point returns point i of z.
func (z *Zone) Point(i int32) [3]float64 {
	return [3]float64{z.Points[3*i], z.Points[3*i+1], z.Points[3*i+2]}
}

// CellNodes returns the point indices of cell c. The slice aliases z.Conn.
func (z *Zone) CellNodes(c int) []int32 {
	return z.Conn[z.Offsets[c]:z.Offsets[c+1]]
}

// Array returns the array called name, or nil.
func (z *Zone) Array(name string) *Array {
	for i := range z.Arrays {
		if z.Arrays[i].Name == name {
			return &z.Arrays[i]
		}
	}
	return nil
}

// AddCell appends a cell of type t with the given nodes.
func (z *Zone) AddCell(t CellType, nodes ...int32) {
	if len(z.Offsets) == 0 {
		z.Offsets = append(z.Offsets, 0)
	}
	z.Types = append(z.Types, t)
	z.Conn = append(z.Conn, nodes...)
	z.Offsets = append(z.Offsets, int32(len(z.Conn)))
}

// Validate checks the internal consistency of z: offsets, node counts per
// cell type, node indices in range and array lengths. It returns an error
// describing the first problem found.
func (z *Zone) Validate() error {
	np := z.NumPoints()
	if len(z.Points)%3 != 0 {
		return fmt.Errorf("zone %q: %d coordinates is not a multiple of 3", z.Name, len(z.Points))
	}
	nc := z.NumCells()
	if len(z.Offsets) != nc+1 && !(nc == 0 && len(z.Offsets) == 0) {
		return fmt.Errorf("zone %q: %d offsets for %d cells", z.Name, len(z.Offsets), nc)
	}
	if nc > 0 && (z.Offsets[0] != 0 || int(z.Offsets[nc]) != len(z.Conn)) {
		return fmt.Errorf("zone %q: offsets must run from 0 to %d", z.Name, len(z.Conn))
	}
	for c := 0; c < nc; c++ {
		lo, hi := z.Offsets[c], z.Offsets[c+1]
		if hi < lo {
			return fmt.Errorf("zone %q: cell %d: offsets decrease", z.Name, c)
		}
		n := int(hi - lo)
		want := z.Types[c].NumNodes()
		if want == 0 && z.Types[c] == Polygon {
			if n < 3 {
				return fmt.Errorf("zone %q: cell %d: polygon with %d nodes", z.Name, c, n)
			}
		} else if n != want {
			return fmt.Errorf("zone %q: cell %d: %s needs %d nodes, has %d", z.Name, c, z.Types[c], want, n)
		}
		for _, p := range z.Conn[lo:hi] {
			if p < 0 || int(p) >= np {
				return fmt.Errorf("zone %q: cell %d: node index %d out of range [0,%d)", z.Name, c, p, np)
			}
		}
	}
	if z.Blank != nil && len(z.Blank) != nc {
		return fmt.Errorf("zone %q: blank mask has %d entries for %d cells", z.Name, len(z.Blank), nc)
	}
	for i := range z.Arrays {
		a := &z.Arrays[i]
		n := np
		if a.Location == AtCells {
			n = nc
		}
		if a.Components < 1 || len(a.Data) != n*a.Components {
			return fmt.Errorf("zone %q: array %q: %d values for %d %ss of %d components", z.Name, a.Name, len(a.Data), n, a.Location, a.Components)
		}
	}
	return nil
}

// Field is a flow solution: one or more zones (a partitioned or multi-block
// mesh) sharing array names.
type Field struct {
	Zones []*Zone
	// Warnings collects non-fatal remarks made while building the field
	// (reduced quadratic cells, skipped blocks, ...).
	Warnings []string
}

// Dim returns 2 when every point of every zone has the same z coordinate
// and 3 otherwise. An empty field is 3D.
func (f *Field) Dim() int {
	first := true
	var z0 float64
	for _, z := range f.Zones {
		for i := 2; i < len(z.Points); i += 3 {
			if first {
				z0, first = z.Points[i], false
			} else if z.Points[i] != z0 {
				return 3
			}
		}
	}
	if first {
		return 3
	}
	return 2
}

// Bounds returns the smallest box holding every point of f. For an empty
// field lo is +Inf and hi -Inf.
func (f *Field) Bounds() (lo, hi [3]float64) {
	for k := 0; k < 3; k++ {
		lo[k], hi[k] = math.Inf(1), math.Inf(-1)
	}
	for _, z := range f.Zones {
		for i := 0; i < len(z.Points); i += 3 {
			for k := 0; k < 3; k++ {
				v := z.Points[i+k]
				if v < lo[k] {
					lo[k] = v
				}
				if v > hi[k] {
					hi[k] = v
				}
			}
		}
	}
	return lo, hi
}

// NumPoints returns the total number of points over all zones.
func (f *Field) NumPoints() int {
	n := 0
	for _, z := range f.Zones {
		n += z.NumPoints()
	}
	return n
}

// NumCells returns the total number of cells over all zones.
func (f *Field) NumCells() int {
	n := 0
	for _, z := range f.Zones {
		n += z.NumCells()
	}
	return n
}
