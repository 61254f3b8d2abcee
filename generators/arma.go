package generators

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
)

// ARMA21 is the Gaussian ARMA(2,1) process
// x_t = φ1·x_{t−1} + φ2·x_{t−2} + ε_t + θ·ε_{t−1}, ε ~ N(0, 1). With complex
// characteristic roots (φ1² + 4φ2 < 0) its autocorrelation is a damped
// cosine and its spectrum has a resonance peak: it looks periodic but is
// noise. Writing the roots as r·e^{±iω}, φ1 = 2r·cos ω and φ2 = −r².
type ARMA21 struct {
	Phi1, Phi2, Theta float64
}

// rootModulus returns the largest modulus of the roots of z² − φ1 z − φ2.
func (a ARMA21) rootModulus() float64 {
	disc := complex(a.Phi1*a.Phi1+4*a.Phi2, 0)
	s := cmplx.Sqrt(disc)
	r1 := cmplx.Abs((complex(a.Phi1, 0) + s) / 2)
	r2 := cmplx.Abs((complex(a.Phi1, 0) - s) / 2)
	return math.Max(r1, r2)
}

// Generate returns n samples after a burn-in long enough for the start
// (zeros) to be forgotten to 1e−17: ⌈40/(−ln ρ)⌉ steps for root modulus ρ,
// at least 100 and at most 10^6.
func (a ARMA21) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(a.Phi1+a.Phi2 < 1 && a.Phi2-a.Phi1 < 1 && math.Abs(a.Phi2) < 1) || math.IsNaN(a.Theta) || math.IsInf(a.Theta, 0) {
		return nil, fmt.Errorf("arma21: phi1 = %g, phi2 = %g, theta = %g: not stationary (need phi1+phi2 < 1, phi2-phi1 < 1, |phi2| < 1)", a.Phi1, a.Phi2, a.Theta)
	}
	burn := 100
	if rho := a.rootModulus(); rho > 0 {
		burn = int(math.Min(1e6, math.Max(100, math.Ceil(40/-math.Log(rho)))))
	}
	out := make([]float64, n)
	var x1, x2, e1 float64
	for i := -burn; i < n; i++ {
		e := rng.NormFloat64()
		x := a.Phi1*x1 + a.Phi2*x2 + e + a.Theta*e1
		x2, x1, e1 = x1, x, e
		if i >= 0 {
			out[i] = x
		}
	}
	return out, nil
}

func init() {
	register(&System{
		Name:  "arma21",
		Title: "ARMA(2,1) with oscillatory roots (noisy resonance)",
		Doc:   "x_t = phi1 x_{t-1} + phi2 x_{t-2} + e_t + theta e_{t-1} with phi1 = 2r cos(2π/period), phi2 = -r²: a damped stochastic oscillation that looks periodic-ish but is noise. Label: stochastic.",
		Params: []Param{
			{Name: "r", Default: 0.95, Min: 0, Max: 0.999, Doc: "modulus of the characteristic roots (damping per sample)"},
			{Name: "period", Default: 20, Min: 2, Max: 1e6, Doc: "resonance period (samples)"},
			{Name: "theta", Default: 0.5, Min: -10, Max: 10, Doc: "moving-average coefficient θ"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			r := p["r"]
			return ARMA21{Phi1: 2 * r * math.Cos(2*math.Pi/p["period"]), Phi2: -r * r, Theta: p["theta"]}, 1, nil
		},
	})
}
