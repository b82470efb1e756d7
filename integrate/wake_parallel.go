package integrate

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// forChunks runs fn(k) for k = 0 … n−1 on up to workers goroutines
// (≤ 0: GOMAXPROCS), claiming k in increasing order, and returns the error
// of the lowest failing k (every claimed k runs to completion, so that
// error does not depend on the scheduling). fn must write only to data
// owned by its k.
func forChunks(n, workers int, fn func(k int) error) error {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = max(1, min(workers, n))
	errs := make([]error, n)
	var next atomic.Int64
	var failed atomic.Bool
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for !failed.Load() {
				k := int(next.Add(1) - 1)
				if k >= n {
					return
				}
				if errs[k] = fn(k); errs[k] != nil {
					failed.Store(true)
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
