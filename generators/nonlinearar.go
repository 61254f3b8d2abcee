package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// nonlinearBurn is the burn-in of the nonlinear stochastic processes
// below, which start from zero (common practice; their memory decays
// geometrically at the documented stationary parameters).
const nonlinearBurn = 1000

// TAR is the two-regime self-exciting threshold autoregression
// x_t = φ_low·x_{t−1} + ε_t if x_{t−1} ≤ Threshold, else φ_high·x_{t−1} + ε_t,
// ε ~ N(0, 1) (Tong & Lim, J. R. Stat. Soc. B 42 (1980) 245). |φ| < 1 in both
// regimes is sufficient for stationarity. A nonlinear, time-irreversible
// noise.
type TAR struct {
	PhiLow, PhiHigh, Threshold float64
}

// Generate returns n samples after a burn-in of 1000 steps from 0.
func (a TAR) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(math.Abs(a.PhiLow) < 1 && math.Abs(a.PhiHigh) < 1) || math.IsNaN(a.Threshold) || math.IsInf(a.Threshold, 0) {
		return nil, fmt.Errorf("tar: phi_low = %g, phi_high = %g, threshold = %g, want |phi| < 1 and a finite threshold", a.PhiLow, a.PhiHigh, a.Threshold)
	}
	out := make([]float64, n)
	var x float64
	for i := -nonlinearBurn; i < n; i++ {
		phi := a.PhiHigh
		if x <= a.Threshold {
			phi = a.PhiLow
		}
		x = phi*x + rng.NormFloat64()
		if i >= 0 {
			out[i] = x
		}
	}
	return out, nil
}

// Bilinear is the bilinear process x_t = a·x_{t−1} + b·x_{t−1}·ε_{t−1} + ε_t,
// ε ~ N(0, 1) (Granger & Andersen, An Introduction to Bilinear Time Series
// Models (1978)); a² + b² < 1 keeps its second moment finite. Its
// innovations multiply the state, giving bursts that linear models miss.
type Bilinear struct {
	A, B float64
}

// Generate returns n samples after a burn-in of 1000 steps from 0.
func (a Bilinear) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(a.A*a.A+a.B*a.B < 1) {
		return nil, fmt.Errorf("bilinear: a = %g, b = %g, want a² + b² < 1", a.A, a.B)
	}
	out := make([]float64, n)
	var x, e float64
	for i := -nonlinearBurn; i < n; i++ {
		en := rng.NormFloat64()
		x = a.A*x + a.B*x*e + en
		e = en
		if i >= 0 {
			out[i] = x
		}
	}
	return out, nil
}

// NLMA is the nonlinear moving average x_t = ε_t + b·ε_{t−1}·ε_{t−2},
// ε ~ N(0, 1). Every autocorrelation at lag ≥ 1 is exactly zero (each term
// of E[x_t x_{t−k}] has an odd power of some ε), so linear methods see
// white noise, yet x_t is predictable in part from the past: a hard
// negative for tests of "structure".
type NLMA struct {
	B float64
}

// Generate returns n samples.
func (a NLMA) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if math.IsNaN(a.B) || math.IsInf(a.B, 0) {
		return nil, fmt.Errorf("nlma: b = %g, want a finite value", a.B)
	}
	out := make([]float64, n)
	e1, e2 := rng.NormFloat64(), rng.NormFloat64()
	for i := range out {
		e := rng.NormFloat64()
		out[i] = e + a.B*e1*e2
		e2, e1 = e1, e
	}
	return out, nil
}

func init() {
	register(&System{
		Name:  "tar",
		Title: "threshold autoregression SETAR(2;1,1)",
		Doc:   "x_t = phi_low x_{t-1} + e_t below the threshold, phi_high x_{t-1} + e_t above; burn-in 1000. Label: stochastic.",
		Params: []Param{
			{Name: "phi_low", Default: 0.9, Min: -0.999, Max: 0.999, Doc: "coefficient at or below the threshold"},
			{Name: "phi_high", Default: -0.5, Min: -0.999, Max: 0.999, Doc: "coefficient above the threshold"},
			{Name: "threshold", Default: 0, Min: -100, Max: 100, Doc: "threshold on x_{t-1}"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return TAR{PhiLow: p["phi_low"], PhiHigh: p["phi_high"], Threshold: p["threshold"]}, 1, nil
		},
	})
	register(&System{
		Name:  "bilinear",
		Title: "bilinear process x_t = a x_{t-1} + b x_{t-1} e_{t-1} + e_t",
		Doc:   "Requires a² + b² < 1 (checked when generating); burn-in 1000. Label: stochastic.",
		Params: []Param{
			{Name: "a", Default: 0.4, Min: -0.999, Max: 0.999, Doc: "linear coefficient"},
			{Name: "b", Default: 0.5, Min: -0.999, Max: 0.999, Doc: "bilinear coefficient"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			if p["a"]*p["a"]+p["b"]*p["b"] >= 1 {
				return nil, 0, fmt.Errorf("bilinear: %w: a² + b² = %g, want < 1", ErrParamRange, p["a"]*p["a"]+p["b"]*p["b"])
			}
			return Bilinear{A: p["a"], B: p["b"]}, 1, nil
		},
	})
	register(&System{
		Name:         "nlma",
		Title:        "nonlinear moving average x_t = e_t + b e_{t-1} e_{t-2}",
		Doc:          "Uncorrelated at every lag yet not independent. Label: stochastic.",
		Params:       []Param{{Name: "b", Default: 0.8, Min: -10, Max: 10, Doc: "coefficient of the product term"}},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return NLMA{B: p["b"]}, 1, nil
		},
	})
}
