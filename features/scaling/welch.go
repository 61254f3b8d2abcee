package scaling

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/dsp/fourier"
)

// WelchOptions configures Welch. The zero value selects the defaults.
type WelchOptions struct {
	// Segment is the segment length in samples, a power of two of at least
	// 16 and at most n. 0 means DefaultSegment(n): the largest power of two
	// not above n/8, but at least 256.
	Segment int
}

// Spectrum is a one-sided power spectral density estimate.
type Spectrum struct {
	// Freq holds the frequencies k/Segment in cycles per sample,
	// k = 0 … Segment/2.
	Freq []float64
	// Power is the one-sided density in (units of x)² per (cycle/sample),
	// normalised so that Σ_{k≥1} Power[k]·Δf ≈ variance of x.
	Power    []float64
	Segment  int // segment length used
	Segments int // number of averaged segments
}

// DefaultSegment returns the default Welch segment length for n samples:
// the largest power of two not above n/8, but at least 256 (so that the
// spectrum has enough frequencies for a slope), and never above n. It
// returns 0 for n < 256.
func DefaultSegment(n int) int {
	if n < 256 {
		return 0
	}
	l := 256
	for 2*l <= n/8 {
		l *= 2
	}
	return l
}

// Welch returns the power spectral density of x by Welch's method: the
// series is cut into segments of opts.Segment samples overlapping by 50%
// (the last partial segment is dropped), each segment has its mean removed
// and is multiplied by a periodic Hann window w_t = sin²(πt/L), and the
// periodograms |FFT|²/Σw² are averaged (doubled for 0 < f < ½).
// Welch, IEEE Trans. Audio Electroacoust. 15 (1967) 70 (checked: rdrr.io/cran/rsleep/man/pwelch.html).
//
// The caller must supply at least max(Segment, 256) finite samples (16 when
// Segment is given explicitly) that are not all equal. Cost O(n log L).
func Welch(x []float64, opts WelchOptions) (Spectrum, error) {
	l := opts.Segment
	if l == 0 {
		if err := checkSeries("welch", x, 256); err != nil {
			return Spectrum{}, err
		}
		l = DefaultSegment(len(x))
	} else {
		if l < 16 || l&(l-1) != 0 {
			return Spectrum{}, fmt.Errorf("welch: %w: segment %d, want a power of two ≥ 16", ErrBadOption, l)
		}
		if err := checkSeries("welch", x, l); err != nil {
			return Spectrum{}, err
		}
	}
	n := len(x)
	win := make([]float64, l)
	var w2 float64
	for t := range win {
		s := math.Sin(math.Pi * float64(t) / float64(l))
		win[t] = s * s
		w2 += win[t] * win[t]
	}
	fft := fourier.NewFFT(l)
	buf := make([]float64, l)
	coef := make([]complex128, l/2+1)
	power := make([]float64, l/2+1)
	step := l / 2
	segs := 0
	// Centre on the global mean first so segment means of a series far
	// from zero do not lose digits.
	var g float64
	for _, v := range x {
		g += v
	}
	g /= float64(n)
	for start := 0; start+l <= n; start += step {
		seg := x[start : start+l]
		var m float64
		for _, v := range seg {
			m += v - g
		}
		m /= float64(l)
		for t, v := range seg {
			buf[t] = ((v - g) - m) * win[t]
		}
		fft.Coefficients(coef, buf)
		for k, c := range coef {
			power[k] += real(c)*real(c) + imag(c)*imag(c)
		}
		segs++
	}
	freq := make([]float64, l/2+1)
	norm := 1 / (float64(segs) * w2)
	for k := range power {
		power[k] *= norm
		if k > 0 && k < l/2 {
			power[k] *= 2
		}
		freq[k] = float64(k) / float64(l)
	}
	return Spectrum{Freq: freq, Power: power, Segment: l, Segments: segs}, nil
}
