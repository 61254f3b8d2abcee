package demo

import (
	"fmt"
	"math"
	"math/rand/v2"

	"github.com/tracesift/tracesift/generators"
)

// Components are the parts of one synthesized trace, all in amperes. The
// drain current is Id[k] = Mean + Deterministic[k] + Noise[k].
type Components struct {
	// Mean is the expected drain current.
	Mean float64
	// Deterministic is the oscillation, zero mean over the record; nil for
	// stochastic traces.
	Deterministic []float64
	// Noise is everything stochastic: 1/f, the trap's telegraph signal
	// (centred on its stationary occupancy) and the white read-out noise.
	Noise []float64
}

// Current returns Id[k] = Mean + Deterministic[k] + Noise[k].
func (c Components) Current() []float64 {
	out := make([]float64, len(c.Noise))
	for k, v := range c.Noise {
		out[k] = c.Mean + v
		if c.Deterministic != nil {
			out[k] += c.Deterministic[k]
		}
	}
	return out
}

// Synthesize builds the trace of s from rng = rand.New(rand.NewPCG(s.Seed,
// CampaignSeed)), drawing in this order: the oscillation (if any), the 1/f
// component, the trap (if any), the read-out noise. Every component is
// Samples long.
//
//   - Oscillation: the system's observed coordinate x, standardised
//     (zero mean, unit population variance over the record), times
//     Depth·Mean.
//   - 1/f: the Flicker generator's output, standardised, times RMS·Mean.
//   - Trap: −Depth·Mean·(T[k] − p), where T is a telegraph signal that is 1
//     while the trap is occupied (mean dwell TauEmission) and 0 while it is
//     empty (mean dwell TauCapture), sampled every Interval, and p =
//     τe/(τc + τe) its stationary occupancy.
//   - Read-out: independent N(0, Readout²) samples.
//
// Without an oscillation Noise is the sum of the last three. With one, that
// sum is multiplied by the factor that makes its population variance over
// the record exactly var(Deterministic)/10^(SNRdB/10), so the stated SNR
// holds for the record itself, not only in expectation.
func Synthesize(s Spec) (Components, error) {
	rng := rand.New(rand.NewPCG(s.Seed, CampaignSeed))
	name := s.Path()
	c := Components{Mean: s.Mean}
	if !(s.Mean > 0) {
		return c, fmt.Errorf("%s: mean current %g A, want > 0", name, s.Mean)
	}
	if o := s.Oscillation; o != nil {
		x, err := draw(o.System, o.Overrides, rng)
		if err != nil {
			return c, fmt.Errorf("%s: oscillation: %w", name, err)
		}
		if err := standardise(x); err != nil {
			return c, fmt.Errorf("%s: oscillation %s: %w", name, o.System, err)
		}
		scaleInPlace(x, o.Depth*s.Mean)
		c.Deterministic = x
	}

	noise, err := draw(s.Flicker.System, s.Flicker.Overrides, rng)
	if err != nil {
		return c, fmt.Errorf("%s: 1/f: %w", name, err)
	}
	if err := standardise(noise); err != nil {
		return c, fmt.Errorf("%s: 1/f %s: %w", name, s.Flicker.System, err)
	}
	scaleInPlace(noise, s.Flicker.RMS*s.Mean)

	if t := s.Trap; t != nil {
		tel := generators.Telegraph{TauUp: t.TauEmission, TauDown: t.TauCapture, Dt: Interval}
		occ, err := tel.Generate(Samples, rng)
		if err != nil {
			return c, fmt.Errorf("%s: trap: %w", name, err)
		}
		p := t.TauEmission / (t.TauCapture + t.TauEmission)
		a := t.Depth * s.Mean
		for k, v := range occ {
			noise[k] -= a * (v - p)
		}
	}

	for k := range noise {
		noise[k] += s.Readout * rng.NormFloat64()
	}

	if c.Deterministic != nil {
		target := variance(c.Deterministic) * math.Pow(10, -s.Oscillation.SNRdB/10)
		v := variance(noise)
		if !(v > 0) {
			return c, fmt.Errorf("%s: noise has zero variance", name)
		}
		scaleInPlace(noise, math.Sqrt(target/v))
	}
	c.Noise = noise
	return c, nil
}

// draw returns Samples values of a registered system.
func draw(system string, overrides map[string]float64, rng *rand.Rand) ([]float64, error) {
	sys, err := generators.Lookup(system)
	if err != nil {
		return nil, err
	}
	return sys.Generate(Samples, overrides, rng)
}

// standardise shifts and scales x in place to zero mean and unit
// population variance.
func standardise(x []float64) error {
	m := mean(x)
	sd := math.Sqrt(variance(x))
	if !(sd > 0) || math.IsInf(sd, 0) {
		return fmt.Errorf("standard deviation %g, want finite and > 0", sd)
	}
	for k := range x {
		x[k] = (x[k] - m) / sd
	}
	return nil
}

func scaleInPlace(x []float64, a float64) {
	for k := range x {
		x[k] *= a
	}
}

func mean(x []float64) float64 {
	var s float64
	for _, v := range x {
		s += v
	}
	return s / float64(len(x))
}

// variance is the population variance (1/n) of x, two-pass.
func variance(x []float64) float64 {
	m := mean(x)
	var s float64
	for _, v := range x {
		d := v - m
		s += d * d
	}
	return s / float64(len(x))
}
