package field

import (
	"slices"
	"sync"
)

// Stencils for reconstruction and gradient recovery are rings of cells
// linked by shared nodes. Two cells share a node when they have nodes at
// exactly the same position, which links cells across zone interfaces
// (where each zone keeps its own copy of the interface points) as well as
// within a zone. Candidates come from the Locator, so only indexed
// (non-blank) cells of the field's dimension take part. Unlike a search by
// distance, a ring never reaches across a thin body or a gap between
// non-matching zones.

// cellsAtNode appends to dst the indexed cells having a node at exactly
// the position x of node n of zone zi, in (Zone, Cell) order. A cell of zi
// using n itself has one without comparing positions.
func (l *Locator) cellsAtNode(zi int, n int32, dst []CellRef) []CellRef {
	x := l.f.Zones[zi].Point(n)
	first := len(dst)
	dst = l.CellsInBox(x, x, dst)
	keep := dst[:first]
	for _, r := range dst[first:] {
		z := l.f.Zones[r.Zone]
		if int(r.Zone) == zi && slices.Contains(z.CellNodes(int(r.Cell)), n) || z.hasNodeAt(int(r.Cell), x) {
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

// nodeCells returns the indexed cells having a node at the position of
// node n of zone zi (cellsAtNode), computed on first use and cached per
// node: neighbouring stencils share most nodes. The result must not be
// modified.
func (s *Sampler) nodeCells(zi int, n int32) []CellRef {
	slot := &s.cellsAt[zi][n]
	if p := slot.Load(); p != nil {
		return *p
	}
	r := slices.Clip(s.l.cellsAtNode(zi, n, nil))
	slot.Store(&r)
	return r
}

// expandRing returns refs together with every indexed cell that shares a
// node with one of them, sorted by (Zone, Cell) without duplicates. refs
// itself may hold cells that are not indexed (a blank cell); they are
// dropped. dst is reused for the result, *keys and *table as scratch space.
func (s *Sampler) expandRing(refs []CellRef, dst []CellRef, keys, table *[]uint64) []CellRef {
	ks := (*keys)[:0] // zone<<32 | cell: sorts as (Zone, Cell)
	for _, r := range refs {
		for _, n := range s.l.f.Zones[r.Zone].CellNodes(int(r.Cell)) {
			for _, c := range s.nodeCells(int(r.Zone), n) {
				ks = append(ks, uint64(c.Zone)<<32|uint64(uint32(c.Cell)))
			}
		}
	}
	ks = sortUnique(ks, table)
	*keys = ks
	dst = dst[:0]
	for _, k := range ks {
		dst = append(dst, CellRef{int32(k >> 32), int32(uint32(k))})
	}
	return dst
}

// sortUnique sorts s and removes repeated keys, in place, like slices.Sort
// followed by slices.Compact, and returns the result. Stencils list each
// key several times (a node for each of its cells, a cell for each of its
// nodes), so the repeats are dropped first, through an open-addressing
// hash set in *table (scratch space), and only the distinct keys sorted.
// Keys are zone<<32 | index with both non-negative int32.
func sortUnique(s []uint64, table *[]uint64) []uint64 {
	if len(s) < 16 {
		slices.Sort(s)
		return slices.Compact(s)
	}
	size := 32
	for size < 2*len(s) {
		size *= 2
	}
	if cap(*table) < size {
		*table = make([]uint64, size)
	}
	t := (*table)[:size] // slot holds key+1, 0 when free: no key is ^0
	clear(t)
	mask := uint64(size - 1)
	out := s[:0]
	for _, k := range s {
		h := (k * 0x9e3779b97f4a7c15) >> 32 & mask
		for t[h] != 0 && t[h] != k+1 {
			h = (h + 1) & mask
		}
		if t[h] == 0 {
			t[h] = k + 1
			out = append(out, k) // out never overtakes the loop: len(out) <= index
		}
	}
	if len(out) > 48 {
		slices.Sort(out)
		return out
	}
	for i := 1; i < len(out); i++ { // insertion sort: few keys
		k, j := out[i], i
		for ; j > 0 && out[j-1] > k; j-- {
			out[j] = out[j-1]
		}
		out[j] = k
	}
	return out
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

// stencilWork is scratch space for building one stencil operator, pooled
// so that only the operator itself is allocated.
type stencilWork struct {
	refs, next []CellRef
	keys, ring []uint64
	table      []uint64 // for sortUnique
	fit        fitWork
	pts        [][3]float64
	ids        []sampleRef
}

var stencilWorkPool = sync.Pool{New: func() any { return new(stencilWork) }}
