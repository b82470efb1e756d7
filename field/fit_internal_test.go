package field

import (
	"math"
	"math/rand/v2"
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
