package field

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"sync"
	"unsafe"
)

// Locator is a spatial index over the cells of a field: every non-blank
// cell whose dimension equals the field's (triangles and quads in 2D;
// tetrahedra, hexahedra, wedges and pyramids in 3D) from every zone.
//
// Cells are numbered globally, zone after zone (cell c of zone z is
// base[z] + c), so that number order is (Zone, Cell) order. The index is a
// uniform grid of bins over the padded bounding boxes of the cells (about
// binsPerCell bins per cell, fewer when the boxes are much larger than the
// cells, see binPerBoxVolume), stored as compressed rows filled by counting
// sort, so each bin lists its cells in increasing number order. Each entry
// of a bin holds the cell number and the cell's box clipped to the bin and
// quantized to 1/512 of the bin width, rounded outward (12 bytes; see
// binEntry). A query visits the one bin holding the point and filters its
// entries by their quantized boxes without leaving the bin's contiguous
// memory; the survivors are gathered together (for zones of one cell type
// straight from the connectivity, without the offsets), then tested in bin
// order by a quick tetrahedron test, the inverse of the cell's
// shape-function map and the exact padded box. The exact padded boxes are
// also kept per cell (6 float64) for CellsInBox and CellSize.
//
// A Locator is read-only after NewLocator returns; all its methods are safe
// for concurrent use. It keeps a reference to the field, whose points and
// cells must not change afterwards.
type Locator struct {
	f   *Field
	dim int

	base   []int32   // zone z's cells are numbers base[z] to base[z+1]-1
	stride []int32   // zone z's cell c has nodes Conn[s*c:s*c+s], s = stride[z] > 0 (0: read Offsets)
	box    []float64 // 6 per numbered cell: lo x,y,z then hi x,y,z (padded); lo x = +Inf when not indexed

	lo, inv [3]float64 // grid origin and inverse bin width per axis
	n       [3]int     // bins per axis
	start   []int32    // bin b holds items[start[b]:start[b+1]]
	items   []binEntry // indexed cells with their quantized boxes
}

// binsPerCell is the number of grid bins per indexed cell. A little below one
// keeps bins slightly larger than cells, so that a cell's padded box
// overlaps about 2 bins per axis even on a grid aligned with the mesh.
const binsPerCell = 0.7

// binPerBoxVolume is the smallest bin volume relative to the mean volume of
// the cell boxes. It matters for meshes whose boxes overlap much, such as
// tetrahedra (a box holds several tetrahedra's worth of volume): bins sized
// by the cell count alone would be far smaller than the boxes, and every
// cell would be listed in dozens of bins. Hexahedral meshes have bins of
// about their box volume already and are not affected.
const binPerBoxVolume = 0.8

// boxPad is the padding of each cell's bounding box relative to the box's
// largest extent; it exceeds localTol so that every cell that contains a
// point within tolerance is a candidate of the point's bin.
const boxPad = 1e-8

// ErrNoCells is returned by NewLocator when the field has no cell to index.
var ErrNoCells = errors.New("field: no non-blank cells of the field's dimension")

// NewLocator builds the spatial index of f. Cells of the wrong dimension
// (faces or edges stored beside volume cells), polygons and blank cells are
// left out. It returns ErrNoCells when nothing remains, and an error naming
// zone, cell and point when a cell has a non-finite coordinate.
//
// Cost: linear in the number of cells, spread over GOMAXPROCS goroutines
// (the index is the same for any number), about 0.2 µs of CPU per cell;
// memory about 145 bytes per hexahedron and 155 per tetrahedron (48 for
// the box, 12 per bin entry, about 8 entries per hexahedron and 9 per
// tetrahedron), plus 4 bytes per bin and worker for the counts while it
// builds.
func NewLocator(f *Field) (*Locator, error) {
	return newLocator(f, runtime.GOMAXPROCS(0))
}

// buildChunk is the number of cells below which the build stays serial.
const buildChunk = 1 << 15

func newLocator(f *Field, workers int) (*Locator, error) {
	l := &Locator{f: f, dim: f.Dim()}
	l.base = make([]int32, len(f.Zones)+1)
	l.stride = make([]int32, len(f.Zones))
	total := 0
	for zi, z := range f.Zones {
		l.stride[zi] = uniformStride(z)
		total += len(z.Types)
		if total > math.MaxInt32 {
			return nil, fmt.Errorf("field: %d cells is more than the locator can index", total)
		}
		l.base[zi+1] = int32(total)
	}
	l.box = make([]float64, 6*total)
	workers = max(1, min(workers, total/buildChunk, 16))
	errs := make([]error, workers)
	stats := make([]boxStats, workers)
	parallel(total, workers, func(w, lo, hi int) {
		stats[w], errs[w] = l.boxChunk(lo, hi)
	})
	for w, err := range errs { // the first chunk's error: the lowest cell
		if err != nil {
			return nil, err
		}
		if w > 0 {
			stats[0].add(&stats[w])
		}
	}
	if stats[0].indexed == 0 {
		return nil, ErrNoCells
	}
	if err := l.buildGrid(workers, &stats[0]); err != nil {
		return nil, err
	}
	return l, nil
}

