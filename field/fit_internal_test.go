package field

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// lattice27 returns the 27 points of {-1,0,1}³ moved randomly by up to
// 0.1, and values of a random quadratic at them.
func lattice27(rng *rand.Rand) (pts [][3]float64, vals []float64, q [10]float64) {
	for i := range q {
		q[i] = rng.NormFloat64()
	}
	for i := -1; i <= 1; i++ {
		for j := -1; j <= 1; j++ {
			for k := -1; k <= 1; k++ {
				x := [3]float64{float64(i) + 0.1*rng.Float64(), float64(j) + 0.1*rng.Float64(), float64(k) + 0.1*rng.Float64()}
				var row [10]float64
				basisRow(3, x, row[:])
				v := 0.0
				for t := range row {
					v += q[t] * row[t]
				}
				pts, vals = append(pts, x), append(vals, v)
			}
		}
	}
	return pts, vals, q
}

// Exact: the least-squares quadratic through samples of a quadratic is that
// quadratic, whether solved directly (Householder QR) or through the
// operator (semi-normal equations), to rounding (Golub & Van Loan 2013,
// §5.3; tolerance 1e-12 for condition numbers near 10).
func TestFitReproducesQuadratic(t *testing.T) {
	rng := rand.New(rand.NewPCG(71, 72))
	for trial := 0; trial < 50; trial++ {
		pts, vals, q := lattice27(rng)
		one := [3]float64{1, 1, 1}
		direct, ok1 := fitStencil(3, 2, [3]float64{}, one, pts, vals, 1, wellPosed)
		op, ok2 := fitStencil(3, 2, [3]float64{}, one, pts, nil, 0, wellPosed)
		if !ok1 || !ok2 {
			t.Fatal("well-posed stencil rejected")
		}
		for tm := 0; tm < 10; tm++ {
			c := 0.0
			for i := range pts {
				c += op.coef[tm*len(pts)+i] * vals[i]
			}
			if math.Abs(direct.coef[tm]-q[tm]) > 1e-12 || math.Abs(c-q[tm]) > 1e-12 {
				t.Fatalf("term %d: direct %v, operator %v, want %v", tm, direct.coef[tm], c, q[tm])
			}
		}
	}
}

// Exact: the gradient rows of the operator (first = 1, as node operators
// keep them) applied to samples of a quadratic give its linear
// coefficients, to rounding (Golub & Van Loan 2013, §5.3), and they are
// the same bits as those rows kept from the constant one on; also for the
// linear fit (degree 1), whose operator is formed whole (lsqOperator), on
// samples of a linear function.
func TestFitOperatorGradientRows(t *testing.T) {
	rng := rand.New(rand.NewPCG(73, 74))
	var w fitWork
	for trial := 0; trial < 50; trial++ {
		pts, vals, q := lattice27(rng)
		deg := 2
		if trial%2 == 1 { // the linear part only
			deg = 1
			for i, x := range pts {
				vals[i] = q[0] + q[1]*x[0] + q[2]*x[1] + q[3]*x[2]
			}
		}
		one := [3]float64{1, 1, 1}
		grad, ok1 := fitOperator(3, deg, 1, 4, [3]float64{}, one, pts, wellPosed, &w)
		all, ok2 := fitOperator(3, deg, 0, 4, [3]float64{}, one, pts, wellPosed, &w)
		if !ok1 || !ok2 {
			t.Fatal("well-posed stencil rejected")
		}
		m := len(pts)
		for tm := 1; tm < 4; tm++ {
			c := 0.0
			for i := range pts {
				g, a := grad.coef[(tm-1)*m+i], all.coef[tm*m+i]
				if math.Float64bits(g) != math.Float64bits(a) {
					t.Fatalf("term %d sample %d: %v with first = 1, %v with first = 0", tm, i, g, a)
				}
				c += g * vals[i]
			}
			if math.Abs(c-q[tm]) > 1e-12 {
				t.Fatalf("term %d: operator %v, want %v", tm, c, q[tm])
			}
		}
	}
}

// reflectColumns must give the bits of reflect applied to each column in
// turn (the Householder update x - 2v(vᵀx)/(vᵀv), Golub & Van Loan 2013,
// §5.1.4), for any number of columns.
func TestReflectColumnsMatchesReflect(t *testing.T) {
	rng := rand.New(rand.NewPCG(75, 76))
	const m = 13
	for k := 0; k <= 9; k++ {
		v := make([]float64, m)
		vn := 0.0
		for i := range v {
			v[i] = rng.NormFloat64()
			vn += v[i] * v[i]
		}
		x := make([]float64, 2+k*m)
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		want := slices.Clone(x)
		for c := 0; c < k; c++ {
			reflect(v, vn, want[2+c*m:2+(c+1)*m])
		}
		reflectColumns(v, vn, x, 2, m, k)
		for i := range x {
			if math.Float64bits(x[i]) != math.Float64bits(want[i]) {
				t.Fatalf("k = %d: entry %d is %v, want %v", k, i, x[i], want[i])
			}
		}
	}
}

func BenchmarkFitDirect(b *testing.B) {
	pts, vals, _ := lattice27(rand.New(rand.NewPCG(1, 1)))
	b.ReportAllocs()
	for b.Loop() {
		fitStencil(3, 2, [3]float64{}, [3]float64{1, 1, 1}, pts, vals, 1, wellPosed)
	}
}

func BenchmarkFitOperator(b *testing.B) {
	pts, _, _ := lattice27(rand.New(rand.NewPCG(1, 1)))
	b.ReportAllocs()
	for b.Loop() {
		fitStencil(3, 2, [3]float64{}, [3]float64{1, 1, 1}, pts, nil, 0, wellPosed)
	}
}

// BenchmarkFitOperatorGradient times the operator of a node's recovered
// gradient: the linear rows only, as growOp builds it.
func BenchmarkFitOperatorGradient(b *testing.B) {
	pts, _, _ := lattice27(rand.New(rand.NewPCG(1, 1)))
	var w fitWork
	b.ReportAllocs()
	for b.Loop() {
		fitOperator(3, 2, 1, 4, [3]float64{}, [3]float64{1, 1, 1}, pts, wellPosed, &w)
	}
}
