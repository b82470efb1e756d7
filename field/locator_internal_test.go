package field

import (
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
// same, array for array.
func TestLocatorBuildIndependentOfWorkers(t *testing.T) {
	f := &Field{Zones: []*Zone{hexGrid(50, 3)}}
	ref, err := newLocator(f, 1)
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range []int{2, 3} {
		l, err := newLocator(f, w)
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(l.start, ref.start) || !slices.Equal(l.items, ref.items) || !slices.Equal(l.box, ref.box) || l.n != ref.n {
			t.Fatalf("%d workers: index differs from the serial one", w)
		}
	}
}
