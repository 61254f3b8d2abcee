package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Sawtooth is the periodic ramp x_t = frac(t/P + φ) in [0, 1), period
// Period samples, with a random phase φ in [0, 1).
type Sawtooth struct {
	Period float64 // period in samples, ≥ 2
}

// Generate returns n samples.
func (s Sawtooth) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(s.Period >= 2) || math.IsInf(s.Period, 0) {
		return nil, fmt.Errorf("sawtooth: period = %g samples, want period ≥ 2", s.Period)
	}
	phi := rng.Float64()
	out := make([]float64, n)
	for t := range out {
		u := math.Mod(float64(t), s.Period)/s.Period + phi
		out[t] = u - math.Floor(u)
	}
	return out, nil
}

// Square is the periodic rectangular wave that is 1 for a fraction Duty of
// each period of Period samples and 0 otherwise, with a random phase. Its
// samples take only two values, like telegraph noise, but switch on a
// strict schedule.
type Square struct {
	Period float64 // period in samples, ≥ 2
	Duty   float64 // fraction of the period at 1, 0 < Duty < 1; zero means ½
}

// Generate returns n samples.
func (s Square) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	d := s.Duty
	if d == 0 {
		d = 0.5
	}
	if !(s.Period >= 2) || math.IsInf(s.Period, 0) || !(d > 0 && d < 1) {
		return nil, fmt.Errorf("square: period = %g, duty = %g, want period ≥ 2 and 0 < duty < 1", s.Period, s.Duty)
	}
	phi := rng.Float64()
	out := make([]float64, n)
	for t := range out {
		u := math.Mod(float64(t), s.Period)/s.Period + phi
		if u-math.Floor(u) < d {
			out[t] = 1
		}
	}
	return out, nil
}

func init() {
	register(&System{
		Name:         "sawtooth",
		Title:        "sawtooth wave (random phase)",
		Doc:          "frac(t/P + φ). Label: regular.",
		Params:       []Param{{Name: "period", Default: 25, Min: 2, Max: 1e9, Doc: "period (samples)"}},
		TimeAxis:     AxisIteration,
		DefaultClass: Regular,
		label:        fixed(Regular),
		build: func(p map[string]float64) (Generator, float64, error) {
			return Sawtooth{Period: p["period"]}, 1, nil
		},
	})
	register(&System{
		Name:  "square",
		Title: "square (rectangular) wave (random phase)",
		Doc:   "1 for a fraction duty of each period, else 0. Label: regular.",
		Params: []Param{
			{Name: "period", Default: 30, Min: 2, Max: 1e9, Doc: "period (samples)"},
			{Name: "duty", Default: 0.3, Min: 0.01, Max: 0.99, Doc: "fraction of the period at the high level"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Regular,
		label:        fixed(Regular),
		build: func(p map[string]float64) (Generator, float64, error) {
			return Square{Period: p["period"], Duty: p["duty"]}, 1, nil
		},
	})
}
