package field

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestCombineNodalSameBits checks that the register-held sums of
// combineNodal (widths 1, 3 and 9) and its general path give exactly the
// bits of the plain definition dst[i] = Σ_k N_k G[k*w+i] summed in node
// order, on values spanning many magnitudes (so that any change in the
// order of additions would show).
func TestCombineNodalSameBits(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	val := func() float64 { return (rng.Float64() - 0.5) * math.Pow(10, float64(rng.IntN(16)-8)) }
	for _, w := range []int{1, 2, 3, 6, 9, 27, 30} {
		for _, nn := range []int{3, 4, 6, 8} {
			for trial := 0; trial < 50; trial++ {
				var N [maxCellNodes]float64
				for k := range nn {
					N[k] = val()
				}
				G := make([]float64, nn*w)
				for i := range G {
					G[i] = val()
				}
				got := make([]float64, w)
				combineNodal(&N, nn, G, got)
				for i := range w {
					want := 0.0
					for k := 0; k < nn; k++ {
						want += N[k] * G[k*w+i]
					}
					if math.Float64bits(got[i]) != math.Float64bits(want) {
						t.Fatalf("w=%d nn=%d output %d: %v, want %v", w, nn, i, got[i], want)
					}
				}
			}
		}
	}
}
