package generators

import (
	"errors"
	"math"
	"testing"
)

// TestGenesioTesi: the exponents sum to −C (analytic: constant divergence,
// tolerance 1e-3); the defaults (A = 1, B = 1.1, C = 0.44; Genesio & Tesi
// 1992 (memory)) and C = 0.47 are chaotic, C = 0.5 and C = 0.7 periodic,
// and C = 0.40 lies below the escape edge, where Generate and the label
// rule report ErrDiverged (all measured when the ranges were chosen).
//
// Scaling (analytic): x(t) = A·X(A^{1/3}·t) maps solutions of
// d³X/dt³ + C₁·d²X/dt² + B₁·dX/dt + X = X² with C₁ = C·A^{−1/3},
// B₁ = B·A^{−2/3} onto solutions of the equation at (A, B, C). Two
// integrations from corresponding starts, over the first 40 time units of
// the spiral away from the unstable origin, agree to 1e-6 relative to the
// orbit's size (RK4 at step 0.001 in x's time, the same number of steps in
// both; the two differ only by rounding).
func TestGenesioTesi(t *testing.T) {
	for _, tc := range []struct {
		c     float64
		class Class
	}{{0.44, Chaotic}, {0.47, Chaotic}, {0.5, Regular}, {0.7, Regular}} {
		checkFlow(t, "genesio-tesi", map[string]float64{"c": tc.c}, tc.class, -tc.c, 1e-3) // analytic
	}
	m := GenesioTesi{A: 1, B: 1.1, C: 0.40, Dt: 0.1}
	if _, err := m.Generate(100, newRand(1)); !errors.Is(err, ErrDiverged) {
		t.Errorf("C = 0.40: Generate gave %v, want ErrDiverged", err)
	}
	r := flowRule{h: genesioTesiStep, transient: genesioTesiTransient, span: 2000, renorm: 1}
	if _, err := r.spectrum(m, []float64{0.1, -0.05, 0.08}, r.span, 1); !errors.Is(err, ErrDiverged) {
		t.Errorf("C = 0.40: label rule gave %v, want ErrDiverged", err)
	}

	const a, b, c = 0.9, 1.05, 0.43
	k := math.Cbrt(a) // time scale factor: t_X = k·t_x
	big := GenesioTesi{A: a, B: b, C: c}
	unit := GenesioTesi{A: 1, B: b / (k * k), C: c / k}
	x0 := []float64{0.1, -0.05, 0.08}
	X0 := []float64{x0[0] / a, x0[1] / (a * k), x0[2] / (a * k * k)}
	const dt = 0.05
	xs, err := sampleFlow("genesio-tesi", big, x0, 800, dt, 0.001, 0, 0)
	if err != nil {
		t.Fatal(err)
	}
	Xs, err := sampleFlow("genesio-tesi", unit, X0, 800, dt*k, 0.001*k, 0, 0)
	if err != nil {
		t.Fatal(err)
	}
	var size float64
	for _, v := range xs {
		size = math.Max(size, math.Abs(v))
	}
	for i := range xs {
		if d := math.Abs(xs[i] - a*Xs[i]); d > 1e-6*size {
			t.Fatalf("scaling broken at t = %g: x = %.9g, A·X = %.9g", float64(i)*dt, xs[i], a*Xs[i])
		}
	}
}
