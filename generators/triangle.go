package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Triangle is the periodic triangle wave that rises linearly from 0 to 1
// during a fraction Rise of each period of Period samples and falls back
// linearly during the rest, with a random phase: x_t = u/r for u < r,
// (1 − u)/(1 − r) otherwise, u = frac(t/P + φ). Rise = ½ is the symmetric
// triangle, whose Fourier series has only odd harmonics, with amplitudes
// 4/(π²h²) about the mean ½ (analytic); Rise → 1 tends to the sawtooth.
type Triangle struct {
	Period float64 // period in samples, ≥ 2
	Rise   float64 // fraction of the period spent rising, 0 < Rise < 1
}

// Generate returns n samples.
func (s Triangle) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(s.Period >= 2) || math.IsInf(s.Period, 0) || !(s.Rise > 0 && s.Rise < 1) {
		return nil, fmt.Errorf("triangle: %w: period = %g, rise = %g, want period ≥ 2 and 0 < rise < 1", ErrParamRange, s.Period, s.Rise)
	}
	phi := rng.Float64()
	out := make([]float64, n)
	for t := range out {
		u := turns(t, s.Period, phi)
		if u < s.Rise {
			out[t] = u / s.Rise
		} else {
			out[t] = (1 - u) / (1 - s.Rise)
		}
	}
	return out, nil
}

func init() {
	registerSignal(&System{
		Name:  "triangle",
		Title: "triangle wave with adjustable rise fraction (random phase)",
		Doc:   "Linear rise during a fraction rise of the period, linear fall during the rest; rise = 0.5 is symmetric, rise near 0 or 1 approaches a sawtooth. Label: regular.",
		Params: []Param{
			{Name: "period", Default: 30, Min: 2, Max: 1e9, Doc: "period (samples)"},
			{Name: "rise", Default: 0.5, Min: 0.02, Max: 0.98, Doc: "fraction of the period spent rising"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return Triangle{Period: p["period"], Rise: p["rise"]}, nil
	})
}
