package field

import (
	"slices"
	"sync/atomic"
)

// Gradient recovery for point data. The gradient of the shape-function
// interpolant is only first-order accurate (and jumps across faces). The
// recovered gradient at node n is the gradient at n of the least-squares
// quadratic through the nodal values of the patch of n:
//
//	q_n = argmin Σ_{m ∈ P(n)} (q(x_m) - f_m)²,   G_n = ∇q_n(x_n)
//
// where P(n) holds the nodes of every indexed cell having a node at x_n
// (the cells around n, across zone interfaces too, blank cells never; see
// stencil.go), each position once. Where P(n) has fewer than 1.5 times as
// many nodes as coefficients or does not determine a quadratic well
// (boundary nodes, low-valence nodes) the next ring of cells joins, up to
// maxGrow times (see growOp). Inside a cell the recovered gradient is
// Σ_k N_k G_k: continuous, and second order on smooth fields because the
// fit reproduces quadratics (measured orders in doc.go).

// gradBlockSize is the number of consecutive nodes whose recovered
// gradients share one lazily allocated gradBlock. Small, because a surface
// cut through a volume mesh needs few nodes of each run of consecutive
// ones (about 4 of 16 for a sphere through a structured box), and a block
// costs 8(3·comps + 1/2) bytes per node whether used or not.
const gradBlockSize = 16

// gradBlock holds the recovered gradients of gradBlockSize consecutive
// nodes of one zone for one array of comps components: node k of the block
// has ∂f_c/∂x_j at g[k*3*comps+3*c+j]. state[k] is 0 while that gradient
// is not stored, 1 while one goroutine stores it, 2 once it is stored (and
// never written again), so readers that see 2 read it without a race.
type gradBlock struct {
	state [gradBlockSize]atomic.Uint32
	g     []float64
}

// nodeGradient returns the recovered gradient G_n of array p at node n of
// zone zi (3*comps values, ∂f_c/∂x_j at 3c+j), computed from the node's
// stencil operator on first use and cached. Until the cached copy is
// stored the gradient is computed into buf (len >= 3*comps) and buf is
// returned: every computation gives the same bits.
func (s *Sampler) nodeGradient(p *prepared, zi int, n int32, buf []float64) []float64 {
	w := 3 * p.comps
	slot := &p.grads[zi][n/gradBlockSize]
	blk := slot.Load()
	if blk == nil {
		blk = &gradBlock{g: make([]float64, gradBlockSize*w)}
		if !slot.CompareAndSwap(nil, blk) {
			blk = slot.Load()
		}
	}
	k := int(n % gradBlockSize)
	g := blk.g[k*w : (k+1)*w]
	st := &blk.state[k]
	if st.Load() == 2 {
		return g
	}
	buf = buf[:w]
	s.nodeOp(zi, n).centreGradient(p.data, p.comps, buf)
	if st.CompareAndSwap(0, 1) {
		copy(g, buf)
		st.Store(2)
	}
	return buf
}

// nodeOp returns the cached stencil operator of node n of zone zi, shared
// by all point arrays.
func (s *Sampler) nodeOp(zi int, n int32) *stencilOp {
	slot := &s.nodeOps[zi][n]
	if op := slot.Load(); op != nil {
		return op
	}
	op := s.buildNodeOp(zi, n)
	slot.Store(op)
	return op
}

func (s *Sampler) buildNodeOp(zi int, n int32) *stencilOp {
	l := s.l
	w := stencilWorkPool.Get().(*stencilWork)
	defer stencilWorkPool.Put(w)
	x := l.f.Zones[zi].Point(n)
	refs := l.cellsAtNode(zi, n, w.refs[:0])
	next := w.next[:0]
	defer func() { w.refs, w.next = refs, next }()
	collect := func() {
		w.keys = patchSamples(l.f, refs, w.keys[:0], &w.table)
		w.pts, w.ids = w.pts[:0], w.ids[:0]
		for _, q := range w.keys {
			zq, nq := int32(q>>32), int32(uint32(q))
			w.pts = append(w.pts, l.f.Zones[zq].Point(nq))
			w.ids = append(w.ids, sampleRef{zq, nq})
		}
	}
	collect()
	// Scale: the largest distance from x to the box of the cells around
	// it, which is the box of their nodes.
	lo, hi := x, x
	for _, p := range w.pts {
		for k := 0; k < 3; k++ {
			lo[k], hi[k] = min(lo[k], p[k]), max(hi[k], p[k])
		}
	}
	var e [3]float64
	for k := 0; k < 3; k++ {
		e[k] = max(x[k]-lo[k], hi[k]-x[k])
	}
	h := halfExtents(l.dim, [3]float64{-e[0], -e[1], -e[2]}, e)
	return growOp(l.dim, 1, l.dim+1, x, h, &w.fit, func(grow int) ([][3]float64, []sampleRef) {
		if grow > 0 {
			next = s.expandRing(refs, next, &w.ring, &w.table)
			refs, next = next, refs
			collect()
		}
		return w.pts, w.ids
	})
}

// patchSamples appends to dst the nodes of the cells refs as keys
// zone<<32 | node, each node once, in (zone, node) order. A position
// repeated in several zones (a zone interface) counts once, keeping its
// lowest (zone, node). *table is scratch space (sortUnique).
func patchSamples(f *Field, refs []CellRef, dst []uint64, table *[]uint64) []uint64 {
	first := len(dst)
	multiZone := false
	for _, r := range refs {
		z := f.Zones[r.Zone]
		multiZone = multiZone || r.Zone != refs[0].Zone
		for _, n := range z.CellNodes(int(r.Cell)) {
			dst = append(dst, uint64(r.Zone)<<32|uint64(uint32(n)))
		}
	}
	s := sortUnique(dst[first:], table)
	if multiZone {
		s = dedupePositions(f, s)
	}
	return dst[:first+len(s)]
}

// dedupePositions removes from the (zone, node) keys s those at a position
// already taken by an earlier key, keeping the order of the rest.
func dedupePositions(f *Field, s []uint64) []uint64 {
	pos := func(q uint64) [3]float64 { return f.Zones[int32(q>>32)].Point(int32(uint32(q))) }
	idx := make([]int, len(s))
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int { return comparePos(pos(s[a]), pos(s[b])) })
	drop := make([]bool, len(s))
	for i := 1; i < len(idx); i++ {
		if pos(s[idx[i]]) == pos(s[idx[i-1]]) {
			drop[idx[i]] = true // stable sort: idx[i-1] < idx[i]
		}
	}
	out := s[:0]
	for i := range s {
		if !drop[i] {
			out = append(out, s[i])
		}
	}
	return out
}
