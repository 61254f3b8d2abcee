package generators

import (
	"fmt"
	"math"
	"testing"
)

// TestBrusselatorHopf checks the Hopf condition b > 1 + a² (analytic: the
// fixed point (a, b/a) has trace b − 1 − a² and determinant a²):
//   - below it (b = 0.8(1 + a²)) every orbit settles on (a, b/a), reached
//     to 1e−9 after 1200 time units (decay rate |trace|/2 ≥ 0.025);
//   - just above it (b = 1 + a² + 0.005) the orbit spirals out slowly
//     onto a small limit cycle with period 2π/a, the eigenvalues being
//     ±i·a at the bifurcation (analytic; within 0.5 %: the frequency
//     shifts in proportion to the distance from the bifurcation);
//   - above it the limit cycle has λ1 ≈ 0 > λ2, and the exponents sum to
//     the average of the divergence 2xy − x² − (b + 1) along the orbit
//     (Liouville, analytic).
func TestBrusselatorHopf(t *testing.T) {
	for _, a := range []float64{0.5, 1, 1.5} {
		t.Run(fmt.Sprintf("a=%g", a), func(t *testing.T) {
			below := 0.8 * (1 + a*a)
			for obs, want := range []float64{a, below / a} {
				x, err := Brusselator{A: a, B: below, Dt: 0.5, Obs: obs}.Generate(2000, newRand(1))
				if err != nil {
					t.Fatal(err)
				}
				if got := x[len(x)-1]; math.Abs(got-want) > 1e-9 {
					t.Errorf("b = %.4g below the Hopf value: coordinate %d ends at %.12f, want the fixed point's %.12f", below, obs, got, want)
				}
			}
			near := Brusselator{A: a, B: 1 + a*a + 0.005, Dt: 0.01}
			x, err := near.Generate(200000, newRand(2))
			if err != nil {
				t.Fatal(err)
			}
			if p, want := meanPeriod(x, near.Dt), 2*math.Pi/a; math.Abs(p/want-1) > 0.005 {
				t.Errorf("just above the Hopf value: period %.4f, want about 2π/a = %.4f", p, want)
			}
			m := Brusselator{A: a, B: 1.5 * (1 + a*a)}
			x0 := []float64{a, 1.5 * m.B / a}
			sp, err := brusselatorRule.spectrum(m, x0, brusselatorRule.span, 2)
			if err != nil {
				t.Fatal(err)
			}
			div := divergenceAverage(m, x0, brusselatorRule, sp.Span, func(v []float64) float64 {
				return 2*v[0]*v[1] - v[0]*v[0] - (m.B + 1)
			})
			t.Logf("b_hopf = 1.5: spectrum %.5f, mean divergence %.5f", sp.Exponents, div)
			if math.Abs(sp.Exponents[0]) > 0.01 || !(sp.Exponents[1] < -0.05) {
				t.Errorf("spectrum %v, want λ1 ≈ 0 > λ2 (limit cycle)", sp.Exponents)
			}
			if math.Abs(spectrumSum(sp)-div) > 1e-4 { // Liouville, analytic
				t.Errorf("exponents sum to %.6f, mean divergence %.6f", spectrumSum(sp), div)
			}
		})
	}
}

// TestBrusselatorBox: at the corners of the registry's box (a in [0.3, 1.5],
// b_hopf in [1.05, 2]) the series oscillates, the label is regular, and
// the internal RK4 step 0.005 resolves the cycle: its extrema agree with
// those at step 0.001 to 1e−3 relative (convergence in the step, common
// practice).
func TestBrusselatorBox(t *testing.T) {
	s, _ := Lookup("brusselator")
	for _, a := range []float64{0.3, 1.5} {
		for _, bh := range []float64{1.05, 2} {
			m := Brusselator{A: a, B: bh * (1 + a*a), Dt: 0.05}
			var ext [2][2]float64
			for i, h := range []float64{brusselatorStep, 0.001} {
				x, err := sampleFlow("brusselator", m, []float64{a, m.B / a * 1.2}, 10000, m.Dt, h, brusselatorTransient, 0)
				if err != nil {
					t.Fatal(err)
				}
				ext[i][0], ext[i][1] = extrema(x)
			}
			if ext[0][1]-ext[0][0] < 0.05*a {
				t.Errorf("a = %g, b_hopf = %g: amplitude %g, want an oscillation", a, bh, ext[0][1]-ext[0][0])
			}
			for k := 0; k < 2; k++ {
				if math.Abs(ext[0][k]/ext[1][k]-1) > 1e-3 {
					t.Errorf("a = %g, b_hopf = %g: extremum %.6g at step %g, %.6g at step 0.001", a, bh, ext[0][k], brusselatorStep, ext[1][k])
				}
			}
			if c, err := s.Class(map[string]float64{"a": a, "b_hopf": bh}); err != nil || c != Regular {
				t.Errorf("a = %g, b_hopf = %g: class %s (%v), want regular", a, bh, c, err)
			}
		}
	}
}
