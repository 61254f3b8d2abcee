package scaling

import (
	"math"
	"math/rand/v2"
	"sync"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// white returns n i.i.d. N(0,1) draws.
func white(n int, rng *rand.Rand) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = rng.NormFloat64()
	}
	return out
}

// cumsum returns the running sum of x (a random walk for white x).
func cumsum(x []float64) []float64 {
	out := make([]float64, len(x))
	var s float64
	for i, v := range x {
		s += v
		out[i] = s
	}
	return out
}

func newRNG(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, 0x5ca1e)) }

var (
	fgnMu    sync.Mutex
	fgnCache = map[[3]uint64][]float64{}
)

// fgnSeed returns (and memoises across tests) n samples of unit fGn with
// Hurst exponent h drawn from newRNG(seed) by generators.FGN (exact
// circulant embedding, Davies & Harte, Biometrika 74 (1987) 95). Callers
// must not modify it.
func fgnSeed(t testing.TB, n int, h float64, seed uint64) []float64 {
	key := [3]uint64{uint64(n), math.Float64bits(h), seed}
	fgnMu.Lock()
	defer fgnMu.Unlock()
	if x, ok := fgnCache[key]; ok {
		return x
	}
	x, err := generators.FGN{H: h}.Generate(n, newRNG(seed))
	if err != nil {
		t.Fatal(err)
	}
	fgnCache[key] = x
	return x
}
