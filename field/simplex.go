package field

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
