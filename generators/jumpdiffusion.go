package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// JumpDiffusion is an Ornstein–Uhlenbeck process with compound-Poisson
// jumps (the mean-reverting form of Merton's jump diffusion, J. Financ.
// Econ. 3 (1976) 125):
//
//	dx = −x/τ dt + √(2/τ) dW + dJ,
//
// with J jumps of Gaussian size N(JumpMean, JumpSD²) arriving at Rate per
// sample. Time is counted in samples (one sample per unit). x is the sum
// of a unit-variance OU process (OU, exact update) and jump shot noise
// relaxing with the same τ, so by Campbell's theorem (analytic)
//
//	E[x] = ν μ_J τ,   Var[x] = 1 + ν (μ_J² + σ_J²) τ/2,
//	fourth cumulant κ4 = ν E[J⁴] τ/4,  E[J⁴] = μ_J⁴ + 6μ_J²σ_J² + 3σ_J⁴,
//
// and the lag-k autocorrelation is e^{−k/τ}.
//
// Sampling is exact: the jump part decays by e^{−1/τ} per sample and each
// jump at offset u in the interval adds J·e^{−(1−u)/τ}. Both parts start
// stationary: the OU part from N(0, 1), the jump part as the sum of the
// decayed jumps of the preceding 40τ (e^{−40} ≈ 4·10^{−18} of older ones
// are dropped), so no burn-in is needed. Time O(n + ν(n + 40τ)).
type JumpDiffusion struct {
	Tau      float64 // relaxation time (samples), > 0
	Rate     float64 // jump rate ν (per sample), > 0
	JumpMean float64 // mean jump size μ_J
	JumpSD   float64 // jump size standard deviation σ_J, ≥ 0
}

// Generate returns n samples: the OU part is drawn first, then the jumps.
func (g JumpDiffusion) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(g.Tau > 0 && g.Rate > 0 && g.JumpSD >= 0) || math.IsInf(g.Tau+g.Rate+g.JumpSD, 0) || math.IsNaN(g.JumpMean) || math.IsInf(g.JumpMean, 0) {
		return nil, fmt.Errorf("jump-diffusion: tau = %g, rate = %g, jump mean = %g, jump sd = %g, want tau, rate > 0, jump sd ≥ 0, all finite", g.Tau, g.Rate, g.JumpMean, g.JumpSD)
	}
	x, err := OU{Tau: g.Tau, S: 1, Dt: 1}.Generate(n, rng)
	if err != nil {
		return nil, fmt.Errorf("jump-diffusion: %w", err)
	}
	jump := func() float64 { return g.JumpMean + g.JumpSD*rng.NormFloat64() }
	// Stationary start: jumps at times −t, t > 0, decayed to time 0.
	var j float64
	for t := rng.ExpFloat64() / g.Rate; t < 40*g.Tau; t += rng.ExpFloat64() / g.Rate {
		j += jump() * math.Exp(-t/g.Tau)
	}
	decay := math.Exp(-1 / g.Tau)
	next := rng.ExpFloat64() / g.Rate // next arrival, from the start of the interval
	for i := range x {
		if i > 0 {
			j *= decay
			for next <= 1 {
				j += jump() * math.Exp(-(1-next)/g.Tau)
				next += rng.ExpFloat64() / g.Rate
			}
			next--
		}
		x[i] += j
	}
	return x, nil
}

func init() {
	registerNoise(&System{
		Name:  "jump-diffusion",
		Title: "Ornstein–Uhlenbeck process with compound-Poisson Gaussian jumps",
		Doc:   "Unit-variance OU (relaxation tau samples) plus Gaussian jumps N(jump_mean, jump_sd²) at rate jumps per sample relaxing with the same tau; exact sampling, stationary start. Label: stochastic.",
		Params: []Param{
			{Name: "tau", Default: 20, Min: 1, Max: 1e4, Doc: "relaxation time τ (samples)"},
			{Name: "rate", Default: 0.01, Min: 1e-4, Max: 0.5, Doc: "jump rate ν (per sample)"},
			{Name: "jump_mean", Default: 0, Min: -20, Max: 20, Doc: "mean jump size (OU sd units)"},
			{Name: "jump_sd", Default: 5, Min: 0, Max: 50, Doc: "jump size sd (OU sd units)"},
		},
		Invariants: []Invariant{
			{Name: "variance", Value: 1 + 0.01*25*20/2, Unit: "", Source: "Campbell's theorem (analytic): 1 + ν(μ_J² + σ_J²)τ/2"},
			{Name: "lag1_autocorrelation", Value: math.Exp(-1.0 / 20), Unit: "", Source: "analytic: e^{-1/τ} (OU and jump parts share the kernel)"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return JumpDiffusion{Tau: p["tau"], Rate: p["rate"], JumpMean: p["jump_mean"], JumpSD: p["jump_sd"]}, nil
	})
}
