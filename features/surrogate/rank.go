package surrogate

import (
	"fmt"
	"math"
)

// Side is the alternative hypothesis of a rank test. The zero value means
// TwoSided.
type Side string

// The sidedness of a rank test.
const (
	// TwoSided rejects when the observed value is extreme on either side:
	// p = min(1, 2·min(p_upper, p_lower)).
	TwoSided Side = "two-sided"
	// Upper rejects when the observed value is large: p = p_upper.
	Upper Side = "upper"
	// Lower rejects when the observed value is small: p = p_lower.
	Lower Side = "lower"
)

// ErrSide is returned (wrapped) for an unknown Side.
var ErrSide = fmt.Errorf("unknown side (want two-sided, upper or lower)")

func (s Side) resolve() (Side, error) {
	switch s {
	case "":
		return TwoSided, nil
	case TwoSided, Upper, Lower:
		return s, nil
	}
	return "", fmt.Errorf("%w: %q", ErrSide, string(s))
}

// RankP returns the rank-test p-values of an observed value against M
// surrogate values:
//
//	p_upper = (1 + #{v ≥ observed}) / (M + 1)
//	p_lower = (1 + #{v ≤ observed}) / (M + 1)
//	p_two   = min(1, 2·min(p_upper, p_lower))
//
// Under the null hypothesis the observed value and the surrogate values are
// exchangeable, so P(p_upper ≤ k/(M+1)) ≤ k/(M+1): the test is exact (ties
// count against rejection, so it is conservative). The two-sided p doubles
// the smaller one-sided p (Bonferroni over the two sides). Theiler et al.,
// Physica D 58 (1992) 77; Schreiber & Schmitz, Physica D 142 (2000) 346.
// NaN values must be removed by the caller; with M = 0 all three are 1.
func RankP(observed float64, values []float64) (upper, lower, two float64) {
	ge, le := 0, 0
	for _, v := range values {
		if v >= observed {
			ge++
		}
		if v <= observed {
			le++
		}
	}
	m1 := float64(len(values) + 1)
	upper = float64(1+ge) / m1
	lower = float64(1+le) / m1
	two = math.Min(1, 2*math.Min(upper, lower))
	return upper, lower, two
}

// pFor returns the p-value of the given side.
func pFor(side Side, upper, lower, two float64) float64 {
	switch side {
	case Upper:
		return upper
	case Lower:
		return lower
	}
	return two
}

// MinSurrogates returns the least number of surrogates M for which a rank
// test can reach p ≤ alpha: the smallest p is 1/(M+1) one-sided and
// 2/(M+1) two-sided, so M = ⌈1/α − 1⌉ one-sided (19 for α = 0.05) and
// M = ⌈2/α − 1⌉ two-sided (39 for α = 0.05). Theiler et al., Physica D 58
// (1992) 77. alpha must be in (0, 1); side "" means TwoSided.
func MinSurrogates(alpha float64, side Side) (int, error) {
	if !(alpha > 0 && alpha < 1) {
		return 0, fmt.Errorf("%w: alpha %g not in (0, 1)", ErrOption, alpha)
	}
	s, err := side.resolve()
	if err != nil {
		return 0, err
	}
	k := 1.0
	if s == TwoSided {
		k = 2
	}
	// The small slack keeps 1/0.05 − 1 at 19 despite rounding.
	return int(math.Ceil(k/alpha - 1 - 1e-9)), nil
}

// Holm returns Holm's step-down adjusted p-values: with the m finite
// p-values sorted ascending, p_(1) ≤ … ≤ p_(m),
//
//	p̃_(i) = max_{j ≤ i} min(1, (m − j + 1)·p_(j)),
//
// returned in the input order. Rejecting every hypothesis with p̃ ≤ α
// controls the family-wise error rate at α. NaN entries (statistics that
// could not be computed) are not counted in m and stay NaN. Holm, Scand. J.
// Statist. 6 (1979) 65.
func Holm(p []float64) []float64 {
	out := make([]float64, len(p))
	idx := make([]int, 0, len(p))
	for i, v := range p {
		out[i] = math.NaN()
		if !math.IsNaN(v) {
			idx = append(idx, i)
		}
	}
	// Stable insertion sort: m is the number of statistics, small.
	for a := 1; a < len(idx); a++ {
		for b := a; b > 0 && p[idx[b-1]] > p[idx[b]]; b-- {
			idx[b-1], idx[b] = idx[b], idx[b-1]
		}
	}
	m := len(idx)
	run := 0.0
	for j, i := range idx {
		run = math.Max(run, math.Min(1, float64(m-j)*p[i]))
		out[i] = run
	}
	return out
}
