package readers

import (
	"encoding/binary"
	"math"
)

// checkEndian looks at the first integers of a binary cell block before it
// is read and switches the rest of the file to little-endian when the
// big-endian reading is impossible but the little-endian one is plausible.
// The format is big-endian, but some writers emit little-endian; VTK
// offers no marker, so FORMATS.md §1.9 suggests testing cell data this
// way. idx is the index of the value to test (0 for a classic count, 1 for
// the second 5.x offset) and limit its largest plausible value. Points
// read before the switch are converted back and reinterpreted.
func (f *vtkFile) checkEndian(t dtype, idx int, limit int64) error {
	s := f.s
	if s.ascii || s.le || f.endianChecked || t.size < 2 || t.kind == kFloat {
		return nil
	}
	f.endianChecked = true
	need := (idx + 1) * t.size
	if err := s.fill(need); err != nil {
		return err
	}
	if s.end-s.pos < need {
		return nil
	}
	p := s.buf[s.pos+idx*t.size:]
	be := int64(intAt(p, t, binary.BigEndian))
	le := int64(intAt(p, t, binary.LittleEndian))
	if (be >= 0 && be <= limit) || le < 0 || le > limit {
		return nil
	}
	s.le = true
	s.warn("byte %d: binary data is little-endian, not big-endian as the format requires; read as little-endian", s.offset())
	f.swapPoints()
	return nil
}

// intAt decodes the integer at the start of p.
func intAt(p []byte, t dtype, o binary.ByteOrder) int64 {
	switch t.size {
	case 2:
		if t.kind == kUint {
			return int64(o.Uint16(p))
		}
		return int64(int16(o.Uint16(p)))
	case 4:
		if t.kind == kUint {
			return int64(o.Uint32(p))
		}
		return int64(int32(o.Uint32(p)))
	}
	return int64(o.Uint64(p))
}

// swapPoints re-reads the coordinates already decoded big-endian as
// little-endian: each value is encoded back to its bytes and decoded
// again. This is exact for integers and numbers; a signalling NaN may
// come back quiet.
func (f *vtkFile) swapPoints() {
	var buf [8]byte
	t := f.pointsType
	if t.size == 0 || t.kind == kBit {
		return
	}
	for _, arr := range [][]float64{f.points, f.coords[0], f.coords[1], f.coords[2]} {
		for i, x := range arr {
			b := buf[:t.size]
			switch {
			case t.kind == kFloat && t.size == 8:
				binary.BigEndian.PutUint64(b, math.Float64bits(x))
			case t.kind == kFloat:
				binary.BigEndian.PutUint32(b, math.Float32bits(float32(x)))
			case t.size == 8:
				binary.BigEndian.PutUint64(b, uint64(int64(x)))
			case t.size == 4:
				binary.BigEndian.PutUint32(b, uint32(int64(x)))
			case t.size == 2:
				binary.BigEndian.PutUint16(b, uint16(int64(x)))
			default:
				b[0] = byte(int64(x))
			}
			arr[i] = scalarAt(b, 0, t, binary.LittleEndian)
		}
	}
}
