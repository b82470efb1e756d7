package surface

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"

	"farforce/field"
)

// CutOptions tunes CutSurface.
type CutOptions struct {
	// Workers is the number of goroutines (0: GOMAXPROCS). The result does
	// not depend on it.
	Workers int
	// SizeFactor multiplies the local cell size to give the facet edge
	// length of shapes without facets=/size= (0: DefaultSizeFactor).
	SizeFactor float64
}

// DefaultSizeFactor is the facet edge of shapes without facets=/size=, in
// local cell sizes. Accuracy rests on the quadrature rule of each piece
// (every piece lies in one cell, where the integrand is smooth), not on the
// facet size: a coarser inscribed polyhedron is as valid a closed control
// surface. Facets of two cells give about half the pieces of one-cell
// facets (a piece per facet-cell overlap) for a sagitta still below a
// hundredth of a cell wherever the shape's radius exceeds 50 cells.
const DefaultSizeFactor = 2

// chunkFacets is the number of facets per unit of parallel work; fixed so
// that the split, and hence the result, is independent of the workers.
const chunkFacets = 256

// dropArea is the relative area (to the facet's) below which a clipped
// piece is discarded as a rounding sliver (a facet grazing a cell edge).
const dropArea = 1e-14

// CutSurface tessellates s and cuts it through the cells indexed by l:
// every facet is clipped against each cell its bounding box overlaps (see
// the package documentation), giving pieces inside one cell each, with
// their quadrature points located in that cell (a point within rounding of
// the face of a warped cell may be located in the neighbour that holds
// it). Pieces are ordered by facet, then by cell (Zone, Cell), then by
// simplex; points follow their piece.
//
// The size of curved shapes follows opt.SizeFactor × l.CellSize unless the
// shape fixes it. A 2D field gets a 2D shape in the plane of its points.
//
// Errors: a shape of the wrong dimension, a tessellation error, and a
// *CoverageError when the pieces of any facet do not add up to the facet
// area within CoverageTol (surface outside the mesh, crossing a body or
// blank cells, or overlapping zones).
//
// Concurrency: uses opt.Workers goroutines; l must not change meanwhile.
// The result is bit-for-bit independent of the number of workers.
func CutSurface(l *field.Locator, s Shape, opt CutOptions) (*Cut, error) {
	dim := l.Dim()
	spec := s.String()
	if fs, ok := s.(FileSurface); ok && !fs.Loaded() {
		return nil, fmt.Errorf("surface %q: %w", spec, ErrNotLoaded)
	}
	if s.Dim() != dim {
		return nil, fmt.Errorf("surface %q is %dD but the field is %dD", spec, s.Dim(), dim)
	}
	var z0 float64
	for _, z := range l.Field().Zones {
		if len(z.Points) > 0 {
			z0 = z.Points[2]
			break
		}
	}
	k := opt.SizeFactor
	if k == 0 {
		k = DefaultSizeFactor
	}
	if !(k > 0) || math.IsInf(k, 0) {
		return nil, fmt.Errorf("surface %q: size factor %g must be positive", spec, k)
	}
	f, err := s.Tessellate(func(p [3]float64) float64 { return k * l.CellSize(p) }, z0)
	if err != nil {
		return nil, err
	}
	area, closure := f.Measure()
	nf := f.Len()
	cut := &Cut{Spec: spec, Dim: dim, Facets: nf, Area: area, ExactArea: s.ExactArea(), Closure: closure}

	nChunks := (nf + chunkFacets - 1) / chunkFacets
	chunks := make([]chunkResult, nChunks)
	cov := make([]facetCover, nf)
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = max(1, min(workers, nChunks))

	// Pass 1: clip the facets into pieces, chunk by chunk; a piece's First
	// is relative to its chunk's points.
	eachChunk(nChunks, workers, func() func(int) {
		c := newCutter(l, f, spec)
		var w chunkResult // grows to the largest chunk, then is reused
		return func(ci int) {
			for i := ci * chunkFacets; i < min(nf, (ci+1)*chunkFacets); i++ {
				c.facet(i, &w, &cov[i], false)
			}
			chunks[ci] = w.compact()
		}
	})

	// Pass 2: with the chunks' offsets known, place the quadrature points
	// of every piece directly into the cut's arrays.
	offP, offQ := make([]int, nChunks+1), make([]int, nChunks+1)
	for i := range chunks {
		offP[i+1] = offP[i] + len(chunks[i].pieces)
		offQ[i+1] = offQ[i] + chunks[i].points
	}
	cut.Pieces = make([]Piece, offP[nChunks])
	cut.Points = make([]QuadPoint, offQ[nChunks])
	eachChunk(nChunks, workers, func() func(int) {
		p := placer{l: l, spec: spec, dim: dim}
		return func(ci int) {
			r := &chunks[ci]
			// Every chunk runs to its first error, so the error reported
			// (the first in facet order) is deterministic.
			r.err = p.chunk(r, cut.Pieces[offP[ci]:offP[ci+1]], cut.Points[offQ[ci]:offQ[ci+1]], offQ[ci])
			r.pieces, r.facet = nil, nil
		}
	})
	for i := range chunks {
		if chunks[i].err != nil {
			return nil, chunks[i].err
		}
	}
	var mc *cutter
	moments := func(i int, fc *facetCover) {
		if mc == nil {
			mc = newCutter(l, f, spec)
		}
		mc.facet(i, &chunkResult{}, fc, true)
	}
	if err := checkCover(spec, dim, area, cov, moments); err != nil {
		return nil, err
	}
	return cut, nil
}

