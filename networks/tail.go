package networks

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// TailOptions controls ExponentialTail. The zero value means the defaults.
type TailOptions struct {
	// KMin fixes the first degree of the fitted tail. Zero means choose it
	// as Clauset et al. do for power laws: among the degrees above the mode
	// whose tail holds at least MinTail nodes, the one whose maximum-
	// likelihood geometric fit has the smallest Kolmogorov–Smirnov distance
	// to the empirical tail. This keeps the fit off the bulk at small k
	// (chaotic maps distort P(k) there; Luque et al. 2009 fit the tail).
	KMin int
	// MinTail is the least number of nodes with k ≥ k_min for a candidate
	// k_min; zero means max(50, n/100).
	MinTail int
	// MinCount is the least number of nodes a degree must have to enter the
	// least-squares diagnostic fit. Zero means 5.
	MinCount int
}

// TailFit is the exponential tail P(k) ~ e^{−λk} of a degree distribution.
type TailFit struct {
	// Lambda is the maximum-likelihood rate: for k ≥ KMin the excess
	// Y = k − KMin is taken as geometric, P(Y = y) = (1 − e^{−λ}) e^{−λy},
	// whose MLE is λ = ln(1 + 1/Ȳ).
	Lambda float64 `json:"lambda"`
	// StdErr is the asymptotic standard error (1 − q)/√(q·NTail), q = e^{−λ},
	// from the Fisher information of the geometric law (treats degrees as
	// independent, which they are only approximately).
	StdErr float64 `json:"std_err"`
	KMin   int     `json:"k_min"`
	NTail  int64   `json:"n_tail"` // nodes with k ≥ KMin
	// KS is the Kolmogorov–Smirnov distance between the empirical tail and
	// the fitted geometric law; Candidates the number of k_min values tried.
	KS         float64 `json:"ks"`
	Candidates int     `json:"candidates"`
	// LambdaLS, R2 and Points describe the diagnostic fit: least squares of
	// ln count(k) on k, weighted by count(k) (≈ inverse Poisson variance of
	// the log), over k = KMin..KMaxLS, the longest run of consecutive degrees
	// from KMin each holding at least MinCount nodes. NaN when fewer than 3
	// such degrees exist.
	LambdaLS float64 `json:"lambda_ls"`
	KMaxLS   int     `json:"k_max_ls"`
	Points   int     `json:"points"`
	R2       float64 `json:"r2"`
}

// MarshalJSON writes the fit with NaN as null.
func (t TailFit) MarshalJSON() ([]byte, error) { return jsonsafe.Marshal(t, jsonsafe.Options{}) }

// ExponentialTail fits P(k) ~ e^{−λk} to the tail of the degree distribution
// of g, the HVG statistic of Luque et al., Phys. Rev. E 80 (2009) 046103: an
// i.i.d. series gives exactly P(k) = (1/3)(2/3)^{k−2}, λ = ln(3/2) ≈ 0.405;
// chaotic series give λ < ln(3/2), correlated stochastic ones λ > ln(3/2)
// (Lacasa & Toral, Phys. Rev. E 82 (2010) 036120). The rate is the
// maximum-likelihood estimate of a geometric tail (see TailFit), with a
// weighted least-squares line on log P(k) as a fit-quality diagnostic.
// It returns ErrTooFewPoints when no k_min leaves at least 10 nodes spread
// over two or more degrees.
func ExponentialTail(g *Graph, opts TailOptions) (TailFit, error) {
	return tailFromHist(degreeHistogram(g), opts)
}

// ExponentialTailCounts is ExponentialTail on a degree histogram:
// counts[k] nodes have degree k (a distribution pooled over several
// graphs, say). Negative counts are taken as zero.
func ExponentialTailCounts(counts []int64, opts TailOptions) (TailFit, error) {
	return tailFromHist(nonNegative(counts), opts)
}

// nonNegative returns counts with negative entries set to zero (a copy
// when there are any).
func nonNegative(counts []int64) []int64 {
	for i, c := range counts {
		if c < 0 {
			out := append([]int64(nil), counts...)
			for j := i; j < len(out); j++ {
				out[j] = max(out[j], 0)
			}
			return out
		}
	}
	return counts
}

