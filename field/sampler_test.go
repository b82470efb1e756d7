package field_test

import (
	"math"
	"math/rand/v2"
	"strings"
	"sync"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// prepared builds a locator and sampler over zones and prepares names.
func prepared(t testing.TB, zones []*field.Zone, names ...string) (*field.Locator, *field.Sampler, []field.ArrayID) {
	t.Helper()
	l := mustLocator(t, zones...)
	s := field.NewSampler(l)
	var ids []field.ArrayID
	for _, n := range names {
		id, err := s.Prepare(n)
		if err != nil {
			t.Fatal(err)
		}
		ids = append(ids, id)
	}
	return l, s, ids
}

// randomInside returns random points of [0,1]^dim that lie in an indexed
// cell, with their locations.
func randomInside(t testing.TB, l *field.Locator, rng *rand.Rand, n int) ([][3]float64, []field.Location) {
	t.Helper()
	var pts [][3]float64
	var locs []field.Location
	for len(pts) < n {
		var p [3]float64
		for k := 0; k < l.Dim(); k++ {
			p[k] = rng.Float64()
		}
		if loc, ok := l.Locate(p); ok {
			pts, locs = append(pts, p), append(locs, loc)
		}
	}
	return pts, locs
}

// polyField is a polynomial vector field of degree deg with 2 components,
// random coefficients, and its gradient.
type polyField struct {
	dim, deg int
	c        [2][10]float64
}

func newPolyField(dim, deg int, rng *rand.Rand) polyField {
	p := polyField{dim: dim, deg: deg}
	for i := range p.c {
		for j := range p.c[i] {
			p.c[i][j] = rng.NormFloat64()
		}
	}
	return p
}

func (p polyField) eval(x [3]float64, dst []float64) {
	if p.dim == 2 {
		x[2] = 0
	}
	for i := 0; i < 2; i++ {
		c := p.c[i]
		v := c[0] + c[1]*x[0] + c[2]*x[1] + c[3]*x[2]
		if p.deg == 2 {
			v += c[4]*x[0]*x[0] + c[5]*x[1]*x[1] + c[6]*x[2]*x[2] + c[7]*x[0]*x[1] + c[8]*x[1]*x[2] + c[9]*x[2]*x[0]
		}
		dst[i] = v
	}
}

func (p polyField) grad(x [3]float64) (g [6]float64) {
	if p.dim == 2 {
		x[2] = 0
	}
	for i := 0; i < 2; i++ {
		c := p.c[i]
		g[3*i], g[3*i+1], g[3*i+2] = c[1], c[2], c[3]
		if p.deg == 2 {
			g[3*i] += 2*c[4]*x[0] + c[7]*x[1] + c[9]*x[2]
			g[3*i+1] += 2*c[5]*x[1] + c[7]*x[0] + c[8]*x[2]
			g[3*i+2] += 2*c[6]*x[2] + c[8]*x[1] + c[9]*x[0]
		}
		if p.dim == 2 {
			g[3*i+2] = 0
		}
	}
	return g
}

// checkSamples compares Value and the gradients of the listed methods with
// the field at random points, to tol relative to the field's scale.
func checkSamples(t *testing.T, what string, l *field.Locator, s *field.Sampler, id field.ArrayID, pf polyField, value bool, methods []field.GradientMethod, tol float64) {
	t.Helper()
	rng := rand.New(rand.NewPCG(41, 42))
	pts, locs := randomInside(t, l, rng, 300)
	v := make([]float64, 2)
	g := make([]float64, 6)
	want := make([]float64, 2)
	for i, p := range pts {
		pf.eval(p, want)
		if value {
			s.Value(id, locs[i], v)
			for c := 0; c < 2; c++ {
				if math.Abs(v[c]-want[c]) > tol {
					t.Fatalf("%s: value at %v = %v, want %v", what, p, v, want)
				}
			}
		}
		wg := pf.grad(p)
		for _, m := range methods {
			s.GradientWith(m, id, locs[i], g)
			for j := range g {
				if math.Abs(g[j]-wg[j]) > tol {
					t.Fatalf("%s: %s gradient at %v = %v, want %v", what, m, p, g, wg)
				}
			}
		}
	}
}

// Exact: point data of a linear field are interpolated exactly, and both
// gradient methods return the exact gradient (shape functions reproduce
// linear fields; a least-squares quadratic reproduces any polynomial of
// degree ≤ 2), on perturbed meshes of every type. Cell data of a linear
// field are reconstructed exactly, value and gradient. Tolerance 1e-9:
// rounding in least-squares fits with condition numbers up to ~1e4.
func TestLinearFieldsExact(t *testing.T) {
	rng := rand.New(rand.NewPCG(43, 44))
	for _, mc := range meshCases {
		t.Run(mc.name, func(t *testing.T) {
			z := mc.build(5)
			fieldtest.Perturb(z, 0.04, 45)
			pf := newPolyField(mc.dim, 1, rng)
			fieldtest.SamplePoints(z, "p", 2, pf.eval)
			fieldtest.SampleCells(z, "c", 2, pf.eval)
			l, s, ids := prepared(t, []*field.Zone{z}, "p", "c")
			both := []field.GradientMethod{field.GradientShape, field.GradientRecovered}
			checkSamples(t, "point data", l, s, ids[0], pf, true, both, 1e-9)
			checkSamples(t, "cell data", l, s, ids[1], pf, true, both, 1e-9)
		})
	}
}

// Exact: for a quadratic field, the recovered gradient of point data is
// exact (the nodal fits are exact and the shape functions interpolate the
// linear gradient exactly), and the cell-data reconstruction is exact in
// value and gradient, on perturbed meshes of every type, boundary cells
// included.
func TestQuadraticFieldsExact(t *testing.T) {
	rng := rand.New(rand.NewPCG(46, 47))
	for _, mc := range meshCases {
		t.Run(mc.name, func(t *testing.T) {
			z := mc.build(5)
			fieldtest.Perturb(z, 0.04, 48)
			pf := newPolyField(mc.dim, 2, rng)
			fieldtest.SamplePoints(z, "p", 2, pf.eval)
			fieldtest.SampleCells(z, "c", 2, pf.eval)
			l, s, ids := prepared(t, []*field.Zone{z}, "p", "c")
			checkSamples(t, "point data", l, s, ids[0], pf, false, []field.GradientMethod{field.GradientRecovered}, 1e-8)
			checkSamples(t, "cell data", l, s, ids[1], pf, true, []field.GradientMethod{field.GradientRecovered}, 1e-8)
		})
	}
}

// Exact: bilinear fields on quads and trilinear fields on hexahedra
// (axis-aligned cells) are interpolated exactly with exact shape-function
// gradients (the shape functions span 1, x, y, z, xy, yz, zx, xyz).
func TestMultilinearExact(t *testing.T) {
	tri := func(x [3]float64, dst []float64) {
		dst[0] = 1 + 2*x[0] - x[1] + 0.5*x[2] + 3*x[0]*x[1] - 2*x[1]*x[2] + x[2]*x[0] + 4*x[0]*x[1]*x[2]
	}
	triGrad := func(x [3]float64) [3]float64 {
		return [3]float64{2 + 3*x[1] + x[2] + 4*x[1]*x[2], -1 + 3*x[0] - 2*x[2] + 4*x[0]*x[2], 0.5 - 2*x[1] + x[0] + 4*x[0]*x[1]}
	}
	for _, z := range []*field.Zone{
		fieldtest.BoxHex([3]float64{-1, 0, 2}, [3]float64{2, 1, 3}, [3]int{4, 3, 5}),
		fieldtest.RectQuad([2]float64{-1, 0}, [2]float64{2, 1}, [2]int{4, 3}),
	} {
		fieldtest.SamplePoints(z, "f", 1, tri)
		l, s, ids := prepared(t, []*field.Zone{z}, "f")
		rng := rand.New(rand.NewPCG(49, 50))
		v, g := make([]float64, 1), make([]float64, 3)
		for i := 0; i < 300; i++ {
			p := [3]float64{-1 + 3*rng.Float64(), rng.Float64(), 2 + rng.Float64()}
			if l.Dim() == 2 {
				p[2] = 0
			}
			loc, ok := l.Locate(p)
			if !ok {
				t.Fatalf("%v not located", p)
			}
			tri(p, v)
			want := v[0]
			s.Value(ids[0], loc, v)
			s.GradientWith(field.GradientShape, ids[0], loc, g)
			wg := triGrad(p)
			if l.Dim() == 2 {
				wg[2] = 0
			}
			if math.Abs(v[0]-want) > 1e-12 || math.Abs(g[0]-wg[0])+math.Abs(g[1]-wg[1])+math.Abs(g[2]-wg[2]) > 1e-11 {
				t.Fatalf("dim %d at %v: %v %v, want %v %v", l.Dim(), p, v[0], g, want, wg)
			}
		}
	}
}

// Consistency: a field split into two zones at x = 1/2 samples like the
// same mesh as one zone (stencils and patches cross the interface), to
// rounding, for point and cell data of a smooth field.
func TestMultiZoneSamplingMatchesSingleZone(t *testing.T) {
	fn := func(x [3]float64, dst []float64) { dst[0], _ = smooth(x) }
	a, b := splitBox(6)
	one := fieldtest.BoxHex(unitLo, unitHi, [3]int{6, 6, 6})
	for _, z := range []*field.Zone{a, b, one} {
		fieldtest.SamplePoints(z, "p", 1, fn)
		fieldtest.SampleCells(z, "c", 1, fn)
	}
	l2, s2, ids2 := prepared(t, []*field.Zone{a, b}, "p", "c")
	l1, s1, ids1 := prepared(t, []*field.Zone{one}, "p", "c")
	rng := rand.New(rand.NewPCG(51, 52))
	pts, locs2 := randomInside(t, l2, rng, 500)
	pts = append(pts, [3]float64{0.5, 0.3, 0.4}, [3]float64{0.5, 0.5, 0.5})
	for _, p := range pts[500:] {
		loc, _ := l2.Locate(p)
		locs2 = append(locs2, loc)
	}
	v1, v2 := make([]float64, 3), make([]float64, 3)
	for i, p := range pts {
		loc1, ok := l1.Locate(p)
		if !ok {
			t.Fatal(p)
		}
		for k := 0; k < 2; k++ {
			s1.Value(ids1[k], loc1, v1)
			s2.Value(ids2[k], locs2[i], v2)
			if math.Abs(v1[0]-v2[0]) > 1e-12 {
				t.Fatalf("array %d value at %v: one zone %v, two zones %v", k, p, v1[0], v2[0])
			}
			s1.Gradient(ids1[k], loc1, v1)
			s2.Gradient(ids2[k], locs2[i], v2)
			for j := 0; j < 3; j++ {
				if math.Abs(v1[j]-v2[j]) > 1e-10 {
					t.Fatalf("array %d gradient at %v: one zone %v, two zones %v", k, p, v1, v2)
				}
			}
		}
	}
}

// Exact: blank cells stay out of reconstruction stencils: a quadratic is
// still reconstructed exactly next to a blank cell holding garbage (1e30).
func TestBlankCellsExcludedFromStencils(t *testing.T) {
	rng := rand.New(rand.NewPCG(53, 54))
	z := fieldtest.BoxHex(unitLo, unitHi, [3]int{5, 5, 5})
	pf := newPolyField(3, 2, rng)
	fieldtest.SampleCells(z, "c", 2, pf.eval)
	z.Blank = make([]bool, z.NumCells())
	mid := 2 + 5*(2+5*2)
	z.Blank[mid] = true
	z.Arrays[0].Data[2*mid] = 1e30
	z.Arrays[0].Data[2*mid+1] = math.NaN() // not reachable: no error either
	l, s, ids := prepared(t, []*field.Zone{z}, "c")
	checkSamples(t, "cell data beside a blank cell", l, s, ids[0], pf, true, []field.GradientMethod{field.GradientRecovered}, 1e-8)
}

// Errors: Prepare names the array, the zone and the index of a NaN or Inf,
// a missing array, or a component mismatch; preparing twice gives one id.
func TestPrepareErrors(t *testing.T) {
	build := func() (*field.Zone, *field.Zone) {
		a, b := splitBox(4)
		for _, z := range []*field.Zone{a, b} {
			fieldtest.SamplePoints(z, "p", 3, func(x [3]float64, d []float64) { copy(d, x[:]) })
			fieldtest.SampleCells(z, "c", 1, func(x [3]float64, d []float64) { d[0] = x[0] })
		}
		return a, b
	}
	a, b := build()
	b.Arrays[0].Data[3*7+2] = math.NaN()
	b.Arrays[1].Data[5] = math.Inf(-1)
	s := field.NewSampler(mustLocator(t, a, b))
	for _, c := range []struct{ name, want string }{
		{"p", `array "p": zone 1 ("right"): point 7 component 2 is NaN`},
		{"c", `array "c": zone 1 ("right"): cell 5 component 0 is -Inf`},
		{"nope", `array "nope": missing in zone 0`},
	} {
		_, err := s.Prepare(c.name)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Prepare(%q) = %v, want an error containing %q", c.name, err, c.want)
		}
	}
	a, b = build()
	b.Arrays[1].Components, b.Arrays[1].Data = 2, append(b.Arrays[1].Data, b.Arrays[1].Data...)
	s = field.NewSampler(mustLocator(t, a, b))
	if _, err := s.Prepare("c"); err == nil || !strings.Contains(err.Error(), "2 components") {
		t.Errorf("component mismatch: %v", err)
	}
	id1, err1 := s.Prepare("p")
	id2, err2 := s.Prepare("p")
	if err1 != nil || err2 != nil || id1 != id2 || s.Components(id1) != 3 {
		t.Errorf("repeat Prepare: %v %v %v %v", id1, id2, err1, err2)
	}
}

