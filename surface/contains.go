package surface

import "math"

// Inside tests of the shapes: whether a point lies in the region a shape
// encloses. 2D shapes (Circle, Rect, PolygonShape, 2D file contours)
// ignore the z coordinate. Points on the boundary may go either way. All
// methods are pure and safe for concurrent use.

// Contains reports whether p is inside the sphere (|p − Center| < Radius).
func (s Sphere) Contains(p [3]float64) bool {
	return norm(sub(p, s.Center)) < s.Radius
}

// Contains reports whether p is inside the box: its coordinates in the
// box's own axes (the inverse rotation about the centre) lie between Min
// and Max.
func (b Box) Contains(p [3]float64) bool {
	c := b.Pivot()
	d := sub(p, c)
	if b.Rotate != [3]float64{} {
		r := b.rotation() // p = c + R q: q = Rᵀ (p − c)
		var q [3]float64
		for i := 0; i < 3; i++ {
			q[i] = r[0][i]*d[0] + r[1][i]*d[1] + r[2][i]*d[2]
		}
		d = q
	}
	for i := 0; i < 3; i++ {
		if math.Abs(d[i]) >= (b.Max[i]-b.Min[i])/2 {
			return false
		}
	}
	return true
}

// Contains reports whether p is inside the cylinder: within Length/2 of
// Center along the axis and closer than Radius to the axis.
func (c Cylinder) Contains(p [3]float64) bool {
	a := unit(c.Axis)
	d := sub(p, c.Center)
	t := dot(d, a)
	if math.Abs(t) >= c.Length/2 {
		return false
	}
	return norm(sub(d, scale(a, t))) < c.Radius
}

// Contains reports whether (p[0], p[1]) is inside the circle.
func (c Circle) Contains(p [3]float64) bool {
	return math.Hypot(p[0]-c.Center[0], p[1]-c.Center[1]) < c.Radius
}

// Contains reports whether (p[0], p[1]) is inside the rectangle.
func (r Rect) Contains(p [3]float64) bool {
	return p[0] > r.Min[0] && p[0] < r.Max[0] && p[1] > r.Min[1] && p[1] < r.Max[1]
}

// Contains reports whether (p[0], p[1]) is inside the polygon, by its
// winding number about the point.
func (s PolygonShape) Contains(p [3]float64) bool {
	sum := 0.0
	for i, a := range s.Points {
		b := s.Points[(i+1)%len(s.Points)]
		sum += segmentAngle([3]float64{a[0], a[1]}, [3]float64{b[0], b[1]}, p)
	}
	return math.Abs(sum) > math.Pi
}

// Contains reports whether p is inside the loaded file surface (as
// scaled), by the winding number of its facets about p: the sum of the
// angles (2D) or solid angles (3D) the facets subtend, over 2π (4π), is 1
// inside and 0 outside. False before Load.
func (s FileSurface) Contains(p [3]float64) bool {
	if s.mesh == nil {
		return false
	}
	f, c, k := s.mesh.facets, s.mesh.centre, s.factor()
	q := add(c, scale(sub(p, c), 1/k)) // p in file coordinates
	return windingNumber(f, q) > 0.5
}

// windingNumber returns |winding number| of the closed facets f about p.
func windingNumber(f *Facets, p [3]float64) float64 {
	sum := 0.0
	for i := 0; i < f.Len(); i++ {
		v := f.Facet(i)
		if f.Dim == 2 {
			sum += segmentAngle(v[0], v[1], p)
			continue
		}
		sum += solidAngle(sub(v[0], p), sub(v[1], p), sub(v[2], p))
	}
	full := 2 * math.Pi
	if f.Dim == 3 {
		full = 4 * math.Pi
	}
	return math.Abs(sum / full)
}

// segmentAngle is the signed angle the segment a→b subtends at p, in the
// xy plane.
func segmentAngle(a, b, p [3]float64) float64 {
	ax, ay := a[0]-p[0], a[1]-p[1]
	bx, by := b[0]-p[0], b[1]-p[1]
	return math.Atan2(ax*by-ay*bx, ax*bx+ay*by)
}

// solidAngle is the signed solid angle of the triangle (a, b, c) seen from
// the origin (Van Oosterom & Strackee 1983, IEEE Trans. Biomed. Eng.
// 30(2):125-126):
// tan(Ω/2) = a·(b×c) / (|a||b||c| + (a·b)|c| + (a·c)|b| + (b·c)|a|).
func solidAngle(a, b, c [3]float64) float64 {
	la, lb, lc := norm(a), norm(b), norm(c)
	den := la*lb*lc + dot(a, b)*lc + dot(a, c)*lb + dot(b, c)*la
	return 2 * math.Atan2(dot(a, cross(b, c)), den)
}
