package field

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"sync"
)

// Locator is a spatial index over the cells of a field: every non-blank
// cell whose dimension equals the field's (triangles and quads in 2D;
// tetrahedra, hexahedra, wedges and pyramids in 3D) from every zone.
//
// The index is a uniform grid of bins over the bounding boxes of the cells,
// stored as compressed rows of int32 cell numbers (counting sort, so each
// bin lists its cells in increasing (Zone, Cell) order). A query visits the
// one bin holding the point and tests its cells by bounding box and then by
// the inverse of the cell's shape-function map.
//
// A Locator is read-only after NewLocator returns; all its methods are safe
// for concurrent use. It keeps a reference to the field, whose points and
// cells must not change afterwards.
type Locator struct {
	f   *Field
	dim int

	zoneOf, cellOf []int32   // indexed cell -> zone, cell
	box            []float64 // 6 per indexed cell: lo x,y,z then hi x,y,z (padded)

	lo, inv [3]float64 // grid origin and inverse bin width per axis
	n       [3]int     // bins per axis
	start   []int32    // bin b holds items[start[b]:start[b+1]]
	items   []int32    // indexed cell numbers
}

// binsPerCell is the number of grid bins per indexed cell. A little below one
// keeps bins slightly larger than cells, so that a cell's padded box
// overlaps about 2 bins per axis even on a grid aligned with the mesh.
const binsPerCell = 0.7

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
// (the index is the same for any number); memory about 90 bytes per cell.
func NewLocator(f *Field) (*Locator, error) {
	return newLocator(f, runtime.GOMAXPROCS(0))
}

// buildChunk is the number of cells below which the build stays serial.
const buildChunk = 1 << 15

