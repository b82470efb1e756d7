package surface

import (
	"math"
	"slices"

	"farforce/field"
)

// cutter is the scratch state of one CutSurface worker.
type cutter struct {
	l        *field.Locator
	f        *Facets
	spec     string
	dim      int
	reg      regions
	cells    []field.CellRef
	a, b     [][3]float64 // clip buffers
	polys    [][3]float64 // the pieces of the current cell, back to back
	ends     []int        // polys[ends[k-1]:ends[k]] is piece k
	areas    []float64
	hull     []int
	idx      []int
	uv       [][2]float64
	hullPoly [][3]float64
}

func newCutter(l *field.Locator, f *Facets, spec string) *cutter {
	return &cutter{l: l, f: f, spec: spec, dim: f.Dim}
}

// facet cuts facet i, appending its pieces to r and its coverage account
// to cov; the first moments of the account only when moments is set (they
// locate the gaps of a failed coverage check, see checkCover).
func (c *cutter) facet(i int, r *chunkResult, cov *facetCover, moments bool) {
	v := c.f.Facet(i)
	n, area := facetGeom(c.dim, v)
	cov.area = area
	if area == 0 {
		return
	}
	nv := c.dim
	if moments {
		cov.moment = scale(centroid(v[:nv]), area)
	}
	lo, hi := v[0], v[0]
	for _, p := range v[1:nv] {
		for k := 0; k < 3; k++ {
			lo[k], hi[k] = min(lo[k], p[k]), max(hi[k], p[k])
		}
	}
	pad := 1e-9 * max(hi[0]-lo[0], hi[1]-lo[1], hi[2]-lo[2])
	for k := 0; k < 3; k++ {
		lo[k], hi[k] = lo[k]-pad, hi[k]+pad
	}
	c.cells = c.l.CellsInBox(lo, hi, c.cells[:0])
	// Vertices this far from overflow stay finite through the clipping.
	bounded := true
	for _, p := range v {
		bounded = bounded && math.Abs(p[0]) < 1e300 && math.Abs(p[1]) < 1e300 && math.Abs(p[2]) < 1e300
	}
	var covered field.CompensatedSum
	var mom [3]field.CompensatedSum
	zones := c.l.Field().Zones
	for _, ref := range c.cells {
		if !c.reg.build(zones[ref.Zone], ref, c.dim, n, v[0]) {
			continue
		}
		tol := 1e-10 * c.reg.scale
		c.polys, c.ends, c.areas = c.polys[:0], c.ends[:0], c.areas[:0]
		for k := 0; k < c.reg.len(); k++ {
			c.clipRegion(v, n, area, c.reg.region(k), tol, bounded)
		}
		if len(c.ends) == 0 {
			continue
		}
		if len(c.ends) > 1 {
			c.merge(n)
		}
		start := 0
		for k, end := range c.ends {
			poly, a := c.polys[start:end], c.areas[k]
			start = end
			covered.Add(a)
			if moments {
				pc := centroid(poly)
				if c.dim == 3 {
					pc = polygonCentroid(poly, n)
				}
				for j := 0; j < 3; j++ {
					mom[j].Add(a * pc[j])
				}
			}
			c.emit(i, ref, poly, n, a, r)
		}
	}
	cov.covered = covered.Value()
	if moments {
		cov.mCov = [3]float64{mom[0].Value(), mom[1].Value(), mom[2].Value()}
	}
}

// clipRegion clips facet v (normal n, area area) against one convex region
// and records the piece when it has area; bounded says that the facet's
// coordinates are finite and far from overflow (see clipPolygon).
func (c *cutter) clipRegion(v [3][3]float64, n [3]float64, area float64, planes []halfSpace, tol float64, bounded bool) {
	if c.dim == 2 {
		s := [2][3]float64{v[0], v[1]}
		for j := range planes {
			if !clipSegment(&s, &planes[j], n, tol) {
				return
			}
		}
		d := unit(sub(v[1], v[0]))
		a := dot(sub(s[1], s[0]), d)
		if a > dropArea*area {
			c.polys = append(c.polys, s[0], s[1])
			c.ends = append(c.ends, len(c.polys))
			c.areas = append(c.areas, a)
		}
		return
	}
	c.a = append(c.a[:0], v[0], v[1], v[2])
	for j := range planes {
		if out, clipped := clipPolygon(c.a, &planes[j], n, tol, bounded, c.b); clipped {
			c.a, c.b = out, c.a
		}
		if len(c.a) < 3 {
			return
		}
	}
	a := polygonArea(c.a, n)
	if a > dropArea*area {
		c.polys = append(c.polys, c.a...)
		c.ends = append(c.ends, len(c.polys))
		c.areas = append(c.areas, a)
	}
}

