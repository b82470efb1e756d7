package fieldtest

import (
	"math"
	"math/rand/v2"

	"farforce/field"
)

// Perturb moves every point of z that lies strictly inside the bounding box
// of z by a random offset, uniform in [-amp, amp] per coordinate (x and y
// only when z is planar), drawn from a PCG generator with the given seed.
// Points on the bounding box stay, so the domain keeps its shape. With amp
// below a quarter of the mesh spacing, cells stay valid (positive Jacobian).
func Perturb(z *field.Zone, amp float64, seed uint64) {
	lo, hi, dims := zoneBounds(z)
	rng := rand.New(rand.NewPCG(seed, 0x9e3779b97f4a7c15))
	for i := 0; i < len(z.Points); i += 3 {
		onBoundary := false
		for k := 0; k < dims; k++ {
			if z.Points[i+k] == lo[k] || z.Points[i+k] == hi[k] {
				onBoundary = true
			}
		}
		var d [3]float64
		for k := 0; k < dims; k++ {
			d[k] = amp * (2*rng.Float64() - 1)
		}
		if onBoundary {
			continue
		}
		for k := 0; k < dims; k++ {
			z.Points[i+k] += d[k]
		}
	}
}

// BoxWedge returns the box [lo,hi] as n[0]×n[1]×n[2] hexahedra, each split
// into two wedges (triangular prisms along z) by the diagonal of its
// xy faces, alternating the diagonal from column to column.
func BoxWedge(lo, hi [3]float64, n [3]int) *field.Zone {
	z := &field.Zone{Name: "box"}
	boxPoints(z, lo, hi, n)
	boxHexes(n, func(i, j int, v [8]int32) {
		a, b, c, d := v[0], v[1], v[2], v[3]
		A, B, C, D := v[4], v[5], v[6], v[7]
		if (i+j)%2 == 0 {
			z.AddCell(field.Wedge, a, b, c, A, B, C)
			z.AddCell(field.Wedge, a, c, d, A, C, D)
		} else {
			z.AddCell(field.Wedge, a, b, d, A, B, D)
			z.AddCell(field.Wedge, b, c, d, B, C, D)
		}
	})
	return z
}

// BoxPyramid returns the box [lo,hi] as n[0]×n[1]×n[2] cubes, each split
// into six pyramids whose bases are the cube faces and whose common apex is
// a point added at the cube centre.
func BoxPyramid(lo, hi [3]float64, n [3]int) *field.Zone {
	z := &field.Zone{Name: "box"}
	boxPoints(z, lo, hi, n)
	boxHexes(n, func(_, _ int, v [8]int32) {
		var c [3]float64
		for _, p := range v {
			q := z.Point(p)
			for m := 0; m < 3; m++ {
				c[m] += q[m] / 8
			}
		}
		apex := int32(z.NumPoints())
		z.Points = append(z.Points, c[0], c[1], c[2])
		for _, f := range field.Hexa.Faces() {
			z.AddCell(field.Pyramid, v[f[0]], v[f[1]], v[f[2]], v[f[3]], apex)
		}
	})
	return z
}

// Warp moves every point of z by a smooth displacement that vanishes on the
// bounding box of z: coordinate k moves by ±amp·Π_j sin(π ξ_j), with ξ_j the
// point's relative position along axis j (x and y only when z is planar).
// The result is a smoothly curved mesh, as body-fitted meshes are, on the
// same domain; amp below about a tenth of the box keeps cells valid.
func Warp(z *field.Zone, amp float64) {
	lo, hi, dims := zoneBounds(z)
	sign := [3]float64{1, -1, 1}
	for i := 0; i < len(z.Points); i += 3 {
		s := 1.0
		for j := 0; j < dims; j++ {
			s *= math.Sin(math.Pi * (z.Points[i+j] - lo[j]) / (hi[j] - lo[j]))
		}
		for k := 0; k < dims; k++ {
			z.Points[i+k] += sign[k] * amp * (hi[k] - lo[k]) * s
		}
	}
}

// zoneBounds returns the bounding box of z's points and the number of
// axes it spans: 2 when every point has the same z coordinate, else 3.
func zoneBounds(z *field.Zone) (lo, hi [3]float64, dims int) {
	lo, hi = (&field.Field{Zones: []*field.Zone{z}}).Bounds()
	dims = 3
	if lo[2] == hi[2] {
		dims = 2
	}
	return lo, hi, dims
}
