package generators

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// TestIIDMarginals: Kolmogorov–Smirnov at the 0.1% level on n = 10^5
// draws against the CDF of gonum's distuv (a general-purpose reference
// library) for every continuous marginal, with the shape parameters at and
// inside the ends of the registry's ranges.
func TestIIDMarginals(t *testing.T) {
	const n = 100000
	mixture := func(sep, w float64) func(float64) float64 {
		lo, hi := distuv.Normal{Mu: -sep / 2, Sigma: 1}, distuv.Normal{Mu: sep / 2, Sigma: 1}
		return func(x float64) float64 { return w*lo.CDF(x) + (1-w)*hi.CDF(x) }
	}
	tests := []struct {
		name string
		g    IID
		cdf  func(float64) float64
	}{
		{"uniform", IID{Marginal: MarginalUniform}, distuv.Uniform{Min: 0, Max: 1}.CDF},
		{"exponential", IID{Marginal: MarginalExponential}, distuv.Exponential{Rate: 1}.CDF},
		{"log-normal 0.1", IID{Marginal: MarginalLogNormal, Sigma: 0.1}, distuv.LogNormal{Mu: 0, Sigma: 0.1}.CDF},
		{"log-normal 3", IID{Marginal: MarginalLogNormal, Sigma: 3}, distuv.LogNormal{Mu: 0, Sigma: 3}.CDF},
		{"bimodal", IID{Marginal: MarginalBimodal, Sep: 4, Weight: 0.5}, mixture(4, 0.5)},
		{"bimodal skewed", IID{Marginal: MarginalBimodal, Sep: 10, Weight: 0.05}, mixture(10, 0.05)},
		{"laplace", IID{Marginal: MarginalLaplace}, distuv.Laplace{Mu: 0, Scale: 1}.CDF},
		{"chi-squared 0.5", IID{Marginal: MarginalChiSquared, K: 0.5}, distuv.ChiSquared{K: 0.5}.CDF},
		{"chi-squared 3", IID{Marginal: MarginalChiSquared, K: 3}, distuv.ChiSquared{K: 3}.CDF},
		{"chi-squared 100", IID{Marginal: MarginalChiSquared, K: 100}, distuv.ChiSquared{K: 100}.CDF},
	}
	for i, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			x, err := tc.g.Generate(n, newRand(uint64(440+i)))
			if err != nil {
				t.Fatal(err)
			}
			d := ksDistance(x, tc.cdf)
			t.Logf("%s: KS D = %.5f (0.1%% critical %.5f)", tc.name, d, ksCritical(n))
			if d > ksCritical(n) {
				t.Errorf("KS D = %.5f > %.5f", d, ksCritical(n))
			}
		})
	}
}

// TestIIDPoisson: Pearson's χ² goodness of fit of n = 2·10^5 counts
// against gonum's distuv.Poisson probabilities, over cells of expected
// count ≥ 20 (the tails pooled into the end cells), at λ on both sides of
// the switch between the product method (λ < 10) and PTRS (Hörmann 1993),
// up to the registry's maximum; the statistic must lie below the 0.1%
// critical value of χ² with cells − 1 degrees of freedom (distuv.ChiSquared
// quantile). Pearson's test; standard statistics texts.
func TestIIDPoisson(t *testing.T) {
	const n = 200000
	for i, lambda := range []float64{0.1, 3, 9.99, 10, 37.5, 1000, 1e4} {
		x, err := IID{Marginal: MarginalPoisson, Lambda: lambda}.Generate(n, newRand(uint64(460+i)))
		if err != nil {
			t.Fatal(err)
		}
		counts := map[int]float64{}
		for _, v := range x {
			if v != math.Trunc(v) || v < 0 {
				t.Fatalf("λ = %g: count %v is not a non-negative integer", lambda, v)
			}
			counts[int(v)]++
		}
		ref := distuv.Poisson{Lambda: lambda}
		// Cells [lo, hi] hold the central values with expected count ≥ 20;
		// everything below lo and above hi is pooled into the end cells.
		lo, hi := int(lambda), int(lambda)
		for lo > 0 && n*ref.Prob(float64(lo-1)) >= 20 {
			lo--
		}
		for n*ref.Prob(float64(hi+1)) >= 20 {
			hi++
		}
		var chi2 float64
		cells := 0
		for k := lo; k <= hi; k++ {
			var obs, exp float64
			switch k {
			case lo:
				exp = n * ref.CDF(float64(lo))
				for v, c := range counts {
					if v <= lo {
						obs += c
					}
				}
			case hi:
				exp = n * ref.Survival(float64(hi-1))
				for v, c := range counts {
					if v >= hi {
						obs += c
					}
				}
			default:
				exp = n * ref.Prob(float64(k))
				obs = counts[k]
			}
			chi2 += (obs - exp) * (obs - exp) / exp
			cells++
		}
		crit := distuv.ChiSquared{K: float64(cells - 1)}.Quantile(0.999)
		t.Logf("λ = %g: χ² = %.1f over %d cells (0.1%% critical %.1f)", lambda, chi2, cells, crit)
		if cells < 2 || chi2 > crit {
			t.Errorf("λ = %g: χ² = %.1f over %d cells, critical %.1f", lambda, chi2, cells, crit)
		}
	}
}

// TestIIDErrors: shape parameters outside their domain and unknown
// marginals are rejected.
func TestIIDErrors(t *testing.T) {
	for _, g := range []IID{
		{Marginal: -1}, {Marginal: numMarginals},
		{Marginal: MarginalLogNormal}, {Marginal: MarginalBimodal, Sep: 1, Weight: 1},
		{Marginal: MarginalBimodal, Sep: -1, Weight: 0.5}, {Marginal: MarginalPoisson, Lambda: math.Inf(1)},
		{Marginal: MarginalChiSquared, K: 0},
	} {
		if _, err := g.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v accepted", g)
		}
	}
	if MarginalPoisson.String() != "poisson" || Marginal(42).String() != "Marginal(42)" {
		t.Errorf("names: %v, %v", MarginalPoisson, Marginal(42))
	}
}
