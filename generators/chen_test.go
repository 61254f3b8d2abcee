package generators

import (
	"math"
	"testing"
)

// TestChen: the exponents sum to c − a − b (analytic: constant divergence;
// RK4 keeps it to O(h⁴), tolerance 1e-3). At a = 35, b = 3, c = 28 the flow
// is chaotic with a zero exponent for the flow direction and λ1 ≈ 2.02
// per time unit (Sprott, Chaos and Time-Series Analysis (2003): 2.0272, confirmed via DuncDennis/rescomp rescomp/simulations_new.py)
// within 5%, the finite-time spread over 200 time units being a few per
// cent; c = 28.5 and a = 32 lie in periodic windows.
func TestChen(t *testing.T) {
	sp := checkFlow(t, "chen", nil, Chaotic, 28-35-3, 1e-3) // analytic
	if math.Abs(sp.Exponents[0]-2.02)/2.02 > 0.05 {         // Sprott (2003): 2.0272 (DuncDennis/rescomp rescomp/simulations_new.py)
		t.Errorf("λ1 = %.4f, want 2.02 ± 5%%", sp.Exponents[0])
	}
	if math.Abs(sp.Exponents[1]) > 0.02 { // analytic: flow direction
		t.Errorf("λ2 = %.4f, want ≈ 0", sp.Exponents[1])
	}
	checkFlow(t, "chen", map[string]float64{"c": 28.5}, Regular, 28.5-35-3, 1e-3)
	checkFlow(t, "chen", map[string]float64{"a": 32}, Regular, 28-32-3, 1e-3)
}
