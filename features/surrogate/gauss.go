package surrogate

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
)

// Gaussianise returns the rank-order Gaussianisation of x: each value is
// replaced by the standard normal quantile Φ⁻¹((r+0.5)/n) of its rank r
// (0-based; tied values share their mid-rank, so ties stay tied). It keeps
// the temporal order of the data exactly (x_i < x_j ⇔ g_i < g_j) and
// removes fat tails and any other feature of the marginal distribution;
// the result has mean ≈ 0 and sd ≈ 1 whatever the scale and offset of x.
// Rank-based transform, common practice. x must be finite and non-empty.
func Gaussianise(x []float64) ([]float64, error) {
	if len(x) == 0 {
		return nil, fmt.Errorf("gaussianise: %w: empty series", ErrTooShort)
	}
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("gaussianise: %w: value %g at index %d", ErrNonFinite, v, i)
		}
	}
	s := newSorter(len(x))
	order := s.argsort(x)
	sorted := make([]float64, len(x))
	for j, i := range order {
		sorted[j] = x[i]
	}
	q := gaussQuantiles(len(x), tieGroups(sorted))
	out := make([]float64, len(x))
	for j, i := range order {
		out[i] = q[j]
	}
	return out, nil
}

// gaussianSurrogate writes a Gauss surrogate into dst: the values at each
// rank position are a sorted sample of n N(0,1) draws (or the fixed
// quantiles when Options.GaussQuantiles), in the rank order of x; a run of
// tied data values gets the mean of its Gaussian values, so ties stay tied.
func gaussianSurrogate(dst []float64, p *prepared, rng *rand.Rand, w *workspace) {
	q := p.quant
	if q == nil {
		for i := range w.g {
			w.g[i] = rng.NormFloat64()
		}
		slices.Sort(w.g)
		for gi := 0; gi+1 < len(p.groups); gi++ {
			a, b := p.groups[gi], p.groups[gi+1]
			if b-a == 1 {
				continue
			}
			var s float64
			for j := a; j < b; j++ {
				s += w.g[j]
			}
			s /= float64(b - a)
			for j := a; j < b; j++ {
				w.g[j] = s
			}
		}
		q = w.g
	}
	for j, i := range p.order {
		dst[i] = q[j]
	}
}
