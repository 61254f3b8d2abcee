package surrogate

import (
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// benchDeterminism runs the determinism test with its defaults (39 IAAFT
// surrogates, the middle 4096 samples, GOMAXPROCS workers) on n samples of
// the Hénon map (chaos, low embedding dimension) or an AR(1) process with
// φ = 0.9 (noise: Cao's method picks a high dimension, the costliest
// forecasts), or on the whole trace when whole is set.
func benchDeterminism(b *testing.B, system string, n int, whole bool) {
	rng := rand.New(rand.NewPCG(1, 2))
	var x []float64
	var err error
	if system == "henon" {
		x, err = generators.Henon{A: 1.4, B: 0.3}.Generate(n, rng)
	} else {
		x, err = generators.AR1{Phi: 0.9}.Generate(n, rng)
	}
	if err != nil {
		b.Fatal(err)
	}
	opts := DeterminismOptions{Seed: 1}
	if whole {
		opts.MaxLength = -1
	}
	for b.Loop() {
		if _, err := Determinism(x, opts); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkDeterminism* are the cost per trace of 'classify
// --significance' (M = 39) at n = 4096 and 10^4 (of which the middle 4096
// samples are tested); run with -cpu 1 for the CPU time per trace.
func BenchmarkDeterminismHenon4096(b *testing.B) { benchDeterminism(b, "henon", 4096, false) }
func BenchmarkDeterminismHenon1e4(b *testing.B)  { benchDeterminism(b, "henon", 10000, false) }
func BenchmarkDeterminismAR4096(b *testing.B)    { benchDeterminism(b, "ar1", 4096, false) }
func BenchmarkDeterminismAR1e4(b *testing.B)     { benchDeterminism(b, "ar1", 10000, false) }

// BenchmarkDeterminismAR1e4Whole tests all 10^4 samples (MaxLength −1).
func BenchmarkDeterminismAR1e4Whole(b *testing.B) { benchDeterminism(b, "ar1", 10000, true) }
