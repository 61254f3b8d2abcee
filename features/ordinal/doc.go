// Package ordinal computes the ordinal-pattern (Bandt–Pompe) measures of a
// trace: the distribution of ordinal patterns of embedding order d and delay
// τ, the normalised permutation entropy, the Jensen–Shannon statistical
// complexity with the bounds of the complexity–entropy plane, and the
// fraction of missing (forbidden) patterns.
//
// Patterns depend only on the order relations inside each window, so every
// measure is exactly invariant under x → a·x + b with a > 0 (any strictly
// increasing transform). Negation (a < 0) mirrors every pattern (code c
// becomes d!−1−c for tie-free data): the entropy, the complexity and the
// number of missing patterns are unchanged, the pattern distribution is
// reversed.
//
// Ties: two equal values in a window have no order. Continuous data have
// none; quantised, clipped or genuinely discrete series have many, and a
// fixed tie rule then favours some patterns and reads the grid as structure
// (Zunino et al., Phys. Lett. A 381 (2017) 1883). Options.Ties chooses the
// rule: TiesStable (the default) ranks the earlier of two equal values as
// the smaller, so every window gets one pattern; TiesSkip counts only the
// windows without equal values. features.Extract dithers a quantised trace
// before these measures see it, so there they meet ties only in genuinely
// discrete series (fewer than five levels, or exactly periodic).
//
// Bandt & Pompe, Phys. Rev. Lett. 88 (2002) 174102.
package ordinal

import (
	"errors"
	"fmt"
	"math"
)

// Sentinel errors that callers may need to tell apart (use errors.Is).
var (
	// ErrTooShort means the series holds fewer samples than one window
	// ((d−1)·τ + 1) or than the estimator needs.
	ErrTooShort = errors.New("series too short")
	// ErrConstant means every sample has the same value: every window is
	// an all-tie pattern and the measures carry no information.
	ErrConstant = errors.New("series is constant")
	// ErrNonFinite means the series holds NaN or ±Inf.
	ErrNonFinite = errors.New("series holds NaN or Inf")
	// ErrBadOption means an option lies outside its documented domain.
	ErrBadOption = errors.New("invalid option")
	// ErrAllTied means every window holds equal values, so TiesSkip leaves
	// nothing to count.
	ErrAllTied = errors.New("every window holds equal values")
)

// MinOrder and MaxOrder bound the embedding order d.
const (
	MinOrder = 3
	MaxOrder = 7
)

// DefaultOrder is the embedding order used when Options.Order is 0. d = 5
// has 120 patterns, so traces of 10^3 samples and more satisfy n ≫ d!
// (common practice: Bandt & Pompe (2002) recommend 3 ≤ d ≤ 7 with n ≫ d!).
const DefaultOrder = 5

// Options configures the ordinal-pattern measures. The zero value selects
// the defaults.
type Options struct {
	// Order is the embedding order d, the number of samples per pattern,
	// MinOrder ≤ d ≤ MaxOrder. 0 means DefaultOrder.
	Order int
	// Delay is the embedding delay τ in samples, ≥ 1. 0 means 1.
	Delay int
	// Ties is the rule for windows holding equal values; the zero value is
	// TiesStable.
	Ties Ties
}

// Ties is the rule for a window holding equal values.
type Ties int

const (
	// TiesStable ranks the earlier of two equal values as the smaller (a
	// stable ranking, common practice), so every window gets exactly one
	// pattern; a window of equal values counts as strictly increasing. On a
	// coarse grid this favours rising patterns: i.i.d. noise recorded with
	// 16 levels over ±3 sd loses about 0.01 of its normalised entropy at
	// order 4 (measured), far more than the finite-sample bias.
	TiesStable Ties = iota
	// TiesSkip counts only the windows without equal values and leaves the
	// others out of Windows (Distribution.Skipped counts them). A monotone
	// quantiser never creates a strict order the unquantised series did not
	// have, so every pattern counted was really there and forbidden patterns
	// stay forbidden. For an i.i.d. series all orders of distinct values are
	// equally likely given that the values are distinct (exchangeability),
	// so the tie-free windows stay uniformly distributed and H_S → 1
	// (derived). The price is fewer windows: on a coarse grid or a slowly
	// varying series most windows hold a tie.
	TiesSkip
)

// resolve returns the effective order and delay.
func (o Options) resolve() (int, int, error) {
	d, tau := o.Order, o.Delay
	if d == 0 {
		d = DefaultOrder
	}
	if tau == 0 {
		tau = 1
	}
	if d < MinOrder || d > MaxOrder {
		return 0, 0, fmt.Errorf("%w: order %d, want %d ≤ d ≤ %d", ErrBadOption, o.Order, MinOrder, MaxOrder)
	}
	if tau < 1 {
		return 0, 0, fmt.Errorf("%w: delay %d, want ≥ 1", ErrBadOption, o.Delay)
	}
	if o.Ties != TiesStable && o.Ties != TiesSkip {
		return 0, 0, fmt.Errorf("%w: tie rule %d", ErrBadOption, o.Ties)
	}
	return d, tau, nil
}

// checkSeries rejects empty, NaN/Inf and constant series.
func checkSeries(x []float64) error {
	if len(x) == 0 {
		return fmt.Errorf("%w: empty series", ErrTooShort)
	}
	constant := true
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("%w at index %d", ErrNonFinite, i)
		}
		if v != x[0] {
			constant = false
		}
	}
	if constant {
		return fmt.Errorf("%w (every sample is %g)", ErrConstant, x[0])
	}
	return nil
}

// factorial returns d! for small d.
func factorial(d int) int {
	f := 1
	for i := 2; i <= d; i++ {
		f *= i
	}
	return f
}
