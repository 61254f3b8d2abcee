package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Sine is a periodic signal of fundamental period Period samples with
// harmonics: x_t = sin(2πt/P + φ_1) + Σ_h a_h·sin(2πht/P + φ_h), h = 2, 3,
// ..., with a_h = Harmonics[h−2] and every phase φ uniform in [0, 2π) from
// the rng. Every harmonic with a non-zero amplitude must lie below the
// Nyquist frequency (h/P < ½), so it is not aliased.
type Sine struct {
	Period    float64   // fundamental period in samples, ≥ 2
	Harmonics []float64 // amplitudes of harmonics 2, 3, ... relative to the fundamental
}

// Generate returns n samples.
func (s Sine) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(s.Period >= 2) || math.IsInf(s.Period, 0) {
		return nil, fmt.Errorf("sine: period = %g samples, want period ≥ 2", s.Period)
	}
	amps := append([]float64{1}, s.Harmonics...)
	for i, a := range amps {
		if math.IsNaN(a) || math.IsInf(a, 0) {
			return nil, fmt.Errorf("sine: harmonic %d amplitude = %g, want a finite value", i+1, a)
		}
		if a != 0 && float64(i+1)/s.Period >= 0.5 {
			return nil, fmt.Errorf("sine: harmonic %d of period %g samples lies at or above the Nyquist frequency", i+1, s.Period)
		}
	}
	out := make([]float64, n)
	for i, a := range amps {
		phi := 2 * math.Pi * rng.Float64()
		if a == 0 {
			continue
		}
		// The phase is taken from t mod Period, so that with a whole
		// period the samples repeat exactly, not just up to rounding
		// (visibility graphs and ordinal patterns see the difference).
		w := 2 * math.Pi * float64(i+1)
		for t := range out {
			out[t] += a * math.Sin(w*math.Mod(float64(t), s.Period)/s.Period+phi)
		}
	}
	return out, nil
}

// TwoTone is a quasi-periodic signal, the sum of two sines whose frequency
// ratio is irrational: x_t = sin(2πt/P + φ_1) + A2·sin(2πt·Ratio/P + φ_2),
// random phases. The default ratio is the golden mean (1 + √5)/2, the
// number worst approximated by rationals, so the motion never locks.
type TwoTone struct {
	Period float64 // period of the first tone in samples, ≥ 2
	Ratio  float64 // frequency ratio f2/f1, > 0; zero means the golden mean
	Amp2   float64 // amplitude of the second tone; zero means 1
}

// GoldenMean is (1 + √5)/2, the default frequency ratio of TwoTone.
const GoldenMean = 1.618033988749894848204586834365638

// Generate returns n samples.
func (s TwoTone) Generate(n int, rng *rand.Rand) ([]float64, error) {
	r, a2 := s.Ratio, s.Amp2
	if r == 0 {
		r = GoldenMean
	}
	if a2 == 0 {
		a2 = 1
	}
	if !(r > 0) || !(s.Period >= 2) || math.IsInf(s.Period*r, 0) || math.IsNaN(a2) || math.IsInf(a2, 0) {
		return nil, fmt.Errorf("two-tone: period = %g, ratio = %g, amp2 = %g, want period ≥ 2, ratio > 0, finite amp2", s.Period, s.Ratio, s.Amp2)
	}
	if r/s.Period >= 0.5 {
		return nil, fmt.Errorf("two-tone: second tone of period %g samples lies at or above the Nyquist frequency", s.Period/r)
	}
	if err := checkN(n); err != nil {
		return nil, err
	}
	p1, p2 := 2*math.Pi*rng.Float64(), 2*math.Pi*rng.Float64()
	w1, w2 := 2*math.Pi/s.Period, 2*math.Pi*r/s.Period
	out := make([]float64, n)
	for t := range out {
		out[t] = math.Sin(w1*float64(t)+p1) + a2*math.Sin(w2*float64(t)+p2)
	}
	return out, nil
}

func init() {
	register(&System{
		Name:  "sine",
		Title: "sine with harmonics (random phases)",
		Doc:   "sin(2πt/P) + h2 sin(4πt/P) + h3 sin(6πt/P), each with a random phase; harmonics at or above Nyquist are refused. Label: regular.",
		Params: []Param{
			{Name: "period", Default: 20, Min: 2, Max: 1e9, Doc: "fundamental period (samples)"},
			{Name: "h2", Default: 0.3, Min: -10, Max: 10, Doc: "amplitude of the second harmonic"},
			{Name: "h3", Default: 0.1, Min: -10, Max: 10, Doc: "amplitude of the third harmonic"},
		},
		Invariants: []Invariant{
			{Name: "hv_deg_mean", Value: 4 * (1 - 1.0/40), Unit: "", Source: "Núñez et al., visibility algorithms review (2012) (memory): 4(1 - 1/(2T)), T = 20"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Regular,
		label:        fixed(Regular),
		build: func(p map[string]float64) (Generator, float64, error) {
			return Sine{Period: p["period"], Harmonics: []float64{p["h2"], p["h3"]}}, 1, nil
		},
	})
	register(&System{
		Name:  "two-tone",
		Title: "quasi-periodic two-tone signal (golden-mean frequency ratio)",
		Doc:   "sin(2πt/P) + amp2 sin(2πt·ratio/P) with random phases; an irrational ratio makes the motion quasi-periodic (a torus). Label: regular.",
		Params: []Param{
			{Name: "period", Default: 20, Min: 2, Max: 1e9, Doc: "period of the first tone (samples)"},
			{Name: "ratio", Default: GoldenMean, Min: 1e-6, Max: 1e6, Doc: "frequency ratio f2/f1 (the second period, period/ratio, must exceed 2 samples)"},
			{Name: "amp2", Default: 0.7, Min: 1e-6, Max: 1e6, Doc: "amplitude of the second tone"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Regular,
		label:        fixed(Regular),
		build: func(p map[string]float64) (Generator, float64, error) {
			return TwoTone{Period: p["period"], Ratio: p["ratio"], Amp2: p["amp2"]}, 1, nil
		},
	})
}
