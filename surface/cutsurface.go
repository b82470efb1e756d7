package surface

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"farforce/field"
)

// CutOptions tunes CutSurface.
type CutOptions struct {
	// Workers is the number of goroutines (0: GOMAXPROCS). The result does
	// not depend on it.
	Workers int
	// SizeFactor multiplies the local cell size to give the facet edge
	// length of shapes without facets=/size= (0: 1).
	SizeFactor float64
}

// chunkFacets is the number of facets per unit of parallel work; fixed so
// that the split, and hence the result, is independent of the workers.
const chunkFacets = 64

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
		k = 1
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
	var next atomic.Int64
	var sizes outputSizes
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			c := newCutter(l, f, spec)
			for {
				ci := int(next.Add(1) - 1)
				if ci >= nChunks {
					return
				}
				r := &chunks[ci]
				np, nq := sizes.guess()
				r.pieces = make([]Piece, 0, np)
				r.points = make([]QuadPoint, 0, nq)
				for i := ci * chunkFacets; i < min(nf, (ci+1)*chunkFacets); i++ {
					// Every chunk runs to its first error, so the error
					// reported (the first in facet order) is deterministic.
					if r.err = c.facet(i, r, &cov[i]); r.err != nil {
						break
					}
				}
				sizes.record(len(r.pieces), len(r.points))
			}
		}()
	}
	wg.Wait()
	np, nq := 0, 0
	for i := range chunks {
		if chunks[i].err != nil {
			return nil, chunks[i].err
		}
		np += len(chunks[i].pieces)
		nq += len(chunks[i].points)
	}
	if err := checkCover(spec, dim, area, cov); err != nil {
		return nil, err
	}
	cut.Pieces = make([]Piece, np)
	cut.Points = make([]QuadPoint, nq)
	concat(cut, chunks, workers)
	return cut, nil
}

// concat copies the chunks' pieces and points, in chunk order, into the
// preallocated cut.Pieces and cut.Points, shifting each piece's First by
// its chunk's offset. The copy, a few hundred megabytes for a large cut,
// is split by chunk over the workers.
func concat(cut *Cut, chunks []chunkResult, workers int) {
	offP, offQ := make([]int, len(chunks)+1), make([]int, len(chunks)+1)
	for i := range chunks {
		offP[i+1] = offP[i] + len(chunks[i].pieces)
		offQ[i+1] = offQ[i] + len(chunks[i].points)
	}
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := w; i < len(chunks); i += workers {
				off := int32(offQ[i])
				dst := cut.Pieces[offP[i]:offP[i+1]]
				for k, p := range chunks[i].pieces {
					p.First += off
					dst[k] = p
				}
				copy(cut.Points[offQ[i]:offQ[i+1]], chunks[i].points)
				chunks[i] = chunkResult{}
			}
		}()
	}
	wg.Wait()
}

// outputSizes tracks the largest piece and point counts of the chunks
// done so far, to size the buffers of the next ones (which then rarely
// grow). Capacities do not affect the result.
type outputSizes struct{ pieces, points atomic.Int64 }

// guess returns capacities for a chunk's pieces and points.
func (s *outputSizes) guess() (pieces, points int) {
	p, q := int(s.pieces.Load()), int(s.points.Load())
	return max(4*chunkFacets, p+p/8), max(40*chunkFacets, q+q/8)
}

// record notes the counts of a finished chunk.
func (s *outputSizes) record(pieces, points int) {
	for old := s.pieces.Load(); int64(pieces) > old && !s.pieces.CompareAndSwap(old, int64(pieces)); old = s.pieces.Load() {
	}
	for old := s.points.Load(); int64(points) > old && !s.points.CompareAndSwap(old, int64(points)); old = s.points.Load() {
	}
}

// chunkResult is the output of one chunk of facets; First of each piece
// is relative to the chunk's points.
type chunkResult struct {
	pieces []Piece
	points []QuadPoint
	verts  [][3]float64 // backing store of the pieces' vertices
	err    error
}

// keep returns a copy of poly carved from the chunk's vertex store, so that
// pieces do not allocate one by one. Earlier copies stay valid when the
// store grows (a new block is started).
func (r *chunkResult) keep(poly [][3]float64) [][3]float64 {
	if len(r.verts)+len(poly) > cap(r.verts) {
		r.verts = make([][3]float64, 0, max(4096, len(poly)))
	}
	n := len(r.verts)
	r.verts = append(r.verts, poly...)
	return r.verts[n : n+len(poly) : n+len(poly)]
}

// facetCover is the coverage account of one facet: its area, the area of
// its pieces, and the first moments (area × centroid) of both.
type facetCover struct {
	area, covered float64
	moment, mCov  [3]float64
}

// checkCover sums the coverage accounts in facet order and returns a
// *CoverageError when a facet's pieces miss or exceed its area by more
// than CoverageTol relative.
func checkCover(spec string, dim int, total float64, cov []facetCover) error {
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
