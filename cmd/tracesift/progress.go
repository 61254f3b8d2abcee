package main

import (
	"sync"

	"github.com/schollz/progressbar/v3"
)

// newProgress returns a callback drawing a progress bar on stderr, or nil
// when stderr is not a terminal (scripts and logs get no bar). The callback
// is safe for concurrent use.
func newProgress(e *env, total int, what string) func(done, total int) {
	if !e.terminal || total <= 1 {
		return nil
	}
	bar := progressbar.NewOptions(total,
		progressbar.OptionSetWriter(e.stderr),
		progressbar.OptionSetDescription(what),
		progressbar.OptionShowCount(),
		progressbar.OptionClearOnFinish(),
		progressbar.OptionThrottle(100_000_000),
	)
	var mu sync.Mutex
	return func(done, _ int) {
		mu.Lock()
		defer mu.Unlock()
		bar.Set(done)
		if done >= total {
			bar.Finish()
		}
	}
}
