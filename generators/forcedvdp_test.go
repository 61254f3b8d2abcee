package generators

import (
	"math"
	"testing"
)

// TestForcedVdpRegimes: the spectrum of the forced van der Pol oscillator
// (all three exponents; the forcing phase contributes an exact zero)
// tells its regimes apart:
//   - unforced (A = 0): the limit cycle times the free phase, two zero
//     exponents and one negative (analytic);
//   - weak forcing off resonance (the defaults, ω = golden mean): a 2-torus,
//     again two zero exponents and one negative;
//   - forcing near the natural frequency (ω = 1.05, A = 1): 1:1 frequency
//     locking, a periodic orbit with one zero exponent (the phase) and two
//     negative ones; the orbit then repeats every forcing period, so
//     sampling once per period gives a constant series;
//   - strong forcing of a strongly nonlinear oscillator (μ = 5, A = 5,
//     ω = 2.47): chaotic, λ1 > 0 (Parlitz & Lauterborn, Phys. Rev. A 36
//     (1987) 1428 (memory) report chaotic windows near ω ≈ 2.45–2.5 at
//     these μ and A; the rule finds λ1 ≈ 0.12 here).
//
// In every regime the exponents sum to the average of the divergence
// μ(1 − x²) along the same orbit (Liouville, analytic) within 1e−4 (the
// RK4 volume error and the trapezoid rule on the integration grid).
func TestForcedVdpRegimes(t *testing.T) {
	tests := []struct {
		name  string
		m     ForcedVanDerPol
		zeros int // exponents with |λ| < 0.01
		class Class
	}{
		{"unforced", ForcedVanDerPol{Mu: 1, A: 0, Omega: GoldenMean}, 2, Regular},
		{"torus", ForcedVanDerPol{Mu: 1, A: 0.5, Omega: GoldenMean}, 2, Regular},
		{"locked", ForcedVanDerPol{Mu: 1, A: 1, Omega: 1.05}, 1, Regular},
		{"chaotic", ForcedVanDerPol{Mu: 5, A: 5, Omega: 2.47}, 1, Chaotic},
	}
	s, _ := Lookup("forced-vdp")
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			x0 := []float64{1, 0, 0}
			sp, err := forcedVdpRule.spectrum(tc.m, x0, forcedVdpRule.span, 3)
			if err != nil {
				t.Fatal(err)
			}
			e := sp.Exponents
			zeros := 0
			for _, l := range e {
				if math.Abs(l) < 0.01 {
					zeros++
				}
			}
			div := divergenceAverage(tc.m, x0, forcedVdpRule, sp.Span, func(v []float64) float64 { return tc.m.Mu * (1 - v[0]*v[0]) })
			t.Logf("spectrum %.4f, sum %.5f, mean divergence %.5f", e, spectrumSum(sp), div)
			if math.Abs(spectrumSum(sp)-div) > 1e-4 { // Liouville, analytic
				t.Errorf("exponents sum to %.5f, mean divergence %.5f", spectrumSum(sp), div)
			}
			if tc.class == Regular && (zeros != tc.zeros || !(e[len(e)-1] < -0.05)) {
				t.Errorf("spectrum %v: %d zero exponents, want %d and a negative one", e, zeros, tc.zeros)
			}
			if tc.class == Chaotic && !(e[0] > 0.05) {
				t.Errorf("λ1 = %.4f, want > 0.05", e[0])
			}
			set := map[string]float64{"mu": tc.m.Mu, "a": tc.m.A, "omega": tc.m.Omega}
			if c, err := s.Class(set); err != nil || c != tc.class {
				t.Errorf("class %s (%v), want %s", c, err, tc.class)
			}
		})
	}
	// 1:1 locking: one sample per forcing period is a fixed point of the
	// stroboscopic map.
	m := ForcedVanDerPol{Mu: 1, A: 1, Omega: 1.05, Obs: 0}
	m.Dt = 2 * math.Pi / m.Omega
	x, err := m.Generate(50, newRand(2))
	if err != nil {
		t.Fatal(err)
	}
	for i := 1; i < len(x); i++ {
		if math.Abs(x[i]-x[0]) > 1e-6 {
			t.Fatalf("locked orbit sampled once per forcing period: x[%d] = %.9f, x[0] = %.9f", i, x[i], x[0])
		}
	}
}
