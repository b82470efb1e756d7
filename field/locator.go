package field

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
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
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return fmt.Errorf("point %d: coordinate %d is %v", p, k, v)
			}
			lo[k], hi[k] = math.Min(lo[k], v), math.Max(hi[k], v)
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
			lo[k], hi[k] = math.Min(lo[k], b[k]), math.Max(hi[k], b[3+k])
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
	f := (x - l.lo[k]) * l.inv[k]
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

// Field returns the field the locator indexes.
func (l *Locator) Field() *Field { return l.f }

// Dim returns the dimension of the indexed cells: 2 or 3.
func (l *Locator) Dim() int { return l.dim }

// inBox reports whether p lies in the padded box of indexed cell g.
func (l *Locator) inBox(g int32, p [3]float64) bool {
	b := l.box[6*int(g) : 6*int(g)+6 : 6*int(g)+6]
	return p[0] >= b[0] && p[0] <= b[3] && p[1] >= b[1] && p[1] <= b[4] && p[2] >= b[2] && p[2] <= b[5]
}

// Locate returns the cell containing p and p's local coordinates in it. A
// point on a face, edge or vertex shared by several cells (within a relative
// tolerance of 1e-9 in local coordinates) goes to the one with the lowest
// (Zone, Cell). ok is false when no indexed cell contains p. In 2D, p[2] is
// ignored.
func (l *Locator) Locate(p [3]float64) (Location, bool) {
	var b int
	for k := l.dim - 1; k >= 0; k-- {
		f := (p[k] - l.lo[k]) * l.inv[k]
		if !(f >= -1e-9*float64(l.n[k])) || f > float64(l.n[k])*(1+1e-9) {
			return Location{}, false
		}
		i := int(f)
		if i >= l.n[k] {
			i = l.n[k] - 1
		} else if i < 0 {
			i = 0
		}
		b = b*l.n[k] + i
	}
	var g cellGeom
	for _, id := range l.items[l.start[b]:l.start[b+1]] {
		if !l.inBox(id, p) {
			continue
		}
		z := l.f.Zones[l.zoneOf[id]]
		z.gather(int(l.cellOf[id]), &g)
		if r, ok := g.local(p); ok && contains(g.t, r, localTol) {
			return Location{Zone: l.zoneOf[id], Cell: l.cellOf[id], Local: r}, true
		}
	}
	return Location{}, false
}

// InCell returns the local coordinates of p in the cell ref. ok is false
// when p lies outside the cell (beyond the relative tolerance 1e-9 in local
// coordinates), when ref does not exist, or when the cell has no shape
// functions (vertices, lines, polygons) or is degenerate. The cell may be
// blank or of another dimension than the index.
func (l *Locator) InCell(ref CellRef, p [3]float64) (Location, bool) {
	if ref.Zone < 0 || int(ref.Zone) >= len(l.f.Zones) {
		return Location{}, false
	}
	z := l.f.Zones[ref.Zone]
	if ref.Cell < 0 || int(ref.Cell) >= len(z.Types) {
		return Location{}, false
	}
	var g cellGeom
	if !z.gather(int(ref.Cell), &g) || !g.nearBox(p) {
		return Location{}, false
	}
	r, ok := g.local(p)
	if !ok || !contains(g.t, r, localTol) {
		return Location{}, false
	}
	return Location{Zone: ref.Zone, Cell: ref.Cell, Local: r}, true
}

// CellsInBox appends to dst the indexed cells whose padded bounding box
// overlaps the box [lo,hi], sorted by (Zone, Cell) without duplicates, and
// returns the extended slice. In 2D the z range is ignored. The test is by
// bounding box only: a returned cell may miss the box itself.
func (l *Locator) CellsInBox(lo, hi [3]float64, dst []CellRef) []CellRef {
	for k := 0; k < l.dim; k++ {
		if !(lo[k] <= hi[k]) {
			return dst
		}
	}
	first := len(dst)
	i0, i1 := l.binRange(lo[:], hi[:])
	q := [6]float64{lo[0], lo[1], lo[2], hi[0], hi[1], hi[2]}
	if l.dim == 2 {
		q[2], q[5] = math.Inf(-1), math.Inf(1)
	}
	for c := i0[2]; c <= i1[2]; c++ {
		for bb := i0[1]; bb <= i1[1]; bb++ {
			for a := i0[0]; a <= i1[0]; a++ {
				bin := [3]int{a, bb, c}
				idx := (c*l.n[1]+bb)*l.n[0] + a
				for _, id := range l.items[l.start[idx]:l.start[idx+1]] {
					b := l.box[6*int(id) : 6*int(id)+6 : 6*int(id)+6]
					if b[0] > q[3] || b[3] < q[0] || b[1] > q[4] || b[4] < q[1] || b[2] > q[5] || b[5] < q[2] {
						continue
					}
					// Report each cell once: from the bin holding the low
					// corner of the intersection of the two boxes.
					dup := false
					for k := 0; k < l.dim; k++ {
						if l.binIndex(k, math.Max(b[k], q[k])) != bin[k] {
							dup = true
							break
						}
					}
					if !dup {
						dst = append(dst, CellRef{l.zoneOf[id], l.cellOf[id]})
					}
				}
			}
		}
	}
	slices.SortFunc(dst[first:], compareRefs)
	return dst
}

