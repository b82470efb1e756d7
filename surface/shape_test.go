package surface

import (
	"math"
	"testing"

	"farforce/field"
)

// allShapes returns one instance of every shape kind with a fixed
// resolution, for property tests.
func allShapes(t *testing.T) []Shape {
	t.Helper()
	poly, err := NewPolygon([][2]float64{{0, 0}, {2, 0}, {2, 1}, {1, 0.5}, {0, 1.5}}, Resolution{Size: 0.1})
	if err != nil {
		t.Fatal(err)
	}
	file, err := FileSurface{Path: "cube.vtk"}.Load(cubeZone())
	if err != nil {
		t.Fatal(err)
	}
	contour, err := FileSurface{Path: "square.vtk"}.Load(squareZone())
	if err != nil {
		t.Fatal(err)
	}
	return []Shape{
		Sphere{Center: [3]float64{0.1, -0.2, 0.3}, Radius: 1.3, Res: Resolution{Facets: 2000}},
		Box{Min: [3]float64{-1, -2, -0.5}, Max: [3]float64{2, 1, 0.7}, Rotate: [3]float64{10, 20, 35}, Res: Resolution{Size: 0.3}},
		Box{Min: [3]float64{-1, -2, -0.5}, Max: [3]float64{2, 1, 0.7}},
		Cylinder{Center: [3]float64{1, 2, 3}, Axis: [3]float64{1, 2, -0.5}, Radius: 0.7, Length: 2.5, Res: Resolution{Facets: 3000}},
		Circle{Center: [2]float64{0.5, -1}, Radius: 2, Res: Resolution{Facets: 100}},
		Rect{Min: [2]float64{-1, -1}, Max: [2]float64{3, 0.5}, Res: Resolution{Size: 0.3}},
		poly,
		file,
		file.Scaled(2),
		FileSurface{Path: file.Path, Res: Resolution{Size: 0.2}, mesh: file.mesh},
		contour,
	}
}

// cubeZone is the unit cube as 6 quads, deliberately with mixed
// orientation and its own copy of the vertices of one face.
func cubeZone() *field.Zone {
	z := &field.Zone{Name: "cube"}
	for i := 0; i < 8; i++ {
		z.Points = append(z.Points, float64(i&1), float64(i>>1&1), float64(i>>2&1))
	}
	z.AddCell(field.Quad, 0, 2, 3, 1) // -z, outward
	z.AddCell(field.Quad, 4, 5, 7, 6) // +z, outward
	z.AddCell(field.Quad, 0, 1, 5, 4) // -y, outward
	z.AddCell(field.Quad, 2, 3, 7, 6) // +y, inward
	z.AddCell(field.Quad, 0, 4, 6, 2) // -x, outward
	// +x face with duplicated points 8..11 = 1, 3, 7, 5.
	for _, i := range []int{1, 3, 7, 5} {
		z.Points = append(z.Points, float64(i&1), float64(i>>1&1), float64(i>>2&1))
	}
	z.AddCell(field.Triangle, 8, 9, 10) // inward
	z.AddCell(field.Triangle, 8, 10, 11)
	return z
}

// squareZone is the unit square as 4 lines, clockwise.
func squareZone() *field.Zone {
	z := &field.Zone{Name: "square", Points: []float64{0, 0, 0, 1, 0, 0, 1, 1, 0, 0, 1, 0}}
	z.AddCell(field.Line, 0, 3)
	z.AddCell(field.Line, 3, 2)
	z.AddCell(field.Line, 2, 1)
	z.AddCell(field.Line, 1, 0)
	return z
}

