package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Langevin is a noise-driven nonlinear oscillator, the second-order
// Langevin equation
//
//	ẍ + γ·ẋ + V'(x) = σ·ξ(t)
//
// with white noise ξ, integrated by the Euler–Maruyama scheme in its
// semi-implicit (symplectic) form, velocity first (Kloeden & Platen,
// Numerical Solution of Stochastic Differential Equations (1992)), with an
// internal step of at most 0.005 time units, and sampled every Dt.
// Two potentials:
//
//   - DoubleWell: V(x) = x⁴/4 − x²/2: noise-driven hopping between two
//     wells (Kramers' problem, Kramers, Physica 7 (1940) 284) with
//     oscillations inside each well;
//   - not DoubleWell: the hardening well V(x) = x²/2 + x⁴/4 (a noise-driven
//     Duffing oscillator): oscillations of random amplitude whose frequency
//     rises with the amplitude.
//
// The stationary law is the Boltzmann density
// p(x, v) ∝ exp(−(2γ/σ²)(v²/2 + V(x))) of the Fokker–Planck equation (e.g.
// Risken, The Fokker–Planck Equation (1989)). Both are stochastic: without
// the noise every orbit settles on a fixed point, so the motion is made by
// the noise, not by deterministic dynamics. They fill the region of
// smooth, oscillating, non-Gaussian noise next to chaotic flows.
type Langevin struct {
	DoubleWell bool    // double-well (true) or hardening single-well potential
	Gamma      float64 // damping γ > 0
	Sigma      float64 // noise intensity σ > 0
	Dt         float64 // sample interval in time units, > 0
}

const (
	langevinStep      = 0.005
	langevinTransient = 200.0
)

// force returns −V'(x).
func (g Langevin) force(x float64) float64 {
	if g.DoubleWell {
		return x - x*x*x
	}
	return -x - x*x*x
}

// Generate returns n samples of x after a transient of 200 time units,
// started at rest at x = 0.
func (g Langevin) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(g.Gamma > 0 && g.Sigma > 0 && g.Dt > 0) || math.IsInf(g.Gamma+g.Sigma+g.Dt, 0) {
		return nil, fmt.Errorf("langevin: gamma = %g, sigma = %g, dt = %g, want all > 0 and finite", g.Gamma, g.Sigma, g.Dt)
	}
	sub := int(math.Ceil(g.Dt / langevinStep))
	h := g.Dt / float64(sub)
	sq := g.Sigma * math.Sqrt(h)
	x, v := 0.0, 0.0
	step := func() { // semi-implicit (symplectic) Euler: velocity first
		v += h*(g.force(x)-g.Gamma*v) + sq*rng.NormFloat64()
		x += h * v
	}
	for t := 0; t < int(math.Ceil(langevinTransient/h)); t++ {
		step()
	}
	out := make([]float64, n)
	for i := range out {
		for k := 0; k < sub; k++ {
			step()
		}
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return nil, fmt.Errorf("langevin: %w at sample %d", ErrDiverged, i)
		}
		out[i] = x
	}
	return out, nil
}

func init() {
	params := func(gamma, sigma float64) []Param {
		return []Param{
			{Name: "gamma", Default: gamma, Min: 0.05, Max: 5, Doc: "damping γ (per time unit)"},
			{Name: "sigma", Default: sigma, Min: 0.05, Max: 1.5, Doc: "noise intensity σ (the energy σ²/2γ stays ≤ 22.5 over the ranges)"},
			{Name: "dt", Default: 0.5, Min: 0.01, Max: 5, Doc: "sample interval (time units); a small oscillation takes about 4.4 (double well) or 6.3 (hardening well) time units"},
		}
	}
	boltzmann := func(v string) Invariant {
		return Invariant{Name: "stationary_density", Value: math.NaN(), Unit: "",
			Source: "Boltzmann density of the Fokker–Planck equation: p(x) ∝ exp(−(2γ/σ²)V(x)), V(x) = " + v + " (Risken, The Fokker–Planck Equation (1989))"}
	}
	register(&System{
		Name:  "double-well",
		Title: "noise-driven double-well oscillator (Kramers hopping)",
		Doc: "x'' + gamma x' − x + x³ = sigma·white noise, Euler–Maruyama with internal step ≤ 0.005, observed x every dt: oscillations in a well and noise-driven hops between the wells. " +
			"Label: stochastic (without noise every orbit settles in a well).",
		Params:       params(0.3, 0.5),
		Invariants:   []Invariant{boltzmann("x⁴/4 − x²/2")},
		TimeAxis:     AxisTime,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return Langevin{DoubleWell: true, Gamma: p["gamma"], Sigma: p["sigma"], Dt: p["dt"]}, p["dt"], nil
		},
	})
	register(&System{
		Name:  "hardening-well",
		Title: "noise-driven Duffing oscillator (hardening single well)",
		Doc: "x'' + gamma x' + x + x³ = sigma·white noise, Euler–Maruyama with internal step ≤ 0.005, observed x every dt: noise-sustained oscillations of random amplitude whose frequency rises with it. " +
			"Label: stochastic (without noise every orbit spirals into x = 0).",
		Params:       params(0.1, 0.5),
		Invariants:   []Invariant{boltzmann("x²/2 + x⁴/4")},
		TimeAxis:     AxisTime,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return Langevin{DoubleWell: false, Gamma: p["gamma"], Sigma: p["sigma"], Dt: p["dt"]}, p["dt"], nil
		},
	})
}
