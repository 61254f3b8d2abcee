package generators

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestNoisyOscillatorStep: the one-sample transition matrix M equals
// e^{A} computed by gonum's mat.Exp (a general-purpose reference) for
// A = [[0, 1], [−ω0², −γ]], across Q from critical damping (0.5, and just
// above it, where the closed form switches between series and
// trigonometric branches) to 50 and periods 4 to 10^5; and the noise
// covariance Σ from quadrature satisfies the discrete Lyapunov identity
// P = M P Mᵀ + Σ for the stationary covariance P = diag(1, ω0²) (derived:
// stationarity of X_{k+1} = M X_k + noise). Tolerances 10^{−12} absolute on
// M and 10^{−12} relative to P on the identity (the identity is evaluated
// only where P − MPMᵀ does not cancel, period ≤ 100).
func TestNoisyOscillatorStep(t *testing.T) {
	for _, q := range []float64{0.5, 0.5 + 1e-9, 0.5 + 1e-4, 0.7, 3, 50} {
		for _, period := range []float64{4, 7.3, 20, 100, 1e5} {
			g := NoisyOscillator{Q: q, Period: period}
			m, s11, s12, s22 := g.oscStep()
			w0 := 2 * math.Pi / period
			gam := w0 / q
			var ref mat.Dense
			ref.Exp(mat.NewDense(2, 2, []float64{0, 1, -w0 * w0, -gam}))
			for i := 0; i < 4; i++ {
				if d := math.Abs(m[i] - ref.At(i/2, i%2)); d > 1e-12 {
					t.Errorf("Q = %g, period = %g: M[%d] = %.15g, mat.Exp %.15g", q, period, i, m[i], ref.At(i/2, i%2))
				}
			}
			if period > 100 {
				continue
			}
			p := [2]float64{1, w0 * w0}
			// (M P Mᵀ)_{ij} = Σ_k M_ik P_k M_jk
			mpm := func(i, j int) float64 { return m[2*i]*p[0]*m[2*j] + m[2*i+1]*p[1]*m[2*j+1] }
			r11, r12, r22 := p[0]-mpm(0, 0)-s11, -mpm(0, 1)-s12, p[1]-mpm(1, 1)-s22
			if math.Abs(r11) > 1e-12 || math.Abs(r12) > 1e-12*w0 || math.Abs(r22) > 1e-12*w0*w0 {
				t.Errorf("Q = %g, period = %g: Lyapunov residuals %g, %g, %g", q, period, r11, r12, r22)
			}
		}
	}
}

// oscAliased is the spectrum of the sampled oscillator: Σ_m S(ω + 2πm)
// with S(ω) = σ²/((ω0² − ω²)² + γ²ω²), σ² = 2γω0² (unit variance),
// summed over |m| ≤ 200 (terms fall as m^{−4}).
func oscAliased(q, period, w float64) float64 {
	w0 := 2 * math.Pi / period
	gam := w0 / q
	var s float64
	for m := -200; m <= 200; m++ {
		v := w + 2*math.Pi*float64(m)
		d := w0*w0 - v*v
		s += 2 * gam * w0 * w0 / (d*d + gam*gam*v*v)
	}
	return s
}

