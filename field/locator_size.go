package field

import "math"

// Cell size for Locator.CellSize: the mean length of a cell's face sides.

// maxCellEdges is the largest edge count of a supported cell (hexahedron).
const maxCellEdges = 12

// edgeTable lists the distinct edges of a cell type (pairs of local
// nodes) and, for each face side in the order meanEdge sums them, the
// index of its edge, so that each edge length is computed once.
type edgeTable struct {
	edges [][2]int
	sides []int
}

// edgeTables holds the edgeTable of every cell type, indexed by type.
var edgeTables = func() (tab [Pyramid + 1]edgeTable) {
	for t := range tab {
		e := &tab[t]
		for _, f := range CellType(t).Faces() {
			for i := range f {
				a, b := f[i], f[(i+1)%len(f)]
				k := 0
				for k < len(e.edges) && e.edges[k] != [2]int{a, b} && e.edges[k] != [2]int{b, a} {
					k++
				}
				if k == len(e.edges) {
					e.edges = append(e.edges, [2]int{a, b})
				}
				e.sides = append(e.sides, k)
				if len(f) == 2 {
					break // a 2D cell's "faces" are its edges
				}
			}
		}
	}
	return tab
}()

// meanEdge returns the mean length of the face sides of cell c: the mean
// edge length, since each edge of a volume cell is a side of two faces (a
// 2D cell's sides are its edges). It is 0 for types without faces. The
// sides are summed in face order; an edge's length does not depend on its
// direction, so computing it once per edge changes no bit.
func (z *Zone) meanEdge(c int) float64 {
	t := z.Types[c]
	if int(t) >= len(edgeTables) || len(edgeTables[t].sides) == 0 {
		return 0
	}
	tab := &edgeTables[t]
	var g cellGeom
	z.gatherNodes(t, z.CellNodes(c), &g)
	var length [maxCellEdges]float64
	for e, ab := range tab.edges {
		a, b := &g.x[ab[0]], &g.x[ab[1]]
		length[e] = math.Sqrt(norm2([3]float64{b[0] - a[0], b[1] - a[1], b[2] - a[2]}))
	}
	sum := 0.0
	for _, e := range tab.sides {
		sum += length[e]
	}
	return sum / float64(len(tab.sides))
}
