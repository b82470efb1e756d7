package surface

import (
	"math"
	"testing"
)

// gridMeasure counts the midpoints of an n^dim grid over [lo, hi] that c
// contains and returns their share of the box's volume (area in 2D).
func gridMeasure(c func([3]float64) bool, lo, hi [3]float64, dim, n int) float64 {
	nz := n
	if dim == 2 {
		nz = 1
	}
	in := 0
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			for k := 0; k < nz; k++ {
				p := [3]float64{
					lo[0] + (hi[0]-lo[0])*(float64(i)+0.5)/float64(n),
					lo[1] + (hi[1]-lo[1])*(float64(j)+0.5)/float64(n),
					lo[2] + (hi[2]-lo[2])*(float64(k)+0.5)/float64(nz),
				}
				if c(p) {
					in++
				}
			}
		}
	}
	box := (hi[0] - lo[0]) * (hi[1] - lo[1])
	if dim == 3 {
		box *= hi[2] - lo[2]
	}
	return box * float64(in) / float64(n*n*nz)
}

// TestContainsMeasure checks every shape's inside test by the volume (area)
// of the points it accepts on a fine grid, against the exact volume from
// elementary geometry: sphere 4/3 πr³, cylinder πr²L, box abc, circle πr²,
// rectangle ab, polygon by the shoelace formula. The tolerance, 1.5 %, is
// a few times the grid's boundary error (cells cut by the boundary, about
// surface area × h / 2 over the volume for n = 60 in 3D, 400 in 2D); a
// wrong test (inverted, shifted, wrong axis or rotation) is off by far
// more.
func TestContainsMeasure(t *testing.T) {
	cube, err := FileSurface{Path: "cube.vtk"}.Load(cubeZone())
	if err != nil {
		t.Fatal(err)
	}
	square, err := FileSurface{Path: "square.vtk"}.Load(squareZone())
	if err != nil {
		t.Fatal(err)
	}
	type container interface{ Contains([3]float64) bool }
	tests := []struct {
		name   string
		s      container
		lo, hi [3]float64
		dim    int
		want   float64
	}{
		{"sphere", Sphere{Center: [3]float64{0.1, -0.2, 0.3}, Radius: 1}, [3]float64{-1, -1.3, -0.8}, [3]float64{1.2, 1, 1.4}, 3, 4.0 / 3 * math.Pi},
		{"cylinder", Cylinder{Center: [3]float64{0, 0, 0}, Axis: [3]float64{1, 1, 0}, Radius: 0.5, Length: 2}, [3]float64{-1.3, -1.3, -0.6}, [3]float64{1.3, 1.3, 0.6}, 3, math.Pi * 0.25 * 2},
		{"box rotated", Box{Min: [3]float64{-1, -0.5, -0.25}, Max: [3]float64{1, 0.5, 0.25}, Rotate: [3]float64{30, 20, 10}}, [3]float64{-1.2, -1.2, -1.2}, [3]float64{1.2, 1.2, 1.2}, 3, 1},
		{"file cube scaled 2", cube.Scaled(2).(FileSurface), [3]float64{-0.7, -0.7, -0.7}, [3]float64{1.7, 1.7, 1.7}, 3, 8},
		{"circle", Circle{Center: [2]float64{1, 2}, Radius: 0.5}, [3]float64{0.4, 1.4, 0}, [3]float64{1.6, 2.6, 0}, 2, math.Pi * 0.25},
		{"rect", Rect{Min: [2]float64{-1, 0}, Max: [2]float64{2, 0.5}}, [3]float64{-1.5, -0.5, 0}, [3]float64{2.5, 1, 0}, 2, 1.5},
		{"L-shaped polygon", PolygonShape{Points: [][2]float64{{0, 0}, {2, 0}, {2, 1}, {1, 1}, {1, 2}, {0, 2}}}, [3]float64{-0.5, -0.5, 0}, [3]float64{2.5, 2.5, 0}, 2, 3},
		{"file square", square, [3]float64{-0.5, -0.5, 0}, [3]float64{1.5, 1.5, 0}, 2, 1},
	}
	for _, tc := range tests {
		n := 60
		if tc.dim == 2 {
			n = 400
		}
		got := gridMeasure(tc.s.Contains, tc.lo, tc.hi, tc.dim, n)
		if rel := math.Abs(got-tc.want) / tc.want; rel > 0.015 {
			t.Errorf("%s: measure of the inside %.5g, want %.5g (off by %.2g %%)", tc.name, got, tc.want, 100*rel)
		}
	}
}

// TestContainsPoints checks single points whose side follows from the
// definitions: a box turned 90° about z has its long side along y; the
// notch of the L-shaped polygon is outside; a file surface is outside
// everything before Load.
func TestContainsPoints(t *testing.T) {
	b := Box{Min: [3]float64{-1, -0.1, -0.1}, Max: [3]float64{1, 0.1, 0.1}, Rotate: [3]float64{0, 0, 90}}
	if !b.Contains([3]float64{0, 0.9, 0}) || b.Contains([3]float64{0.9, 0, 0}) {
		t.Errorf("box turned 90° about z: want (0, 0.9, 0) inside and (0.9, 0, 0) outside")
	}
	l := PolygonShape{Points: [][2]float64{{0, 0}, {2, 0}, {2, 1}, {1, 1}, {1, 2}, {0, 2}}}
	if l.Contains([3]float64{1.5, 1.5, 0}) || !l.Contains([3]float64{0.5, 1.5, 7}) {
		t.Errorf("L-shaped polygon: want the notch (1.5, 1.5) outside and (0.5, 1.5) inside, whatever z")
	}
	reversed := PolygonShape{Points: [][2]float64{{0, 2}, {1, 2}, {1, 1}, {2, 1}, {2, 0}, {0, 0}}}
	if !reversed.Contains([3]float64{0.5, 0.5, 0}) {
		t.Errorf("clockwise polygon: want (0.5, 0.5) inside")
	}
	c := Cylinder{Center: [3]float64{1, 1, 1}, Axis: [3]float64{0, 0, 2}, Radius: 1, Length: 2}
	if !c.Contains([3]float64{1, 1, 1.9}) || c.Contains([3]float64{1, 1, 2.1}) || c.Contains([3]float64{1.8, 1.8, 1}) {
		t.Errorf("cylinder: want (1,1,1.9) inside, (1,1,2.1) beyond the cap and (1.8,1.8,1) beyond the radius")
	}
	if (FileSurface{Path: "x.vtk"}).Contains([3]float64{}) {
		t.Errorf("an unloaded file surface contains nothing")
	}
}
