package scaling

import (
	"fmt"
	"math"
)

// DFAOptions configures DFA. The zero value selects the defaults.
type DFAOptions struct {
	// Order is the order of the detrending polynomial, 1 (DFA-1) or 2
	// (DFA-2). 0 means 1.
	Order int
	// MinWindow is the smallest window size in samples. 0 means
	// DefaultDFAMinWindow(Order). It must be at least Order+2.
	MinWindow int
	// MaxWindow is the largest window size in samples. 0 means n/4, so
	// every scale averages over at least 8 windows (4 from each end).
	MaxWindow int
	// Scales is the number of logarithmically spaced window sizes between
	// MinWindow and MaxWindow (duplicates after rounding are dropped).
	// 0 means 20.
	Scales int
}

// DFAResult is the outcome of DFA with the diagnostics of the fit.
type DFAResult struct {
	Alpha     float64 // fluctuation exponent: slope of ln F(s) against ln s
	AlphaErr  float64 // standard error of the slope (OLS, scales treated as independent)
	Intercept float64 // intercept of the ln–ln fit
	R2        float64 // coefficient of determination of the ln–ln fit

	Order     int // detrending order used
	MinWindow int // smallest window in the fit (samples)
	MaxWindow int // largest window in the fit (samples)
	Points    int // number of window sizes in the fit
	N         int // series length

	Windows     []int     // window sizes s, increasing
	Fluctuation []float64 // F(s) for each window size, in the units of x
}

// DefaultDFAMinWindow returns the default smallest window for a detrending
// order: 10 for DFA-1 and 16 for DFA-2. Below roughly these sizes F(s)
// bends away from the asymptotic power law because the detrending polynomial
// absorbs a sizeable part of the variance of a short window (Kantelhardt et
// al., Physica A 295 (2001) 441 (memory)); the values are chosen so that
// fractional Gaussian noise with 0.3 ≤ H ≤ 0.9 is recovered within 0.05 at
// n = 2^14 (see the package tests).
func DefaultDFAMinWindow(order int) int {
	if order == 2 {
		return 16
	}
	return 10
}

