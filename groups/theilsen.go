package groups

import (
	"math"
	"sort"

	"gonum.org/v1/gonum/stat/distuv"
)

// TheilSenResult is a robust straight-line fit with a confidence interval
// for its slope.
type TheilSenResult struct {
	// Slope is the median of the pairwise slopes; Intercept is
	// median(y) − Slope·median(x).
	Slope     float64 `json:"slope"`
	Intercept float64 `json:"intercept"`
	// Low and High bound the slope's confidence interval at Level.
	Low   float64 `json:"low"`
	High  float64 `json:"high"`
	Level float64 `json:"level"`
	// N is the number of points used (finite x and y) and Slopes the
	// number of pairwise slopes (pairs with distinct x).
	N      int `json:"n"`
	Slopes int `json:"slopes"`
}

// TheilSen fits y ≈ Intercept + Slope·x by the Theil–Sen estimator: the
// slope is the median of (y_j − y_i)/(x_j − x_i) over all pairs with
// x_j > x_i (Theil, Proc. K. Ned. Akad. Wet. 53 (1950) 386; Sen, J. Am.
// Stat. Assoc. 63 (1968) 1379), the intercept median(y) − slope·median(x).
//
// The confidence interval at level (0 means 0.95) is Sen's distribution-free
// one, from the null distribution of Kendall's statistic: with N sorted
// slopes, z = Φ⁻¹((1 − level)/2) and the tie-corrected variance (Sen 1968,
// eq. 2.6) σ² = [n(n−1)(2n+5) − Σ_x t(t−1)(2t+5) − Σ_y u(u−1)(2u+5)]/18 over
// the tie groups t of x and u of y, the bounds are the slopes of 0-based
// rank max(round((N + zσ)/2) − 1, 0) and min(round((N − zσ)/2), N − 1),
// rounding half to even (the index arithmetic of scipy.stats.theilslopes).
//
// Pairs with a non-finite x or y are dropped. With fewer than two distinct
// x values every field but N and Level is NaN (Slopes = 0). Invariant under
// y → a·y + b (slope scaled by a, a > 0) and under the order of the points.
func TheilSen(x, y []float64, level float64) TheilSenResult {
	if level == 0 {
		level = 0.95
	}
	nan := math.NaN()
	r := TheilSenResult{Slope: nan, Intercept: nan, Low: nan, High: nan, Level: level}
	if len(x) != len(y) || !(level > 0 && level < 1) {
		return r
	}
	var xs, ys []float64
	for i := range x {
		if finite(x[i]) && finite(y[i]) {
			xs = append(xs, x[i])
			ys = append(ys, y[i])
		}
	}
	n := len(xs)
	r.N = n
	slopes := make([]float64, 0, n*(n-1)/2)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			if dx := xs[j] - xs[i]; dx > 0 {
				slopes = append(slopes, (ys[j]-ys[i])/dx)
			}
		}
	}
	r.Slopes = len(slopes)
	if len(slopes) == 0 {
		return r
	}
	sort.Float64s(slopes)
	r.Slope = Quantile(slopes, 0.5)
	r.Intercept = Quantile(sortedCopy(ys), 0.5) - r.Slope*Quantile(sortedCopy(xs), 0.5)

	z := distuv.UnitNormal.Quantile((1 - level) / 2) // negative
	fn := float64(n)
	sigsq := fn*(fn-1)*(2*fn+5) - tieSum(xs) - tieSum(ys)
	sigma := math.Sqrt(sigsq / 18)
	nt := float64(len(slopes))
	hi := min(int(math.RoundToEven((nt-z*sigma)/2)), len(slopes)-1)
	lo := max(int(math.RoundToEven((nt+z*sigma)/2))-1, 0)
	if math.IsNaN(sigma) || hi < 0 || lo >= len(slopes) {
		return r
	}
	r.Low, r.High = slopes[lo], slopes[hi]
	return r
}

// tieSum returns Σ t(t−1)(2t+5) over the groups of t > 1 equal values
// of v (the tie term of the variance of Kendall's statistic).
func tieSum(v []float64) float64 {
	s := sortedCopy(v)
	sum := 0.0
	for i := 0; i < len(s); {
		j := i + 1
		for j < len(s) && s[j] == s[i] {
			j++
		}
		if t := float64(j - i); t > 1 {
			sum += t * (t - 1) * (2*t + 5)
		}
		i = j
	}
	return sum
}
