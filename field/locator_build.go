package field

import (
	"fmt"
	"math"
)

// Build passes of the Locator: the padded box of every cell, then the bin
// grid filled by counting sort. Each pass splits the cells into the same
// contiguous chunks, one per worker (see parallel), and reads the points
// through the connectivity directly, without gathering cells.

// boxStats sums up the boxes of a range of cells: how many are indexed and
// the bounds of their boxes on the first dim axes (+Inf, -Inf when none).
type boxStats struct {
	indexed int
	lo, hi  [3]float64
}

// add merges t into s.
func (s *boxStats) add(t *boxStats) {
	s.indexed += t.indexed
	for k := 0; k < 3; k++ {
		s.lo[k], s.hi[k] = min(s.lo[k], t.lo[k]), max(s.hi[k], t.hi[k])
	}
}

// boxChunk stores in l.box the padded boxes of global cells [a,b) (lo x =
// +Inf, hi x = -Inf for cells left out of the index) and returns their
// boxStats, or the error of the first cell with a non-finite coordinate.
func (l *Locator) boxChunk(a, b int) (boxStats, error) {
	var st boxStats
	for k := 0; k < 3; k++ {
		st.lo[k], st.hi[k] = math.Inf(1), math.Inf(-1)
	}
	for g := a; g < b; {
		zi, c := l.ref(int32(g))
		z := l.f.Zones[zi]
		s := int(l.stride[zi])
		for end := min(b, int(l.base[zi+1])); g < end; g, c = g+1, c+1 {
			out := (*[6]float64)(l.box[6*g : 6*g+6])
			if !l.indexable(z, c) {
				out[0], out[3] = math.Inf(1), math.Inf(-1)
				continue
			}
			var nodes []int32
			if s > 0 {
				nodes = z.Conn[s*c : s*c+s : s*c+s]
			} else {
				nodes = z.CellNodes(c)
			}
			if !nodeBox(z.Points, nodes, l.dim, out) {
				if err := nonFinite(z.Points, nodes); err != nil {
					return st, fmt.Errorf("field: zone %d (%q): cell %d: %w", zi, z.Name, c, err)
				}
			}
			st.indexed++
			for k := 0; k < l.dim; k++ { // rarely taken: cheaper than min and max
				if out[k] < st.lo[k] {
					st.lo[k] = out[k]
				}
				if out[3+k] > st.hi[k] {
					st.hi[k] = out[3+k]
				}
			}
		}
	}
	return st, nil
}

// nodeBox stores in out the padded bounding box of the given points of pts
// (3 coordinates per point), lo x,y,z then hi x,y,z, exactly as
// cellGeom.paddedBox computes it for the cell of those nodes. It returns
// false when the sum of the coordinates is not finite, which it is
// whenever a coordinate is not (the box is then meaningless).
//
// The bounds are taken on the orderedBits of the coordinates, by integer
// comparisons that compile to conditional moves: for non-NaN values they
// give the bits of the builtin min and max, at half the instructions.
func nodeBox(pts []float64, nodes []int32, dim int, out *[6]float64) bool {
	var x0, y0, z0, x1, y1, z1 int64 // a cell without nodes: the origin, as paddedBox
	sum := 0.0                       // NaN or ±Inf when a coordinate is
	if len(nodes) > 0 {
		p := 3 * int(nodes[0])
		q := pts[p : p+3 : p+3]
		x0, y0, z0 = orderedBits(q[0]), orderedBits(q[1]), orderedBits(q[2])
		x1, y1, z1 = x0, y0, z0
		sx, sy, sz := q[0], q[1], q[2]
		for _, n := range nodes[1:] {
			p := 3 * int(n)
			q := pts[p : p+3 : p+3]
			sx, sy, sz = sx+q[0], sy+q[1], sz+q[2]
			x, y, z := orderedBits(q[0]), orderedBits(q[1]), orderedBits(q[2])
			x0, y0, z0 = min(x0, x), min(y0, y), min(z0, z)
			x1, y1, z1 = max(x1, x), max(y1, y), max(z1, z)
		}
		sum = sx + sy + sz
	}
	out[0], out[1], out[2], out[3], out[4], out[5] = padBox(dim,
		orderedFloat(x0), orderedFloat(y0), orderedFloat(z0), orderedFloat(x1), orderedFloat(y1), orderedFloat(z1))
	return sum-sum == 0
}

// orderedBits maps x to an integer whose order is that of the non-NaN
// floats (-0 below +0): the bits of x, with all but the sign flipped when
// x is negative. orderedFloat is its inverse.
func orderedBits(x float64) int64 {
	b := int64(math.Float64bits(x))
	return b ^ int64(uint64(b>>63)>>1)
}

// orderedFloat returns the float whose orderedBits is k.
func orderedFloat(k int64) float64 {
	return math.Float64frombits(uint64(k ^ int64(uint64(k>>63)>>1)))
}

// nonFinite returns an error naming the first of the nodes with a
// non-finite coordinate in pts, or nil when all are finite.
func nonFinite(pts []float64, nodes []int32) error {
	for _, p := range nodes {
		for k := 0; k < 3; k++ {
			if v := pts[3*int(p)+k]; v-v != 0 {
				return fmt.Errorf("point %d: coordinate %d is %v", p, k, v)
			}
		}
	}
	return nil
}

