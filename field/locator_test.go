package field_test

import (
	"errors"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// probePoints returns points that stress point location: random points in
// a box 10% larger than [0,1]^d (some outside the mesh), every node, and
// the node centroid of every face and edge of every cell (points exactly on
// shared faces and edges).
func probePoints(z *field.Zone, dim int, rng *rand.Rand, nrand int) [][3]float64 {
	var pts [][3]float64
	for i := 0; i < nrand; i++ {
		var p [3]float64
		for k := 0; k < dim; k++ {
			p[k] = -0.1 + 1.2*rng.Float64()
		}
		pts = append(pts, p)
	}
	for i := 0; i < z.NumPoints(); i++ {
		pts = append(pts, z.Point(int32(i)))
	}
	for c := 0; c < z.NumCells(); c++ {
		nodes := z.CellNodes(c)
		for _, f := range z.Types[c].Faces() {
			var m [3]float64
			for _, k := range f {
				p := z.Point(nodes[k])
				for j := 0; j < 3; j++ {
					m[j] += p[j] / float64(len(f))
				}
			}
			pts = append(pts, m)
		}
	}
	return pts
}

// Reference: brute force over all cells in (Zone, Cell) order with the same
// containment test gives the same cell (the lowest containing one) and
// the same local coordinates, for random, on-face, on-edge, on-vertex and
// outside points, on perturbed meshes of every type.
func TestLocateMatchesBruteForce(t *testing.T) {
	for _, mc := range meshCases {
		t.Run(mc.name, func(t *testing.T) {
			z := mc.build(4)
			fieldtest.Perturb(z, 0.055, 7) // up to 0.22 h: strongly distorted, still valid
			l := mustLocator(t, z)
			rng := rand.New(rand.NewPCG(11, 12))
			found, outside := 0, 0
			for _, p := range probePoints(z, mc.dim, rng, 2000) {
				got, ok := l.Locate(p)
				want, wok := bruteLocate(l, p)
				if ok != wok || got.Ref() != want.Ref() || got.Local != want.Local {
					t.Fatalf("point %v: Locate = %+v,%v; brute force %+v,%v", p, got, ok, want, wok)
				}
				if ok {
					found++
				} else {
					outside++
					// The cells tile the box exactly (boundary nodes stay):
					// a point inside must be found, or the inverse map
					// failed on a distorted cell.
					if inside(p, mc.dim, 1e-12) {
						t.Fatalf("point %v inside the box not located", p)
					}
				}
			}
			if found == 0 || outside == 0 {
				t.Fatalf("probe set degenerate: %d found, %d outside", found, outside)
			}
		})
	}
}

// Exact: every node of every cell lies in the mesh, and a point just
// outside the box [0,1]^3 (by 1e-6, far above the 1e-9 tolerance) lies in
// none.
func TestLocateBoundary(t *testing.T) {
	z := fieldtest.BoxHex(unitLo, unitHi, [3]int{3, 3, 3})
	l := mustLocator(t, z)
	for i := 0; i < z.NumPoints(); i++ {
		if _, ok := l.Locate(z.Point(int32(i))); !ok {
			t.Fatalf("node %d not located", i)
		}
	}
	for _, p := range [][3]float64{{-1e-6, 0.5, 0.5}, {0.5, 1 + 1e-6, 0.5}, {0.5, 0.5, -1e-6}, {1 + 1e-6, 1, 1}} {
		if loc, ok := l.Locate(p); ok {
			t.Fatalf("outside point %v located in %+v", p, loc)
		}
	}
	// The corner (1,1,1) belongs only to the last cell, with local (1,1,1).
	loc, ok := l.Locate([3]float64{1, 1, 1})
	if !ok || loc.Cell != 26 || math.Abs(loc.Local[0]-1)+math.Abs(loc.Local[1]-1)+math.Abs(loc.Local[2]-1) > 1e-12 {
		t.Fatalf("corner: %+v %v", loc, ok)
	}
	// The centre vertex (1/3,1/3,1/3) is shared by 8 cells: the lowest is 0.
	loc, ok = l.Locate([3]float64{1.0 / 3, 1.0 / 3, 1.0 / 3})
	if !ok || loc.Cell != 0 {
		t.Fatalf("shared vertex: %+v %v", loc, ok)
	}
}

// splitBox returns the unit box of n³ hexahedra as two zones meeting at
// x = 1/2, each with its own copy of the interface points.
func splitBox(n int) (*field.Zone, *field.Zone) {
	a := fieldtest.BoxHex([3]float64{0, 0, 0}, [3]float64{0.5, 1, 1}, [3]int{n / 2, n, n})
	b := fieldtest.BoxHex([3]float64{0.5, 0, 0}, [3]float64{1, 1, 1}, [3]int{n - n/2, n, n})
	a.Name, b.Name = "left", "right"
	return a, b
}

// Reference: on a two-zone field, location agrees with brute force and
// points on the interface go to zone 0 (lowest zone first).
func TestLocateMultiZone(t *testing.T) {
	a, b := splitBox(6)
	l := mustLocator(t, b, a) // zone 0 is the right half
	rng := rand.New(rand.NewPCG(13, 14))
	pts := append(probePoints(a, 3, rng, 1000), probePoints(b, 3, rng, 0)...)
	for _, p := range pts {
		got, ok := l.Locate(p)
		want, wok := bruteLocate(l, p)
		if ok != wok || got != want {
			t.Fatalf("point %v: Locate = %+v,%v; brute force %+v,%v", p, got, ok, want, wok)
		}
	}
	loc, ok := l.Locate([3]float64{0.5, 0.3, 0.7})
	if !ok || loc.Zone != 0 {
		t.Fatalf("interface point: %+v %v, want zone 0", loc, ok)
	}
}

// Exact: blank cells and cells of a lower dimension are not indexed; points
// inside a blank cell are outside the mesh.
func TestLocatorSkipsBlankAndLowerDim(t *testing.T) {
	z := fieldtest.BoxHex(unitLo, unitHi, [3]int{3, 3, 3})
	z.Blank = make([]bool, z.NumCells())
	z.Blank[13] = true // the middle cell
	z.AddCell(field.Quad, 0, 1, 5, 4)
	z.Blank = append(z.Blank, false)
	l := mustLocator(t, z)
	if _, ok := l.Locate([3]float64{0.5, 0.5, 0.5}); ok {
		t.Fatal("point in a blank cell located")
	}
	if loc, ok := l.Locate([3]float64{0.1, 0.1, 0.1}); !ok || loc.Cell != 0 {
		t.Fatalf("got %+v %v", loc, ok)
	}
	refs := l.CellsInBox([3]float64{0, 0, 0}, [3]float64{1, 1, 1}, nil)
	if len(refs) != 26 {
		t.Fatalf("CellsInBox found %d cells, want 26", len(refs))
	}
}

// Exact: CellsInBox returns every cell whose bounding box overlaps the
// query box, no cell whose box is clearly apart, sorted without
// duplicates.
func TestCellsInBox(t *testing.T) {
	for _, mc := range meshCases {
		t.Run(mc.name, func(t *testing.T) {
			z := mc.build(5)
			fieldtest.Perturb(z, 0.03, 9)
			l := mustLocator(t, z)
			rng := rand.New(rand.NewPCG(15, 16))
			var dst []field.CellRef
			for trial := 0; trial < 200; trial++ {
				var lo, hi [3]float64
				for k := 0; k < mc.dim; k++ {
					a, b := -0.1+1.2*rng.Float64(), -0.1+1.2*rng.Float64()
					if trial%4 == 0 {
						b = a // a degenerate box: a point
					}
					lo[k], hi[k] = min(a, b), max(a, b)
				}
				dst = l.CellsInBox(lo, hi, dst[:0])
				if !slices.IsSortedFunc(dst, cmpRef) || len(slices.CompactFunc(slices.Clone(dst), func(a, b field.CellRef) bool { return a == b })) != len(dst) {
					t.Fatalf("not sorted or duplicated: %v", dst)
				}
				for c := 0; c < z.NumCells(); c++ {
					clo, chi := bounds(z, c)
					ov := overlap(clo, chi, lo, hi, mc.dim, 0)
					near := overlap(clo, chi, lo, hi, mc.dim, 1e-6)
					_, in := slices.BinarySearchFunc(dst, field.CellRef{Cell: int32(c)}, cmpRef)
					if ov && !in || in && !near {
						t.Fatalf("cell %d: overlap %v, returned %v (box %v %v)", c, ov, in, lo, hi)
					}
				}
			}
		})
	}
}

// inside reports whether p lies in [0,1]^dim at least tol from its faces.
func inside(p [3]float64, dim int, tol float64) bool {
	for k := 0; k < dim; k++ {
		if p[k] < tol || p[k] > 1-tol {
			return false
		}
	}
	return true
}

func cmpRef(a, b field.CellRef) int {
	if a.Zone != b.Zone {
		return int(a.Zone - b.Zone)
	}
	return int(a.Cell - b.Cell)
}

func bounds(z *field.Zone, c int) (lo, hi [3]float64) {
	lo = [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}
	hi = [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	for _, n := range z.CellNodes(c) {
		p := z.Point(n)
		for k := 0; k < 3; k++ {
			lo[k], hi[k] = min(lo[k], p[k]), max(hi[k], p[k])
		}
	}
	return lo, hi
}

func overlap(alo, ahi, blo, bhi [3]float64, dim int, pad float64) bool {
	for k := 0; k < dim; k++ {
		if alo[k] > bhi[k]+pad || ahi[k] < blo[k]-pad {
			return false
		}
	}
	return true
}

// Exact: CellSize is the mean edge length: h on a cube mesh of spacing h,
// inside and outside the mesh, and (3 + 2√2 + √3)h/6 for the Kuhn
// tetrahedra of a cube (three edges h, two face diagonals √2h, one body
// diagonal √3h).
func TestCellSize(t *testing.T) {
	l := mustLocator(t, fieldtest.BoxHex(unitLo, unitHi, [3]int{4, 4, 4}))
	for _, p := range [][3]float64{{0.3, 0.6, 0.9}, {5, -3, 0.5}, {0.5, 0.5, 1.2}} {
		if h := l.CellSize(p); math.Abs(h-0.25) > 1e-15 {
			t.Fatalf("CellSize(%v) = %v, want 0.25", p, h)
		}
	}
	l = mustLocator(t, fieldtest.BoxTet(unitLo, unitHi, [3]int{4, 4, 4}))
	want := 0.25 * (3 + 2*math.Sqrt2 + math.Sqrt(3)) / 6
	if h := l.CellSize([3]float64{0.3, 0.6, 0.9}); math.Abs(h-want) > 1e-14 {
		t.Fatalf("tet CellSize = %v, want %v", h, want)
	}
}

// Errors: no indexable cell gives ErrNoCells; a NaN coordinate names the
// point.
func TestNewLocatorErrors(t *testing.T) {
	z := fieldtest.BoxHex(unitLo, unitHi, [3]int{2, 2, 2})
	z.Blank = make([]bool, z.NumCells())
	for i := range z.Blank {
		z.Blank[i] = true
	}
	if _, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}}); !errors.Is(err, field.ErrNoCells) {
		t.Fatalf("all blank: err = %v", err)
	}
	z = fieldtest.BoxHex(unitLo, unitHi, [3]int{2, 2, 2})
	z.Points[3*4+1] = math.NaN()
	_, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err == nil || !strings.Contains(err.Error(), "point 4") {
		t.Fatalf("NaN point: err = %v", err)
	}
}

