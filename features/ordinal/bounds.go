package ordinal

import (
	"fmt"
	"math"
)

// PlanePoint is a point (H_S, C_JS) of the complexity–entropy plane.
type PlanePoint struct {
	Entropy, Complexity float64
}

// Bounds returns the smallest and largest statistical complexity C_JS that
// any distribution over the d! ordinal patterns of the given order can have
// at normalised entropy h ∈ [0, 1]. The minimum is reached by the family
// with one probability p ≥ 1/N and the other N−1 equal; the maximum by the
// families with m zero probabilities, one probability p ≤ 1/(N−m) and the
// remaining N−m−1 equal, m = 0 … N−2, each family covering the entropy range
// [ln(N−m−1), ln(N−m)]/ln N. Martin, Plastino & Rosso, Physica A 369 (2006)
// 439 (checked: search.r-project.org/CRAN/refmans/statcomp/html/maxd6.html); the extremality is checked numerically in the package tests.
func Bounds(order int, h float64) (cmin, cmax float64, err error) {
	if order < MinOrder || order > MaxOrder {
		return 0, 0, fmt.Errorf("complexity bounds: %w: order %d, want %d ≤ d ≤ %d", ErrBadOption, order, MinOrder, MaxOrder)
	}
	if math.IsNaN(h) || h < 0 || h > 1 {
		return 0, 0, fmt.Errorf("complexity bounds: %w: entropy %g, want 0 ≤ h ≤ 1", ErrBadOption, h)
	}
	cmin, cmax = bounds(factorial(order), h)
	return cmin, cmax, nil
}

// BoundaryCurves returns the lower and upper boundary of the
// complexity–entropy plane for the given order, sampled at points entropies
// spaced evenly over [0, 1] (points ≥ 2), for plotting.
func BoundaryCurves(order, points int) (lower, upper []PlanePoint, err error) {
	if points < 2 {
		return nil, nil, fmt.Errorf("complexity boundary: %w: %d points, want ≥ 2", ErrBadOption, points)
	}
	lower = make([]PlanePoint, points)
	upper = make([]PlanePoint, points)
	for i := range lower {
		h := float64(i) / float64(points-1)
		lo, hi, err := Bounds(order, h)
		if err != nil {
			return nil, nil, err
		}
		lower[i] = PlanePoint{h, lo}
		upper[i] = PlanePoint{h, hi}
	}
	return lower, upper, nil
}

// bounds computes the two extremes for n states at entropy h in [0, 1].
func bounds(n int, h float64) (cmin, cmax float64) {
	if h <= 0 || h >= 1 {
		return 0, 0
	}
	lnN := math.Log(float64(n))
	// Lower boundary: p ∈ [1/n, 1]; the entropy falls from 1 to 0 as p grows.
	p := bisect(1/float64(n), 1, h, false, func(p float64) float64 { return family(n, 0, p).h / lnN })
	cmin = family(n, 0, p).c(n)
	// Upper boundary: k = n − m nonzero probabilities with k−1 ≤ n^h ≤ k.
	k := int(math.Ceil(math.Exp(h * lnN)))
	if k < 2 {
		k = 2
	}
	if k > n {
		k = n
	}
	m := n - k
	p = bisect(0, 1/float64(k), h, true, func(p float64) float64 { return family(n, m, p).h / lnN })
	cmax = family(n, m, p).c(n)
	return cmin, cmax
}

// bisect finds p in [lo, hi] with f(p) = target for a monotone f
// (increasing when inc is true).
func bisect(lo, hi, target float64, inc bool, f func(float64) float64) float64 {
	for i := 0; i < 100; i++ {
		mid := (lo + hi) / 2
		if (f(mid) < target) == inc {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}

// planeStat holds the Shannon entropy (nats) and the entropy of the
// mixture with the uniform distribution of a boundary family member.
type planeStat struct {
	h, hm float64
}

// c returns the statistical complexity of the member over n states.
func (s planeStat) c(n int) float64 {
	lnN := math.Log(float64(n))
	js := s.hm - s.h/2 - lnN/2
	if js < 0 {
		js = 0
	}
	return Q0(n) * js * s.h / lnN
}

// family evaluates the distribution with m zeros, one probability p and
// n−m−1 probabilities (1−p)/(n−m−1), in O(1).
func family(n, m int, p float64) planeStat {
	rest := float64(n - m - 1)
	q := (1 - p) / rest
	pe := 1 / float64(n)
	var s planeStat
	s.h = -xlogx(p) - rest*xlogx(q)
	s.hm = -xlogx((p+pe)/2) - rest*xlogx((q+pe)/2) - float64(m)*xlogx(pe/2)
	return s
}

// xlogx returns x·ln x with 0·ln 0 = 0.
func xlogx(x float64) float64 {
	if x <= 0 {
		return 0
	}
	return x * math.Log(x)
}
