package nonlinear

import (
	"math"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// Correlation dimension (Grassberger & Procaccia, Physica D 9 (1983) 189).
func TestCorrelationDimensionReferenceSystems(t *testing.T) {
	cases := []struct {
		name      string
		g         generators.Generator
		n         int
		want, tol float64
	}{
		// Grassberger & Procaccia (1983): Hénon 1.21 ± 0.01 (confirmed: sprott.physics.wisc.edu/chaos/henongp.htm)
		{"henon", henon, 10000, 1.21, 0.1},
		// Grassberger & Procaccia (1983): Lorenz 2.05 ± 0.01 (confirmed: nonlinearTseries tests/testthat/test_correlation_dim.R)
		{"lorenz dt=0.01", lorenz, 20000, 2.05, 0.15},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			res, err := CorrelationDimension(series(t, c.g, c.n, 1), CorrDimOptions{})
			if err != nil {
				t.Fatal(err)
			}
			t.Logf("D2 = %.3f (want %.2f ± %.2f) over r = %.3g..%.3g SD (%.2f decades), r² = %.5f, slope sd %.3f, d = %d, pairs %d",
				res.D2, c.want, c.tol, res.RMin, res.RMax, res.Decades, res.R2, res.SlopeSpread, res.Embedding.Dim, res.Pairs)
			if math.IsNaN(res.D2) {
				t.Fatalf("no scaling region: %s", res.Reason)
			}
			if math.Abs(res.D2-c.want) > c.tol {
				t.Errorf("D2 = %.3f, want %.2f ± %.2f", res.D2, c.want, c.tol)
			}
			if res.Decades < 0.99 {
				t.Errorf("scaling region %.2f decades, want ≥ 1", res.Decades)
			}
		})
	}
}

// The subsampled correlation sum must agree with the one over every pair
// (reference: the same count with every pair) wherever it rests on many
// pairs: with 10^6 pairs, C ≥ 10^-3 rests on ≥ 10^3 pairs (≈ 3% counting
// error; the reference points are fewer, so allow 10%).
func TestCorrelationDimensionSubsampling(t *testing.T) {
	x := series(t, henon, 4000, 2)
	full, err := CorrelationDimension(x, CorrDimOptions{})
	if err != nil {
		t.Fatal(err)
	}
	sub, err := CorrelationDimension(x, CorrDimOptions{MaxPairs: 1_000_000})
	if err != nil {
		t.Fatal(err)
	}
	if full.Stride != 1 || full.Refs != 4000-1 || sub.Pairs > 1_100_000 {
		t.Fatalf("expected full (refs %d, stride %d) and subsampled (refs %d, stride %d, pairs %d) counts",
			full.Refs, full.Stride, sub.Refs, sub.Stride, sub.Pairs)
	}
	cf := map[float64]float64{}
	for k, r := range full.Radii {
		cf[r] = full.C[k]
	}
	checked := 0
	for k, r := range sub.Radii {
		want, ok := cf[r]
		if !ok || want < 1e-3 || want > 0.2 {
			continue
		}
		checked++
		if math.Abs(sub.C[k]-want) > 0.1*want {
			t.Errorf("C(%.3g): subsampled %.4g, all pairs %.4g", r, sub.C[k], want)
		}
	}
	if checked < 20 {
		t.Errorf("only %d radii compared", checked)
	}
	t.Logf("D2 all pairs %.3f, subsampled %.3f", full.D2, sub.D2)
}
