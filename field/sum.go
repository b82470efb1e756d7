package field

import "math"

// CompensatedSum is a running sum with Neumaier's compensation (Neumaier
// 1974, "Rundungsfehleranalyse einiger Verfahren zur Summation endlicher
// Summen", ZAMM 54:39–51): it carries the rounding error of each addition,
// so Value is accurate to about one rounding of the exact sum whatever the
// order of magnitude of the terms. Far-field forces are small differences
// of large fluxes, and areas and closures are sums of many small facets;
// every such sum in farforce uses this type. The zero value is an empty
// sum. It is not safe for concurrent use; give each worker its own and
// Merge them in a fixed order for results independent of the split.
type CompensatedSum struct{ s, c float64 }

// Add adds x to the sum.
func (a *CompensatedSum) Add(x float64) {
	t := a.s + x
	if math.Abs(a.s) >= math.Abs(x) {
		a.c += (a.s - t) + x
	} else {
		a.c += (x - t) + a.s
	}
	a.s = t
}

// Merge adds another compensated sum: its running sum, then its
// compensation.
func (a *CompensatedSum) Merge(b CompensatedSum) {
	a.Add(b.s)
	a.Add(b.c)
}

// Value returns the compensated sum.
func (a CompensatedSum) Value() float64 { return a.s + a.c }
