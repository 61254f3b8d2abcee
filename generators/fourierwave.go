package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// FourierWave is a periodic waveform of random shape built from its
// Fourier series: x_t = Σ_{h=1..H} a_h·cos(2πh·t/P + φ_h) with period
// P = Period samples, a_h = h^(−p)·c_h (p = Decay, c_h uniform in
// [0.5, 1.5)) and phases φ_h uniform in [0, 2π), all drawn from the rng.
// The decay sets the smoothness (p ≤ 1: jagged, sawtooth-like p = 1;
// p ≥ 2: rounded, triangle-like p = 2) and the random amplitudes and
// phases give a different shape per series at one period. Harmonics at or
// above the Nyquist frequency (h/P ≥ ½) are left out, as an anti-aliasing
// filter would remove them. The phase is taken from t mod P, so with a
// whole period the samples repeat exactly.
type FourierWave struct {
	Period    float64 // period in samples, > 2
	Harmonics int     // H, number of harmonics, ≥ 1
	Decay     float64 // p, amplitude fall-off exponent
}

// Generate returns n samples.
func (s FourierWave) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(s.Period > 2) || math.IsInf(s.Period, 0) || s.Harmonics < 1 || math.IsNaN(s.Decay) || math.IsInf(s.Decay, 0) {
		return nil, fmt.Errorf("fourier-wave: %w: period = %g, harmonics = %d, decay = %g, want period > 2, harmonics ≥ 1, finite decay", ErrParamRange, s.Period, s.Harmonics, s.Decay)
	}
	// Draw every harmonic's amplitude and phase, so that the draws do not
	// depend on how many lie below Nyquist; keep those that do.
	h := s.Harmonics
	amp, cphi, sphi := make([]float64, h), make([]float64, h), make([]float64, h)
	kept := 0
	for i := 0; i < h; i++ {
		a := math.Pow(float64(i+1), -s.Decay) * (0.5 + rng.Float64())
		sp, cp := math.Sincos(2 * math.Pi * rng.Float64())
		if float64(i+1)/s.Period < 0.5 {
			amp[kept], cphi[kept], sphi[kept] = a, cp, sp
			kept++
		}
	}
	amp, cphi, sphi = amp[:kept], cphi[:kept], sphi[:kept]
	out := make([]float64, n)
	for t := range out {
		// e^{ihθ} by repeated multiplication with e^{iθ}: one Sincos
		// per sample; the rounding error grows like h·ε, far below the
		// smallest amplitude.
		s1, c1 := math.Sincos(2 * math.Pi * turns(t, s.Period, 0))
		re, im := c1, s1
		var x float64
		for k, a := range amp {
			if k > 0 {
				re, im = re*c1-im*s1, re*s1+im*c1
			}
			x += a * (re*cphi[k] - im*sphi[k]) // a·cos(hθ + φ_h)
		}
		out[t] = x
	}
	return out, nil
}

func init() {
	registerSignal(&System{
		Name:  "fourier-wave",
		Title: "periodic wave of random shape: H harmonics with amplitudes ~ h^(-p) and random phases",
		Doc:   "x = Σ_{h≤H} h^(-decay)·c_h cos(2π h t/period + φ_h), c_h uniform in [0.5, 1.5), φ_h uniform; harmonics at or above Nyquist are left out. Many shapes at one period: decay 1 is sawtooth-like, 2 triangle-like, 3 nearly sinusoidal. Label: regular.",
		Params: []Param{
			{Name: "period", Default: 50, Min: 2.5, Max: 1e9, Doc: "period (samples)"},
			{Name: "harmonics", Default: 10, Min: 1, Max: 30, Integer: true, Doc: "number of harmonics H"},
			{Name: "decay", Default: 1.5, Min: 0.5, Max: 3, Doc: "amplitude fall-off exponent p: a_h ~ h^(-p)"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return FourierWave{Period: p["period"], Harmonics: int(p["harmonics"]), Decay: p["decay"]}, nil
	})
}
