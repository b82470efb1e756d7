package surface

import (
	"fmt"
	"math"
)

// Circle is the circle of radius Radius (metres) about Center in the plane
// of a 2D field. It is tessellated as an inscribed polygon, counter-
// clockwise, whose vertex spacing follows the size function; its length
// converges to 2πR as O(h²).
type Circle struct {
	Center [2]float64
	Radius float64
	Res    Resolution
}

// Dim returns 2.
func (c Circle) Dim() int { return 2 }

// String returns the spec "circle center=X,Y radius=R [facets=N|size=H]".
func (c Circle) String() string {
	return "circle center=" + fvec(c.Center[:]...) + " radius=" + fnum(c.Radius) + c.Res.specFields()
}

// Pivot returns the centre (z = 0).
func (c Circle) Pivot() [3]float64 { return [3]float64{c.Center[0], c.Center[1], 0} }

// Scaled returns the circle with k times the radius.
func (c Circle) Scaled(k float64) Shape {
	checkScale(k)
	c.Radius *= k
	return c
}

// ExactArea returns the circumference 2πR.
func (c Circle) ExactArea() float64 { return 2 * math.Pi * c.Radius }

// Resolution returns the facets=/size= setting.
func (c Circle) Resolution() Resolution { return c.Res }

// Tessellate returns the inscribed polygon in the plane z.
func (c Circle) Tessellate(size SizeFunc, z float64) (*Facets, error) {
	spec := c.String()
	if !(c.Radius > 0) || !finite(c.Radius, c.Center[0], c.Center[1]) {
		return nil, fmt.Errorf("surface %q: radius must be positive and the centre finite", spec)
	}
	size, err := c.Res.sizer(spec, size, c.ExactArea(), 0)
	if err != nil {
		return nil, err
	}
	at := func(phi float64) [3]float64 {
		return [3]float64{c.Center[0] + c.Radius*math.Cos(phi), c.Center[1] + c.Radius*math.Sin(phi), z}
	}
	ts, err := grade(spec, c.ExactArea(), 3, func(t float64) (float64, error) { return sizeAt(size, spec, at(2*math.Pi*t)) })
	if err != nil {
		return nil, err
	}
	n := len(ts) - 1
	f := &Facets{Dim: 2, Verts: make([][3]float64, n), Index: make([]int32, 0, 2*n)}
	for i := 0; i < n; i++ {
		f.Verts[i] = at(2 * math.Pi * ts[i])
		f.Index = append(f.Index, int32(i), int32((i+1)%n))
	}
	return f, nil
}
