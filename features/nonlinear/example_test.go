package nonlinear_test

import (
	"fmt"
	"math/rand/v2"

	"github.com/tracesift/tracesift/features/nonlinear"
	"github.com/tracesift/tracesift/generators"
)

// Estimate the largest Lyapunov exponent of the Hénon map from its x
// component alone, reusing one embedding for two measures.
func ExampleLyapunov() {
	x, _ := generators.Henon{A: 1.4, B: 0.3}.Generate(5000, rand.New(rand.NewPCG(1, 2)))
	emb, err := nonlinear.Embed(x, nonlinear.EmbedOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	ly, _ := nonlinear.Lyapunov(x, nonlinear.LyapunovOptions{Embed: emb.Fixed()})
	d2, _ := nonlinear.CorrelationDimension(x, nonlinear.CorrDimOptions{Embed: emb.Fixed()})
	fmt.Printf("d = %d, τ = %d\n", emb.Dim, emb.Delay)
	fmt.Printf("λ1 ≈ %.1f per iteration (credible: %v)\n", ly.Lambda, ly.Credible)
	fmt.Printf("D2 ≈ %.1f\n", d2.D2)
	// Output:
	// d = 2, τ = 1
	// λ1 ≈ 0.4 per iteration (credible: true)
	// D2 ≈ 1.2
}

// White noise has no credible Lyapunov exponent: the result says why
// instead of returning a slope.
func ExampleLyapunov_noise() {
	x, _ := generators.White{Sigma: 1}.Generate(5000, rand.New(rand.NewPCG(1, 2)))
	ly, _ := nonlinear.Lyapunov(x, nonlinear.LyapunovOptions{})
	fmt.Println(ly.Credible, ly.Lambda)
	// Output:
	// false NaN
}

// Sample entropy of Gaussian white noise is close to the derived value
// −ln(2Φ(0.2/√2) − 1) ≈ 2.185 for m = 2, r = 0.2.
func ExampleSampleEntropy() {
	x, _ := generators.White{Sigma: 1}.Generate(20000, rand.New(rand.NewPCG(3, 4)))
	s, _ := nonlinear.SampleEntropy(x, nonlinear.SampEnOptions{})
	fmt.Printf("SampEn(2, 0.2) = %.2f\n", s.Value)
	// Output:
	// SampEn(2, 0.2) = 2.18
}

// The 0–1 test separates chaotic from periodic logistic-map orbits.
func ExampleZeroOne() {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, r := range []float64{4, 3.5} {
		x, _ := generators.Logistic{R: r}.Generate(5000, rng)
		k, _ := nonlinear.ZeroOne(x, nonlinear.ZeroOneOptions{Seed: 1})
		fmt.Printf("r = %.1f: K ≈ %.1f\n", r, k.K)
	}
	// Output:
	// r = 4.0: K ≈ 1.0
	// r = 3.5: K ≈ -0.0
}
