package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Cascade is multifractal noise built on the binomial multiplicative
// cascade (the p-model of Meneveau & Sreenivasan, Phys. Rev. Lett. 59
// (1987) 1424): a unit measure on 2^J cells, J = ⌈log2 n⌉, is made by
// splitting every interval J times into halves that receive the fractions
// P and 1 − P, in an order chosen by a fair coin at each split. With
// W_i = 2^J μ_i the cell weights (mean 1), the series is
//
//	x_i = √W_i · ε_i,   ε ~ N(0, 1),   i = 0..n−1,
//
// Gaussian noise whose variance is the cascade: uncorrelated, with bursts
// nested on every scale. Its moments follow from the cascade's partition
// function Σ_i μ_i^q = (P^q + (1 − P)^q)^J (exact for the p-model;
// Meneveau & Sreenivasan 1987): the sum of x over a block of 2^j cells has
// kurtosis
//
//	K(j) = 3 · (2(P² + (1 − P)²))^{J−j}   (derived),
//
// falling with the scale j towards the Gaussian 3 at the whole record: the
// scale-dependent kurtosis of intermittent increments. P = ½ is white
// noise. Only the first n cells are returned when n is not a power of two.
// Time and memory O(2^J) ≤ O(2n).
type Cascade struct {
	P float64 // cascade weight, 0.5 ≤ P < 1
}

// Weights returns the 2^J cell weights W_i (mean 1) of one cascade with J
// levels.
func (c Cascade) Weights(levels int, rng *rand.Rand) ([]float64, error) {
	if !(c.P >= 0.5 && c.P < 1) {
		return nil, fmt.Errorf("cascade: p = %g, want 0.5 ≤ p < 1", c.P)
	}
	if levels < 0 || levels > 40 {
		return nil, fmt.Errorf("cascade: %d levels, want 0..40", levels)
	}
	w := make([]float64, 1<<levels)
	w[0] = 1
	hi, lo := 2*c.P, 2*(1-c.P)
	for l, size := 0, 1; l < levels; l, size = l+1, 2*size {
		// Split the first size cells into 2·size, from the back so that
		// nothing is overwritten before it is read.
		var bits uint64
		for i := size - 1; i >= 0; i-- {
			if (size-1-i)%64 == 0 {
				bits = rng.Uint64() // 64 fair coins
			}
			a, b := hi, lo
			if bits&1 == 1 {
				a, b = lo, hi
			}
			bits >>= 1
			v := w[i]
			w[2*i], w[2*i+1] = v*a, v*b
		}
	}
	return w, nil
}

// Generate returns n samples.
func (c Cascade) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	levels := 0
	for 1<<levels < n {
		levels++
	}
	w, err := c.Weights(levels, rng)
	if err != nil {
		return nil, err
	}
	out := w[:n]
	for i, v := range out {
		out[i] = math.Sqrt(v) * rng.NormFloat64()
	}
	return out, nil
}

func init() {
	registerNoise(&System{
		Name:  "cascade",
		Title: "multifractal noise from a binomial multiplicative cascade (p-model)",
		Doc:   "Gaussian noise whose variance is a random-order binomial cascade (weights p, 1 - p at each of log2 n splits): uncorrelated, intermittent on every scale, kurtosis falling with scale. Label: stochastic.",
		Params: []Param{
			{Name: "p", Default: 0.7, Min: 0.5, Max: 0.9, Doc: "cascade weight p (0.5 white noise)"},
		},
		Invariants: []Invariant{
			{Name: "tau_q2", Value: -math.Log2(0.49 + 0.09), Unit: "", Source: "Meneveau & Sreenivasan, Phys. Rev. Lett. 59 (1987) 1424: τ(q) = -log2(p^q + (1-p)^q)"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return Cascade{P: p["p"]}, nil
	})
}
