package generators

import "testing"

// TestThomas: the exponents sum to −3b (analytic: constant divergence,
// tolerance 1e-3); b = 0.18 and b = 0.1 are weakly chaotic (λ1 of a few
// hundredths per time unit) and b = 0.25 periodic (Thomas 1999: periodic
// above b ≈ 0.21). The cyclic symmetry of the equations maps the orbit
// from (x, y, z) onto the orbit from (y, z, x) with the coordinates
// permuted, checked bit for bit on generated series.
func TestThomas(t *testing.T) {
	for _, tc := range []struct {
		b     float64
		class Class
	}{{0.18, Chaotic}, {0.1, Chaotic}, {0.25, Regular}} {
		checkFlow(t, "thomas", map[string]float64{"b": tc.b}, tc.class, -3*tc.b, 1e-3) // analytic
	}
	m := Thomas{B: 0.18, Dt: 0.5}
	a, _ := sampleFlow("thomas", m, []float64{0.3, -0.7, 1.1}, 200, m.Dt, thomasStep, 0, 0)
	b, _ := sampleFlow("thomas", m, []float64{-0.7, 1.1, 0.3}, 200, m.Dt, thomasStep, 0, 2)
	for i := range a {
		if a[i] != b[i] {
			t.Fatalf("cyclic symmetry broken at %d: %v vs %v", i, a[i], b[i])
		}
	}
}