// TestNoisyOscillatorSpectrum: the spectrum of the series is the squared
// transfer function of the driven damped oscillator, aliased by sampling
// (standard result; oscAliased). For Q = 20 and period 50 samples (peak
// at ω0√(1 − 1/(2Q²)), half-power width ≈ γ = ω0/Q = 0.0063 rad ≈ 33 bins
// at n = 2^15), Hann periodograms of R = 64 series are compared with
// (3/8)·S_d: (1) the band ratio over ±γ/2 around the peak, ±γ/4 around
// the two half-power points and ±64 bins around ω = 1 (far off the peak)
// is 1 within four replicate standard errors, which must be below 5%; (2) the centroid and the rms width of the
// averaged periodogram over ω0 ± 3γ equal those of the analytic spectrum
// over the same band within 2% of γ and 3% respectively. Also the lag-k
// autocorrelation of one series of n = 4·10^5 at Q = 2, period 12 matches
// e^{−γk/2}(cos ω_d k + (γ/2ω_d) sin ω_d k) within 0.01 (several Bartlett
// standard errors of a correlation decaying within ≈ 4 samples).
func TestNoisyOscillatorSpectrum(t *testing.T) {
	const n, reps, q, period = 1 << 15, 64, 20.0, 50.0
	w0 := 2 * math.Pi / period
	gam := w0 / q
	binOf := func(w float64) int { return int(math.Round(w * n / (2 * math.Pi))) }
	freqOf := func(k int) float64 { return 2 * math.Pi * float64(k) / n }
	specTab := make([]float64, n/2)
	for k := range specTab {
		specTab[k] = oscAliased(q, period, freqOf(k))
	}
	spec := func(k int) float64 { return specTab[k] }
	// Analytic peak and half-power points of S_d, located on the bin grid.
	peak := binOf(w0)
	for spec(peak+1) > spec(peak) {
		peak++
	}
	for spec(peak-1) > spec(peak) {
		peak--
	}
	lo, hi := peak, peak
	for spec(lo) > spec(peak)/2 {
		lo--
	}
	for spec(hi) > spec(peak)/2 {
		hi++
	}
	t.Logf("analytic peak at ω = %.5f (ω0√(1-1/2Q²) = %.5f), half-power width %.5f (γ = %.5f)", freqOf(peak), w0*math.Sqrt(1-1/(2*q*q)), freqOf(hi-lo), gam)
	halfBand := binOf(gam / 2)
	bands := map[string][2]int{
		"peak":       {peak - halfBand, peak + halfBand},
		"lower half": {lo - halfBand/2, lo + halfBand/2},
		"upper half": {hi - halfBand/2, hi + halfBand/2},
		"far":        {binOf(1) - 64, binOf(1) + 64},
	}
	wide := binOf(3 * gam)
	moments := func(p func(k int) float64) (c, w float64) {
		var s0, s1, s2 float64
		for k := peak - wide; k <= peak+wide; k++ {
			f := freqOf(k)
			s0 += p(k)
			s1 += p(k) * f
			s2 += p(k) * f * f
		}
		c = s1 / s0
		return c, math.Sqrt(s2/s0 - c*c)
	}
	ratios := map[string][]float64{}
	var cents, widths []float64
	rng := newRand(480)
	for r := 0; r < reps; r++ {
		x, err := NoisyOscillator{Q: q, Period: period}.Generate(n, rng)
		if err != nil {
			t.Fatal(err)
		}
		p := periodogram(x)
		for name, b := range bands {
			ratios[name] = append(ratios[name], bandRatio(p, b[0], b[1], spec))
		}
		c, w := moments(func(k int) float64 { return p[k-1] })
		cents = append(cents, c)
		widths = append(widths, w)
	}
	for name := range bands {
		m, se := meanSE(ratios[name])
		t.Logf("%s band: periodogram/S = %.4f ± %.4f", name, m, se)
		if math.Abs(m-1) > 4*se || se > 0.05 {
			t.Errorf("%s band: ratio %.4f ± %.4f, want 1", name, m, se)
		}
	}
	wantC, wantW := moments(spec)
	gotC, _ := meanSE(cents)
	gotW, _ := meanSE(widths)
	t.Logf("peak centroid %.5f (analytic %.5f), rms width %.5f (analytic %.5f)", gotC, wantC, gotW, wantW)
	if math.Abs(gotC-wantC) > 0.02*gam || math.Abs(gotW/wantW-1) > 0.03 {
		t.Errorf("centroid %.5f want %.5f; width %.5f want %.5f", gotC, wantC, gotW, wantW)
	}

	// Autocorrelation in the time domain.
	const q2, per2, n2 = 2.0, 12.0, 400000
	x, err := NoisyOscillator{Q: q2, Period: per2}.Generate(n2, newRand(481))
	if err != nil {
		t.Fatal(err)
	}
	w02 := 2 * math.Pi / per2
	g2 := w02 / q2
	wd := math.Sqrt(w02*w02 - g2*g2/4)
	for _, k := range []int{1, 2, 3, 6, 10} {
		kf := float64(k)
		want := math.Exp(-g2*kf/2) * (math.Cos(wd*kf) + g2/(2*wd)*math.Sin(wd*kf))
		got := autocorr(x, k)
		t.Logf("Q = %g, period %g, lag %d: ρ̂ = %+.4f, analytic %+.4f", q2, per2, k, got, want)
		if math.Abs(got-want) > 0.01 {
			t.Errorf("lag %d: ρ̂ = %.4f, want %.4f", k, got, want)
		}
	}
	if v := variance(x); math.Abs(v-1) > 0.02 {
		t.Errorf("variance %.4f, want 1", v)
	}
	for _, g := range []NoisyOscillator{{Q: 0.4, Period: 10}, {Q: 5, Period: 0}, {Q: math.NaN(), Period: 10}} {
		if _, err := g.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v accepted", g)
		}
	}
}
