package nonlinear

import (
	"math"
	"testing"
)

// Time-reversal asymmetry of increments (Theiler et al., Physica D 58
// (1992) 77; Schreiber & Schmitz, Physica D 142 (2000) 346).
func TestAsymmetry(t *testing.T) {
	h, err := Asymmetry(series(t, henon, 10000, 1), AsymmetryOptions{})
	if err != nil {
		t.Fatal(err)
	}
	// Dissipative chaos is time-irreversible: clearly nonzero (≫ 10 SE).
	if h.Abs < 10*h.StdErr {
		t.Errorf("henon: |A| = %.4f, want > 10 × %.4f", h.Abs, h.StdErr)
	}
	// Gaussian AR(1) is time-reversible: expectation 0 (analytic); the
	// increments are nearly uncorrelated (lag-1 correlation −(1−φ)/2 =
	// −0.05), so the skewness has SE ≈ √(6/N); allow 4 SE.
	a, err := Asymmetry(series(t, ar1, 20000, 1), AsymmetryOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if a.Abs > 4*a.StdErr {
		t.Errorf("ar1: A = %.4f, want |A| ≤ 4 × %.4f", a.Value, a.StdErr)
	}
	t.Logf("henon A = %.4f, ar1 A = %.4f (SE %.4f)", h.Value, a.Value, a.StdErr)
	// Negation flips the sign exactly (mean and SD are computed exactly for
	// −x, so the standardised increments are exactly negated).
	x := series(t, henon, 1000, 2)
	p, _ := Asymmetry(x, AsymmetryOptions{Lag: 2})
	n, _ := Asymmetry(affine(x, -1, 0), AsymmetryOptions{Lag: 2})
	if n.Value != -p.Value || n.Abs != p.Abs || math.IsNaN(p.Value) {
		t.Errorf("negation: %v vs %v", n.Value, p.Value)
	}
}
