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

// SelectKeyed reorders key, and ids alongside it, so that key[k] holds the
// value of sorted rank k, smaller-or-equal keys before it and
// greater-or-equal ones after: Hoare's selection as in Select, but the
// median-of-three pivot is read, not swapped into place, and every swap of
// keys is repeated in ids (the k-d tree's median split carries point
// indices this way). len(ids) must equal len(key); k outside [0, len(key))
// leaves both unchanged.
func SelectKeyed[I any](key []float64, ids []I, k int) {
	if k < 0 || k >= len(key) {
		return
	}
	lo, hi := 0, len(key)-1
	for lo < hi {
		m := lo + (hi-lo)/2
		a, b, e := key[lo], key[m], key[hi]
		pivot := b
		if (a <= b) == (b <= e) {
			pivot = b
		} else if (b <= a) == (a <= e) {
			pivot = a
		} else {
			pivot = e
		}
		i, j := lo, hi
		for i <= j {
			for key[i] < pivot {
				i++
			}
			for key[j] > pivot {
				j--
			}
			if i <= j {
				key[i], key[j] = key[j], key[i]
				ids[i], ids[j] = ids[j], ids[i]
				i++
				j--
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return
		}
	}
}

func nan() float64 {
	var zero float64
	return zero / zero
}
