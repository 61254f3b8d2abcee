package generators

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/dsp/fourier"
)

// bartlettSE is the standard error of the lag-k sample autocorrelation of
// an AR(1)-like series with lag-one correlation φ and length n, by
// Bartlett's formula: Var ≈ (1/n)[(1+φ²)(1−φ^{2k})/(1−φ²) − 2kφ^{2k}]
// (Bartlett 1946; standard time-series texts).
func bartlettSE(phi float64, k, n int) float64 {
	p2k := math.Pow(phi, 2*float64(k))
	v := ((1+phi*phi)*(1-p2k)/(1-phi*phi) - 2*float64(k)*p2k) / float64(n)
	return math.Sqrt(v)
}

// TestOU: lag-k autocorrelation e^{−kΔ/τ} and stationary variance s²
// (Gillespie, Phys. Rev. E 54 (1996) 2084). n = 2·10^5 at τ = 10, Δ = 1,
// s = 2; autocorrelation tolerance five Bartlett standard errors; the
// sample variance of an AR(1) with φ = e^{−0.1} has relative standard error
// √(2(1+φ²)/(n(1−φ²))) ≈ 0.01 (standard time-series texts); tolerance 5%.
func TestOU(t *testing.T) {
	const n, tau, dt, s = 200000, 10.0, 1.0, 2.0
	x, err := OU{Tau: tau, S: s, Dt: dt}.Generate(n, newRand(51))
	if err != nil {
		t.Fatal(err)
	}
	phi := math.Exp(-dt / tau)
	for _, k := range []int{1, 2, 5, 10, 20} {
		got, want := autocorr(x, k), math.Exp(-float64(k)*dt/tau)
		se := bartlettSE(phi, k, n)
		t.Logf("lag %2d: ρ̂ = %.4f, e^{-kΔ/τ} = %.4f, SE %.4f", k, got, want, se)
		if math.Abs(got-want) > 5*se {
			t.Errorf("lag %d: ρ̂ = %.4f, want %.4f ± %.4f", k, got, want, 5*se)
		}
	}
	v := variance(x)
	t.Logf("variance %.4f, s² = %.4f", v, s*s)
	if math.Abs(v/(s*s)-1) > 0.05 {
		t.Errorf("variance %.4f, want %.4f ± 5%%", v, s*s)
	}
}

// periodogram returns |DFT_k|²/n for k = 1..n/2 − 1 of x times a Hann
// window (the window keeps leakage from the strong low frequencies of
// steep spectra far below the local power: its sidelobes fall as f^{−6} in
// power; standard spectral-analysis practice).
func periodogram(x []float64) []float64 {
	n := len(x)
	w := make([]float64, n)
	for i := range x {
		w[i] = x[i] * 0.5 * (1 - math.Cos(2*math.Pi*float64(i)/float64(n)))
	}
	c := fourier.NewFFT(n).Coefficients(nil, w)
	p := make([]float64, n/2-1)
	for k := range p {
		a := c[k+1]
		p[k] = (real(a)*real(a) + imag(a)*imag(a)) / float64(n)
	}
	return p
}

// logSlope fits log p against log k over k in [lo, hi] (p[k−1] holds
// frequency k) and returns the least-squares slope.
func logSlope(p []float64, lo, hi int) float64 {
	var sx, sy, sxx, sxy, m float64
	for k := lo; k <= hi; k++ {
		x, y := math.Log(float64(k)), math.Log(p[k-1])
		sx += x
		sy += y
		sxx += x * x
		sxy += x * y
		m++
	}
	return (m*sxy - sx*sy) / (m*sxx - sx*sx)
}

