package scaling

import (
	"errors"
	"math"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// naiveACF is the direct O(n·maxLag) sum of the same estimator.
func naiveACF(x []float64, maxLag int) []float64 {
	var m float64
	for _, v := range x {
		m += v
	}
	m /= float64(len(x))
	var c0 float64
	for _, v := range x {
		c0 += (v - m) * (v - m)
	}
	r := make([]float64, maxLag+1)
	for k := range r {
		var s float64
		for i := 0; i+k < len(x); i++ {
			s += (x[i] - m) * (x[i+k] - m)
		}
		r[k] = s / c0
	}
	return r
}

// TestACFMatchesNaive checks the FFT route against the direct sum to
// 1e-12 (Wiener–Khinchin theorem; identical estimator, only round-off
// differs), on odd and power-of-two lengths and the full lag range.
func TestACFMatchesNaive(t *testing.T) {
	rng := newRNG(51)
	for _, tc := range []struct{ n, maxLag int }{{3001, 500}, {4096, 4095}, {7, 6}, {1000, 0}} {
		x := make([]float64, tc.n)
		var v float64
		for i := range x {
			v = 0.8*v + rng.NormFloat64()
			x[i] = 50 + v
		}
		got, err := ACF(x, ACFOptions{MaxLag: tc.maxLag})
		if err != nil {
			t.Fatal(err)
		}
		want := naiveACF(x, len(got)-1)
		if tc.maxLag == 0 && len(got) != tc.n/4+1 {
			t.Errorf("default max lag: %d lags, want n/4+1 = %d", len(got), tc.n/4+1)
		}
		for k := range want {
			if math.Abs(got[k]-want[k]) > 1e-12 {
				t.Fatalf("n=%d lag %d: FFT %.17g, direct %.17g", tc.n, k, got[k], want[k])
			}
		}
	}
}

// TestDecayTimeOU checks the 1/e decay time τ/Δ of an Ornstein–Uhlenbeck
// process (lag-k autocorrelation e^{−kΔ/τ}, Gillespie, Phys. Rev. E 54
// (1996) 2084) and the integrated time (1+φ)/(1−φ) with φ = e^{−Δ/τ}
// (analytic: 1 + 2Σφ^k). n = 2^17 samples with τ/Δ = 20: the ACF at lag
// 20 has sd ≈ √(τ_int/n) ≈ 0.012, i.e. ≈ 0.7 lag in the crossing, and the
// integrated time has relative sd ≈ √(2(2M+1)/n) ≈ 0.06 (Sokal 1997
// (memory)); tolerances are 3 sd.
func TestDecayTimeOU(t *testing.T) {
	const tau, dt = 20.0, 1.0
	x, err := generators.OU{Tau: tau, S: 2, Dt: dt}.Generate(1<<17, newRNG(61))
	if err != nil {
		t.Fatal(err)
	}
	r, err := DecayTime(x, DecayOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(r.Time-tau/dt) > 2 {
		t.Errorf("OU τ/Δ = 20: decay time %.2f (lag %d)", r.Time, r.Lag)
	}
	phi := math.Exp(-dt / tau)
	want := (1 + phi) / (1 - phi)
	if !r.WindowConverged || math.Abs(r.Integrated/want-1) > 0.18 {
		t.Errorf("OU: integrated time %.2f (window %d, converged %v), want %.2f", r.Integrated, r.Window, r.WindowConverged, want)
	}
	t.Logf("OU τ/Δ=20: 1/e time %.2f (lag %d); integrated %.2f vs analytic %.2f (window %d)", r.Time, r.Lag, r.Integrated, want, r.Window)

	// White noise decorrelates at lag 1 (analytic: r(k) = 0 for k ≥ 1).
	w, err := DecayTime(white(10000, newRNG(62)), DecayOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if w.Lag != 1 || w.Time > 1 || math.Abs(w.Integrated-1) > 0.15 {
		t.Errorf("white: lag %d, time %.3f, integrated %.3f; want 1, ≤ 1, 1", w.Lag, w.Time, w.Integrated)
	}
}

// TestDecayTimeNoDecay checks the sentinel when the lag range is too short
// for a slowly decaying series.
func TestDecayTimeNoDecay(t *testing.T) {
	x, err := generators.OU{Tau: 500, S: 1, Dt: 1}.Generate(20000, newRNG(63))
	if err != nil {
		t.Fatal(err)
	}
	_, err = DecayTime(x, DecayOptions{MaxLag: 10})
	if !errors.Is(err, ErrNoDecay) {
		t.Errorf("error %v, want ErrNoDecay", err)
	}
}
