package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// ShotNoise is Poisson shot noise: pulses of unit height arriving as a
// Poisson process of Rate per time unit, each decaying as e^{−t/Tau},
// x(t) = Σ_{t_k ≤ t} e^{−(t − t_k)/τ}, sampled every Dt. By Campbell's
// theorem its mean is ν·τ and its variance ν·τ/2 (analytic). Small ν·τ
// gives sparse spikes, large ν·τ approaches Gaussian OU-like noise.
//
// Sampling is exact: between samples the state decays by e^{−Dt/τ} and each
// arrival in the interval adds its decayed pulse. A burn-in of 20τ (at
// least 10 samples) brings the state to its stationary law.
type ShotNoise struct {
	Rate, Tau float64 // pulse rate (per time unit) and decay time (time units), > 0
	Dt        float64 // sample interval (time units), > 0
}

// Generate returns n samples.
func (s ShotNoise) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(s.Rate > 0 && s.Tau > 0 && s.Dt > 0) || math.IsInf(s.Rate+s.Tau+s.Dt, 0) {
		return nil, fmt.Errorf("shot-noise: rate = %g, tau = %g, dt = %g, want all > 0", s.Rate, s.Tau, s.Dt)
	}
	burn := int(math.Min(1e7, math.Max(10, math.Ceil(20*s.Tau/s.Dt))))
	decay := math.Exp(-s.Dt / s.Tau)
	out := make([]float64, n)
	var x float64
	next := rng.ExpFloat64() / s.Rate // next arrival, measured from the start of the interval
	for i := -burn; i < n; i++ {
		x *= decay
		for next <= s.Dt {
			x += math.Exp(-(s.Dt - next) / s.Tau)
			next += rng.ExpFloat64() / s.Rate
		}
		next -= s.Dt
		if i >= 0 {
			out[i] = x
		}
	}
	return out, nil
}

func init() {
	register(&System{
		Name:  "shot-noise",
		Title: "Poisson shot noise (exponential pulses)",
		Doc:   "Unit pulses at Poisson times decaying as exp(-t/tau), sampled exactly every dt. Label: stochastic.",
		Params: []Param{
			{Name: "rate", Default: 0.1, Min: 1e-9, Max: 1e6, Doc: "pulse rate ν (per time unit)"},
			{Name: "tau", Default: 5, Min: 1e-9, Max: 1e9, Doc: "pulse decay time τ (time units)"},
			{Name: "dt", Default: 1, Min: 1e-9, Max: 1e9, Doc: "sample interval (time units)"},
		},
		Invariants: []Invariant{
			{Name: "mean", Value: 0.5, Unit: "", Source: "Campbell's theorem (analytic): ν τ"},
			{Name: "variance", Value: 0.25, Unit: "", Source: "Campbell's theorem (analytic): ν τ / 2"},
		},
		TimeAxis:     AxisTime,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			if p["rate"]*p["dt"] > 1e3 {
				return nil, 0, fmt.Errorf("shot-noise: %w: rate·dt = %g pulses per sample, want ≤ 1000", ErrParamRange, p["rate"]*p["dt"])
			}
			return ShotNoise{Rate: p["rate"], Tau: p["tau"], Dt: p["dt"]}, p["dt"], nil
		},
	})
}
