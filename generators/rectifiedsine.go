package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// RectifiedSine is a rectified sine of period Period samples with a random
// phase, u = frac(t/P + φ): full-wave |sin(πu)| (Half false; the absolute
// value of a sine of period 2P) or half-wave max(0, sin(2πu)) (Half true).
// Full-wave: mean 2/π and harmonics of amplitude 4/(π(4h² − 1)) at h/P;
// half-wave: mean 1/π, fundamental ½, then only even harmonics of
// amplitude 2/(π(h² − 1)) (analytic Fourier series). The kinks where the
// sine is cut make the spectrum fall only as h^(−2).
type RectifiedSine struct {
	Period float64 // period of the rectified wave in samples, ≥ 2
	Half   bool    // half-wave instead of full-wave rectification
}

// Generate returns n samples.
func (s RectifiedSine) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(s.Period >= 2) || math.IsInf(s.Period, 0) {
		return nil, fmt.Errorf("rectified-sine: %w: period = %g, want period ≥ 2", ErrParamRange, s.Period)
	}
	phi := rng.Float64()
	out := make([]float64, n)
	for t := range out {
		u := turns(t, s.Period, phi)
		if s.Half {
			out[t] = math.Max(0, math.Sin(2*math.Pi*u))
		} else {
			out[t] = math.Sin(math.Pi * u) // ≥ 0 on [0, 1)
		}
	}
	return out, nil
}

func init() {
	registerSignal(&System{
		Name:  "rectified-sine",
		Title: "full- or half-wave rectified sine (random phase)",
		Doc:   "Full-wave |sin(π t/period)| (half = 0) or half-wave max(0, sin(2π t/period)) (half = 1), period in samples of the rectified wave. Label: regular.",
		Params: []Param{
			{Name: "period", Default: 25, Min: 2, Max: 1e9, Doc: "period of the rectified wave (samples)"},
			{Name: "half", Default: 0, Min: 0, Max: 1, Integer: true, Doc: "0 full-wave, 1 half-wave rectification"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return RectifiedSine{Period: p["period"], Half: p["half"] == 1}, nil
	})
}
