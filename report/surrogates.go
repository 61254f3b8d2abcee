package report

import (
	"sync"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/features/surrogate"
)

// runDeterminism runs the determinism test (surrogate.Determinism, the test
// of 'classify --significance') on the middle o.SurrogateLength samples of
// x with o.Surrogates IAAFT surrogates.
func runDeterminism(x []float64, o Options, progress func(done, total int)) (*surrogate.DeterminismResult, error) {
	return surrogate.Determinism(x, surrogate.DeterminismOptions{
		Count: o.Surrogates, Seed: o.Seed, Alpha: o.Alpha, MaxLength: o.SurrogateLength, Progress: progress,
	})
}

// runSurrogates tests the statistics of o.Stats on the middle
// o.SurrogateLength samples of x against o.StatSurrogates surrogates
// (surrogate.Test, two-sided, Holm-adjusted across the statistics).
func runSurrogates(x []float64, o Options, progress func(done, total int)) (*surrogate.Report, error) {
	seg, _ := middle(x, o.SurrogateLength)
	stats := make([]surrogate.Statistic, 0, len(o.Stats))
	for _, name := range uniq(o.Stats) {
		fo := features.Options{Seed: o.Seed}
		st := surrogate.Statistic{Name: name, Func: func(y []float64) (float64, error) { return features.Value(name, y, fo) }}
		stats = append(stats, st)
	}
	return surrogate.Test(seg, stats, surrogate.TestOptions{
		Options: surrogate.Options{Method: o.Method, Count: o.StatSurrogates, Seed: o.Seed, Progress: progress},
		Alpha:   o.Alpha,
		Side:    surrogate.TwoSided,
	})
}

// sharedProgress returns, for test k (0: determinism, 1: features), a
// progress callback that reports the surrogates finished by both tests
// against their joint total to o.Progress (nil when o.Progress is nil).
func sharedProgress(o Options) func(k int) func(done, total int) {
	if o.Progress == nil {
		return func(int) func(int, int) { return nil }
	}
	total := o.Surrogates
	if len(o.Stats) > 0 {
		total += o.StatSurrogates
	}
	var mu sync.Mutex
	var done [2]int
	return func(k int) func(int, int) {
		return func(d, _ int) {
			mu.Lock()
			defer mu.Unlock()
			done[k] = d
			o.Progress(done[0]+done[1], total)
		}
	}
}
