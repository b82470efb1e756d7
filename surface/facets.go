package surface

import (
	"math"

	"farforce/field"
)

// Facets is a tessellated closed surface: triangles in 3D (Dim 3) or
// segments in 2D (Dim 2), given by indices into Verts (3 or 2 per facet).
// Curved shapes store each vertex once, shared by the facets around it;
// box faces and split file facets repeat the vertices of their edges
// (computed to rounding on the same straight edge). Either way the facet
// area vectors cancel to rounding. Facets are oriented counter-clockwise
// seen from outside (see the package documentation).
type Facets struct {
	Dim   int
	Verts [][3]float64
	Index []int32
}

// Len returns the number of facets.
func (f *Facets) Len() int { return len(f.Index) / f.Dim }

// Facet returns the vertices of facet i (the third is zero in 2D).
func (f *Facets) Facet(i int) (v [3][3]float64) {
	for k := 0; k < f.Dim; k++ {
		v[k] = f.Verts[f.Index[f.Dim*i+k]]
	}
	return v
}

// facetGeom returns the unit outward normal and the area (length in 2D) of
// the facet with vertices v.
func facetGeom(dim int, v [3][3]float64) (n [3]float64, area float64) {
	if dim == 2 {
		d := sub(v[1], v[0])
		l := math.Hypot(d[0], d[1])
		if l == 0 {
			return n, 0
		}
		return [3]float64{d[1] / l, -d[0] / l, 0}, l
	}
	c := cross(sub(v[1], v[0]), sub(v[2], v[0]))
	l := norm(c)
	if l == 0 {
		return n, 0
	}
	return scale(c, 1/l), l / 2
}

// Measure returns the total area (length in 2D) and the closure vector
// Σ A_f n_f of the facets, summed in facet order with compensation.
func (f *Facets) Measure() (area float64, closure [3]float64) {
	var sa field.CompensatedSum
	var sc [3]field.CompensatedSum
	for i := 0; i < f.Len(); i++ {
		n, a := facetGeom(f.Dim, f.Facet(i))
		sa.Add(a)
		for k := range sc {
			sc[k].Add(a * n[k])
		}
	}
	return sa.Value(), [3]float64{sc[0].Value(), sc[1].Value(), sc[2].Value()}
}

// SignedVolume returns the volume (area in 2D) enclosed by the facets,
// positive when they are oriented outward: Σ (a · (b × c)) / 6 over
// triangles, Σ (a_x b_y - a_y b_x) / 2 over segments, taken about the
// first vertex to limit rounding.
func (f *Facets) SignedVolume() float64 {
	if len(f.Verts) == 0 {
		return 0
	}
	o := f.Verts[0]
	var s field.CompensatedSum
	for i := 0; i < f.Len(); i++ {
		v := f.Facet(i)
		a, b := sub(v[0], o), sub(v[1], o)
		if f.Dim == 2 {
			s.Add((a[0]*b[1] - a[1]*b[0]) / 2)
			continue
		}
		s.Add(dot(a, cross(b, sub(v[2], o))) / 6)
	}
	return s.Value()
}

// flip reverses the orientation of every facet.
func (f *Facets) flip() {
	for i := 0; i < f.Len(); i++ {
		j := f.Dim * i
		f.Index[j], f.Index[j+1] = f.Index[j+1], f.Index[j]
	}
}

// orientOutward flips f when its signed volume is negative.
func (f *Facets) orientOutward() {
	if f.SignedVolume() < 0 {
		f.flip()
	}
}
