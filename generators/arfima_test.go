package generators

import (
	"math"
	"testing"
)

// TestARFIMAAutocovariance: ARFIMA(0, d, 0) has γ(0) = Γ(1 − 2d)/Γ(1 − d)²
// and ρ(1) = d/(1 − d), ρ(k) = ρ(k−1)(k − 1 + d)/(k − d) (Hosking,
// Biometrika 68 (1981) 165). The autocovariance at lags 0..5, averaged over
// R = 40 series of n = 4096 with the known zero mean (unbiased for an
// exact synthesis), is compared with it within four standard errors taken
// from the spread of the replicates (as TestFGNAutocovariance); ρ(1) is
// checked against the closed form d/(1 − d) directly.
func TestARFIMAAutocovariance(t *testing.T) {
	const n, reps, maxLag = 4096, 40, 5
	for _, d := range []float64{-0.3, 0.2, 0.4} {
		rng := newRand(uint64(360 + 100*d))
		est := make([][]float64, maxLag+1)
		for r := 0; r < reps; r++ {
			x, err := ARFIMA{D: d}.Generate(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			for k := 0; k <= maxLag; k++ {
				var s float64
				for i := 0; i+k < n; i++ {
					s += x[i] * x[i+k]
				}
				est[k] = append(est[k], s/float64(n-k))
			}
		}
		g0 := math.Exp(lgamma(1-2*d) - 2*lgamma(1-d))
		gamma := make([]float64, maxLag+1)
		arfimaAcovFill(d)(gamma)
		if math.Abs(gamma[1]/gamma[0]-d/(1-d)) > 1e-12 || math.Abs(gamma[0]/g0-1) > 1e-12 {
			t.Errorf("d = %g: γ(0) = %g, ρ(1) = %g, want %g and d/(1-d) = %g", d, gamma[0], gamma[1]/gamma[0], g0, d/(1-d))
		}
		for k := 0; k <= maxLag; k++ {
			mean, se := meanSE(est[k])
			if math.Abs(mean-gamma[k]) > 4*se || se > 0.05*g0 {
				t.Errorf("d = %g, lag %d: γ̂ = %.5f ± %.5f, want %.5f", d, k, mean, se, gamma[k])
			}
			if k <= 1 {
				t.Logf("d = %+g, lag %d: γ̂ = %+.5f ± %.5f, Hosking %+.5f", d, k, mean, se, gamma[k])
			}
		}
		m0, _ := meanSE(est[0])
		m1, _ := meanSE(est[1])
		t.Logf("d = %+g: ρ̂(1) = %.4f, d/(1-d) = %.4f", d, m1/m0, d/(1-d))
	}
}

func lgamma(x float64) float64 {
	v, _ := math.Lgamma(x)
	return v
}

// TestARFIMAMovingAverage cross-checks Hosking's closed-form variance
// against the moving-average representation x_t = Σ ψ_j ε_{t−j},
// ψ_j = ψ_{j−1}(j − 1 + d)/j (Hosking 1981): γ(0) = Σ ψ_j² and
// γ(1) = Σ ψ_j ψ_{j+1}, summed to J = 2·10^6 with the tail
// Σ_{j>J} ψ_j² ≈ J^{2d−1}/((1 − 2d)Γ(d)²) added (ψ_j ~ j^{d−1}/Γ(d);
// derived). Tolerance 10^{−5} relative (the neglected next term of the
// tail is O(J^{2d−2})).
func TestARFIMAMovingAverage(t *testing.T) {
	const big = 2000000
	for _, d := range []float64{-0.3, 0.2} {
		var s0, s1 float64
		psi := 1.0
		for j := 1; j <= big+1; j++ {
			next := psi * (float64(j) - 1 + d) / float64(j)
			s0 += psi * psi
			s1 += psi * next
			psi = next
		}
		_, sign := math.Lgamma(d)
		gd := float64(sign) * math.Exp(lgamma(d))
		tail := math.Pow(big, 2*d-1) / ((1 - 2*d) * gd * gd)
		gamma := make([]float64, 2)
		arfimaAcovFill(d)(gamma)
		t.Logf("d = %+g: Σψ² = %.7f (+ tail %.2e), Hosking γ(0) = %.7f; Σψψ' = %.7f, γ(1) = %.7f", d, s0, tail, gamma[0], s1, gamma[1])
		if math.Abs((s0+tail)/gamma[0]-1) > 1e-5 || math.Abs((s1+tail)/gamma[1]-1) > 1e-4 {
			t.Errorf("d = %g: MA sums %.7f, %.7f disagree with γ(0) = %.7f, γ(1) = %.7f", d, s0+tail, s1+tail, gamma[0], gamma[1])
		}
	}
}

// TestARFIMASpectrum: with an AR(1) factor the spectral density is
// S(ω) = |2 sin(ω/2)|^{−2d}/|1 − φe^{−iω}|² (Hosking 1981; Granger & Joyeux
// 1980). Hann periodograms of R = 64 series of n = 8192 at d = 0.3, φ = 0.6
// and at d = −0.35, φ = −0.5 are divided by (3/8)S over bands of 129 bins
// around ω = 0.2, 0.8 and 2.0 rad; the band ratio, averaged over the
// replicates, must be 1 within four standard errors of the replicate
// spread, and that error must be below 5% (so the check has power).
func TestARFIMASpectrum(t *testing.T) {
	const n, reps, half = 8192, 64, 64
	for _, c := range [][2]float64{{0.3, 0.6}, {-0.35, -0.5}} {
		d, phi := c[0], c[1]
		spec := func(k int) float64 {
			w := 2 * math.Pi * float64(k) / n
			return math.Pow(2*math.Sin(w/2), -2*d) / (1 - 2*phi*math.Cos(w) + phi*phi)
		}
		rng := newRand(uint64(370 + 10*phi))
		ratios := make([][]float64, 3)
		for r := 0; r < reps; r++ {
			x, err := ARFIMA{D: d, Phi: phi}.Generate(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			p := periodogram(x)
			for i, w := range []float64{0.2, 0.8, 2.0} {
				k := int(math.Round(w * n / (2 * math.Pi)))
				ratios[i] = append(ratios[i], bandRatio(p, k-half, k+half, spec))
			}
		}
		for i, w := range []float64{0.2, 0.8, 2.0} {
			m, se := meanSE(ratios[i])
			t.Logf("d = %+g, φ = %+g, ω = %.1f: periodogram/S = %.4f ± %.4f", d, phi, w, m, se)
			if math.Abs(m-1) > 4*se || se > 0.05 {
				t.Errorf("d = %g, φ = %g, ω = %g: ratio %.4f ± %.4f, want 1", d, phi, w, m, se)
			}
		}
	}
}

// TestARFIMARange: the circulant embedding of Hosking's autocovariance is
// non-negative definite at the ends of the registry's range for several
// lengths (Davies & Harte 1987 synthesis stays exact), and the output is
// finite; out-of-range parameters are rejected.
func TestARFIMARange(t *testing.T) {
	rng := newRand(380)
	for _, d := range []float64{-0.45, 0.45} {
		for _, phi := range []float64{-0.95, 0, 0.95} {
			for _, n := range []int{1, 2, 999, 4097, 100000} {
				x, err := ARFIMA{D: d, Phi: phi}.Generate(n, rng)
				if err != nil {
					t.Fatalf("d = %g, φ = %g, n = %d: %v", d, phi, n, err)
				}
				for _, v := range x {
					if math.IsNaN(v) || math.IsInf(v, 0) {
						t.Fatalf("d = %g, φ = %g, n = %d: non-finite value", d, phi, n)
					}
				}
			}
		}
	}
	for _, a := range []ARFIMA{{D: 0.5}, {D: -0.5}, {D: 0.2, Phi: 1}, {D: math.NaN()}} {
		if _, err := a.Generate(10, rng); err == nil {
			t.Errorf("%+v accepted", a)
		}
	}
}
