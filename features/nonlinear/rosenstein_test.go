package nonlinear

import (
	"math"
	"testing"

	"tracesift/generators"
)

// Largest Lyapunov exponent from the series alone (Rosenstein, Collins &
// De Luca, Physica D 65 (1993) 117), per sample step.
func TestLyapunovReferenceSystems(t *testing.T) {
	cases := []struct {
		name string
		g    generators.Generator
		n    int
		want float64 // per sample
		tol  float64 // relative
		src  string
	}{
		{"logistic r=4", logistic4, 5000, math.Ln2, 0.10, "analytic: ln 2 (conjugacy to the tent map)"},
		{"henon", henon, 5000, 0.41922, 0.10, "Sprott, Chaos and Time-Series Analysis (2003), appendix (memory)"},
		{"lorenz dt=0.01", lorenz, 20000, 0.9056 * lorenzDt, 0.15, "Sprott (2003) (memory): 0.9056 per time unit × dt"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			res, err := Lyapunov(series(t, c.g, c.n, 1), LyapunovOptions{})
			if err != nil {
				t.Fatal(err)
			}
			e := res.Embedding
			t.Logf("λ = %.5f per sample (want %.5f, %s); fit steps %d..%d, r² = %.4f, rise %.2f; d = %d, τ = %d, W = %d",
				res.Lambda, c.want, c.src, res.FitStart, res.FitEnd, res.R2, res.Rise, e.Dim, e.Delay, e.Theiler)
			if !res.Credible {
				t.Fatalf("not credible: %s", res.Reason)
			}
			if math.Abs(res.Lambda-c.want) > c.tol*c.want { // source: c.src
				t.Errorf("λ = %.5f, want %.5f ± %.0f%%", res.Lambda, c.want, 100*c.tol)
			}
		})
	}
}

// Noise has no credible exponent: the divergence curve of white noise and
// of a Gaussian AR(1) jumps or saturates within the embedding window
// (criterion documented on Lyapunov). Checked at the automatic embedding and
// at forced low dimensions, where neighbours are close and the curve rises
// far, and for a pure sine (no divergence at all).
func TestLyapunovNoiseNotCredible(t *testing.T) {
	sine := make([]float64, 5000)
	for i := range sine {
		sine[i] = math.Sin(2 * math.Pi * float64(i) / 37.3)
	}
	inputs := map[string][]float64{
		"white":     series(t, white, 5000, 2),
		"ar1 φ=0.9": series(t, ar1, 5000, 3),
		"ar1 n=2e4": series(t, ar1, 20000, 4),
		"ar1 φ=0.5": series(t, generators.AR1{Phi: 0.5}, 5000, 5),
		"sine":      sine,
	}
	for name, x := range inputs {
		for _, d := range []int{0, 2, 3, 5} {
			res, err := Lyapunov(x, LyapunovOptions{Embed: EmbedOptions{Dim: d}})
			if err != nil {
				t.Fatalf("%s d=%d: %v", name, d, err)
			}
			if res.Credible || !math.IsNaN(res.Lambda) || res.Reason == "" {
				t.Errorf("%s d=%d: credible λ = %g (fit %d..%d, rise %.2f, jump %.2f, window rise %.2f), want none",
					name, res.Embedding.Dim, res.Lambda, res.FitStart, res.FitEnd, res.Rise, res.Jump, res.WindowRise)
			}
		}
	}
}
