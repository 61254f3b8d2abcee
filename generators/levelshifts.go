package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// LevelShifts is white Gaussian noise N(0, 1) around a piecewise-constant
// mean that changes at the times of a Poisson process of Rate per sample:
// a non-stationary series of random level shifts. Sampled once per time
// unit, the mean can only change between two samples, and it does so
// independently at each of the n − 1 boundaries with probability
// p = 1 − e^{−Rate} (the chance that a Poisson process has an event in a
// unit interval), so the number of visible change points is
// Binomial(n − 1, p) and the segment lengths are geometric with mean 1/p.
// At a change the new level is a fresh N(0, LevelSD²) draw (independent
// levels) or, with Walk, the old level plus a N(0, LevelSD²) step (a
// random walk of levels). The first level is N(0, LevelSD²).
type LevelShifts struct {
	Rate    float64 // change rate (per sample), > 0
	LevelSD float64 // standard deviation of the levels or of the steps, > 0
	Walk    bool    // levels form a random walk instead of independent draws
}

// Path returns n samples of the series and of its mean.
func (g LevelShifts) Path(n int, rng *rand.Rand) (x, mean []float64, err error) {
	if err := checkN(n); err != nil {
		return nil, nil, err
	}
	if !(g.Rate > 0 && g.LevelSD > 0) || math.IsInf(g.Rate+g.LevelSD, 0) {
		return nil, nil, fmt.Errorf("level-shifts: rate = %g, level sd = %g, want both > 0 and finite", g.Rate, g.LevelSD)
	}
	mean = make([]float64, n)
	level := g.LevelSD * rng.NormFloat64()
	// Gaps between changes: ⌈E/Rate⌉ for E ~ Exp(1) is geometric with
	// success probability 1 − e^{−Rate} (inverse transform).
	next := math.Ceil(rng.ExpFloat64() / g.Rate)
	for i := range mean {
		if float64(i) >= next {
			step := g.LevelSD * rng.NormFloat64()
			if g.Walk {
				level += step
			} else {
				level = step
			}
			next += math.Ceil(rng.ExpFloat64() / g.Rate)
		}
		mean[i] = level
	}
	x = make([]float64, n)
	for i, m := range mean {
		x[i] = m + rng.NormFloat64()
	}
	return x, mean, nil
}

// Generate returns n samples.
func (g LevelShifts) Generate(n int, rng *rand.Rand) ([]float64, error) {
	x, _, err := g.Path(n, rng)
	return x, err
}

func init() {
	registerNoise(&System{
		Name:  "level-shifts",
		Title: "white noise around a mean with random level shifts at Poisson times",
		Doc:   "N(0, 1) noise plus a piecewise-constant mean that jumps at the times of a Poisson process (rate per sample) to a new N(0, level_sd²) level (walk = 0) or by a N(0, level_sd²) step (walk = 1); non-stationary. Label: stochastic.",
		Params: []Param{
			{Name: "rate", Default: 1e-3, Min: 1e-5, Max: 0.1, Doc: "change rate (per sample)"},
			{Name: "level_sd", Default: 3, Min: 0.1, Max: 20, Doc: "sd of the levels (walk = 0) or of the steps (walk = 1), in noise sds"},
			{Name: "walk", Default: 0, Min: 0, Max: 1, Integer: true, Doc: "0 independent levels, 1 random walk of levels"},
		},
		Invariants: []Invariant{
			{Name: "change_points_per_sample", Value: 1 - math.Exp(-1e-3), Unit: "per sample", Source: "analytic: P(Poisson event in a unit interval) = 1 - e^-rate"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return LevelShifts{Rate: p["rate"], LevelSD: p["level_sd"], Walk: p["walk"] == 1}, nil
	})
}
