package nonlinear

import "github.com/tracesift/tracesift/internal/order"

// interquartileMean returns the mean of the middle half of a: the values of
// sorted ranks n/4 … n − n/4 − 1 (all of them when n < 4), the 25% trimmed
// mean (common practice: as robust as the median against a minority of
// outliers, nearly as efficient as the mean). It reorders a in place and
// needs len(a) ≥ 1. Expected O(n): two deterministic selections.
func interquartileMean(a []float64) float64 {
	n := len(a)
	lo, hi := n/4, n-n/4
	if lo > 0 {
		order.Select(a, lo)
		if hi-lo < len(a[lo:]) {
			order.Select(a[lo:], hi-lo)
		}
	}
	var s float64
	for _, v := range a[lo:hi] {
		s += v
	}
	return s / float64(hi-lo)
}
