package surface

// halfSpace is the closed half-space m·x <= c with m a unit vector (the
// outward normal of a cell face); in 2D m lies in the plane.
type halfSpace struct {
	m [3]float64
	c float64
}

// coplanarTol is the bound on |m·n| below which a facet vertex lying on a
// clip plane is treated as a transversal crossing rather than as part of
// a facet lying in the plane.
const coplanarTol = 1e-12

// side classifies point p against h for a facet of unit normal n. It
// returns the signed distance d (0 when |d| <= tol, "on the plane") and
// whether p counts as inside. A point on the plane is inside when
// m·n >= -coplanarTol: the facet is treated as moved by an infinitesimal
// distance against its normal, so that of two cells sharing the plane the
// one on the inner side of the facet owns it, and never both.
func (h *halfSpace) side(p, n [3]float64, tol float64) (d float64, in bool) {
	d = dot(h.m, p) - h.c
	if d > tol {
		return d, false
	}
	if d < -tol {
		return d, true
	}
	return 0, dot(h.m, n) >= -coplanarTol
}

// crossing returns the point where edge p→q (distances dp, dq, one inside
// and one outside) meets the plane; a vertex on the plane is returned as
// it is.
func crossing(p, q [3]float64, dp, dq float64) [3]float64 {
	switch {
	case dp == 0:
		return p
	case dq == 0:
		return q
	}
	return lerp3(p, q, dp/(dp-dq))
}

// clipPolygon clips the convex polygon in (3D) against h
// (Sutherland–Hodgman), appending the result to out[:0]. n is the facet's
// unit normal, tol the distance below which a vertex is on the plane.
func clipPolygon(in []([3]float64), h *halfSpace, n [3]float64, tol float64, out [][3]float64) [][3]float64 {
	out = out[:0]
	if len(in) == 0 {
		return out
	}
	prev := in[len(in)-1]
	dPrev, inPrev := h.side(prev, n, tol)
	for _, cur := range in {
		dCur, inCur := h.side(cur, n, tol)
		if inCur != inPrev {
			x := crossing(prev, cur, dPrev, dCur)
			if len(out) == 0 || out[len(out)-1] != x {
				out = append(out, x)
			}
		}
		if inCur && (len(out) == 0 || out[len(out)-1] != cur) {
			out = append(out, cur)
		}
		prev, dPrev, inPrev = cur, dCur, inCur
	}
	for len(out) > 1 && out[0] == out[len(out)-1] {
		out = out[:len(out)-1]
	}
	return out
}

// clipSegment clips segment s (2D facet a→b) against h, returning false
// when nothing remains. n is the segment's unit normal.
func clipSegment(s *[2][3]float64, h *halfSpace, n [3]float64, tol float64) bool {
	da, ina := h.side(s[0], n, tol)
	db, inb := h.side(s[1], n, tol)
	switch {
	case ina && inb:
		return true
	case !ina && !inb:
		return false
	case ina:
		s[1] = crossing(s[0], s[1], da, db)
	default:
		s[0] = crossing(s[0], s[1], da, db)
	}
	return true
}

// polygonArea returns the area of the planar polygon v projected on the
// unit normal n: ½ Σ ((v_i - v_0) × (v_{i+1} - v_0)) · n, positive when v
// turns counter-clockwise about n.
func polygonArea(v [][3]float64, n [3]float64) float64 {
	var a float64
	for i := 1; i+1 < len(v); i++ {
		a += dot(cross(sub(v[i], v[0]), sub(v[i+1], v[0])), n)
	}
	return a / 2
}
