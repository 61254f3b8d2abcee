package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Pulse shapes of PulseTrain.
const (
	// PulseGaussian: exp(−d²/2σ²), FWHM = 2√(2 ln 2)·σ.
	PulseGaussian = iota
	// PulseExponential: an instant rise and an exponential decay
	// exp(−d/τ), d ≥ 0, FWHM = τ·ln 2 (a neuron's or a detector's spike).
	PulseExponential
	// PulseAsymmetric: a two-sided Gaussian, rise σ_r and fall σ_f with
	// σ_r/(σ_r + σ_f) uniform in [0.1, 0.4] from the rng,
	// FWHM = √(2 ln 2)·(σ_r + σ_f).
	PulseAsymmetric
	// PulseComposite: the main Gaussian pulse plus 2 to 4 smaller bumps of
	// either sign at random positions, widths and heights from the rng,
	// like the P, Q, S and T waves around the R peak of an
	// electrocardiogram written as a sum of Gaussians in phase (McSharry
	// et al., IEEE Trans. Biomed. Eng. 50 (2003) 289 (memory)).
	PulseComposite
	pulseShapes
)

// PulseTrain is a strictly periodic train of identical pulses: x_t =
// Σ_k g((t/P + φ − k)·P) with period P = Period samples, a random phase φ
// and one pulse shape g per series (Shape; the random details of the
// asymmetric and composite shapes are drawn once from the rng). The width
// of the main pulse at half its height is Duty·P, so small Duty gives
// spiky, neuron- or ECG-like signals. Images of the pulse one and two
// periods away are summed, so the train is periodic and smooth across
// period boundaries (the exponential tail is summed over all periods in
// closed form).
type PulseTrain struct {
	Period float64 // period in samples, ≥ 2
	Duty   float64 // full width at half maximum of the main pulse / period, in (0, ½]; Duty·Period ≥ 1 sample
	Shape  int     // PulseGaussian, PulseExponential, PulseAsymmetric or PulseComposite
}

// bump is one Gaussian component of a pulse: centre c and widths in
// periods, height h.
type bump struct{ c, rise, fall, h float64 }

// pulseImages is the number of neighbouring periods summed on each side;
// pulseCutoff is the squared distance, in widths σ, beyond which a
// Gaussian bump is left out (e^{−50} of its height).
const (
	pulseImages = 2
	pulseCutoff = 100
)

func (s PulseTrain) check() error {
	if !(s.Period >= 2) || math.IsInf(s.Period, 0) || !(s.Duty > 0 && s.Duty <= 0.5) {
		return fmt.Errorf("pulse-train: %w: period = %g, duty = %g, want period ≥ 2 and 0 < duty ≤ ½", ErrParamRange, s.Period, s.Duty)
	}
	if s.Duty*s.Period < 1 {
		return fmt.Errorf("pulse-train: %w: pulse width duty·period = %g samples, want ≥ 1 so that pulses are resolved", ErrParamRange, s.Duty*s.Period)
	}
	if s.Shape < 0 || s.Shape >= pulseShapes {
		return fmt.Errorf("pulse-train: %w: shape = %d, want 0 to %d", ErrParamRange, s.Shape, pulseShapes-1)
	}
	return nil
}

// fwhmToSigma converts a full width at half maximum into the standard
// deviation of a Gaussian.
var fwhmToSigma = 1 / (2 * math.Sqrt(2*math.Ln2))

// bumps draws the Gaussian components of one series' pulse (not used by
// the exponential shape).
func (s PulseTrain) bumps(rng *rand.Rand) []bump {
	sigma := s.Duty * fwhmToSigma
	switch s.Shape {
	case PulseAsymmetric:
		q := 0.1 + 0.3*rng.Float64()
		total := 2 * sigma
		return []bump{{c: 0, rise: q * total, fall: (1 - q) * total, h: 1}}
	case PulseComposite:
		out := []bump{{c: 0, rise: sigma, fall: sigma, h: 1}}
		extra := 2 + rng.IntN(3)
		for i := 0; i < extra; i++ {
			w := math.Min(s.Duty*(0.5+2.5*rng.Float64()), 0.5) * fwhmToSigma
			c := 0.1 + 0.8*rng.Float64()
			h := 0.1 + 0.4*rng.Float64()
			if rng.Float64() < 0.5 {
				h = -h
			}
			out = append(out, bump{c: c, rise: w, fall: w, h: h})
		}
		return out
	default:
		return []bump{{c: 0, rise: sigma, fall: sigma, h: 1}}
	}
}

// Generate returns n samples.
func (s PulseTrain) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := s.check(); err != nil {
		return nil, err
	}
	phi := rng.Float64()
	var bs []bump
	if s.Shape != PulseExponential {
		bs = s.bumps(rng)
	}
	tau := s.Duty / math.Ln2
	tailSum := 1 / (1 - math.Exp(-1/tau)) // Σ_{k≥0} e^{−k/τ}
	out := make([]float64, n)
	for t := range out {
		u := turns(t, s.Period, phi) // position in the period, [0, 1)
		if s.Shape == PulseExponential {
			out[t] = math.Exp(-u/tau) * tailSum
			continue
		}
		var x float64
		for _, b := range bs {
			for k := -pulseImages; k <= pulseImages; k++ {
				d := u - b.c - float64(k)
				w := b.fall
				if d < 0 {
					w = b.rise
				}
				if d*d > pulseCutoff*w*w {
					continue // below e^{−pulseCutoff/2} of the bump's height
				}
				x += b.h * math.Exp(-d*d/(2*w*w))
			}
		}
		out[t] = x
	}
	return out, nil
}

func init() {
	registerSignal(&System{
		Name:  "pulse-train",
		Title: "periodic pulse train (Gaussian, exponential, asymmetric or ECG-like composite pulses)",
		Doc:   "Identical pulses every period samples at a random phase; duty is the main pulse's full width at half maximum over the period (duty·period ≥ 1 sample). Shape 0 Gaussian, 1 instant rise and exponential decay, 2 two-sided Gaussian with a random rise/fall ratio, 3 main pulse plus 2-4 random smaller bumps of either sign (ECG-like). Label: regular.",
		Params: []Param{
			{Name: "period", Default: 40, Min: 2, Max: 1e9, Doc: "period (samples)"},
			{Name: "duty", Default: 0.1, Min: 0.01, Max: 0.5, Doc: "full width at half maximum of the main pulse over the period"},
			{Name: "shape", Default: PulseAsymmetric, Min: 0, Max: pulseShapes - 1, Integer: true, Doc: "pulse shape: 0 Gaussian, 1 exponential decay, 2 asymmetric, 3 composite (ECG-like)"},
		},
	}, func(p map[string]float64) (Generator, error) {
		s := PulseTrain{Period: p["period"], Duty: p["duty"], Shape: int(p["shape"])}
		return s, s.check()
	})
}
