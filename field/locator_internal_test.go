package field

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// hexGrid returns an n³ grid of hexahedra over the unit cube with nodes
// moved randomly by up to 0.2/n (a local fixture: package fieldtest cannot
// be imported from inside package field).
func hexGrid(n int, seed uint64) *Zone {
	z := &Zone{Name: "grid"}
	rng := rand.New(rand.NewPCG(seed, 1))
	for k := 0; k <= n; k++ {
		for j := 0; j <= n; j++ {
			for i := 0; i <= n; i++ {
				d := func() float64 { return 0.2 / float64(n) * (2*rng.Float64() - 1) }
				z.Points = append(z.Points, float64(i)/float64(n)+d(), float64(j)/float64(n)+d(), float64(k)/float64(n)+d())
			}
		}
	}
	id := func(i, j, k int) int32 { return int32(i + (n+1)*(j+(n+1)*k)) }
	for k := 0; k < n; k++ {
		for j := 0; j < n; j++ {
			for i := 0; i < n; i++ {
				z.AddCell(Hexa, id(i, j, k), id(i+1, j, k), id(i+1, j+1, k), id(i, j+1, k),
					id(i, j, k+1), id(i+1, j, k+1), id(i+1, j+1, k+1), id(i, j+1, k+1))
			}
		}
	}
	return z
}

// Determinism (house rule 7): the index built by 1, 2 or 3 workers is the
// same, array for array, also when a worker's chunk starts in the second
// zone.
func TestLocatorBuildIndependentOfWorkers(t *testing.T) {
	f := &Field{Zones: []*Zone{hexGrid(30, 4), hexGrid(44, 3)}}
	ref, err := newLocator(f, 1)
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range []int{2, 3} {
		l, err := newLocator(f, w)
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(l.start, ref.start) || !slices.Equal(l.items, ref.items) || !slices.Equal(l.box, ref.box) ||
			!slices.Equal(l.base, ref.base) || !slices.Equal(l.stride, ref.stride) || l.n != ref.n {
			t.Fatalf("%d workers: index differs from the serial one", w)
		}
	}
}

// Exact: the quantized filter of a bin never rejects a cell whose exact
// padded box holds the point (random points, and points on the box faces
// and corners, where rounding would show), and it does reject some
// entries (so this test can fail).
func TestQuantizedFilterConservative(t *testing.T) {
	l, err := newLocator(&Field{Zones: []*Zone{hexGrid(12, 5)}}, 1)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(21, 22))
	var pts [][3]float64
	for i := 0; i < 5000; i++ {
		pts = append(pts, [3]float64{rng.Float64(), rng.Float64(), rng.Float64()})
	}
	for g := 0; g < len(l.box)/6; g += 7 {
		b := l.box[6*g : 6*g+6]
		for m := 0; m < 8; m++ {
			pts = append(pts, [3]float64{b[3*(m&1)], b[1+3*(m>>1&1)], b[2+3*(m>>2)]})
		}
	}
	rejected := 0
	for _, p := range pts {
		var bin int
		var q uint32
		for k := 2; k >= 0; k-- {
			f := l.binCoord(k, p[k])
			i := min(max(int(f), 0), l.n[k]-1)
			bin = bin*l.n[k] + i
			q |= quantize(f-float64(i)) << (10 * uint(k))
		}
		for _, e := range l.items[l.start[bin]:l.start[bin+1]] {
			b := l.box[6*int(e.id) : 6*int(e.id)+6]
			in := p[0] >= b[0] && p[0] <= b[3] && p[1] >= b[1] && p[1] <= b[4] && p[2] >= b[2] && p[2] <= b[5]
			if in && !e.mayHold(q) {
				t.Fatalf("point %v in the box %v of cell %d rejected by the filter", p, b, e.id)
			}
			if !e.mayHold(q) {
				rejected++
			}
		}
	}
	if rejected == 0 {
		t.Fatal("the filter rejected nothing")
	}
}

