package generators

import (
	"math"
	"testing"
)

// TestJerkAbs: the exponents sum to −A (analytic: constant divergence;
// tolerance 1e-3, RK4's error in the volume growth); A = 0.6 and 0.62 are
// chaotic, the window at A = 0.592 and A = 0.7 periodic (Linz & Sprott
// 1999 (memory): chaotic near A = 0.6; the window and the periodic range
// from 0.645 on were measured when the range was chosen). λ1 at A = 0.6 is
// 0.035 per time unit (Linz & Sprott 1999 (memory)), checked within 15%
// over 2·10^4 time units (0.0356–0.0366 over 5·10^4 from three starts,
// measured). The Jacobian is checked by finite differences on the x < 0
// side, which TestJacobians (states in (0.1, 0.9)) does not reach.
func TestJerkAbs(t *testing.T) {
	for _, tc := range []struct {
		a     float64
		class Class
	}{{0.6, Chaotic}, {0.62, Chaotic}, {0.592, Regular}, {0.7, Regular}} {
		checkFlow(t, "jerk-abs", map[string]float64{"a": tc.a}, tc.class, -tc.a, 1e-3) // analytic
	}
	r := flowRule{h: jerkAbsStep, transient: jerkAbsTransient, renorm: 1}
	sp, err := r.spectrum(JerkAbs{A: 0.6}, []float64{0.1, 0, 0}, 20000, 1)
	if err != nil {
		t.Fatal(err)
	}
	if l := sp.Exponents[0]; math.Abs(l-0.035)/0.035 > 0.15 { // Linz & Sprott (1999) (memory)
		t.Errorf("A = 0.6: λ1 = %.4f, want 0.035 ± 15%%", l)
	}
	// Negative side: the field is affine there, so central differences are
	// exact up to rounding.
	m := JerkAbs{A: 0.6}
	v := []float64{-0.7, 0.3, -0.2}
	j := make([]float64, 9)
	m.jacobian(j, v)
	fp, fm := make([]float64, 3), make([]float64, 3)
	for c := 0; c < 3; c++ {
		vp := append([]float64(nil), v...)
		vm := append([]float64(nil), v...)
		vp[c] += 1e-4
		vm[c] -= 1e-4
		m.eval(fp, vp)
		m.eval(fm, vm)
		for r := 0; r < 3; r++ {
			if num := (fp[r] - fm[r]) / 2e-4; math.Abs(num-j[r*3+c]) > 1e-9 {
				t.Errorf("x < 0: J[%d][%d] = %g, finite difference %g", r, c, j[r*3+c], num)
			}
		}
	}
}
