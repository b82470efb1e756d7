package field

import (
	"math"
	"slices"
)

// Cell-data reconstruction. A finite-volume solver stores one value per
// cell: its average, equal to the value at the volume centroid to second
// order (Zone.CellCentroid). For each cell c the reconstruction is the
// least-squares quadratic (basis in fit.go) through the values at the
// volume centroids x_j of the cells around c:
//
//	q_c = argmin Σ_{j ∈ S(c)} (q(x_j) - f_j)²
//
// over the stencil S(c): c and every indexed cell sharing a node with it
// (its vertex neighbours, across zone interfaces too, blank cells never;
// see stencil.go). Where S(c) holds fewer than 1.5 times the number of
// coefficients, or does not determine a quadratic well (at boundaries and
// corners: too few cells, or only two layers of centroids across the
// boundary), the next ring of vertex neighbours joins, up to maxGrow
// times. When even the largest stencil leaves the quadratic undetermined
// the fit falls back to a linear one, then to a constant. Value and
// gradient at a point of c are those of q_c: a quadratic is reproduced
// exactly, so on smooth data the value error is O(h³) and the gradient
// error O(h²) (measured orders in doc.go).

// wellPosed is the conditioning a stencil must reach (smallest over largest
// diagonal entry of the QR factor, columns equilibrated) before growOp
// stops growing it; nearly degenerate stencils (two slightly
// perturbed layers of points) amplify data errors by its inverse.
const wellPosed = 5e-2

// rankTol is the conditioning below which a fit counts as undetermined.
const rankTol = 1e-8

// maxGrow bounds how often a stencil grows by a ring of neighbours.
const maxGrow = 3

// minSamples is the stencil size from which a quadratic fit is tried: 1.5
// times the number of quadratic terms, enough for a well-posed fit on
// one-sided stencils.
func minSamples(dim int) int { return numTerms(dim, 2) * 3 / 2 }

// cellFit returns the cached reconstruction of cell c of zone zi for array
// p, building it on first use from the cell's stencil operator.
func (s *Sampler) cellFit(p *prepared, zi, c int) *polyFit {
	slot := &p.cache[zi][c]
	if f := slot.Load(); f != nil {
		return f
	}
	f := s.cellOp(zi, c).apply(p.data, p.comps)
	slot.Store(f)
	return f
}

// cellOp returns the cached stencil operator of cell c of zone zi, shared
// by all cell arrays.
func (s *Sampler) cellOp(zi, c int) *stencilOp {
	slot := &s.cellOps[zi][c]
	if op := slot.Load(); op != nil {
		return op
	}
	op := s.buildCellOp(zi, c)
	slot.Store(op)
	return op
}

func (s *Sampler) buildCellOp(zi, c int) *stencilOp {
	l := s.l
	w := stencilWorkPool.Get().(*stencilWork)
	defer stencilWorkPool.Put(w)
	z := l.f.Zones[zi]
	x0 := s.centroid(zi, c)
	lo, hi := z.cellBounds(c)
	h := halfExtents(l.dim, lo, hi)
	refs, next := append(w.refs[:0], CellRef{int32(zi), int32(c)}), w.next[:0]
	defer func() { w.refs, w.next = refs, next }()
	return growOp(l.dim, 0, numTerms(l.dim, 2), x0, h, &w.fit, func(int) ([][3]float64, []sampleRef) {
		next = s.expandRing(refs, next, &w.ring, &w.table)
		refs, next = next, refs
		w.pts, w.ids = w.pts[:0], w.ids[:0]
		for _, r := range refs {
			w.pts = append(w.pts, s.centroid(int(r.Zone), int(r.Cell)))
			w.ids = append(w.ids, sampleRef{r.Zone, r.Cell})
		}
		return w.pts, w.ids
	})
}

// centroid returns the cached volume centroid of cell c of zone zi.
func (s *Sampler) centroid(zi, c int) [3]float64 {
	slot := &s.centroids[zi][c]
	if x := slot.Load(); x != nil {
		return *x
	}
	x := s.l.f.Zones[zi].CellCentroid(c)
	slot.Store(&x)
	return x
}

// sampleRef names the value a stencil sample reads: cell or point idx of
// zone Zone.
type sampleRef struct{ zone, idx int32 }

// stencilOp is the linear map from the values at a stencil's samples to the
// coefficients of the least-squares polynomial through them:
// coef_t = Σ_i W[t][i] v_i, with W stored as the coefficients of a polyFit
// of m components (the fit of the identity data). Cell operators keep every
// term; node operators only the linear ones, all that the recovered
// gradient at the node needs (w.first = 1, w.terms = dim+1, see
// fitOperator), or only the constant one where the fit is constant.
// It depends only on the geometry, so every array of the same centering
// shares it.
type stencilOp struct {
	w   polyFit
	ids []sampleRef
}

// apply returns the fit of the array with per-zone data and comps
// components over the stencil. The operator must keep every term from the
// constant one on (first = 0, as cell operators do).
func (op *stencilOp) apply(data [][]float64, comps int) *polyFit {
	m := len(op.ids)
	f := polyFit{dim: op.w.dim, terms: op.w.terms, comps: comps, x0: op.w.x0, h: op.w.h, coef: make([]float64, op.w.terms*comps)}
	if m == 0 {
		fillNaN(f.coef)
		return &f
	}
	for t := 0; t < f.terms; t++ {
		row := op.w.coef[t*m : (t+1)*m]
		out := f.coef[t*comps : (t+1)*comps]
		for i, id := range op.ids {
			v := data[id.zone][int(id.idx)*comps : int(id.idx+1)*comps]
			for c := range out {
				out[c] += row[i] * v[c]
			}
		}
	}
	return &f
}