// Determinism (house rule 7): lazily built reconstructions give the same
// bits whatever the query order and concurrency.
func TestSamplerDeterministicUnderConcurrency(t *testing.T) {
	fn := func(x [3]float64, dst []float64) { dst[0], _ = smooth(x) }
	mk := func() (*field.Locator, *field.Sampler, []field.ArrayID) {
		z := fieldtest.BoxTet(unitLo, unitHi, [3]int{6, 6, 6})
		fieldtest.Perturb(z, 0.02, 55)
		fieldtest.SamplePoints(z, "p", 1, fn)
		fieldtest.SampleCells(z, "c", 1, fn)
		return prepared(t, []*field.Zone{z}, "p", "c")
	}
	l, s, ids := mk()
	rng := rand.New(rand.NewPCG(56, 57))
	_, locs := randomInside(t, l, rng, 2000)
	eval := func(s *field.Sampler, i int) [8]float64 {
		var out [8]float64
		for k, id := range ids {
			s.Value(id, locs[i], out[4*k:4*k+1])
			s.Gradient(id, locs[i], out[4*k+1:4*k+4])
		}
		return out
	}
	serial := make([][8]float64, len(locs))
	for i := range locs {
		serial[i] = eval(s, i)
	}
	_, s2, _ := mk()
	const workers = 4
	par := make([][][8]float64, workers)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		par[w] = make([][8]float64, len(locs))
		wg.Add(1)
		go func() {
			defer wg.Done()
			for j := range locs {
				i := (j*7 + w*len(locs)/workers) % len(locs) // different orders
				par[w][i] = eval(s2, i)
			}
		}()
	}
	wg.Wait()
	for w := range par {
		for i := range locs {
			if serial[i] != par[w][i] {
				t.Fatalf("point %d: serial %v, goroutine %d %v", i, serial[i], w, par[w][i])
			}
		}
	}
}