// TestPowerLawSlope: the log–log periodogram slope is −β (by construction
// S(f) ∝ f^{−β}; spectral slopes of white, 1/f and Brownian-like noise:
// standard result). Periodograms of R = 16 series of n = 8192 are averaged,
// so each log ordinate has sd ≈ 1/√16 = 0.25; over the ≈ 2000 ordinates
// k = 8..n/4 (log k has variance ≈ 1) the slope's standard error is about
// 0.25/√2000 ≈ 0.006, doubled for the correlation of neighbouring Hann
// ordinates; the tolerance 0.05 is four such errors. The lowest bins
// (k < 8) are dropped: the Hann main lobe (±2 bins) averages the convex
// f^{−β} there and flattens the slope (a bias of the estimator, not of the
// series).
func TestPowerLawSlope(t *testing.T) {
	const n, reps = 8192, 16
	rng := newRand(52)
	for _, beta := range []float64{0, 1, 2} {
		avg := make([]float64, n/2-1)
		for r := 0; r < reps; r++ {
			x, err := PowerLaw{Beta: beta}.Generate(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			for k, v := range periodogram(x) {
				avg[k] += v / reps
			}
		}
		got := logSlope(avg, 8, n/4)
		t.Logf("beta = %g: periodogram slope %.4f", beta, got)
		if math.Abs(got+beta) > 0.05 {
			t.Errorf("beta = %g: slope %.4f, want %.4f ± 0.05", beta, got, -beta)
		}
	}
	if _, err := (PowerLaw{Beta: 3.5}).Generate(10, rng); err == nil {
		t.Error("beta = 3.5 accepted")
	}
}

// TestTelegraph: the sampled two-state process has lag-k autocorrelation
// exp(−k·dt·(1/τ_up + 1/τ_down)) (Machlup, J. Appl. Phys. 25 (1954) 341) and
// up/down runs whose mean length is dt/(1 − P_stay), with
// P_stay,up = π_up + π_down·e^{−κ dt}, κ = 1/τ_up + 1/τ_down, π_up =
// τ_up/(τ_up + τ_down) (derived: the transition probability of Machlup's
// two-state Markov process over dt), which tends to τ_up as dt → 0.
// n = 4·10^5 samples hold ≈ 5700 up and down runs; geometric run lengths
// have sd ≈ mean, so the mean has relative standard error ≈ 1.3%;
// tolerance 6%. Autocorrelation tolerance: five Bartlett standard errors
// with φ = e^{−κ dt} (the sampled process is a two-state Markov chain with
// that lag-one correlation).
func TestTelegraph(t *testing.T) {
	const n, tu, td, dt = 400000, 20.0, 50.0, 1.0
	x, err := Telegraph{TauUp: tu, TauDown: td, Dt: dt, Amplitude: 3}.Generate(n, newRand(53))
	if err != nil {
		t.Fatal(err)
	}
	kappa := 1/tu + 1/td
	phi := math.Exp(-kappa * dt)
	for _, k := range []int{1, 5, 20} {
		got, want := autocorr(x, k), math.Exp(-float64(k)*dt*kappa)
		se := bartlettSE(phi, k, n)
		t.Logf("lag %2d: ρ̂ = %.4f, Machlup %.4f, SE %.4f", k, got, want, se)
		if math.Abs(got-want) > 5*se {
			t.Errorf("lag %d: ρ̂ = %.4f, want %.4f ± %.4f", k, got, want, 5*se)
		}
	}
	var upRuns, downRuns, upLen, downLen float64
	for i := 0; i < n; {
		j := i
		for j < n && x[j] == x[i] {
			j++
		}
		if i > 0 && j < n { // complete runs only
			if x[i] == 3 {
				upRuns++
				upLen += float64(j - i)
			} else {
				downRuns++
				downLen += float64(j - i)
			}
		}
		i = j
	}
	piU, piD := tu/(tu+td), td/(tu+td)
	wantUp := dt / (1 - (piU + piD*phi))
	wantDown := dt / (1 - (piD + piU*phi))
	gotUp, gotDown := upLen/upRuns*dt, downLen/downRuns*dt
	t.Logf("mean up run %.3f (expected %.3f, τ_up = %g), down %.3f (expected %.3f, τ_down = %g); %v up runs", gotUp, wantUp, tu, gotDown, wantDown, td, upRuns)
	if math.Abs(gotUp/wantUp-1) > 0.06 || math.Abs(gotDown/wantDown-1) > 0.06 {
		t.Errorf("mean dwell: up %.3f want %.3f, down %.3f want %.3f", gotUp, wantUp, gotDown, wantDown)
	}
	// Levels are exactly 0 and the amplitude.
	for _, v := range x {
		if v != 0 && v != 3 {
			t.Fatalf("level %v", v)
		}
	}
}

// TestTelegraphSumSpectrum: K sources with log-uniform τ in [1, 10^4]
// (dt = 1) give, on average over the τ draws, S(f) ∝ (atan(πfτ_max) −
// atan(πfτ_min))/(πf) — the Lorentzians 1/(1 + (πfτ)²) of symmetric
// telegraph sources (Machlup 1954) integrated against the 1/τ density
// (McWhorter 1957 (memory); derived). Over f ∈ [10^{−3}, 3·10^{−2}], well
// inside both corners, that curve's log–log slope is −1.01 (computed below
// from the formula). Periodograms of R = 24 series of 2^15 samples (each
// with fresh τ draws) are averaged; the slope is compared with the formula's
// within four standard errors, estimated from the spread of the
// per-replicate slopes.
func TestTelegraphSumSpectrum(t *testing.T) {
	const n, reps, k = 1 << 15, 24, 30
	const tmin, tmax = 1.0, 1e4
	rng := newRand(54)
	lo, hi := n/1000+1, n*3/100
	avg := make([]float64, n/2-1)
	var slopes []float64
	for r := 0; r < reps; r++ {
		x, err := TelegraphSum{K: k, TauMin: tmin, TauMax: tmax, Dt: 1}.Generate(n, rng)
		if err != nil {
			t.Fatal(err)
		}
		p := periodogram(x)
		slopes = append(slopes, logSlope(p, lo, hi))
		for i, v := range p {
			avg[i] += v / reps
		}
	}
	theory := make([]float64, n/2-1)
	for i := range theory {
		f := float64(i+1) / n
		theory[i] = (math.Atan(math.Pi*f*tmax) - math.Atan(math.Pi*f*tmin)) / (math.Pi * f)
	}
	want := logSlope(theory, lo, hi)
	got := logSlope(avg, lo, hi)
	_, se := meanSE(slopes)
	t.Logf("telegraph sum: slope %.4f, formula %.4f, SE %.4f (per-replicate slopes)", got, want, se)
	if math.Abs(got-want) > 4*se || se > 0.05 {
		t.Errorf("slope %.4f, want %.4f ± %.4f", got, want, 4*se)
	}
}

// TestShotNoiseCampbell: mean ν·τ and variance ν·τ/2 (Campbell's theorem,
// analytic) at ν = 0.2, τ = 5, dt = 1 over n = 4·10^5 samples. The samples
// are correlated over ≈ τ, so the effective count is ≈ n/(2τ) = 4·10^4;
// the mean's standard error is then ≈ √(0.5/4·10^4) ≈ 0.0035 (0.4%) and the
// variance's a few per cent of the excess-kurtosis-inflated spread;
// tolerances 2% and 5%.
func TestShotNoiseCampbell(t *testing.T) {
	const n, rate, tau = 400000, 0.2, 5.0
	x, err := ShotNoise{Rate: rate, Tau: tau, Dt: 1}.Generate(n, newRand(55))
	if err != nil {
		t.Fatal(err)
	}
	var m float64
	for _, v := range x {
		m += v
	}
	m /= n
	v := variance(x)
	t.Logf("shot noise: mean %.4f (ντ = %.4f), variance %.4f (ντ/2 = %.4f)", m, rate*tau, v, rate*tau/2)
	if math.Abs(m/(rate*tau)-1) > 0.02 || math.Abs(v/(rate*tau/2)-1) > 0.05 {
		t.Errorf("mean %.4f want %.4f, variance %.4f want %.4f", m, rate*tau, v, rate*tau/2)
	}
}

// TestNonlinearNoises checks the second-order facts the hard negatives are
// built on: GARCH(1,1) has variance ω/(1 − α − β) (Bollerslev 1986) and no
// lag-one correlation while its squares are correlated; the nonlinear
// moving average has zero autocorrelation at every lag (analytic) and
// variance 1 + b²; Student-t with ν = 5 has variance ν/(ν − 2) (standard
// result). n = 4·10^5; a white series' lag-k autocorrelation has standard
// error 1/√n = 0.0016, tolerance 0.01; variance tolerances from the fourth
// moments (GARCH kurtosis ≈ 4.5 at the defaults gives ≈ 1% relative
// error but volatility persistence inflates it several-fold: 6%; NLMA
// and t(5) a few tenths of a per cent to 2%: 3% and 6%).
func TestNonlinearNoises(t *testing.T) {
	const n = 400000
	g, err := GARCH{Omega: 0.1, Alpha: 0.1, Beta: 0.85}.Generate(n, newRand(56))
	if err != nil {
		t.Fatal(err)
	}
	if v := variance(g); math.Abs(v/2-1) > 0.06 {
		t.Errorf("GARCH variance %.4f, want 2", v)
	}
	sq := make([]float64, n)
	for i, v := range g {
		sq[i] = v * v
	}
	if r := autocorr(g, 1); math.Abs(r) > 0.01 {
		t.Errorf("GARCH lag-1 autocorrelation %.4f, want 0", r)
	}
	if r := autocorr(sq, 1); r < 0.05 {
		t.Errorf("GARCH squares lag-1 autocorrelation %.4f, want clearly positive (volatility clustering)", r)
	}
	m, err := NLMA{B: 0.8}.Generate(n, newRand(57))
	if err != nil {
		t.Fatal(err)
	}
	for k := 1; k <= 3; k++ {
		if r := autocorr(m, k); math.Abs(r) > 0.01 {
			t.Errorf("NLMA lag-%d autocorrelation %.4f, want 0", k, r)
		}
	}
	if v := variance(m); math.Abs(v/1.64-1) > 0.03 {
		t.Errorf("NLMA variance %.4f, want 1.64", v)
	}
	st, err := StudentT{Nu: 5}.Generate(n, newRand(58))
	if err != nil {
		t.Fatal(err)
	}
	if v := variance(st); math.Abs(v/(5.0/3)-1) > 0.06 {
		t.Errorf("t(5) variance %.4f, want %.4f", v, 5.0/3)
	}
	t.Logf("GARCH var %.4f, ρ1 %.4f, ρ1(squares) %.4f; NLMA var %.4f ρ1 %.4f; t(5) var %.4f",
		variance(g), autocorr(g, 1), autocorr(sq, 1), variance(m), autocorr(m, 1), variance(st))
}

// TestARMA21 checks the autocorrelation of the oscillatory ARMA(2,1) at
// r = 0.95, period 20, θ = 0.5 against its Yule–Walker recursion
// ρ(k) = φ1ρ(k−1) + φ2ρ(k−2) for k ≥ 2 (Box & Jenkins, standard result),
// with ρ(0), ρ(1) from the closed-form autocovariances of an ARMA(2,1)
// computed here by solving the linear system of the first three
// autocovariance equations. n = 4·10^5; the series is strongly
// correlated (half-life ≈ 14 samples) so the effective count is ≈ n/30 and
// the standard error ≈ 0.01; tolerance 0.04.
func TestARMA21(t *testing.T) {
	const n = 400000
	r, per, th := 0.95, 20.0, 0.5
	p1, p2 := 2*r*math.Cos(2*math.Pi/per), -r*r
	x, err := ARMA21{Phi1: p1, Phi2: p2, Theta: th}.Generate(n, newRand(59))
	if err != nil {
		t.Fatal(err)
	}
	// Autocovariances γ0, γ1, γ2 of x_t = p1 x_{t-1} + p2 x_{t-2} + e_t + θ e_{t-1}:
	// with E[x_t e_t] = 1 and E[x_t e_{t-1}] = p1 + θ,
	// γ0 = p1γ1 + p2γ2 + 1 + θ(p1 + θ)
	// γ1 = p1γ0 + p2γ1 + θ
	// γ2 = p1γ1 + p2γ0
	// Substituting γ2 and γ1 into the first gives γ0 directly.
	c := p1 / (1 - p2) // γ1 = c·γ0 + θ/(1 − p2)
	d := th / (1 - p2)
	// γ0 = p1(cγ0 + d) + p2(p1(cγ0 + d) + p2γ0) + 1 + θ(p1 + θ)
	g0 := (p1*d + p2*p1*d + 1 + th*(p1+th)) / (1 - p1*c - p2*p1*c - p2*p2)
	g1 := c*g0 + d
	rho := []float64{1, g1 / g0}
	for k := 2; k <= 15; k++ {
		rho = append(rho, p1*rho[k-1]+p2*rho[k-2])
	}
	for _, k := range []int{1, 5, 10, 15} {
		got := autocorr(x, k)
		t.Logf("lag %2d: ρ̂ = %+.4f, theory %+.4f", k, got, rho[k])
		if math.Abs(got-rho[k]) > 0.04 {
			t.Errorf("lag %d: ρ̂ = %.4f, want %.4f", k, got, rho[k])
		}
	}
}
