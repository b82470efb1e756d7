package field

import "math"

// Simplices appends to dst a decomposition of cell c of z into simplices and
// returns the extended slice: tetrahedra for volume cells, triangles (the
// fourth vertex left zero) for 2D cells.
//
// The decomposition is conforming across cells: a tetrahedron is kept as it
// is, and every other volume cell is split about its node centroid, each
// triangular face giving one tetrahedron and each quadrilateral face four,
// through the face's node centroid. Because a shared face is split the same
// way from both sides, the simplices of neighbouring cells meet face to
// face, so a surface clipped against them leaves neither gaps nor overlaps.
// A quad is split into four triangles about its centroid. Hexahedra give 24
// tetrahedra, wedges 14, pyramids 8.
//
// For a non-planar quadrilateral face the union of the simplices differs
// from the trilinear cell by a sliver of the order of the face warp; points
// inside the simplices still map into the parent cell through its own shape
// functions. Lines, vertices and polygons yield nothing.
func (z *Zone) Simplices(c int, dst [][4][3]float64) [][4][3]float64 {
	nodes := z.CellNodes(c)
	t := z.Types[c]
	switch t {
	case Triangle:
		return append(dst, [4][3]float64{z.Point(nodes[0]), z.Point(nodes[1]), z.Point(nodes[2])})
	case Quad:
		cen := z.centroid(nodes)
		for i := 0; i < 4; i++ {
			dst = append(dst, [4][3]float64{cen, z.Point(nodes[i]), z.Point(nodes[(i+1)%4])})
		}
		return dst
	case Tetra:
		return append(dst, [4][3]float64{z.Point(nodes[0]), z.Point(nodes[1]), z.Point(nodes[2]), z.Point(nodes[3])})
	case Hexa, Wedge, Pyramid:
		cen := z.centroid(nodes)
		var face [4]int32
		for _, f := range t.Faces() {
			for i, k := range f {
				face[i] = nodes[k]
			}
			if len(f) == 3 {
				dst = append(dst, [4][3]float64{cen, z.Point(face[0]), z.Point(face[1]), z.Point(face[2])})
				continue
			}
			fc := z.centroid(face[:4])
			for i := 0; i < 4; i++ {
				dst = append(dst, [4][3]float64{cen, fc, z.Point(face[i]), z.Point(face[(i+1)%4])})
			}
		}
		return dst
	}
	return dst
}

// centroid returns the mean of the given points of z.
func (z *Zone) centroid(nodes []int32) [3]float64 {
	var c [3]float64
	for _, n := range nodes {
		p := z.Point(n)
		c[0] += p[0]
		c[1] += p[1]
		c[2] += p[2]
	}
	inv := 1 / float64(len(nodes))
	return [3]float64{c[0] * inv, c[1] * inv, c[2] * inv}
}

// Centroid returns the mean of the nodes of cell c of z.
func (z *Zone) Centroid(c int) [3]float64 { return z.centroid(z.CellNodes(c)) }

// tetOutside reports whether p is clearly outside the tetrahedron g: some
// barycentric coordinate, computed from the signed volumes of p with each
// face, is below -1e-6. It is a quick, conservative rejection before the
// inverse map: it answers only for a well-shaped tetrahedron (volume
// determinant D at least 1e-3 h³, h the largest edge-vector component),
// where the rounding of both computations is far below the margin, so a
// point it rejects is one the inverse map (tolerance 1e-9) rejects too.
func (g *cellGeom) tetOutside(p [3]float64) bool {
	x0 := &g.x[0]
	var e1, e2, e3, b [3]float64
	for k := 0; k < 3; k++ {
		e1[k], e2[k], e3[k] = g.x[1][k]-x0[k], g.x[2][k]-x0[k], g.x[3][k]-x0[k]
		b[k] = p[k] - x0[k]
	}
	n1 := cross(e2, e3)
	D := e1[0]*n1[0] + e1[1]*n1[1] + e1[2]*n1[2]
	sig, ad := 1.0, D
	if D < 0 {
		sig, ad = -1, -D
	}
	m := -1e-6 * ad
	s1 := sig * (b[0]*n1[0] + b[1]*n1[1] + b[2]*n1[2])
	out := s1 < m
	if !out {
		n2 := cross(e3, e1)
		s2 := sig * (b[0]*n2[0] + b[1]*n2[1] + b[2]*n2[2])
		out = s2 < m
		if !out {
			n3 := cross(e1, e2)
			s3 := sig * (b[0]*n3[0] + b[1]*n3[1] + b[2]*n3[2])
			out = s3 < m || ad-s1-s2-s3 < m
		}
	}
	if !out {
		return false
	}
	// Trust the rejection only for a well-shaped tetrahedron.
	h := 0.0
	for k := 0; k < 3; k++ {
		h = max(h, math.Abs(e1[k]), math.Abs(e2[k]), math.Abs(e3[k]))
	}
	return ad >= 1e-3*h*h*h
}

// cross returns the cross product a × b.
func cross(a, b [3]float64) [3]float64 {
	return [3]float64{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}
