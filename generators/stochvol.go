package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// StochVol is the log-normal stochastic volatility process
//
//	x_t = exp(h_t/2) ε_t,   h_t − μ = φ (h_{t−1} − μ) + σ_h √(1 − φ²) η_t,
//
// with ε, η independent N(0, 1) (Taylor, Modelling Financial Time Series
// (1986) (memory)). The log-variance h is a stationary Gaussian AR(1) with
// mean μ and standard deviation σ_h, started from its stationary law, so x
// is stationary from the first sample. x is serially uncorrelated, but its
// variance clusters: from the log-normal moments of e^h (derived),
//
//	E[x²] = exp(μ + σ_h²/2),   E[x⁴]/E[x²]² = 3 exp(σ_h²),
//	corr(x_t², x_{t+k}²) = (exp(σ_h² φ^k) − 1) / (3 exp(σ_h²) − 1),  k ≥ 1.
type StochVol struct {
	Mu     float64 // mean of the log-variance
	Phi    float64 // persistence of the log-variance, |Phi| < 1
	SigmaH float64 // stationary standard deviation of the log-variance, ≥ 0
}

// Generate returns n samples: the log-variance path is drawn first (AR1),
// then the ε.
func (g StochVol) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(math.Abs(g.Phi) < 1 && g.SigmaH >= 0) || math.IsInf(g.SigmaH, 0) || math.IsNaN(g.Mu) || math.IsInf(g.Mu, 0) {
		return nil, fmt.Errorf("stoch-vol: mu = %g, phi = %g, sigma_h = %g, want finite mu, |phi| < 1, sigma_h ≥ 0", g.Mu, g.Phi, g.SigmaH)
	}
	h, err := AR1{Phi: g.Phi}.Generate(n, rng) // stationary variance 1/(1 − φ²)
	if err != nil {
		return nil, fmt.Errorf("stoch-vol: %w", err)
	}
	scale := g.SigmaH * math.Sqrt(1-g.Phi*g.Phi)
	for i, v := range h {
		h[i] = math.Exp((g.Mu+scale*v)/2) * rng.NormFloat64()
	}
	return h, nil
}

func init() {
	registerNoise(&System{
		Name:  "stoch-vol",
		Title: "log-normal stochastic volatility x = exp(h/2) e, h AR(1)",
		Doc:   "Serially uncorrelated noise whose log-variance is a stationary Gaussian AR(1) of mean mu, persistence phi and sd sigma_h (Taylor's model). Label: stochastic.",
		Params: []Param{
			{Name: "mu", Default: 0, Min: -20, Max: 20, Doc: "mean log-variance μ"},
			{Name: "phi", Default: 0.95, Min: -0.9, Max: 0.999, Doc: "persistence φ of the log-variance"},
			{Name: "sigma_h", Default: 0.8, Min: 0.05, Max: 3, Doc: "stationary sd σ_h of the log-variance"},
		},
		Invariants: []Invariant{
			{Name: "variance", Value: math.Exp(0.32), Unit: "", Source: "Taylor (1986) (memory); log-normal moment: exp(μ + σ_h²/2)"},
			{Name: "kurtosis", Value: 3 * math.Exp(0.64), Unit: "", Source: "Taylor (1986) (memory); log-normal moments: 3 exp(σ_h²)"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return StochVol{Mu: p["mu"], Phi: p["phi"], SigmaH: p["sigma_h"]}, nil
	})
}