// Exact: degenerate queries. A NaN point is in no cell; an InCell with a
// reference to no cell, or to a cell without shape functions, is false; in
// 2D the z coordinate of a query is ignored; an inverted box is empty.
func TestLocatorDegenerateQueries(t *testing.T) {
	l := mustLocator(t, fieldtest.BoxHex(unitLo, unitHi, [3]int{2, 2, 2}))
	if _, ok := l.Locate([3]float64{math.NaN(), 0.5, 0.5}); ok {
		t.Error("NaN located")
	}
	for _, r := range []field.CellRef{{Zone: 1}, {Zone: -1}, {Cell: 8}, {Cell: -1}} {
		if _, ok := l.InCell(r, [3]float64{0.1, 0.1, 0.1}); ok {
			t.Errorf("InCell(%+v) ok", r)
		}
	}
	if got := l.CellsInBox([3]float64{1, 0, 0}, [3]float64{0, 1, 1}, nil); len(got) != 0 {
		t.Errorf("inverted box: %v", got)
	}
	z := fieldtest.Annulus(0.5, 0.5, 0.1, 0.4, 6, 24)
	for i := 2; i < len(z.Points); i += 3 {
		z.Points[i] = 7 // the plane z = 7
	}
	z.AddCell(field.Line, 0, 1) // not indexed: lower dimension
	l = mustLocator(t, z)
	if l.Dim() != 2 {
		t.Fatalf("Dim = %d", l.Dim())
	}
	rng := rand.New(rand.NewPCG(17, 18))
	for _, p := range probePoints(z, 2, rng, 2000) {
		q := p
		q[2] = -100 * rng.Float64()
		got, ok := l.Locate(q)
		want, wok := bruteLocate(l, p)
		if ok != wok || got != want {
			t.Fatalf("annulus point %v: Locate = %+v,%v; brute force %+v,%v", q, got, ok, want, wok)
		}
	}
	if got := l.CellsInBox([3]float64{0.45, 0.05, 100}, [3]float64{0.55, 0.15, 100}, nil); len(got) == 0 {
		t.Error("2D CellsInBox must ignore z")
	}
}

