package classifier

import (
	"math"

	"gonum.org/v1/gonum/dsp/fourier"
)

// Thresholds of the drift test (see DriftTest).
const (
	// DriftMinSize is the smallest linear change across the record, in
	// standard deviations of the detrended trace, reported as drift: a
	// ramp of total size D adds D²/12 to the variance (analytic, the
	// variance of a uniform ramp), so 0.35 s.d. adds 1% of the trace's
	// variance; a smaller drift is not worth a warning (common practice).
	DriftMinSize = 0.35
	// DriftZ is how many standard errors the change must lie from zero.
	DriftZ = 4.0
	// driftBlocks is the number of block means the test works on (fewer
	// for shorter traces), driftFitBins the highest Fourier frequency of
	// the block means used to fit the low-frequency spectrum.
	driftBlocks  = 1024
	driftFitBins = 64
)

// eulerGamma is the Euler–Mascheroni constant: E[ln ε] = −γ for an
// exponential variable ε of unit mean.
const eulerGamma = 0.5772156649015329

// DriftResult is the outcome of DriftTest.
type DriftResult struct {
	// Change is the change of the least-squares straight line across the
	// record (its slope times the record length), in units of x; Size is
	// Change in standard deviations of the detrended trace.
	Change, Size float64
	// SE is the standard error of Change under the null of stationary
	// noise whose spectrum at the lowest frequencies follows the power law
	// f^−Beta fitted to them; Z = Change/SE.
	SE, Z, Beta float64
	// Drift reports |Size| ≥ DriftMinSize and |Z| ≥ DriftZ.
	Drift bool
}

