package surface

import (
	"fmt"
	"math"
)

// Cylinder is the closed circular cylinder of radius Radius and length
// Length (metres) about the axis through Center along Axis (any non-zero
// direction), closed by two flat end caps. It is tessellated as rings
// along the axis and concentric rings on the caps, joined by bands of
// triangles; the rim edges are kept sharp. Its area converges as O(h²).
type Cylinder struct {
	Center, Axis   [3]float64
	Radius, Length float64
	Res            Resolution
}

// Dim returns 3.
func (c Cylinder) Dim() int { return 3 }

// String returns the spec "cylinder center=X,Y,Z axis=X,Y,Z radius=R length=L [facets=N|size=H]".
func (c Cylinder) String() string {
	return "cylinder center=" + fvec(c.Center[:]...) + " axis=" + fvec(c.Axis[:]...) +
		" radius=" + fnum(c.Radius) + " length=" + fnum(c.Length) + c.Res.specFields()
}

// Pivot returns the centre of the cylinder (mid-way along the axis).
func (c Cylinder) Pivot() [3]float64 { return c.Center }

// Scaled returns the cylinder with k times the radius and the length.
func (c Cylinder) Scaled(k float64) Shape {
	checkScale(k)
	c.Radius *= k
	c.Length *= k
	return c
}

// ExactArea returns 2πR L + 2πR².
func (c Cylinder) ExactArea() float64 {
	return 2*math.Pi*c.Radius*c.Length + 2*math.Pi*c.Radius*c.Radius
}

// Resolution returns the facets=/size= setting.
func (c Cylinder) Resolution() Resolution { return c.Res }

// Tessellate returns the inscribed closed polyhedron. z is ignored.
func (c Cylinder) Tessellate(size SizeFunc, _ float64) (*Facets, error) {
	spec := c.String()
	if !(c.Radius > 0) || !(c.Length > 0) || !finite(c.Radius, c.Length) || !finite(c.Center[:]...) || !finite(c.Axis[:]...) || norm(c.Axis) == 0 {
		return nil, fmt.Errorf("surface %q: radius and length must be positive, centre and axis finite, axis non-zero", spec)
	}
	size, err := c.Res.sizer(spec, size, c.ExactArea(), 0.5)
	if err != nil {
		return nil, err
	}
	fr := newAxisFrame(c.Axis)
	R, L := c.Radius, c.Length
	// The profile runs from the bottom cap centre out to the rim, up the
	// side and in to the top cap centre; each straight part is graded.
	type part struct{ r0, s0, r1, s1 float64 }
	parts := []part{{0, -L / 2, R, -L / 2}, {R, -L / 2, R, L / 2}, {R, L / 2, 0, L / 2}}
	var rings []ring
	for pi, p := range parts {
		at := func(t float64) (r, s float64) {
			r, s = p.r0+t*(p.r1-p.r0), p.s0+t*(p.s1-p.s0)
			if t == 1 {
				r, s = p.r1, p.s1
			}
			return r, s
		}
		length := math.Hypot(p.r1-p.r0, p.s1-p.s0)
		ts, err := grade(spec, length, 1, func(t float64) (float64, error) {
			r, s := at(t)
			return ringSize(spec, size, fr, c.Center, r, s)
		})
		if err != nil {
			return nil, err
		}
		for i, t := range ts {
			if pi > 0 && i == 0 {
				continue // shared with the previous part
			}
			r, s := at(t)
			h, err := ringSize(spec, size, fr, c.Center, r, s)
			if err != nil {
				return nil, err
			}
			rings = append(rings, ring{r: r, s: s, n: ringCount(r, h)})
		}
	}
	return revolve(spec, fr, c.Center, rings)
}
