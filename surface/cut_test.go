package surface

import (
	"errors"
	"math"
	"reflect"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

func locator(t testing.TB, zones ...*field.Zone) *field.Locator {
	t.Helper()
	l, err := field.NewLocator(&field.Field{Zones: zones})
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// checkCut verifies the internal accounting of a cut: pieces add up to
// the tessellated area, weights add up to each piece's area, every point
// lies in its piece's cell (or at least in some cell), normals are the
// facet normals.
func checkCut(t *testing.T, l *field.Locator, c *Cut, warped bool) {
	t.Helper()
	var sum field.CompensatedSum
	moved := 0
	for _, p := range c.Pieces {
		sum.Add(p.Area)
		var w float64
		for _, q := range c.Points[p.First : p.First+p.Count] {
			w += q.W
			if q.At.Ref() != p.Cell {
				moved++
			}
			if q.N != p.N {
				t.Fatalf("point normal %v differs from piece normal %v", q.N, p.N)
			}
		}
		if math.Abs(w-p.Area) > 1e-12*p.Area {
			t.Fatalf("piece weights %g, area %g", w, p.Area)
		}
	}
	if math.Abs(sum.Value()-c.Area) > 1e-9*c.Area {
		t.Errorf("%s: pieces cover %.15g of area %.15g", c.Spec, sum.Value(), c.Area)
	}
	// In a warped hexahedron the simplices differ from the trilinear cell
	// by a sliver; points there belong to the neighbour's trilinear cell.
	if moved > 0 && !warped {
		t.Errorf("%s: %d of %d points located outside their piece's cell", c.Spec, moved, len(c.Points))
	}
	if warped {
		t.Logf("%s: %d of %d points in the neighbour of their piece's warped cell", c.Spec, moved, len(c.Points))
	}
	if m := norm(c.Closure); m > 1e-12*c.Area {
		t.Errorf("%s: closure %g", c.Spec, m)
	}
}

// checkOwner checks the tie rule for facets lying in a cell face plane:
// the cell owning a piece must not lie entirely on the outer side (+n) of
// the piece's plane, i.e. its node centroid is on the inner side or on
// the plane.
func checkOwner(t *testing.T, l *field.Locator, c *Cut) {
	t.Helper()
	for _, p := range c.Pieces {
		z := l.Field().Zones[p.Cell.Zone]
		cen := z.Centroid(int(p.Cell.Cell))
		h := 0.0
		for _, q := range z.CellNodes(int(p.Cell.Cell)) {
			h = math.Max(h, norm(sub(z.Point(q), cen)))
		}
		if d := dot(sub(cen, p.Verts[0]), p.N); d > 1e-3*h {
			// Fine unless every node is on the outer side or in the plane.
			inner := false
			for _, q := range z.CellNodes(int(p.Cell.Cell)) {
				if dot(sub(z.Point(q), p.Verts[0]), p.N) < -1e-9*h {
					inner = true
				}
			}
			if !inner {
				t.Fatalf("%s: piece at %v given to cell %v on the outer side of its plane", c.Spec, p.Verts[0], p.Cell)
			}
		}
	}
}

// warp moves the interior points of a structured box mesh by up to
// frac of the spacing (deterministic pseudo-random offsets), making its
// hexahedra warped and non-convex-faced.
func warp(z *field.Zone, frac float64) *field.Zone {
	lo, hi := [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}, [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	for i := 0; i < z.NumPoints(); i++ {
		p := z.Point(int32(i))
		for k := 0; k < 3; k++ {
			lo[k], hi[k] = math.Min(lo[k], p[k]), math.Max(hi[k], p[k])
		}
	}
	h := z.Point(1)[0] - z.Point(0)[0]
	seed := uint64(12345)
	rnd := func() float64 { // xorshift64, deterministic
		seed ^= seed << 13
		seed ^= seed >> 7
		seed ^= seed << 17
		return float64(seed%1_000_000)/1_000_000*2 - 1
	}
	for i := 0; i < z.NumPoints(); i++ {
		for k := 0; k < 3; k++ {
			v := &z.Points[3*i+k]
			if *v > lo[k] && *v < hi[k] {
				*v += frac * h * rnd()
			}
		}
	}
	return z
}

func mustParse(t testing.TB, spec string) Shape {
	t.Helper()
	s, err := ParseSpec(spec)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// TestCoverage cuts shapes through hexahedral, tetrahedral, quad,
// triangle and polar meshes, including boxes and rectangles whose faces
// lie exactly on grid planes, and checks that the pieces tile the
// tessellated surface (Σ piece areas = Σ facet areas to 1e-9, VALIDATION
// §1.3 closure requirement on the cut surface).
func TestCoverage(t *testing.T) {
	lo, hi := [3]float64{-1, -1, -1}, [3]float64{1, 1, 1}
	hex := locator(t, fieldtest.BoxHex(lo, hi, [3]int{10, 10, 10}))
	tet := locator(t, fieldtest.BoxTet(lo, hi, [3]int{6, 6, 6}))
	quad := locator(t, fieldtest.RectQuad([2]float64{-1, -1}, [2]float64{1, 1}, [2]int{10, 10}))
	tri := locator(t, fieldtest.RectTri([2]float64{-1, -1}, [2]float64{1, 1}, [2]int{10, 10}))
	ann := locator(t, fieldtest.Annulus(0, 0, 0.2, 2, 12, 40))
	warped := locator(t, warp(fieldtest.BoxHex(lo, hi, [3]int{8, 8, 8}), 0.15))
	twoZones := locator(t, fieldtest.BoxHex(lo, [3]float64{0, 1, 1}, [3]int{5, 10, 10}), fieldtest.BoxHex([3]float64{0, -1, -1}, hi, [3]int{4, 9, 11}))
	cases := []struct {
		l    *field.Locator
		spec string
	}{
		{hex, "sphere center=0.05,0.02,-0.03 radius=0.7"},
		{hex, "sphere center=0,0,0 radius=0.6 facets=200"},
		{hex, "box min=-0.6,-0.4,-0.2 max=0.6,0.4,0.8"}, // faces on grid planes
		{hex, "box min=-1,-1,-1 max=1,1,1"},             // faces on the domain boundary
		{hex, "box min=-0.55,-0.45,-0.35 max=0.65,0.5,0.6 rotate=15,-25,40"},
		{hex, "box min=-0.6,-0.4,-0.2 max=0.6,0.4,0.8 rotate=0,0,45"}, // edges through grid nodes
		{hex, "cylinder center=0,0,0 axis=1,1,0 radius=0.4 length=1.2"},
		{hex, "cylinder center=0,0,0 axis=0,0,1 radius=0.5 length=1.2"}, // caps on grid planes
		{tet, "sphere center=0,0,0 radius=0.7"},
		{tet, "box min=-2/3,-1/3,0 max=1/3,2/3,1"},
		{tet, "box min=-0.5,-0.5,-0.5 max=0.5,0.5,0.5 rotate=0,0,45"},
		{tet, "cylinder center=0.1,0,0 axis=0,1,0 radius=0.5 length=1"},
		{quad, "circle center=0.01,0 radius=0.7"},
		{quad, "rect min=-0.6,-0.4 max=0.6,0.8"},
		{quad, "rect min=-1,-1 max=1,1"},
		{quad, "polygon points=-0.8,-0.8;0.8,-0.6;0.2,0;0.8,0.8;-0.8,0.6"},
		{tri, "circle center=0,0 radius=0.9"},
		{tri, "rect min=-0.6,-0.4 max=0.6,0.8"},
		{tri, "polygon points=-0.8,-0.8;0.8,-0.8;-0.8,0.8"}, // hypotenuse along cell diagonals
		{ann, "circle center=0,0 radius=1"},
		{warped, "sphere center=0,0,0 radius=0.7"},
		{warped, "box min=-0.5,-0.5,-0.5 max=0.5,0.5,0.5"},
		{twoZones, "box min=0,-0.6,-0.6 max=0.6,0.6,0.6"}, // a face on the zone interface
		{twoZones, "sphere center=0,0,0 radius=0.7 facets=500"},
		{ann, "rect min=-1,-1 max=1,1.2"},
	}
	for _, tc := range cases {
		spec := tc.spec
		if spec == "box min=-2/3,-1/3,0 max=1/3,2/3,1" {
			// Grid planes of the 6-cell tet mesh at exact multiples of 1/3.
			s := Box{Min: [3]float64{-1 + 1.0/3, -1 + 2.0/3, 0}, Max: [3]float64{-1 + 4.0/3, -1 + 5.0/3, 1}}
			spec = s.String()
		}
		s := mustParse(t, spec)
		c, err := CutSurface(tc.l, s, CutOptions{})
		if err != nil {
			t.Errorf("%s: %v", spec, err)
			continue
		}
		checkCut(t, tc.l, c, tc.l == warped)
		checkOwner(t, tc.l, c)
		t.Logf("%s: %d facets, %d pieces, %d points, area %.6g (exact %.6g)", spec, c.Facets, len(c.Pieces), len(c.Points), c.Area, c.ExactArea)
	}
}

// TestCoverageError checks that surfaces leaving the mesh or crossing a
// carved-out body are refused with the missing area and its place.
func TestCoverageError(t *testing.T) {
	lo, hi := [3]float64{-1, -1, -1}, [3]float64{1, 1, 1}
	hex := fieldtest.BoxHex(lo, hi, [3]int{10, 10, 10})
	carved := locator(t, fieldtest.Carve(hex, fieldtest.OutsideBall([3]float64{0, 0, 0}, 0.3)))
	full := locator(t, hex)
	ann := locator(t, fieldtest.Annulus(0, 0, 0.5, 2, 10, 40))
	cases := []struct {
		l        *field.Locator
		spec     string
		min, max float64 // expected uncovered fraction range
		near     [3]float64
	}{
		// Box sticking out of the +x face by 0.2: the part beyond x = 1 is
		// 4 side strips 0.2 wide plus the end face (exact box geometry).
		{full, "box min=-0.5,-0.5,-0.5 max=1.2,0.5,0.5", 0, 1, [3]float64{1.2, 0, 0}},
		{full, "sphere center=0.8,0,0 radius=0.5", 0, 1, [3]float64{1.3, 0, 0}},
		{carved, "sphere center=0,0,0 radius=0.35", 0.99, 1.01, [3]float64{0, 0, 0}},
		{carved, "sphere center=0.5,0,0 radius=0.4", 0, 0.9, [3]float64{0, 0, 0}},
		{blanked(hex), "box min=-0.5,-0.5,-0.5 max=0.5,0.5,0.5", 0, 0.9, [3]float64{0, 0, 0}},
		{ann, "circle center=0,0 radius=0.45 facets=64", 0.99, 1.01, [3]float64{0, 0, 0}},
		{ann, "rect min=-0.4,-0.4 max=1,1", 0, 1, [3]float64{-0.4, -0.4, 0}},
		{ann, "circle center=0.6,0 radius=0.3", 0, 0.9, [3]float64{0, 0, 0}},
	}
	for _, tc := range cases {
		_, err := CutSurface(tc.l, mustParse(t, tc.spec), CutOptions{})
		var ce *CoverageError
		if !errors.As(err, &ce) {
			t.Errorf("%s: got %v, want a CoverageError", tc.spec, err)
			continue
		}
		t.Logf("%v", err)
		if !(ce.Fraction > tc.min && ce.Fraction <= tc.max) || !(ce.Uncovered > 0) {
			t.Errorf("%s: uncovered fraction %g outside (%g, %g]", tc.spec, ce.Fraction, tc.min, tc.max)
		}
	}
	// The blank cells x, y > 0.4 take exactly 0.1 × 1 from two side faces
	// and 0.1 × 0.1 from the top and bottom of the box.
	_, err := CutSurface(blanked(hex), mustParse(t, "box min=-0.5,-0.5,-0.5 max=0.5,0.5,0.5"), CutOptions{})
	var ce *CoverageError
	if !errors.As(err, &ce) || math.Abs(ce.Uncovered-0.22) > 1e-12 {
		t.Errorf("blanked box: got %v, want 0.22 m² uncovered", err)
	}
	// The uncovered area of the protruding box is known exactly: the end
	// face 1×1 plus four strips 0.2 × 1.
	_, err = CutSurface(full, mustParse(t, "box min=-0.5,-0.5,-0.5 max=1.2,0.5,0.5"), CutOptions{})
	if errors.As(err, &ce) {
		if math.Abs(ce.Uncovered-1.8) > 1e-12 {
			t.Errorf("protruding box: uncovered %.15g, want 1.8", ce.Uncovered)
		}
		if ce.Near[0] < 1 {
			t.Errorf("protruding box: near %v, want x > 1", ce.Near)
		}
	}
}

// blanked returns a copy of z whose cells with x > 0.3 and y > 0.3 are
// blank (not fluid).
func blanked(z *field.Zone) *field.Locator {
	c := *z
	c.Blank = make([]bool, z.NumCells())
	for i := range c.Blank {
		p := z.Centroid(i)
		c.Blank[i] = p[0] > 0.3 && p[1] > 0.3
	}
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{&c}})
	if err != nil {
		panic(err)
	}
	return l
}

// TestOverlapError checks that zones overlapping in space are reported:
// their cells would count the surface twice.
func TestOverlapError(t *testing.T) {
	l := locator(t, fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{0.2, 1, 1}, [3]int{6, 5, 5}),
		fieldtest.BoxHex([3]float64{-0.2, -1, -1}, [3]float64{1, 1, 1}, [3]int{6, 5, 5}))
	_, err := CutSurface(l, mustParse(t, "box min=-0.5,-0.5,-0.5 max=0.5,0.5,0.5"), CutOptions{})
	var ce *CoverageError
	if !errors.As(err, &ce) || !(ce.Overlap > 0) || ce.Uncovered != 0 {
		t.Fatalf("got %v, want an overlap CoverageError", err)
	}
	// Exactly the strip -0.2 < x < 0.2 of the four side faces overlaps.
	if math.Abs(ce.Overlap-4*0.4*1) > 1e-12 {
		t.Errorf("overlap %.15g, want 1.6", ce.Overlap)
	}
	t.Log(err)
}

// monomial integrates x^a y^b z^c over [lo,hi]^3 exactly.
func monomial(lo, hi [3]float64, e [3]int) float64 {
	v := 1.0
	for k := 0; k < 3; k++ {
		if e[k] < 0 {
			return 0
		}
		p := float64(e[k] + 1)
		v *= (math.Pow(hi[k], p) - math.Pow(lo[k], p)) / p
	}
	return v
}

// TestQuadratureExact integrates ∮ x^a y^b z^c n_k dA over a box cut
// through hexahedral and tetrahedral meshes for every a+b+c <= 5 and
// compares with the volume integral a_k ∫ x^.. y^.. z^.. dV that the Gauss
// divergence theorem gives (∮ f n_k dA = ∫ ∂f/∂x_k dV). The degree-5 rule
// on every piece makes this exact up to rounding; tolerance 1e-11 relative
// to the integral of |f| scale.
func TestQuadratureExact(t *testing.T) {
	lo, hi := [3]float64{-1, -1, -1}, [3]float64{1, 1, 1}
	meshes := []*field.Locator{
		locator(t, fieldtest.BoxHex(lo, hi, [3]int{7, 6, 5})),
		locator(t, fieldtest.BoxTet(lo, hi, [3]int{4, 5, 3})),
	}
	bmin, bmax := [3]float64{-0.63, -0.41, -0.27}, [3]float64{0.71, 0.52, 0.83}
	for _, l := range meshes {
		c, err := CutSurface(l, Box{Min: bmin, Max: bmax}, CutOptions{})
		if err != nil {
			t.Fatal(err)
		}
		for a := 0; a <= 5; a++ {
			for b := 0; a+b <= 5; b++ {
				for cc := 0; a+b+cc <= 5; cc++ {
					e := [3]int{a, b, cc}
					var got [3]float64
					for _, q := range c.Points {
						f := math.Pow(q.X[0], float64(a)) * math.Pow(q.X[1], float64(b)) * math.Pow(q.X[2], float64(cc))
						for k := 0; k < 3; k++ {
							got[k] += q.W * f * q.N[k]
						}
					}
					for k := 0; k < 3; k++ {
						d := e
						d[k]--
						want := float64(e[k]) * monomial(bmin, bmax, d)
						if math.Abs(got[k]-want) > 1e-11 {
							t.Errorf("∮ x^%d y^%d z^%d n_%d dA = %.15g, want %.15g", a, b, cc, k, got[k], want)
						}
					}
				}
			}
		}
	}
}

// TestQuadratureExact2D is the 2D analogue: ∮ x^a y^b n_k ds over a
// rectangle and a polygon = ∫ ∂(x^a y^b)/∂x_k dA (divergence theorem in
// the plane), exact for a+b <= 5 with 3-point Gauss–Legendre per piece.
func TestQuadratureExact2D(t *testing.T) {
	for _, z := range []*field.Zone{
		fieldtest.RectQuad([2]float64{-1, -1}, [2]float64{1, 1}, [2]int{7, 9}),
		fieldtest.RectTri([2]float64{-1, -1}, [2]float64{1, 1}, [2]int{6, 5}),
	} {
		l := locator(t, z)
		bmin, bmax := [3]float64{-0.63, -0.41, 0}, [3]float64{0.71, 0.52, 1}
		c, err := CutSurface(l, Rect{Min: [2]float64{bmin[0], bmin[1]}, Max: [2]float64{bmax[0], bmax[1]}}, CutOptions{})
		if err != nil {
			t.Fatal(err)
		}
		for a := 0; a <= 5; a++ {
			for b := 0; a+b <= 5; b++ {
				var got [2]float64
				for _, q := range c.Points {
					f := math.Pow(q.X[0], float64(a)) * math.Pow(q.X[1], float64(b))
					got[0] += q.W * f * q.N[0]
					got[1] += q.W * f * q.N[1]
				}
				want := [2]float64{float64(a) * monomial(bmin, bmax, [3]int{a - 1, b, 0}), float64(b) * monomial(bmin, bmax, [3]int{a, b - 1, 0})}
				for k := 0; k < 2; k++ {
					if math.Abs(got[k]-want[k]) > 1e-12 {
						t.Errorf("∮ x^%d y^%d n_%d ds = %.15g, want %.15g", a, b, k, got[k], want[k])
					}
				}
			}
		}
	}
}

// TestDeterministic checks that the cut is bit-for-bit the same for 1, 2
// and 5 workers (house rule 7).
func TestDeterministic(t *testing.T) {
	l := locator(t, fieldtest.BoxTet([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{8, 8, 8}))
	s := mustParse(t, "sphere center=0.03,0,0 radius=0.8 facets=3000")
	var ref *Cut
	for _, w := range []int{1, 2, 5} {
		c, err := CutSurface(l, s, CutOptions{Workers: w})
		if err != nil {
			t.Fatal(err)
		}
		if ref == nil {
			ref = c
			continue
		}
		if !reflect.DeepEqual(ref, c) {
			t.Errorf("cut with %d workers differs from 1 worker", w)
		}
	}
}
