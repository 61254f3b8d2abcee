package groups

import (
	"fmt"
	"math"
)

// DefaultSignedRankExactMax is the largest number of non-zero differences
// for which SignedRank uses the exact null distribution (when the |d| have
// no ties): 2^n sign patterns are summarised by a recursion over the
// n(n+1)/2 + 1 possible rank sums, about 3·10⁴ steps at n = 50, and every
// probability is a dyadic rational held exactly in a float64. The same
// limit as scipy.stats.wilcoxon's automatic choice.
const DefaultSignedRankExactMax = 50

// SignedRankOptions control SignedRank. The zero value means Method auto:
// exact without ties or zeros for n ≤ DefaultSignedRankExactMax, normal
// approximation otherwise.
type SignedRankOptions struct {
	// Method forces the exact or the asymptotic p-value. MethodExact with
	// tied |d| or zero differences is an error (ErrTiesExact): the exact
	// distribution assumes the ranks 1…n.
	Method Method
	// ExactMax is the largest n for the automatic exact p-value; 0 means
	// DefaultSignedRankExactMax.
	ExactMax int
}

// SignedRankResult is the outcome of a two-sided Wilcoxon signed-rank test.
type SignedRankResult struct {
	// T is min(W⁺, W⁻), the smaller of the rank sums of the positive and
	// the negative differences (what scipy.stats.wilcoxon returns as its
	// two-sided statistic); WPlus is W⁺.
	T      float64 `json:"t"`
	WPlus  float64 `json:"w_plus"`
	P      float64 `json:"p"`      // two-sided p-value
	Z      float64 `json:"z"`      // standardised W⁺ of the normal approximation (NaN when exact)
	Method Method  `json:"method"` // exact or asymptotic
	// N is the number of non-zero differences used; Zeros the number of
	// zero differences dropped.
	N     int  `json:"n"`
	Zeros int  `json:"zeros"`
	Ties  bool `json:"ties"` // some |d| are equal
	// Median is the median of all differences given (zeros included), the
	// plain location summary reported beside the test.
	Median float64 `json:"median"`
}

// SignedRank performs the two-sided Wilcoxon signed-rank test of
// H₀: the differences d are symmetric about zero (Wilcoxon, Biometrics
// Bull. 1 (1945) 80), for paired data d_i = b_i − a_i.
//
// Zero differences are dropped (Wilcoxon's own treatment, zero_method
// "wilcox" of scipy.stats.wilcoxon); the remaining n are ranked by |d|
// with mid-ranks for ties, W⁺ is the rank sum of the positive ones.
//
//   - exact (no ties, no zeros): under H₀ each sign is ± with probability
//     ½ independently, so W⁺ is the sum of a random subset of 1…n; its
//     distribution follows from the recursion
//     P_k(w) = ½·P_{k−1}(w) + ½·P_{k−1}(w − k). p = 2·min(P(W⁺ ≤ w),
//     P(W⁺ ≥ w)), capped at 1, and exactly 1 when w is the centre
//     n(n+1)/4 (scipy's convention);
//   - asymptotic: z = (T − n(n+1)/4)/σ with the tie-corrected
//     σ² = n(n+1)(2n+1)/24 − Σ(t³ − t)/48 over the tie groups of |d|,
//     p = 2·(1 − Φ(|z|)), no continuity correction (scipy's default).
//     Z reports (W⁺ − n(n+1)/4)/σ, signed like the differences.
//
// The smallest attainable exact p is 2/2^n (all differences of one sign).
// With no non-zero difference the result has P = 1 and N = 0. d must be
// finite and non-empty (ErrEmpty, ErrNotFinite).
func SignedRank(d []float64, opts SignedRankOptions) (SignedRankResult, error) {
	if err := checkFinite("signed-rank differences", d); err != nil {
		return SignedRankResult{}, err
	}
	r := SignedRankResult{Z: math.NaN(), Median: Quantile(sortedCopy(d), 0.5)}
	nz := make([]float64, 0, len(d))
	for _, v := range d {
		if v == 0 {
			r.Zeros++
			continue
		}
		nz = append(nz, math.Abs(v))
	}
	n := len(nz)
	r.N = n
	if n == 0 {
		r.P, r.Method = 1, MethodAsymptotic
		return r, nil
	}
	ranks, tieTerm := midRanks(nz)
	r.Ties = tieTerm > 0
	k := 0
	for _, v := range d {
		if v == 0 {
			continue
		}
		if v > 0 {
			r.WPlus += ranks[k]
		}
		k++
	}
	total := float64(n) * float64(n+1) / 2
	r.T = math.Min(r.WPlus, total-r.WPlus)
	limit := opts.ExactMax
	if limit <= 0 {
		limit = DefaultSignedRankExactMax
	}
	switch opts.Method {
	case MethodExact:
		if r.Ties || r.Zeros > 0 {
			return SignedRankResult{}, ErrTiesExact
		}
		r.Method = MethodExact
	case MethodAsymptotic:
		r.Method = MethodAsymptotic
	case MethodAuto:
		r.Method = MethodAsymptotic
		if !r.Ties && r.Zeros == 0 && n <= limit {
			r.Method = MethodExact
		}
	default:
		return SignedRankResult{}, fmt.Errorf("signed-rank: unknown method %q", opts.Method)
	}
	mean := total / 2
	if r.Method == MethodExact {
		w := int(math.Round(r.WPlus))
		if 2*w == int(total) {
			r.P = 1
			return r, nil
		}
		pmf := signedRankPMF(n)
		lower, upper := 0.0, 0.0
		for i := 0; i <= w; i++ {
			lower += pmf[i]
		}
		for i := w; i < len(pmf); i++ {
			upper += pmf[i]
		}
		r.P = math.Min(1, 2*math.Min(lower, upper))
		return r, nil
	}
	sd := math.Sqrt(float64(n)*float64(n+1)*float64(2*n+1)/24 - tieTerm/48)
	if sd == 0 || math.IsNaN(sd) {
		r.P = 1
		return r, nil
	}
	r.Z = (r.WPlus - mean) / sd
	r.P = math.Min(1, math.Erfc(math.Abs(r.T-mean)/sd/math.Sqrt2))
	return r, nil
}

// signedRankPMF returns P(W⁺ = w), w = 0…n(n+1)/2, for n untied non-zero
// differences under H₀, by the recursion of SignedRank. Every entry is a
// multiple of 2^−n, exact in float64 for n ≤ 52.
func signedRankPMF(n int) []float64 {
	top := n * (n + 1) / 2
	p := make([]float64, top+1)
	p[0] = 1
	hi := 0
	for k := 1; k <= n; k++ {
		hi += k
		for w := hi; w >= 0; w-- {
			v := p[w]
			if w >= k {
				v += p[w-k]
			}
			p[w] = v / 2
		}
	}
	return p
}

// SignedRankMinP returns the smallest two-sided p-value the exact
// signed-rank test can give for n non-zero differences: 2/2^n (every
// difference of one sign), capped at 1.
func SignedRankMinP(n int) float64 {
	if n <= 0 {
		return 1
	}
	return math.Min(1, 2*math.Exp2(-float64(n)))
}
