package generators

import (
	"math"
	"slices"
	"testing"
)

// Helpers shared by the tests of the stochastic families (stable,
// levy-walk, arfima, ar-random, regime-ar, bursts, stoch-vol, cascade, iid,
// jump-diffusion, noisy-oscillator, level-shifts, varying-variance,
// poisson-counts).

// ksDistance returns the one-sample Kolmogorov–Smirnov statistic
// D = sup |F_n(x) − F(x)| of x against the continuous CDF cdf.
func ksDistance(x []float64, cdf func(float64) float64) float64 {
	s := slices.Clone(x)
	slices.Sort(s)
	n := float64(len(s))
	var d float64
	for i, v := range s {
		f := cdf(v)
		d = math.Max(d, math.Max(float64(i+1)/n-f, f-float64(i)/n))
	}
	return d
}

// ksCritical is the 0.1% critical value of D for n samples: the 0.999
// quantile 1.9495 of the Kolmogorov distribution over √n (Kolmogorov
// 1933; asymptotic, accurate for n ≥ 100; standard statistics tables).
func ksCritical(n int) float64 { return 1.9495 / math.Sqrt(float64(n)) }

// meanOf returns the mean of f over x.
func meanOf(x []float64, f func(float64) float64) float64 {
	var s float64
	for _, v := range x {
		s += f(v)
	}
	return s / float64(len(x))
}

// bandRatio returns the mean over bins k in [lo, hi] of p[k−1]/want(k),
// where p is a Hann periodogram (periodogram: p[k−1] at frequency k) and
// want the spectral density at bin k. The Hann window's mean square 3/8 is
// divided out, so the ratio is 1 when p is unbiased for want.
func bandRatio(p []float64, lo, hi int, want func(k int) float64) float64 {
	var s float64
	for k := lo; k <= hi; k++ {
		s += p[k-1] / (0.375 * want(k))
	}
	return s / float64(hi-lo+1)
}

// checkReplicates compares the mean over replicates of est[k] with want[k]
// within four standard errors of the replicate spread (meanSE), for each
// quantity names[k], logging every comparison.
func checkReplicates(t *testing.T, label string, names []string, want []float64, est [][]float64) {
	t.Helper()
	for k := range want {
		m, se := meanSE(est[k])
		t.Logf("%s %s = %.4f ± %.4f, analytic %.4f", label, names[k], m, se, want[k])
		if math.Abs(m-want[k]) > 4*se {
			t.Errorf("%s %s = %.4f ± %.4f, want %.4f", label, names[k], m, se, want[k])
		}
	}
}
