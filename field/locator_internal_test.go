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