// merge replaces the pieces of one cell (from its simplices) by their
// convex hull when the hull's area equals their total area to 1e-10
// relative, i.e. when they tile a convex polygon; otherwise it keeps them.
func (c *cutter) merge(n [3]float64) {
	var total float64
	for _, a := range c.areas {
		total += a
	}
	if c.dim == 2 {
		// Collinear sub-segments: merge when they tile one interval.
		d := unit(sub(c.polys[1], c.polys[0]))
		o := c.polys[0]
		lo, hi := math.Inf(1), math.Inf(-1)
		var plo, phi [3]float64
		for _, p := range c.polys {
			t := dot(sub(p, o), d)
			if t < lo {
				lo, plo = t, p
			}
			if t > hi {
				hi, phi = t, p
			}
		}
		if math.Abs((hi-lo)-total) <= 1e-10*total {
			c.polys = append(c.polys[:0], plo, phi)
			c.ends = append(c.ends[:0], 2)
			c.areas = append(c.areas[:0], hi-lo)
		}
		return
	}
	e1 := unit(cross(n, [3]float64{1, 0, 0}))
	if norm(cross(n, [3]float64{1, 0, 0})) < 0.5 {
		e1 = unit(cross(n, [3]float64{0, 1, 0}))
	}
	e2 := cross(n, e1)
	o := c.polys[0]
	c.uv = c.uv[:0]
	for i := range c.polys {
		p := &c.polys[i]
		q0, q1, q2 := p[0]-o[0], p[1]-o[1], p[2]-o[2] // dot(p - o, e) by component
		c.uv = append(c.uv, [2]float64{q0*e1[0] + q1*e1[1] + q2*e1[2], q0*e2[0] + q1*e2[1] + q2*e2[2]})
	}
	c.hull, c.idx = convexHull(c.uv, c.hull, c.idx)
	hullPoly := c.hullPoly[:0]
	for _, j := range c.hull {
		hullPoly = append(hullPoly, c.polys[j])
	}
	c.hullPoly = hullPoly
	a := polygonArea(hullPoly, n)
	if len(hullPoly) >= 3 && math.Abs(a-total) <= 1e-10*total {
		c.polys = append(c.polys[:0], hullPoly...)
		c.ends = append(c.ends[:0], len(hullPoly))
		c.areas = append(c.areas[:0], a)
	}
}

// convexHull returns in dst the indices of the convex hull of pts,
// counter-clockwise, without collinear points (Andrew's monotone chain).
// idx is scratch space, returned for reuse.
func convexHull(pts [][2]float64, dst, idx []int) ([]int, []int) {
	idx = idx[:0]
	for i := range pts {
		idx = append(idx, i)
	}
	slices.SortStableFunc(idx, func(a, b int) int {
		p, q := pts[a], pts[b]
		switch {
		case p[0] < q[0] || p[0] == q[0] && p[1] < q[1]:
			return -1
		case q[0] < p[0] || q[0] == p[0] && q[1] < p[1]:
			return 1
		}
		return 0
	})
	turn := func(o, a, b [2]float64) float64 {
		return (a[0]-o[0])*(b[1]-o[1]) - (a[1]-o[1])*(b[0]-o[0])
	}
	dst = dst[:0]
	for pass := 0; pass < 2; pass++ {
		base := len(dst)
		for _, i := range idx {
			for len(dst) >= base+2 && turn(pts[dst[len(dst)-2]], pts[dst[len(dst)-1]], pts[i]) <= 0 {
				dst = dst[:len(dst)-1]
			}
			dst = append(dst, i)
		}
		dst = dst[:len(dst)-1] // the last point starts the other chain
		for l, r := 0, len(idx)-1; l < r; l, r = l+1, r-1 {
			idx[l], idx[r] = idx[r], idx[l]
		}
	}
	return dst, idx
}

// emit appends the piece poly (area a, by the polygon formula) of facet i
// in cell ref to r, its vertices to r.verts: in 3D its area becomes the
// sum of its quadrature triangles (fanArea, as placer.piece weights them),
// and its Count that of the points placer.piece will write.
func (c *cutter) emit(i int, ref field.CellRef, poly [][3]float64, n [3]float64, a float64, r *chunkResult) {
	r.verts = append(r.verts, poly...)
	r.vend = append(r.vend, len(r.verts))
	p := Piece{N: n, Area: a, Cell: ref, First: int32(r.points)} // Verts: see compact
	if c.dim == 2 {
		p.Count = int32(len(segRule))
	} else {
		var sum float64
		for k := 1; k+1 < len(poly); k++ {
			sum += fanArea(poly, k, n)
		}
		p.Area = sum
		p.Count = int32(len(triRule) * (len(poly) - 2))
	}
	r.points += int(p.Count)
	r.pieces = append(r.pieces, p)
	r.facet = append(r.facet, int32(i))
}

// centroid returns the mean of the points.
func centroid(v [][3]float64) [3]float64 {
	var c [3]float64
	for _, p := range v {
		c = add(c, p)
	}
	return scale(c, 1/float64(len(v)))
}

// polygonCentroid returns the area centroid of the planar polygon v of
// unit normal n (the vertex mean when its area is zero).
func polygonCentroid(v [][3]float64, n [3]float64) [3]float64 {
	var c [3]float64
	var a float64
	for k := 1; k+1 < len(v); k++ {
		ta := dot(cross(sub(v[k], v[0]), sub(v[k+1], v[0])), n) / 2
		a += ta
		c = add(c, scale(add(add(v[0], v[k]), v[k+1]), ta/3))
	}
	if a == 0 {
		return centroid(v)
	}
	return scale(c, 1/a)
}
