package surface

import "math"

// triRule is Radon's 7-point rule on a triangle, exact for polynomials of
// degree 5: barycentric coordinates and weights (summing to 1, to be
// multiplied by the triangle's area).
//
// Source: J. Radon, "Zur mechanischen Kubatur", Monatshefte für
// Mathematik 52 (1948) 286–300; the same points are the degree-5 rule of
// D. A. Dunavant, "High degree efficient symmetrical Gaussian quadrature
// rules for the triangle", Int. J. Numer. Meth. Eng. 21 (1985) 1129–1148,
// Table (p = 5, n = 7): a = (6 ∓ √15)/21, weights (155 ± √15)/1200 and
// 9/40 at the centroid. (From memory; the degree-5 exactness is checked by
// TestQuadratureExact through the Gauss divergence theorem.)
var triRule = radon7()

// triPoint is one point of a triangle rule: barycentric coordinates and
// weight.
type triPoint struct {
	l [3]float64
	w float64
}

func radon7() [7]triPoint {
	s := math.Sqrt(15)
	a1, a2 := (6-s)/21, (6+s)/21
	w1, w2 := (155-s)/1200, (155+s)/1200
	return [7]triPoint{
		{[3]float64{1.0 / 3, 1.0 / 3, 1.0 / 3}, 9.0 / 40},
		{[3]float64{a1, a1, 1 - 2*a1}, w1}, {[3]float64{a1, 1 - 2*a1, a1}, w1}, {[3]float64{1 - 2*a1, a1, a1}, w1},
		{[3]float64{a2, a2, 1 - 2*a2}, w2}, {[3]float64{a2, 1 - 2*a2, a2}, w2}, {[3]float64{1 - 2*a2, a2, a2}, w2},
	}
}

// segRule is the 3-point Gauss–Legendre rule on [0,1], exact for degree 5:
// nodes ½ ∓ ½√(3/5) and ½, weights 5/18, 8/18, 5/18 (Abramowitz & Stegun
// 1964, Table 25.4, n = 3, mapped from [-1,1]; from memory, checked by
// TestQuadratureExact2D).
var segRule = [3]struct{ t, w float64 }{
	{0.5 - math.Sqrt(0.6)/2, 5.0 / 18}, {0.5, 8.0 / 18}, {0.5 + math.Sqrt(0.6)/2, 5.0 / 18},
}
