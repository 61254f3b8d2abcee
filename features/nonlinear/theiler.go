package nonlinear

import "math"

// autocorrTime returns the first lag k ≥ 1 at which the sample
// autocorrelation of the standardised series z drops to 1/e or below, and
// whether that happened within maxLag; when it did not, it returns maxLag
// and false. ρ(k) = Σ_{t<n−k} z_t z_{t+k} / Σ_t z_t² (the biased estimator,
// which is what makes the 1/e time well defined for short series).
func autocorrTime(z []float64, maxLag int) (int, bool) {
	var c0 float64
	for _, v := range z {
		c0 += v * v
	}
	thr := c0 / math.E
	for k := 1; k <= maxLag && k < len(z); k++ {
		var c float64
		a, b := z[:len(z)-k], z[k:]
		for t := range a {
			c += a[t] * b[t]
		}
		if c <= thr {
			return k, true
		}
	}
	return maxLag, false
}

// defaultTheiler is the default Theiler window, the number of samples on
// either side of a point whose neighbours are excluded as temporal rather
// than dynamical neighbours (Theiler, Phys. Rev. A 34 (1986) 2427):
// W = 2·max(acfTime, delay), twice the autocorrelation time of the series
// (or the delay, when larger), which keeps out points on the same trajectory
// strand for flows and is 2 for maps.
func defaultTheiler(acfTime, delay int) int {
	return 2 * max(acfTime, delay)
}
