package surrogate

import (
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// benchIAAFT makes 99 IAAFT surrogates of a 10^4-point AR(1) series with
// the default options and the given worker count, and reports the mean
// number of iterations.
func benchIAAFT(b *testing.B, workers int) {
	x, err := generators.AR1{Phi: 0.7}.Generate(10000, rand.New(rand.NewPCG(1, 2)))
	if err != nil {
		b.Fatal(err)
	}
	var iters float64
	for b.Loop() {
		set, err := Generate(x, Options{Method: IAAFT, Count: 99, Seed: 1, Workers: workers})
		if err != nil {
			b.Fatal(err)
		}
		iters = 0
		for _, it := range set.Iterations {
			iters += float64(it)
		}
	}
	b.ReportMetric(iters/99, "iter/surrogate")
}

// BenchmarkIAAFT99x1e4 is the speed target: 99 IAAFT surrogates of a
// 10^4-point series in under 2 s on 2 cores (GOMAXPROCS workers).
func BenchmarkIAAFT99x1e4(b *testing.B) { benchIAAFT(b, 0) }

// BenchmarkIAAFT99x1e4Serial is the same on one worker.
func BenchmarkIAAFT99x1e4Serial(b *testing.B) { benchIAAFT(b, 1) }

// BenchmarkGenerate makes 99 surrogates of a 10^4-point AR(1) series with
// each method (IAAFT at the default options).
func BenchmarkGenerate(b *testing.B) {
	x := series(b, "ar1", 10000, 1)
	for _, m := range Methods() {
		b.Run(string(m), func(b *testing.B) {
			for b.Loop() {
				if _, err := Generate(x, Options{Method: m, Count: 99, Seed: 1}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkIAAFTPrime is BenchmarkIAAFT99x1e4 at the prime length 9973,
// which goes through Bluestein's algorithm.
func BenchmarkIAAFTPrime(b *testing.B) {
	x := series(b, "ar1", 9973, 1)
	for b.Loop() {
		if _, err := Generate(x, Options{Method: IAAFT, Count: 99, Seed: 1}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkMatchEnds searches the end-matched sub-series of 10^6 points.
func BenchmarkMatchEnds(b *testing.B) {
	x := series(b, "ar1", 1000000, 1)
	for b.Loop() {
		if _, err := MatchEnds(x, 0.9); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkTest runs the rank test of time asymmetry with 99 IAAFT
// surrogates of 10^4 points.
func BenchmarkTest(b *testing.B) {
	x := series(b, "henon", 10000, 1)
	for b.Loop() {
		if _, err := Test(x, []Statistic{TimeAsymmetryStat}, TestOptions{Options: Options{Seed: 1}}); err != nil {
			b.Fatal(err)
		}
	}
}
