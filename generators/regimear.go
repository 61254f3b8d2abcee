package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// RegimeAR is a two-regime Markov-switching AR(1) process (Hamilton,
// Econometrica 57 (1989) 357):
//
//	x_t − μ_{s_t} = φ_{s_t} (x_{t−1} − μ_{s_{t−1}}) + σ_{s_t} ε_t,   ε ~ N(0, 1),
//
// where the hidden regime s_t ∈ {0, 1} is a Markov chain that leaves
// regime i with probability 1/Dwell[i] per step. Dwell times in regime i
// are therefore geometric, P(D = k) = (1 − q_i) q_i^{k−1} with
// q_i = 1 − 1/Dwell[i] and mean Dwell[i], and the chain spends the fraction
// Dwell[i]/(Dwell[0] + Dwell[1]) of the time in regime i (stationary law of
// a two-state chain). The regimes may differ in level, colour and
// variance; with equal μ and φ it is intermittent burst noise.
//
// The regime starts from the stationary law; x starts at μ_{s} and a
// burn-in of ⌈40/(−ln max|φ|)⌉ steps (at least 100) lets the deviation
// forget that start (it contracts by at least max|φ| per step).
type RegimeAR struct {
	Mu    [2]float64 // regime means
	Phi   [2]float64 // regime AR(1) coefficients, |Phi| < 1
	Sigma [2]float64 // regime innovation standard deviations, > 0
	Dwell [2]float64 // mean dwell times (samples), ≥ 1
}

func (g RegimeAR) check() error {
	for i := range 2 {
		if !(math.Abs(g.Phi[i]) < 1 && g.Sigma[i] > 0 && g.Dwell[i] >= 1) || math.IsInf(g.Sigma[i]+g.Dwell[i]+g.Mu[i], 0) || math.IsNaN(g.Mu[i]) {
			return fmt.Errorf("regime-ar: regime %d: mu = %g, phi = %g, sigma = %g, dwell = %g, want |phi| < 1, sigma > 0, dwell ≥ 1, all finite", i, g.Mu[i], g.Phi[i], g.Sigma[i], g.Dwell[i])
		}
	}
	return nil
}

// Path returns n samples of x and the regime s_t of each.
func (g RegimeAR) Path(n int, rng *rand.Rand) ([]float64, []uint8, error) {
	if err := checkN(n); err != nil {
		return nil, nil, err
	}
	if err := g.check(); err != nil {
		return nil, nil, err
	}
	burn := 100
	if rho := math.Max(math.Abs(g.Phi[0]), math.Abs(g.Phi[1])); rho > 0 {
		burn = int(math.Max(100, math.Ceil(40/-math.Log(rho))))
	}
	leave := [2]float64{1 / g.Dwell[0], 1 / g.Dwell[1]}
	var s uint8
	if rng.Float64()*(g.Dwell[0]+g.Dwell[1]) >= g.Dwell[0] {
		s = 1
	}
	x := make([]float64, n)
	regime := make([]uint8, n)
	var y float64 // deviation x − μ_s
	for t := -burn; t < n; t++ {
		if rng.Float64() < leave[s] {
			s = 1 - s
		}
		y = g.Phi[s]*y + g.Sigma[s]*rng.NormFloat64()
		if t >= 0 {
			x[t] = g.Mu[s] + y
			regime[t] = s
		}
	}
	return x, regime, nil
}

// Generate returns n samples of x.
func (g RegimeAR) Generate(n int, rng *rand.Rand) ([]float64, error) {
	x, _, err := g.Path(n, rng)
	return x, err
}

// Bursts returns intermittent burst noise as a RegimeAR: Gaussian noise,
// AR(1)-coloured with coefficient phi (0 for white), whose standard
// deviation switches between 1 in the quiet regime (0) and ratio in the
// burst regime (1), with mean dwell times dwellQuiet and dwellBurst
// samples. The innovations are scaled by √(1 − φ²) so that a long stay in
// a regime has variance 1 or ratio².
func Bursts(ratio, dwellQuiet, dwellBurst, phi float64) RegimeAR {
	s := math.Sqrt(1 - phi*phi)
	return RegimeAR{
		Phi:   [2]float64{phi, phi},
		Sigma: [2]float64{s, ratio * s},
		Dwell: [2]float64{dwellQuiet, dwellBurst},
	}
}

func init() {
	dwell := func(name string, def float64, doc string) Param {
		return Param{Name: name, Default: def, Min: 1, Max: 1e6, Doc: doc}
	}
	registerNoise(&System{
		Name:  "regime-ar",
		Title: "Markov-switching AR(1) (two regimes, Hamilton)",
		Doc:   "x - mu_s = phi_s (x' - mu_s') + sigma_s e with a hidden two-state Markov regime s of geometric dwell times; regime 0 has mu = 0, sigma = 1. Label: stochastic.",
		Params: []Param{
			{Name: "mu1", Default: 3, Min: -10, Max: 10, Doc: "mean of regime 1 (regime 0 has mean 0)"},
			{Name: "phi0", Default: 0.5, Min: -0.95, Max: 0.98, Doc: "AR(1) coefficient in regime 0"},
			{Name: "phi1", Default: 0.9, Min: -0.95, Max: 0.98, Doc: "AR(1) coefficient in regime 1"},
			{Name: "sigma1", Default: 1, Min: 0.1, Max: 10, Doc: "innovation sd in regime 1 (regime 0 has 1)"},
			dwell("dwell0", 100, "mean dwell time in regime 0 (samples)"),
			dwell("dwell1", 50, "mean dwell time in regime 1 (samples)"),
		},
		Invariants: []Invariant{
			{Name: "regime1_fraction", Value: 50.0 / 150, Unit: "", Source: "stationary law of a two-state Markov chain (analytic): dwell1/(dwell0 + dwell1)"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return RegimeAR{
			Mu:    [2]float64{0, p["mu1"]},
			Phi:   [2]float64{p["phi0"], p["phi1"]},
			Sigma: [2]float64{1, p["sigma1"]},
			Dwell: [2]float64{p["dwell0"], p["dwell1"]},
		}, nil
	})
	registerNoise(&System{
		Name:  "bursts",
		Title: "intermittent burst noise (Markov on/off variance switching)",
		Doc:   "Gaussian noise, optionally AR(1)-coloured, whose sd switches between 1 (quiet) and ratio (burst) by a two-state Markov chain with geometric dwell times. Label: stochastic.",
		Params: []Param{
			{Name: "ratio", Default: 5, Min: 1, Max: 100, Doc: "burst sd / quiet sd"},
			dwell("dwell_quiet", 200, "mean quiet dwell time (samples)"),
			dwell("dwell_burst", 20, "mean burst dwell time (samples)"),
			{Name: "phi", Default: 0, Min: -0.9, Max: 0.98, Doc: "AR(1) colour φ (0 white)"},
		},
		Invariants: []Invariant{
			{Name: "regime1_fraction", Value: 20.0 / 220, Unit: "", Source: "stationary law of a two-state Markov chain (analytic): fraction of time in bursts, dwell_burst/(dwell_quiet + dwell_burst)"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return Bursts(p["ratio"], p["dwell_quiet"], p["dwell_burst"], p["phi"]), nil
	})
}
