package surface

import (
	"math"

	"farforce/field"
)

// regions holds the convex regions of one cell against which facets are
// clipped, for the facet at hand: region k is the intersection of the
// planes of the cell's region sel[k]. It is the reusable scratch state of
// one worker, with a direct-mapped cache of the regions of recently cut
// cells (neighbouring facets cross the same cells; the regions depend only
// on the cell, so the cache does not change any result).
type regions struct {
	cache []cellRegions
	cur   *cellRegions
	sel   []int
	scale float64 // largest extent of the cell's bounding box
}

// regionCacheSize is the number of cells whose regions a worker keeps (a
// power of two).
const regionCacheSize = 4096

// cellRegions are the regions of one cell: region k is the intersection of
// planes[start[k]:start[k+1]]; simp[k] holds the vertices of region k when
// the cell is split into simplices (own is false).
type cellRegions struct {
	ref    field.CellRef
	filled bool
	own    bool
	scale  float64
	nodes  [][3]float64
	planes []halfSpace
	start  []int
	simp   [][4][3]float64
	all    [][4][3]float64 // scratch: all simplices of the cell
}

// planarTol is the relative tolerance (to the cell size) within which a
// face counts as planar and a cell as convex, so that it is clipped
// against its own faces instead of its simplices.
const planarTol = 1e-12

// offPlane is the distance, relative to the cell size, by which a cell or
// simplex must lie on one side of a facet's plane to be skipped without
// clipping. Clipping keeps points within 1e-10 of the cell size of a face
// plane; a region this far from the plane could yield a piece only if its
// corners were sharper than about 1e-4 rad.
const offPlane = 1e-6

// build selects the regions of cell c of z in dimension dim that the plane
// (line in 2D) n·x = n·o of a facet through o with unit normal n crosses:
// the cell itself when it is a simplex or a convex cell with planar faces,
// else those of its conforming simplices (field.Zone.Simplices) that are
// not degenerate and reach the plane. It returns false, with no regions,
// when all the cell's nodes lie on one side of the plane: the facet then
// has no piece in the cell.
func (r *regions) build(z *field.Zone, ref field.CellRef, dim int, n, o [3]float64) bool {
	if r.cache == nil {
		r.alloc()
	}
	cr := &r.cache[cellHash(ref)&(regionCacheSize-1)]
	if !cr.filled || cr.ref != ref {
		cr.fill(z, ref, dim)
	}
	r.cur, r.scale, r.sel = cr, cr.scale, r.sel[:0]
	margin := offPlane * cr.scale
	if oneSide(cr.nodes, n, o, margin) {
		return false
	}
	for k := 0; k+1 < len(cr.start); k++ {
		if cr.own || !oneSide(cr.simp[k][:dim+1], n, o, margin) {
			r.sel = append(r.sel, k)
		}
	}
	return true
}

// alloc makes the cache, with room in each entry for the regions of a
// hexahedron (carved from three blocks: a few allocations, not thousands);
// a cell needing more grows its entry's slices alone.
func (r *regions) alloc() {
	const nodes, planes = 8, 6
	r.cache = make([]cellRegions, regionCacheSize)
	nb := make([][3]float64, regionCacheSize*nodes)
	pb := make([]halfSpace, regionCacheSize*planes)
	sb := make([]int, regionCacheSize*2)
	for k := range r.cache {
		cr := &r.cache[k]
		cr.nodes = nb[k*nodes : k*nodes : (k+1)*nodes]
		cr.planes = pb[k*planes : k*planes : (k+1)*planes]
		cr.start = sb[2*k : 2*k : 2*k+2]
	}
}

// cellHash returns a hash of ref for the direct-mapped cell caches.
func cellHash(ref field.CellRef) uint32 {
	return (uint32(ref.Cell)*2654435761 ^ uint32(ref.Zone)*40503) >> 7
}

