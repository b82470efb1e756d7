package integrate

import "math"

// neumaier is a compensated running sum (Neumaier 1974, "Rundungsfehleranalyse
// einiger Verfahren zur Summation endlicher Summen", ZAMM 54:39–51): s holds
// the sum and c the accumulated rounding error, so s + c is accurate to
// about one rounding of the exact sum for any order of magnitudes.
type neumaier struct{ s, c float64 }

// add adds x to the sum.
func (a *neumaier) add(x float64) {
	t := a.s + x
	if math.Abs(a.s) >= math.Abs(x) {
		a.c += (a.s - t) + x
	} else {
		a.c += (x - t) + a.s
	}
	a.s = t
}

// merge adds another compensated sum (its sum, then its compensation).
func (a *neumaier) merge(b neumaier) {
	a.add(b.s)
	a.add(b.c)
}

// value returns the compensated sum.
func (a neumaier) value() float64 { return a.s + a.c }
