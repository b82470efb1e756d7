package surface

import "fmt"

// Rect is the axis-aligned rectangle with corners Min and Max (metres) in
// the plane of a 2D field, traversed counter-clockwise. It is exact.
type Rect struct {
	Min, Max [2]float64
	Res      Resolution
}

// Dim returns 2.
func (r Rect) Dim() int { return 2 }

// String returns the spec "rect min=X,Y max=X,Y [facets=N|size=H]".
func (r Rect) String() string {
	return "rect min=" + fvec(r.Min[:]...) + " max=" + fvec(r.Max[:]...) + r.Res.specFields()
}

// Pivot returns the centre (z = 0).
func (r Rect) Pivot() [3]float64 {
	return [3]float64{(r.Min[0] + r.Max[0]) / 2, (r.Min[1] + r.Max[1]) / 2, 0}
}

// Scaled returns the rectangle scaled by k about its centre.
func (r Rect) Scaled(k float64) Shape {
	checkScale(k)
	c := r.Pivot()
	for i := 0; i < 2; i++ {
		h := (r.Max[i] - r.Min[i]) / 2 * k
		r.Min[i], r.Max[i] = c[i]-h, c[i]+h
	}
	return r
}

// ExactArea returns the perimeter 2(a + b).
func (r Rect) ExactArea() float64 { return 2 * (r.Max[0] - r.Min[0] + r.Max[1] - r.Min[1]) }

// Resolution returns the facets=/size= setting.
func (r Rect) Resolution() Resolution { return r.Res }

// corners returns the corners counter-clockwise from Min.
func (r Rect) corners() [][2]float64 {
	return [][2]float64{r.Min, {r.Max[0], r.Min[1]}, r.Max, {r.Min[0], r.Max[1]}}
}

// Tessellate returns the four sides in the plane z, split into segments.
func (r Rect) Tessellate(size SizeFunc, z float64) (*Facets, error) {
	spec := r.String()
	if !finite(r.Min[0], r.Min[1], r.Max[0], r.Max[1]) || !(r.Max[0] > r.Min[0]) || !(r.Max[1] > r.Min[1]) {
		return nil, fmt.Errorf("surface %q: corners must be finite and max must exceed min", spec)
	}
	pts := r.corners()
	h, err := flatSize(spec, r.Res, size, r.ExactArea(), 0, edgeSamples(pts, z))
	if err != nil {
		return nil, err
	}
	return polyline2D(spec, pts, z, h)
}
