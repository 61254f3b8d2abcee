package benchmarks

import (
	"sync"

	"github.com/tracesift/tracesift/internal/parallel"
)

// forEach calls f(i) for i = 0..n−1 on up to workers goroutines. Each f
// writes only its own result slot, so the outcome does not depend on the
// schedule. progress (if set) is called after each item, serialised.
func forEach(n, workers int, stage string, progress func(string, int, int), f func(i int)) {
	var mu sync.Mutex
	done := 0
	parallel.For(n, workers, func(i int) {
		f(i)
		if progress != nil {
			mu.Lock()
			done++
			progress(stage, done, n)
			mu.Unlock()
		}
	})
}
