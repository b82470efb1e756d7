// Package fieldtest builds meshes and fields with known answers for tests:
// structured boxes of hexahedra or tetrahedra, rectangles of quads or
// triangles, bodies carved out of them, and arrays sampled from closed-form
// functions. It is imported only by tests.
package fieldtest

import (
	"math"

	"farforce/field"
)

// BoxHex returns a zone of n[0]×n[1]×n[2] hexahedra filling the box [lo,hi],
// with points numbered x fastest. Nodes of each hexahedron follow the VTK
// order.
func BoxHex(lo, hi [3]float64, n [3]int) *field.Zone {
	z := &field.Zone{Name: "box"}
	boxPoints(z, lo, hi, n)
	boxHexes(n, func(_, _ int, v [8]int32) { z.AddCell(field.Hexa, v[:]...) })
	return z
}

// BoxTet returns the box [lo,hi] as n[0]×n[1]×n[2] cubes, each split into six
// tetrahedra around its main diagonal (Kuhn's subdivision), which is
// conforming across neighbouring cubes.
func BoxTet(lo, hi [3]float64, n [3]int) *field.Zone {
	z := &field.Zone{Name: "box"}
	boxPoints(z, lo, hi, n)
	id := pointIndexer(n)
	// The six permutations of the axes give the six Kuhn simplices.
	perms := [6][3]int{{0, 1, 2}, {0, 2, 1}, {1, 0, 2}, {1, 2, 0}, {2, 0, 1}, {2, 1, 0}}
	for k := 0; k < n[2]; k++ {
		for j := 0; j < n[1]; j++ {
			for i := 0; i < n[0]; i++ {
				for _, p := range perms {
					c := [3]int{i, j, k}
					var nodes [4]int32
					nodes[0] = id(c[0], c[1], c[2])
					for s := 0; s < 3; s++ {
						c[p[s]]++
						nodes[s+1] = id(c[0], c[1], c[2])
					}
					orientTet(z, &nodes)
					z.AddCell(field.Tetra, nodes[:]...)
				}
			}
		}
	}
	return z
}

// RectQuad returns a zone of n[0]×n[1] quads filling [lo,hi] in the plane
// z = 0.
func RectQuad(lo, hi [2]float64, n [2]int) *field.Zone {
	z := &field.Zone{Name: "rect"}
	boxPoints(z, [3]float64{lo[0], lo[1], 0}, [3]float64{hi[0], hi[1], 0}, [3]int{n[0], n[1], 0})
	rectQuads(n, func(_, _ int, v [4]int32) { z.AddCell(field.Quad, v[:]...) })
	return z
}

// RectTri returns [lo,hi] as n[0]×n[1] squares in the plane z = 0, each split
// into two triangles, alternating the diagonal so that no direction is
// favoured.
func RectTri(lo, hi [2]float64, n [2]int) *field.Zone {
	z := &field.Zone{Name: "rect"}
	boxPoints(z, [3]float64{lo[0], lo[1], 0}, [3]float64{hi[0], hi[1], 0}, [3]int{n[0], n[1], 0})
	rectQuads(n, func(i, j int, v [4]int32) {
		a, b, c, d := v[0], v[1], v[2], v[3]
		if (i+j)%2 == 0 {
			z.AddCell(field.Triangle, a, b, c)
			z.AddCell(field.Triangle, a, c, d)
		} else {
			z.AddCell(field.Triangle, a, b, d)
			z.AddCell(field.Triangle, b, c, d)
		}
	})
	return z
}

// Annulus returns a polar O-grid of quads between radii r0 and r1 about
// (cx, cy) in the plane z = 0: nr cells across, nt around. Radial spacing is
// geometric so that cells stay near square.
func Annulus(cx, cy, r0, r1 float64, nr, nt int) *field.Zone {
	z := &field.Zone{Name: "annulus"}
	for _, r := range geometricRadii(r0, r1, nr) {
		for j := 0; j < nt; j++ {
			t := 2 * math.Pi * float64(j) / float64(nt)
			z.Points = append(z.Points, cx+r*math.Cos(t), cy+r*math.Sin(t), 0)
		}
	}
	id := func(i, j int) int32 { return int32(i*nt + j%nt) }
	for i := 0; i < nr; i++ {
		for j := 0; j < nt; j++ {
			z.AddCell(field.Quad, id(i, j), id(i+1, j), id(i+1, j+1), id(i, j+1))
		}
	}
	return z
}

// Carve returns a copy of z without the cells for which inside reports true
// at any node, and without the points no remaining cell uses. Arrays are not
// copied: sample them after carving.
func Carve(z *field.Zone, inside func(p [3]float64) bool) *field.Zone {
	out := &field.Zone{Name: z.Name}
	remap := make([]int32, z.NumPoints())
	for i := range remap {
		remap[i] = -1
	}
	var nodes []int32
	for c := 0; c < z.NumCells(); c++ {
		keep := true
		for _, p := range z.CellNodes(c) {
			if inside(z.Point(p)) {
				keep = false
				break
			}
		}
		if !keep {
			continue
		}
		nodes = nodes[:0]
		for _, p := range z.CellNodes(c) {
			if remap[p] < 0 {
				remap[p] = int32(out.NumPoints())
				out.Points = append(out.Points, z.Points[3*p:3*p+3]...)
			}
			nodes = append(nodes, remap[p])
		}
		out.AddCell(z.Types[c], nodes...)
	}
	return out
}

