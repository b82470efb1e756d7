package surface

import (
	"fmt"
	"strings"

	"github.com/paulmach/orb"
	"github.com/paulmach/orb/planar"
)

// PolygonShape is a simple polygon (metres) in the plane of a 2D field.
// NewPolygon closes the ring, orients it counter-clockwise so that the
// segment normals point outward, and rejects self-intersecting or
// degenerate rings. The contour is exact.
type PolygonShape struct {
	// Points are the vertices, counter-clockwise, first not repeated.
	Points [][2]float64
	Res    Resolution
}

// NewPolygon returns the polygon through pts (in either orientation, the
// first point optionally repeated at the end). Errors: fewer than three
// distinct points, a non-finite coordinate, zero area, repeated
// consecutive points, or edges that cross or touch other than at their
// shared vertex.
func NewPolygon(pts [][2]float64, res Resolution) (PolygonShape, error) {
	ring := make(orb.Ring, 0, len(pts)+1)
	for i, p := range pts {
		if !finite(p[0], p[1]) {
			return PolygonShape{}, fmt.Errorf("polygon point %d (%g, %g) is not finite", i+1, p[0], p[1])
		}
		ring = append(ring, orb.Point{p[0], p[1]})
	}
	if len(ring) > 0 && !ring.Closed() {
		ring = append(ring, ring[0])
	}
	n := len(ring) - 1
	if n < 3 {
		return PolygonShape{}, fmt.Errorf("polygon needs at least 3 distinct points, has %d", max(n, 0))
	}
	for i := 0; i < n; i++ {
		if ring[i] == ring[i+1] {
			return PolygonShape{}, fmt.Errorf("polygon point %d repeats point %d", i%n+2, i+1)
		}
	}
	if i, j, ok := selfIntersection(ring); ok {
		return PolygonShape{}, fmt.Errorf("polygon edges %d and %d intersect: the polygon must be simple", i+1, j+1)
	}
	if planar.Area(ring) == 0 {
		return PolygonShape{}, fmt.Errorf("polygon has zero area")
	}
	if ring.Orientation() != orb.CCW {
		ring.Reverse()
	}
	s := PolygonShape{Points: make([][2]float64, n), Res: res}
	for i := 0; i < n; i++ {
		s.Points[i] = [2]float64{ring[i][0], ring[i][1]}
	}
	return s, nil
}

// selfIntersection returns two non-adjacent edges of the closed ring that
// intersect (touching counts), or ok = false. Edge i runs from point i to
// i+1. Cost O(n²).
func selfIntersection(r orb.Ring) (int, int, bool) {
	n := len(r) - 1
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			if j == i+1 || (i == 0 && j == n-1) {
				// Adjacent edges share a vertex; they overlap only if
				// they fold back onto each other.
				if foldBack(r, i, j, n) {
					return i, j, true
				}
				continue
			}
			if segmentsTouch(r[i], r[i+1], r[j], r[j+1]) {
				return i, j, true
			}
		}
	}
	return 0, 0, false
}

// foldBack reports whether adjacent edges i and j are collinear and point
// back onto each other.
func foldBack(r orb.Ring, i, j, n int) bool {
	a, b := i, j
	if i == 0 && j == n-1 {
		a, b = j, i
	}
	p, q, s := r[a], r[a+1], r[b+1] // edge a: p→q, edge b: q→s
	if orient2(p, q, s) != 0 {
		return false
	}
	return (q[0]-p[0])*(s[0]-q[0])+(q[1]-p[1])*(s[1]-q[1]) < 0
}

// orient2 returns the sign of the cross product (q - p) × (s - p).
func orient2(p, q, s orb.Point) int {
	v := (q[0]-p[0])*(s[1]-p[1]) - (q[1]-p[1])*(s[0]-p[0])
	switch {
	case v > 0:
		return 1
	case v < 0:
		return -1
	}
	return 0
}

// onSegment reports whether s, collinear with p q, lies within its box.
func onSegment(p, q, s orb.Point) bool {
	return min(p[0], q[0]) <= s[0] && s[0] <= max(p[0], q[0]) && min(p[1], q[1]) <= s[1] && s[1] <= max(p[1], q[1])
}

// segmentsTouch reports whether segments p1 q1 and p2 q2 share a point.
func segmentsTouch(p1, q1, p2, q2 orb.Point) bool {
	o1, o2 := orient2(p1, q1, p2), orient2(p1, q1, q2)
	o3, o4 := orient2(p2, q2, p1), orient2(p2, q2, q1)
	if o1 != o2 && o3 != o4 {
		return true
	}
	return (o1 == 0 && onSegment(p1, q1, p2)) || (o2 == 0 && onSegment(p1, q1, q2)) ||
		(o3 == 0 && onSegment(p2, q2, p1)) || (o4 == 0 && onSegment(p2, q2, q1))
}

// Dim returns 2.
func (s PolygonShape) Dim() int { return 2 }

// String returns the spec "polygon points=X,Y;X,Y;... [facets=N|size=H]".
func (s PolygonShape) String() string {
	parts := make([]string, len(s.Points))
	for i, p := range s.Points {
		parts[i] = fvec(p[:]...)
	}
	return "polygon points=" + strings.Join(parts, ";") + s.Res.specFields()
}

// Pivot returns the area centroid of the polygon (z = 0).
func (s PolygonShape) Pivot() [3]float64 {
	ring := make(orb.Ring, 0, len(s.Points)+1)
	for _, p := range s.Points {
		ring = append(ring, orb.Point{p[0], p[1]})
	}
	if len(ring) > 0 {
		ring = append(ring, ring[0])
	}
	c, _ := planar.CentroidArea(ring)
	return [3]float64{c[0], c[1], 0}
}

// Scaled returns the polygon scaled by k about its area centroid.
func (s PolygonShape) Scaled(k float64) Shape {
	checkScale(k)
	c := s.Pivot()
	pts := make([][2]float64, len(s.Points))
	for i, p := range s.Points {
		pts[i] = [2]float64{c[0] + k*(p[0]-c[0]), c[1] + k*(p[1]-c[1])}
	}
	s.Points = pts
	return s
}

// ExactArea returns the perimeter.
func (s PolygonShape) ExactArea() float64 { return perimeter(s.Points) }

// Resolution returns the facets=/size= setting.
func (s PolygonShape) Resolution() Resolution { return s.Res }

// Tessellate returns the sides in the plane z, split into segments.
func (s PolygonShape) Tessellate(size SizeFunc, z float64) (*Facets, error) {
	spec := s.String()
	if len(s.Points) < 3 {
		return nil, fmt.Errorf("surface %q: a polygon needs at least 3 points", spec)
	}
	h, err := flatSize(spec, s.Res, size, s.ExactArea(), 0, edgeSamples(s.Points, z))
	if err != nil {
		return nil, err
	}
	return polyline2D(spec, s.Points, z, h)
}
