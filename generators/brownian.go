package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Brownian is a Gaussian random walk x_k = x_{k−1} + Drift + Sigma·ε_k,
// ε_k ~ N(0, 1), started at x_{−1} = 0: Brownian motion sampled at unit
// steps, with an optional drift. Its spectrum falls as f^{−2} and its DFA
// exponent is 1.5 (Peng et al. 1994).
type Brownian struct {
	Sigma float64 // step standard deviation; zero means 1
	Drift float64 // mean step
}

// Generate returns n samples of the walk.
func (b Brownian) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	s := b.Sigma
	if s == 0 {
		s = 1
	}
	if !(s > 0) || math.IsInf(s, 0) || math.IsNaN(b.Drift) || math.IsInf(b.Drift, 0) {
		return nil, fmt.Errorf("brownian: sigma = %g, drift = %g, want sigma > 0 and a finite drift", b.Sigma, b.Drift)
	}
	out := make([]float64, n)
	var x float64
	for i := range out {
		x += b.Drift + s*rng.NormFloat64()
		out[i] = x
	}
	return out, nil
}

func init() {
	build := func(p map[string]float64) (Generator, float64, error) {
		return Brownian{Sigma: p["sigma"], Drift: p["drift"]}, 1, nil
	}
	params := func(drift float64) []Param {
		return []Param{
			{Name: "sigma", Default: 1, Min: 1e-12, Max: 1e12, Doc: "step standard deviation"},
			{Name: "drift", Default: drift, Min: -1e12, Max: 1e12, Doc: "mean step"},
		}
	}
	register(&System{
		Name:   "brownian",
		Title:  "Brownian motion (Gaussian random walk)",
		Doc:    "Cumulative sum of N(drift, sigma²) steps; non-stationary. Label: stochastic.",
		Params: params(0),
		Invariants: []Invariant{
			{Name: "sc_fluct_a1", Value: 1.5, Unit: "", Source: "Peng et al., Phys. Rev. E 49 (1994) 1685"},
			{Name: "sc_psd_beta", Value: 2, Unit: "", Source: "standard result for Brownian motion"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build:        build,
	})
	register(&System{
		Name:         "drift-walk",
		Title:        "random walk with drift",
		Doc:          "The brownian entry preset to a drift of 0.2 sigma per step, so the trend dominates over n ≳ 25 steps. Label: stochastic.",
		Params:       params(0.2),
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build:        build,
	})
}
