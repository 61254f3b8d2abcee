package generators

import (
	"fmt"
	"math"
	"testing"
)

// TestCoupledOscillatorsSpectrum: the leading Lyapunov exponents count
// the independent phases (zero exponents) and tell tori from locking:
//   - uncoupled (κ = 0): M independent limit cycles, M zero and M negative
//     exponents (analytic);
//   - weak coupling of incommensurate oscillators (the defaults, ω = 1,
//     golden mean, √5, κ = 0.05): a 3-torus, three zero exponents; with
//     M = 2 a 2-torus (the frequency ratio stays off every low-order
//     resonance: 1.609 measured);
//   - two nearly equal frequencies (1 and 1.02) under κ = 0.2: locked onto
//     one periodic orbit, one zero exponent.
//
// The first zeros+1 exponents are followed over 2000 time units, where a
// zero exponent's finite-time estimate is within 0.005 of 0 (over the
// rule's 500 the second zero of a torus still reads −0.012, falling off
// like 1/T: the tangent vectors align with the Oseledets directions only
// slowly) and the next one is below −0.02. (Uncoupled, the Jacobian is
// block-diagonal and the leading tangent vectors never leave the first
// oscillators' coordinates, so the uncoupled case is checked at M = 2,
// where zeros+1 vectors reach both.)
func TestCoupledOscillatorsSpectrum(t *testing.T) {
	golden, root5 := GoldenMean, math.Sqrt(5)
	tests := []struct {
		m     CoupledVanDerPol
		zeros int
	}{
		{CoupledVanDerPol{M: 2, Mu: 0.5, Omega: []float64{1, golden}}, 2},
		{CoupledVanDerPol{M: 2, Mu: 0.5, Omega: []float64{1, golden}, Kappa: 0.05}, 2},
		{CoupledVanDerPol{M: 3, Mu: 0.5, Omega: []float64{1, golden, root5}, Kappa: 0.05}, 3},
		{CoupledVanDerPol{M: 2, Mu: 0.5, Omega: []float64{1, 1.02}, Kappa: 0.2}, 1},
	}
	for _, tc := range tests {
		t.Run(fmt.Sprintf("M=%d kappa=%g w=%.3g", tc.m.M, tc.m.Kappa, tc.m.Omega[:tc.m.M]), func(t *testing.T) {
			sp, err := coupledRule.spectrum(tc.m, tc.m.classStart(), 2000, tc.zeros+1)
			if err != nil {
				t.Fatal(err)
			}
			t.Logf("leading exponents %.4f", sp.Exponents)
			for i, l := range sp.Exponents {
				if i < tc.zeros && math.Abs(l) > 0.005 || i == tc.zeros && !(l < -0.02) {
					t.Errorf("leading exponents %v, want %d zeros followed by a negative one", sp.Exponents, tc.zeros)
					break
				}
			}
		})
	}
}

// TestCoupledOscillatorsLiouville: the full spectrum sums to the average
// of the divergence Σ_j μ(1 − x_j²) along the same orbit (Liouville,
// analytic; the position coupling adds none) within 1e−4, on a 3-torus
// and on a locked orbit.
func TestCoupledOscillatorsLiouville(t *testing.T) {
	for _, m := range []CoupledVanDerPol{
		{M: 3, Mu: 0.5, Omega: []float64{1, GoldenMean, math.Sqrt(5)}, Kappa: 0.05},
		{M: 2, Mu: 2, Omega: []float64{1, 1.02}, Kappa: 0.2},
	} {
		x0 := m.classStart()
		sp, err := coupledRule.spectrum(m, x0, coupledRule.span, 0)
		if err != nil {
			t.Fatal(err)
		}
		div := divergenceAverage(m, x0, coupledRule, sp.Span, func(v []float64) float64 {
			var s float64
			for j := 0; j < m.M; j++ {
				s += m.Mu * (1 - v[2*j]*v[2*j])
			}
			return s
		})
		if math.Abs(spectrumSum(sp)-div) > 1e-4 { // Liouville, analytic
			t.Errorf("M = %d: exponents %v sum to %.6f, mean divergence %.6f", m.M, sp.Exponents, spectrumSum(sp), div)
		}
	}
}

// TestCoupledOscillatorsRanges: every observed coordinate is available for
// M = 3 and only the first four for M = 2; the label is regular at the
// defaults and with M = 2.
func TestCoupledOscillatorsRanges(t *testing.T) {
	s, _ := Lookup("coupled-oscillators")
	for obs := 0; obs < 6; obs++ {
		for _, m := range []float64{2, 3} {
			_, err := s.Generate(100, map[string]float64{"m": m, "obs": float64(obs)}, newRand(1))
			if bad := obs >= 2*int(m); bad != (err != nil) {
				t.Errorf("m = %g, obs = %d: error %v", m, obs, err)
			}
		}
	}
	for _, set := range []map[string]float64{nil, {"m": 2}} {
		if c, err := s.Class(set); err != nil || c != Regular {
			t.Errorf("%v: class %s (%v), want regular", set, c, err)
		}
	}
}
