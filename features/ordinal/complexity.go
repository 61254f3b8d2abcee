package ordinal

import (
	"fmt"
	"math"
)

// ComplexityResult is the Jensen–Shannon statistical complexity with its
// diagnostics and the bounds of the complexity–entropy plane at the
// observed entropy.
type ComplexityResult struct {
	// Complexity is C_JS = Q_J[P, P_e]·H_S[P].
	Complexity float64
	// Entropy is the normalised permutation entropy H_S[P].
	Entropy float64
	// Disequilibrium is Q_J = Q0·J[P, P_e] in [0, 1].
	Disequilibrium float64
	// Divergence is the Jensen–Shannon divergence
	// J = S[(P+P_e)/2] − S[P]/2 − S[P_e]/2 in nats.
	Divergence float64
	// MinComplexity and MaxComplexity bound C_JS at this entropy for this
	// order (see Bounds); chaotic series lie near the maximum.
	MinComplexity, MaxComplexity float64

	Order, Delay      int
	Windows           int     // W = n − (d−1)·τ
	Patterns          int     // d!
	WindowsPerPattern float64 // W/d!
}

// Complexity returns the Jensen–Shannon statistical complexity of x,
// C_JS = Q_J[P, P_e]·H_S[P], where P is the ordinal-pattern distribution of
// order d and delay τ, P_e the uniform distribution over the N = d!
// patterns, H_S the normalised permutation entropy and
// Q_J = Q0·(S[(P+P_e)/2] − S[P]/2 − S[P_e]/2) the Jensen–Shannon
// disequilibrium normalised by
// Q0 = −2 / ( (N+1)/N·ln(N+1) − 2 ln(2N) + ln N ) so that Q_J ∈ [0, 1].
// C_JS → 0 for i.i.d. noise (and for monotone series); chaotic maps lie
// near the upper boundary of the complexity–entropy plane.
// Rosso et al., Phys. Rev. Lett. 99 (2007) 154102.
//
// The caller must supply at least (d−1)·τ + 1 finite samples that are not
// all equal; meaningful values need W ≫ d! windows. C_JS is invariant under
// x → a·x + b for any a ≠ 0. Cost O(n·d²).
//
// Ties: as Patterns, by Options.Ties; with TiesSkip i.i.d. data keep
// C_JS → 0.
func Complexity(x []float64, opts Options) (ComplexityResult, error) {
	dist, err := Patterns(x, opts)
	if err != nil {
		return ComplexityResult{}, fmt.Errorf("statistical complexity: %w", err)
	}
	return dist.Complexity(), nil
}

// Complexity returns the statistical complexity of the distribution.
func (d *Distribution) Complexity() ComplexityResult {
	k := len(d.Counts)
	fk := float64(k)
	lnK := math.Log(fk)
	t := float64(d.Windows)
	var sp, sm float64
	pe := 1 / fk
	for _, c := range d.Counts {
		p := float64(c) / t
		if p > 0 {
			sp -= p * math.Log(p)
		}
		m := (p + pe) / 2
		sm -= m * math.Log(m)
	}
	js := sm - sp/2 - lnK/2
	if js < 0 { // round-off at the uniform distribution
		js = 0
	}
	h := sp / lnK
	qj := Q0(k) * js
	cmin, cmax := bounds(k, h)
	return ComplexityResult{
		Complexity:        qj * h,
		Entropy:           h,
		Disequilibrium:    qj,
		Divergence:        js,
		MinComplexity:     cmin,
		MaxComplexity:     cmax,
		Order:             d.Order,
		Delay:             d.Delay,
		Windows:           d.Windows,
		Patterns:          k,
		WindowsPerPattern: t / fk,
	}
}

// Q0 returns the normalisation constant of the Jensen–Shannon
// disequilibrium over n states, the inverse of the largest divergence from
// the uniform distribution (reached by a delta distribution):
// Q0 = −2 / ( (n+1)/n·ln(n+1) − 2 ln(2n) + ln n ). Rosso et al., Phys. Rev.
// Lett. 99 (2007) 154102. n must be at least 2.
func Q0(n int) float64 {
	f := float64(n)
	return -2 / ((f+1)/f*math.Log(f+1) - 2*math.Log(2*f) + math.Log(f))
}
