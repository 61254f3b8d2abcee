package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// GARCH is the GARCH(1,1) process ε_t = σ_t·z_t, z ~ N(0, 1),
// σ²_t = ω + α·ε²_{t−1} + β·σ²_{t−1} (Bollerslev, J. Econometrics 31 (1986)
// 307): serially uncorrelated noise whose variance clusters in bursts, with
// unconditional variance ω/(1 − α − β) when α + β < 1.
type GARCH struct {
	Omega, Alpha, Beta float64
}

// Generate returns n samples of ε after a burn-in of ⌈40/(−ln(α+β))⌉ steps
// (at least 100, at most 10^6) from the unconditional variance.
func (g GARCH) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	p := g.Alpha + g.Beta
	if !(g.Omega > 0 && g.Alpha >= 0 && g.Beta >= 0 && p < 1) || math.IsInf(g.Omega, 0) {
		return nil, fmt.Errorf("garch: omega = %g, alpha = %g, beta = %g, want omega > 0, alpha, beta ≥ 0, alpha + beta < 1", g.Omega, g.Alpha, g.Beta)
	}
	burn := 100
	if p > 0 {
		burn = int(math.Min(1e6, math.Max(100, math.Ceil(40/-math.Log(p)))))
	}
	s2 := g.Omega / (1 - p)
	var e float64
	out := make([]float64, n)
	for i := -burn; i < n; i++ {
		s2 = g.Omega + g.Alpha*e*e + g.Beta*s2
		e = math.Sqrt(s2) * rng.NormFloat64()
		if i >= 0 {
			out[i] = e
		}
	}
	return out, nil
}

func init() {
	register(&System{
		Name:  "garch",
		Title: "GARCH(1,1) volatility clustering",
		Doc:   "Serially uncorrelated noise with clustered variance. Label: stochastic.",
		Params: []Param{
			{Name: "omega", Default: 0.1, Min: 1e-12, Max: 1e12, Doc: "variance floor ω"},
			{Name: "alpha", Default: 0.1, Min: 0, Max: 0.999, Doc: "ARCH coefficient α"},
			{Name: "beta", Default: 0.85, Min: 0, Max: 0.999, Doc: "GARCH coefficient β (alpha + beta < 1 required)"},
		},
		Invariants: []Invariant{
			{Name: "variance", Value: 0.1 / (1 - 0.95), Unit: "", Source: "Bollerslev, J. Econometrics 31 (1986) 307: ω/(1 - α - β)"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return GARCH{Omega: p["omega"], Alpha: p["alpha"], Beta: p["beta"]}, 1, nil
		},
	})
}
