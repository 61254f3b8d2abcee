package nonlinear

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat"

	"github.com/tracesift/tracesift/generators"
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

// The global linear forecast beside the simplex one. For Gaussian AR(1) the
// best linear forecast h samples ahead is φ^h·x_t, whose correlation with the
// truth is φ^h (analytic: ρ(h) = φ^h for AR(1)). The 1000 test points over
// 2500 samples are autocorrelated (integrated time (1+φ)/(1−φ) = 19 samples),
// so about 130 are independent and the standard error of a correlation is
// (1 − ρ²)/√130; allow 3 SE. Hénon's map is quadratic: its linear skill one
// step ahead is far below the simplex skill (common practice: the
// local-versus-global comparison of Casdagli 1992); white noise has no
// linear skill (SE 1/√1000 = 0.032, 4 SE).
func TestPredictionLinear(t *testing.T) {
	a, err := Prediction(series(t, ar1, 5000, 2), PredictionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("ar1 linear ρ = %.3f", a.LinearRho)
	for h, r := range a.LinearRho {
		want := math.Pow(0.9, float64(h+1))
		tol := 3 * (1 - want*want) / math.Sqrt(130)
		if math.Abs(r-want) > tol {
			t.Errorf("ar1: linear ρ(%d) = %.3f, want %.3f ± %.2f", h+1, r, want, tol)
		}
	}
	hn, err := Prediction(series(t, henon, 5000, 2), PredictionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("henon linear ρ = %.3f", hn.LinearRho)
	if hn.LinearRho[0] > hn.Rho1-0.3 {
		t.Errorf("henon: linear ρ(1) = %.3f, want far below the simplex ρ(1) = %.3f", hn.LinearRho[0], hn.Rho1)
	}
	w, err := Prediction(series(t, white, 5000, 2), PredictionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for h, r := range w.LinearRho {
		if math.Abs(r) > 0.13 {
			t.Errorf("white: linear ρ(%d) = %.3f, want |ρ| ≤ 0.13", h+1, r)
		}
	}
}

// linearForecastSkill solves its normal equations by Cholesky; gonum's QR
// least squares (mat.Dense.Solve on the full design matrix) is the
// reference for the same fit. Forecast correlations agree to 1e-9.
func TestLinearForecastMatchesQR(t *testing.T) {
	z := series(t, generators.AR1{Phi: 0.6}, 1500, 3)
	const d, tau, H = 3, 2, 4
	span := (d - 1) * tau
	half := len(z) / 2
	libStart, libEnd := 10, half-span-H
	tests := evenlySpaced(len(z)-half-span-H, 300)
	truth := make([][]float64, H)
	for h := range truth {
		for _, off := range tests {
			truth[h] = append(truth[h], z[half+off+span+h+1])
		}
	}
	got := linearForecastSkill(z, d, tau, libStart, libEnd, half, tests, truth)
	rows := libEnd - libStart
	X := mat.NewDense(rows, d+1, nil)
	Y := mat.NewDense(rows, H, nil)
	for i := 0; i < rows; i++ {
		t0 := libStart + i
		X.Set(i, 0, 1)
		for j := 0; j < d; j++ {
			X.Set(i, j+1, z[t0+j*tau])
		}
		for h := 0; h < H; h++ {
			Y.Set(i, h, z[t0+span+h+1])
		}
	}
	var beta mat.Dense
	if err := beta.Solve(X, Y); err != nil {
		t.Fatal(err)
	}
	for h := 0; h < H; h++ {
		fc := make([]float64, len(tests))
		for i, off := range tests {
			fc[i] = beta.At(0, h)
			for j := 0; j < d; j++ {
				fc[i] += beta.At(j+1, h) * z[half+off+j*tau]
			}
		}
		want := stat.Correlation(truth[h], fc, nil)
		if math.Abs(got[h]-want) > 1e-9 {
			t.Errorf("h = %d: linear skill %.12f, QR reference %.12f", h+1, got[h], want)
		}
	}
}
