package fieldtest

import (
	"math"

	"farforce/field"
)

// WallSphere returns the surface of a sphere of radius a about c as a zone of
// 6·n² quads: the faces of the cube [-1,1]³ are split into n×n squares
// whose nodes are projected radially onto the sphere (an equiangular
// "cube sphere", so facet edges are of similar length everywhere, about
// π a/(2n)). Nodes shared between cube faces are stored once, so the surface
// is closed and manifold. Facet node order is counter-clockwise seen from
// outside, but callers under test should not rely on it.
//
// WallSphere panics if n < 1 (programmer error).
func WallSphere(c [3]float64, a float64, n int) *field.Zone {
	dirs, quads := cubeSphere(n)
	z := &field.Zone{Name: "sphere wall"}
	for _, d := range dirs {
		z.Points = append(z.Points, c[0]+a*d[0], c[1]+a*d[1], c[2]+a*d[2])
	}
	for _, q := range quads {
		z.AddCell(field.Quad, q[:]...)
	}
	return z
}

// WallShell returns the spherical shell a ≤ |x − c| ≤ b as a body-fitted
// volume mesh of 6·n²·nr hexahedra: the cube sphere of WallSphere extruded
// radially in nr layers of geometrically growing thickness (cells stay
// near cubic when b/a is large). The inner surface r = a is the wall of a
// sphere at c; the mesh conforms to it exactly at the nodes.
//
// WallShell panics if n < 1, nr < 1 or not 0 < a < b (programmer errors).
func WallShell(c [3]float64, a, b float64, n, nr int) *field.Zone {
	if nr < 1 || !(0 < a && a < b) {
		panic("fieldtest: WallShell needs nr >= 1 and 0 < a < b")
	}
	dirs, quads := cubeSphere(n)
	z := &field.Zone{Name: "sphere shell"}
	for _, r := range geometricRadii(a, b, nr) {
		for _, d := range dirs {
			z.Points = append(z.Points, c[0]+r*d[0], c[1]+r*d[1], c[2]+r*d[2])
		}
	}
	np := int32(len(dirs))
	for i := int32(0); i < int32(nr); i++ {
		for _, f := range quads {
			lo, hi := i*np, (i+1)*np
			z.AddCell(field.Hexa, f[0]+lo, f[1]+lo, f[2]+lo, f[3]+lo, f[0]+hi, f[1]+hi, f[2]+hi, f[3]+hi)
		}
	}
	return z
}

// cubeSphere returns the unit directions of the nodes of an equiangular
// cube sphere with n×n quads per cube face, and the quads (node indices,
// counter-clockwise seen from outside). It panics if n < 1.
func cubeSphere(n int) (dirs [][3]float64, quads [][4]int32) {
	if n < 1 {
		panic("fieldtest: cube sphere needs n >= 1")
	}
	ids := map[[3]int]int32{}
	// node returns the node at the integer cube lattice position q (each
	// component in [-n, n], one of them ±n), adding it on first use.
	node := func(q [3]int) int32 {
		if id, ok := ids[q]; ok {
			return id
		}
		var d [3]float64
		for k := 0; k < 3; k++ {
			// Equiangular spacing: tan of evenly spaced angles.
			d[k] = math.Tan(math.Pi / 4 * float64(q[k]) / float64(n))
		}
		r := math.Sqrt(d[0]*d[0] + d[1]*d[1] + d[2]*d[2])
		id := int32(len(dirs))
		dirs = append(dirs, [3]float64{d[0] / r, d[1] / r, d[2] / r})
		ids[q] = id
		return id
	}
	for axis := 0; axis < 3; axis++ {
		u, v := (axis+1)%3, (axis+2)%3 // (axis, u, v) is a right-handed cyclic triad
		for _, s := range []int{-1, 1} {
			for i := 0; i < n; i++ {
				for j := 0; j < n; j++ {
					corner := func(di, dj int) int32 {
						var q [3]int
						q[axis] = s * n
						q[u] = -n + 2*(i+di)
						q[v] = -n + 2*(j+dj)
						return node(q)
					}
					// Around (u, v) counter-clockwise; reversed on the
					// negative face so that every quad winds outward.
					a0, a1, a2, a3 := corner(0, 0), corner(1, 0), corner(1, 1), corner(0, 1)
					if s > 0 {
						quads = append(quads, [4]int32{a0, a1, a2, a3})
					} else {
						quads = append(quads, [4]int32{a0, a3, a2, a1})
					}
				}
			}
		}
	}
	return dirs, quads
}