// Reference: outside the mesh, CellSize is the mean edge length of a cell
// whose bounding box is nearest, as found by brute force over all cells.
func TestCellSizeNearestMatchesBruteForce(t *testing.T) {
	for _, mc := range meshCases {
		z := mc.build(5)
		fieldtest.Perturb(z, 0.05, 19)
		l := mustLocator(t, z)
		rng := rand.New(rand.NewPCG(20, 21))
		for trial := 0; trial < 200; trial++ {
			var p [3]float64
			for k := 0; k < mc.dim; k++ {
				p[k] = -1 + 3*rng.Float64()
			}
			if _, ok := l.Locate(p); ok {
				continue
			}
			dist := make([]float64, z.NumCells())
			bestD := math.Inf(1)
			for c := range dist {
				lo, hi := bounds(z, c)
				for k := 0; k < mc.dim; k++ {
					e := max(lo[k]-p[k], p[k]-hi[k], 0)
					dist[c] += e * e
				}
				bestD = min(bestD, dist[c])
			}
			// Boxes at equal distance (common beside a flat boundary) are
			// told apart only by their 1e-8 padding: accept any of them.
			got, match := l.CellSize(p), false
			for c, d := range dist {
				if d <= bestD+1e-6*(1+bestD) && math.Abs(got-meanEdge(z, c)) < 1e-12 {
					match = true
				}
			}
			if !match {
				t.Fatalf("%s: CellSize(%v) = %v matches no nearest cell", mc.name, p, got)
			}
		}
	}
}

