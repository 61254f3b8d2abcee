package benchmarks

import (
	"sync"
	"sync/atomic"
)

// forEach calls f(i) for i = 0..n−1 on up to workers goroutines. Each f
// writes only its own result slot, so the outcome does not depend on the
// schedule. progress (if set) is called after each item, serialised.
func forEach(n, workers int, stage string, progress func(string, int, int), f func(i int)) {
	if n == 0 {
		return
	}
	workers = max(1, min(workers, n))
	var next atomic.Int64
	var mu sync.Mutex
	done := 0
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1) - 1)
				if i >= n {
					return
				}
				f(i)
				if progress != nil {
					mu.Lock()
					done++
					progress(stage, done, n)
					mu.Unlock()
				}
			}
		}()
	}
	wg.Wait()
}
