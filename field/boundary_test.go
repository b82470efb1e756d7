package field_test

import (
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// Face counts of structured blocks are elementary: an n×n×n box of cubes
// has 6n² boundary squares (12n² triangles when each cube is split into six
// tetrahedra), an n×n rectangle 4n boundary edges.
func TestBoundaryFacesCounts(t *testing.T) {
	n := 3
	lo, hi := [3]float64{0, 0, 0}, [3]float64{1, 1, 1}
	cases := []struct {
		name string
		f    *field.Field
		want int
	}{
		{"hexa", &field.Field{Zones: []*field.Zone{fieldtest.BoxHex(lo, hi, [3]int{n, n, n})}}, 6 * n * n},
		{"tetra", &field.Field{Zones: []*field.Zone{fieldtest.BoxTet(lo, hi, [3]int{n, n, n})}}, 12 * n * n},
		{"quad", &field.Field{Zones: []*field.Zone{fieldtest.RectQuad([2]float64{0, 0}, [2]float64{1, 1}, [2]int{n, n})}}, 4 * n},
		{"tri", &field.Field{Zones: []*field.Zone{fieldtest.RectTri([2]float64{0, 0}, [2]float64{1, 1}, [2]int{n, n})}}, 4 * n},
		// Two blocks sharing the face x = 1 with their own copies of its
		// points: the shared face is interior.
		{"two zones", &field.Field{Zones: []*field.Zone{
			fieldtest.BoxHex(lo, hi, [3]int{n, n, n}),
			fieldtest.BoxHex([3]float64{1, 0, 0}, [3]float64{2, 1, 1}, [3]int{n, n, n}),
		}}, 10 * n * n},
	}
	for _, c := range cases {
		faces, err := field.BoundaryFaces(c.f, nil)
		if err != nil {
			t.Fatal(c.name, err)
		}
		if len(faces) != c.want {
			t.Errorf("%s: %d boundary faces, want %d", c.name, len(faces), c.want)
		}
	}
}

// A blanked cell in the middle of a 3×3×3 block is a body: its 6 faces
// become boundary faces of the neighbours, and inside picks them out.
func TestBoundaryFacesBlankBody(t *testing.T) {
	z := fieldtest.BoxHex([3]float64{0, 0, 0}, [3]float64{3, 3, 3}, [3]int{3, 3, 3})
	z.Blank = make([]bool, z.NumCells())
	z.Blank[13] = true // the centre cell
	f := &field.Field{Zones: []*field.Zone{z}}
	all, err := field.BoundaryFaces(f, nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(all) != 6*9+6 {
		t.Errorf("%d faces, want %d", len(all), 6*9+6)
	}
	body, err := field.BoundaryFaces(f, func(p [3]float64) bool {
		return p[0] > 0.5 && p[0] < 2.5 && p[1] > 0.5 && p[1] < 2.5 && p[2] > 0.5 && p[2] < 2.5
	})
	if err != nil {
		t.Fatal(err)
	}
	if len(body) != 6 {
		t.Fatalf("%d body faces, want 6", len(body))
	}
	for i, fc := range body {
		if fc.Cell.Cell == 13 || len(fc.Nodes) != 4 {
			t.Errorf("face %d: %+v belongs to the blank cell or is not a quad", i, fc)
		}
		if i > 0 && fc.Cell.Cell < body[i-1].Cell.Cell {
			t.Errorf("faces not sorted by cell: %d after %d", fc.Cell.Cell, body[i-1].Cell.Cell)
		}
	}
}
