// Package scaling estimates how the fluctuations of a trace grow with the
// time scale: detrended fluctuation analysis (DFA), the rescaled range (R/S)
// Hurst exponent with the Anis–Lloyd small-sample correction, the spectral
// slope β of a Welch periodogram, and the autocorrelation function with its
// decay time.
//
// Every estimator takes the trace as []float64 and an options struct whose
// zero value selects the documented defaults, and returns a result struct that
// carries the diagnostics (fit range, r², number of points) beside the value.
// All exponents are invariant under x → a·x + b for any a ≠ 0 up to
// floating-point error.
package scaling

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/stat"
)

// Sentinel errors that callers may need to tell apart (use errors.Is).
var (
	// ErrTooShort means the series has fewer samples than the estimator
	// needs; the wrapped message names the minimum.
	ErrTooShort = errors.New("series too short")
	// ErrConstant means every sample has the same value, so no scaling
	// exponent is defined.
	ErrConstant = errors.New("series is constant")
	// ErrNonFinite means the series holds NaN or ±Inf.
	ErrNonFinite = errors.New("series holds NaN or Inf")
	// ErrBadOption means an option lies outside its documented domain.
	ErrBadOption = errors.New("invalid option")
	// ErrDegenerate means an intermediate quantity vanished (for example a
	// zero fluctuation because the series is an exact polynomial), so the
	// log–log fit is undefined.
	ErrDegenerate = errors.New("degenerate series")
	// ErrNoDecay means the autocorrelation did not fall below 1/e within
	// the lag range examined.
	ErrNoDecay = errors.New("autocorrelation does not fall below 1/e")
)

// checkSeries rejects series shorter than minLen, holding NaN/Inf, or
// constant. name prefixes the error message.
func checkSeries(name string, x []float64, minLen int) error {
	if len(x) < minLen {
		return fmt.Errorf("%s: %w: %d samples, need at least %d", name, ErrTooShort, len(x), minLen)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("%s: %w at index %d", name, ErrNonFinite, i)
		}
		lo = math.Min(lo, v)
		hi = math.Max(hi, v)
	}
	if lo == hi {
		return fmt.Errorf("%s: %w (every sample is %g)", name, ErrConstant, lo)
	}
	return nil
}

// logSpaced returns up to k distinct integers spaced logarithmically from lo
// to hi inclusive (lo ≤ hi), rounded to the nearest integer.
func logSpaced(lo, hi, k int) []int {
	if k < 2 || lo == hi {
		return []int{lo}
	}
	out := make([]int, 0, k)
	r := math.Log(float64(hi) / float64(lo))
	for j := 0; j < k; j++ {
		s := int(math.Round(float64(lo) * math.Exp(r*float64(j)/float64(k-1))))
		if s < lo {
			s = lo
		}
		if s > hi {
			s = hi
		}
		if len(out) == 0 || s > out[len(out)-1] {
			out = append(out, s)
		}
	}
	return out
}

// lineFit is an ordinary least-squares fit y = Intercept + Slope·x with its
// coefficient of determination and the standard error of the slope.
type lineFit struct {
	Slope, Intercept, R2, SlopeErr float64
}

// fitLine fits y against x by ordinary least squares (gonum stat).
// The caller guarantees len(x) == len(y) ≥ 2 and finite values.
func fitLine(x, y []float64) lineFit {
	a, b := stat.LinearRegression(x, y, nil, false)
	r2 := stat.RSquared(x, y, nil, a, b)
	var se float64
	if n := len(x); n > 2 {
		var ssr, sxx float64
		mx := stat.Mean(x, nil)
		for i := range x {
			e := y[i] - a - b*x[i]
			ssr += e * e
			sxx += (x[i] - mx) * (x[i] - mx)
		}
		se = math.Sqrt(ssr / float64(n-2) / sxx)
	}
	return lineFit{Slope: b, Intercept: a, R2: r2, SlopeErr: se}
}
