package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Marginal selects the law of IID noise.
type Marginal int

// The marginals of IID; the numbers are the registry's "marginal" values.
const (
	MarginalUniform     Marginal = iota // U(0, 1)
	MarginalExponential                 // Exp(1)
	MarginalLogNormal                   // exp(σZ), Z ~ N(0, 1)
	MarginalBimodal                     // w N(−δ/2, 1) + (1 − w) N(δ/2, 1)
	MarginalLaplace                     // density ½ e^{−|x|}
	MarginalPoisson                     // Poisson(λ) counts (integer-valued)
	MarginalChiSquared                  // χ² with k degrees of freedom
	numMarginals
)

var marginalNames = [numMarginals]string{"uniform", "exponential", "log-normal", "bimodal", "laplace", "poisson", "chi-squared"}

// String returns the marginal's name.
func (m Marginal) String() string {
	if m < 0 || m >= numMarginals {
		return fmt.Sprintf("Marginal(%d)", int(m))
	}
	return marginalNames[m]
}

// IID is independent, identically distributed noise with a chosen
// non-Gaussian marginal law, in its standard form (scale and offset carry
// no information for the classifier):
//
//	MarginalUniform      U(0, 1)
//	MarginalExponential  Exp(1) (math/rand/v2 ExpFloat64)
//	MarginalLogNormal    exp(Sigma·Z), Z ~ N(0, 1)
//	MarginalBimodal      Weight·N(−Sep/2, 1) + (1 − Weight)·N(Sep/2, 1): two
//	                     modes when Sep > 2 (equal weights; standard result
//	                     for normal mixtures)
//	MarginalLaplace      ±Exp(1) with a fair sign
//	MarginalPoisson      Poisson(Lambda) counts (poissonDraw: Knuth's product
//	                     method below 10, Hörmann's PTRS above)
//	MarginalChiSquared   2·Gamma(K/2, 1) (Marsaglia & Tsang, gammaRand)
//
// Only the shape fields of the chosen marginal are read.
type IID struct {
	Marginal Marginal
	Sigma    float64 // LogNormal: σ > 0
	Sep      float64 // Bimodal: separation of the means in component sds, ≥ 0
	Weight   float64 // Bimodal: weight of the lower component, 0 < Weight < 1
	Lambda   float64 // Poisson: mean λ > 0
	K        float64 // ChiSquared: degrees of freedom k > 0
}

func (g IID) check() error {
	bad := func(what string, v float64) error {
		return fmt.Errorf("iid %v: %s = %g out of range", g.Marginal, what, v)
	}
	finite := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	switch g.Marginal {
	case MarginalUniform, MarginalExponential, MarginalLaplace:
	case MarginalLogNormal:
		if !(g.Sigma > 0) || !finite(g.Sigma) {
			return bad("sigma", g.Sigma)
		}
	case MarginalBimodal:
		if !(g.Sep >= 0) || !finite(g.Sep) {
			return bad("sep", g.Sep)
		}
		if !(g.Weight > 0 && g.Weight < 1) {
			return bad("weight", g.Weight)
		}
	case MarginalPoisson:
		if !(g.Lambda > 0) || !finite(g.Lambda) {
			return bad("lambda", g.Lambda)
		}
	case MarginalChiSquared:
		if !(g.K > 0) || !finite(g.K) {
			return bad("k", g.K)
		}
	default:
		return fmt.Errorf("iid: marginal %d, want 0..%d", int(g.Marginal), int(numMarginals)-1)
	}
	return nil
}

// Generate returns n independent draws.
func (g IID) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := g.check(); err != nil {
		return nil, err
	}
	out := make([]float64, n)
	for i := range out {
		var v float64
		switch g.Marginal {
		case MarginalUniform:
			v = rng.Float64()
		case MarginalExponential:
			v = rng.ExpFloat64()
		case MarginalLogNormal:
			v = math.Exp(g.Sigma * rng.NormFloat64())
		case MarginalBimodal:
			v = rng.NormFloat64() + g.Sep/2
			if rng.Float64() < g.Weight {
				v -= g.Sep
			}
		case MarginalLaplace:
			v = rng.ExpFloat64()
			if rng.IntN(2) == 0 {
				v = -v
			}
		case MarginalPoisson:
			v = poissonDraw(g.Lambda, rng)
		case MarginalChiSquared:
			v = 2 * gammaRand(g.K/2, rng)
		}
		out[i] = v
	}
	return out, nil
}

func init() {
	registerNoise(&System{
		Name:  "iid",
		Title: "i.i.d. noise with a non-Gaussian marginal (uniform, exponential, log-normal, bimodal, Laplace, Poisson, chi-squared)",
		Doc:   "Independent draws; marginal 0 uniform, 1 exponential, 2 log-normal (sigma), 3 bimodal Gaussian mixture (sep, weight), 4 Laplace, 5 Poisson counts (lambda), 6 chi-squared (k); shape parameters of other marginals are ignored. Label: stochastic.",
		Params: []Param{
			{Name: "marginal", Default: 3, Min: 0, Max: float64(numMarginals - 1), Integer: true, Doc: "law: 0 uniform, 1 exponential, 2 log-normal, 3 bimodal, 4 Laplace, 5 Poisson, 6 chi-squared"},
			{Name: "sigma", Default: 1, Min: 0.1, Max: 3, Doc: "log-normal σ of the logarithm"},
			{Name: "sep", Default: 4, Min: 0, Max: 10, Doc: "bimodal: distance of the two means in component sds"},
			{Name: "weight", Default: 0.5, Min: 0.05, Max: 0.95, Doc: "bimodal: weight of the lower component"},
			{Name: "lambda", Default: 5, Min: 0.1, Max: 1e4, Doc: "Poisson mean λ"},
			{Name: "k", Default: 3, Min: 0.5, Max: 100, Doc: "chi-squared degrees of freedom"},
		},
		Invariants: []Invariant{
			{Name: "op_ent_d4", Value: 1, Unit: "normalised", Source: "Bandt & Pompe, Phys. Rev. Lett. 88 (2002) 174102: i.i.d. continuous marginals (ties of Poisson counts excepted)"},
			{Name: "hv_deg_mean", Value: 4, Unit: "", Source: "Luque et al., Phys. Rev. E 80 (2009) 046103: any continuous i.i.d. series"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return IID{Marginal: Marginal(p["marginal"]), Sigma: p["sigma"], Sep: p["sep"], Weight: p["weight"], Lambda: p["lambda"], K: p["k"]}, nil
	})
}
