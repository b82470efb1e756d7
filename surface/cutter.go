package surface

import (
	"fmt"
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
	cm       field.CellMap // the inverse map of the cell being emitted
	cmOK     bool
}

func newCutter(l *field.Locator, f *Facets, spec string) *cutter {
	return &cutter{l: l, f: f, spec: spec, dim: f.Dim}
}

// facet cuts facet i, appending its pieces and points to r and its
// coverage account to cov.
func (c *cutter) facet(i int, r *chunkResult, cov *facetCover) error {
	v := c.f.Facet(i)
	n, area := facetGeom(c.dim, v)
	cov.area = area
	if area == 0 {
		return nil
	}
	nv := c.dim
	cen := centroid(v[:nv])
	cov.moment = scale(cen, area)
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
			c.clipRegion(v, n, area, c.reg.region(k), tol)
		}
		if len(c.ends) == 0 {
			continue
		}
		if len(c.ends) > 1 {
			c.merge(n)
		}
		c.cmOK = c.l.MapCell(ref, &c.cm)
		start := 0
		for k, end := range c.ends {
			poly, a := c.polys[start:end], c.areas[k]
			start = end
			covered.Add(a)
			pc := centroid(poly)
			if c.dim == 3 {
				pc = polygonCentroid(poly, n)
			}
			for j := 0; j < 3; j++ {
				mom[j].Add(a * pc[j])
			}
			if err := c.emit(i, ref, poly, n, a, r); err != nil {
				return err
			}
		}
	}
	cov.covered = covered.Value()
	cov.mCov = [3]float64{mom[0].Value(), mom[1].Value(), mom[2].Value()}
	return nil
}

// clipRegion clips facet v (normal n, area area) against one convex region
// and records the piece when it has area.
func (c *cutter) clipRegion(v [3][3]float64, n [3]float64, area float64, planes []halfSpace, tol float64) {
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
		c.b = clipPolygon(c.a, &planes[j], n, tol, c.b)
		c.a, c.b = c.b, c.a
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
	for _, p := range c.polys {
		q := sub(p, o)
		c.uv = append(c.uv, [2]float64{dot(q, e1), dot(q, e2)})
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

// emit appends the piece poly of facet i in cell ref and its quadrature
// points to r.
func (c *cutter) emit(i int, ref field.CellRef, poly [][3]float64, n [3]float64, a float64, r *chunkResult) error {
	p := Piece{Verts: r.keep(poly), N: n, Area: a, Cell: ref, First: int32(len(r.points))}
	if c.dim == 2 {
		d := sub(poly[1], poly[0])
		for _, q := range segRule {
			if err := c.point(i, ref, add(poly[0], scale(d, q.t)), q.w*a, n, r); err != nil {
				return err
			}
		}
	} else {
		var sum float64
		for k := 1; k+1 < len(poly); k++ {
			v0, v1, v2 := poly[0], poly[k], poly[k+1]
			ta := dot(cross(sub(v1, v0), sub(v2, v0)), n) / 2
			sum += ta
			for _, q := range triRule {
				x := add(add(scale(v0, q.l[0]), scale(v1, q.l[1])), scale(v2, q.l[2]))
				if err := c.point(i, ref, x, q.w*ta, n, r); err != nil {
					return err
				}
			}
		}
		p.Area = sum
	}
	p.Count = int32(len(r.points)) - p.First
	r.pieces = append(r.pieces, p)
	return nil
}

// point appends one quadrature point, located in cell ref or, failing
// that (rounding at the face of a warped cell), wherever the locator finds
// it.
func (c *cutter) point(i int, ref field.CellRef, x [3]float64, w float64, n [3]float64, r *chunkResult) error {
	var at field.Location
	ok := false
	if c.cmOK {
		at, ok = c.cm.Local(x)
	}
	if !ok {
		at, ok = c.l.Locate(x)
	}
	if !ok {
		return fmt.Errorf("surface %q: facet %d: quadrature point (%g, %g, %g) cut in cell %d of zone %d lies in no cell: %w", c.spec, i, x[0], x[1], x[2], ref.Cell, ref.Zone, errNoCell)
	}
	r.points = append(r.points, QuadPoint{X: x, W: w, N: n, At: at})
	return nil
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
