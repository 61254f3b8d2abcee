// Package order holds the selection algorithm the project's robust
// statistics share.
package order

// Select reorders x so that x[k] holds the value of sorted rank k (0-based),
// every x[i] with i < k is ≤ x[k] and every x[i] with i > k is ≥ x[k], and
// returns x[k]: Hoare's selection (Hoare, Commun. ACM 4 (1961) 321) with a
// median-of-three pivot, deterministic, expected O(n). x must hold no NaN;
// k outside [0, len(x)) leaves x unchanged and returns NaN.
func Select(x []float64, k int) float64 {
	if k < 0 || k >= len(x) {
		return nan()
	}
	lo, hi := 0, len(x)-1
	for hi > lo {
		mid := lo + (hi-lo)/2
		// Median of three into x[mid], then use it as the pivot.
		if x[mid] < x[lo] {
			x[mid], x[lo] = x[lo], x[mid]
		}
		if x[hi] < x[lo] {
			x[hi], x[lo] = x[lo], x[hi]
		}
		if x[hi] < x[mid] {
			x[hi], x[mid] = x[mid], x[hi]
		}
		p := x[mid]
		i, j := lo, hi
		for i <= j {
			for x[i] < p {
				i++
			}
			for x[j] > p {
				j--
			}
			if i <= j {
				x[i], x[j] = x[j], x[i]
				i++
				j--
			}
		}
		// Now x[lo..j] ≤ p ≤ x[i..hi] and any index between j and i holds p.
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return x[k]
		}
	}
	return x[k]
}

func nan() float64 {
	var zero float64
	return zero / zero
}
