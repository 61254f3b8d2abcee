package generators

import (
	"math"
	"math/cmplx"
	"testing"

	"gonum.org/v1/gonum/dsp/fourier"
)

// Spectral-line helpers for the tests of the regular signals.

// lineAmplitude returns |(2/N)·Σ_t x_t·e^{−2πift}|, the amplitude of a
// cosine of frequency f (cycles per sample) in x. It is exact (no leakage)
// when every line of x completes a whole number of cycles in N samples
// (orthogonality of the discrete Fourier basis, analytic).
func lineAmplitude(x []float64, f float64) float64 {
	var s complex128
	for t, v := range x {
		s += complex(v, 0) * cmplx.Exp(complex(0, -2*math.Pi*f*float64(t)))
	}
	return 2 * cmplx.Abs(s) / float64(len(x))
}

// blackmanHarris returns the 4-term Blackman–Harris window of length n,
// whose sidelobes lie 92 dB below the main lobe (Harris, Proc. IEEE 66
// (1978) 51, citation as in uk.mathworks.com/help/signal/ref/blackmanharris.html; the 92 dB figure (memory)), so weak lines stand clear of strong ones.
func blackmanHarris(n int) []float64 {
	w := make([]float64, n)
	for i := range w {
		a := 2 * math.Pi * float64(i) / float64(n)
		w[i] = 0.35875 - 0.48829*math.Cos(a) + 0.14128*math.Cos(2*a) - 0.01168*math.Cos(3*a)
	}
	return w
}

// windowedAmplitude returns the amplitude of a cosine of frequency f in x
// estimated through the Blackman–Harris window at exactly f (no
// scalloping loss): |Σ w_t x_t e^{−2πift}|·2/Σ w_t. Lines further than
// four bins from f contribute less than 1e-4 of their amplitude.
func windowedAmplitude(x []float64, f float64) float64 {
	w := blackmanHarris(len(x))
	var s complex128
	var sw float64
	for t, v := range x {
		s += complex(w[t]*v, 0) * cmplx.Exp(complex(0, -2*math.Pi*f*float64(t)))
		sw += w[t]
	}
	return 2 * cmplx.Abs(s) / sw
}

// spectralPeaks returns the frequencies (cycles per sample, bin k ↦ k/N)
// of the local maxima of the Blackman–Harris periodogram of x whose power
// exceeds rel times the largest, skipping the first minBin bins (the mean
// and its window leakage).
func spectralPeaks(x []float64, rel float64, minBin int) []float64 {
	n := len(x)
	w := blackmanHarris(n)
	y := make([]float64, n)
	for i := range x {
		y[i] = w[i] * x[i]
	}
	c := fourier.NewFFT(n).Coefficients(nil, y)
	p := make([]float64, len(c))
	var top float64
	for k := minBin; k < len(c); k++ {
		p[k] = real(c[k])*real(c[k]) + imag(c[k])*imag(c[k])
		top = math.Max(top, p[k])
	}
	var peaks []float64
	for k := max(minBin, 1); k < len(p)-1; k++ {
		if p[k] > rel*top && p[k] > p[k-1] && p[k] >= p[k+1] {
			peaks = append(peaks, float64(k)/float64(n))
		}
	}
	return peaks
}

// nearest returns the distance from f to the closest element of set.
func nearest(f float64, set []float64) float64 {
	d := math.Inf(1)
	for _, g := range set {
		d = math.Min(d, math.Abs(f-g))
	}
	return d
}

// checkPeriodic fails unless x repeats bit for bit with the whole period
// p samples.
func checkPeriodic(t *testing.T, name string, x []float64, p int) {
	t.Helper()
	for i := p; i < len(x); i++ {
		if math.Float64bits(x[i]) != math.Float64bits(x[i-p]) {
			t.Errorf("%s: x[%d] = %v differs from x[%d] = %v one period earlier", name, i, x[i], i-p, x[i-p])
			return
		}
	}
}

// aliasBound returns the largest change aliasing can make to the measured
// amplitude of harmonic h of a wave sampled with P samples per period,
// whose continuous Fourier series has line amplitudes c(k): the
// harmonics k = mP ± h (m ≥ 1) land on bin h with arbitrary phases, so
// they shift it by at most Σ |c(k)| (for h = 0, the mean, only k = mP
// count). The sum runs to m = 10^5; the tail beyond is below 1e-10 for
// coefficients falling as k^−2.
func aliasBound(c func(k int) float64, h, p int) float64 {
	var b float64
	for m := 1; m <= 100000; m++ {
		if h == 0 {
			b += math.Abs(c(m * p))
			continue
		}
		b += math.Abs(c(m*p+h)) + math.Abs(c(m*p-h))
	}
	return b + 1e-10
}
