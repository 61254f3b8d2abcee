package generators

import (
	"math"
	"math/cmplx"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// companionRoots returns the roots of z^p − a_1 z^{p−1} − … − a_p, the
// characteristic roots of the AR(p) with coefficients a, as the
// eigenvalues of its companion matrix computed by gonum (a general-purpose
// reference, independent of the pole draw).
func companionRoots(t *testing.T, a []float64) []complex128 {
	p := len(a)
	c := mat.NewDense(p, p, nil)
	for j, v := range a {
		c.Set(0, j, v)
	}
	for i := 1; i < p; i++ {
		c.Set(i, i-1, 1)
	}
	var e mat.Eigen
	if !e.Factorize(c, mat.EigenNone) {
		t.Fatal("eigen decomposition failed")
	}
	return e.Values(nil)
}

// TestRandomARStationary: for every order 1..8, rmax ∈ {0.3, 0.7, 0.98}
// and 100 pole seeds, the characteristic roots of the expanded
// coefficients (gonum eigenvalues of the companion matrix) lie inside the
// disc of radius rmax, the largest exactly on it (the dominant pole), so
// the process is stationary (Box & Jenkins (1970): all roots inside the
// unit circle). Tolerance 10^{−6} (root sensitivity of nearly repeated
// poles is √ε ≈ 10^{−8}). Every shape occurs: the draw covers all pair
// counts 0..⌊p/2⌋ and both signs of real poles. rmax = 0 gives white noise
// (all coefficients zero).
func TestRandomARStationary(t *testing.T) {
	pairCounts := map[[2]int]bool{}
	var neg, pos int
	for order := 1; order <= 8; order++ {
		for _, rmax := range []float64{0.3, 0.7, 0.98} {
			for seed := uint64(0); seed < 100; seed++ {
				g := RandomAR{Order: order, RMax: rmax, PoleSeed: seed}
				a, err := g.Coefficients()
				if err != nil {
					t.Fatal(err)
				}
				poles, _ := g.Poles()
				pairs := 0
				for _, z := range poles {
					switch {
					case imag(z) > 0:
						pairs++
					case imag(z) == 0 && real(z) < 0:
						neg++
					case imag(z) == 0:
						pos++
					}
				}
				pairCounts[[2]int{order, pairs}] = true
				var top float64
				for _, z := range companionRoots(t, a) {
					top = math.Max(top, cmplx.Abs(z))
				}
				if math.Abs(top-rmax) > 1e-6 {
					t.Fatalf("order %d, rmax %g, seed %d: largest root modulus %.9f, want %g", order, rmax, seed, top, rmax)
				}
			}
		}
	}
	for order := 1; order <= 8; order++ {
		for c := 0; c <= order/2; c++ {
			if !pairCounts[[2]int{order, c}] {
				t.Errorf("order %d: %d complex pairs never drawn", order, c)
			}
		}
	}
	if neg == 0 || pos == 0 {
		t.Errorf("real poles: %d negative, %d positive", neg, pos)
	}
	a, err := RandomAR{Order: 8, RMax: 0, PoleSeed: 3}.Coefficients()
	if err != nil {
		t.Fatal(err)
	}
	for _, v := range a {
		if v != 0 {
			t.Errorf("rmax = 0: coefficients %v, want zeros", a)
			break
		}
	}
	for _, g := range []RandomAR{{Order: 0, RMax: 0.5}, {Order: 9, RMax: 0.5}, {Order: 2, RMax: 0.99}, {Order: 2, RMax: math.NaN()}} {
		if _, err := g.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v accepted", g)
		}
	}
}

// arSpectrum returns S(ω) = 1/|1 − Σ a_k e^{−ikω}|² (Box & Jenkins 1970,
// unit innovation variance).
func arSpectrum(a []float64, w float64) float64 {
	z := complex(1, 0)
	for k, v := range a {
		z -= complex(v, 0) * cmplx.Exp(complex(0, -w*float64(k+1)))
	}
	return 1 / (real(z)*real(z) + imag(z)*imag(z))
}

// TestRandomARSpectrum: the Hann periodogram, averaged over R = 32 series
// of n = 8192, divided by (3/8)·S(ω) of the analytic AR spectrum and
// averaged over bands of 65 bins, is 1 within four replicate standard
// errors at the resonance of the dominant pole pair (when there is one)
// and at ω = 0.3, 1.5 and 2.8 rad, for several orders, radii and seeds;
// the standard error must be below 5% so the check has power. The peaks
// (width ≈ 1 − r ≥ 0.1 rad) are far wider than the Hann main lobe
// (4 bins ≈ 0.003 rad), so the window's smoothing bias is negligible.
// At least two cases have a dominant pole pair. The sample variance over
// the R·n samples is also compared with
// γ(0) = (1/2π)∫ S dω (trapezoid rule on 2^16 points: spectrally accurate
// for a periodic analytic integrand), within 5%.
func TestRandomARSpectrum(t *testing.T) {
	const n, reps, half = 8192, 32, 32
	cases := []RandomAR{{Order: 2, RMax: 0.95, PoleSeed: 0}, {Order: 5, RMax: 0.9, PoleSeed: 4}, {Order: 8, RMax: 0.8, PoleSeed: 2}, {Order: 3, RMax: 0.6, PoleSeed: 7}}
	resonances := 0
	for ci, g := range cases {
		a, err := g.Coefficients()
		if err != nil {
			t.Fatal(err)
		}
		poles, _ := g.Poles()
		freqs := []float64{0.3, 1.5, 2.8}
		for _, z := range poles {
			if cmplx.Abs(z) == g.RMax && imag(z) > 0.1 && imag(z) < math.Pi-0.1 {
				freqs = append(freqs, cmplx.Phase(z))
				resonances++
			}
		}
		spec := func(k int) float64 { return arSpectrum(a, 2*math.Pi*float64(k)/n) }
		const grid = 1 << 16
		var g0 float64
		for k := 0; k < grid; k++ {
			g0 += arSpectrum(a, 2*math.Pi*float64(k)/grid) / grid
		}
		rng := newRand(uint64(390 + ci))
		ratios := make([][]float64, len(freqs))
		var ss float64
		for r := 0; r < reps; r++ {
			x, err := g.Generate(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			ss += meanOf(x, func(v float64) float64 { return v * v }) / reps
			p := periodogram(x)
			for i, w := range freqs {
				k := int(math.Round(w * n / (2 * math.Pi)))
				k = min(max(k, half+1), n/2-2-half)
				ratios[i] = append(ratios[i], bandRatio(p, k-half, k+half, spec))
			}
		}
		for i, w := range freqs {
			m, se := meanSE(ratios[i])
			t.Logf("%+v ω = %.3f: periodogram/S = %.4f ± %.4f", g, w, m, se)
			if math.Abs(m-1) > 4*se || se > 0.05 {
				t.Errorf("%+v ω = %.3f: ratio %.4f ± %.4f, want 1", g, w, m, se)
			}
		}
		t.Logf("%+v: variance %.4f, γ(0) = %.4f", g, ss, g0)
		if math.Abs(ss/g0-1) > 0.05 {
			t.Errorf("%+v: variance %.4f, want %.4f", g, ss, g0)
		}
	}
	if resonances < 2 {
		t.Errorf("only %d resonance peaks checked; pick cases with dominant pole pairs", resonances)
	}
}