func tailFromHist(hist []int64, opts TailOptions) (TailFit, error) {
	nan := math.NaN()
	fit := TailFit{Lambda: nan, StdErr: nan, LambdaLS: nan, R2: nan, KS: nan}
	minCount := opts.MinCount
	if minCount <= 0 {
		minCount = 5
	}
	K := len(hist)
	tail := make([]int64, K+1) // nodes with degree ≥ k
	sumK := make([]float64, K+1)
	var n int64
	for k := K - 1; k >= 0; k-- {
		tail[k] = tail[k+1] + hist[k]
		sumK[k] = sumK[k+1] + float64(k)*float64(hist[k])
		n += hist[k]
	}
	var cands []int
	if opts.KMin > 0 {
		cands = []int{opts.KMin}
	} else {
		minTail := int64(opts.MinTail)
		if minTail <= 0 {
			minTail = max(50, n/100)
		}
		mode := 0
		for k, c := range hist {
			if c > hist[mode] {
				mode = k
			}
		}
		for k := mode + 1; k < K && tail[k] >= minTail; k++ {
			cands = append(cands, k)
		}
	}
	for _, kmin := range cands {
		if kmin >= K || tail[kmin] < 10 || tail[kmin+1] == 0 {
			continue
		}
		nt := tail[kmin]
		ybar := sumK[kmin]/float64(nt) - float64(kmin)
		lam := math.Log1p(1 / ybar)
		q := math.Exp(-lam)
		// KS over k ≥ kmin of S(k) = P(K ≥ k | K ≥ kmin) = q^{k−kmin}.
		var d float64
		for k := kmin; k <= K; k++ {
			d = math.Max(d, math.Abs(float64(tail[k])/float64(nt)-math.Pow(q, float64(k-kmin))))
		}
		fit.Candidates++
		if math.IsNaN(fit.KS) || d < fit.KS {
			fit.KS, fit.KMin, fit.NTail, fit.Lambda = d, kmin, nt, lam
			fit.StdErr = (1 - q) / math.Sqrt(q*float64(nt))
		}
	}
	if fit.Candidates == 0 {
		if opts.KMin > 0 {
			fit.KMin = opts.KMin
		}
		return fit, fmt.Errorf("exponential tail: no k_min with at least 10 nodes in a tail of two or more degrees: %w", ErrTooFewPoints)
	}
	kmin := fit.KMin
	var xs, ys, ws []float64
	for k := kmin; k < K && hist[k] >= int64(minCount); k++ {
		xs = append(xs, float64(k))
		ys = append(ys, math.Log(float64(hist[k])))
		ws = append(ws, float64(hist[k]))
		fit.KMaxLS = k
	}
	fit.Points = len(xs)
	if len(xs) >= 3 {
		slope, _, r2 := weightedLine(xs, ys, ws)
		fit.LambdaLS = -slope
		fit.R2 = r2
	}
	return fit, nil
}

// weightedLine fits y = a + b·x by weighted least squares and returns b, a
// and the weighted coefficient of determination R² = 1 − SS_res/SS_tot.
func weightedLine(xs, ys, ws []float64) (slope, intercept, r2 float64) {
	var sw, sx, sy float64
	for i := range xs {
		sw += ws[i]
		sx += ws[i] * xs[i]
		sy += ws[i] * ys[i]
	}
	mx, my := sx/sw, sy/sw
	var sxx, sxy, syy float64
	for i := range xs {
		dx, dy := xs[i]-mx, ys[i]-my
		sxx += ws[i] * dx * dx
		sxy += ws[i] * dx * dy
		syy += ws[i] * dy * dy
	}
	slope = sxy / sxx
	intercept = my - slope*mx
	var ssr float64
	for i := range xs {
		r := ys[i] - intercept - slope*xs[i]
		ssr += ws[i] * r * r
	}
	r2 = 1 - ssr/syy
	return slope, intercept, r2
}