// fill computes the regions of cell ref of z.
func (cr *cellRegions) fill(z *field.Zone, ref field.CellRef, dim int) {
	cr.ref, cr.filled = ref, true
	cr.planes, cr.start, cr.simp = cr.planes[:0], cr.start[:0], cr.simp[:0]
	cr.nodes = cr.nodes[:0]
	c := int(ref.Cell)
	// Bounding box and node mean, by component (see radonPoints).
	lo0, lo1, lo2 := math.Inf(1), math.Inf(1), math.Inf(1)
	hi0, hi1, hi2 := math.Inf(-1), math.Inf(-1), math.Inf(-1)
	var c0, c1, c2 float64
	for _, p := range z.CellNodes(c) {
		x := z.Point(p)
		cr.nodes = append(cr.nodes, x)
		c0, c1, c2 = c0+x[0], c1+x[1], c2+x[2]
		lo0, hi0 = min(lo0, x[0]), max(hi0, x[0])
		lo1, hi1 = min(lo1, x[1]), max(hi1, x[1])
		lo2, hi2 = min(lo2, x[2]), max(hi2, x[2])
	}
	cr.scale = max(hi0-lo0, hi1-lo1, hi2-lo2)
	inv := 1 / float64(len(cr.nodes))
	cen := [3]float64{c0 * inv, c1 * inv, c2 * inv}
	if cr.own = cr.ownFaces(z.Types[c], cen, dim); cr.own {
		return
	}
	cr.planes, cr.start = cr.planes[:0], cr.start[:0]
	cr.all = z.Simplices(c, cr.all[:0])
	if n := len(cr.all); cap(cr.simp) < n {
		// Grow the entry once for all its simplices.
		cr.simp = make([][4][3]float64, 0, n)
		cr.start = make([]int, 0, n+1)
		cr.planes = make([]halfSpace, 0, (dim+1)*n)
	}
	for _, s := range cr.all {
		if degenerate(s, dim, cr.scale) {
			continue // a flat simplex bounds nothing and owns no area
		}
		cr.start = append(cr.start, len(cr.planes))
		cr.simp = append(cr.simp, s)
		if dim == 2 {
			cr.addEdges(s[:3], [][]int{{0, 1}, {1, 2}, {2, 0}})
		} else {
			cr.addFaces(&s)
		}
	}
	cr.start = append(cr.start, len(cr.planes))
}

// oneSide reports whether all points x lie farther than margin on the same
// side of the plane through o with unit normal n.
func oneSide(x [][3]float64, n, o [3]float64, margin float64) bool {
	above, below := true, true
	for i := range x {
		p := &x[i]
		d := n[0]*(p[0]-o[0]) + n[1]*(p[1]-o[1]) + n[2]*(p[2]-o[2]) // dot(n, p - o)
		above = above && d > margin
		below = below && d < -margin
		if !above && !below {
			return false
		}
	}
	return above || below
}

// ownFaces tries to make the cell one region bounded by its own faces:
// it succeeds when every face is planar and every node lies on the inner
// side of every face (within planarTol of the cell size).
func (r *cellRegions) ownFaces(t field.CellType, cen [3]float64, dim int) bool {
	faces := t.Faces()
	if faces == nil || t.Dim() != dim {
		return false
	}
	r.start = append(r.start, 0)
	tol := planarTol * r.scale
	for _, f := range faces {
		var h halfSpace
		if dim == 2 {
			a, b := r.nodes[f[0]], r.nodes[f[1]]
			h.m = unit([3]float64{b[1] - a[1], a[0] - b[0], 0})
			h.c = dot(h.m, a)
		} else {
			// Newell's normal and the mean point of the face, by
			// component.
			var m0, m1, m2, f0, f1, f2 float64
			for i, k := range f {
				next := i + 1
				if next == len(f) {
					next = 0
				}
				p, q := &r.nodes[k], &r.nodes[f[next]]
				m0 += (p[1] - q[1]) * (p[2] + q[2])
				m1 += (p[2] - q[2]) * (p[0] + q[0])
				m2 += (p[0] - q[0]) * (p[1] + q[1])
				f0, f1, f2 = f0+p[0], f1+p[1], f2+p[2]
			}
			m0, m1, m2 = unit3(m0, m1, m2)
			h.m = [3]float64{m0, m1, m2}
			inv := 1 / float64(len(f))
			h.c = h.m[0]*(f0*inv) + h.m[1]*(f1*inv) + h.m[2]*(f2*inv)
		}
		if h.m == [3]float64{} {
			return false
		}
		if dot(h.m, cen)-h.c > 0 {
			h.m, h.c = scale(h.m, -1), -h.c
		}
		m0, m1, m2, hc := h.m[0], h.m[1], h.m[2], h.c
		var onFace uint64
		for _, k := range f {
			p := &r.nodes[k]
			if math.Abs(m0*p[0]+m1*p[1]+m2*p[2]-hc) > tol {
				return false // warped face
			}
			onFace |= 1 << uint(k)
		}
		for k := range r.nodes {
			// The face's own nodes passed the stricter test above.
			p := &r.nodes[k]
			if onFace&(1<<uint(k)) == 0 && m0*p[0]+m1*p[1]+m2*p[2]-hc > tol {
				return false // not convex
			}
		}
		r.planes = append(r.planes, makeHalfSpace(h.m, h.c))
	}
	r.start = append(r.start, len(r.planes))
	return true
}

