package report

import (
	"tracesift/features"
	"tracesift/features/surrogate"
)

// runSurrogates tests the statistics of o.Stats on the middle
// o.SurrogateLength samples of x against o.Surrogates surrogates
// (surrogate.Test, two-sided, Holm-adjusted across the statistics).
func runSurrogates(x []float64, o Options) (*surrogate.Report, error) {
	seg, _ := middle(x, o.SurrogateLength)
	stats := make([]surrogate.Statistic, 0, len(o.Stats))
	for _, name := range uniq(o.Stats) {
		fo := features.Options{Seed: o.Seed}
		st := surrogate.Statistic{Name: name, Func: func(y []float64) (float64, error) { return features.Value(name, y, fo) }}
		stats = append(stats, st)
	}
	return surrogate.Test(seg, stats, surrogate.TestOptions{
		Options: surrogate.Options{Method: o.Method, Count: o.Surrogates, Seed: o.Seed, Progress: o.Progress},
		Alpha:   o.Alpha,
		Side:    surrogate.TwoSided,
	})
}
