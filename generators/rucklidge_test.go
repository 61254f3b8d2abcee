package generators

import (
	"math"
	"testing"
)

// TestRucklidge: the exponents sum to −(κ + 1) (analytic: constant
// divergence, tolerance 1e-3); κ = 2, λ = 6.7 is chaotic with a zero
// exponent for the flow direction, and κ = 1 and λ = 3 are periodic.
func TestRucklidge(t *testing.T) {
	sp := checkFlow(t, "rucklidge", nil, Chaotic, -3, 1e-3) // analytic
	if math.Abs(sp.Exponents[1]) > 0.02 {                   // analytic: flow direction
		t.Errorf("λ2 = %.4f, want ≈ 0", sp.Exponents[1])
	}
	checkFlow(t, "rucklidge", map[string]float64{"kappa": 1}, Regular, -2, 1e-3)
	checkFlow(t, "rucklidge", map[string]float64{"lambda": 3}, Regular, -3, 1e-3)
}
