package groups

import (
	"math"
)

// madNormal is 1/Φ⁻¹(3/4), the factor that makes the median absolute
// deviation a consistent estimator of the standard deviation of a normal
// distribution (Hampel, J. Am. Stat. Assoc. 69 (1974) 383; the same
// constant as scipy.stats.median_abs_deviation(scale="normal")).
const madNormal = 1.482602218505602

// Summary describes one group's values of one feature.
type Summary struct {
	N       int     `json:"n"`       // finite values used
	Missing int     `json:"missing"` // NaN or ±Inf values dropped
	Median  float64 `json:"median"`
	Q1      float64 `json:"q1"`  // 25 % quantile, linear interpolation
	Q3      float64 `json:"q3"`  // 75 % quantile, linear interpolation
	IQR     float64 `json:"iqr"` // Q3 − Q1
	MAD     float64 `json:"mad"` // 1.4826 · median |x − median|
	Mean    float64 `json:"mean"`
	SD      float64 `json:"sd"` // sample standard deviation (n − 1)
	Min     float64 `json:"min"`
	Max     float64 `json:"max"`
}

// Describe returns the Summary of x. NaN and ±Inf values are counted in
// Missing and otherwise ignored; with no finite value every statistic is
// NaN, with one value SD is NaN. Quantiles use linear interpolation between
// order statistics, Q(p) = x₍ₕ₎ + (h − ⌊h⌋)(x₍ₕ₊₁₎ − x₍ₕ₎) with
// h = (n − 1)p (0-based), definition 7 of Hyndman & Fan, Am. Stat. 50
// (1996) 361, the default of R and NumPy. MAD is scaled by 1/Φ⁻¹(3/4) ≈
// 1.4826 so that it estimates σ for normal data (Hampel 1974).
func Describe(x []float64) Summary {
	vals := make([]float64, 0, len(x))
	for _, v := range x {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			vals = append(vals, v)
		}
	}
	s := Summary{N: len(vals), Missing: len(x) - len(vals)}
	nan := math.NaN()
	if s.N == 0 {
		s.Median, s.Q1, s.Q3, s.IQR, s.MAD, s.Mean, s.SD, s.Min, s.Max = nan, nan, nan, nan, nan, nan, nan, nan, nan
		return s
	}
	sorted := sortedCopy(vals)
	s.Median = Quantile(sorted, 0.5)
	s.Q1 = Quantile(sorted, 0.25)
	s.Q3 = Quantile(sorted, 0.75)
	s.IQR = s.Q3 - s.Q1
	s.MAD = madNormal * rawMAD(sorted, s.Median)
	s.Min, s.Max = sorted[0], sorted[s.N-1]
	sum := 0.0
	for _, v := range sorted {
		sum += v
	}
	s.Mean = sum / float64(s.N)
	if s.N > 1 {
		ss := 0.0
		for _, v := range sorted {
			d := v - s.Mean
			ss += d * d
		}
		s.SD = math.Sqrt(ss / float64(s.N-1))
	} else {
		s.SD = nan
	}
	return s
}

// Quantile returns the p-quantile of the ascending slice sorted by linear
// interpolation (Hyndman & Fan 1996, definition 7): with h = (n − 1)p,
// Q = x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋+1] − x[⌊h⌋]). The caller guarantees that
// sorted is ascending, finite and non-empty and 0 ≤ p ≤ 1; otherwise NaN.
func Quantile(sorted []float64, p float64) float64 {
	n := len(sorted)
	if n == 0 || !(p >= 0 && p <= 1) {
		return math.NaN()
	}
	h := float64(n-1) * p
	lo := int(math.Floor(h))
	if lo >= n-1 {
		return sorted[n-1]
	}
	f := h - float64(lo)
	if f == 0 {
		return sorted[lo]
	}
	return sorted[lo] + f*(sorted[lo+1]-sorted[lo])
}

// rawMAD returns median |x − med| of the ascending slice sorted (unscaled).
func rawMAD(sorted []float64, med float64) float64 {
	dev := make([]float64, len(sorted))
	for i, v := range sorted {
		dev[i] = math.Abs(v - med)
	}
	return Quantile(sortedCopy(dev), 0.5)
}