// centreGradient stores in dst[3*c+j] the gradient at the centre x0 of the
// fit of the array with per-zone data and comps components over the
// stencil, where only the linear terms contribute: ∂f_c/∂x_j =
// (Σ_i W[1+j][i] v_ic) / h_j for j < dim, and 0 otherwise or when the fit
// has no linear terms. The operator must keep the linear terms (first <= 1)
// if it has any.
func (op *stencilOp) centreGradient(data [][]float64, comps int, dst []float64) {
	for i := range dst[:3*comps] {
		dst[i] = 0
	}
	if op.w.terms < 2 {
		return
	}
	if comps > centreComps {
		op.centreGradientSlow(data, comps, dst)
		return
	}
	// One pass over the samples; each sum in sample order as below.
	m, dim := len(op.ids), op.w.dim
	var rows [3][]float64
	for j := 0; j < dim; j++ {
		t := 1 + j - op.w.first
		rows[j] = op.w.coef[t*m : (t+1)*m : (t+1)*m]
	}
	var sum [3 * centreComps]float64 // sum[3c+j]
	for i, id := range op.ids {
		v := data[id.zone][int(id.idx)*comps : int(id.idx+1)*comps]
		for j := 0; j < dim; j++ {
			w := rows[j][i]
			for c, vc := range v {
				sum[3*c+j] += w * vc
			}
		}
	}
	for c := 0; c < comps; c++ {
		for j := 0; j < dim; j++ {
			dst[3*c+j] = sum[3*c+j] / op.w.h[j]
		}
	}
}

// centreComps is the number of components up to which centreGradient
// forms all sums in one pass over the samples.
const centreComps = 9

// centreGradientSlow is centreGradient for arrays of more than
// centreComps components.
func (op *stencilOp) centreGradientSlow(data [][]float64, comps int, dst []float64) {
	m := len(op.ids)
	for j := 0; j < op.w.dim; j++ {
		t := 1 + j - op.w.first
		row := op.w.coef[t*m : (t+1)*m]
		for c := 0; c < comps; c++ {
			s := 0.0
			for i, id := range op.ids {
				s += row[i] * data[id.zone][int(id.idx)*comps+c]
			}
			dst[3*c+j] = s / op.w.h[j]
		}
	}
}

// growOp builds the operator of a quadratic fit over the samples that
// gather returns for growing stencils (grow = 0, 1, ..., maxGrow, called in
// that order), stopping at the first stencil with at least minSamples
// samples that determines the quadratic well (wellPosed). Growing also
// cures stencils that are large enough but degenerate, such as two layers
// of cells at a boundary (no curvature across them). If no stencil
// qualifies, the largest one gets the best fit of lower degree (2, 1, then
// 0 at rankTol); with no sample at all the fit is NaN. The operator keeps
// the coefficients of the basis terms first..rows-1 that the fit has (see
// fitOperator), and of the constant term when that is all it has. fw is
// scratch space for the fits.
func growOp(dim, first, rows int, x0, h [3]float64, fw *fitWork, gather func(grow int) ([][3]float64, []sampleRef)) *stencilOp {
	need := minSamples(dim)
	var pts [][3]float64
	var ids []sampleRef
	for grow := 0; grow <= maxGrow; grow++ {
		pts, ids = gather(grow)
		if len(pts) < need {
			continue
		}
		if w, ok := fitOperator(dim, 2, first, min(rows, numTerms(dim, 2)), x0, h, pts, wellPosed, fw); ok {
			return &stencilOp{w: w, ids: slices.Clone(ids)}
		}
	}
	for deg := 2; deg >= 0 && len(pts) > 0; deg-- {
		r := min(rows, numTerms(dim, deg))
		if w, ok := fitOperator(dim, deg, min(first, r-1), r, x0, h, pts, rankTol, fw); ok {
			return &stencilOp{w: w, ids: slices.Clone(ids)}
		}
	}
	return &stencilOp{w: polyFit{dim: dim, terms: 1, x0: x0, h: h}}
}

// cellBounds returns the bounding box of the nodes of cell c.
func (z *Zone) cellBounds(c int) (lo, hi [3]float64) {
	lo = [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}
	hi = [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	for _, n := range z.CellNodes(c) {
		x := z.Point(n)
		for k := 0; k < 3; k++ {
			lo[k], hi[k] = math.Min(lo[k], x[k]), math.Max(hi[k], x[k])
		}
	}
	return lo, hi
}

// halfExtents returns half the box extents per axis, for scaling fits; an
// axis of zero extent (or beyond dim) gets the largest half extent, or 1.
func halfExtents(dim int, lo, hi [3]float64) (h [3]float64) {
	big := 0.0
	for k := 0; k < dim; k++ {
		h[k] = (hi[k] - lo[k]) / 2
		big = math.Max(big, h[k])
	}
	if !(big > 0) {
		big = 1
	}
	for k := 0; k < 3; k++ {
		if k >= dim || !(h[k] > 1e-6*big) {
			h[k] = big
		}
	}
	return h
}
