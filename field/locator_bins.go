package field

// Compact per-bin candidate filter of the Locator.
//
// Every entry of a bin carries, beside the cell number, the cell's padded
// bounding box clipped to the bin and quantized to binLevels steps per bin
// width, rounded outward: the three lower bounds in one word and the three
// upper bounds in another, each in a 10-bit lane (bits 0, 10 and 20 for x,
// y, z). A query quantizes its position inside its bin the same way and
// tests all three axes at once with two subtractions (lane arithmetic with
// a guard bit, see binEntry.mayHold). The filter is conservative: a point
// in the exact padded box always passes, because quantization is monotone
// in the coordinate; the exact box and the inverse map decide afterwards.
// It touches only the bin's contiguous entries, not the per-cell boxes.

// binEntry is one cell listed in one bin: its global cell number (see
// Locator.base) and its quantized box within the bin (lanes as above).
type binEntry struct {
	id     int32
	lo, hi uint32
}

// binLevels is the number of quantization steps per bin width (9 bits, so
// that a 10-bit lane holds a value and its guard bit).
const binLevels = 512

// laneGuards has the guard bit (bit 9) of each of the three lanes set.
const laneGuards = 1<<9 | 1<<19 | 1<<29

// fullLanes is the quantized interval covering a whole bin on every axis.
const (
	fullLo = 0
	fullHi = (binLevels - 1) | (binLevels-1)<<10 | (binLevels-1)<<20
)

// quantize returns the quantization step of t, a position in bin widths
// relative to the bin's lower side: floor(binLevels·t) clamped to
// [0, binLevels-1]. It is monotone in t (NaN gives 0).
func quantize(t float64) uint32 {
	t *= binLevels
	if !(t > 0) {
		return 0
	}
	if t >= binLevels-1 {
		return binLevels - 1
	}
	return uint32(t)
}

// mayHold reports whether the quantized point q (one lane per axis, each
// at most binLevels-1) lies in the entry's quantized box on every axis.
// Each lane computes binLevels + q - lo and binLevels + hi - q, which stay
// in [1, 2·binLevels-1], so no borrow crosses lanes, and keep the guard bit
// exactly when the difference is not negative.
func (e *binEntry) mayHold(q uint32) bool {
	return ((q|laneGuards)-e.lo)&((e.hi|laneGuards)-q)&laneGuards == laneGuards
}

// axisLanes stores in dst[j] the lane, on axis k, of coordinate x of a
// box corner quantized within bin i0+j of that axis:
// quantize(binCoord(k,x) - (i0+j)) shifted to bit 10·k. A cell's entry in
// the bin with coordinates i has as lanes those of its padded box [lo,hi]
// clipped to the bin: the lo lanes of lo[k] and the hi lanes of hi[k] for
// the first dim axes, and the whole bin (0 and binLevels-1) on the others.
func (l *Locator) axisLanes(dst []uint32, k int, x float64, i0 int) {
	f := l.binCoord(k, x)
	for j := range dst {
		dst[j] = quantize(f-float64(i0+j)) << (10 * uint(k))
	}
}
