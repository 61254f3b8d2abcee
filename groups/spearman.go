package groups

import (
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// SpearmanResult is a rank correlation with its test.
type SpearmanResult struct {
	Rho float64 `json:"rho"` // Spearman's ρ, NaN when undefined
	P   float64 `json:"p"`   // two-sided p-value of H₀: ρ = 0, NaN when undefined
	N   int     `json:"n"`   // pairs used
}

// Spearman returns Spearman's rank correlation of x and y: the Pearson
// correlation of their mid-ranks (Spearman, Am. J. Psychol. 15 (1904) 72),
// which handles ties, and the two-sided p-value from
// t = ρ·√((n−2)/(1−ρ²)) with Student's t on n − 2 degrees of freedom (the
// large-sample test used by scipy.stats.spearmanr). Pairs with a NaN or
// ±Inf in either coordinate are dropped. Rho and P are NaN with fewer than
// 3 pairs or when x or y is constant; |ρ| = 1 gives P = 0. x and y must
// have the same length (otherwise the result is NaN with N = 0).
func Spearman(x, y []float64) SpearmanResult {
	if len(x) != len(y) {
		return SpearmanResult{Rho: math.NaN(), P: math.NaN()}
	}
	xs := make([]float64, 0, len(x))
	ys := make([]float64, 0, len(y))
	for i := range x {
		if finite(x[i]) && finite(y[i]) {
			xs = append(xs, x[i])
			ys = append(ys, y[i])
		}
	}
	n := len(xs)
	r := SpearmanResult{Rho: math.NaN(), P: math.NaN(), N: n}
	if n < 3 {
		return r
	}
	rx, _ := midRanks(xs)
	ry, _ := midRanks(ys)
	mean := float64(n+1) / 2 // mean of ranks 1…n, also with mid-ranks
	var sxy, sxx, syy float64
	for i := range rx {
		dx, dy := rx[i]-mean, ry[i]-mean
		sxy += dx * dy
		sxx += dx * dx
		syy += dy * dy
	}
	if sxx == 0 || syy == 0 {
		return r
	}
	rho := sxy / math.Sqrt(sxx*syy)
	rho = math.Max(-1, math.Min(1, rho))
	r.Rho = rho
	df := float64(n - 2)
	den := (1 - rho) * (1 + rho)
	if den <= 0 {
		r.P = 0
		return r
	}
	t := math.Abs(rho) * math.Sqrt(df/den)
	r.P = math.Min(1, 2*distuv.StudentsT{Mu: 0, Sigma: 1, Nu: df}.Survival(t))
	return r
}

// finite reports whether v is neither NaN nor ±Inf.
func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
