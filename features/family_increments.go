package features

import (
	"math"

	"github.com/tracesift/tracesift/features/increments"
)

var incrementsFamily = family{
	name: FamilyIncrements,
	entries: []Entry{
		{"dx_skew_abs", FamilyIncrements, "|skewness| of the increments (sign dropped so a polarity flip does not matter)", "moment estimator, standard statistics texts"},
		{"dx_kurt_ex", FamilyIncrements, "excess kurtosis of the increments (0 Gaussian; large for jumps and fat tails)", "moment estimator, standard statistics texts"},
		{"dx_ks_gauss", FamilyIncrements, "Kolmogorov–Smirnov distance of the normalised increments from the fitted Gaussian", "Lilliefors, J. Am. Stat. Assoc. 62 (1967) 399 (checked: rdrr.io/cran/PoweR/man/stat0001.Lilliefors.html)"},
		{"dx_acf_1", FamilyIncrements, "lag-1 autocorrelation of the increments (−0.5 white noise, 0 random walk)", "standard result"},
	},
	compute: computeIncrements,
}

func computeIncrements(z []float64, _ Options, s *sink) {
	r, err := increments.Analyze(z, increments.Options{})
	if err != nil {
		s.missErr(err, "dx_skew_abs", "dx_kurt_ex", "dx_ks_gauss", "dx_acf_1")
		return
	}
	s.set("dx_skew_abs", math.Abs(r.Skewness))
	s.set("dx_kurt_ex", r.ExcessKurtosis)
	s.set("dx_ks_gauss", r.KS)
	s.set("dx_acf_1", r.Lag1)
}
