package increments

import "math"

// ksNormal returns the Kolmogorov–Smirnov distance
// D = max_i max(i/N − Φ(z_(i)), Φ(z_(i)) − (i−1)/N) between the empirical
// distribution of the sorted sample z and the standard normal CDF
// Φ(z) = ½·erfc(−z/√2). Kolmogorov (1933); Smirnov (1948) (checked: github.com/mauriceling/mauriceling.github.io/wiki/Kolmogorov-Smirnov-test).
// The caller guarantees z is sorted increasingly and non-empty.
func ksNormal(z []float64) float64 {
	n := float64(len(z))
	var d float64
	for i, v := range z {
		f := 0.5 * math.Erfc(-v/math.Sqrt2)
		d = math.Max(d, math.Max(float64(i+1)/n-f, f-float64(i)/n))
	}
	return d
}
