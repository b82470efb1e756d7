package readers

import (
	"fmt"
	"math"
)

// sink is the destination of a numeric block. grow makes room for n
// values (len >= n); put* store values starting at index k and return the
// index (within v or src) of a value that does not fit, with its error.
// put* may be called concurrently on disjoint ranges after grow.
type sink interface {
	grow(n int)
	putFloats(k int, v []float64) (int, *Error)
	putBytes(k int, src []byte, t dtype, le bool) (int, *Error)
}

// floatSink collects float64 values.
type floatSink struct {
	d     []float64
	total int
}

func (f *floatSink) grow(n int) { f.d = growTo(f.d, n, f.total) }

func (f *floatSink) putFloats(k int, v []float64) (int, *Error) {
	copy(f.d[k:], v)
	return 0, nil
}

func (f *floatSink) putBytes(k int, src []byte, t dtype, le bool) (int, *Error) {
	decodeFloats(f.d[k:k+len(src)/t.size], src, t, le)
	return 0, nil
}

// intSink collects int32 values (cell connectivity, offsets, types);
// values must be integers in int32 range.
type intSink struct {
	d     []int32
	total int
}

func (f *intSink) grow(n int) { f.d = growTo(f.d, n, f.total) }

func (f *intSink) putFloats(k int, v []float64) (int, *Error) {
	d := f.d[k : k+len(v)]
	for i, x := range v {
		if x < math.MinInt32 || x > math.MaxInt32 || x != math.Trunc(x) {
			return i, &Error{Expected: "a 32-bit integer", Found: fmt.Sprint(x), Err: errSyntax}
		}
		d[i] = int32(x)
	}
	return 0, nil
}

func (f *intSink) putBytes(k int, src []byte, t dtype, le bool) (int, *Error) {
	if i, x, ok := decodeInts(f.d[k:k+len(src)/t.size], src, t, le); !ok {
		return i, &Error{Expected: "a 32-bit integer", Found: fmt.Sprint(x), Err: errSyntax}
	}
	return 0, nil
}

// growTo returns d resliced to length n (n >= len(d)) or d unchanged when
// it is already that long. A new backing array gets stepCap(n, total)
// values, total being the count the stream declared and the scanner
// already checked.
func growTo[T float64 | int32](d []T, n, total int) []T {
	if n <= len(d) {
		return d
	}
	if n > cap(d) {
		nd := make([]T, len(d), stepCap(n, total))
		copy(nd, d)
		d = nd
	}
	return d[:n]
}

// Capacity steps of a block whose declared count is not backed by a known
// stream size: total/growStep^k, at least minGrow values.
const (
	growStep = 8
	minGrow  = 1 << 16
)

// stepCap returns the capacity to allocate for need of total values
// (need <= total) when the stream cannot vouch for total: the smallest of
// total, total/8, total/64, ... that holds need values and minGrow.
//
// The steps are fixed by total, so the last one before total is at most
// total/8 and all the arrays given up on the way (with the first one of
// minGrow values) sum to at most total/7 + minGrow: a block that arrives
// whole allocates little more than 8/7 of its size. Each step is
// at most 8 times the previous one, which the values already read filled,
// so a count that the data does not back costs at most 8 times the values
// it really delivered.
func stepCap(need, total int) int {
	c := total
	for c/growStep >= max(need, minGrow) {
		c /= growStep
	}
	return c
}

// budget checks that n values of t can still be in the stream and
// converts n to int.
func (s *scanner) budget(n int64, t dtype, sec, what string) (int, error) {
	if n < 0 {
		return 0, s.errAt(sec, "a non-negative count", fmt.Sprint(n), errSyntax)
	}
	need := s.blockBytes(n, t)
	if need > s.remaining() {
		return 0, s.tooBig(sec, fmt.Sprintf("%d %s", n, what), need)
	}
	if n > 1<<40 {
		return 0, s.errAt(sec, fmt.Sprintf("%d %s", n, what), "more than the field model holds", ErrTooLarge)
	}
	return int(n), nil
}

// blockBytes returns the fewest bytes n values of t take in the stream:
// 2n-1 in ASCII (one digit and one separator each), their binary size
// otherwise; math.MaxInt64 on overflow.
func (s *scanner) blockBytes(n int64, t dtype) int64 {
	if s.ascii {
		if n > 1<<61 {
			return math.MaxInt64
		}
		return 2*n - 1
	}
	if b := t.byteLen(n); b >= 0 {
		return b
	}
	return math.MaxInt64
}

// initialCap is the capacity to allocate for n values of t: all of them
// when the stream size is known (the budget check has bounded n) or when
// the size hint of a compressed stream covers their bytes, else at most
// minGrow, from which the slice grows in steps as data arrives (stepCap).
// Bit arrays never follow the hint: at 64 bytes of float64 per byte of
// data, a hinted bit array would let a lying container claim too much.
func (s *scanner) initialCap(n int, t dtype) int {
	if s.sized() || (t.kind != kBit && s.hinted(s.blockBytes(int64(n), t))) {
		return n
	}
	return min(n, minGrow)
}

// readFloats reads n values of type t as float64.
func (s *scanner) readFloats(n int64, t dtype, sec, what string) ([]float64, error) {
	if t.kind == kString {
		return nil, s.errAt(sec, "a numeric data type", t.name, ErrUnsupported)
	}
	m, err := s.budget(n, t, sec, what)
	if err != nil {
		return nil, err
	}
	f := &floatSink{d: make([]float64, 0, s.initialCap(m, t)), total: m}
	if err := s.readBlock(m, t, sec, what, f); err != nil {
		return nil, err
	}
	return f.d, nil
}

// readInts reads n integers of type t as int32.
func (s *scanner) readInts(n int64, t dtype, sec, what string) ([]int32, error) {
	if t.kind == kString || t.kind == kBit {
		return nil, s.errAt(sec, "an integer data type", t.name, errSyntax)
	}
	m, err := s.budget(n, t, sec, what)
	if err != nil {
		return nil, err
	}
	if m > math.MaxInt32 {
		return nil, s.errAt(sec, fmt.Sprintf("%d %s", n, what), "more than 2^31-1 indices", ErrTooLarge)
	}
	f := &intSink{d: make([]int32, 0, s.initialCap(m, t)), total: m}
	if err := s.readBlock(m, t, sec, what, f); err != nil {
		return nil, err
	}
	return f.d, nil
}

// readBlock reads n values of t into dst, ASCII or binary.
func (s *scanner) readBlock(n int, t dtype, sec, what string, dst sink) error {
	if s.ascii {
		return s.readASCII(n, t.f32(), sec, what, dst)
	}
	if t.kind == kBit {
		return s.readBits(n, sec, what, dst)
	}
	return s.readBinary(n, t, sec, what, dst)
}

// skipBlock consumes n values of t without converting them.
func (s *scanner) skipBlock(n int64, t dtype, sec, what string) error {
	if n < 0 {
		return s.errAt(sec, "a non-negative count", fmt.Sprint(n), errSyntax)
	}
	if t.kind == kString {
		return s.skipStrings(n, sec, what)
	}
	if s.ascii {
		if 2*n-1 > s.remaining() {
			return s.tooBig(sec, fmt.Sprintf("%d %s", n, what), 2*n-1)
		}
		return s.skipASCII(n, sec, what)
	}
	b := t.byteLen(n)
	if b < 0 {
		b = math.MaxInt64
	}
	return s.discard(b, sec, fmt.Sprintf("%d %s", n, what))
}
