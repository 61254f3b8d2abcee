package scaling

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/dsp/fourier"
)

// ACFOptions configures ACF. The zero value selects the defaults.
type ACFOptions struct {
	// MaxLag is the largest lag returned. 0 means n/4 (estimates at larger
	// lags rest on too few pairs; common practice, Box & Jenkins (memory)).
	// It must be below n.
	MaxLag int
}

// ACF returns the sample autocorrelation function of x at lags
// 0 … MaxLag, r(k) = Σ_{i=0}^{n−1−k} (x_i − x̄)(x_{i+k} − x̄) / Σ_i (x_i − x̄)²
// (the standard biased estimator, which keeps the sequence positive
// semi-definite; r(0) = 1). It is computed by FFT of the zero-padded,
// mean-removed series (Wiener–Khinchin), O(n log n), to round-off equal to
// the direct O(n·MaxLag) sum.
//
// The caller must supply at least 2 finite samples that are not all equal.
// r is invariant under x → a·x + b for any a ≠ 0.
func ACF(x []float64, opts ACFOptions) ([]float64, error) {
	if err := checkSeries("acf", x, 2); err != nil {
		return nil, err
	}
	n := len(x)
	maxLag := opts.MaxLag
	if maxLag == 0 {
		maxLag = n / 4
	}
	if maxLag < 0 || maxLag >= n {
		return nil, fmt.Errorf("acf: %w: max lag %d, want 0 < max lag < n = %d", ErrBadOption, opts.MaxLag, n)
	}
	// Circular correlation of a sequence padded to m ≥ n + maxLag has no
	// wrap-around at lags ≤ maxLag.
	m := 1
	for m < n+maxLag {
		m *= 2
	}
	var mean float64
	for _, v := range x {
		mean += v
	}
	mean /= float64(n)
	buf := make([]float64, m)
	for i, v := range x {
		buf[i] = v - mean
	}
	fft := fourier.NewFFT(m)
	coef := fft.Coefficients(nil, buf)
	for k, c := range coef {
		coef[k] = complex(real(c)*real(c)+imag(c)*imag(c), 0)
	}
	fft.Sequence(buf, coef)
	r := make([]float64, maxLag+1)
	c0 := buf[0]
	if !(c0 > 0) {
		return nil, fmt.Errorf("acf: %w: zero variance after mean removal", ErrDegenerate)
	}
	for k := range r {
		r[k] = buf[k] / c0
	}
	return r, nil
}

// DecayOptions configures DecayTime. The zero value selects the defaults.
type DecayOptions struct {
	// MaxLag is the largest lag examined. 0 means n/4 (see ACFOptions).
	MaxLag int
	// WindowFactor is c of the automatic window for the integrated time:
	// the smallest M with M ≥ c·τ_int(M). 0 means 5 (Sokal, Monte Carlo
	// methods in statistical mechanics (1997) (memory)).
	WindowFactor float64
}

// DecayResult holds the autocorrelation decay times of a series, in
// samples.
type DecayResult struct {
	// Lag is the first lag k with r(k) < 1/e.
	Lag int
	// Time is the 1/e crossing interpolated between lags Lag−1 and Lag:
	// linearly in ln r when r(Lag) > 0 (exact for an exponential decay),
	// linearly in r otherwise.
	Time float64
	// Integrated is τ_int = 1 + 2·Σ_{k=1}^{Window} r(k), the factor by which
	// correlation inflates the variance of the mean (1 for white noise,
	// (1+φ)/(1−φ) for AR(1)).
	Integrated float64
	// Window is the summation window M of Integrated.
	Window int
	// WindowConverged is false when no M ≤ MaxLag satisfied
	// M ≥ c·τ_int(M); Integrated then sums up to MaxLag and is a lower
	// bound for slowly decaying series.
	WindowConverged bool
	// MaxLag is the largest lag examined.
	MaxLag int
}

// DecayTime returns the autocorrelation decay time of x: the first lag at
// which the sample ACF (see ACF) drops below 1/e, with an interpolated
// crossing, and the integrated autocorrelation time with Sokal's automatic
// window. For an Ornstein–Uhlenbeck process sampled at Δ with relaxation
// time τ, r(k) = e^{−kΔ/τ} and Time = τ/Δ (Gillespie, Phys. Rev. E 54 (1996)
// 2084).
//
// If r stays at or above 1/e up to MaxLag, the error wraps ErrNoDecay.
// The caller must supply at least 2 finite samples that are not all equal.
// Cost O(n log n).
func DecayTime(x []float64, opts DecayOptions) (DecayResult, error) {
	c := opts.WindowFactor
	if c == 0 {
		c = 5
	}
	if !(c > 0) {
		return DecayResult{}, fmt.Errorf("decay time: %w: window factor %g, want > 0", ErrBadOption, c)
	}
	r, err := ACF(x, ACFOptions{MaxLag: opts.MaxLag})
	if err != nil {
		return DecayResult{}, fmt.Errorf("decay time: %w", err)
	}
	maxLag := len(r) - 1
	res := DecayResult{MaxLag: maxLag, Lag: -1}

	tau := 1.0
	res.Window = maxLag
	res.Integrated = math.NaN()
	for m := 1; m <= maxLag; m++ {
		tau += 2 * r[m]
		if float64(m) >= c*tau {
			res.Window = m
			res.Integrated = tau
			res.WindowConverged = true
			break
		}
	}
	if !res.WindowConverged {
		res.Integrated = tau
	}

	thr := 1 / math.E
	for k := 1; k <= maxLag; k++ {
		if r[k] < thr {
			a, b := r[k-1], r[k]
			var frac float64
			if b > 0 {
				frac = (math.Log(a) - math.Log(thr)) / (math.Log(a) - math.Log(b))
			} else {
				frac = (a - thr) / (a - b)
			}
			res.Lag = k
			res.Time = float64(k-1) + frac
			return res, nil
		}
	}
	return res, fmt.Errorf("decay time: %w up to lag %d (r = %.3g there)", ErrNoDecay, maxLag, r[maxLag])
}