func compareRefs(a, b CellRef) int {
	if a.Zone != b.Zone {
		return int(a.Zone) - int(b.Zone)
	}
	return int(a.Cell) - int(b.Cell)
}

// CellSize returns the mean edge length of the cell containing p or, when p
// lies in no indexed cell, of the cell whose bounding box is nearest to p
// (ties to the lowest (Zone, Cell)). It is a length scale for tessellating
// surfaces to the local mesh resolution.
func (l *Locator) CellSize(p [3]float64) float64 {
	if loc, ok := l.Locate(p); ok {
		return l.f.Zones[loc.Zone].meanEdge(int(loc.Cell))
	}
	g := l.nearest(p)
	return l.f.Zones[l.zoneOf[g]].meanEdge(int(l.cellOf[g]))
}

// nearest returns the indexed cell whose padded box is nearest to p,
// searching rings of bins around p's (clamped) bin until a ring lies farther
// than the best box found.
func (l *Locator) nearest(p [3]float64) int32 {
	var c [3]int
	for k := 0; k < l.dim; k++ {
		c[k] = l.binIndex(k, p[k])
	}
	best, bestD := int32(-1), math.Inf(1)
	maxRing := max(l.n[0], l.n[1], l.n[2])
	binW := math.Inf(1)
	for k := 0; k < l.dim; k++ {
		if l.inv[k] > 0 {
			binW = math.Min(binW, 1/l.inv[k])
		}
	}
	for ring := 0; ring <= maxRing; ring++ {
		if best >= 0 && float64(ring-1)*binW > math.Sqrt(bestD) {
			break
		}
		var i0, i1 [3]int
		for k := 0; k < l.dim; k++ {
			i0[k], i1[k] = max(c[k]-ring, 0), min(c[k]+ring, l.n[k]-1)
		}
		l.eachBin(i0, i1, func(b int) {
			// Only the shell of the ring: inner bins were visited before.
			a := b % l.n[0]
			bb := (b / l.n[0]) % l.n[1]
			cc := b / (l.n[0] * l.n[1])
			if ring > 0 && abs(a-c[0]) < ring && abs(bb-c[1]) < ring && abs(cc-c[2]) < ring {
				return
			}
			for _, id := range l.items[l.start[b]:l.start[b+1]] {
				d := l.boxDist2(id, p)
				if d < bestD || (d == bestD && id < best) {
					best, bestD = id, d
				}
			}
		})
	}
	return best
}

func abs(i int) int {
	if i < 0 {
		return -i
	}
	return i
}

// boxDist2 returns the squared distance from p to the box of indexed cell g.
func (l *Locator) boxDist2(g int32, p [3]float64) float64 {
	b := l.box[6*int(g) : 6*int(g)+6]
	d := 0.0
	for k := 0; k < l.dim; k++ {
		if p[k] < b[k] {
			d += (b[k] - p[k]) * (b[k] - p[k])
		} else if p[k] > b[3+k] {
			d += (p[k] - b[3+k]) * (p[k] - b[3+k])
		}
	}
	return d
}

// nearBox reports whether p lies in the bounding box of g padded as in the
// index (boxPad times its largest extent), the same pre-test Locate applies.
func (g *cellGeom) nearBox(p [3]float64) bool {
	var lo, hi [3]float64
	h := 0.0
	for k := 0; k < g.dim; k++ {
		lo[k], hi[k] = g.x[0][k], g.x[0][k]
		for i := 1; i < g.n; i++ {
			lo[k], hi[k] = math.Min(lo[k], g.x[i][k]), math.Max(hi[k], g.x[i][k])
		}
		h = math.Max(h, hi[k]-lo[k])
	}
	pad := boxPad*h + 1e-300
	for k := 0; k < g.dim; k++ {
		if !(p[k] >= lo[k]-pad && p[k] <= hi[k]+pad) {
			return false
		}
	}
	return true
}

// meanEdge returns the mean length of the edges of cell c (each edge of a
// volume cell appears in two faces, so the mean over face sides is the mean
// over edges).
func (z *Zone) meanEdge(c int) float64 {
	nodes := z.CellNodes(c)
	sum, n := 0.0, 0
	for _, f := range z.Types[c].Faces() {
		for i := range f {
			a, b := z.Point(nodes[f[i]]), z.Point(nodes[f[(i+1)%len(f)]])
			sum += math.Sqrt(norm2([3]float64{b[0] - a[0], b[1] - a[1], b[2] - a[2]}))
			n++
			if len(f) == 2 {
				break // a 2D cell's "faces" are its edges
			}
		}
	}
	if n == 0 {
		return 0
	}
	return sum / float64(n)
}
