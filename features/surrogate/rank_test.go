package surrogate

import (
	"math"
	"testing"
)

// TestRankP checks the rank p-values against hand counts of the formula
// p_upper = (1 + #{v ≥ obs})/(M+1), p_lower = (1 + #{v ≤ obs})/(M+1),
// p_two = min(1, 2·min(p_upper, p_lower)). Theiler et al., Physica D 58
// (1992) 77; Schreiber & Schmitz, Physica D 142 (2000) 346.
func TestRankP(t *testing.T) {
	nineteen := make([]float64, 19)
	for i := range nineteen {
		nineteen[i] = float64(i) // 0..18
	}
	for _, tc := range []struct {
		name                string
		obs                 float64
		vals                []float64
		upper, lower, twoSd float64
	}{
		// Above all 19: p_upper = 1/20 = 0.05, the least for M = 19.
		{"above all 19", 100, nineteen, 1.0 / 20, 20.0 / 20, 2.0 / 20},
		{"below all 19", -1, nineteen, 20.0 / 20, 1.0 / 20, 2.0 / 20},
		// 9.5: 9 values above (10..18), 10 below (0..9).
		{"middle", 9.5, nineteen, 10.0 / 20, 11.0 / 20, 1},
		// Tie with 18: counts on both sides.
		{"tie at top", 18, nineteen, 2.0 / 20, 20.0 / 20, 4.0 / 20},
		{"all tied", 1, []float64{1, 1, 1}, 1, 1, 1},
		{"no surrogates", 3, nil, 1, 1, 1},
	} {
		u, l, two := RankP(tc.obs, tc.vals)
		if math.Abs(u-tc.upper) > 1e-15 || math.Abs(l-tc.lower) > 1e-15 || math.Abs(two-tc.twoSd) > 1e-15 {
			t.Errorf("%s: got (%g, %g, %g), want (%g, %g, %g)", tc.name, u, l, two, tc.upper, tc.lower, tc.twoSd)
		}
	}
}

// TestMinSurrogates: M = 1/α − 1 one-sided, 2/α − 1 two-sided; 19 and 39
// for α = 0.05 (REFERENCES.md: Theiler et al. 1992), 99 and 199 for 0.01.
func TestMinSurrogates(t *testing.T) {
	for _, tc := range []struct {
		alpha float64
		side  Side
		want  int
	}{
		{0.05, Upper, 19}, {0.05, Lower, 19}, {0.05, TwoSided, 39}, {0.05, "", 39},
		{0.01, Upper, 99}, {0.01, TwoSided, 199}, {0.1, Upper, 9}, {0.03, Upper, 33},
	} {
		got, err := MinSurrogates(tc.alpha, tc.side)
		if err != nil || got != tc.want {
			t.Errorf("MinSurrogates(%g, %q) = %d, %v; want %d", tc.alpha, tc.side, got, err, tc.want)
		}
	}
	for _, bad := range []float64{0, 1, -0.1, math.NaN()} {
		if _, err := MinSurrogates(bad, Upper); err == nil {
			t.Errorf("MinSurrogates(%g) gave no error", bad)
		}
	}
	if _, err := MinSurrogates(0.05, "left"); err == nil {
		t.Error("unknown side gave no error")
	}
}

// TestHolm compares with a hand computation of Holm's step-down procedure
// (Holm, Scand. J. Statist. 6 (1979) 65). p = (0.01, 0.04, 0.03, 0.005),
// m = 4, sorted 0.005, 0.01, 0.03, 0.04:
// 4·0.005 = 0.02; max(0.02, 3·0.01) = 0.03; max(0.03, 2·0.03) = 0.06;
// max(0.06, 1·0.04) = 0.06. In input order: 0.03, 0.06, 0.06, 0.02.
func TestHolm(t *testing.T) {
	for _, tc := range []struct {
		name string
		p    []float64
		want []float64
	}{
		{"hand", []float64{0.01, 0.04, 0.03, 0.005}, []float64{0.03, 0.06, 0.06, 0.02}},
		// Capped at 1: 3·0.5 → 1.
		{"cap", []float64{0.5, 0.9, 0.01}, []float64{1, 1, 0.03}},
		{"single", []float64{0.07}, []float64{0.07}},
		// A NaN (failed statistic) is not counted: m = 2.
		{"nan", []float64{0.02, math.NaN(), 0.04}, []float64{0.04, math.NaN(), 0.04}},
		{"ties", []float64{0.01, 0.01, 0.2}, []float64{0.03, 0.03, 0.2}},
	} {
		got := Holm(tc.p)
		for i := range got {
			if math.IsNaN(tc.want[i]) != math.IsNaN(got[i]) || (!math.IsNaN(got[i]) && math.Abs(got[i]-tc.want[i]) > 1e-15) {
				t.Errorf("%s: Holm(%v) = %v, want %v", tc.name, tc.p, got, tc.want)
				break
			}
		}
	}
}
