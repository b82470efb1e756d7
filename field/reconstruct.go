package field

import "math"

// Cell-data reconstruction. A finite-volume solver stores one value per
// cell, close to the value at the cell centroid. For each cell c the
// reconstruction is the least-squares quadratic (package fit.go basis)
// through the centroid values of the cells around c:
//
//	q_c = argmin Σ_{j ∈ S(c)} (q(x_j) - f_j)²
//
// over the stencil S(c): c and every indexed cell whose bounding box touches
// c's (its vertex neighbours, across zone interfaces too, blank cells never).
// Where S(c) holds fewer than 1.5 times the number of coefficients, or does
// not determine a quadratic (at boundaries and corners: too few cells, or
// only two layers of centroids across the boundary), the search box grows
// by the cell's extent, up to maxGrow times. When even the largest stencil
// leaves the quadratic undetermined the fit falls back to a linear one, then
// to a constant. Value and gradient at a point of c are
// those of q_c: a quadratic is reproduced exactly, so on smooth data the
// value error is O(h³) and the gradient error O(h²) (measured orders in
// doc.go).

// wellPosed is the conditioning a stencil must reach (smallest over largest
// diagonal entry of the QR factor, coordinates scaled to the cell) before
// growFit stops growing it; nearly degenerate stencils (two slightly
// perturbed layers of points) amplify data errors by its inverse.
const wellPosed = 5e-2

// rankTol is the conditioning below which a fit counts as undetermined.
const rankTol = 1e-8

// maxGrow bounds how often a stencil search box is enlarged.
const maxGrow = 3

// minSamples is the stencil size at which a quadratic fit stops growing its
// search box: 1.5 times the number of quadratic terms, enough for a
// well-posed fit on one-sided stencils.
func minSamples(dim int) int { return numTerms(dim, 2) * 3 / 2 }

// cellFit returns the cached reconstruction of cell c of zone zi, building
// it on first use.
func (s *Sampler) cellFit(p *prepared, zi, c int) *polyFit {
	slot := &p.cache[zi][c]
	if f := slot.Load(); f != nil {
		return f
	}
	f := s.buildCellFit(p, zi, c)
	slot.Store(f)
	return f
}

func (s *Sampler) buildCellFit(p *prepared, zi, c int) *polyFit {
	l := s.l
	z := l.f.Zones[zi]
	x0 := z.Centroid(c)
	lo, hi := z.cellBounds(c)
	h := halfExtents(l.dim, lo, hi)
	var refs []CellRef
	var pts [][3]float64
	var vals []float64
	return growFit(l.dim, x0, h, p.comps, func(grow int) ([][3]float64, []float64) {
		var qlo, qhi [3]float64
		for k := 0; k < 3; k++ {
			qlo[k], qhi[k] = lo[k]-float64(grow)*2*h[k], hi[k]+float64(grow)*2*h[k]
		}
		refs = l.CellsInBox(qlo, qhi, refs[:0])
		pts, vals = pts[:0], vals[:0]
		for _, r := range refs {
			pts = append(pts, l.f.Zones[r.Zone].Centroid(int(r.Cell)))
			vals = append(vals, p.data[r.Zone][int(r.Cell)*p.comps:int(r.Cell+1)*p.comps]...)
		}
		return pts, vals
	})
}

// growFit fits a quadratic to the samples that gather returns for growing
// search boxes (grow = 0, 1, ..., maxGrow), stopping at the first stencil
// with at least minSamples samples that determines the quadratic. Growing
// also cures stencils that are large enough but degenerate, such as two
// layers of cells at a boundary (no curvature across them). If no stencil
// qualifies, the largest one gets the best fit of lower degree.
func growFit(dim int, x0, h [3]float64, comps int, gather func(grow int) ([][3]float64, []float64)) *polyFit {
	need := minSamples(dim)
	var pts [][3]float64
	var vals []float64
	for grow := 0; grow <= maxGrow; grow++ {
		pts, vals = gather(grow)
		if len(pts) < need {
			continue
		}
		if f, ok := fitStencil(dim, 2, x0, h, pts, vals, comps, wellPosed); ok {
			return &f
		}
	}
	return bestFit(dim, x0, h, pts, vals, comps)
}

// bestFit returns the highest-degree fit (2, 1, then 0) the samples
// determine. With no sample at all the fit is NaN.
func bestFit(dim int, x0, h [3]float64, pts [][3]float64, vals []float64, comps int) *polyFit {
	for deg := 2; deg >= 0; deg-- {
		if f, ok := fitStencil(dim, deg, x0, h, pts, vals, comps, rankTol); ok {
			return &f
		}
	}
	f := polyFit{dim: dim, terms: 1, comps: comps, x0: x0, h: h, coef: make([]float64, comps)}
	fillNaN(f.coef)
	return &f
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
