package fieldtest

import (
	"math"

	"farforce/field"
)

// WallCircle returns a closed polygon of n segments inscribed in the circle
// of radius a about (cx, cy) in the plane z = 0, as n Line cells running
// counter-clockwise, node 0 at angle θ0. It panics if n < 3 (programmer
// error).
func WallCircle(cx, cy, a, theta0 float64, n int) *field.Zone {
	if n < 3 {
		panic("fieldtest: WallCircle needs n >= 3")
	}
	z := &field.Zone{Name: "circle wall"}
	for i := 0; i < n; i++ {
		t := theta0 + 2*math.Pi*float64(i)/float64(n)
		z.Points = append(z.Points, cx+a*math.Cos(t), cy+a*math.Sin(t), 0)
	}
	for i := 0; i < n; i++ {
		z.AddCell(field.Line, int32(i), int32((i+1)%n))
	}
	return z
}
