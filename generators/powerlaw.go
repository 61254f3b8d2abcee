package generators

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/dsp/fourier"
)

// PowerLaw is Gaussian noise with power spectrum S(f) ∝ f^{−β} ("1/f^β
// noise") made by spectral synthesis. Variant: random Gaussian Fourier
// amplitudes — the real and imaginary parts of each coefficient are
// independent N(0, S(f_k)/2), so the modulus is Rayleigh and the phase
// uniform (Timmer & König, Astron. Astrophys. 300 (1995) 707; confirmed: pypi.org/project/colorednoise) —
// rather than fixed amplitudes with random phases, which would make every
// periodogram ordinate equal to S(f_k) and the series not Gaussian-process
// like. The zero-frequency term is 0.
//
// To avoid the wrap-around of a periodic synthesis (first and last samples
// joined), the series is synthesised at a 5-smooth length M ≥ 2n and the
// first n values are kept; frequencies below 1/n therefore add the slow
// wander a long record of such noise has. Amplitudes are scaled so that the
// length-M process has variance 1 (the sample variance of a short window
// fluctuates, much more so for β ≥ 1).
type PowerLaw struct {
	Beta float64 // spectral exponent, 0 ≤ Beta ≤ 3
}

// Generate returns n samples. Time O(n log n).
func (p PowerLaw) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(p.Beta >= 0 && p.Beta <= 3) {
		return nil, fmt.Errorf("powerlaw: beta = %g, want 0 ≤ beta ≤ 3", p.Beta)
	}
	m := fftSize(2 * max(n, 2))
	if m%2 == 1 {
		m *= 2
	}
	half := m / 2
	coef := make([]complex128, half+1)
	var total float64
	for k := 1; k <= half; k++ {
		s := math.Pow(float64(k)/float64(m), -p.Beta)
		if k == half {
			coef[k] = complex(math.Sqrt(s)*rng.NormFloat64(), 0)
			total += s
			continue
		}
		a := math.Sqrt(s / 2)
		coef[k] = complex(a*rng.NormFloat64(), a*rng.NormFloat64())
		total += 2 * s
	}
	y := fourier.NewFFT(m).Sequence(nil, coef)
	scale := 1 / math.Sqrt(total)
	out := make([]float64, n)
	for i := range out {
		out[i] = scale * y[i]
	}
	return out, nil
}

func init() {
	register(&System{
		Name:  "powerlaw",
		Title: "1/f^beta Gaussian noise (spectral synthesis)",
		Doc:   "Random Gaussian Fourier amplitudes with variance ∝ f^-beta at a 5-smooth length ≥ 2n, first n values kept, unit variance of the synthesised process. Label: stochastic.",
		Params: []Param{
			{Name: "beta", Default: 1, Min: 0, Max: 3, Doc: "spectral exponent β (0 white, 1 pink, 2 Brownian-like)"},
		},
		Invariants: []Invariant{
			{Name: "sc_psd_beta", Value: 1, Unit: "", Source: "by construction: S(f) ∝ f^-β"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return PowerLaw{Beta: p["beta"]}, 1, nil
		},
	})
}