// Reference: tetOutside agrees with the inverse map (the reference
// containment test): it never rejects a point the inverse map accepts,
// also for flat, nearly degenerate and inverted tetrahedra, and it rejects
// every point of a well-shaped tetrahedron whose smallest barycentric
// coordinate is below -1e-5.
func TestTetOutsideConservative(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 24))
	for trial := 0; trial < 3000; trial++ {
		var g cellGeom
		g.t, g.n, g.dim = Tetra, 4, 3
		for i := range 4 {
			for k := range 3 {
				g.x[i][k] = rng.Float64()
			}
		}
		if trial%3 == 1 { // flat: node 3 near the plane of the others
			e := 1e-5 * rng.Float64()
			for k := range 3 {
				g.x[3][k] = (g.x[0][k]+g.x[1][k]+g.x[2][k])/3 + e*float64(k)
			}
		}
		var im inverseMap
		im.init(&g)
		for j := 0; j < 50; j++ {
			// Points near the tetrahedron: barycentric combinations with
			// some weights slightly negative, and points on its faces.
			var w [4]float64
			sum := 0.0
			for i := range w {
				w[i] = rng.Float64() - 0.05
				if j%5 == 0 && i == j%4 {
					w[i] = 0
				}
				sum += w[i]
			}
			var p [3]float64
			for i := range w {
				for k := range 3 {
					p[k] += w[i] / sum * g.x[i][k]
				}
			}
			r, ok := im.local(p)
			in := ok && contains(Tetra, r, localTol)
			out := g.tetOutside(p)
			if in && out {
				t.Fatalf("trial %d: point %v in the tetrahedron %v (local %v) rejected", trial, p, g.x[:4], r)
			}
			if trial%3 != 1 && ok && !out {
				lam := min(r[0], r[1], r[2], 1-r[0]-r[1]-r[2])
				if lam < -1e-5 {
					h := g.size()
					if d := g.tetDet(); math.Abs(d) >= 1e-3*h*h*h {
						t.Fatalf("trial %d: point with barycentric %v not rejected", trial, lam)
					}
				}
			}
		}
	}
}

// tetDet returns the determinant of the edge vectors of tetrahedron g.
func (g *cellGeom) tetDet() float64 {
	var e [3][3]float64
	for i := range 3 {
		for k := range 3 {
			e[i][k] = g.x[i+1][k] - g.x[0][k]
		}
	}
	n := cross(e[1], e[2])
	return e[0][0]*n[0] + e[0][1]*n[1] + e[0][2]*n[2]
}

// Exact: the scalar 3D Newton step gives the same bits as the general one
// (eval then solve3) on random hexahedra, wedges and pyramids at random
// iterates.
func TestNewtonStep3MatchesNewtonStep(t *testing.T) {
	rng := rand.New(rand.NewPCG(25, 26))
	z := hexGrid(3, 7)
	for trial := 0; trial < 2000; trial++ {
		var g cellGeom
		z.gather(trial%z.NumCells(), &g)
		g.t = []CellType{Hexa, Wedge, Pyramid}[trial%3]
		g.n = map[CellType]int{Hexa: 8, Wedge: 6, Pyramid: 5}[g.t]
		m := g.multilinear()
		r := [3]float64{3*rng.Float64() - 1, 3*rng.Float64() - 1, 3*rng.Float64() - 1}
		p := [3]float64{rng.Float64(), rng.Float64(), rng.Float64()}
		want, _, wok := m.newtonStep(r, p, 3)
		var got [3]float64
		var ok bool
		got[0], got[1], got[2], ok = m.newtonStep3(r[0], r[1], r[2], &p)
		if ok != wok || ok && got != want {
			t.Fatalf("trial %d: newtonStep3 = %v %v, newtonStep = %v %v", trial, got, ok, want, wok)
		}
	}
}

// Exact: uniformStride finds the node count of zones of one cell type and
// gives 0 for mixed or empty zones.
func TestUniformStride(t *testing.T) {
	z := hexGrid(2, 1)
	if s := uniformStride(z); s != 8 {
		t.Fatalf("hexahedra: stride %d, want 8", s)
	}
	z.AddCell(Quad, 0, 1, 4, 3)
	if s := uniformStride(z); s != 0 {
		t.Fatalf("mixed zone: stride %d, want 0", s)
	}
	if s := uniformStride(&Zone{}); s != 0 {
		t.Fatalf("empty zone: stride %d, want 0", s)
	}
}

