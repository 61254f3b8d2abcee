package generators

import (
	"math"
	"testing"
)

// TestNoseHoover checks the conservative structure along orbits of the
// sea and of a torus.
//
// Sum of the exponents: the divergence is z and dH/dt = z for
// H = (x² + y² + z²)/2, so Σλ over a span T equals (H(T) − H(0))/T
// exactly for the flow (analytic); RK4 keeps it to its truncation error,
// tolerance 1e-5. Time reversibility makes the spectrum symmetric,
// λ3 = −λ1 and λ2 = 0, up to the same O(1/T) terms (tolerance 0.003).
//
// λ1 in the sea from (0, 5, 0) is 0.014 per time unit (Sprott, Phys. Rev.
// E 50 (1994) R647 (memory)); sticky excursions near the tori make the
// finite-time value wander (0.011 to 0.020 between 3·10^3 and 10^5 time
// units, measured), so 10^4 time units are checked within 30%. The torus
// from (0, 1, 0) has λ1 ≈ 0 and is labelled regular.
func TestNoseHoover(t *testing.T) {
	m := NoseHoover{}
	r := flowRule{h: noseHooverStep, transient: noseHooverTransient, renorm: 1}
	hamilton := func(v []float64) float64 { return (v[0]*v[0] + v[1]*v[1] + v[2]*v[2]) / 2 }
	for _, tc := range []struct {
		x0    []float64
		span  float64
		class Class
	}{
		{[]float64{0, 5, 0}, 10000, Chaotic},
		{[]float64{0, 1, 0}, 3000, Regular},
	} {
		sp, err := r.spectrum(m, tc.x0, tc.span, 3)
		if err != nil {
			t.Fatal(err)
		}
		start, end, span, _ := orbitStats(m, tc.x0, r.h, r.transient, tc.span, r.renorm, hamilton)
		dH := (hamilton(end) - hamilton(start)) / span
		e := sp.Exponents
		t.Logf("from %v: %v, sum %.7f, ΔH/T %.7f", tc.x0, e, sum(e), dH)
		if math.Abs(sum(e)-dH) > 1e-5 { // analytic: Σλ = ⟨z⟩ = ΔH/T
			t.Errorf("from %v: sum %.7f, ΔH/T %.7f", tc.x0, sum(e), dH)
		}
		if math.Abs(e[0]+e[2]) > 0.003 || math.Abs(e[1]) > 0.003 { // time reversibility
			t.Errorf("from %v: spectrum %v not symmetric", tc.x0, e)
		}
		c := Regular
		if e[0] > 0.005 {
			c = Chaotic
		}
		if c != tc.class {
			t.Errorf("from %v: %s, want %s", tc.x0, c, tc.class)
		}
		if tc.class == Chaotic && math.Abs(e[0]-0.014)/0.014 > 0.3 { // Sprott (1994) (memory)
			t.Errorf("sea: λ1 = %.4f, want 0.014 ± 30%%", e[0])
		}
	}
}
