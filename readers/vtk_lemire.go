package readers

import (
	"math"
	"math/big"
	"math/bits"
	"sync"
)

// The Eisel-Lemire algorithm (Lemire 2021, "Number parsing at a gigabyte
// per second", Software: Practice and Experience 51(8), §5) converts a
// decimal significand of at most 19 digits and a power of ten to the
// correctly rounded float64 with one or two 64x128-bit multiplications by
// a truncated 128-bit approximation of the power of ten. It reports
// failure in the rare cases where the truncation leaves the rounding
// undecided (and for subnormal or overflowing results); the caller then
// falls back to strconv.

const (
	elMinExp = -348
	elMaxExp = 347
)

var (
	elOnce   sync.Once
	elPowers [elMaxExp - elMinExp + 1][2]uint64 // {lo, hi} of 10^e rounded down, top bit of hi set
)

// elTable computes the powers of ten exactly with math/big (once, on first
// use) and keeps their leading 128 bits, rounded down.
func elTable() {
	ten := big.NewInt(10)
	for e := elMinExp; e <= elMaxExp; e++ {
		var m big.Int
		if e >= 0 {
			m.Exp(ten, big.NewInt(int64(e)), nil)
			if l := m.BitLen(); l > 128 {
				m.Rsh(&m, uint(l-128))
			} else {
				m.Lsh(&m, uint(128-l))
			}
		} else {
			var d big.Int
			d.Exp(ten, big.NewInt(int64(-e)), nil)
			m.Lsh(big.NewInt(1), uint(127+d.BitLen()))
			m.Quo(&m, &d)
		}
		var lo big.Int
		lo.And(&m, new(big.Int).SetUint64(math.MaxUint64))
		m.Rsh(&m, 64)
		elPowers[e-elMinExp] = [2]uint64{lo.Uint64(), m.Uint64()}
	}
}

// eiselLemire returns man·10^exp10 correctly rounded, or ok = false when
// the fast method cannot decide. man must be non-zero.
func eiselLemire(man uint64, exp10 int, neg bool) (float64, bool) {
	if exp10 < elMinExp || exp10 > elMaxExp {
		return 0, false
	}
	elOnce.Do(elTable)
	pow := &elPowers[exp10-elMinExp]
	clz := bits.LeadingZeros64(man)
	man <<= uint(clz)
	// 217706/2^16 approximates log2(10); exact floor for |exp10| < 1500.
	exp2 := uint64(217706*exp10>>16+64+1023) - uint64(clz)
	hi, lo := bits.Mul64(man, pow[1])
	if hi&0x1ff == 0x1ff && lo+man < man {
		// The truncated product may be one short in its low bits:
		// refine with the next 64 bits of the power.
		yhi, ylo := bits.Mul64(man, pow[0])
		mhi, mlo := hi, lo+yhi
		if mlo < lo {
			mhi++
		}
		if mhi&0x1ff == 0x1ff && mlo+1 == 0 && ylo+man < man {
			return 0, false
		}
		hi, lo = mhi, mlo
	}
	msb := hi >> 63
	mant := hi >> (msb + 9)
	exp2 -= 1 ^ msb
	if lo == 0 && hi&0x1ff == 0 && mant&3 == 1 {
		return 0, false // exactly halfway: undecided
	}
	mant += mant & 1
	mant >>= 1
	if mant>>53 > 0 {
		mant >>= 1
		exp2++
	}
	if exp2-1 >= 0x7ff-1 {
		return 0, false // subnormal, zero or overflow
	}
	b := exp2<<52 | mant&(1<<52-1)
	if neg {
		b |= 1 << 63
	}
	return math.Float64frombits(b), true
}
