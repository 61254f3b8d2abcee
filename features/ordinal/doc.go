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
}

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
