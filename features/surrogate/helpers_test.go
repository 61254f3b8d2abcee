package surrogate

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// series returns n points of a reference system from the generators
// package, seeded by seed.
func series(t testing.TB, sys string, n int, seed uint64) []float64 {
	t.Helper()
	rng := rand.New(rand.NewPCG(seed, 0x5eed))
	var x []float64
	var err error
	switch sys {
	case "ar1":
		x, err = generators.AR1{Phi: 0.7}.Generate(n, rng)
	case "henon":
		x, err = generators.Henon{A: 1.4, B: 0.3}.Generate(n, rng)
	case "logistic":
		x, err = generators.Logistic{R: 4}.Generate(n, rng)
	case "white":
		x, err = generators.White{Sigma: 1}.Generate(n, rng)
	case "walk":
		x, err = generators.White{Sigma: 1}.Generate(n, rng)
		for i := 1; i < len(x); i++ {
			x[i] += x[i-1]
		}
	case "cauchy": // heavy tails: ratio of two normals
		x = make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64() / rng.NormFloat64()
		}
	default:
		t.Fatalf("unknown test system %q", sys)
	}
	if err != nil {
		t.Fatal(err)
	}
	return x
}

// periodogram returns |X_k|², k = 0..n/2.
func periodogram(x []float64) []float64 {
	c := make([]complex128, len(x)/2+1)
	newRealFFT(len(x), nil).forward(c, x)
	p := make([]float64, len(c))
	for k, v := range c {
		p[k] = real(v)*real(v) + imag(v)*imag(v)
	}
	return p
}

// relPeriodogramError is sqrt(Σ_{k≥1}(P_s − P_x)²)/sqrt(Σ_{k≥1} P_x²).
func relPeriodogramError(s, x []float64) float64 {
	ps, px := periodogram(s), periodogram(x)
	var num, den float64
	for k := 1; k < len(px); k++ {
		d := ps[k] - px[k]
		num += d * d
		den += px[k] * px[k]
	}
	return math.Sqrt(num / den)
}

func sortedCopy(x []float64) []float64 {
	s := slices.Clone(x)
	slices.Sort(s)
	return s
}

// ksNormal is the Kolmogorov–Smirnov distance of the sample x from N(0,1).
func ksNormal(x []float64) float64 {
	s := sortedCopy(x)
	n := float64(len(s))
	var d float64
	for i, v := range s {
		f := 0.5 * math.Erfc(-v/math.Sqrt2)
		d = math.Max(d, math.Max(f-float64(i)/n, float64(i+1)/n-f))
	}
	return d
}
