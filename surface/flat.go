package surface

import (
	"fmt"
	"math"

	"farforce/field"
)

// flatFactor is the default facet edge of flat shapes in units of the
// smallest size found on them: their facets need no refinement for
// accuracy (they are exact), only to keep the cells each facet overlaps
// few and the work balanced.
const flatFactor = 4

// flatSamples is the number of samples along an edge (and across a face)
// at which a flat shape looks up the size function.
const flatSamples = 16

// flatSize returns the edge length to subdivide a flat shape with: the
// resolution's size when set, else flatFactor times the smallest size
// function value over the sample points; +Inf (no splitting) when size is
// nil.
func flatSize(spec string, r Resolution, size SizeFunc, area, perFacet float64, samples func(yield func(p [3]float64) bool)) (float64, error) {
	if h := r.uniform(area, perFacet); h > 0 {
		if !finite(h) {
			return 0, fmt.Errorf("surface %q: facet size %g is not finite", spec, h)
		}
		return h, nil
	}
	if size == nil {
		return math.Inf(1), nil // unsplit: flat faces need no refinement
	}
	h := math.Inf(1)
	var err error
	samples(func(p [3]float64) bool {
		var v float64
		v, err = sizeAt(size, spec, p)
		if err != nil {
			return false
		}
		h = math.Min(h, v)
		return true
	})
	if err != nil {
		return 0, err
	}
	return flatFactor * h, nil
}

// divisions returns ceil(length/h), at least 1, or an error above
// MaxFacets.
func divisions(spec string, length, h float64) (int, error) {
	m := math.Ceil(length/h - 1e-9)
	if !(m < MaxFacets) {
		return 0, fmt.Errorf("surface %q: %.3g divisions of an edge exceeds the limit of %d facets; give a larger size=", spec, m, MaxFacets)
	}
	if m < 1 {
		m = 1
	}
	return int(m), nil
}

// appendGrid appends the parallelogram o + a u + b v, a, b in [0,1], as an
// mu × mv grid of quads split into two triangles each, oriented along
// u × v.
func appendGrid(f *Facets, o, u, v [3]float64, mu, mv int) {
	base := int32(len(f.Verts))
	for j := 0; j <= mv; j++ {
		b := float64(j) / float64(mv)
		for i := 0; i <= mu; i++ {
			a := float64(i) / float64(mu)
			var p [3]float64
			for k := 0; k < 3; k++ {
				p[k] = o[k] + a*u[k] + b*v[k]
			}
			f.Verts = append(f.Verts, p)
		}
	}
	id := func(i, j int) int32 { return base + int32(j*(mu+1)+i) }
	for j := 0; j < mv; j++ {
		for i := 0; i < mu; i++ {
			f.Index = append(f.Index, id(i, j), id(i+1, j), id(i+1, j+1), id(i, j), id(i+1, j+1), id(i, j+1))
		}
	}
}

// polyline2D returns the closed contour through pts (counter-clockwise,
// not repeating the first point) in the plane z, each edge cut into
// ceil(length/h) equal segments.
func polyline2D(spec string, pts [][2]float64, z, h float64) (*Facets, error) {
	f := &Facets{Dim: 2}
	total := 0
	ms := make([]int, len(pts))
	for i := range pts {
		a, b := pts[i], pts[(i+1)%len(pts)]
		m, err := divisions(spec, math.Hypot(b[0]-a[0], b[1]-a[1]), h)
		if err != nil {
			return nil, err
		}
		ms[i] = m
		total += m
	}
	if total > MaxFacets {
		return nil, fmt.Errorf("surface %q: %d segments exceeds the limit of %d facets; give a larger size=", spec, total, MaxFacets)
	}
	f.Verts = make([][3]float64, 0, total)
	for i := range pts {
		a, b := pts[i], pts[(i+1)%len(pts)]
		for k := 0; k < ms[i]; k++ {
			t := float64(k) / float64(ms[i])
			f.Verts = append(f.Verts, [3]float64{a[0] + t*(b[0]-a[0]), a[1] + t*(b[1]-a[1]), z})
		}
	}
	f.Index = make([]int32, 0, 2*total)
	for i := 0; i < total; i++ {
		f.Index = append(f.Index, int32(i), int32((i+1)%total))
	}
	return f, nil
}

// edgeSamples yields flatSamples+1 points along each edge of a closed 2D
// contour in the plane z.
func edgeSamples(pts [][2]float64, z float64) func(yield func(p [3]float64) bool) {
	return func(yield func(p [3]float64) bool) {
		for i := range pts {
			a, b := pts[i], pts[(i+1)%len(pts)]
			for k := 0; k <= flatSamples; k++ {
				t := float64(k) / flatSamples
				if !yield([3]float64{a[0] + t*(b[0]-a[0]), a[1] + t*(b[1]-a[1]), z}) {
					return
				}
			}
		}
	}
}

// perimeter returns the length of the closed contour through pts.
func perimeter(pts [][2]float64) float64 {
	var s field.CompensatedSum
	for i := range pts {
		a, b := pts[i], pts[(i+1)%len(pts)]
		s.Add(math.Hypot(b[0]-a[0], b[1]-a[1]))
	}
	return s.Value()
}
