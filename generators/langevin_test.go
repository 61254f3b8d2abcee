package generators

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestLangevinBoltzmann: the sampled marginal of x follows the Boltzmann
// density p(x) ∝ exp(−(2γ/σ²)V(x)) of the Fokker–Planck equation (Risken
// 1989), checked by a Kolmogorov–Smirnov distance against the CDF obtained
// by numerical integration of the density. Samples are taken every 2 time
// units over a long record; the effective sample size is smaller than n
// (the series is correlated), so the bound is a loose 0.03; the wrong
// potential (the hardening well's law for the double-well samples) gives
// 0.18 (measured), so the check can fail.
func TestLangevinBoltzmann(t *testing.T) {
	for _, g := range []Langevin{
		{DoubleWell: true, Gamma: 0.5, Sigma: 0.8, Dt: 2},
		{DoubleWell: false, Gamma: 0.3, Sigma: 0.6, Dt: 2},
	} {
		x, err := g.Generate(40000, rand.New(rand.NewPCG(3, 4)))
		if err != nil {
			t.Fatal(err)
		}
		beta := 2 * g.Gamma / (g.Sigma * g.Sigma)
		pot := func(u float64) float64 {
			if g.DoubleWell {
				return u*u*u*u/4 - u*u/2
			}
			return u*u/2 + u*u*u*u/4
		}
		// CDF on a fine grid by the trapezoidal rule.
		const lo, hi, m = -4.0, 4.0, 8000
		grid := make([]float64, m+1)
		cdf := make([]float64, m+1)
		for i := range grid {
			grid[i] = lo + (hi-lo)*float64(i)/m
			if i > 0 {
				a, b := math.Exp(-beta*pot(grid[i-1])), math.Exp(-beta*pot(grid[i]))
				cdf[i] = cdf[i-1] + (a+b)/2*(hi-lo)/m
			}
		}
		for i := range cdf {
			cdf[i] /= cdf[m]
		}
		s := slices.Clone(x)
		slices.Sort(s)
		var d float64
		for i, v := range s {
			k := min(max(int((v-lo)/(hi-lo)*m), 0), m)
			d = max(d, math.Abs(float64(i+1)/float64(len(s))-cdf[k]))
		}
		if d > 0.03 {
			t.Errorf("%+v: KS distance %.4f from the Boltzmann law", g, d)
		}
	}
}

func TestLangevinRegistry(t *testing.T) {
	for _, name := range []string{"double-well", "hardening-well"} {
		sys, err := Lookup(name)
		if err != nil {
			t.Fatal(err)
		}
		c, err := sys.Class(nil)
		if err != nil || c != Stochastic {
			t.Errorf("%s: class %v, %v", name, c, err)
		}
		x, err := sys.Generate(1000, map[string]float64{"dt": 5, "sigma": 1.5, "gamma": 0.05}, rand.New(rand.NewPCG(1, 1)))
		if err != nil {
			t.Fatalf("%s at the range corner: %v", name, err)
		}
		for _, v := range x {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("%s: non-finite sample", name)
			}
		}
	}
}
