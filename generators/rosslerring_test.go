package generators

import (
	"math"
	"testing"
)

// TestRosslerRing checks the ring against the single Rössler flow and its
// volume law.
//
// Uncoupled limit (exact): with ε = 0 and Δ = 0 every oscillator is the
// Rössler flow at a = b = 0.2, and the ring's arithmetic reduces to the
// Rössler field's operation for operation, so x_0 equals the Rössler x
// series from oscillator 0's start bit for bit, and the mean field equals
// the mean of the N Rössler series (to rounding of the sum, 1e-12).
//
// Volume (analytic, Liouville's formula): the exponents sum to the time
// average of the divergence N(a − 2ε − c) + Σ x_i along the orbit. At the
// production step 0.05 RK4 misses the strongest contraction rates
// (h·|x_i − c| up to about 0.5 while z_i decays) by about 0.1% of the sum,
// so the check runs at step 0.01 (error below 1e-3 per time unit on a sum
// near −16.6, measured 2e-5).
//
// Regimes: at the defaults (c = 5.7, ε = Δ = 0.05, N = 5) several
// exponents are positive (three above 0.01 per time unit over 3000 time
// units, measured 0.056, 0.025, 0.013); c = 3, where each oscillator alone
// has a period-1 orbit (Rössler 1976), gives λ1 ≈ 0 (regular).
func TestRosslerRing(t *testing.T) {
	const n = 400
	rng := newRand(3)
	ring := RosslerRing{N: 4, C: 5.7, Dt: 0.3}
	x, err := ring.Generate(n, newRand(3))
	if err != nil {
		t.Fatal(err)
	}
	ring.Obs = 1
	xm, err := ring.Generate(n, newRand(3))
	if err != nil {
		t.Fatal(err)
	}
	start := ring.start(rng)
	mean := make([]float64, n)
	for i := 0; i < ring.N; i++ {
		xi, err := sampleFlow("rossler", Rossler{A: 0.2, B: 0.2, C: 5.7}, start[3*i:3*i+3], n, 0.3, rosslerRingStep, rosslerRingTransient, 0)
		if err != nil {
			t.Fatal(err)
		}
		for k := range xi {
			if i == 0 && xi[k] != x[k] {
				t.Fatalf("uncoupled x_0 differs from the Rössler series at %d: %v vs %v", k, x[k], xi[k])
			}
			mean[k] += xi[k] / float64(ring.N)
		}
	}
	for k := range mean {
		if math.Abs(mean[k]-xm[k]) > 1e-12*(1+math.Abs(mean[k])) {
			t.Fatalf("uncoupled mean field differs at %d: %v vs %v", k, xm[k], mean[k])
		}
	}

	m := RosslerRing{N: 3, Eps: 0.1, Spread: 0.05, C: 5.7}.withOmegas()
	x0 := rosslerRingClassStart(map[string]float64{"n": 3})
	r := flowRule{h: 0.01, transient: rosslerRingTransient, renorm: 1}
	sp, err := r.spectrum(m, x0, 500, 0)
	if err != nil {
		t.Fatal(err)
	}
	div := func(v []float64) float64 {
		s := float64(m.N) * (rosslerRingA - 2*m.Eps - m.C)
		for i := 0; i < m.N; i++ {
			s += v[3*i]
		}
		return s
	}
	_, _, _, avg := orbitStats(m, x0, r.h, r.transient, 500, r.renorm, div)
	t.Logf("N = 3: Σλ = %.6f, mean divergence %.6f", sum(sp.Exponents), avg)
	if math.Abs(sum(sp.Exponents)-avg) > 1e-3 { // Liouville
		t.Errorf("Σλ = %.6f, mean divergence %.6f", sum(sp.Exponents), avg)
	}

	s, err := Lookup("rossler-ring")
	if err != nil {
		t.Fatal(err)
	}
	def := RosslerRing{N: 5, Eps: 0.05, Spread: 0.05, C: 5.7}.withOmegas()
	rule := flowRule{h: rosslerRingStep, transient: rosslerRingTransient, renorm: 1}
	sd, err := rule.spectrum(def, rosslerRingClassStart(map[string]float64{"n": 5}), 3000, 4)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("defaults: %v", sd.Exponents)
	if !(sd.Exponents[2] > 0.01) {
		t.Errorf("defaults: leading exponents %v, want three above 0.01", sd.Exponents)
	}
	if c, err := s.Class(map[string]float64{"c": 3}); err != nil || c != Regular {
		t.Errorf("c = 3: %s (%v), want regular", c, err)
	}
	if c, err := s.computeClass(s.Defaults()); err != nil || c != Chaotic {
		t.Errorf("defaults (computed): %s (%v), want chaotic", c, err)
	}
}
