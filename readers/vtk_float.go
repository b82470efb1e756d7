package readers

import (
	"math"
	"strconv"
)

// pow10 holds the powers of ten that float64 represents exactly.
var pow10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// parseNumber parses one ASCII token as a float64 without allocating.
// The grammar is a decimal number ([sign] digits [. digits] [e|E [sign]
// digits], with at least one digit in the mantissa) or nan, inf, infinity
// in any case with an optional sign (FORMATS.md §1.9; VTK's
// TestLegacyArrayInfNan). Hexadecimal floats and underscores, which
// strconv accepts, are rejected. When f32 is set the value is rounded to
// float32 as if parsed with bitSize 32. The result has the same bits as
// strconv.ParseFloat(tok, 64 or 32) for every token strconv accepts and
// this grammar allows; out-of-range values give ±Inf or ±0.
//
// Tokens of at most 19 significant digits are converted directly: with
// one exact multiplication or division by a power of ten when both are
// exact in float64 (Clinger 1990), else by the Eisel-Lemire method
// (vtk_lemire.go); longer tokens and the rare undecided cases go to
// strconv.
func parseNumber(tok []byte, f32 bool) (float64, bool) {
	i := 0
	neg := false
	if len(tok) > 0 && (tok[0] == '-' || tok[0] == '+') {
		neg = tok[0] == '-'
		i++
	}
	var m uint64
	nd, exp, digits := 0, 0, 0
	trunc := false
	for ; i < len(tok); i++ {
		d := tok[i] - '0'
		if d > 9 {
			break
		}
		digits++
		if m == 0 && d == 0 {
			continue
		}
		if nd < 19 {
			m = m*10 + uint64(d)
			nd++
		} else {
			exp++
			if d != 0 {
				trunc = true
			}
		}
	}
	if i < len(tok) && tok[i] == '.' {
		for i++; i < len(tok); i++ {
			d := tok[i] - '0'
			if d > 9 {
				break
			}
			digits++
			if m == 0 && d == 0 {
				exp--
				continue
			}
			if nd < 19 {
				m = m*10 + uint64(d)
				nd++
				exp--
			} else if d != 0 {
				trunc = true
			}
		}
	}
	if digits == 0 {
		return special(tok)
	}
	if i < len(tok) && (tok[i] == 'e' || tok[i] == 'E') {
		i++
		eneg := false
		if i < len(tok) && (tok[i] == '-' || tok[i] == '+') {
			eneg = tok[i] == '-'
			i++
		}
		if i == len(tok) {
			return 0, false
		}
		e := 0
		for ; i < len(tok); i++ {
			d := tok[i] - '0'
			if d > 9 {
				return 0, false
			}
			if e < 100000 {
				e = e*10 + int(d)
			}
		}
		if eneg {
			e = -e
		}
		exp += e
	}
	if i != len(tok) {
		return 0, false
	}
	var f float64
	switch {
	case m == 0:
		f = 0
	case !trunc && m < 1<<53 && exp >= -22 && exp <= 22:
		f = float64(m)
		if exp < 0 {
			f /= pow10[-exp]
		} else {
			f *= pow10[exp]
		}
	case !trunc:
		g, ok := eiselLemire(m, exp, false)
		if !ok {
			return slowParse(tok, f32)
		}
		f = g
	default:
		return slowParse(tok, f32)
	}
	if neg {
		f = -f
	}
	if f32 {
		return round32(f, tok), true
	}
	return f, true
}

// slowParse hands a validated decimal token to strconv.
func slowParse(tok []byte, f32 bool) (float64, bool) {
	f, err := strconv.ParseFloat(string(tok), 64)
	if err != nil && !isRange(err) {
		return 0, false
	}
	if f32 {
		return round32(f, tok), true
	}
	return f, true
}

func isRange(err error) bool {
	e, ok := err.(*strconv.NumError)
	return ok && e.Err == strconv.ErrRange
}

// round32 rounds the correctly rounded float64 f of tok to float32. This
// equals rounding tok directly unless f lies exactly halfway between two
// float32 values; that rare case is re-parsed with bitSize 32.
func round32(f float64, tok []byte) float64 {
	r := float32(f)
	if float64(r) == f || math.IsInf(f, 0) || math.IsNaN(f) {
		return float64(r)
	}
	toward := float32(math.Inf(1))
	if f < float64(r) {
		toward = float32(math.Inf(-1))
	}
	n := math.Nextafter32(r, toward)
	if (float64(r)+float64(n))/2 == f {
		g, _ := strconv.ParseFloat(string(tok), 32)
		return g
	}
	return float64(r)
}

// special parses nan, inf and infinity in any case with an optional sign.
func special(tok []byte) (float64, bool) {
	s := tok
	neg := false
	if len(s) > 0 && (s[0] == '-' || s[0] == '+') {
		neg = s[0] == '-'
		s = s[1:]
	}
	switch {
	case eqFold(s, "nan"):
		return math.NaN(), true
	case eqFold(s, "inf"), eqFold(s, "infinity"):
		if neg {
			return math.Inf(-1), true
		}
		return math.Inf(1), true
	}
	return 0, false
}

// eqFold reports whether b equals the lower-case word w ignoring ASCII case.
func eqFold(b []byte, w string) bool {
	if len(b) != len(w) {
		return false
	}
	for i := range b {
		if b[i]|0x20 != w[i] {
			return false
		}
	}
	return true
}
