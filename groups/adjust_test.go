package groups

import (
	"math"
	"testing"
)

// TestAdjustHand checks Holm and BH on a hand-computed example.
// p = (0.01, 0.04, 0.03, 0.005), m = 4.
// Holm (Holm 1979): sorted 0.005, 0.01, 0.03, 0.04 times 4, 3, 2, 1 =
// 0.02, 0.03, 0.06, 0.04, running maximum 0.02, 0.03, 0.06, 0.06.
// BH (Benjamini & Hochberg 1995): m·p₍ᵢ₎/i = 0.02, 0.02, 0.04, 0.04,
// running minimum from the top 0.02, 0.02, 0.04, 0.04.
// A NaN entry is left out of m and stays NaN.
func TestAdjustHand(t *testing.T) {
	p := []float64{0.01, 0.04, 0.03, 0.005}
	cases := []struct {
		name string
		got  []float64
		want []float64
	}{
		{"holm", Holm(p), []float64{0.03, 0.06, 0.06, 0.02}},
		{"bh", BH(p), []float64{0.02, 0.04, 0.04, 0.02}},
		{"holm+NaN", Holm([]float64{0.01, math.NaN(), 0.04, 0.03, 0.005}), []float64{0.03, math.NaN(), 0.06, 0.06, 0.02}},
		{"bh+NaN", BH([]float64{0.01, 0.04, math.NaN(), 0.03, 0.005}), []float64{0.02, 0.04, math.NaN(), 0.04, 0.02}},
		{"holm cap", Holm([]float64{0.5, 0.6}), []float64{1, 1}},
		{"single", BH([]float64{0.3}), []float64{0.3}},
		{"empty", Holm(nil), []float64{}},
	}
	for _, c := range cases {
		if len(c.got) != len(c.want) {
			t.Errorf("%s: %v, want %v", c.name, c.got, c.want)
			continue
		}
		for i := range c.want {
			if !near(c.got[i], c.want[i], 1e-15, 1e-14) {
				t.Errorf("%s[%d] = %v, want %v", c.name, i, c.got[i], c.want[i])
			}
		}
	}
	if _, err := Adjust(p, "bogus"); err == nil {
		t.Error("unknown adjustment accepted")
	}
	for _, s := range []string{"", "holm", "bh", "fdr", "none"} {
		if _, err := ParseAdjustment(s); err != nil {
			t.Errorf("ParseAdjustment(%q): %v", s, err)
		}
	}
	// Properties: BH ≤ Holm entrywise (a step-up FDR procedure is never
	// stricter than Holm's step-down FWER procedure), both ≥ raw p.
	q := []float64{0.001, 0.2, 0.013, 0.04, 0.5, 0.0001, 0.049, 0.03}
	h, b := Holm(q), BH(q)
	for i := range q {
		if b[i] > h[i]+1e-15 || b[i] < q[i] || h[i] < q[i] {
			t.Errorf("i=%d: p %v BH %v Holm %v", i, q[i], b[i], h[i])
		}
	}
}
