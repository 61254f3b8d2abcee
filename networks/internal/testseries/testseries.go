// Package testseries holds the series the tests and benchmarks of the
// network packages build their graphs from (fixed seeds or an explicit
// generator), shared by networks, networks/visibility and the other
// constructions' tests. It is imported by tests only.
package testseries

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
)

// Varied returns a varied corpus: random reals, integers with many ties,
// monotone (linear, convex, concave), periodic, plateaus, collinear runs and
// Brownian walks (integer ±1 steps give ties and collinear triples galore).
func Varied(rng *rand.Rand, count int) (names []string, series [][]float64) {
	for k := 0; k < count; k++ {
		n := 1 + rng.IntN(80)
		if k%10 == 0 {
			n = 100 + rng.IntN(200)
		}
		x := make([]float64, n)
		kind := k % 12
		switch kind {
		case 0: // Gaussian
			for i := range x {
				x[i] = rng.NormFloat64()
			}
		case 1: // integers 0..3: many ties
			for i := range x {
				x[i] = float64(rng.IntN(4))
			}
		case 2: // integers 0..20
			for i := range x {
				x[i] = float64(rng.IntN(21))
			}
		case 3: // monotone linear up or down (all collinear)
			s := float64(1 - 2*rng.IntN(2))
			for i := range x {
				x[i] = s * float64(i)
			}
		case 4: // convex / concave monotone
			p := []float64{2, 0.5, 3, 1.5}[rng.IntN(4)]
			for i := range x {
				x[i] = math.Pow(float64(i), p)
			}
			if rng.IntN(2) == 0 {
				slices.Reverse(x)
			}
		case 5: // periodic integer pattern
			T := 1 + rng.IntN(6)
			pat := make([]float64, T)
			for i := range pat {
				pat[i] = float64(rng.IntN(5))
			}
			for i := range x {
				x[i] = pat[i%T]
			}
		case 6: // plateaus
			v := 0.0
			for i := range x {
				if rng.IntN(5) == 0 {
					v = float64(rng.IntN(6))
				}
				x[i] = v
			}
		case 7: // collinear runs with occasional kinks
			slope, v := 1.0, 0.0
			for i := range x {
				if rng.IntN(8) == 0 {
					slope = float64(rng.IntN(5) - 2)
				}
				v += slope
				x[i] = v
			}
		case 8: // integer Brownian walk
			v := 0.0
			for i := range x {
				v += float64(1 - 2*rng.IntN(2))
				x[i] = v
			}
		case 9: // Gaussian Brownian walk
			v := 0.0
			for i := range x {
				v += rng.NormFloat64()
				x[i] = v
			}
		case 10: // dyadic rationals with exact collinear triples, large offset
			for i := range x {
				x[i] = 1e6 + float64(rng.IntN(9))*0.125
			}
		case 11: // constant, or uniform in a tiny range (near ties)
			if rng.IntN(3) == 0 {
				for i := range x {
					x[i] = 2.5
				}
			} else {
				for i := range x {
					x[i] = 1 + rng.Float64()*1e-12
				}
			}
		}
		names = append(names, fmt.Sprintf("case%d-kind%d-n%d", k, kind, n))
		series = append(series, x)
	}
	return names, series
}

// IID draws n i.i.d. samples from a named continuous law.
func IID(law string, n int, rng *rand.Rand) []float64 {
	x := make([]float64, n)
	for i := range x {
		switch law {
		case "uniform":
			x[i] = rng.Float64()
		case "gauss":
			x[i] = rng.NormFloat64()
		case "student3": // Student t, ν = 3: Z/√(χ²₃/3), heavy tails
			z := rng.NormFloat64()
			c := 0.0
			for j := 0; j < 3; j++ {
				v := rng.NormFloat64()
				c += v * v
			}
			x[i] = z / math.Sqrt(c/3)
		case "pareto": // Pareto, α = 1.5: infinite variance
			x[i] = math.Pow(1-rng.Float64(), -1/1.5)
		}
	}
	return x
}

// Cumsum returns the running sum (fGn → fBm).
func Cumsum(x []float64) []float64 {
	y := make([]float64, len(x))
	s := 0.0
	for i, v := range x {
		s += v
		y[i] = s
	}
	return y
}

// Bench returns Gaussian white noise ("gauss"), its cumulative sum
// (Brownian motion, "brown") or a linear trend 0.3·i plus unit noise
// ("trend", the deep-Cartesian-tree case) of length n from a fixed seed.
func Bench(kind string, n int) []float64 {
	rng := rand.New(rand.NewPCG(uint64(n), 99))
	x := make([]float64, n)
	v := 0.0
	for i := range x {
		e := rng.NormFloat64()
		switch kind {
		case "brown":
			v += e
			x[i] = v
		case "trend":
			x[i] = 0.3*float64(i) + e
		default:
			x[i] = e
		}
	}
	return x
}
