package generators

import (
	"math"
	"testing"
)

// TestHenonGen: the generated series obeys the delay form of the map,
// x_{t+1} = a − x_{t−d+2}² − b·x_{t−d+1} (Baier & Klein 1990), exactly;
// the full spectrum sums to ln b (analytic: |det J| = b, and the
// Gram–Schmidt norms multiply to |det J| each iteration, so the identity
// holds to rounding, tolerance 1e-9); and at a = 1.76, b = 0.1 the map is
// hyperchaotic, λ2 > 0 (Baier & Klein 1990).
func TestHenonGen(t *testing.T) {
	for _, d := range []int{3, 5, 8} {
		m := HenonGen{D: d, A: 1.76, B: 0.1}
		x, err := m.Generate(2000, newRand(uint64(d)))
		if err != nil {
			t.Fatal(err)
		}
		for i := d - 1; i+1 < len(x); i++ {
			want := m.A - x[i-d+2]*x[i-d+2] - m.B*x[i-d+1]
			if math.Abs(x[i+1]-want) > 1e-12 {
				t.Fatalf("d = %d: x[%d] = %v, recurrence gives %v", d, i+1, x[i+1], want)
			}
		}
		sp, err := mapSpectrum(m, m.start(newRand(9)), mapTransient, 20000, d)
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("d = %d: spectrum %v, sum %.9f", d, sp.Exponents, sum(sp.Exponents))
		if math.Abs(sum(sp.Exponents)-math.Log(m.B)) > 1e-9 { // analytic: ln|det J| = ln b
			t.Errorf("d = %d: sum %.9f, want ln b = %.9f", d, sum(sp.Exponents), math.Log(m.B))
		}
		if !(sp.Exponents[1] > 0.02) { // hyperchaos (Baier & Klein 1990)
			t.Errorf("d = %d: λ2 = %.4f, want > 0", d, sp.Exponents[1])
		}
	}
	s, _ := Lookup("henon-gen")
	if c, err := s.Class(map[string]float64{"a": 1.3}); err != nil || c != Regular {
		t.Errorf("a = 1.3: %s (%v), want regular (periodic window)", c, err)
	}
	x, _ := s.Generate(3000, map[string]float64{"a": 1.3}, newRand(1))
	if p := period(x[1000:], 64, 1e-9); p == 0 {
		t.Error("a = 1.3: no period ≤ 64 in the series")
	}
}
