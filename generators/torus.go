package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Torus is quasi-periodic motion on a k-torus, k = 1 + len(Ratios) = 2..5,
// seen through a smooth observable. The phases advance uniformly,
// φ_i(t) = 2π·f_i·t + φ_i(0), with f_1 = 1/Period and f_i = Ratios[i−2]/Period,
// every φ_i(0) uniform in [0, 2π) from the rng; the observable is
//
//	u(t) = Σ_i a_i cos φ_i(t) / Σ_i |a_i|,  x(t) = u(t) + Mix·u(t)²,
//
// with a_1 = 1 and a_i = Amps[i−2]. The square adds the combination tones
// cos(φ_i ± φ_j) and harmonics cos 2φ_i that every nonlinear smooth
// function of the torus carries, so the spectrum has lines exactly at the
// frequencies f_i, 2f_i and |f_i ± f_j| (Mix = 0: only at f_i). When 1 and
// the ratios are rationally independent the motion never repeats; rational
// ratios give a periodic orbit (a resonant torus). Every line must lie
// below the Nyquist frequency: max f_i < ½, and 2·max f_i < ½ when
// Mix ≠ 0.
type Torus struct {
	Period float64   // period of the first phase, in samples
	Ratios []float64 // f_i/f_1 for i = 2..k, each > 0; 1 ≤ len ≤ 4
	Amps   []float64 // a_i for i = 2..k, same length as Ratios
	Mix    float64   // strength of the quadratic term, finite
}

// torusMaxDim is the largest torus dimension Torus accepts.
const torusMaxDim = 5

func (s Torus) check() error {
	k := len(s.Ratios) + 1
	if k < 2 || k > torusMaxDim || len(s.Amps) != len(s.Ratios) {
		return fmt.Errorf("torus: %w: %d ratios and %d amplitudes, want the same number, 1 to %d", ErrParamRange, len(s.Ratios), len(s.Amps), torusMaxDim-1)
	}
	if !(s.Period > 0) || math.IsInf(s.Period, 0) || math.IsNaN(s.Mix) || math.IsInf(s.Mix, 0) {
		return fmt.Errorf("torus: %w: period = %g, mix = %g, want a finite period > 0 and finite mix", ErrParamRange, s.Period, s.Mix)
	}
	fmax := 1 / s.Period
	for i, r := range s.Ratios {
		if !(r > 0) || math.IsInf(r, 0) || math.IsNaN(s.Amps[i]) || math.IsInf(s.Amps[i], 0) {
			return fmt.Errorf("torus: %w: ratio%d = %g, amp%d = %g, want ratio > 0 and a finite amplitude", ErrParamRange, i+2, r, i+2, s.Amps[i])
		}
		fmax = max(fmax, r/s.Period)
	}
	top := fmax
	if s.Mix != 0 {
		top = 2 * fmax
	}
	if top >= 0.5 {
		return fmt.Errorf("torus: %w: highest line at %g cycles per sample (period %g, ratios %v, mix %g), want below the Nyquist frequency ½", ErrParamRange, top, s.Period, s.Ratios, s.Mix)
	}
	return nil
}

// Generate returns n samples.
func (s Torus) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := s.check(); err != nil {
		return nil, err
	}
	k := len(s.Ratios) + 1
	freq := make([]float64, k)
	amp := make([]float64, k)
	phase := make([]float64, k)
	freq[0], amp[0] = 1/s.Period, 1
	for i := 1; i < k; i++ {
		freq[i], amp[i] = s.Ratios[i-1]/s.Period, s.Amps[i-1]
	}
	var norm float64
	for i := range phase {
		phase[i] = rng.Float64()
		norm += math.Abs(amp[i])
	}
	if !(norm > 0) {
		return nil, fmt.Errorf("torus: %w: every amplitude is zero", ErrParamRange)
	}
	out := make([]float64, n)
	for t := range out {
		var u float64
		for i, f := range freq {
			// Turns f·t + φ_i(0), reduced to [0, 1) before the cosine.
			c := f*float64(t) + phase[i]
			u += amp[i] * math.Cos(2*math.Pi*(c-math.Floor(c)))
		}
		u /= norm
		out[t] = u + s.Mix*u*u
	}
	return out, nil
}

// torusRatioDefaults are the default frequency ratios of the torus entry:
// √2, √3, √5, √7, rationally independent with 1 (square roots of distinct
// square-free integers; analytic), so every default torus is
// non-resonant.
var torusRatioDefaults = [torusMaxDim - 1]float64{math.Sqrt2, math.Sqrt(3), math.Sqrt(5), math.Sqrt(7)}

func init() {
	params := []Param{
		{Name: "k", Default: 3, Min: 2, Max: torusMaxDim, Integer: true, Doc: "torus dimension: number of incommensurate frequencies"},
		{Name: "period", Default: 50, Min: 2, Max: 1e9, Doc: "period of the first frequency (samples)"},
	}
	amps := [torusMaxDim - 1]float64{0.8, 0.6, 0.5, 0.4}
	for i := 2; i <= torusMaxDim; i++ {
		params = append(params, Param{Name: fmt.Sprintf("ratio%d", i), Default: torusRatioDefaults[i-2], Min: 0.01, Max: 100, Doc: fmt.Sprintf("frequency ratio f%d/f1 (used when k ≥ %d)", i, i)})
	}
	for i := 2; i <= torusMaxDim; i++ {
		params = append(params, Param{Name: fmt.Sprintf("amp%d", i), Default: amps[i-2], Min: 0, Max: 10, Doc: fmt.Sprintf("amplitude of tone %d relative to tone 1 (used when k ≥ %d)", i, i)})
	}
	params = append(params, Param{Name: "mix", Default: 0.3, Min: 0, Max: 3, Doc: "quadratic mixing strength (combination tones f_i ± f_j and harmonics 2 f_i)"})
	registerSignal(&System{
		Name:   "torus",
		Title:  "quasi-periodic motion on a k-torus (k = 2..5 frequencies) seen through a smooth observable",
		Doc:    "u = Σ a_i cos(2π f_i t + φ_i)/Σ|a_i|, x = u + mix·u², f_1 = 1/period, f_i = ratio_i/period, random phases. Irrational, rationally independent ratios (the defaults √2, √3, √5, √7) make the motion quasi-periodic; the square adds combination tones at f_i ± f_j and 2 f_i. Every line must lie below Nyquist: period > 2·max(1, ratio_i), and > 4·max(1, ratio_i) when mix > 0. Label: regular.",
		Params: params,
	}, func(p map[string]float64) (Generator, error) {
		s := Torus{Period: p["period"], Mix: p["mix"]}
		for i := 2; i <= int(p["k"]); i++ {
			s.Ratios = append(s.Ratios, p[fmt.Sprintf("ratio%d", i)])
			s.Amps = append(s.Amps, p[fmt.Sprintf("amp%d", i)])
		}
		return s, s.check()
	})
}