// buildGrid sizes the bin grid over the cell boxes and fills it by counting
// sort. Each worker counts and then places the cells of one contiguous
// chunk; chunk w's entries of a bin follow those of chunks < w, so every bin
// lists its cells in increasing order whatever the number of workers.
//
// st sums up all the boxes. The mean box volume is summed in cell order, so
// the grid is the same for any number of workers.
func (l *Locator) buildGrid(workers int, st *boxStats) error {
	ncell := len(l.box) / 6
	boxVol := 0.0
	for g := 0; g < ncell; g++ {
		b := (*[6]float64)(l.box[6*g : 6*g+6])
		if !(b[0] <= b[3]) { // not indexed
			continue
		}
		v := 1.0
		for k := 0; k < l.dim; k++ {
			v *= b[3+k] - b[k]
		}
		boxVol += v
	}
	lo, hi, indexed := st.lo, st.hi, st.indexed
	nb := l.sizeGrid(lo, hi, indexed, boxVol/float64(indexed))
	counts := make([][]int32, workers)
	totals := make([]int, workers)
	parallel(ncell, workers, func(w, a, b int) {
		counts[w] = make([]int32, nb)
		totals[w] = l.countChunk(a, b, counts[w])
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
		for _, cnt := range counts {
			c := cnt[b]
			cnt[b] = next
			next += c
		}
	}
	l.start[nb] = next
	l.items = make([]binEntry, total)
	parallel(ncell, workers, func(w, a, b int) { l.fillChunk(a, b, counts[w]) })
	return nil
}

// countChunk adds to cnt the number of entries of the indexed cells of
// [a,b) in each bin and returns their total, or a value above
// math.MaxInt32 as soon as the total exceeds it.
func (l *Locator) countChunk(a, b int, cnt []int32) int {
	total := 0
	for g := a; g < b; g++ {
		box := (*[6]float64)(l.box[6*g : 6*g+6])
		if !(box[0] <= box[3]) { // not indexed
			continue
		}
		var i0, i1 [3]int
		for k := 0; k < l.dim; k++ {
			i0[k], i1[k] = l.binIndex(k, box[k]), l.binIndex(k, box[3+k])
		}
		total += (i1[0] - i0[0] + 1) * (i1[1] - i0[1] + 1) * (i1[2] - i0[2] + 1)
		if total > math.MaxInt32 {
			break
		}
		for z := i0[2]; z <= i1[2]; z++ {
			for y := i0[1]; y <= i1[1]; y++ {
				row := (z*l.n[1] + y) * l.n[0]
				r := cnt[row+i0[0] : row+i1[0]+1]
				for x := range r {
					r[x]++
				}
			}
		}
	}
	return total
}

// fillChunk places the indexed cells of [a,b) in their bins, in increasing
// bin order for each cell: entry slot cur[b] of bin b, then advances
// cur[b]. Each entry's quantized box is assembled from the lanes of its
// bin's three axes, computed once per cell and axis (see axisLanes).
func (l *Locator) fillChunk(a, b int, cur []int32) {
	// Per axis k, the lo lanes and then the hi lanes of the cell's bins,
	// at most l.n[k] of each.
	var lanes [3][2][]uint32
	buf := make([]uint32, 2*(l.n[0]+l.n[1]+l.n[2]))
	for k := 0; k < 3; k++ {
		lanes[k][0], lanes[k][1], buf = buf[:l.n[k]], buf[l.n[k]:2*l.n[k]], buf[2*l.n[k]:]
	}
	for k := l.dim; k < 3; k++ { // the whole (only) bin
		lanes[k][0][0], lanes[k][1][0] = 0, (binLevels-1)<<(10*uint(k))
	}
	for g := a; g < b; g++ {
		box := (*[6]float64)(l.box[6*g : 6*g+6])
		if !(box[0] <= box[3]) { // not indexed
			continue
		}
		var i0, n [3]int
		for k := 0; k < 3; k++ {
			i0[k], n[k] = 0, 1
			if k < l.dim {
				flo, fhi := l.binCoord(k, box[k]), l.binCoord(k, box[3+k])
				i0[k] = l.clampBin(k, flo)
				n[k] = l.clampBin(k, fhi) - i0[k] + 1
				l.axisLanes(lanes[k][0][:n[k]], k, box[k], i0[k])
				l.axisLanes(lanes[k][1][:n[k]], k, box[3+k], i0[k])
			}
		}
		lx, hx := lanes[0][0], lanes[0][1]
		for z := 0; z < n[2]; z++ {
			lz, hz := lanes[2][0][z], lanes[2][1][z]
			for y := 0; y < n[1]; y++ {
				ly, hy := lanes[1][0][y]|lz, lanes[1][1][y]|hz
				row := ((i0[2]+z)*l.n[1]+i0[1]+y)*l.n[0] + i0[0]
				r := cur[row : row+n[0]]
				for x := range r {
					l.items[r[x]] = binEntry{id: int32(g), lo: lx[x] | ly, hi: hx[x] | hy}
					r[x]++
				}
			}
		}
	}
}