func newLocator(f *Field, workers int) (*Locator, error) {
	l := &Locator{f: f, dim: f.Dim()}
	total := 0
	for _, z := range f.Zones {
		for c := range z.Types {
			if l.indexable(z, c) {
				total++
			}
		}
	}
	if total == 0 {
		return nil, ErrNoCells
	}
	if total > math.MaxInt32 {
		return nil, fmt.Errorf("field: %d cells is more than the locator can index", total)
	}
	l.zoneOf = make([]int32, total)
	l.cellOf = make([]int32, total)
	l.box = make([]float64, 6*total)
	g := 0
	for zi, z := range f.Zones {
		for c := range z.Types {
			if l.indexable(z, c) {
				l.zoneOf[g], l.cellOf[g] = int32(zi), int32(c)
				g++
			}
		}
	}
	workers = max(1, min(workers, total/buildChunk, 16))
	errs := make([]error, workers)
	parallel(total, workers, func(w, lo, hi int) {
		for g := lo; g < hi; g++ {
			zi, c := l.zoneOf[g], int(l.cellOf[g])
			z := f.Zones[zi]
			if err := l.cellBox(z, c, l.box[6*g:6*g+6]); err != nil {
				errs[w] = fmt.Errorf("field: zone %d (%q): cell %d: %w", zi, z.Name, c, err)
				return
			}
		}
	})
	for _, err := range errs { // the first chunk's error: the lowest cell
		if err != nil {
			return nil, err
		}
	}
	if err := l.buildGrid(workers); err != nil {
		return nil, err
	}
	return l, nil
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

// cellBox stores the padded bounding box of cell c of z in b. In 2D the z
// range is unbounded.
func (l *Locator) cellBox(z *Zone, c int, b []float64) error {
	lo := [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}
	hi := [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	for _, p := range z.CellNodes(c) {
		for k := 0; k < 3; k++ {
			v := z.Points[3*int(p)+k]
			if v-v != 0 { // NaN or ±Inf
				return fmt.Errorf("point %d: coordinate %d is %v", p, k, v)
			}
			if v < lo[k] {
				lo[k] = v
			}
			if v > hi[k] {
				hi[k] = v
			}
		}
	}
	h := 0.0
	for k := 0; k < l.dim; k++ {
		h = math.Max(h, hi[k]-lo[k])
	}
	pad := boxPad*h + 1e-300
	for k := 0; k < 3; k++ {
		b[k], b[3+k] = lo[k]-pad, hi[k]+pad
	}
	if l.dim == 2 {
		b[2], b[5] = math.Inf(-1), math.Inf(1)
	}
	return nil
}

// buildGrid sizes the bin grid over the cell boxes and fills it by counting
// sort. Each worker counts and then places the cells of one contiguous
// chunk; chunk w's entries of a bin follow those of chunks < w, so every bin
// lists its cells in increasing order whatever the number of workers.
func (l *Locator) buildGrid(workers int) error {
	ncell := len(l.zoneOf)
	var lo, hi [3]float64
	for k := 0; k < 3; k++ {
		lo[k], hi[k] = math.Inf(1), math.Inf(-1)
	}
	for g := 0; g < ncell; g++ {
		b := l.box[6*g : 6*g+6 : 6*g+6]
		for k := 0; k < l.dim; k++ {
			if b[k] < lo[k] {
				lo[k] = b[k]
			}
			if b[3+k] > hi[k] {
				hi[k] = b[3+k]
			}
		}
	}
	nb := l.sizeGrid(lo, hi, ncell)
	counts := make([][]int32, workers)
	totals := make([]int, workers)
	parallel(ncell, workers, func(w, a, b int) {
		cnt := make([]int32, nb)
		total := 0
		for g := a; g < b; g++ {
			i0, i1 := l.binRange(l.box[6*g:6*g+3], l.box[6*g+3:6*g+6])
			total += (i1[0] - i0[0] + 1) * (i1[1] - i0[1] + 1) * (i1[2] - i0[2] + 1)
			if total > math.MaxInt32 {
				break
			}
			l.eachBin(i0, i1, func(b int) { cnt[b]++ })
		}
		counts[w], totals[w] = cnt, total
	})
	total := 0
	for _, t := range totals {
		total += t
	}
	if total > math.MaxInt32 {
		return fmt.Errorf("field: locator grid too large (%d entries)", total)
	}
	// Turn counts into each worker's first slot per bin.
	l.start = make([]int32, nb+1)
	next := int32(0)
	for b := 0; b < nb; b++ {
		l.start[b] = next
		for w := 0; w < workers; w++ {
			c := counts[w][b]
			counts[w][b] = next
			next += c
		}
	}
	l.start[nb] = next
	l.items = make([]int32, total)
	parallel(ncell, workers, func(w, a, b int) {
		cur := counts[w]
		for g := a; g < b; g++ {
			i0, i1 := l.binRange(l.box[6*g:6*g+3], l.box[6*g+3:6*g+6])
			l.eachBin(i0, i1, func(b int) { l.items[cur[b]] = int32(g); cur[b]++ })
		}
	})
	return nil
}

// binCoord returns the continuous bin coordinate of x along axis k (bin i
// spans [i, i+1)), the quantity binIndex truncates.
func (l *Locator) binCoord(k int, x float64) float64 {
	return (x - l.lo[k]) * l.inv[k]
}

// sizeGrid chooses bins of equal width s on every axis such that the box
// [lo,hi] holds about binsPerCell*ncell of them, and returns the bin count.
func (l *Locator) sizeGrid(lo, hi [3]float64, ncell int) int {
	vol := 1.0
	maxExt := 0.0
	for k := 0; k < l.dim; k++ {
		maxExt = math.Max(maxExt, hi[k]-lo[k])
	}
	for k := 0; k < l.dim; k++ {
		vol *= math.Max(hi[k]-lo[k], 1e-6*maxExt)
	}
	s := math.Pow(vol/(binsPerCell*float64(ncell)), 1/float64(l.dim))
	nb := 1
	for k := 0; k < 3; k++ {
		l.n[k], l.lo[k], l.inv[k] = 1, 0, 0
		if k >= l.dim {
			continue
		}
		ext := hi[k] - lo[k]
		n := 1
		if s > 0 && ext > 0 {
			n = int(math.Min(math.Ceil(ext/s), 1<<20))
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
	f := l.binCoord(k, x)
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

func (l *Locator) eachBin(i0, i1 [3]int, fn func(b int)) {
	for c := i0[2]; c <= i1[2]; c++ {
		for b := i0[1]; b <= i1[1]; b++ {
			row := (c*l.n[1] + b) * l.n[0]
			for a := i0[0]; a <= i1[0]; a++ {
				fn(row + a)
			}
		}
	}
}
