package integrate

import (
	"runtime"
	"sync"
	"sync/atomic"

	"farforce/field"
)

// forChunks runs fn(k) for k = 0 … n−1 on up to workers goroutines
// (≤ 0: GOMAXPROCS), handed out by a field.ChunkQueue (each goroutine
// works through a contiguous share first, so neighbouring chunks, which
// share cells and nodes, rarely run at once), and returns the error of
// the lowest failing k. After a failure only chunks below the lowest
// failure seen are still run, so that error does not depend on the
// scheduling. fn must write only to data owned by its k.
func forChunks(n, workers int, fn func(k int) error) error {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = max(1, min(workers, n))
	errs := make([]error, n)
	q := field.NewChunkQueue(n, workers)
	var lowest atomic.Int64 // lowest failing chunk so far
	lowest.Store(int64(n))
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for k := q.Take(w); k >= 0; k = q.Take(w) {
				if int64(k) > lowest.Load() {
					continue
				}
				if errs[k] = fn(k); errs[k] != nil {
					for old := lowest.Load(); int64(k) < old && !lowest.CompareAndSwap(old, int64(k)); old = lowest.Load() {
					}
				}
			}
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}
