package field

import (
	"math"
	"math/rand/v2"
	"testing"
)

// refNodes holds the reference (local) coordinates of the nodes of each
// type, VTK order; for the pyramid the apex is placed above the base centre.
var refNodes = map[CellType][][3]float64{
	Triangle: {{0, 0, 0}, {1, 0, 0}, {0, 1, 0}},
	Quad:     {{0, 0, 0}, {1, 0, 0}, {1, 1, 0}, {0, 1, 0}},
	Tetra:    {{0, 0, 0}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}},
	Hexa:     {{0, 0, 0}, {1, 0, 0}, {1, 1, 0}, {0, 1, 0}, {0, 0, 1}, {1, 0, 1}, {1, 1, 1}, {0, 1, 1}},
	Wedge:    {{0, 0, 0}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}, {1, 0, 1}, {0, 1, 1}},
	Pyramid:  {{0, 0, 0}, {1, 0, 0}, {1, 1, 0}, {0, 1, 0}, {0.5, 0.5, 1}},
}

var allTypes = []CellType{Triangle, Quad, Tetra, Hexa, Wedge, Pyramid}

// distortedCell returns a cell of type t: the reference nodes under a
// random affine map, each node then moved by up to amp.
func distortedCell(t CellType, amp float64, rng *rand.Rand) cellGeom {
	g := cellGeom{t: t, dim: t.Dim(), n: t.NumNodes()}
	var A [3][3]float64
	for i := 0; i < 3; i++ {
		A[i][i] = 1 + 0.5*rng.Float64()
		for j := 0; j < 3; j++ {
			if i != j {
				A[i][j] = 0.3 * (2*rng.Float64() - 1)
			}
		}
	}
	shift := [3]float64{10 * rng.Float64(), -5 * rng.Float64(), 3}
	for k, r := range refNodes[t] {
		for i := 0; i < g.dim; i++ {
			v := shift[i] + amp*(2*rng.Float64()-1)
			for j := 0; j < g.dim; j++ {
				v += A[i][j] * r[j]
			}
			g.x[k][i] = v
		}
		if g.dim == 2 {
			g.x[k][2] = 3 // a plane z = const
		}
	}
	return g
}

// randomLocal returns random local coordinates inside the reference cell.
func randomLocal(t CellType, rng *rand.Rand) [3]float64 {
	for {
		r := [3]float64{rng.Float64(), rng.Float64(), rng.Float64()}
		if t.Dim() == 2 {
			r[2] = 0
		}
		if contains(t, r, 0) {
			return r
		}
	}
}

// Exact: shape functions form a partition of unity and their derivatives
// match central differences (common practice for isoparametric elements).
func TestShapePartitionAndDerivatives(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, ct := range allTypes {
		for trial := 0; trial < 50; trial++ {
			r := randomLocal(ct, rng)
			var N [maxCellNodes]float64
			var dN [maxCellNodes][3]float64
			shapeValues(ct, r, &N)
			shapeDerivs(ct, r, &dN)
			sum := 0.0
			for k := 0; k < ct.NumNodes(); k++ {
				sum += N[k]
			}
			if math.Abs(sum-1) > 1e-14 {
				t.Fatalf("%s: ΣN = %v at %v", ct, sum, r)
			}
			const e = 1e-6
			for j := 0; j < ct.Dim(); j++ {
				rp, rm := r, r
				rp[j] += e
				rm[j] -= e
				var Np, Nm [maxCellNodes]float64
				shapeValues(ct, rp, &Np)
				shapeValues(ct, rm, &Nm)
				for k := 0; k < ct.NumNodes(); k++ {
					fd := (Np[k] - Nm[k]) / (2 * e)
					// Central difference error O(e²) on polynomials of degree ≤ 3.
					if math.Abs(fd-dN[k][j]) > 1e-8 {
						t.Fatalf("%s: dN[%d][%d] = %v, difference quotient %v", ct, k, j, dN[k][j], fd)
					}
				}
			}
		}
	}
}

// Exact: each shape function is 1 at its own node and 0 at the others
// (Kronecker property of Lagrange elements; common practice).
func TestShapeKronecker(t *testing.T) {
	for _, ct := range allTypes {
		for k, r := range refNodes[ct] {
			if ct == Pyramid && k == 4 {
				r[0], r[1] = 0.3, 0.8 // the apex: any (r, s) at t = 1
			}
			var N [maxCellNodes]float64
			shapeValues(ct, r, &N)
			for m := 0; m < ct.NumNodes(); m++ {
				want := 0.0
				if m == k {
					want = 1
				}
				if math.Abs(N[m]-want) > 1e-15 {
					t.Fatalf("%s: N_%d at node %d = %v", ct, m, k, N[m])
				}
			}
		}
	}
}

