package field

import (
	"cmp"
	"slices"
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

// sample is one nodal value position used in a patch fit.
type sample struct {
	x          [3]float64
	zone, node int32
}

// nodeFit returns the cached patch fit around node n of zone zi for array
// p, building it on first use from the node's stencil operator.
func (s *Sampler) nodeFit(p *prepared, zi int, n int32) *polyFit {
	slot := &p.cache[zi][n]
	if f := slot.Load(); f != nil {
		return f
	}
	f := s.nodeOp(zi, n).apply(p.data, p.comps)
	slot.Store(f)
	return f
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
	x := l.f.Zones[zi].Point(n)
	refs := l.cellsAtNode(x, nil)
	lo, hi := x, x
	for _, r := range refs {
		clo, chi := l.f.Zones[r.Zone].cellBounds(int(r.Cell))
		for k := 0; k < 3; k++ {
			lo[k], hi[k] = min(lo[k], clo[k]), max(hi[k], chi[k])
		}
	}
	var e [3]float64
	for k := 0; k < 3; k++ {
		e[k] = max(x[k]-lo[k], hi[k]-x[k])
	}
	h := halfExtents(l.dim, [3]float64{-e[0], -e[1], -e[2]}, e)
	next := make([]CellRef, 0, 64)
	smp := make([]sample, 0, 64)
	pts := make([][3]float64, 0, 64)
	ids := make([]sampleRef, 0, 64)
	return growOp(l.dim, x, h, func(grow int) ([][3]float64, []sampleRef) {
		if grow > 0 {
			next = l.expandRing(refs, next)
			refs, next = next, refs
		}
		smp = patchSamples(l.f, refs, smp[:0])
		pts, ids = pts[:0], ids[:0]
		for _, q := range smp {
			pts = append(pts, q.x)
			ids = append(ids, sampleRef{q.zone, q.node})
		}
		return pts, ids
	})
}

// patchSamples appends the nodes of the cells refs to dst, each node once,
// in (zone, node) order. A position repeated in several zones (a zone
// interface) counts once, keeping its lowest (zone, node).
func patchSamples(f *Field, refs []CellRef, dst []sample) []sample {
	first := len(dst)
	multiZone := false
	for _, r := range refs {
		z := f.Zones[r.Zone]
		multiZone = multiZone || r.Zone != refs[0].Zone
		for _, n := range z.CellNodes(int(r.Cell)) {
			dst = append(dst, sample{zone: r.Zone, node: n})
		}
	}
	s := dst[first:]
	slices.SortFunc(s, func(a, b sample) int {
		if a.zone != b.zone {
			return cmp.Compare(a.zone, b.zone)
		}
		return cmp.Compare(a.node, b.node)
	})
	s = slices.CompactFunc(s, func(a, b sample) bool { return a.zone == b.zone && a.node == b.node })
	for i := range s {
		s[i].x = f.Zones[s[i].zone].Point(s[i].node)
	}
	if multiZone {
		s = dedupePositions(s)
	}
	return dst[:first+len(s)]
}

// dedupePositions removes samples at a position already taken by an
// earlier sample (in (zone, node) order), keeping the order of the rest.
func dedupePositions(s []sample) []sample {
	idx := make([]int, len(s))
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int {
		for k := 0; k < 3; k++ {
			if c := cmp.Compare(s[a].x[k], s[b].x[k]); c != 0 {
				return c
			}
		}
		return 0
	})
	drop := make([]bool, len(s))
	for i := 1; i < len(idx); i++ {
		if s[idx[i]].x == s[idx[i-1]].x {
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