// uniformStride returns s when every cell of z has s nodes stored in
// order (Offsets[c] = s·c for every c), else 0.
func uniformStride(z *Zone) int32 {
	if len(z.Offsets) < 2 || z.Offsets[0] != 0 {
		return 0
	}
	s := z.Offsets[1]
	if s <= 0 || s > maxCellNodes {
		return 0
	}
	for c, o := range z.Offsets {
		if int64(o) != int64(s)*int64(c) {
			return 0
		}
	}
	return s
}

// gather fills g with cell c of zone zi, an indexed cell, reading the
// zone's offsets only when its cells are not of uniform size.
func (l *Locator) gather(zi, c int, g *cellGeom) {
	z := l.f.Zones[zi]
	if s := int(l.stride[zi]); s > 0 {
		z.gatherNodes(z.Types[c], z.Conn[s*c:s*c+s], g)
		return
	}
	z.gather(c, g)
}

// ref returns the zone and cell of global cell number g.
func (l *Locator) ref(g int32) (zone, cell int) {
	lo, hi := 0, len(l.base)-2 // the zone is the last z with base[z] <= g
	for lo < hi {
		m := int(uint(lo+hi+1) >> 1)
		if l.base[m] <= g {
			lo = m
		} else {
			hi = m - 1
		}
	}
	return lo, int(g - l.base[lo])
}

// parallel splits [0,n) into workers contiguous chunks, in order, and runs
// fn on each in its own goroutine (inline when workers is 1).
func parallel(n, workers int, fn func(w, lo, hi int)) {
	if workers <= 1 {
		fn(0, 0, n)
		return
	}
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			fn(w, w*n/workers, (w+1)*n/workers)
		}()
	}
	wg.Wait()
}

// indexable reports whether cell c of z belongs in the index.
func (l *Locator) indexable(z *Zone, c int) bool {
	t := z.Types[c]
	return supported(t) && t.Dim() == l.dim && (z.Blank == nil || !z.Blank[c])
}

// binCoord returns the continuous bin coordinate of x along axis k (bin i
// spans [i, i+1)), the quantity binIndex truncates.
func (l *Locator) binCoord(k int, x float64) float64 {
	return (x - l.lo[k]) * l.inv[k]
}

// sizeGrid chooses bins of equal width s on every axis such that the box
// [lo,hi] holds about binsPerCell*ncell of them, but each at least
// binPerBoxVolume times the mean volume of a cell box (meanBox), and returns
// the bin count.
func (l *Locator) sizeGrid(lo, hi [3]float64, ncell int, meanBox float64) int {
	vol := 1.0
	maxExt := 0.0
	for k := 0; k < l.dim; k++ {
		maxExt = math.Max(maxExt, hi[k]-lo[k])
	}
	for k := 0; k < l.dim; k++ {
		vol *= math.Max(hi[k]-lo[k], 1e-6*maxExt)
	}
	s := math.Pow(max(vol/(binsPerCell*float64(ncell)), binPerBoxVolume*meanBox), 1/float64(l.dim))
	nb := 1
	for k := 0; k < 3; k++ {
		l.n[k], l.lo[k], l.inv[k] = 1, 0, 0
		if k >= l.dim {
			continue
		}
		ext := hi[k] - lo[k]
		n := 1
		if s > 0 && ext > 0 {
			n = max(1, int(math.Min(math.Ceil(ext/s), 1<<20))) // s = +Inf when the volume overflows
		}
		l.n[k], l.lo[k] = n, lo[k]
		if ext > 0 {
			l.inv[k] = float64(n) / ext
		}
		nb *= n
	}
	return nb
}

// binIndex returns the bin coordinate of x along axis k, clamped to the grid.
func (l *Locator) binIndex(k int, x float64) int {
	return l.clampBin(k, l.binCoord(k, x))
}

// clampBin returns the bin of continuous bin coordinate f along axis k:
// its integer part clamped to the grid.
func (l *Locator) clampBin(k int, f float64) int {
	if !(f > 0) { // also NaN and -Inf
		return 0
	}
	if f >= float64(l.n[k]) {
		return l.n[k] - 1
	}
	return int(f)
}

// binRange returns the inclusive bin coordinate range overlapped by the box
// [lo,hi].
func (l *Locator) binRange(lo, hi []float64) (i0, i1 [3]int) {
	for k := 0; k < l.dim; k++ {
		i0[k], i1[k] = l.binIndex(k, lo[k]), l.binIndex(k, hi[k])
	}
	return i0, i1
}

// indexBytes returns the memory held by the index itself (boxes, zone
// bases, bin offsets and entries), not counting the field.
func (l *Locator) indexBytes() int {
	return 8*len(l.box) + 4*len(l.base) + 4*len(l.stride) + 4*len(l.start) + int(unsafe.Sizeof(binEntry{}))*len(l.items)
}
