package increments

import (
	"math"
	"testing"
)

// TestQuantisedIID documents the tie rule of the package doc: i.i.d. N(0,1)
// noise recorded with 16 levels over ±3 sd is still i.i.d., so the lag-1
// autocorrelation of its increments is −1/2 (derived: for i.i.d. X of any
// distribution, Cov(X₁ − X₀, X₂ − X₁) = −Var X and Var(X₁ − X₀) = 2 Var X),
// within 3/√N (over four standard errors: Bartlett's formula gives
// √((1 − 3ρ² + 4ρ⁴)/N) = 0.71/√N at ρ = −1/2, derived from the formula as quoted by Cavazos-Cadena, Stat. Probab. Lett. 19 (1994) 221); but its
// increments live on the grid, and the KS distance to
// the fitted Gaussian exceeds the Lilliefors 1% critical value 1.031/√N
// (Lilliefors, J. Am. Stat. Assoc. 62 (1967) 399; 1.031/√N as in NikNakk/mothur source/calculators/geom.cpp). Spread over
// their cells (uniform dither, as features.Extract does) the increments pass
// the same test.
func TestQuantisedIID(t *testing.T) {
	const n, levels, c = 1 << 15, 16, 3.0
	q := 2 * c / (levels - 1)
	rng := newRNG(31)
	grid := make([]float64, n)
	dithered := make([]float64, n)
	for i := range grid {
		k := math.Max(0, math.Min(levels-1, math.Round((rng.NormFloat64()+c)/q)))
		grid[i] = k * q
		dithered[i] = grid[i] + q*(rng.Float64()-0.5)
	}
	for _, tc := range []struct {
		name   string
		x      []float64
		onGrid bool
	}{{"grid", grid, true}, {"dithered", dithered, false}} {
		r, err := Analyze(tc.x, Options{})
		if err != nil {
			t.Fatal(err)
		}
		se := 1 / math.Sqrt(float64(r.N))
		if math.Abs(r.Lag1+0.5) > 3*se {
			t.Errorf("%s: lag-1 autocorrelation %.4f, want −0.5 ± %.4f", tc.name, r.Lag1, 3*se)
		}
		crit := 1.031 / math.Sqrt(float64(r.N))
		if (r.KS > crit) != tc.onGrid {
			t.Errorf("%s: KS = %.4f, 1%% critical value %.4f", tc.name, r.KS, crit)
		}
		t.Logf("%s: lag-1 %.4f, KS %.4f (1%% critical %.4f)", tc.name, r.Lag1, r.KS, crit)
	}
}