// DFA returns the detrended fluctuation exponent α of x: the slope of
// ln F(s) against ln s, where F(s)² is the mean over windows of the squared
// deviation of the profile Y(k) = Σ_{i≤k} (x_i − x̄) from its least-squares
// polynomial of order opts.Order within non-overlapping windows of s
// samples. Windows are laid from the start and again from the end of the
// series, so 2·⌊n/s⌋ windows cover every sample (common practice,
// Kantelhardt et al., Physica A 316 (2002) 87; checked: search.r-project.org/CRAN/refmans/MFDFA/html/MFDFA.html). α = H for
// fractional Gaussian noise, 0.5 for white noise, 1.5 for Brownian motion.
// Peng et al., Phys. Rev. E 49 (1994) 1685.
//
// The window sizes are opts.Scales values spaced logarithmically from
// MinWindow to MaxWindow; all of them enter the fit. The per-window fit is
// closed-form (orthogonal polynomials on the window), O(n) per scale with no
// per-window allocation, O(n·Scales) overall.
//
// The caller must supply at least 8·MinWindow finite samples that are not
// all equal. α is invariant under x → a·x + b for any a ≠ 0.
func DFA(x []float64, opts DFAOptions) (DFAResult, error) {
	order := opts.Order
	if order == 0 {
		order = 1
	}
	if order != 1 && order != 2 {
		return DFAResult{}, fmt.Errorf("dfa: %w: order %d, want 1 or 2", ErrBadOption, opts.Order)
	}
	minW := opts.MinWindow
	if minW == 0 {
		minW = DefaultDFAMinWindow(order)
	}
	if minW < order+2 {
		return DFAResult{}, fmt.Errorf("dfa: %w: min window %d, want at least order+2 = %d", ErrBadOption, minW, order+2)
	}
	scales := opts.Scales
	if scales == 0 {
		scales = 20
	}
	if scales < 3 {
		return DFAResult{}, fmt.Errorf("dfa: %w: %d scales, want at least 3", ErrBadOption, scales)
	}
	if err := checkSeries("dfa", x, 8*minW); err != nil {
		return DFAResult{}, err
	}
	n := len(x)
	maxW := opts.MaxWindow
	if maxW == 0 {
		maxW = n / 4
	}
	if maxW > n/2 || maxW < 2*minW {
		return DFAResult{}, fmt.Errorf("dfa: %w: max window %d, want 2·min window (%d) ≤ max ≤ n/2 (%d)", ErrBadOption, maxW, 2*minW, n/2)
	}
	windows := logSpaced(minW, maxW, scales)
	if len(windows) < 3 {
		return DFAResult{}, fmt.Errorf("dfa: %w: only %d distinct window sizes in [%d, %d]", ErrBadOption, len(windows), minW, maxW)
	}

	// Profile of the mean-removed series.
	var mean float64
	for _, v := range x {
		mean += v
	}
	mean /= float64(n)
	y := make([]float64, n)
	var c float64
	for i, v := range x {
		c += v - mean
		y[i] = c
	}

	// Orthogonal basis on one window: u = t − (s−1)/2 and q = u² − mean(u²)
	// are orthogonal to the constant and to each other (u is symmetric).
	u := make([]float64, maxW)
	q := make([]float64, maxW)
	fl := make([]float64, len(windows))
	lx := make([]float64, len(windows))
	ly := make([]float64, len(windows))
	for j, s := range windows {
		var uu, mu2 float64
		h := float64(s-1) / 2
		for t := 0; t < s; t++ {
			u[t] = float64(t) - h
			uu += u[t] * u[t]
		}
		mu2 = uu / float64(s)
		var qq float64
		for t := 0; t < s; t++ {
			q[t] = u[t]*u[t] - mu2
			qq += q[t] * q[t]
		}
		segs := n / s
		var rss float64
		off := n - segs*s // start of the windows laid from the end
		for k := 0; k < segs; k++ {
			rss += detrendRSS(y[k*s:(k+1)*s], u[:s], q[:s], uu, qq, order)
			rss += detrendRSS(y[off+k*s:off+(k+1)*s], u[:s], q[:s], uu, qq, order)
		}
		f := math.Sqrt(rss / float64(2*segs*s))
		if !(f > 0) {
			return DFAResult{}, fmt.Errorf("dfa: %w: fluctuation is zero at window %d (the series is an exact polynomial trend of order < %d)", ErrDegenerate, s, order)
		}
		fl[j] = f
		lx[j] = math.Log(float64(s))
		ly[j] = math.Log(f)
	}
	fit := fitLine(lx, ly)
	return DFAResult{
		Alpha:       fit.Slope,
		AlphaErr:    fit.SlopeErr,
		Intercept:   fit.Intercept,
		R2:          fit.R2,
		Order:       order,
		MinWindow:   windows[0],
		MaxWindow:   windows[len(windows)-1],
		Points:      len(windows),
		N:           n,
		Windows:     windows,
		Fluctuation: fl,
	}, nil
}

// detrendRSS returns the residual sum of squares of y about its
// least-squares polynomial of the given order (1 or 2), by projection on the
// orthogonal basis {1, u, q}; uu = Σu², qq = Σq². Two passes (mean first)
// keep the sums free of cancellation when the window sits far from zero.
func detrendRSS(y, u, q []float64, uu, qq float64, order int) float64 {
	var m float64
	for _, v := range y {
		m += v
	}
	m /= float64(len(y))
	var syy, suy, sqy float64
	if order == 1 {
		for t, v := range y {
			d := v - m
			syy += d * d
			suy += u[t] * d
		}
		r := syy - suy*suy/uu
		return math.Max(r, 0)
	}
	for t, v := range y {
		d := v - m
		syy += d * d
		suy += u[t] * d
		sqy += q[t] * d
	}
	r := syy - suy*suy/uu - sqy*sqy/qq
	return math.Max(r, 0)
}