// Exact: the build's boxes, computed straight from the points, are bit for
// bit the padded boxes of the gathered cells that Locate and CellMap use,
// for every cell type, for negative coordinates and negative zeros, and in
// 2D; cells left out have an empty box.
func TestBuildBoxesArePaddedBoxes(t *testing.T) {
	negZero := func(z *Zone, dim int) *Zone { // also -0 on the first dim axes
		for i, v := range z.Points {
			if i%3 >= dim {
				continue
			}
			z.Points[i] = v - 0.5
			if i%5 == 0 {
				z.Points[i] = math.Copysign(0, -1)
			}
		}
		return z
	}
	mixed := hexGrid(3, 6)
	mixed.AddCell(Tetra, 0, 1, 4, 16)
	mixed.AddCell(Wedge, 0, 1, 4, 16, 17, 20)
	mixed.AddCell(Pyramid, 0, 1, 5, 4, 16)
	mixed.AddCell(Quad, 0, 1, 5, 4) // a face: left out in 3D
	mixed.Blank = make([]bool, mixed.NumCells())
	mixed.Blank[5] = true
	quads := &Zone{Name: "quads"}
	for i := 0; i < 16; i++ {
		quads.Points = append(quads.Points, float64(i%4)/3, float64(i/4)/3, 0)
	}
	for j := 0; j < 3; j++ {
		for i := 0; i < 3; i++ {
			p := int32(4*j + i)
			quads.AddCell(Quad, p, p+1, p+5, p+4)
		}
	}
	quads.AddCell(Triangle, 0, 1, 5)
	for _, f := range []*Field{{Zones: []*Zone{negZero(hexGrid(4, 7), 3), mixed}}, {Zones: []*Zone{negZero(quads, 2)}}} {
		l, err := newLocator(f, 2)
		if err != nil {
			t.Fatal(err)
		}
		for zi, z := range f.Zones {
			for c := range z.Types {
				b := l.box[6*(int(l.base[zi])+c):][:6]
				if !l.indexable(z, c) {
					if !(b[0] > b[3]) {
						t.Fatalf("zone %d cell %d: left out, but box %v", zi, c, b)
					}
					continue
				}
				var g cellGeom
				z.gather(c, &g)
				lo, hi := g.paddedBox(l.dim)
				for k := 0; k < 3; k++ {
					if math.Float64bits(b[k]) != math.Float64bits(lo[k]) || math.Float64bits(b[3+k]) != math.Float64bits(hi[k]) {
						t.Fatalf("zone %d cell %d: box %v, paddedBox %v %v", zi, c, b, lo, hi)
					}
				}
			}
		}
	}
}

// Exact: CellsInBox on boxes inside one bin (the path that neither removes
// duplicates nor sorts) returns exactly the cells whose padded box
// overlaps the query box, in increasing order.
func TestCellsInBoxOneBin(t *testing.T) {
	f := &Field{Zones: []*Zone{hexGrid(6, 8), hexGrid(5, 9)}}
	l, err := newLocator(f, 1)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(25, 26))
	oneBin := 0
	for trial := 0; trial < 2000; trial++ {
		var lo, hi [3]float64
		for k := 0; k < 3; k++ {
			lo[k] = 1.1*rng.Float64() - 0.05
			hi[k] = lo[k] + 0.02*rng.Float64()*float64(trial%2)
		}
		if i0, i1 := l.binRange(lo[:], hi[:]); i0 == i1 {
			oneBin++
		}
		got := l.CellsInBox(lo, hi, nil)
		var want []CellRef
		for g := 0; g < len(l.box)/6; g++ {
			b := l.box[6*g : 6*g+6]
			if b[0] <= hi[0] && b[3] >= lo[0] && b[1] <= hi[1] && b[4] >= lo[1] && b[2] <= hi[2] && b[5] >= lo[2] {
				zi, c := l.ref(int32(g))
				want = append(want, CellRef{int32(zi), int32(c)})
			}
		}
		if !slices.Equal(got, want) {
			t.Fatalf("box %v %v: got %v, want %v", lo, hi, got, want)
		}
	}
	if oneBin < 500 {
		t.Fatalf("only %d of the boxes lie in one bin", oneBin)
	}
}

// Regression: a mesh whose extents multiply beyond the largest float64
// (here 4e307 per axis) gets one bin per axis instead of none, so the
// build neither panics nor loses cells.
func TestLocatorHugeExtent(t *testing.T) {
	z := hexGrid(4, 10)
	for i := range z.Points {
		z.Points[i] *= 4e307
	}
	l, err := newLocator(&Field{Zones: []*Zone{z}}, 1)
	if err != nil {
		t.Fatal(err)
	}
	if l.n != [3]int{1, 1, 1} {
		t.Fatalf("bins per axis %v, want 1 1 1", l.n)
	}
	if got := l.CellsInBox([3]float64{-1e308, -1e308, -1e308}, [3]float64{1e308, 1e308, 1e308}, nil); len(got) != z.NumCells() {
		t.Fatalf("CellsInBox found %d cells, want %d", len(got), z.NumCells())
	}
}

// Exact: the edge tables of meanEdge hold the edges of each cell type
// (counts from Euler's formula V - E + F = 2 for the solids: tetrahedron 6,
// pyramid 8, wedge 9, hexahedron 12; a polygon has as many edges as nodes)
// and one side per edge and adjacent face (twice the edges for solids).
func TestEdgeTables(t *testing.T) {
	want := map[CellType][2]int{Triangle: {3, 3}, Quad: {4, 4}, Tetra: {6, 12}, Pyramid: {8, 16}, Wedge: {9, 18}, Hexa: {12, 24}}
	for ct, w := range want {
		if e := edgeTables[ct]; len(e.edges) != w[0] || len(e.sides) != w[1] {
			t.Errorf("%v: %d edges, %d sides; want %d, %d", ct, len(e.edges), len(e.sides), w[0], w[1])
		}
	}
	if e := edgeTables[Polygon]; len(e.sides) != 0 {
		t.Errorf("polygon: %d sides, want none", len(e.sides))
	}
}
