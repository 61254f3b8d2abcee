package generators

import (
	"fmt"
	"math/rand/v2"
)

// Noisy wraps a generator and adds independent Gaussian observational noise
// at SNRdB decibels to its output (AddNoise): the measured version of a
// clean system.
type Noisy struct {
	Gen   Generator
	SNRdB float64 // signal-to-noise ratio in dB; +Inf adds nothing
}

// Generate draws n clean samples from Gen, then the noise, both from rng.
func (g Noisy) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if g.Gen == nil {
		return nil, fmt.Errorf("noisy: no generator")
	}
	x, err := g.Gen.Generate(n, rng)
	if err != nil {
		return nil, err
	}
	return AddNoise(x, g.SNRdB, rng)
}

// noisySineMinSNR is the lowest SNR the noisy-sine entry accepts. Below
// about 10 dB the noise carries a quarter or more of the variance and the
// series is a mixture that neither "regular" nor "stochastic" describes, so
// the entry does not offer it (GenerateNoisy can still make such series,
// unlabelled by this rule).
const noisySineMinSNR = 10

func init() {
	register(&System{
		Name:  "noisy-sine",
		Title: "sine with harmonics plus white observational noise",
		Doc:   "The sine entry (h2 = 0.3, h3 = 0.1, random phases) plus Gaussian noise at snr dB. Label: regular; the SNR is limited to ≥ 10 dB (noise variance ≤ 10% of the signal's) so the label stays true — DESIGN.md counts periodic motion with small noise as regular.",
		Params: []Param{
			{Name: "period", Default: 20, Min: 7, Max: 1e9, Doc: "fundamental period (samples); ≥ 7 keeps the third harmonic below Nyquist"},
			{Name: "snr", Default: 20, Min: noisySineMinSNR, Max: 200, Doc: "signal-to-noise ratio (dB)"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Regular,
		label:        fixed(Regular),
		build: func(p map[string]float64) (Generator, float64, error) {
			return Noisy{Gen: Sine{Period: p["period"], Harmonics: []float64{0.3, 0.1}}, SNRdB: p["snr"]}, 1, nil
		},
	})
}
