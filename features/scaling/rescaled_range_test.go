package scaling

import (
	"math"
	"testing"
)

// TestRescaledRangeFractionalGaussianNoise checks H within 0.1 for fGn at
// n = 2^14 with the Anis–Lloyd correction (Hurst 1951; Anis & Lloyd,
// Biometrika 63 (1976) 111; confirmed: neuropsychology/NeuroKit neurokit2/complexity/fractal_hurst.py). R/S is noisier than DFA (seed sd
// about 0.03 here) and known to underestimate strongly persistent noise, so
// the mean over 8 seeds is checked (sd ≈ 0.01).
func TestRescaledRangeFractionalGaussianNoise(t *testing.T) {
	const n, seeds = 1 << 14, 8
	for _, h := range []float64{0.3, 0.5, 0.7, 0.9} {
		var mean float64
		for s := uint64(1); s <= seeds; s++ {
			r, err := RescaledRange(fgnSeed(t, n, h, s), RSOptions{})
			if err != nil {
				t.Fatal(err)
			}
			mean += r.H / seeds
		}
		// fGn: H with small-sample correction, Anis & Lloyd (1976), as in neuropsychology/NeuroKit neurokit2/complexity/fractal_hurst.py.
		if math.Abs(mean-h) > 0.1 {
			t.Errorf("R/S fGn H=%.1f: mean estimate %.3f, want ± 0.1", h, mean)
		}
		t.Logf("R/S fGn H=%.1f: mean estimate %.3f", h, mean)
	}
}

// TestExpectedRSMonteCarlo checks the Anis–Lloyd expectation against the
// Monte Carlo mean R/S of i.i.d. Gaussian blocks cut from 2^20 samples per
// block length, within 4 Monte Carlo standard errors (computed from the
// blocks themselves). At n = 8 Peters' factor (n − ½)/n moves the
// expectation by 6%, far outside that band, which shows that with S taken
// with divisor n the plain Anis–Lloyd formula is the exact one.
func TestExpectedRSMonteCarlo(t *testing.T) {
	rng := newRNG(9)
	for _, n := range []int{8, 16, 64, 256} {
		x := white(1<<20, rng)
		var s, ss float64
		k := 0
		for b := 0; b+n <= len(x); b += n {
			v, _ := blockRS(x[b:b+n], 0)
			s += v
			ss += v * v
			k++
		}
		mc := s / float64(k)
		se := math.Sqrt((ss/float64(k) - mc*mc) / float64(k))
		al := ExpectedRS(n, false) // Anis & Lloyd (1976), formula as in neuropsychology/NeuroKit neurokit2/complexity/fractal_hurst.py
		if math.Abs(mc-al) > 4*se {
			t.Errorf("n=%d: Monte Carlo E[R/S] = %.4f ± %.4f, Anis–Lloyd %.4f", n, mc, se, al)
		}
		alp := ExpectedRS(n, true)
		if n == 8 && math.Abs(mc-alp) < 4*se {
			t.Errorf("n=8: Peters-corrected %.4f is within the Monte Carlo band %.4f ± %.4f", alp, mc, se)
		}
		t.Logf("n=%d: Monte Carlo %.4f ± %.4f, Anis–Lloyd %.4f, with Peters %.4f", n, mc, se, al, alp)
	}
}

// TestExpectedRSAsymptote checks E[R/S] → √(πn/2) (the expected range of
// a Brownian bridge, Feller, Ann. Math. Stat. 22 (1951) 427; cited as such in mne-tools/mne-features mne_features/tests/test_univariate.py); the
// finite-n correction is O(n^{−1/2}), about 0.3% at n = 10^5.
func TestExpectedRSAsymptote(t *testing.T) {
	n := 100000
	ratio := ExpectedRS(n, false) / math.Sqrt(math.Pi*float64(n)/2)
	if math.Abs(ratio-1) > 0.01 {
		t.Errorf("E[R/S](%d)/√(πn/2) = %.5f, want 1 ± 0.01", n, ratio)
	}
	if !math.IsNaN(ExpectedRS(1, false)) {
		t.Errorf("ExpectedRS(1) should be NaN")
	}
}

// TestRescaledRangeCorrections checks that the classical (uncorrected)
// estimate of white noise is biased upwards at short blocks while the
// Anis–Lloyd-corrected one is not (Anis & Lloyd 1976, as in neuropsychology/NeuroKit neurokit2/complexity/fractal_hurst.py: the bias of
// the classical estimate is what the correction removes).
func TestRescaledRangeCorrections(t *testing.T) {
	x := white(1<<14, newRNG(21))
	al, err := RescaledRange(x, RSOptions{MinWindow: 8})
	if err != nil {
		t.Fatal(err)
	}
	none, err := RescaledRange(x, RSOptions{MinWindow: 8, Correction: CorrectionNone})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(al.H-0.5) > 0.05 {
		t.Errorf("corrected H of white noise = %.3f, want 0.5 ± 0.05", al.H)
	}
	if none.H < al.H+0.03 {
		t.Errorf("classical H = %.3f not above corrected %.3f", none.H, al.H)
	}
	t.Logf("white noise: corrected H = %.3f, classical %.3f", al.H, none.H)
}