// Exact: stencils grow by rings of cells sharing nodes, so they never reach
// across a thin body: below a body one cell thick (a row of blank cells)
// a quadratic is reproduced exactly although the values above it differ by
// 1e3, for cell data (value and gradient) and for point data (recovered
// gradient), including at the nodes on the body's lower face.
func TestStencilsDoNotCrossThinBody(t *testing.T) {
	const n = 20
	z := fieldtest.RectQuad([2]float64{0, 0}, [2]float64{1, 1}, [2]int{n, n})
	pf := newPolyField(2, 2, rand.New(rand.NewPCG(58, 59)))
	jump := func(x [3]float64, dst []float64) {
		pf.eval(x, dst)
		if x[1] > 0.5+1e-9 {
			dst[0] += 1e3
			dst[1] -= 1e3
		}
	}
	fieldtest.SamplePoints(z, "p", 2, jump)
	fieldtest.SampleCells(z, "c", 2, jump)
	z.Blank = make([]bool, z.NumCells())
	for i := 1; i < n-1; i++ {
		z.Blank[10*n+i] = true // row 10: y in [0.50, 0.55]
	}
	l, s, ids := prepared(t, []*field.Zone{z}, "p", "c")
	v, g, want := make([]float64, 2), make([]float64, 6), make([]float64, 2)
	rng := rand.New(rand.NewPCG(60, 61))
	for trial := 0; trial < 300; trial++ {
		p := [3]float64{0.3 + 0.4*rng.Float64(), 0.45 + 0.05*rng.Float64(), 0} // row 9, i = 6..13
		loc, ok := l.Locate(p)
		if !ok {
			t.Fatal(p)
		}
		pf.eval(p, want)
		wg := pf.grad(p)
		s.Value(ids[1], loc, v)
		if math.Abs(v[0]-want[0])+math.Abs(v[1]-want[1]) > 1e-8 {
			t.Fatalf("cell data value at %v: %v, want %v", p, v, want)
		}
		for _, id := range ids {
			s.Gradient(id, loc, g)
			for j := range g {
				if math.Abs(g[j]-wg[j]) > 1e-7 {
					t.Fatalf("array %d gradient at %v: %v, want %v", id, p, g, wg)
				}
			}
		}
	}
}

