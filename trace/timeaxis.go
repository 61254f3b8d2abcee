package trace

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/internal/order"
)

// UnevenTolerance is the relative jitter of time steps accepted as even
// sampling, on top of the rounding of the printed time stamps: a step d
// with |d − m| > UnevenTolerance·m + min(ρ, m/2) makes the sampling
// uneven, where m is the median step and ρ the printed rounding of the
// two stamps (see the package documentation).
const UnevenTolerance = 1e-3

// interval derives the sample interval from strictly increasing time
// stamps t (len(t) ≥ 2). With the steps d_i = t_{i+1} − t_i and their
// median m, sampling is uneven when some
//
//	|d_i − m| > UnevenTolerance·m + min(ρ_i, m/2),   ρ_i = (r_i + r_{i+1})/2,
//
// where r_i = 10^res[i] is one unit in the last printed digit of stamp i
// (res[i] = math.MinInt16 when unknown, taken as r_i = 0), so rounding of
// the printed stamps (each off by up to r_i/2) is not mistaken for jitter,
// while the cap m/2 keeps a missing sample always detectable. The
// interval is (t_last − t_0)/(len(t) − 1) when sampling is even — exact
// up to the rounding of two stamps — and m when it is uneven. lo and hi
// are the smallest and largest step.
func interval(t []float64, res []int16) (delta float64, uneven bool, lo, hi float64) {
	d := make([]float64, len(t)-1)
	lo, hi = math.Inf(1), math.Inf(-1)
	for i := range d {
		d[i] = t[i+1] - t[i]
		lo = min(lo, d[i])
		hi = max(hi, d[i])
	}
	m := median(d) // reorders d; the steps are recomputed below
	for i := range d {
		di := t[i+1] - t[i]
		rho := 0.0
		if res != nil {
			rho = (pow10(res[i]) + pow10(res[i+1])) / 2
		}
		if math.Abs(di-m) > UnevenTolerance*m+min(rho, m/2) {
			uneven = true
			break
		}
	}
	if uneven {
		return m, true, lo, hi
	}
	return (t[len(t)-1] - t[0]) / float64(len(t)-1), false, lo, hi
}

func pow10(e int16) float64 {
	if e == math.MinInt16 {
		return 0
	}
	return math.Pow(10, float64(e))
}

// unevenWarning describes uneven sampling for Trace.Warnings.
func unevenWarning(delta, lo, hi float64) string {
	return fmt.Sprintf("time column is unevenly sampled: steps range from %.6g to %.6g; Interval is their median %.6g", lo, hi, delta)
}

// median returns the median of x (mean of the two middle values for even
// length), reordering x. Quickselect with median-of-three pivots: O(n)
// expected, deterministic.
func median(x []float64) float64 {
	n := len(x)
	if n == 0 {
		return math.NaN()
	}
	m := selectK(x, n/2)
	if n%2 == 1 {
		return m
	}
	// The lower middle is the largest value left of position n/2.
	lower := x[0]
	for _, v := range x[1 : n/2] {
		lower = max(lower, v)
	}
	return (lower + m) / 2
}

// selectK reorders x so that x[k] is the k-th smallest value and
// everything left of k is ≤ x[k], and returns x[k].
func selectK(x []float64, k int) float64 { return order.Select(x, k) }
