package readers

import (
	"encoding/binary"
	"fmt"
	"math"
	"sync"
)

// minBinaryPart is the smallest share of a binary chunk worth a goroutine.
const minBinaryPart = 256 << 10

// readBinary reads n big-endian values of t (little-endian when s.le)
// into dst, converting each buffer-full in disjoint ranges across workers.
func (s *scanner) readBinary(n int, t dtype, sec, what string, dst sink) error {
	got := 0
	for got < n {
		needBytes := (n - got) * t.size
		s.want(needBytes)
		if err := s.fill(min(needBytes, len(s.buf))); err != nil {
			return err
		}
		avail := s.end - s.pos
		k := min(avail, needBytes) / t.size
		if k == 0 {
			return s.errAt(sec, fmt.Sprintf("%d %s", n, what), fmt.Sprintf("%d before EOF", got), ErrTruncated)
		}
		dst.grow(got + k)
		src := s.buf[s.pos : s.pos+k*t.size]
		w := min(s.workers, len(src)/minBinaryPart)
		if w <= 1 {
			if i, e := dst.putBytes(got, src, t, s.le); e != nil {
				return s.valueErr(e, sec, i*t.size)
			}
		} else {
			bad := make([]int, w)
			errs := make([]*Error, w)
			var wg sync.WaitGroup
			per := (k + w - 1) / w
			for j := 0; j < w; j++ {
				lo, hi := j*per, min((j+1)*per, k)
				if lo >= hi {
					continue
				}
				wg.Add(1)
				go func(j, lo, hi int) {
					defer wg.Done()
					i, e := dst.putBytes(got+lo, src[lo*t.size:hi*t.size], t, s.le)
					bad[j], errs[j] = lo+i, e
				}(j, lo, hi)
			}
			wg.Wait()
			for j := range errs {
				if errs[j] != nil {
					return s.valueErr(errs[j], sec, bad[j]*t.size)
				}
			}
		}
		got += k
		s.advance(k * t.size)
	}
	return nil
}

// valueErr positions an error from a sink at byte rel after s.pos.
func (s *scanner) valueErr(e *Error, sec string, rel int) *Error {
	e.File, e.Section, e.Offset = s.name, sec, s.offset()+int64(rel)
	return e
}

// readBits reads n packed bits (most significant bit first, as
// vtkBitArray stores them) as 0/1 values.
func (s *scanner) readBits(n int, sec, what string, dst sink) error {
	nb := (n + 7) / 8
	got := 0
	v := make([]float64, 0, 8*4096)
	for got < n {
		if err := s.fill(min(nb-got/8, 4096)); err != nil {
			return err
		}
		k := min(s.end-s.pos, nb-got/8, 4096)
		if k == 0 {
			return s.errAt(sec, fmt.Sprintf("%d %s", n, what), fmt.Sprintf("%d before EOF", got), ErrTruncated)
		}
		v = v[:0]
		for _, b := range s.buf[s.pos : s.pos+k] {
			for bit := 7; bit >= 0 && got+len(v) < n; bit-- {
				v = append(v, float64(b>>uint(bit)&1))
			}
		}
		dst.grow(got + len(v))
		if i, e := dst.putFloats(got, v); e != nil {
			return s.valueErr(e, sec, i/8)
		}
		got += len(v)
		s.advance(k)
	}
	return nil
}

// decodeFloats converts len(dst) binary values of t from src.
func decodeFloats(dst []float64, src []byte, t dtype, le bool) {
	if le {
		decodeFloatsLE(dst, src, t)
		return
	}
	be := binary.BigEndian
	switch {
	case t.kind == kFloat && t.size == 8:
		for i := range dst {
			dst[i] = math.Float64frombits(be.Uint64(src[8*i:]))
		}
	case t.kind == kFloat && t.size == 4:
		for i := range dst {
			dst[i] = float64(math.Float32frombits(be.Uint32(src[4*i:])))
		}
	case t.kind == kInt && t.size == 4:
		for i := range dst {
			dst[i] = float64(int32(be.Uint32(src[4*i:])))
		}
	case t.kind == kInt && t.size == 8:
		for i := range dst {
			dst[i] = float64(int64(be.Uint64(src[8*i:])))
		}
	case t.kind == kUint && t.size == 1:
		for i := range dst {
			dst[i] = float64(src[i])
		}
	default:
		for i := range dst {
			dst[i] = scalarAt(src, i, t, be)
		}
	}
}

