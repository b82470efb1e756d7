package field_test

import (
	"math"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// meshCase builds a zone of one cell type over the unit box (unit square in
// 2D) with n cells per axis.
type meshCase struct {
	name  string
	dim   int
	build func(n int) *field.Zone
}

var unitLo, unitHi = [3]float64{0, 0, 0}, [3]float64{1, 1, 1}

var meshCases = []meshCase{
	{"hexa", 3, func(n int) *field.Zone { return fieldtest.BoxHex(unitLo, unitHi, [3]int{n, n, n}) }},
	{"tetra", 3, func(n int) *field.Zone { return fieldtest.BoxTet(unitLo, unitHi, [3]int{n, n, n}) }},
	{"wedge", 3, func(n int) *field.Zone { return fieldtest.BoxWedge(unitLo, unitHi, [3]int{n, n, n}) }},
	{"pyramid", 3, func(n int) *field.Zone { return fieldtest.BoxPyramid(unitLo, unitHi, [3]int{n, n, n}) }},
	{"quad", 2, func(n int) *field.Zone { return fieldtest.RectQuad([2]float64{0, 0}, [2]float64{1, 1}, [2]int{n, n}) }},
	{"triangle", 2, func(n int) *field.Zone { return fieldtest.RectTri([2]float64{0, 0}, [2]float64{1, 1}, [2]int{n, n}) }},
}

// mustLocator builds a locator over the zones or fails the test.
func mustLocator(t testing.TB, zones ...*field.Zone) *field.Locator {
	t.Helper()
	for _, z := range zones {
		if err := z.Validate(); err != nil {
			t.Fatal(err)
		}
	}
	l, err := field.NewLocator(&field.Field{Zones: zones})
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// bruteLocate tries every indexable cell in (Zone, Cell) order: the
// reference answer for Locator.Locate.
func bruteLocate(l *field.Locator, p [3]float64) (field.Location, bool) {
	for zi, z := range l.Field().Zones {
		for c := range z.Types {
			if z.Types[c].Dim() != l.Dim() || (z.Blank != nil && z.Blank[c]) {
				continue
			}
			if loc, ok := l.InCell(field.CellRef{Zone: int32(zi), Cell: int32(c)}, p); ok {
				return loc, true
			}
		}
	}
	return field.Location{}, false
}

// observedOrder returns the least-squares slope of log(err) against log(h):
// the observed order of convergence (Roache 1998, "Verification and
// Validation in Computational Science and Engineering", ch. 5).
func observedOrder(h, err []float64) float64 {
	n := float64(len(h))
	var sx, sy, sxx, sxy float64
	for i := range h {
		x, y := math.Log(h[i]), math.Log(err[i])
		sx += x
		sy += y
		sxx += x * x
		sxy += x * y
	}
	return (n*sxy - sx*sy) / (n*sxx - sx*sx)
}
