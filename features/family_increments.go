package features

import (
	"math"

	"github.com/tracesift/tracesift/features/increments"
)

var incrementsFamily = family{
	name: FamilyIncrements,
	entries: []Entry{
		{"inc_skew_abs", FamilyIncrements, "|skewness| of the increments (sign dropped so a polarity flip does not matter)", "moment estimator, standard statistics texts"},
		{"inc_kurt", FamilyIncrements, "excess kurtosis of the increments (0 Gaussian; large for jumps and fat tails)", "moment estimator, standard statistics texts"},
		{"inc_ks", FamilyIncrements, "Kolmogorov–Smirnov distance of the normalised increments from the fitted Gaussian", "Lilliefors, J. Am. Stat. Assoc. 62 (1967) 399 (checked: rdrr.io/cran/PoweR/man/stat0001.Lilliefors.html)"},
		{"inc_lag1", FamilyIncrements, "lag-1 autocorrelation of the increments (−0.5 white noise, 0 random walk)", "standard result"},
	},
	compute: computeIncrements,
}

func computeIncrements(z []float64, _ Options, s *sink) {
	r, err := increments.Analyze(z, increments.Options{})
	if err != nil {
		s.missErr(err, "inc_skew_abs", "inc_kurt", "inc_ks", "inc_lag1")
		return
	}
	s.set("inc_skew_abs", math.Abs(r.Skewness))
	s.set("inc_kurt", r.ExcessKurtosis)
	s.set("inc_ks", r.KS)
	s.set("inc_lag1", r.Lag1)
}
