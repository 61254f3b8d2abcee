package groups

import (
	"fmt"
	"math"
)

// DefaultMWExactMax is the default largest n·m for which MannWhitney uses
// the exact null distribution (no ties only). The recursion costs about
// (n·m)²/4 steps, 1.6·10⁶ at the default; beyond it the normal
// approximation with continuity correction is accurate to about 10⁻³.
const DefaultMWExactMax = 2500

// MWOptions control MannWhitney. The zero value means Method auto: exact
// when there are no ties and n·m ≤ DefaultMWExactMax, normal otherwise.
type MWOptions struct {
	// Method forces the exact or the asymptotic p-value. MethodExact with
	// ties is an error (ErrTiesExact): the tabulated null distribution
	// assumes distinct values.
	Method Method
	// ExactMax is the largest n·m for the automatic exact p-value;
	// 0 means DefaultMWExactMax.
	ExactMax int
}

// ErrTiesExact is returned by MannWhitney for MethodExact on tied data.
var ErrTiesExact = fmt.Errorf("exact Mann–Whitney p-value needs distinct values")

// MWResult is the outcome of a two-sided Mann–Whitney U test.
type MWResult struct {
	// U is the statistic of a: #{(i,j): a_i > b_j} + ½·#{a_i = b_j}
	// = R_a − n(n+1)/2 with R_a the mid-rank sum of a (the value
	// scipy.stats.mannwhitneyu returns as its statistic).
	U      float64 `json:"u"`
	P      float64 `json:"p"`      // two-sided p-value
	Z      float64 `json:"z"`      // standardised statistic of the normal approximation (NaN when exact)
	Method Method  `json:"method"` // exact or asymptotic
	N      int     `json:"n"`      // size of a
	M      int     `json:"m"`      // size of b
	Ties   bool    `json:"ties"`   // some pooled values are equal
}

// MannWhitney performs the two-sided Mann–Whitney U (Wilcoxon rank-sum)
// test of H₀: P(a > b) = P(a < b) for independent samples a and b (Mann &
// Whitney, Ann. Math. Stat. 18 (1947) 50).
//
// U = R_a − n(n+1)/2 from the mid-ranks of the pooled sample. With U* =
// max(U, nm − U):
//
//   - exact (no ties): p = 2·P(U ≥ U*) (capped at 1) from the null
//     distribution, computed by Mann & Whitney's recursion in probability
//     form, p_{i,j}(u) = i/(i+j)·p_{i−1,j}(u−j) + j/(i+j)·p_{i,j−1}(u)
//     (the largest of the pooled values belongs to a with probability
//     i/(i+j) and then beats all j values of b), truncated at the needed
//     lower tail P(U ≤ nm − U*), which equals the upper tail by symmetry;
//   - asymptotic: z = (U* − nm/2 − ½)/σ with the tie-corrected
//     σ² = nm/12·((N+1) − Σ(t³−t)/(N(N−1))), N = n+m, t the tie-group
//     sizes, and p = 2·(1 − Φ(z)) (continuity and tie correction as in
//     Lehmann, Nonparametrics (1975), and scipy.stats.mannwhitneyu).
//
// All values tied gives σ = 0 and p = 1. a and b must be non-empty and
// finite (ErrEmpty, ErrNotFinite).
func MannWhitney(a, b []float64, opts MWOptions) (MWResult, error) {
	if err := checkFinite("Mann–Whitney sample a", a); err != nil {
		return MWResult{}, err
	}
	if err := checkFinite("Mann–Whitney sample b", b); err != nil {
		return MWResult{}, err
	}
	n, m := len(a), len(b)
	pooled := make([]float64, 0, n+m)
	pooled = append(append(pooled, a...), b...)
	ranks, tieTerm := midRanks(pooled)
	ra := 0.0
	for _, r := range ranks[:n] {
		ra += r
	}
	nm := float64(n) * float64(m)
	r := MWResult{U: ra - float64(n)*float64(n+1)/2, N: n, M: m, Ties: tieTerm > 0, Z: math.NaN()}
	limit := opts.ExactMax
	if limit <= 0 {
		limit = DefaultMWExactMax
	}
	switch opts.Method {
	case MethodExact:
		if r.Ties {
			return MWResult{}, ErrTiesExact
		}
		r.Method = MethodExact
	case MethodAsymptotic:
		r.Method = MethodAsymptotic
	case MethodAuto:
		r.Method = MethodAsymptotic
		if !r.Ties && nm <= float64(limit) {
			r.Method = MethodExact
		}
	default:
		return MWResult{}, fmt.Errorf("Mann–Whitney: unknown method %q", opts.Method)
	}
	uStar := math.Max(r.U, nm-r.U)
	if r.Method == MethodExact {
		// U is an integer without ties; P(U ≥ u*) = P(U ≤ nm − u*).
		r.P = math.Min(1, 2*mwLowerTail(n, m, int(math.Round(nm-uStar))))
		return r, nil
	}
	N := float64(n + m)
	sigma := math.Sqrt(nm / 12 * ((N + 1) - tieTerm/(N*(N-1))))
	if sigma == 0 || math.IsNaN(sigma) {
		r.P = 1
		return r, nil
	}
	r.Z = (uStar - nm/2 - 0.5) / sigma
	r.P = math.Min(1, math.Erfc(r.Z/math.Sqrt2)) // 2·(1 − Φ(z))
	return r, nil
}

// mwLowerTail returns P(U ≤ k) under H₀ for sample sizes n and m without
// ties, by the recursion of MannWhitney truncated at k.
func mwLowerTail(n, m, k int) float64 {
	if k < 0 {
		return 0
	}
	if k >= n*m {
		return 1
	}
	// prev[j] and cur[j] hold p_{i−1,j}(0…k) and p_{i,j}(0…k).
	w := k + 1
	prev := make([]float64, (m+1)*w)
	cur := make([]float64, (m+1)*w)
	for j := 0; j <= m; j++ {
		prev[j*w] = 1 // i = 0: U = 0 surely
	}
	for i := 1; i <= n; i++ {
		clear(cur)
		cur[0] = 1 // j = 0: U = 0 surely
		for j := 1; j <= m; j++ {
			fi := float64(i) / float64(i+j)
			fj := float64(j) / float64(i+j)
			c := cur[j*w : (j+1)*w]
			up := prev[j*w : (j+1)*w]  // p_{i−1,j}
			left := cur[(j-1)*w : j*w] // p_{i,j−1}
			top := min(k, i*j)
			for u := 0; u <= top; u++ {
				v := fj * left[u]
				if u >= j {
					v += fi * up[u-j]
				}
				c[u] = v
			}
		}
		prev, cur = cur, prev
	}
	s := 0.0
	row := prev[m*w : (m+1)*w]
	for _, v := range row {
		s += v
	}
	return math.Min(1, s)
}