// Robustness (house rule 6, never panic on data): meshes of random,
// overlapping, inverted and degenerate cells (coincident nodes, zero
// volume) of every type: building, locating, boxing and sampling never
// panic, and a located point's local coordinates map back to it.
func TestGarbageMeshesDoNotPanic(t *testing.T) {
	rng := rand.New(rand.NewPCG(62, 63))
	types3 := []field.CellType{field.Tetra, field.Hexa, field.Wedge, field.Pyramid}
	types2 := []field.CellType{field.Triangle, field.Quad}
	for trial := 0; trial < 200; trial++ {
		dim := 2 + trial%2
		z := &field.Zone{Name: "garbage"}
		np := 3 + rng.IntN(12)
		for i := 0; i < np; i++ {
			p := [3]float64{float64(rng.IntN(3)), float64(rng.IntN(3)), 0} // many coincident points
			if dim == 3 {
				p[2] = float64(rng.IntN(3))
			}
			z.Points = append(z.Points, p[:]...)
		}
		types := types2
		if dim == 3 {
			types = types3
			z.Points[2] = 0.5 // make the field 3D
		}
		for c := 0; c < 1+rng.IntN(6); c++ {
			ct := types[rng.IntN(len(types))]
			nodes := make([]int32, ct.NumNodes())
			for i := range nodes {
				nodes[i] = int32(rng.IntN(np))
			}
			z.AddCell(ct, nodes...)
		}
		fieldtest.SamplePoints(z, "p", 2, func(x [3]float64, d []float64) { d[0], d[1] = x[0], x[1]*x[2] })
		fieldtest.SampleCells(z, "c", 1, func(x [3]float64, d []float64) { d[0] = x[0] })
		l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
		if err != nil {
			continue // e.g. no cell of the field's dimension
		}
		s := field.NewSampler(l)
		ip, err1 := s.Prepare("p")
		ic, err2 := s.Prepare("c")
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		v, g := make([]float64, 2), make([]float64, 6)
		for q := 0; q < 50; q++ {
			p := [3]float64{2.2*rng.Float64() - 0.1, 2.2*rng.Float64() - 0.1, 2.2*rng.Float64() - 0.1}
			l.CellsInBox(p, [3]float64{p[0] + 0.5, p[1] + 0.5, p[2] + 0.5}, nil)
			l.CellSize(p)
			loc, ok := l.Locate(p)
			if !ok {
				continue
			}
			s.Value(ip, loc, v)
			s.Value(ic, loc, v)
			s.Gradient(ip, loc, g)
			s.GradientWith(field.GradientShape, ip, loc, g)
			s.Gradient(ic, loc, g)
		}
	}
}
