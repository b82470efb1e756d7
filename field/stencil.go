package field

import "slices"

// Stencils for reconstruction and gradient recovery are rings of cells
// linked by shared nodes. Two cells share a node when they have nodes at
// exactly the same position, which links cells across zone interfaces
// (where each zone keeps its own copy of the interface points) as well as
// within a zone. Candidates come from the Locator, so only indexed
// (non-blank) cells of the field's dimension take part. Unlike a search by
// distance, a ring never reaches across a thin body or a gap between
// non-matching zones.

// cellsAtNode appends to dst the indexed cells having a node at exactly x,
// in (Zone, Cell) order.
func (l *Locator) cellsAtNode(x [3]float64, dst []CellRef) []CellRef {
	first := len(dst)
	dst = l.CellsInBox(x, x, dst)
	keep := dst[:first]
	for _, r := range dst[first:] {
		if l.f.Zones[r.Zone].hasNodeAt(int(r.Cell), x) {
			keep = append(keep, r)
		}
	}
	return keep
}

// hasNodeAt reports whether cell c of z has a node at exactly x.
func (z *Zone) hasNodeAt(c int, x [3]float64) bool {
	for _, n := range z.CellNodes(c) {
		if z.Points[3*n] == x[0] && z.Points[3*n+1] == x[1] && z.Points[3*n+2] == x[2] {
			return true
		}
	}
	return false
}

// expandRing returns refs together with every indexed cell that shares a
// node with one of them, sorted by (Zone, Cell) without duplicates. refs
// itself may hold cells that are not indexed (a blank cell); they are
// dropped. dst is reused for the result.
func (l *Locator) expandRing(refs []CellRef, dst []CellRef) []CellRef {
	dst = dst[:0]
	var pos [][3]float64
	for _, r := range refs {
		z := l.f.Zones[r.Zone]
		for _, n := range z.CellNodes(int(r.Cell)) {
			pos = append(pos, z.Point(n))
		}
	}
	slices.SortFunc(pos, comparePos)
	pos = slices.Compact(pos)
	for _, x := range pos {
		dst = l.cellsAtNode(x, dst)
	}
	slices.SortFunc(dst, compareRefs)
	return slices.Compact(dst)
}

func comparePos(a, b [3]float64) int {
	for k := 0; k < 3; k++ {
		if a[k] < b[k] {
			return -1
		}
		if a[k] > b[k] {
			return 1
		}
	}
	return 0
}
