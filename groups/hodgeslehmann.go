package groups

import (
	"math"
)

// HodgesLehmann returns the Hodges–Lehmann estimate of the shift of b
// relative to a: the median of the n·m pairwise differences b_j − a_i
// (Hodges & Lehmann, Ann. Math. Stat. 34 (1963) 598), the shift estimate
// that goes with the Mann–Whitney test. For even n·m it is the mean of the
// two middle differences.
//
// The differences are never stored: the k-th smallest is found by
// bisection over the ordered float64 values (at most 64 steps), each step
// counting the differences ≤ t in O(n+m) with two pointers over the sorted
// samples (rounded subtraction is monotone, so the count is monotone in t
// and in both indices). Cost O((n+m)·64 + sorting); the result equals the
// median of the explicitly computed differences exactly. NaN if a or b is
// empty; the caller guarantees finite values.
func HodgesLehmann(a, b []float64) float64 {
	n, m := len(a), len(b)
	if n == 0 || m == 0 {
		return math.NaN()
	}
	sa, sb := sortedCopy(a), sortedCopy(b)
	total := int64(n) * int64(m)
	if total%2 == 1 {
		return kthDiff(sa, sb, (total+1)/2)
	}
	lo := kthDiff(sa, sb, total/2)
	hi := lo
	if countDiffLE(sa, sb, lo) == total/2 {
		hi = nextDiff(sa, sb, lo) // the (k+1)-th is the smallest difference > lo
	}
	return lo + (hi-lo)/2
}

// kthDiff returns the k-th smallest (1-based) of the differences
// sb[j] − sa[i] for ascending sa, sb.
func kthDiff(sa, sb []float64, k int64) float64 {
	// Search over the totally ordered keys of float64 values: the
	// smallest t with count(d ≤ t) ≥ k is a difference itself.
	lo := orderedKey(sb[0] - sa[len(sa)-1]) // min difference
	hi := orderedKey(sb[len(sb)-1] - sa[0]) // max difference
	for lo < hi {
		mid := (lo & hi) + ((lo ^ hi) >> 1) // ⌊(lo+hi)/2⌋ without overflow
		if countDiffLE(sa, sb, fromOrderedKey(mid)) >= k {
			hi = mid
		} else {
			lo = mid + 1
		}
	}
	return fromOrderedKey(lo)
}

// countDiffLE returns #{(i,j): sb[j] − sa[i] ≤ t} for ascending sa, sb.
func countDiffLE(sa, sb []float64, t float64) int64 {
	// For each j, the i with sb[j] − sa[i] ≤ t form a suffix [i0, n);
	// i0 does not decrease as j grows.
	n := len(sa)
	i := 0
	var c int64
	for _, y := range sb {
		for i < n && y-sa[i] > t {
			i++
		}
		c += int64(n - i)
	}
	return c
}

// nextDiff returns the smallest difference sb[j] − sa[i] greater than t
// (there must be one). For each j the differences > t are those with
// i < i0 (see countDiffLE); the smallest of them is at i0 − 1.
func nextDiff(sa, sb []float64, t float64) float64 {
	n := len(sa)
	i := 0
	best := math.Inf(1)
	for _, y := range sb {
		for i < n && y-sa[i] > t {
			i++
		}
		if i > 0 {
			best = math.Min(best, y-sa[i-1])
		}
	}
	return best
}

// orderedKey maps a float64 to an int64 whose order matches the numeric
// order of the floats (−0 and +0 both map to 0).
func orderedKey(f float64) int64 {
	if f == 0 {
		return 0
	}
	b := int64(math.Float64bits(f))
	if b < 0 {
		return -(b & math.MaxInt64)
	}
	return b
}

// fromOrderedKey inverts orderedKey.
func fromOrderedKey(k int64) float64 {
	if k < 0 {
		return math.Float64frombits(uint64(-k) | 1<<63)
	}
	return math.Float64frombits(uint64(k))
}
