package surface

import (
	"math"

	"farforce/field"
)

// regions holds the convex regions of one cell against which facets are
// clipped: region k is the intersection of planes[start[k]:start[k+1]].
// It is a reusable scratch buffer of one worker.
type regions struct {
	planes []halfSpace
	start  []int
	simp   [][4][3]float64
	nodes  [][3]float64
	scale  float64 // largest extent of the cell's bounding box
}

// planarTol is the relative tolerance (to the cell size) within which a
// face counts as planar and a cell as convex, so that it is clipped
// against its own faces instead of its simplices.
const planarTol = 1e-12

// build fills r with the regions of cell c of z in dimension dim: the cell
// itself when it is a simplex or a convex cell with planar faces, else its
// conforming simplices (field.Zone.Simplices).
func (r *regions) build(z *field.Zone, c int, dim int) {
	r.planes, r.start = r.planes[:0], r.start[:0]
	r.nodes = r.nodes[:0]
	lo := [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}
	hi := [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	var cen [3]float64
	for _, p := range z.CellNodes(c) {
		x := z.Point(p)
		r.nodes = append(r.nodes, x)
		cen = add(cen, x)
		for k := 0; k < 3; k++ {
			lo[k], hi[k] = math.Min(lo[k], x[k]), math.Max(hi[k], x[k])
		}
	}
	cen = scale(cen, 1/float64(len(r.nodes)))
	r.scale = math.Max(hi[0]-lo[0], math.Max(hi[1]-lo[1], hi[2]-lo[2]))
	if r.ownFaces(z.Types[c], cen, dim) {
		return
	}
	r.planes, r.start = r.planes[:0], r.start[:0]
	r.simp = z.Simplices(c, r.simp[:0])
	for _, s := range r.simp {
		if degenerate(s, dim, r.scale) {
			continue // a flat simplex bounds nothing and owns no area
		}
		r.start = append(r.start, len(r.planes))
		if dim == 2 {
			r.addEdges(s[:3], [][]int{{0, 1}, {1, 2}, {2, 0}})
		} else {
			r.addFaces(s[:], [][]int{{0, 1, 2}, {0, 1, 3}, {0, 2, 3}, {1, 2, 3}})
		}
	}
	r.start = append(r.start, len(r.planes))
}

// ownFaces tries to make the cell one region bounded by its own faces:
// it succeeds when every face is planar and every node lies on the inner
// side of every face (within planarTol of the cell size).
func (r *regions) ownFaces(t field.CellType, cen [3]float64, dim int) bool {
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
func (r *regions) addFaces(s [][3]float64, faces [][]int) {
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
func (r *regions) addEdges(s [][3]float64, edges [][]int) {
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

// len returns the number of regions.
func (r *regions) len() int { return len(r.start) - 1 }

// region returns the planes of region k.
func (r *regions) region(k int) []halfSpace { return r.planes[r.start[k]:r.start[k+1]] }

// degenerate reports whether simplex s (a triangle in 2D) has no volume
// (area) relative to the cell size.
func degenerate(s [4][3]float64, dim int, size float64) bool {
	u, v := sub(s[1], s[0]), sub(s[2], s[0])
	if dim == 2 {
		return math.Abs(u[0]*v[1]-u[1]*v[0]) <= 1e-14*size*size
	}
	return math.Abs(dot(cross(u, v), sub(s[3], s[0]))) <= 1e-14*size*size*size
}
