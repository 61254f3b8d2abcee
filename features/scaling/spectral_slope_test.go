package scaling

import (
	"math"
	"testing"
)

// fgnSpectrum is the spectral density of unit fGn up to a constant,
// f(λ) ∝ (1 − cos λ)·Σ_k |λ + 2πk|^{−2H−1} at λ = 2πf (Sinai 1976; Beran,
// Statistics for Long-Memory Processes (1994) (memory)); the sum is cut at
// |k| ≤ 2000 (the tail beyond is below 10^−6 relative for H ≥ 0.3).
func fgnSpectrum(h float64) func(f float64) float64 {
	return func(f float64) float64 {
		lam := 2 * math.Pi * f
		var sum float64
		for k := -2000; k <= 2000; k++ {
			sum += math.Pow(math.Abs(lam+2*math.Pi*float64(k)), -2*h-1)
		}
		return (1 - math.Cos(lam)) * sum
	}
}

// bandBeta applies the default band and logarithmic binning of
// SpectralSlope to an exact spectral density, giving the β the estimator
// converges to for segment length l (derived: the exact density of a
// discrete-time process is not a pure power law up to f = 0.25).
func bandBeta(s func(float64) float64, l int) float64 {
	var lf, lp []float64
	kLo, kHi := 2, l/4
	lnLo := math.Log(float64(kLo) / float64(l))
	width := math.Ln10 / 10
	bin := -1
	var sf, sp float64
	cnt := 0
	for k := kLo; k <= kHi; k++ {
		f := float64(k) / float64(l)
		b := int(math.Floor((math.Log(f)-lnLo)/width + 1e-9))
		if b != bin && cnt > 0 {
			lf = append(lf, sf/float64(cnt))
			lp = append(lp, sp/float64(cnt))
			sf, sp, cnt = 0, 0, 0
		}
		bin = b
		sf += math.Log(f)
		sp += math.Log(s(f))
		cnt++
	}
	lf = append(lf, sf/float64(cnt))
	lp = append(lp, sp/float64(cnt))
	return -fitLine(lf, lp).Slope
}

// TestSpectralSlope checks β against the standard results for these
// processes (white 0, fGn 2H − 1, Brownian 2) and, more tightly, against
// the β that the same band and binning give on the exact fGn density.
// n = 2^14 gives segments of 2048 and 15 averaged periodograms; the
// measured seed sd of β is 0.037 (white) to 0.034 (Brownian), so the mean
// of 8 seeds has sd ≈ 0.013. The band curvature of the exact density moves
// β by at most 0.031 from 2H − 1 (H = 0.3). Tolerances: 0.04 (3 sd) against
// the band value, 0.07 (band offset + 3 sd) against 2H − 1, 0.05 for white
// and Brownian noise.
func TestSpectralSlope(t *testing.T) {
	const n, seeds = 1 << 14, 8
	for _, h := range []float64{0.3, 0.5, 0.7, 0.9} {
		var mean float64
		for s := uint64(1); s <= seeds; s++ {
			r, err := SpectralSlope(fgnSeed(t, n, h, s), SlopeOptions{})
			if err != nil {
				t.Fatal(err)
			}
			if r.Segment != 2048 || r.Segments != 15 {
				t.Fatalf("segment %d × %d, want 2048 × 15 (n/8, 50%% overlap)", r.Segment, r.Segments)
			}
			mean += r.Beta / seeds
		}
		want := 2*h - 1 // fGn: β = 2H − 1, standard result
		band := bandBeta(fgnSpectrum(h), 2048)
		if math.Abs(mean-want) > 0.07 {
			t.Errorf("fGn H=%.1f: mean β = %.3f, want 2H−1 = %.2f ± 0.07", h, mean, want)
		}
		if math.Abs(mean-band) > 0.04 {
			t.Errorf("fGn H=%.1f: mean β = %.3f, exact density over the band gives %.3f", h, mean, band)
		}
		t.Logf("fGn H=%.1f: mean β = %.3f (2H−1 = %.2f, exact density in band %.3f)", h, mean, want, band)
	}

	var wb, bb float64
	var last SlopeResult
	for s := uint64(1); s <= seeds; s++ {
		x := white(n, newRNG(200+s))
		w, err := SpectralSlope(x, SlopeOptions{})
		if err != nil {
			t.Fatal(err)
		}
		b, err := SpectralSlope(cumsum(x), SlopeOptions{})
		if err != nil {
			t.Fatal(err)
		}
		wb += w.Beta / seeds
		bb += b.Beta / seeds
		last = w
	}
	// White noise: β = 0 (standard result).
	if math.Abs(wb) > 0.05 {
		t.Errorf("white: mean β = %.3f, want 0 ± 0.05", wb)
	}
	// Brownian motion: β = 2 (standard result); the exact random-walk
	// density 1/(4 sin²πf) over the band gives the value logged below.
	bmBand := bandBeta(func(f float64) float64 { return 1 / (4 * math.Pow(math.Sin(math.Pi*f), 2)) }, 2048)
	if math.Abs(bb-2) > 0.05 {
		t.Errorf("brownian: mean β = %.3f, want 2 ± 0.05", bb)
	}
	t.Logf("white mean β = %.3f (band %.4g…%.4g, %d points); brownian mean β = %.3f (exact density in band %.3f)",
		wb, last.FMin, last.FMax, last.Points, bb, bmBand)
}

// TestWelchParseval checks the normalisation: for white noise of variance
// σ², the one-sided density is 2σ² at every 0 < f < ½ (Parseval); the mean
// over 1023 frequencies of 15 averaged segments has relative sd ≈ 0.7%,
// so 3% is ample. A unit sinusoid's peak must sit at its frequency.
func TestWelchParseval(t *testing.T) {
	x := white(1<<14, newRNG(41))
	for i := range x {
		x[i] *= 3
	}
	sp, err := Welch(x, WelchOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var m float64
	for k := 1; k < len(sp.Power)-1; k++ {
		m += sp.Power[k]
	}
	m /= float64(len(sp.Power) - 2)
	if math.Abs(m/18-1) > 0.03 {
		t.Errorf("white σ=3: mean one-sided density %.3f, want 2σ² = 18", m)
	}
	y := make([]float64, 4096)
	for i := range y {
		y[i] = math.Sin(2 * math.Pi * 0.125 * float64(i))
	}
	sp, err = Welch(y, WelchOptions{Segment: 512})
	if err != nil {
		t.Fatal(err)
	}
	best := 0
	for k := range sp.Power {
		if sp.Power[k] > sp.Power[best] {
			best = k
		}
	}
	if sp.Freq[best] != 0.125 {
		t.Errorf("sinusoid at f = 0.125: peak at %g", sp.Freq[best])
	}
}