// OutsideBall returns an inside test for a ball of radius r about c, for
// Carve.
func OutsideBall(c [3]float64, r float64) func(p [3]float64) bool {
	return func(p [3]float64) bool {
		dx, dy, dz := p[0]-c[0], p[1]-c[1], p[2]-c[2]
		return dx*dx+dy*dy+dz*dz < r*r
	}
}

// SamplePoints adds an array of the given components at the points of z,
// with values f(x).
func SamplePoints(z *field.Zone, name string, comps int, f func(x [3]float64, dst []float64)) {
	n := z.NumPoints()
	a := field.Array{Name: name, Location: field.AtPoints, Components: comps, Data: make([]float64, n*comps)}
	for i := 0; i < n; i++ {
		f(z.Point(int32(i)), a.Data[i*comps:(i+1)*comps])
	}
	z.Arrays = append(z.Arrays, a)
}

// SampleCells adds an array of the given components at the cells of z, with
// values f at the volume (area) centroid of each cell: the point where a
// cell-centred solver's value sits, to second order, and the point the
// field sampler reads cell values at.
func SampleCells(z *field.Zone, name string, comps int, f func(x [3]float64, dst []float64)) {
	n := z.NumCells()
	a := field.Array{Name: name, Location: field.AtCells, Components: comps, Data: make([]float64, n*comps)}
	for c := 0; c < n; c++ {
		f(z.CellCentroid(c), a.Data[c*comps:(c+1)*comps])
	}
	z.Arrays = append(z.Arrays, a)
}

func boxPoints(z *field.Zone, lo, hi [3]float64, n [3]int) {
	for k := 0; k <= n[2]; k++ {
		for j := 0; j <= n[1]; j++ {
			for i := 0; i <= n[0]; i++ {
				z.Points = append(z.Points,
					lerp(lo[0], hi[0], i, n[0]), lerp(lo[1], hi[1], j, n[1]), lerp(lo[2], hi[2], k, n[2]))
			}
		}
	}
}

func lerp(a, b float64, i, n int) float64 {
	if n == 0 {
		return a
	}
	if i == n {
		return b
	}
	return a + (b-a)*float64(i)/float64(n)
}

func pointIndexer(n [3]int) func(i, j, k int) int32 {
	return func(i, j, k int) int32 { return int32(i + (n[0]+1)*(j+(n[1]+1)*k)) }
}

// boxHexes calls fn for each of the n[0]×n[1]×n[2] hexahedra of the point
// grid numbered by pointIndexer(n), x fastest, with the column indices i, j
// and the corner points v in VTK order.
func boxHexes(n [3]int, fn func(i, j int, v [8]int32)) {
	id := pointIndexer(n)
	for k := 0; k < n[2]; k++ {
		for j := 0; j < n[1]; j++ {
			for i := 0; i < n[0]; i++ {
				fn(i, j, [8]int32{id(i, j, k), id(i+1, j, k), id(i+1, j+1, k), id(i, j+1, k),
					id(i, j, k+1), id(i+1, j, k+1), id(i+1, j+1, k+1), id(i, j+1, k+1)})
			}
		}
	}
}

// rectQuads calls fn for each of the n[0]×n[1] squares of the planar point
// grid numbered by pointIndexer, x fastest, with the indices i, j and the
// corner points v counter-clockwise from (i, j).
func rectQuads(n [2]int, fn func(i, j int, v [4]int32)) {
	id := pointIndexer([3]int{n[0], n[1], 0})
	for j := 0; j < n[1]; j++ {
		for i := 0; i < n[0]; i++ {
			fn(i, j, [4]int32{id(i, j, 0), id(i+1, j, 0), id(i+1, j+1, 0), id(i, j+1, 0)})
		}
	}
}

// orientTet swaps two nodes if needed so that the tetrahedron has positive
// volume in the VTK sense.
func orientTet(z *field.Zone, n *[4]int32) {
	a, b, c, d := z.Point(n[0]), z.Point(n[1]), z.Point(n[2]), z.Point(n[3])
	var u, v, w [3]float64
	for k := 0; k < 3; k++ {
		u[k], v[k], w[k] = b[k]-a[k], c[k]-a[k], d[k]-a[k]
	}
	det := u[0]*(v[1]*w[2]-v[2]*w[1]) - u[1]*(v[0]*w[2]-v[2]*w[0]) + u[2]*(v[0]*w[1]-v[1]*w[0])
	if det < 0 {
		n[1], n[2] = n[2], n[1]
	}
}

// geometricRadii returns the n+1 radii from r0 to r1 in geometric
// progression, r_i = r0·(r1/r0)^(i/n), with the last one exactly r1;
// none for n < 0.
func geometricRadii(r0, r1 float64, n int) []float64 {
	if n < 0 {
		return nil
	}
	q := math.Pow(r1/r0, 1/float64(n))
	rs := make([]float64, n+1)
	for i := range rs {
		rs[i] = r0 * math.Pow(q, float64(i))
	}
	rs[n] = r1
	return rs
}
