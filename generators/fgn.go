package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// FGN is fractional Gaussian noise of Hurst exponent H: the stationary
// Gaussian process with autocovariance
// γ(k) = ½σ²(|k+1|^{2H} − 2|k|^{2H} + |k−1|^{2H}) (Mandelbrot & Van Ness,
// SIAM Review 10 (1968) 422), synthesised exactly by circulant embedding
// (Davies & Harte, Biometrika 74 (1987) 95). H = ½ is white noise; H > ½
// has long-range positive correlation and a spectrum S(f) ~ f^{−(2H−1)} at
// low frequency; H < ½ is anti-persistent.
type FGN struct {
	H     float64 // Hurst exponent, 0 < H < 1
	Sigma float64 // standard deviation; zero means 1
}

// fgnAcov returns the fGn autocovariance at lag k for unit variance.
func fgnAcov(h float64) func(int) float64 {
	return func(k int) float64 {
		if k == 0 {
			return 1
		}
		kf := float64(k)
		return 0.5 * (math.Pow(kf+1, 2*h) - 2*math.Pow(kf, 2*h) + math.Pow(kf-1, 2*h))
	}
}

// fgnAcovFill writes the unit-variance fGn autocovariance γ(k) into c[k],
// computing each power k^{2H} once (len(c) + 1 calls of math.Pow instead of
// three per lag) and forming the second differences from them.
func fgnAcovFill(h float64) func(c []float64) {
	return func(c []float64) {
		if len(c) == 0 {
			return
		}
		c[0] = 1
		prev, cur := 0.0, 1.0 // (k−1)^{2H} and k^{2H} at k = 1
		for k := 1; k < len(c); k++ {
			next := math.Pow(float64(k+1), 2*h)
			c[k] = 0.5 * (next - 2*cur + prev)
			prev, cur = cur, next
		}
	}
}

func (g FGN) sigma() float64 {
	if g.Sigma == 0 {
		return 1
	}
	return g.Sigma
}

func (g FGN) check(name string) error {
	if !(g.H > 0 && g.H < 1) {
		return fmt.Errorf("%s: H = %g, want 0 < H < 1", name, g.H)
	}
	if !(g.Sigma >= 0) || math.IsInf(g.Sigma, 0) {
		return fmt.Errorf("%s: sigma = %g, want sigma > 0 (0 means 1)", name, g.Sigma)
	}
	return nil
}

// Generate returns n samples of fGn. Time O(n log n).
func (g FGN) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := g.check("fgn"); err != nil {
		return nil, err
	}
	x, err := circulantGaussian(fgnAcovFill(g.H), n, rng)
	if err != nil {
		return nil, fmt.Errorf("fgn: %w", err)
	}
	if s := g.sigma(); s != 1 {
		for i := range x {
			x[i] *= s
		}
	}
	return x, nil
}

// FBM is fractional Brownian motion sampled at unit steps: the cumulative
// sum B_k = Σ_{j≤k} G_j of fractional Gaussian noise G of the same H and
// Sigma (Mandelbrot & Van Ness 1968), so Var(B_k) = σ²(k+1)^{2H}. H = ½ is
// ordinary Brownian motion. It is not stationary.
type FBM struct {
	H     float64 // Hurst exponent, 0 < H < 1
	Sigma float64 // standard deviation of the increments; zero means 1
}

// Generate returns n samples of fBm, starting with the first increment.
func (b FBM) Generate(n int, rng *rand.Rand) ([]float64, error) {
	g := FGN(b)
	if err := g.check("fbm"); err != nil {
		return nil, err
	}
	x, err := g.Generate(n, rng)
	if err != nil {
		return nil, fmt.Errorf("fbm: %w", err)
	}
	for i := 1; i < len(x); i++ {
		x[i] += x[i-1]
	}
	return x, nil
}

func init() {
	hurst := func(def float64) Param {
		return Param{Name: "h", Default: def, Min: 0.01, Max: 0.99, Doc: "Hurst exponent H"}
	}
	register(&System{
		Name:  "fgn",
		Title: "fractional Gaussian noise (Davies–Harte)",
		Doc:   "Exact synthesis by circulant embedding with gonum's FFT. Autocovariance ½σ²(|k+1|^{2H} - 2|k|^{2H} + |k-1|^{2H}). Label: stochastic.",
		Params: []Param{
			hurst(0.7),
			{Name: "sigma", Default: 1, Min: 1e-12, Max: 1e12, Doc: "standard deviation"},
		},
		Invariants: []Invariant{
			{Name: "sc_fluct_a1", Value: 0.7, Unit: "", Source: "Peng et al., Phys. Rev. E 49 (1994) 1685: α = H"},
			{Name: "sc_psd_beta", Value: 0.4, Unit: "", Source: "standard result: fGn spectrum ~ f^-(2H-1)"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return FGN{H: p["h"], Sigma: p["sigma"]}, 1, nil
		},
	})
	register(&System{
		Name:  "fbm",
		Title: "fractional Brownian motion (cumulative fGn)",
		Doc:   "Cumulative sum of Davies–Harte fractional Gaussian noise; non-stationary. Label: stochastic.",
		Params: []Param{
			hurst(0.7),
			{Name: "sigma", Default: 1, Min: 1e-12, Max: 1e12, Doc: "standard deviation of the increments"},
		},
		Invariants: []Invariant{
			{Name: "sc_fluct_a1", Value: 1.7, Unit: "", Source: "Peng et al., Phys. Rev. E 49 (1994) 1685: α = H + 1 for the integrated process"},
			{Name: "sc_psd_beta", Value: 2.4, Unit: "", Source: "standard result: fBm spectrum ~ f^-(2H+1)"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Stochastic,
		label:        fixed(Stochastic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return FBM{H: p["h"], Sigma: p["sigma"]}, 1, nil
		},
	})
}