// TestClosure checks the discrete closure Σ A n = 0 of every shape: the
// discrete form of ∮ n dA = 0 (Gauss divergence theorem applied to a
// constant field), required to |Σ A n| <= 1e-12 Σ A by VALIDATION §1.3.
// It also checks that facets point outward (positive enclosed volume).
func TestClosure(t *testing.T) {
	for _, s := range allShapes(t) {
		f, err := s.Tessellate(nil, 0.25)
		if err != nil {
			t.Fatalf("%s: %v", s, err)
		}
		area, c := f.Measure()
		if m := norm(c); m > 1e-12*area {
			t.Errorf("%s: |Σ A n| = %g, area %g", s, m, area)
		}
		if v := f.SignedVolume(); !(v > 0) {
			t.Errorf("%s: enclosed volume %g is not positive: facets point inward", s, v)
		}
		if s.Dim() != f.Dim {
			t.Errorf("%s: Dim %d, facets of dim %d", s, s.Dim(), f.Dim)
		}
		t.Logf("%s: %d facets, area %.6g (exact %.6g)", s, f.Len(), area, s.ExactArea())
	}
}

// TestExactAreaFlat checks that flat shapes tessellate to their exact area
// (perimeter), and that the enclosed volumes are right: a rotated box
// keeps its volume abc = 3·3·1.2, the unit cube from a file encloses 1.
func TestExactAreaFlat(t *testing.T) {
	for _, s := range allShapes(t) {
		switch s.(type) {
		case Sphere, Cylinder, Circle:
			continue
		}
		f, err := s.Tessellate(nil, 0)
		if err != nil {
			t.Fatal(err)
		}
		a, _ := f.Measure()
		if math.Abs(a-s.ExactArea()) > 1e-12*a {
			t.Errorf("%s: area %.17g, exact %.17g", s, a, s.ExactArea())
		}
	}
	b := Box{Min: [3]float64{-1, -2, -0.5}, Max: [3]float64{2, 1, 0.7}, Rotate: [3]float64{30, -40, 50}, Res: Resolution{Size: 0.5}}
	f, _ := b.Tessellate(nil, 0)
	if v := f.SignedVolume(); math.Abs(v-3*3*1.2) > 1e-12 {
		t.Errorf("rotated box volume %.15g, want 10.8", v)
	}
	cube, err := FileSurface{Path: "cube.vtk"}.Load(cubeZone())
	if err != nil {
		t.Fatal(err)
	}
	f, _ = cube.Tessellate(nil, 0)
	if v := f.SignedVolume(); math.Abs(v-1) > 1e-15 {
		t.Errorf("file cube volume %.17g, want 1", v)
	}
}

// fitOrder returns the least-squares slope of log(err) against log(h).
func fitOrder(h, e []float64) float64 {
	var sx, sy, sxx, sxy float64
	for i := range h {
		x, y := math.Log(h[i]), math.Log(e[i])
		sx, sy, sxx, sxy = sx+x, sy+y, sxx+x*x, sxy+x*y
	}
	n := float64(len(h))
	return (n*sxy - sx*sy) / (n*sxx - sx*sx)
}

// TestAreaConvergence checks that the area of the inscribed polyhedra of
// the curved shapes converges to the exact area (4πR², 2πRL + 2πR², 2πR)
// at second order in the edge length: the chord of an arc of angle θ
// falls short by θ³/24 per unit radius (Taylor series of 2 sin(θ/2)),
// i.e. relatively by θ²/24 = O(h²). Tolerance ±0.15 on the fitted order:
// the ring counts are rounded up to integers, which perturbs the errors
// by a few percent at these resolutions.
func TestAreaConvergence(t *testing.T) {
	shapes := []Shape{
		Sphere{Center: [3]float64{1, 2, 3}, Radius: 2},
		Cylinder{Center: [3]float64{0, 0, 0}, Axis: [3]float64{0, 1, 1}, Radius: 1, Length: 3},
		Circle{Center: [2]float64{1, 1}, Radius: 0.5},
	}
	for _, s := range shapes {
		var hs, es []float64
		for _, h := range []float64{0.2, 0.1, 0.05, 0.025} {
			f, err := s.Tessellate(func([3]float64) float64 { return h }, 0)
			if err != nil {
				t.Fatal(err)
			}
			a, _ := f.Measure()
			hs, es = append(hs, h), append(es, math.Abs(a-s.ExactArea())/s.ExactArea())
		}
		p := fitOrder(hs, es)
		t.Logf("%s: relative area errors %.3g, order %.3f", s, es, p)
		if math.Abs(p-2) > 0.15 {
			t.Errorf("%s: area converges at order %.3f, want 2", s, p)
		}
	}
}
