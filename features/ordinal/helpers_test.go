package ordinal

import (
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

func newRNG(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, 0x0a1)) }

func white(n int, rng *rand.Rand) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = rng.NormFloat64()
	}
	return out
}

func logistic(t testing.TB, n int, seed uint64) []float64 {
	t.Helper()
	x, err := generators.Logistic{R: 4}.Generate(n, newRNG(seed))
	if err != nil {
		t.Fatal(err)
	}
	return x
}

func henon(t testing.TB, n int, seed uint64) []float64 {
	t.Helper()
	x, err := generators.Henon{A: 1.4, B: 0.3}.Generate(n, newRNG(seed))
	if err != nil {
		t.Fatal(err)
	}
	return x
}
