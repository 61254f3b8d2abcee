// Package parallel runs index-addressed work on a fixed number of
// goroutines.
package parallel

import (
	"sync"
	"sync/atomic"
)

// For calls fn(i) for every i in [0, n) on up to workers goroutines (at
// least one), claiming indices from a shared counter. Callers write each
// result to its own index, so the outcome does not depend on the
// scheduling.
func For(n, workers int, fn func(i int)) {
	var next atomic.Int64
	var wg sync.WaitGroup
	for w := 0; w < max(1, min(workers, n)); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1) - 1)
				if i >= n {
					return
				}
				fn(i)
			}
		}()
	}
	wg.Wait()
}
