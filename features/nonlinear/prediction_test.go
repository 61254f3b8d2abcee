package nonlinear

import (
	"math"
	"testing"
)

// Nonlinear prediction (Sugihara & May, Nature 344 (1990) 734): forecast
// skill of deterministic chaos starts near 1 and falls with the horizon;
// for noise it is bounded by what the noise allows.
func TestPrediction(t *testing.T) {
	h, err := Prediction(series(t, henon, 5000, 1), PredictionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	a, err := Prediction(series(t, ar1, 5000, 1), PredictionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	w, err := Prediction(series(t, white, 5000, 1), PredictionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("henon ρ = %.3f", h.Rho)
	t.Logf("ar1   ρ = %.3f", a.Rho)
	t.Logf("white ρ = %.3f", w.Rho)
	// Chaos: skill near 1 at one step, falling with horizon.
	if h.Rho1 < 0.95 || h.Decay <= 0.02 || h.Slope >= 0 {
		t.Errorf("henon: ρ(1) = %.3f, decay %.3f, slope %.4f; want ρ(1) ≥ 0.95, decaying", h.Rho1, h.Decay, h.Slope)
	}
	for k := 1; k < len(h.Rho); k++ {
		if h.Rho[k] > h.Rho[k-1]+0.01 {
			t.Errorf("henon: ρ(%d) = %.3f > ρ(%d) = %.3f", k+1, h.Rho[k], k, h.Rho[k-1])
		}
	}
	// Gaussian AR(1): no predictor beats the conditional mean φ·x_t, whose
	// correlation with the truth is φ = 0.9 (analytic); 1000 test points
	// give a standard error (1 − ρ²)/√1000 ≈ 0.006, so allow 0.02.
	if a.Rho1 > 0.9+0.02 || a.Rho1 >= h.Rho1 {
		t.Errorf("ar1: ρ(1) = %.3f, want ≤ 0.92 and below henon's %.3f", a.Rho1, h.Rho1)
	}
	// White noise: no skill at any horizon; SE 1/√1000 ≈ 0.032, 4 SE.
	for k, r := range w.Rho {
		if math.Abs(r) > 0.13 {
			t.Errorf("white: ρ(%d) = %.3f, want |ρ| ≤ 0.13", k+1, r)
		}
	}
}
