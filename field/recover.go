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
// where P(n) holds the nodes of every indexed cell whose bounding box
// contains x_n (the cells around n, across zone interfaces too, blank cells
// never), each position once. Where P(n) has fewer than 1.5 times as many
// nodes as coefficients or does not determine a quadratic (boundary nodes,
// low-valence nodes) the search box grows by the patch's half extent, up to
// maxGrow times (see growFit). Inside a cell the
// recovered gradient is Σ_k N_k G_k: continuous, and second order on smooth
// fields because the fit reproduces quadratics (measured orders in doc.go).

// sample is one nodal value position used in a patch fit.
type sample struct {
	x          [3]float64
	zone, node int32
}

// nodeFit returns the cached patch fit around node n of zone zi, building it
// on first use.
func (s *Sampler) nodeFit(p *prepared, zi int, n int32) *polyFit {
	slot := &p.cache[zi][n]
	if f := slot.Load(); f != nil {
		return f
	}
	f := s.buildNodeFit(p, zi, n)
	slot.Store(f)
	return f
}

func (s *Sampler) buildNodeFit(p *prepared, zi int, n int32) *polyFit {
	l := s.l
	x := l.f.Zones[zi].Point(n)
	refs := l.CellsInBox(x, x, nil)
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
	var smp []sample
	var pts [][3]float64
	var vals []float64
	return growFit(l.dim, x, h, p.comps, func(grow int) ([][3]float64, []float64) {
		if grow > 0 {
			var qlo, qhi [3]float64
			for k := 0; k < 3; k++ {
				qlo[k], qhi[k] = x[k]-float64(grow)*h[k], x[k]+float64(grow)*h[k]
			}
			refs = l.CellsInBox(qlo, qhi, refs[:0])
		}
		smp = patchSamples(l.f, refs, smp[:0])
		pts, vals = pts[:0], vals[:0]
		for _, q := range smp {
			pts = append(pts, q.x)
			vals = append(vals, p.data[q.zone][int(q.node)*p.comps:int(q.node+1)*p.comps]...)
		}
		return pts, vals
	})
}

// patchSamples appends the nodes of the cells refs to dst, each position
// once (points repeated across zone interfaces count once; the lowest
// (zone, node) is kept), in a deterministic order.
func patchSamples(f *Field, refs []CellRef, dst []sample) []sample {
	for _, r := range refs {
		z := f.Zones[r.Zone]
		for _, n := range z.CellNodes(int(r.Cell)) {
			dst = append(dst, sample{x: z.Point(n), zone: r.Zone, node: n})
		}
	}
	slices.SortFunc(dst, func(a, b sample) int {
		for k := 0; k < 3; k++ {
			if c := cmp.Compare(a.x[k], b.x[k]); c != 0 {
				return c
			}
		}
		if c := cmp.Compare(a.zone, b.zone); c != 0 {
			return c
		}
		return cmp.Compare(a.node, b.node)
	})
	return slices.CompactFunc(dst, func(a, b sample) bool { return a.x == b.x })
}