// eachChunk runs the chunks 0..n-1 on workers goroutines; newWorker is
// called once per goroutine and returns its chunk function (with its own
// scratch state). Chunks are handed out by a field.ChunkQueue, so that
// consecutive chunks, which cross the same cells, mostly run on the same
// goroutine (and hit its cell caches).
func eachChunk(n, workers int, newWorker func() func(ci int)) {
	q := field.NewChunkQueue(n, workers)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			do := newWorker()
			for ci := q.Take(w); ci >= 0; ci = q.Take(w) {
				do(ci)
			}
		}()
	}
	wg.Wait()
}

// chunkResult is the output of one chunk of facets: its pieces (First
// relative to the chunk's points), the facet of each piece, the number
// of quadrature points of its pieces, the pieces' vertices, and the first
// error of pass 2. While a chunk is cut, the pieces' Verts are unset and
// piece k's vertices are verts[vend[k-1]:vend[k]].
type chunkResult struct {
	pieces []Piece
	facet  []int32
	points int
	verts  [][3]float64
	vend   []int
	err    error
}

// compact returns a copy of r in storage of exactly its size, with the
// pieces' Verts set, and empties r for the next chunk.
func (r *chunkResult) compact() chunkResult {
	out := chunkResult{
		pieces: make([]Piece, len(r.pieces)),
		facet:  slices.Clone(r.facet),
		points: r.points,
		verts:  slices.Clone(r.verts),
	}
	start := 0
	for k, p := range r.pieces {
		end := r.vend[k]
		p.Verts = out.verts[start:end:end]
		out.pieces[k] = p
		start = end
	}
	r.pieces, r.facet, r.points, r.verts, r.vend = r.pieces[:0], r.facet[:0], 0, r.verts[:0], r.vend[:0]
	return out
}

// facetCover is the coverage account of one facet: its area, the area of
// its pieces, and the first moments (area × centroid) of both, which pass 1
// leaves out.
type facetCover struct {
	area, covered float64
	moment, mCov  [3]float64
}

// checkCover sums the coverage accounts in facet order and returns a
// *CoverageError when a facet's pieces miss or exceed its area by more
// than CoverageTol relative; moments(i, c) completes the account c of such
// a facet i with its first moments.
func checkCover(spec string, dim int, total float64, cov []facetCover, moments func(i int, c *facetCover)) error {
	var unc, over field.CompensatedSum
	nUnc, nOver := 0, 0
	var worstUnc, worstOver float64
	var nearUnc, nearOver [3]float64
	for i := range cov {
		c := &cov[i]
		d := c.area - c.covered
		if math.Abs(d) <= CoverageTol*c.area {
			continue
		}
		// The missing (or extra) part's centroid from the first moments.
		moments(i, c)
		var at [3]float64
		for k := 0; k < 3; k++ {
			at[k] = (c.moment[k] - c.mCov[k]) / d
		}
		if d > 0 {
			unc.Add(d)
			nUnc++
			if d > worstUnc {
				worstUnc, nearUnc = d, at
			}
		} else {
			over.Add(-d)
			nOver++
			if -d > worstOver {
				worstOver, nearOver = -d, at
			}
		}
	}
	switch {
	case nUnc > 0:
		u := unc.Value()
		return &CoverageError{Spec: spec, Dim: dim, Uncovered: u, Overlap: over.Value(), Fraction: u / total, Near: nearUnc, Facets: nUnc}
	case nOver > 0:
		o := over.Value()
		return &CoverageError{Spec: spec, Dim: dim, Overlap: o, Fraction: o / total, Near: nearOver, Facets: nOver}
	}
	return nil
}

// errNoCell marks a quadrature point that no cell holds.
var errNoCell = errors.New("quadrature point in no cell")
