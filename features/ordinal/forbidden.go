package ordinal

import (
	"fmt"
	"math"
)

// MissingResult counts the ordinal patterns that never occur, with the
// i.i.d. baseline needed to read it.
type MissingResult struct {
	// Missing is the number of the d! patterns never observed.
	Missing int
	// Fraction is Missing / d!.
	Fraction float64
	// ExpectedIID is the number of patterns an i.i.d. series of the same
	// length would miss by chance, d!·(1 − 1/d!)^W (derived: each pattern is
	// absent from W independent windows with probability (1 − 1/d!)^W; an
	// approximation, since overlapping windows are dependent). When W is not
	// ≫ d! patterns go missing for noise too; only Missing well above
	// ExpectedIID points to forbidden patterns of deterministic dynamics.
	ExpectedIID float64
	// ExpectedFractionIID is ExpectedIID / d!.
	ExpectedFractionIID float64
	// Codes lists the Lehmer codes of the missing patterns, increasing
	// (decode with Pattern).
	Codes []int

	Order, Delay      int
	Windows           int     // W = n − (d−1)·τ
	Patterns          int     // d!
	WindowsPerPattern float64 // W/d!
}

// Missing returns the number and fraction of ordinal patterns of order d
// and delay τ that never occur in x. Deterministic dynamics forbid some
// patterns outright (the logistic map at r = 4 never shows
// x_t > x_{t+1} > x_{t+2}; Amigó, Zambrano & Sanjuán, EPL 79 (2007)
// 50001), while for noise every pattern appears once the series is long
// enough; compare Fraction with ExpectedFractionIID.
//
// The caller must supply at least (d−1)·τ + 1 finite samples that are not
// all equal. Invariant under x → a·x + b with a ≠ 0 (for a < 0 the missing
// codes are mirrored, c → d!−1−c). Cost O(n·d²).
//
// Ties: as Patterns, by Options.Ties. With TiesSkip a pattern counts as seen
// only in a window without equal values, so a quantised chaotic series keeps
// every pattern its unquantised series never shows missing (a monotone
// quantiser creates no strict order); Windows and ExpectedIID then refer to
// the windows kept. TiesStable can fill a forbidden pattern with a tied
// window (a run of equal values reads as rising).
func Missing(x []float64, opts Options) (MissingResult, error) {
	dist, err := Patterns(x, opts)
	if err != nil {
		return MissingResult{}, fmt.Errorf("missing patterns: %w", err)
	}
	return dist.Missing(), nil
}

// Missing returns the missing-pattern count of the distribution.
func (d *Distribution) Missing() MissingResult {
	k := len(d.Counts)
	var codes []int
	for c, n := range d.Counts {
		if n == 0 {
			codes = append(codes, c)
		}
	}
	fk := float64(k)
	exp := fk * math.Exp(float64(d.Windows)*math.Log1p(-1/fk))
	return MissingResult{
		Missing:             len(codes),
		Fraction:            float64(len(codes)) / fk,
		ExpectedIID:         exp,
		ExpectedFractionIID: exp / fk,
		Codes:               codes,
		Order:               d.Order,
		Delay:               d.Delay,
		Windows:             d.Windows,
		Patterns:            k,
		WindowsPerPattern:   float64(d.Windows) / fk,
	}
}
