package surrogate

import (
	"fmt"
	"math"
)

// Truncation records the sub-series kept by end matching.
type Truncation struct {
	Start          int     `json:"start"`           // index of the first sample kept
	Len            int     `json:"len"`             // number of samples kept
	CutStart       int     `json:"cut_start"`       // samples dropped at the start
	CutEnd         int     `json:"cut_end"`         // samples dropped at the end
	Mismatch       float64 `json:"mismatch"`        // Mismatch of the kept sub-series
	MismatchBefore float64 `json:"mismatch_before"` // Mismatch of the whole series
}

// Mismatch returns the end-point mismatch of x normalised by its variance:
//
//	((x_0 − x_{n−1})² + ((x_1 − x_0) − (x_{n−1} − x_{n−2}))²) / var(x),
//
// the jump between the two ends plus the jump in slope ("slip") that the
// periodic continuation assumed by the discrete Fourier transform makes.
// Schreiber & Schmitz, Physica D 142 (2000) 346, who normalise by
// Σ(x − x̄)² instead of the variance (memory). x needs ≥ 3 values and a
// non-zero variance (else NaN).
func Mismatch(x []float64) float64 {
	n := len(x)
	if n < 3 {
		return math.NaN()
	}
	v := variance(x)
	if v == 0 {
		return math.NaN()
	}
	return endCost(x, 0, n-1) / v
}

// endCost is the unnormalised mismatch of the sub-series x[s..e].
func endCost(x []float64, s, e int) float64 {
	j := x[s] - x[e]
	sl := (x[s+1] - x[s]) - (x[e] - x[e-1])
	return j*j + sl*sl
}

func variance(x []float64) float64 {
	var m float64
	for _, v := range x {
		m += v
	}
	m /= float64(len(x))
	var s float64
	for _, v := range x {
		d := v - m
		s += d * d
	}
	return s / float64(len(x))
}

// MatchEnds finds the sub-series x[s : s+L] with L ≥ ⌈minFraction·n⌉ that
// minimises the end-point mismatch (x_s − x_{s+L−1})² + (slip)² (see
// Mismatch; the search minimises it unnormalised, which is the same as
// normalising by the variance of the whole series). Only lengths L whose
// prime factors are all ≤ 7 are tried, so that the FFTs of the result are
// fast; if [⌈minFraction·n⌉, n] holds no such length, every length is tried.
// Ties go to the longer sub-series, then to the earlier start. Cost O(K·n)
// with K the number of admissible lengths (about 20 for minFraction = 0.9
// at n = 10^6). Removing the end mismatch removes the spurious high
// frequencies that FT-based surrogates inherit from the jump of the
// periodic continuation: Schreiber & Schmitz, Physica D 142 (2000) 346.
// minFraction 0 means DefaultMinFraction; x must be finite, n ≥ 8.
func MatchEnds(x []float64, minFraction float64) (Truncation, error) {
	if minFraction == 0 {
		minFraction = DefaultMinFraction
	}
	if !(minFraction > 0 && minFraction <= 1) {
		return Truncation{}, fmt.Errorf("match ends: %w: min fraction %g not in (0, 1]", ErrOption, minFraction)
	}
	if err := checkSeries(x); err != nil {
		return Truncation{}, fmt.Errorf("match ends: %w", err)
	}
	n := len(x)
	lmin := int(math.Ceil(minFraction * float64(n)))
	lmin = max(min(lmin, n), minLength)
	bestS, bestL, best := -1, 0, math.Inf(1)
	search := func(smoothOnly bool) {
		for l := n; l >= lmin; l-- {
			if smoothOnly && !isSmooth(l) {
				continue
			}
			for s := 0; s+l <= n; s++ {
				if c := endCost(x, s, s+l-1); bestS < 0 || c < best {
					best, bestS, bestL = c, s, l
				}
			}
		}
	}
	search(true)
	if bestS < 0 {
		search(false)
	}
	sub := x[bestS : bestS+bestL]
	return Truncation{
		Start:          bestS,
		Len:            bestL,
		CutStart:       bestS,
		CutEnd:         n - bestS - bestL,
		Mismatch:       Mismatch(sub),
		MismatchBefore: Mismatch(x),
	}, nil
}

// EndLeakage estimates how much of the upper half of the spectrum of x an
// FT-based surrogate would owe to the jump d = x_0 − x_{n−1} of the periodic
// continuation. A jump d in a periodic sequence adds a sawtooth whose DFT has
// |X_k|² = d²/(4 sin²(πk/n)) (from Σ_t t z^t = n/(z−1) for z^n = 1, z ≠ 1);
// EndLeakage returns Σ of that over n/4 ≤ k ≤ n/2 divided by Σ |X_k|² of x
// over the same k. White noise gives about 0.3·d²/(n·var) (negligible); a
// strongly correlated series with ends far apart gives a large value. NaN
// when x has no power there. x must be finite with n ≥ 8.
func EndLeakage(x []float64) float64 {
	if len(x) < minLength {
		return math.NaN()
	}
	n := len(x)
	t := newRealFFT(n, nil)
	c := make([]complex128, n/2+1)
	t.forward(c, x)
	return endLeakage(x, c)
}

// endLeakage is EndLeakage with the half spectrum c of x given.
func endLeakage(x []float64, c []complex128) float64 {
	n := len(x)
	d := x[0] - x[n-1]
	var art, pow float64
	for k := (n + 3) / 4; k <= n/2; k++ {
		s := math.Sin(math.Pi * float64(k) / float64(n))
		art += d * d / (4 * s * s)
		pow += real(c[k])*real(c[k]) + imag(c[k])*imag(c[k])
	}
	if pow == 0 {
		return math.NaN()
	}
	return art / pow
}
