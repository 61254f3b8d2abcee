package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// White is independent Gaussian noise N(0, Sigma²).
type White struct {
	Sigma float64 // standard deviation, > 0
}

// Generate returns n independent N(0, σ²) draws.
func (w White) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(w.Sigma > 0) {
		return nil, fmt.Errorf("white: sigma = %g, want sigma > 0", w.Sigma)
	}
	out := make([]float64, n)
	for i := range out {
		out[i] = w.Sigma * rng.NormFloat64()
	}
	return out, nil
}

// AR1 is the first-order autoregression x' = Phi·x + ε, ε ~ N(0, 1), started
// from its stationary distribution N(0, 1/(1−Φ²)) so no transient is needed.
type AR1 struct {
	Phi float64 // lag-one coefficient, |Phi| < 1
}

// Generate returns n samples of the stationary AR(1) process.
func (a AR1) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(math.Abs(a.Phi) < 1) {
		return nil, fmt.Errorf("ar1: phi = %g, want |phi| < 1", a.Phi)
	}
	out := make([]float64, n)
	x := rng.NormFloat64() / math.Sqrt(1-a.Phi*a.Phi)
	for i := range out {
		out[i] = x
		x = a.Phi*x + rng.NormFloat64()
	}
	return out, nil
}

// OU is the Ornstein–Uhlenbeck process with relaxation time Tau and
// stationary standard deviation S, sampled every Dt with the exact update
// x' = x·e^{−Δ/τ} + S·√(1−e^{−2Δ/τ})·N(0,1) (Gillespie, Phys. Rev. E 54
// (1996) 2084). Its lag-k autocorrelation is e^{−kΔ/τ}. It starts from the
// stationary distribution, so no transient is needed.
type OU struct {
	Tau, S, Dt float64 // all > 0
}

// Generate returns n samples of the stationary OU process.
func (o OU) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(o.Tau > 0 && o.S > 0 && o.Dt > 0) {
		return nil, fmt.Errorf("ou: tau = %g, s = %g, dt = %g, want all > 0", o.Tau, o.S, o.Dt)
	}
	mu := math.Exp(-o.Dt / o.Tau)
	sd := o.S * math.Sqrt(1-mu*mu)
	out := make([]float64, n)
	x := o.S * rng.NormFloat64()
	for i := range out {
		out[i] = x
		x = x*mu + sd*rng.NormFloat64()
	}
	return out, nil
}

// AddNoise returns x plus independent Gaussian observational noise at the
// given signal-to-noise ratio in decibels, SNR = 10·log10(var(x)/var(noise)),
// so the noise standard deviation is sd(x)·10^(−SNR/20). x is not modified.
// An infinite SNR returns a copy of x.
func AddNoise(x []float64, snrDB float64, rng *rand.Rand) ([]float64, error) {
	if math.IsNaN(snrDB) || math.IsInf(snrDB, -1) {
		return nil, fmt.Errorf("generators: SNR = %g dB, want a number or +Inf", snrDB)
	}
	if len(x) == 0 {
		return nil, fmt.Errorf("generators: cannot add noise to an empty series")
	}
	out := make([]float64, len(x))
	copy(out, x)
	if math.IsInf(snrDB, 1) {
		return out, nil
	}
	var mean, ss float64
	for _, v := range x {
		mean += v
	}
	mean /= float64(len(x))
	for _, v := range x {
		ss += (v - mean) * (v - mean)
	}
	sd := math.Sqrt(ss / float64(len(x)))
	if !(sd > 0) {
		return nil, fmt.Errorf("generators: cannot set an SNR: %w", ErrConstant)
	}
	noiseSD := sd * math.Pow(10, -snrDB/20)
	for i := range out {
		out[i] += noiseSD * rng.NormFloat64()
	}
	return out, nil
}

func init() {
	register(&System{
		Name:   "white",
		Title:  "white Gaussian noise",
		Doc:    "Independent N(0, sigma²) samples. Label: stochastic.",
		Params: []Param{{Name: "sigma", Default: 1, Min: 1e-12, Max: 1e12, Doc: "standard deviation"}},
		Invariants: []Invariant{
			{Name: "hv_deg_mean", Value: 4, Unit: "", Source: "Luque et al., Phys. Rev. E 80 (2009) 046103: any continuous i.i.d. series"},
			{Name: "hv_tail_exprate", Value: math.Log(1.5), Unit: "", Source: "Luque et al. (2009): any continuous i.i.d. series"},
			{Name: "op_ent_d4", Value: 1, Unit: "normalised", Source: "Bandt & Pompe, Phys. Rev. Lett. 88 (2002) 174102: i.i.d."},
			{Name: "nl_sent_m2", Value: 2.185, Unit: "m = 2, r = 0.2 sd", Source: "Richman & Moorman, Am. J. Physiol. 278 (2000) H2039; value derived: -ln(2Φ(0.2/√2) - 1)"},
			{Name: "sc_fluct_a1", Value: 0.5, Unit: "", Source: "Peng et al., Phys. Rev. E 49 (1994) 1685"},
			{Name: "sc_psd_beta", Value: 0, Unit: "", Source: "standard result for white noise"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return White{Sigma: p["sigma"]}, 1, nil
		},
	})
	register(&System{
		Name:   "ar1",
		Title:  "AR(1) process x' = phi x + N(0,1)",
		Doc:    "Gaussian first-order autoregression, started stationary. Label: stochastic.",
		Params: []Param{{Name: "phi", Default: 0.9, Min: -0.999, Max: 0.999, Doc: "lag-one coefficient"}},
		Invariants: []Invariant{
			{Name: "lag1_autocorrelation", Value: 0.9, Unit: "", Source: "analytic: ρ(k) = φ^k for AR(1)"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return AR1{Phi: p["phi"]}, 1, nil
		},
	})
	register(&System{
		Name:  "ou",
		Title: "Ornstein–Uhlenbeck process (exact update)",
		Doc:   "Exact discretisation (Gillespie 1996), started stationary. Label: stochastic.",
		Params: []Param{
			{Name: "tau", Default: 10, Min: 1e-6, Max: 1e9, Doc: "relaxation time (time units)"},
			{Name: "s", Default: 1, Min: 1e-12, Max: 1e12, Doc: "stationary standard deviation"},
			{Name: "dt", Default: 1, Min: 1e-9, Max: 1e9, Doc: "sample interval (time units)"},
		},
		Invariants: []Invariant{
			{Name: "lag1_autocorrelation", Value: math.Exp(-0.1), Unit: "", Source: "Gillespie, Phys. Rev. E 54 (1996) 2084: e^{-Δ/τ} at Δ = 1, τ = 10"},
		},
		TimeAxis:     AxisTime,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return OU{Tau: p["tau"], S: p["s"], Dt: p["dt"]}, p["dt"], nil
		},
	})
}
