package surface

import (
	"fmt"
	"math"
)

// Sphere is the sphere of radius Radius (metres) about Center. It is
// tessellated as latitude rings about the z axis joined by bands of
// triangles, with a single vertex at each pole; ring spacing and vertex
// counts follow the size function, so the polyhedron is inscribed in the
// sphere and closes exactly. Its area converges as O(h²).
type Sphere struct {
	Center [3]float64
	Radius float64
	Res    Resolution
}

// Dim returns 3.
func (s Sphere) Dim() int { return 3 }

// String returns the spec "sphere center=X,Y,Z radius=R [facets=N|size=H]".
func (s Sphere) String() string {
	return "sphere center=" + fvec(s.Center[:]...) + " radius=" + fnum(s.Radius) + s.Res.specFields()
}

// Pivot returns the centre of the sphere.
func (s Sphere) Pivot() [3]float64 { return s.Center }

// Scaled returns the sphere with k times the radius.
func (s Sphere) Scaled(k float64) Shape {
	checkScale(k)
	s.Radius *= k
	return s
}

// ExactArea returns 4πR².
func (s Sphere) ExactArea() float64 { return 4 * math.Pi * s.Radius * s.Radius }

// Resolution returns the facets=/size= setting.
func (s Sphere) Resolution() Resolution { return s.Res }

// Tessellate returns the inscribed polyhedron (about 8πR²/h² triangles for
// a uniform edge length h). z is ignored.
func (s Sphere) Tessellate(size SizeFunc, _ float64) (*Facets, error) {
	spec := s.String()
	if !(s.Radius > 0) || !finite(s.Radius) || !finite(s.Center[:]...) {
		return nil, fmt.Errorf("surface %q: radius must be positive and the centre finite", spec)
	}
	size, err := s.Res.sizer(spec, size, s.ExactArea(), 0.5)
	if err != nil {
		return nil, err
	}
	fr := axisFrame{e1: [3]float64{1, 0, 0}, e2: [3]float64{0, 1, 0}, a: [3]float64{0, 0, 1}}
	R := s.Radius
	hAt := func(theta float64) (float64, error) {
		return ringSize(spec, size, fr, s.Center, R*math.Sin(theta), R*math.Cos(theta))
	}
	ts, err := grade(spec, math.Pi*R, 2, func(t float64) (float64, error) { return hAt(math.Pi * t) })
	if err != nil {
		return nil, err
	}
	rings := make([]ring, len(ts))
	for i, t := range ts {
		th := math.Pi * t
		rg := ring{r: R * math.Sin(th), s: R * math.Cos(th), n: 1}
		switch i {
		case 0:
			rg.r, rg.s = 0, R
		case len(ts) - 1:
			rg.r, rg.s = 0, -R
		default:
			h, err := hAt(th)
			if err != nil {
				return nil, err
			}
			rg.n = ringCount(rg.r, h)
		}
		rings[i] = rg
	}
	return revolve(spec, fr, s.Center, rings)
}
