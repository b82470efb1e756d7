package field

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// sortUnique must give what the standard library's slices.Sort followed by
// slices.Compact gives, for short and long inputs with many repeats (as
// stencils have) and with few.
func TestSortUniqueMatchesSortCompact(t *testing.T) {
	rng := rand.New(rand.NewPCG(81, 82))
	var table []uint64
	for _, n := range []int{0, 1, 5, 15, 16, 17, 64, 100, 512, 3000} {
		for _, spread := range []uint64{3, 40, 1 << 40} {
			s := make([]uint64, n)
			for i := range s {
				zone := rng.Uint64N(3)
				s[i] = zone<<32 | rng.Uint64N(spread)&0x7fffffff
			}
			want := slices.Compact(slices.Sorted(slices.Values(s)))
			got := sortUnique(slices.Clone(s), &table)
			if !slices.Equal(got, want) {
				t.Fatalf("n = %d, spread %d: got %v, want %v", n, spread, got, want)
			}
		}
	}
}
