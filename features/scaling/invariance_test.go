package scaling

import (
	"errors"
	"math"
	"testing"
)

// TestScaleOffsetInvariance checks that every exponent and decay time is
// unchanged by x → a·x + b, for a > 0 and a < 0 (analytic: F(s), R/S up to
// the factor |a|, S(f) up to a², and r(k) are all invariant or scale by a
// constant factor that drops out of the log–log slope). Tolerance 1e-9
// relative to allow for round-off.
func TestScaleOffsetInvariance(t *testing.T) {
	base := fgnSeed(t, 1<<13, 0.7, 77)
	type est func([]float64) (float64, error)
	ests := map[string]est{
		"dfa1": func(x []float64) (float64, error) { r, err := DFA(x, DFAOptions{}); return r.Alpha, err },
		"dfa2": func(x []float64) (float64, error) { r, err := DFA(x, DFAOptions{Order: 2}); return r.Alpha, err },
		"rs":   func(x []float64) (float64, error) { r, err := RescaledRange(x, RSOptions{}); return r.H, err },
		"beta": func(x []float64) (float64, error) { r, err := SpectralSlope(x, SlopeOptions{}); return r.Beta, err },
		"decay": func(x []float64) (float64, error) {
			r, err := DecayTime(x, DecayOptions{})
			return r.Time + r.Integrated, err
		},
		"acf5": func(x []float64) (float64, error) { r, err := ACF(x, ACFOptions{MaxLag: 5}); return r[5], err },
	}
	for name, f := range ests {
		want, err := f(base)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		for _, ab := range [][2]float64{{1e-6, 3}, {4e5, -1e3}, {-2.5, 7}, {-1, 0}} {
			y := make([]float64, len(base))
			for i, v := range base {
				y[i] = ab[0]*v + ab[1]
			}
			got, err := f(y)
			if err != nil {
				t.Fatalf("%s a=%g b=%g: %v", name, ab[0], ab[1], err)
			}
			if math.Abs(got-want) > 1e-9*math.Max(1, math.Abs(want)) {
				t.Errorf("%s: %.15g for a=%g b=%g, %.15g for the original", name, got, ab[0], ab[1], want)
			}
		}
	}
}

// TestEdgeCases checks the errors for short, constant and non-finite input
// and for invalid options.
func TestEdgeCases(t *testing.T) {
	short := white(50, newRNG(1))
	constant := make([]float64, 5000)
	for i := range constant {
		constant[i] = 4.2
	}
	nan := white(5000, newRNG(2))
	nan[17] = math.NaN()
	long := white(5000, newRNG(3))
	tests := []struct {
		name string
		run  func() error
		want error
	}{
		{"dfa short", func() error { _, err := DFA(short, DFAOptions{}); return err }, ErrTooShort},
		{"dfa constant", func() error { _, err := DFA(constant, DFAOptions{}); return err }, ErrConstant},
		{"dfa nan", func() error { _, err := DFA(nan, DFAOptions{}); return err }, ErrNonFinite},
		{"dfa order 3", func() error { _, err := DFA(long, DFAOptions{Order: 3}); return err }, ErrBadOption},
		{"dfa min window", func() error { _, err := DFA(long, DFAOptions{MinWindow: 2}); return err }, ErrBadOption},
		{"dfa max window", func() error { _, err := DFA(long, DFAOptions{MaxWindow: 4000}); return err }, ErrBadOption},
		{"dfa quadratic trend", func() error {
			q := make([]float64, 5000)
			for i := range q {
				q[i] = float64(i) // profile is quadratic: DFA-2 residual is zero
			}
			_, err := DFA(q, DFAOptions{Order: 2})
			return err
		}, ErrDegenerate},
		{"rs short", func() error { _, err := RescaledRange(short, RSOptions{}); return err }, ErrTooShort},
		{"rs constant", func() error { _, err := RescaledRange(constant, RSOptions{}); return err }, ErrConstant},
		{"rs correction", func() error { _, err := RescaledRange(long, RSOptions{Correction: 7}); return err }, ErrBadOption},
		{"welch short", func() error { _, err := Welch(short, WelchOptions{}); return err }, ErrTooShort},
		{"welch segment", func() error { _, err := Welch(long, WelchOptions{Segment: 1000}); return err }, ErrBadOption},
		{"slope constant", func() error { _, err := SpectralSlope(constant, SlopeOptions{}); return err }, ErrConstant},
		{"slope band", func() error { _, err := SpectralSlope(long, SlopeOptions{FMin: 0.3, FMax: 0.2}); return err }, ErrBadOption},
		{"slope narrow band", func() error { _, err := SpectralSlope(long, SlopeOptions{FMin: 0.2, FMax: 0.21}); return err }, ErrTooShort},
		{"acf one sample", func() error { _, err := ACF([]float64{1}, ACFOptions{}); return err }, ErrTooShort},
		{"acf constant", func() error { _, err := ACF(constant, ACFOptions{}); return err }, ErrConstant},
		{"acf lag", func() error { _, err := ACF(long, ACFOptions{MaxLag: 5000}); return err }, ErrBadOption},
		{"decay nan", func() error { _, err := DecayTime(nan, DecayOptions{}); return err }, ErrNonFinite},
	}
	for _, tc := range tests {
		err := tc.run()
		if !errors.Is(err, tc.want) {
			t.Errorf("%s: error %v, want %v", tc.name, err, tc.want)
		} else {
			t.Logf("%s: %v", tc.name, err)
		}
	}
}

// TestDeterministic checks that the estimators are pure functions of the
// input (bit-identical repeated results).
func TestDeterministic(t *testing.T) {
	x := fgnSeed(t, 1<<12, 0.6, 5)
	a, _ := DFA(x, DFAOptions{})
	b, _ := DFA(x, DFAOptions{})
	c, _ := SpectralSlope(x, SlopeOptions{})
	d, _ := SpectralSlope(x, SlopeOptions{})
	if a.Alpha != b.Alpha || c.Beta != d.Beta {
		t.Errorf("repeated calls differ")
	}
}
