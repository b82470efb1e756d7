package field_test

import (
	"sync"
	"testing"

	"farforce/field"
)

// TestChunkQueue takes chunks from several goroutines at once and requires
// each chunk to be taken exactly once, and a lone worker to take them in
// order.
func TestChunkQueue(t *testing.T) {
	for _, n := range []int{0, 1, 7, 100, 1001} {
		for _, workers := range []int{1, 2, 3, 8} {
			q := field.NewChunkQueue(n, workers)
			taken := make([]int, n)
			var mu sync.Mutex
			var wg sync.WaitGroup
			for w := 0; w < workers; w++ {
				wg.Add(1)
				go func() {
					defer wg.Done()
					prev := -1
					for k := q.Take(w); k >= 0; k = q.Take(w) {
						if workers == 1 && k != prev+1 {
							t.Errorf("n %d: one worker took %d after %d", n, k, prev)
						}
						prev = k
						mu.Lock()
						taken[k]++
						mu.Unlock()
					}
				}()
			}
			wg.Wait()
			for k, c := range taken {
				if c != 1 {
					t.Fatalf("n %d workers %d: chunk %d taken %d times", n, workers, k, c)
				}
			}
		}
	}
}
