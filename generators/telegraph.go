package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Telegraph is random telegraph noise: a two-state Markov process that
// stays in the up state for exponentially distributed times of mean TauUp
// and in the down state for times of mean TauDown, sampled every Dt. Its
// autocorrelation is exp(−|t|(1/τ_up + 1/τ_down)) and its spectrum a
// Lorentzian with corner frequency (1/τ_up + 1/τ_down)/(2π) (Machlup,
// J. Appl. Phys. 25 (1954) 341). This is the single-trap noise of small
// transistors.
//
// Simulation is event-exact: dwell times are drawn from the exponential law
// and each sample reads the state at its instant t_k = k·Dt; the start is
// drawn from the stationary law (up with probability τ_up/(τ_up + τ_down),
// and by memorylessness the first dwell is a fresh exponential). Levels are
// 0 (down) and Amplitude (up).
type Telegraph struct {
	TauUp, TauDown float64 // mean dwell times (time units), > 0
	Dt             float64 // sample interval (time units), > 0
	Amplitude      float64 // level of the up state; zero means 1
}

func (g Telegraph) check() error {
	if !(g.TauUp > 0 && g.TauDown > 0 && g.Dt > 0) || math.IsInf(g.TauUp+g.TauDown+g.Dt, 0) {
		return fmt.Errorf("telegraph: tau_up = %g, tau_down = %g, dt = %g, want all > 0 and finite", g.TauUp, g.TauDown, g.Dt)
	}
	if math.IsNaN(g.Amplitude) || math.IsInf(g.Amplitude, 0) {
		return fmt.Errorf("telegraph: amplitude = %g, want a finite value", g.Amplitude)
	}
	return nil
}

// Generate returns n samples of the telegraph signal.
func (g Telegraph) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := g.check(); err != nil {
		return nil, err
	}
	a := g.Amplitude
	if a == 0 {
		a = 1
	}
	out := make([]float64, n)
	telegraphAdd(out, g.TauUp, g.TauDown, g.Dt, a, rng)
	return out, nil
}

// telegraphAdd adds one stationary telegraph source with levels 0 and a,
// sampled at k·dt, to out.
func telegraphAdd(out []float64, tauUp, tauDown, dt, a float64, rng *rand.Rand) {
	up := rng.Float64()*(tauUp+tauDown) < tauUp
	mean := tauDown
	if up {
		mean = tauUp
	}
	next := mean * rng.ExpFloat64() // time of the next switch
	for k := range out {
		t := float64(k) * dt
		for next <= t {
			up = !up
			if up {
				next += tauUp * rng.ExpFloat64()
			} else {
				next += tauDown * rng.ExpFloat64()
			}
		}
		if up {
			out[k] += a
		}
	}
}

// TelegraphSum is the superposition of K independent symmetric telegraph
// sources (τ_up = τ_down = τ_i, levels 0 and 1) whose time constants are
// drawn log-uniformly in [TauMin, TauMax], sampled every Dt. Each source
// contributes a Lorentzian with corner 1/(πτ_i); a 1/τ density of corners
// sums to S(f) ∝ 1/f between about 1/(πTauMax) and 1/(πTauMin) (McWhorter
// 1957 (memory); Machlup 1954 for each Lorentzian): the classical model of
// 1/f noise in MOS devices as many traps with spread tunnelling times.
type TelegraphSum struct {
	K              int     // number of sources, ≥ 1
	TauMin, TauMax float64 // range of the time constants (time units), 0 < TauMin ≤ TauMax
	Dt             float64 // sample interval (time units); zero means 1
}

// Generate returns n samples of the sum. The time constants are drawn from
// rng first, then the sources in turn. Time O(K·n).
func (g TelegraphSum) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	dt := g.Dt
	if dt == 0 {
		dt = 1
	}
	if g.K < 1 || !(g.TauMin > 0 && g.TauMax >= g.TauMin && dt > 0) || math.IsInf(g.TauMax+dt, 0) {
		return nil, fmt.Errorf("telegraph-sum: K = %d, tau_min = %g, tau_max = %g, dt = %g, want K ≥ 1, 0 < tau_min ≤ tau_max, dt > 0", g.K, g.TauMin, g.TauMax, g.Dt)
	}
	taus := make([]float64, g.K)
	lo, hi := math.Log(g.TauMin), math.Log(g.TauMax)
	for i := range taus {
		taus[i] = math.Exp(lo + (hi-lo)*rng.Float64())
	}
	out := make([]float64, n)
	for _, tau := range taus {
		telegraphAdd(out, tau, tau, dt, 1, rng)
	}
	return out, nil
}

func init() {
	register(&System{
		Name:  "telegraph",
		Title: "random telegraph noise (two-state Markov, exponential dwell times)",
		Doc:   "Levels 0 and amplitude; event-exact simulation sampled every dt, stationary start. Label: stochastic.",
		Params: []Param{
			{Name: "tau_up", Default: 20, Min: 1e-6, Max: 1e9, Doc: "mean dwell time in the up state (time units)"},
			{Name: "tau_down", Default: 50, Min: 1e-6, Max: 1e9, Doc: "mean dwell time in the down state (time units)"},
			{Name: "dt", Default: 1, Min: 1e-9, Max: 1e9, Doc: "sample interval (time units)"},
			{Name: "amplitude", Default: 1, Min: 1e-12, Max: 1e12, Doc: "level of the up state"},
		},
		Invariants: []Invariant{
			{Name: "lag1_autocorrelation", Value: math.Exp(-(1.0/20 + 1.0/50)), Unit: "", Source: "Machlup, J. Appl. Phys. 25 (1954) 341: exp(-dt(1/τ_up + 1/τ_down))"},
		},
		TimeAxis:     AxisTime,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return Telegraph{TauUp: p["tau_up"], TauDown: p["tau_down"], Dt: p["dt"], Amplitude: p["amplitude"]}, p["dt"], nil
		},
	})
	register(&System{
		Name:  "telegraph-sum",
		Title: "superposition of K telegraph sources with log-uniform time constants (≈ 1/f)",
		Doc:   "K symmetric telegraph sources, τ log-uniform in [tau_min, tau_max]: a 1/f spectrum between the corners (McWhorter model). Label: stochastic.",
		Params: []Param{
			{Name: "k", Default: 30, Min: 1, Max: 10000, Integer: true, Doc: "number of sources"},
			{Name: "tau_min", Default: 1, Min: 1e-6, Max: 1e9, Doc: "smallest time constant (time units)"},
			{Name: "tau_max", Default: 1e4, Min: 1e-6, Max: 1e9, Doc: "largest time constant (time units), ≥ tau_min"},
			{Name: "dt", Default: 1, Min: 1e-9, Max: 1e9, Doc: "sample interval (time units)"},
		},
		Invariants: []Invariant{
			{Name: "sc_psd_beta", Value: 1, Unit: "", Source: "McWhorter (1957) (memory): ≈ 1/f between 1/(π tau_max) and 1/(π tau_min)"},
		},
		TimeAxis:     AxisTime,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			if p["tau_max"] < p["tau_min"] {
				return nil, 0, fmt.Errorf("telegraph-sum: %w: tau_max = %g < tau_min = %g", ErrParamRange, p["tau_max"], p["tau_min"])
			}
			return TelegraphSum{K: int(p["k"]), TauMin: p["tau_min"], TauMax: p["tau_max"], Dt: p["dt"]}, p["dt"], nil
		},
	})
}
