package ordinal

import (
	"fmt"
	"math"
)

// EntropyResult is the normalised permutation entropy with its
// diagnostics.
type EntropyResult struct {
	// Entropy is H_S = −Σ p ln p / ln d!, in [0, 1]: 1 when all d!
	// patterns are equally frequent (i.i.d. noise), 0 for a monotone
	// series.
	Entropy float64
	// BiasIID is the expected shortfall of the plug-in entropy below 1 for
	// i.i.d. data of this length, (d!−1)/(2·W·ln d!) (derived: the
	// Miller–Madow bias (K−1)/(2W) nats of a plug-in entropy over K = d!
	// equiprobable cells, normalised by ln d!; an approximation, since
	// overlapping windows are not independent). Compare 1 − Entropy with it
	// before reading structure into a value near 1.
	BiasIID float64

	Order, Delay      int
	Windows           int     // W = n − (d−1)·τ
	Patterns          int     // d!
	WindowsPerPattern float64 // W/d!; values below ~10 leave the estimate biased
	Ties              int     // windows holding a tie (see Distribution)
}

// Entropy returns the normalised permutation entropy of x,
// H_S = −Σ_π p(π) ln p(π) / ln d!, over the ordinal patterns π of order d
// and delay τ (Bandt & Pompe, Phys. Rev. Lett. 88 (2002) 174102).
//
// The caller must supply at least (d−1)·τ + 1 finite samples that are not
// all equal; meaningful values need W ≫ d! windows. H_S is invariant under
// x → a·x + b for any a ≠ 0 (negation mirrors the patterns, which permutes
// the probabilities). Cost O(n·d²).
//
// Ties: as Patterns, by Options.Ties. With TiesStable a coarse grid lowers
// H_S of noise (see TiesStable); with TiesSkip i.i.d. data keep H_S → 1 and
// BiasIID is computed from the windows kept.
func Entropy(x []float64, opts Options) (EntropyResult, error) {
	dist, err := Patterns(x, opts)
	if err != nil {
		return EntropyResult{}, fmt.Errorf("permutation entropy: %w", err)
	}
	return dist.Entropy(), nil
}

// Entropy returns the normalised permutation entropy of the distribution.
func (d *Distribution) Entropy() EntropyResult {
	k := len(d.Counts)
	lnK := math.Log(float64(k))
	return EntropyResult{
		Entropy:           shannon(d.Counts, d.Windows) / lnK,
		BiasIID:           float64(k-1) / (2 * float64(d.Windows) * lnK),
		Order:             d.Order,
		Delay:             d.Delay,
		Windows:           d.Windows,
		Patterns:          k,
		WindowsPerPattern: float64(d.Windows) / float64(k),
		Ties:              d.Ties,
	}
}

// shannon returns −Σ p ln p in nats for p = counts/total.
func shannon(counts []int, total int) float64 {
	t := float64(total)
	var s float64
	for _, c := range counts {
		if c > 0 {
			p := float64(c) / t
			s -= p * math.Log(p)
		}
	}
	return s
}
