package groups

import (
	"fmt"
	"math"
	"sort"
)

// Adjustment names a multiple-testing adjustment of p-values.
type Adjustment string

// The adjustments.
const (
	AdjustHolm Adjustment = "holm" // family-wise error rate, any dependence (the default)
	AdjustBH   Adjustment = "bh"   // false discovery rate, independence or positive dependence
	AdjustNone Adjustment = "none" // raw p-values
)

// ParseAdjustment maps "holm", "bh" (also "fdr", "benjamini-hochberg") and
// "none" to an Adjustment; "" gives AdjustHolm.
func ParseAdjustment(s string) (Adjustment, error) {
	switch s {
	case "", "holm":
		return AdjustHolm, nil
	case "bh", "fdr", "benjamini-hochberg", "BH":
		return AdjustBH, nil
	case "none":
		return AdjustNone, nil
	}
	return "", fmt.Errorf("unknown p-value adjustment %q (want holm, bh or none)", s)
}

// Adjust returns the p-values p adjusted by method (AdjustHolm when
// method is ""). NaN entries stay NaN and are not counted in the number of
// tests m. The input is not modified.
func Adjust(p []float64, method Adjustment) ([]float64, error) {
	switch method {
	case "", AdjustHolm:
		return Holm(p), nil
	case AdjustBH:
		return BH(p), nil
	case AdjustNone:
		return append([]float64(nil), p...), nil
	}
	return nil, fmt.Errorf("unknown p-value adjustment %q", method)
}

// finiteOrder returns the indices of the non-NaN entries of p sorted by
// ascending p (ties in input order).
func finiteOrder(p []float64) []int {
	idx := make([]int, 0, len(p))
	for i, v := range p {
		if !math.IsNaN(v) {
			idx = append(idx, i)
		}
	}
	sort.SliceStable(idx, func(a, b int) bool { return p[idx[a]] < p[idx[b]] })
	return idx
}

// Holm returns Holm's step-down adjusted p-values (Holm, Scand. J. Stat. 6
// (1979) 65): with the m non-NaN p-values sorted, p₍₁₎ ≤ … ≤ p₍ₘ₎,
// p̃₍ᵢ₎ = min(1, max_{j≤i} (m − j + 1)·p₍ⱼ₎). Rejecting p̃ ≤ α controls the
// family-wise error rate at α under any dependence. NaN stays NaN.
func Holm(p []float64) []float64 {
	out := make([]float64, len(p))
	for i := range out {
		out[i] = math.NaN()
	}
	idx := finiteOrder(p)
	m := len(idx)
	run := 0.0
	for r, i := range idx {
		run = math.Max(run, float64(m-r)*p[i])
		out[i] = math.Min(1, run)
	}
	return out
}

// BH returns the Benjamini–Hochberg step-up adjusted p-values (Benjamini &
// Hochberg, J. R. Stat. Soc. B 57 (1995) 289): with the m non-NaN p-values
// sorted, p̃₍ᵢ₎ = min(1, min_{j≥i} m·p₍ⱼ₎/j). Rejecting p̃ ≤ q controls the
// false discovery rate at q for independent or positively dependent
// tests (Benjamini & Yekutieli, Ann. Stat. 29 (2001) 1165). NaN stays NaN.
func BH(p []float64) []float64 {
	out := make([]float64, len(p))
	for i := range out {
		out[i] = math.NaN()
	}
	idx := finiteOrder(p)
	m := len(idx)
	run := 1.0
	for r := m - 1; r >= 0; r-- {
		i := idx[r]
		run = math.Min(run, float64(m)*p[i]/float64(r+1))
		out[i] = run
	}
	return out
}
