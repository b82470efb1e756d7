package surface

// halfSpace is the closed half-space m·x <= c with m a unit vector (the
// outward normal of a cell face); in 2D m lies in the plane. axis is k
// when the other two components of m are zero (a face normal to axis k,
// common in structured meshes), else -1.
type halfSpace struct {
	m    [3]float64
	c    float64
	axis int
}

// makeHalfSpace returns the half-space m·x <= c with its axis set.
func makeHalfSpace(m [3]float64, c float64) halfSpace {
	h := halfSpace{m: m, c: c, axis: -1}
	switch {
	case m[1] == 0 && m[2] == 0:
		h.axis = 0
	case m[0] == 0 && m[2] == 0:
		h.axis = 1
	case m[0] == 0 && m[1] == 0:
		h.axis = 2
	}
	return h
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

// maxClipVerts bounds the polygons clipPolygon classifies on the stack: a
// triangle clipped by the k planes of a cell has at most 3 + k vertices.
const maxClipVerts = 16

// clipPolygon clips the convex polygon in (3D) against h
// (Sutherland–Hodgman), whose consecutive vertices (cyclically) differ. n
// is the facet's unit normal, tol the distance below which a vertex is on
// the plane. When every vertex is inside it returns in itself and false
// (the polygon is unchanged); otherwise it writes the clipped polygon, with
// the same property, to out[:0] and returns it and true. finite says that
// every coordinate of in is finite: then the distance to an axis-aligned
// plane is m_k x_k - c, which equals m·x - c as halfSpace.side computes it
// (the other terms are ±0, and a distance of ±0 counts as on the plane).
func clipPolygon(in []([3]float64), h *halfSpace, n [3]float64, tol float64, finite bool, out [][3]float64) ([][3]float64, bool) {
	out = out[:0]
	if len(in) == 0 {
		return out, true
	}
	var dBuf [maxClipVerts]float64
	var inBuf [maxClipVerts]bool
	var ds []float64
	var ins []bool
	if len(in) <= maxClipVerts {
		ds, ins = dBuf[:len(in)], inBuf[:len(in)]
	} else {
		ds, ins = make([]float64, len(in)), make([]bool, len(in))
	}
	if k := h.axis; finite && k >= 0 {
		mk := h.m[k]
		for i := range in {
			ds[i] = mk*in[i][k] - h.c
		}
	} else {
		for i := range in {
			ds[i] = dot(h.m, in[i]) - h.c
		}
	}
	// Classify as halfSpace.side does.
	nIn, onIn, onKnown := 0, false, false
	for i, d := range ds {
		switch {
		case d > tol:
		case d < -tol:
			ins[i] = true
			nIn++
		default:
			if !onKnown {
				onIn, onKnown = dot(h.m, n) >= -coplanarTol, true
			}
			ds[i], ins[i] = 0, onIn
			if onIn {
				nIn++
			}
		}
	}
	switch nIn {
	case len(in):
		return in, false
	case 0:
		return out, true
	}
	k := len(in) - 1
	prev, dPrev, inPrev := in[k], ds[k], ins[k]
	for i, cur := range in {
		dCur, inCur := ds[i], ins[i]
		if inCur != inPrev {
			x := prev
			switch {
			case dPrev == 0:
			case dCur == 0:
				x = cur
			default: // lerp3(prev, cur, t), by component
				t := dPrev / (dPrev - dCur)
				x = [3]float64{prev[0] + t*(cur[0]-prev[0]), prev[1] + t*(cur[1]-prev[1]), prev[2] + t*(cur[2]-prev[2])}
			}
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
	return out, true
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
	if len(v) < 3 {
		return 0
	}
	// dot(cross(v_i - v_0, v_{i+1} - v_0), n) by component.
	v0 := &v[0]
	for i := 1; i+1 < len(v); i++ {
		p, q := &v[i], &v[i+1]
		ax, ay, az := p[0]-v0[0], p[1]-v0[1], p[2]-v0[2]
		bx, by, bz := q[0]-v0[0], q[1]-v0[1], q[2]-v0[2]
		a += (ay*bz-az*by)*n[0] + (az*bx-ax*bz)*n[1] + (ax*by-ay*bx)*n[2]
	}
	return a / 2
}