// DriftTest tests x for a linear drift across the record against the
// trace's own slow fluctuations.
//
// The series is reduced to M = min(n, 1024) block means y_i (a 5-smooth
// count when n < 1024), and the least-squares slope b̂ = Σ w_i y_i with
// w_i = (i − ī)/Σ(i − ī)² gives Change = b̂·M. Its variance under
// stationary noise of spectral density s(f) is 2∫₀^½ |W(f)|² s(f) df, W
// the Fourier transform of the weights (a ramp: |W| = |D′(2πf)|/Σ(i−ī)²
// with D the Dirichlet kernel). s is estimated from the periodogram of the
// detrended block means: above the 64th Fourier frequency the periodogram
// itself, below it a power law A·(fM)^−β fitted by least squares to the
// log-periodogram at Fourier frequencies 2 … 64 (Geweke & Porter-Hudak,
// J. Time Ser. Anal. 4 (1983) 221: log-periodogram regression, with
// E ln ε = −γ for the exponential scatter of the ordinates) and integrated
// down to zero frequency, so that the wander of 1/f-like noise below the
// record's lowest Fourier frequency counts as noise, not drift. The fit
// skips frequency 1, which the detrending depletes. Generalised least
// squares gains nothing over this slope for a trend in stationary noise
// (Grenander, Ann. Math. Statist. 25 (1954) 252 (memory)).
//
// The exponent is held within [0, 2.9] (the integral converges for β < 3);
// for white noise the lower bound makes the standard error about 16% too
// large, on the safe side. For 1/f noise the test holds as far as the
// power law continues below the record's lowest frequency. Cost O(n) plus
// O(M log M).
func DriftTest(x []float64) DriftResult {
	var res DriftResult
	n := len(x)
	if n < 64 {
		return res
	}
	// Scale: s.d. about the full-resolution least-squares line.
	c := float64(n-1) / 2
	var sy, sty float64
	for i, v := range x {
		sy += v
		sty += (float64(i) - c) * v
	}
	mean := sy / float64(n)
	stt := float64(n) * (float64(n)*float64(n) - 1) / 12
	slope := sty / stt
	var ss float64
	for i, v := range x {
		d := v - mean - slope*(float64(i)-c)
		ss += d * d
	}
	sd := math.Sqrt(ss / float64(n))
	if !(sd > 0) {
		return res
	}

	m := driftBlocks
	if n < driftBlocks {
		m = smooth5Below(n)
	}
	y := make([]float64, m)
	for i := range y {
		lo, hi := i*n/m, (i+1)*n/m
		var s float64
		for _, v := range x[lo:hi] {
			s += v
		}
		y[i] = s / float64(hi-lo)
	}
	e := make([]float64, m)
	detrend(e, y)
	cm := float64(m-1) / 2
	mtt := float64(m) * (float64(m)*float64(m) - 1) / 12
	var b float64
	for i, v := range y {
		b += (float64(i) - cm) * v
	}
	b /= mtt
	res.Change = b * float64(m)
	res.Size = res.Change / sd

	// Periodogram of the detrended block means.
	coef := fourier.NewFFT(m).Coefficients(nil, e)
	half := m / 2
	per := make([]float64, half+1)
	for k := 1; k <= half; k++ {
		per[k] = (real(coef[k])*real(coef[k]) + imag(coef[k])*imag(coef[k])) / float64(m)
	}
	kfit := min(driftFitBins, half)
	// w2 returns |W(v/M)|² for v = f·M.
	w2 := func(v float64) float64 {
		th := 2 * math.Pi * v / float64(m)
		var d float64
		if v*1e3 < 1 {
			d = -th * mtt // D′(θ) ≈ −θ Σu² for θM ≪ 1
		} else {
			fm := float64(m)
			s, co := math.Sincos(th / 2)
			sm, cmm := math.Sincos(fm * th / 2)
			d = (fm/2*cmm*s - sm*co/2) / (s * s)
		}
		d /= mtt
		return d * d
	}
	var varB float64
	for k := kfit + 1; k <= half; k++ {
		t := w2(float64(k)) * per[k]
		if 2*k == m {
			varB += t / float64(m)
		} else {
			varB += 2 * t / float64(m)
		}
	}
	if kfit >= 3 {
		// log-periodogram regression on k = 2 … kfit.
		var sx, sl, sxx, sxl float64
		cnt := 0
		tiny := 1e-300
		for k := 2; k <= kfit; k++ {
			lx, ly := math.Log(float64(k)), math.Log(math.Max(per[k], tiny))
			sx += lx
			sl += ly
			sxx += lx * lx
			sxl += lx * ly
			cnt++
		}
		fc := float64(cnt)
		beta := -(fc*sxl - sx*sl) / (fc*sxx - sx*sx)
		beta = math.Max(0, math.Min(beta, 2.9))
		logA := (sl+beta*sx)/fc + eulerGamma
		res.Beta = beta
		// 2∫₀^{(kfit+½)/M} |W|² A (fM)^−β df = (2A/M) ∫₀^{kfit+½} |W(v/M)|² v^−β dv,
		// composite Simpson with 16 intervals per unit of v.
		top := float64(kfit) + 0.5
		steps := 16 * (kfit + 1)
		h := top / float64(steps)
		var integral float64
		for j := 0; j <= steps; j++ {
			v := float64(j) * h
			if j == 0 {
				continue // the integrand vanishes at 0 for β < 3
			}
			f := w2(v) * math.Pow(v, -beta)
			switch {
			case j == steps:
				integral += f
			case j%2 == 1:
				integral += 4 * f
			default:
				integral += 2 * f
			}
		}
		integral *= h / 3
		varB += 2 * math.Exp(logA) / float64(m) * integral
	} else {
		for k := 1; k <= kfit; k++ {
			varB += 2 * w2(float64(k)) * per[k] / float64(m)
		}
	}
	res.SE = math.Sqrt(varB) * float64(m)
	res.Z = res.Change / res.SE
	if res.SE == 0 {
		res.Z = math.Inf(1)
		if res.Change == 0 {
			res.Z = 0
		}
	}
	res.Drift = math.Abs(res.Size) >= DriftMinSize && math.Abs(res.Z) >= DriftZ
	return res
}
