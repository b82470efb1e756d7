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
const regionCacheSize = 512

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
		r.cache = make([]cellRegions, regionCacheSize)
	}
	h := (uint32(ref.Cell)*2654435761 ^ uint32(ref.Zone)*40503) >> 7
	cr := &r.cache[h&(regionCacheSize-1)]
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

// fill computes the regions of cell ref of z.
func (cr *cellRegions) fill(z *field.Zone, ref field.CellRef, dim int) {
	cr.ref, cr.filled = ref, true
	cr.planes, cr.start, cr.simp = cr.planes[:0], cr.start[:0], cr.simp[:0]
	cr.nodes = cr.nodes[:0]
	c := int(ref.Cell)
	lo := [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}
	hi := [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	var cen [3]float64
	for _, p := range z.CellNodes(c) {
		x := z.Point(p)
		cr.nodes = append(cr.nodes, x)
		cen = add(cen, x)
		for k := 0; k < 3; k++ {
			lo[k], hi[k] = min(lo[k], x[k]), max(hi[k], x[k])
		}
	}
	cr.scale = max(hi[0]-lo[0], hi[1]-lo[1], hi[2]-lo[2])
	cen = scale(cen, 1/float64(len(cr.nodes)))
	if cr.own = cr.ownFaces(z.Types[c], cen, dim); cr.own {
		return
	}
	cr.planes, cr.start = cr.planes[:0], cr.start[:0]
	cr.all = z.Simplices(c, cr.all[:0])
	for _, s := range cr.all {
		if degenerate(s, dim, cr.scale) {
			continue // a flat simplex bounds nothing and owns no area
		}
		cr.start = append(cr.start, len(cr.planes))
		cr.simp = append(cr.simp, s)
		if dim == 2 {
			cr.addEdges(s[:3], [][]int{{0, 1}, {1, 2}, {2, 0}})
		} else {
			cr.addFaces(s[:], [][]int{{0, 1, 2}, {0, 1, 3}, {0, 2, 3}, {1, 2, 3}})
		}
	}
	cr.start = append(cr.start, len(cr.planes))
}

// oneSide reports whether all points x lie farther than margin on the same
// side of the plane through o with unit normal n.
func oneSide(x [][3]float64, n, o [3]float64, margin float64) bool {
	above, below := true, true
	for _, p := range x {
		d := dot(n, sub(p, o))
		above = above && d > margin
		below = below && d < -margin
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
			// Newell's normal and the mean point of the face.
			var m, fc [3]float64
			for i, k := range f {
				p, q := r.nodes[k], r.nodes[f[(i+1)%len(f)]]
				m[0] += (p[1] - q[1]) * (p[2] + q[2])
				m[1] += (p[2] - q[2]) * (p[0] + q[0])
				m[2] += (p[0] - q[0]) * (p[1] + q[1])
				fc = add(fc, p)
			}
			h.m = unit(m)
			h.c = dot(h.m, scale(fc, 1/float64(len(f))))
		}
		if h.m == [3]float64{} {
			return false
		}
		if dot(h.m, cen)-h.c > 0 {
			h.m, h.c = scale(h.m, -1), -h.c
		}
		for _, k := range f {
			if math.Abs(dot(h.m, r.nodes[k])-h.c) > tol {
				return false // warped face
			}
		}
		for _, p := range r.nodes {
			if dot(h.m, p)-h.c > tol {
				return false // not convex
			}
		}
		r.planes = append(r.planes, h)
	}
	r.start = append(r.start, len(r.planes))
	return true
}

// addFaces appends the outward planes of the triangles of simplex s.
func (r *cellRegions) addFaces(s [][3]float64, faces [][]int) {
	cen := scale(add(add(s[0], s[1]), add(s[2], s[3])), 0.25)
	for _, f := range faces {
		a := s[f[0]]
		m := unit(cross(sub(s[f[1]], a), sub(s[f[2]], a)))
		c := dot(m, a)
		if dot(m, cen)-c > 0 {
			m, c = scale(m, -1), -c
		}
		r.planes = append(r.planes, halfSpace{m, c})
	}
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
		r.planes = append(r.planes, halfSpace{m, c})
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
	return math.Abs(dot(cross(u, v), sub(s[3], s[0]))) <= 1e-14*size*size*size
}