// decodeFloatsLE is decodeFloats for little-endian data.
func decodeFloatsLE(dst []float64, src []byte, t dtype) {
	for i := range dst {
		dst[i] = scalarAt(src, i, t, binary.LittleEndian)
	}
}

// scalarAt decodes value i of t from src in byte order o.
func scalarAt(src []byte, i int, t dtype, o binary.ByteOrder) float64 {
	p := src[i*t.size:]
	switch t.kind {
	case kFloat:
		if t.size == 8 {
			return math.Float64frombits(o.Uint64(p))
		}
		return float64(math.Float32frombits(o.Uint32(p)))
	case kInt:
		switch t.size {
		case 1:
			return float64(int8(p[0]))
		case 2:
			return float64(int16(o.Uint16(p)))
		case 4:
			return float64(int32(o.Uint32(p)))
		}
		return float64(int64(o.Uint64(p)))
	default:
		switch t.size {
		case 1:
			return float64(p[0])
		case 2:
			return float64(o.Uint16(p))
		case 4:
			return float64(o.Uint32(p))
		}
		return float64(o.Uint64(p))
	}
}

// decodeInts converts len(dst) binary integers of t from src to int32; it
// returns the index and value of the first that is not an integer in
// int32 range.
func decodeInts(dst []int32, src []byte, t dtype, le bool) (int, float64, bool) {
	if !le && t.kind == kInt && t.size == 4 {
		be := binary.BigEndian
		for i := range dst {
			dst[i] = int32(be.Uint32(src[4*i:]))
		}
		return 0, 0, true
	}
	if !le && t.kind == kInt && t.size == 8 {
		be := binary.BigEndian
		for i := range dst {
			v := int64(be.Uint64(src[8*i:]))
			if v != int64(int32(v)) {
				return i, float64(v), false
			}
			dst[i] = int32(v)
		}
		return 0, 0, true
	}
	var o binary.ByteOrder = binary.BigEndian
	if le {
		o = binary.LittleEndian
	}
	for i := range dst {
		if t.size == 8 && t.kind != kFloat {
			u := o.Uint64(src[8*i:])
			if (t.kind == kUint && u > math.MaxInt32) || (t.kind == kInt && int64(u) != int64(int32(int64(u)))) {
				return i, float64(int64(u)), false
			}
			dst[i] = int32(int64(u))
			continue
		}
		x := scalarAt(src, i, t, o)
		if x < math.MinInt32 || x > math.MaxInt32 || x != math.Trunc(x) {
			return i, x, false
		}
		dst[i] = int32(x)
	}
	return 0, 0, true
}

// skipStrings consumes n string values: one line each in ASCII, length-
// prefixed in BINARY (FORMATS.md §1.3).
func (s *scanner) skipStrings(n int64, sec, what string) error {
	if n > s.remaining() {
		return s.tooBig(sec, fmt.Sprintf("%d %s", n, what), n)
	}
	for i := int64(0); i < n; i++ {
		if s.ascii {
			if err := s.skipSpace(); err != nil {
				return err
			}
			if eof, err := s.atEOF(); err != nil || eof {
				if err == nil {
					err = s.errAt(sec, fmt.Sprintf("%d %s", n, what), fmt.Sprintf("%d before EOF", i), ErrTruncated)
				}
				return err
			}
			if _, err := s.rawLine(); err != nil {
				return err
			}
			continue
		}
		if err := s.fill(8); err != nil {
			return err
		}
		if s.pos == s.end {
			return s.errAt(sec, fmt.Sprintf("%d %s", n, what), fmt.Sprintf("%d before EOF", i), ErrTruncated)
		}
		b := s.buf[s.pos:s.end]
		var l int64
		var h int
		switch b[0] >> 6 {
		case 3:
			l, h = int64(b[0]&0x3f), 1
		case 2:
			h = 2
			if len(b) >= 2 {
				l = int64(binary.BigEndian.Uint16(b) & 0x3fff)
			}
		case 1:
			h = 4
			if len(b) >= 4 {
				l = int64(binary.BigEndian.Uint32(b) & 0x3fffffff)
			}
		default:
			h = 8
			if len(b) >= 8 {
				l = int64(binary.BigEndian.Uint64(b) & (1<<62 - 1))
			}
		}
		if len(b) < h {
			return s.errAt(sec, "a string length", "EOF", ErrTruncated)
		}
		s.advance(h)
		if err := s.discard(l, sec, "string bytes"); err != nil {
			return err
		}
	}
	return nil
}
