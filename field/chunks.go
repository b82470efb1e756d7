package field

import "sync"

// ChunkQueue hands out the chunks 0..n-1 of a parallel pass to a fixed
// number of workers: worker w starts on its own contiguous share and,
// once that is done, takes chunks from the end of the largest share left.
// Neighbouring chunks of a surface touch the same cells, so they mostly
// run on one goroutine: its caches stay warm and work that is cached per
// node or cell (recovered gradients, inverse maps) is rarely done twice at
// once. Which worker runs a chunk never changes a result when each chunk
// writes only its own output. Safe for concurrent use.
type ChunkQueue struct {
	mu     sync.Mutex
	lo, hi []int // share w is the chunks lo[w]..hi[w]-1 not yet taken
}

// NewChunkQueue splits the chunks 0..n-1 into workers contiguous shares
// (workers >= 1).
func NewChunkQueue(n, workers int) *ChunkQueue {
	q := &ChunkQueue{lo: make([]int, workers), hi: make([]int, workers)}
	for w := range q.lo {
		q.lo[w], q.hi[w] = w*n/workers, (w+1)*n/workers
	}
	return q
}

// Take returns the next chunk for worker w: the next of its own share or,
// when that is empty, the last chunk of the largest share; -1 when no
// chunk is left.
func (q *ChunkQueue) Take(w int) int {
	q.mu.Lock()
	defer q.mu.Unlock()
	if q.lo[w] < q.hi[w] {
		q.lo[w]++
		return q.lo[w] - 1
	}
	best := w
	for v := range q.lo {
		if q.hi[v]-q.lo[v] > q.hi[best]-q.lo[best] {
			best = v
		}
	}
	if q.lo[best] == q.hi[best] {
		return -1
	}
	q.hi[best]--
	return q.hi[best]
}