// addFaces appends the outward planes of the triangles of simplex s.
// The arithmetic, written out by component (see radonPoints), is that of
// m = unit(cross(b - a, c - a)), c = m·a for face (a, b, c), the centroid
// scale(add(add(s0, s1), add(s2, s3)), 0.25), and m, c = scale(m, -1), -c.
func (r *cellRegions) addFaces(s *[4][3]float64) {
	var cen [3]float64
	for i := range cen {
		cen[i] = ((s[0][i] + s[1][i]) + (s[2][i] + s[3][i])) * 0.25
	}
	for _, f := range tetFaces {
		a, b, c := &s[f[0]], &s[f[1]], &s[f[2]]
		ux, uy, uz := b[0]-a[0], b[1]-a[1], b[2]-a[2]
		vx, vy, vz := c[0]-a[0], c[1]-a[1], c[2]-a[2]
		m0, m1, m2 := unit3(uy*vz-uz*vy, uz*vx-ux*vz, ux*vy-uy*vx)
		hc := m0*a[0] + m1*a[1] + m2*a[2]
		if m0*cen[0]+m1*cen[1]+m2*cen[2]-hc > 0 {
			m0, m1, m2, hc = m0*-1, m1*-1, m2*-1, -hc
		}
		r.planes = append(r.planes, makeHalfSpace([3]float64{m0, m1, m2}, hc))
	}
}

// tetFaces are the faces of a tetrahedron by node index.
var tetFaces = [4][3]int{{0, 1, 2}, {0, 1, 3}, {0, 2, 3}, {1, 2, 3}}

// unit3 returns unit([3]float64{x, y, z}) by component.
func unit3(x, y, z float64) (float64, float64, float64) {
	l := math.Sqrt(x*x + y*y + z*z)
	if l == 0 {
		return x, y, z
	}
	k := 1 / l
	return x * k, y * k, z * k
}

// addEdges appends the outward in-plane lines of the edges of triangle s.
func (r *cellRegions) addEdges(s [][3]float64, edges [][]int) {
	cen := scale(add(add(s[0], s[1]), s[2]), 1.0/3)
	for _, e := range edges {
		a, b := s[e[0]], s[e[1]]
		m := unit([3]float64{b[1] - a[1], a[0] - b[0], 0})
		c := dot(m, a)
		if dot(m, cen)-c > 0 {
			m, c = scale(m, -1), -c
		}
		r.planes = append(r.planes, makeHalfSpace(m, c))
	}
}

// len returns the number of selected regions.
func (r *regions) len() int { return len(r.sel) }

// region returns the planes of selected region k.
func (r *regions) region(k int) []halfSpace {
	j := r.sel[k]
	return r.cur.planes[r.cur.start[j]:r.cur.start[j+1]]
}

// degenerate reports whether simplex s (a triangle in 2D) has no volume
// (area) relative to the cell size.
func degenerate(s [4][3]float64, dim int, size float64) bool {
	u, v := sub(s[1], s[0]), sub(s[2], s[0])
	if dim == 2 {
		return math.Abs(u[0]*v[1]-u[1]*v[0]) <= 1e-14*size*size
	}
	// dot(cross(u, v), s3 - s0) by component.
	w0, w1, w2 := s[3][0]-s[0][0], s[3][1]-s[0][1], s[3][2]-s[0][2]
	return math.Abs((u[1]*v[2]-u[2]*v[1])*w0+(u[2]*v[0]-u[0]*v[2])*w1+(u[0]*v[1]-u[1]*v[0])*w2) <= 1e-14*size*size*size
}