// meanEdge returns the mean length over the face sides of cell c (each edge
// of a volume cell is counted twice, once per face; a 2D cell's faces are
// its edges).
func meanEdge(z *field.Zone, c int) float64 {
	nodes := z.CellNodes(c)
	sum, n := 0.0, 0
	for _, f := range z.Types[c].Faces() {
		sides := len(f)
		if sides == 2 {
			sides = 1
		}
		for i := 0; i < sides; i++ {
			a, b := z.Point(nodes[f[i]]), z.Point(nodes[f[(i+1)%len(f)]])
			sum += math.Sqrt((a[0]-b[0])*(a[0]-b[0]) + (a[1]-b[1])*(a[1]-b[1]) + (a[2]-b[2])*(a[2]-b[2]))
			n++
		}
	}
	return sum / float64(n)
}

// Reference: a zone without cells between two others shifts no cell
// numbers: location agrees with brute force on both sides of it.
func TestLocateAcrossEmptyZone(t *testing.T) {
	a, b := splitBox(4)
	l := mustLocator(t, a, &field.Zone{Name: "empty", Offsets: []int32{0}}, b)
	rng := rand.New(rand.NewPCG(27, 28))
	found := [3]int{}
	for _, p := range probePoints(b, 3, rng, 500) {
		got, ok := l.Locate(p)
		want, wok := bruteLocate(l, p)
		if ok != wok || got != want {
			t.Fatalf("point %v: Locate = %+v,%v; brute force %+v,%v", p, got, ok, want, wok)
		}
		if ok {
			found[got.Zone]++
		}
	}
	if found[0] == 0 || found[2] == 0 {
		t.Fatalf("points found per zone %v: both halves must be hit", found)
	}
}
