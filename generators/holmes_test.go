package generators

import (
	"math"
	"testing"
)

// TestHolmes: the series obeys x_{t+2} = −b·x_t + a·x_{t+1} − x_{t+1}³
// (Holmes 1979) exactly; λ1 + λ2 = ln b (analytic: det J = b, tolerance
// 1e-9); the default a = 2.75 is chaotic and a = 2.5 is periodic (a
// periodic orbit in the series, label regular).
func TestHolmes(t *testing.T) {
	m := Holmes{A: 2.75, B: 0.2}
	x, err := m.Generate(2000, newRand(1))
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i+2 < len(x); i++ {
		want := -m.B*x[i] + m.A*x[i+1] - x[i+1]*x[i+1]*x[i+1]
		if math.Abs(x[i+2]-want) > 1e-12 {
			t.Fatalf("x[%d] = %v, recurrence gives %v", i+2, x[i+2], want)
		}
	}
	s, _ := Lookup("holmes")
	sp, err := s.Lyapunov(nil)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("Holmes spectrum %v", sp.Exponents)
	if d := sp.Exponents[0] + sp.Exponents[1] - math.Log(0.2); math.Abs(d) > 1e-9 { // analytic
		t.Errorf("λ1 + λ2 − ln b = %g", d)
	}
	if c, _ := s.Class(map[string]float64{"a": 2.5}); c != Regular {
		t.Errorf("a = 2.5: %s, want regular", c)
	}
	xr, _ := s.Generate(3000, map[string]float64{"a": 2.5}, newRand(2))
	if p := period(xr[1000:], 64, 1e-9); p == 0 {
		t.Error("a = 2.5: no period ≤ 64")
	}
}
