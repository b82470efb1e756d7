package field_test

import (
	"math"
	"testing"

	"farforce/field"
)

// Exact: volume and area centroids of cells with closed-form centroids:
// unit cube (1/2,1/2,1/2); square frustum with base areas A1 = 4, A2 = 1
// and height 1, centroid height h(A1 + 2√(A1A2) + 3A2)/(4(A1 + √(A1A2) +
// A2)) = 11/28 (standard solid-geometry formula); square pyramid of height
// H at H/4, i.e. 3/4 of the base centroid plus 1/4 of the apex, also for
// a skew apex; right prism over a triangle at the triangle's centroid and half
// height; trapezoid with parallel sides a = 2 (y = 0) and b = 1 (y = 1) at
// y = (a + 2b)/(3(a + b)) = 4/9; tetrahedron at its node mean.
func TestCellCentroid(t *testing.T) {
	cases := []struct {
		name  string
		t     field.CellType
		nodes [][3]float64
		want  [3]float64
	}{
		{"cube", field.Hexa, [][3]float64{{0, 0, 0}, {1, 0, 0}, {1, 1, 0}, {0, 1, 0}, {0, 0, 1}, {1, 0, 1}, {1, 1, 1}, {0, 1, 1}}, [3]float64{0.5, 0.5, 0.5}},
		{"frustum", field.Hexa, [][3]float64{{-1, -1, 0}, {1, -1, 0}, {1, 1, 0}, {-1, 1, 0}, {-0.5, -0.5, 1}, {0.5, -0.5, 1}, {0.5, 0.5, 1}, {-0.5, 0.5, 1}}, [3]float64{0, 0, 11.0 / 28}},
		{"pyramid", field.Pyramid, [][3]float64{{0, 0, 0}, {2, 0, 0}, {2, 2, 0}, {0, 2, 0}, {1, 1, 3}}, [3]float64{1, 1, 0.75}},
		{"skew pyramid", field.Pyramid, [][3]float64{{0, 0, 0}, {2, 0, 0}, {2, 2, 0}, {0, 2, 0}, {5, -1, 4}}, [3]float64{0.75*1 + 0.25*5, 0.75*1 + 0.25*(-1), 0.25 * 4}},
		{"prism", field.Wedge, [][3]float64{{0, 0, 0}, {3, 0, 0}, {0, 3, 0}, {0, 0, 2}, {3, 0, 2}, {0, 3, 2}}, [3]float64{1, 1, 1}},
		{"trapezoid", field.Quad, [][3]float64{{0, 0, 5}, {2, 0, 5}, {1.5, 1, 5}, {0.5, 1, 5}}, [3]float64{1, 4.0 / 9, 5}},
		{"tetra", field.Tetra, [][3]float64{{0, 0, 0}, {4, 0, 0}, {0, 4, 0}, {0, 0, 4}}, [3]float64{1, 1, 1}},
	}
	for _, c := range cases {
		z := &field.Zone{}
		var ids []int32
		for i, p := range c.nodes {
			z.Points = append(z.Points, p[:]...)
			ids = append(ids, int32(i))
		}
		z.AddCell(c.t, ids...)
		got := z.CellCentroid(0)
		for k := 0; k < 3; k++ {
			if math.Abs(got[k]-c.want[k]) > 1e-13 {
				t.Errorf("%s: centroid %v, want %v", c.name, got, c.want)
				break
			}
		}
	}
}

// TestCellCentroidTiltedTrapezoid checks the area centroid of a planar
// trapezoid tilted out of z = const (a wall cell in 3D space) against the
// trapezoid centroid formula y_c = h(a + 2b)/(3(a + b)) measured from the
// side of length a (common practice; any statics handbook).
func TestCellCentroidTiltedTrapezoid(t *testing.T) {
	z := &field.Zone{Points: []float64{0, 0, 0, 2, 0, 0, 1.5, 1, 1, 0.5, 1, 1}}
	z.AddCell(field.Quad, 0, 1, 2, 3)
	got := z.CellCentroid(0)
	// a = 2 (v = 0), b = 1 (v = 1), so the centroid lies 4/9 of the way
	// along the tilted height (0, 1, 1), at x = 1 by symmetry.
	want := [3]float64{1, 4.0 / 9, 4.0 / 9}
	for k := 0; k < 3; k++ {
		if math.Abs(got[k]-want[k]) > 1e-14 {
			t.Fatalf("centroid %v, want %v", got, want)
		}
	}
}
