package nonlinear

import (
	"errors"
	"math"
	"testing"
)

// Every measure standardises its input, so a·x + b gives the same value up
// to floating-point error (analytic: all statistics are functions of
// (x − mean)/SD, distances ratios or correlations). a < 0 is checked for the
// measures that are symmetric under x → −x; the asymmetry statistic flips
// sign and its magnitude is checked.
func TestScaleOffsetInvariance(t *testing.T) {
	x := series(t, henon, 3000, 7)
	type measure struct {
		name      string
		signSymm  bool
		signFlips bool
		f         func([]float64) (float64, error)
	}
	ms := []measure{
		{"embed d·1000+τ", true, false, func(x []float64) (float64, error) {
			e, err := Embed(x, EmbedOptions{})
			if err != nil {
				return 0, err
			}
			return float64(e.Dim*1000000 + e.Delay*1000 + e.Theiler), nil
		}},
		{"lyapunov", true, false, func(x []float64) (float64, error) {
			r, err := Lyapunov(x, LyapunovOptions{})
			if err != nil {
				return 0, err
			}
			return r.Lambda, nil
		}},
		{"nl_gp_dim", true, false, func(x []float64) (float64, error) {
			r, err := CorrelationDimension(x, CorrDimOptions{})
			if err != nil {
				return 0, err
			}
			return r.D2, nil
		}},
		{"nl_k01", true, false, func(x []float64) (float64, error) {
			r, err := ZeroOne(x, ZeroOneOptions{})
			if err != nil {
				return 0, err
			}
			return r.K, nil
		}},
		{"prediction rho1", true, false, func(x []float64) (float64, error) {
			r, err := Prediction(x, PredictionOptions{})
			if err != nil {
				return 0, err
			}
			return r.Rho1 + 10*r.Decay, nil
		}},
		{"nl_sent_m2", true, false, func(x []float64) (float64, error) {
			r, err := SampleEntropy(x, SampEnOptions{})
			if err != nil {
				return 0, err
			}
			return r.Value, nil
		}},
		{"asymmetry", false, true, func(x []float64) (float64, error) {
			r, err := Asymmetry(x, AsymmetryOptions{})
			if err != nil {
				return 0, err
			}
			return r.Value, nil
		}},
		{"asymmetry abs", true, false, func(x []float64) (float64, error) {
			r, err := Asymmetry(x, AsymmetryOptions{})
			if err != nil {
				return 0, err
			}
			return r.Abs, nil
		}},
	}
	for _, m := range ms {
		ref, err := m.f(x)
		if err != nil {
			t.Fatalf("%s: %v", m.name, err)
		}
		for _, ab := range [][2]float64{{1e-3, 7}, {1e6, -3e6}, {-2.5, 1}} {
			if ab[0] < 0 && !m.signSymm && !m.signFlips {
				continue
			}
			got, err := m.f(affine(x, ab[0], ab[1]))
			if err != nil {
				t.Fatalf("%s a=%g: %v", m.name, ab[0], err)
			}
			want := ref
			if ab[0] < 0 && m.signFlips {
				want = -ref
			}
			if !near(got, want, 1e-9) {
				t.Errorf("%s: a=%g b=%g gives %.15g, want %.15g", m.name, ab[0], ab[1], got, want)
			}
		}
	}
}

// Too short, constant and non-finite inputs are errors the caller can tell
// apart.
func TestEdgeCases(t *testing.T) {
	fns := map[string]func([]float64) error{
		"Embed":    func(x []float64) error { _, err := Embed(x, EmbedOptions{}); return err },
		"AMI":      func(x []float64) error { _, err := AverageMutualInformation(x, AMIOptions{}); return err },
		"Cao":      func(x []float64) error { _, err := Cao(x, CaoOptions{}); return err },
		"FNN":      func(x []float64) error { _, err := FalseNeighbours(x, FNNOptions{}); return err },
		"Lyapunov": func(x []float64) error { _, err := Lyapunov(x, LyapunovOptions{}); return err },
		"CorrDim":  func(x []float64) error { _, err := CorrelationDimension(x, CorrDimOptions{}); return err },
		"ZeroOne":  func(x []float64) error { _, err := ZeroOne(x, ZeroOneOptions{}); return err },
		"Predict":  func(x []float64) error { _, err := Prediction(x, PredictionOptions{}); return err },
		"Asym":     func(x []float64) error { _, err := Asymmetry(x, AsymmetryOptions{}); return err },
		"SampEn":   func(x []float64) error { _, err := SampleEntropy(x, SampEnOptions{}); return err },
	}
	short := []float64{1, 2, 3, 2, 1}
	constant := make([]float64, 3000)
	for i := range constant {
		constant[i] = 4.2
	}
	nan := series(t, henon, 3000, 1)
	nan[100] = math.NaN()
	inf := series(t, henon, 3000, 1)
	inf[7] = math.Inf(-1)
	for name, f := range fns {
		for _, c := range []struct {
			what string
			x    []float64
			want error
		}{
			{"empty", nil, ErrTooShort},
			{"short", short, ErrTooShort},
			{"constant", constant, ErrConstant},
			{"NaN", nan, ErrNonFinite},
			{"Inf", inf, ErrNonFinite},
		} {
			if err := f(c.x); !errors.Is(err, c.want) {
				t.Errorf("%s on %s input: err = %v, want %v", name, c.what, err, c.want)
			}
		}
	}
}