// Exact: the inverse map recovers the local coordinates of points mapped
// from inside distorted cells (inverse of the isoparametric map, solved to
// 1e-13 by Newton's method); points mapped from outside are rejected.
func TestInverseMapRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, ct := range allTypes {
		for trial := 0; trial < 200; trial++ {
			g := distortedCell(ct, 0.15, rng)
			r := randomLocal(ct, rng)
			x := g.position(r)
			got, ok := g.local(x)
			if !ok || !contains(ct, got, localTol) {
				t.Fatalf("%s: point from %v not found inside (ok=%v, got %v)", ct, r, ok, got)
			}
			back := g.position(got)
			for i := 0; i < 3; i++ {
				if math.Abs(back[i]-x[i]) > 1e-11 {
					t.Fatalf("%s: round trip %v -> %v", ct, x, back)
				}
			}
			if !(ct == Pyramid && r[2] > 0.999) {
				for i := 0; i < ct.Dim(); i++ {
					if math.Abs(got[i]-r[i]) > 1e-9 {
						t.Fatalf("%s: local %v, want %v", ct, got, r)
					}
				}
			}
			// A point beyond a face: one local coordinate at -0.05, or, for
			// the simplex part of a type, the coordinate sum at 1.05.
			out := r
			out[rng.IntN(ct.Dim())] = -0.05
			if n := simplexCoords(ct); n > 0 && rng.IntN(2) == 0 {
				out = r
				s := 0.0
				for i := 0; i < n; i++ {
					s += r[i]
				}
				for i := 0; i < n; i++ {
					out[i] = (r[i] + 0.01) * 1.05 / (s + 0.01*float64(n))
				}
			}
			if got, ok := g.local(g.position(out)); ok && contains(ct, got, localTol) {
				t.Fatalf("%s: point from %v accepted as %v", ct, out, got)
			}
		}
	}
}

// simplexCoords returns how many leading local coordinates of t are
// barycentric (bounded by their sum), or 0.
func simplexCoords(t CellType) int {
	switch t {
	case Triangle, Wedge:
		return 2
	case Tetra:
		return 3
	}
	return 0
}

// Exact: on any cell, a linear field is interpolated exactly by the shape
// functions and its gradient through the Jacobian is exact, even on
// distorted (non-affine) cells, because the map is isoparametric (common
// practice).
func TestLinearFieldExactOnDistortedCells(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, ct := range allTypes {
		for trial := 0; trial < 100; trial++ {
			g := distortedCell(ct, 0.15, rng)
			a := [3]float64{rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()}
			if g.dim == 2 {
				a[2] = 0
			}
			b := rng.NormFloat64()
			lin := func(x [3]float64) float64 { return a[0]*x[0] + a[1]*x[1] + a[2]*x[2] + b }
			r := randomLocal(ct, rng)
			x := g.position(r)
			var N [maxCellNodes]float64
			var dNdx [maxCellNodes][3]float64
			shapeValues(ct, r, &N)
			if !g.gradientMap(r, &dNdx) {
				t.Fatalf("%s: degenerate", ct)
			}
			v := 0.0
			var grad [3]float64
			for k := 0; k < g.n; k++ {
				f := lin(g.x[k])
				v += N[k] * f
				for j := 0; j < 3; j++ {
					grad[j] += f * dNdx[k][j]
				}
			}
			if math.Abs(v-lin(x)) > 1e-12*(1+math.Abs(v)) {
				t.Fatalf("%s: value %v, want %v", ct, v, lin(x))
			}
			for j := 0; j < 3; j++ {
				if math.Abs(grad[j]-a[j]) > 1e-9 {
					t.Fatalf("%s: gradient %v, want %v", ct, grad, a)
				}
			}
		}
	}
}

// Exact: hexahedra with repeated nodes, as some exporters write wedges
// (nodes 2 = 3 and 6 = 7) and pyramids (4 = 5 = 6 = 7), still invert: points
// mapped from inside (away from the collapsed edge) are found with their
// local coordinates, since the trilinear map stays regular there.
func TestCollapsedHexaInverts(t *testing.T) {
	cube := refNodes[Hexa]
	cases := map[string][8]int{
		"wedge-like":   {0, 1, 2, 2, 4, 5, 6, 6},
		"pyramid-like": {0, 1, 2, 3, 4, 4, 4, 4},
	}
	rng := rand.New(rand.NewPCG(7, 8))
	for name, idx := range cases {
		g := cellGeom{t: Hexa, dim: 3, n: 8}
		for k, i := range idx {
			g.x[k] = cube[i]
		}
		if name == "pyramid-like" {
			for k := 4; k < 8; k++ {
				g.x[k] = [3]float64{0.5, 0.5, 1}
			}
		}
		for trial := 0; trial < 200; trial++ {
			r := [3]float64{0.05 + 0.9*rng.Float64(), 0.05 + 0.9*rng.Float64(), 0.05 + 0.9*rng.Float64()}
			x := g.position(r)
			got, ok := g.local(x)
			if !ok || !contains(Hexa, got, localTol) {
				t.Fatalf("%s: point from %v not found (ok=%v, local %v)", name, r, ok, got)
			}
			back := g.position(got)
			if math.Abs(back[0]-x[0])+math.Abs(back[1]-x[1])+math.Abs(back[2]-x[2]) > 1e-12 {
				t.Fatalf("%s: round trip %v -> %v", name, x, back)
			}
		}
	}
}
