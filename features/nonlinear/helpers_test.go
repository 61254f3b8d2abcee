package nonlinear

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// lorenzDt is the sample interval used for the Lorenz checks: 0.01 time
// units, the generator's default. Rosenstein's method recovers λ1 within a
// few per cent at 0.01, 0.02 and 0.05 alike (all tried); 0.01 keeps the
// divergence curve smooth (a few hundred steps long) and makes the
// per-sample target 0.9056 × 0.01.
const lorenzDt = 0.01

// series draws n samples of g with a PCG seeded by seed.
func series(t testing.TB, g generators.Generator, n int, seed uint64) []float64 {
	t.Helper()
	x, err := g.Generate(n, rand.New(rand.NewPCG(seed, 0x5eed)))
	if err != nil {
		t.Fatal(err)
	}
	return x
}

var (
	logistic4  = generators.Logistic{R: 4}
	logistic35 = generators.Logistic{R: 3.5}
	henon      = generators.Henon{A: 1.4, B: 0.3}
	lorenz     = generators.Lorenz{Sigma: 10, Rho: 28, Beta: 8.0 / 3.0, Dt: lorenzDt}
	white      = generators.White{Sigma: 1}
	ar1        = generators.AR1{Phi: 0.9}
)

// affine returns a·x + b.
func affine(x []float64, a, b float64) []float64 {
	y := make([]float64, len(x))
	for i, v := range x {
		y[i] = a*v + b
	}
	return y
}

// near reports whether got is within rel (relative) of want, or both NaN.
func near(got, want, rel float64) bool {
	if math.IsNaN(got) && math.IsNaN(want) {
		return true
	}
	return math.Abs(got-want) <= rel*math.Max(math.Abs(want), 1e-300)
}
