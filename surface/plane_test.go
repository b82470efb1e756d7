package surface

import (
	"errors"
	"math"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

func mustPlane(t *testing.T, spec string) Plane {
	t.Helper()
	p, err := ParsePlane(spec)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// TestPlaneCut cuts rectangular planes (one between grid planes, one on a
// grid plane, one tilted, and the mesh section) through a tetrahedral box
// and checks the exact area (Σ w = bounded area, exact for flat shapes),
// the normal and that the quadrature integrates y²z exactly (degree-5
// rule; the exact value ∫∫y²z dy dz is elementary calculus).
func TestPlaneCut(t *testing.T) {
	l := locator(t, fieldtest.BoxTet([3]float64{0, -2, -1}, [3]float64{4, 2, 1}, [3]int{6, 5, 4}))
	for _, tc := range []struct {
		spec string
		area float64
		n    [3]float64
	}{
		{"plane x=1.3 ymin=-1.5 ymax=1.2 zmin=-0.7 zmax=0.9", 2.7 * 1.6, [3]float64{1, 0, 0}},
		{"x=2 ymin=-1 ymax=1 zmin=-1 zmax=1 size=0.3", 4, [3]float64{1, 0, 0}},
		{"x=2.5", 8, [3]float64{1, 0, 0}},
		{"origin=2,0,0 normal=1,0.2,0 ymin=-1 ymax=1 zmin=-0.5 zmax=0.5", 2, unit([3]float64{1, 0.2, 0})},
	} {
		c, p, err := CutPlane(l, mustPlane(t, tc.spec), CutOptions{})
		if err != nil {
			t.Fatalf("%s: %v", tc.spec, err)
		}
		// The plane is open: its closure is its area times its normal.
		if d := sub(c.Closure, scale(tc.n, tc.area)); norm(d) > 1e-12*tc.area {
			t.Errorf("%s: closure %v, want area × normal", tc.spec, c.Closure)
		}
		c.Closure = [3]float64{}
		checkCut(t, l, c, false)
		var w, y2z field.CompensatedSum
		for _, q := range c.Points {
			w.Add(q.W)
			if d := sub(q.N, tc.n); norm(d) > 1e-14 {
				t.Fatalf("%s: normal %v, want %v", tc.spec, q.N, tc.n)
			}
			s1, s2 := p.Coords(q.X)
			y2z.Add(q.W * s1 * s1 * s2)
		}
		if math.Abs(w.Value()-tc.area) > 1e-12*tc.area {
			t.Errorf("%s: Σw = %.15g, want %g", tc.spec, w.Value(), tc.area)
		}
		want := (math.Pow(p.Max[0], 3) - math.Pow(p.Min[0], 3)) / 3 * (p.Max[1]*p.Max[1] - p.Min[1]*p.Min[1]) / 2
		if math.Abs(y2z.Value()-want) > 1e-12 {
			t.Errorf("%s: ∫y²z = %.15g, want %.15g", tc.spec, y2z.Value(), want)
		}
	}
}

// TestPlaneDiscOrder checks that the tessellated disc area converges to
// πR² at second order (an inscribed polygon with m sides has area
// (m/2)R² sin(2π/m) = πR²(1 − (2π/m)²/6 + …); tolerance ±0.2 on the order
// allows the rounding of m to whole sectors).
func TestPlaneDiscOrder(t *testing.T) {
	l := locator(t, fieldtest.BoxHex([3]float64{0, -2, -2}, [3]float64{2, 2, 2}, [3]int{2, 4, 4}))
	var hs, errs []float64
	for _, h := range []float64{0.4, 0.2, 0.1} {
		p := mustPlane(t, "x=1.1 radius=1.5 center=0.2,-0.1")
		p.Res.Size = h
		c, _, err := CutPlane(l, p, CutOptions{})
		if err != nil {
			t.Fatal(err)
		}
		hs = append(hs, h)
		errs = append(errs, math.Abs(c.Area-c.ExactArea)/c.ExactArea)
	}
	ord := math.Log(errs[0]/errs[2]) / math.Log(hs[0]/hs[2])
	if math.Abs(ord-2) > 0.2 {
		t.Errorf("disc area order %.3f (errors %v), want 2", ord, errs)
	}
}

// TestPlane2D cuts the line x = X of a 2D field.
func TestPlane2D(t *testing.T) {
	l := locator(t, fieldtest.RectTri([2]float64{-1, -3}, [2]float64{5, 3}, [2]int{7, 9}))
	for _, spec := range []string{"x=2.2 ymin=-2.5 ymax=1", "x=2.2"} {
		c, p, err := CutPlane(l, mustPlane(t, spec), CutOptions{})
		if err != nil {
			t.Fatal(err)
		}
		want := p.Max[0] - p.Min[0]
		if math.Abs(c.Area-want) > 1e-12 || c.Dim != 2 {
			t.Errorf("%s: length %g dim %d, want %g, 2", spec, c.Area, c.Dim, want)
		}
		for _, q := range c.Points {
			if q.N != [3]float64{1, 0, 0} {
				t.Fatalf("%s: normal %v", spec, q.N)
			}
		}
	}
}

// TestPlaneErrors checks spec errors and coverage errors.
func TestPlaneErrors(t *testing.T) {
	for _, spec := range []string{"", "y=3", "x=1 ymin=0", "x=1 ymin=1 ymax=0 zmin=0 zmax=1", "x=1 radius=-2",
		"x=1 radius=1 ymin=0 ymax=1 zmin=0 zmax=1", "origin=1,0,0", "origin=0,0,0 normal=0,0,0", "x=1 center=1,1",
		"origin=0,0,0 normal=0,0,1 up=0,0,2", "x=a"} {
		if _, err := ParsePlane(spec); err == nil {
			t.Errorf("%q: no error", spec)
		} else if se := (*SpecError)(nil); !errors.As(err, &se) {
			t.Errorf("%q: error %T, want *SpecError", spec, err)
		}
	}
	l := locator(t, fieldtest.BoxHex([3]float64{0, -2, -1}, [3]float64{4, 2, 1}, [3]int{4, 4, 2}))
	_, _, err := CutPlane(l, mustPlane(t, "x=1 ymin=-3 ymax=1 zmin=-0.5 zmax=0.5"), CutOptions{})
	var ce *CoverageError
	if !errors.As(err, &ce) || math.Abs(ce.Uncovered-1) > 1e-9 {
		t.Errorf("plane leaving the mesh: %v, want a coverage error of 1 m²", err)
	}
	_, err = PlaneGridOf(l, mustPlane(t, "x=1 ymin=-3 ymax=1 zmin=-0.5 zmax=0.5"), 8, 2)
	var ge *GridError
	if !errors.As(err, &ge) || ge.Missing != 4 {
		t.Errorf("grid leaving the mesh: %v, want 4 missing points", err)
	}
}

// TestPlaneRoundTrip checks that String reads back to the same plane.
func TestPlaneRoundTrip(t *testing.T) {
	for _, spec := range []string{"x=1.5 ymin=-1 ymax=2 zmin=-3 zmax=4 size=0.25", "x=-2 radius=3 center=1,2",
		"origin=1,2,3 normal=0,1,0 up=1,0,0 ymin=0 ymax=1 zmin=0 zmax=1", "x=0"} {
		p := mustPlane(t, spec)
		q := mustPlane(t, p.String())
		if p != q {
			t.Errorf("%q: read back %+v, want %+v", spec, q, p)
		}
	}
}

// TestPlaneGrid checks the grid positions against the plane coordinates.
func TestPlaneGrid(t *testing.T) {
	l := locator(t, fieldtest.BoxHex([3]float64{0, -2, -1}, [3]float64{4, 2, 1}, [3]int{4, 4, 2}))
	g, err := PlaneGridOf(l, mustPlane(t, "x=1.5"), 8, 4)
	if err != nil {
		t.Fatal(err)
	}
	if g.H1 != 0.5 || g.H2 != 0.5 || g.X[0] != [3]float64{1.5, -1.75, -0.75} || g.X[8*4-1] != [3]float64{1.5, 1.75, 0.75} {
		t.Errorf("grid h %g %g, first %v last %v", g.H1, g.H2, g.X[0], g.X[len(g.X)-1])
	}
}
