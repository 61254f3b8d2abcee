package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// CoxCounts is a doubly stochastic Poisson counting process (a Cox
// process; Cox, J. R. Stat. Soc. B 17 (1955) 129 (memory)) observed as
// counts per sample: N_t ~ Poisson(λ_t) given the rate, with the rate a
// log-normal Ornstein–Uhlenbeck process held constant within each sample,
//
//	λ_t = MeanRate · exp(LogSD · u_t − LogSD²/2),
//
// u a unit-variance OU of relaxation time Tau samples (OU, exact update,
// stationary start), so E[λ] = MeanRate. The counts are integer-valued and
// overdispersed: by the law of total variance (analytic)
//
//	E[N] = λ̄,   Var[N] = λ̄ + Var[λ] = λ̄ + λ̄²(e^{s²} − 1),
//	Cov(N_t, N_{t+k}) = λ̄²(exp(s² e^{−k/Tau}) − 1),  k ≥ 1,
//
// with λ̄ = MeanRate and s = LogSD. LogSD = 0 gives i.i.d. Poisson counts.
type CoxCounts struct {
	MeanRate float64 // mean count per sample λ̄, > 0
	LogSD    float64 // standard deviation s of the log-rate, ≥ 0
	Tau      float64 // relaxation time of the log-rate (samples), > 0
}

// Generate returns n counts: the rate path is drawn first, then the counts
// (poissonDraw).
func (g CoxCounts) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(g.MeanRate > 0 && g.LogSD >= 0) || math.IsInf(g.MeanRate+g.LogSD, 0) {
		return nil, fmt.Errorf("poisson-counts: mean rate = %g, log sd = %g, want mean rate > 0 and log sd ≥ 0, finite", g.MeanRate, g.LogSD)
	}
	u, err := OU{Tau: g.Tau, S: 1, Dt: 1}.Generate(n, rng)
	if err != nil {
		return nil, fmt.Errorf("poisson-counts: rate: %w", err)
	}
	for i, v := range u {
		u[i] = poissonDraw(g.MeanRate*math.Exp(g.LogSD*v-g.LogSD*g.LogSD/2), rng)
	}
	return u, nil
}

func init() {
	registerNoise(&System{
		Name:  "poisson-counts",
		Title: "Cox process counts: Poisson counts with a log-normal OU rate",
		Doc:   "Counts per sample N ~ Poisson(rate) with rate = mean_rate exp(log_sd u - log_sd²/2), u a unit OU of relaxation tau samples: integer-valued, overdispersed, correlated. Label: stochastic.",
		Params: []Param{
			{Name: "mean_rate", Default: 5, Min: 0.05, Max: 1e4, Doc: "mean count per sample"},
			{Name: "log_sd", Default: 0.5, Min: 0, Max: 2, Doc: "sd of the log-rate"},
			{Name: "tau", Default: 50, Min: 1, Max: 1e5, Doc: "relaxation time of the log-rate (samples)"},
		},
		Invariants: []Invariant{
			{Name: "mean", Value: 5, Unit: "", Source: "law of total expectation (analytic): mean_rate"},
			{Name: "variance", Value: 5 + 25*(math.Exp(0.25)-1), Unit: "", Source: "law of total variance (analytic): λ̄ + λ̄²(e^{s²} - 1)"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return CoxCounts{MeanRate: p["mean_rate"], LogSD: p["log_sd"], Tau: p["tau"]}, nil
	})
}
