package classifier

import (
	"math"
)

// Thresholds of the clipping rule (see railPileAt).
const (
	// clipMinFraction: a rail pile must hold at least this share of the
	// samples, and at least clipMinCount of them, to be reported (a
	// smaller pile cannot move the features; features.DetectGrid uses the
	// same share for its rail cells).
	clipMinFraction = 0.005
	clipMinCount    = 3
	// clipMinLevels: with fewer distinct values the series is read as
	// genuinely discrete (a telegraph signal, a square wave), whose
	// extreme level is a state, not a rail (features.DetectGrid's rule).
	clipMinLevels = 5
	// turningPointRatio = 1/(√2 − 1): the most an unclipped extreme level
	// can hold relative to the level next to it when the signal turns
	// smoothly there. Near a quadratic maximum M the time spent within u
	// of M grows as √u, so the extreme level (width at most one step q)
	// holds at most ∝ √q and its neighbour ∝ √(2q) − √q (analytic; the
	// arcsine density of a sine or of the logistic map at r = 4).
	turningPointRatio = 1 / (math.Sqrt2 - 1)
	// clipExcess: the pile must exceed the largest unclipped count by this
	// factor, and by clipZ standard deviations of its scatter (margins for
	// slow, correlated traces, whose level counts come from few
	// excursions). clipShapeZ sets the upper confidence limit of the
	// inner levels' trend that picks the edge shape.
	clipExcess = 1.5
	clipZ      = 3.0
	clipShapeZ = 3.0
	// clipShapeCount and clipMaxInner: the inner levels are grouped so
	// that the trend rests on at least this many samples, using at most
	// this many levels.
	clipShapeCount = 400
	clipMaxInner   = 64
)

// railPile is what the clipping rule found at one end of the value range.
type railPile struct {
	// Count is the number of samples on the extreme level and Next the
	// number on the level one grid step inward (each level counted within
	// ±q/2 of its code).
	Count, Next int
	// Bound is the largest count an unclipped extreme level reaches given
	// the levels inside it (see railPileAt); Z is Count − Bound in
	// standard deviations of its scatter.
	Bound, Z float64
	// Clipped reports a pile-up: Count ≥ max(3, 0.5% of n), Count >
	// clipExcess·Bound and Z ≥ clipZ.
	Clipped bool
}

// gridStep returns the smallest gap between neighbouring distinct values
// of the sorted series s, ignoring gaps below 10⁻⁹ of its range (rounding
// of the text it was read from); 0 when s holds fewer than two values.
func gridStep(s []float64) float64 {
	n := len(s)
	if n < 2 || !(s[n-1] > s[0]) {
		return 0
	}
	tol := 1e-9 * (s[n-1] - s[0])
	q := math.Inf(1)
	for i := 1; i < n; i++ {
		if d := s[i] - s[i-1]; d > tol && d < q {
			q = d
		}
	}
	return q
}

// railPileAt applies the clipping rule to one end of the series x (high:
// the maximum, else the minimum); s is x sorted and q the grid step
// (gridStep).
//
// A converter that clips puts every sample beyond its rail on the rail
// code, so the extreme level holds the whole tail of the distribution
// beyond it: a pile-up. A coarse converter that does not clip shows the
// extreme level of a distribution that thins out or turns there, and that
// level holds no more than the levels beside it allow. With counts c₀ on
// the extreme level and c₁ … c₄ on the four levels inward:
//
//   - a density that does not rise towards the rail (the tail of a noise,
//     a flat top) fills the extreme level, at most one step wide, no more
//     than its neighbour: c₀ ≤ c₁;
//   - a density that rises towards it as u^{b−1} (u the distance from the
//     extreme, b = 1/2 at the smooth turning points of an oscillation or a
//     bounded map) gives at most c₀ = c₁/(2^b − 1), and 1/(√2 − 1) = 2.41
//     at b = 1/2 (turningPointRatio); b is read from the trend
//     (c₁ + c₂)/(c₃ + c₄) of the inner levels, taken at its upper
//     3-standard-deviation confidence limit (edgeRatio).
//
// The level is clipped when c₀ exceeds that bound B by clipExcess and by
// three standard deviations of c₀ − B, the Poisson variance of the counts
// inflated by the mean run length of the inner levels (consecutive
// samples of a slow trace share a level). Continuous data (no grid) have
// a tiny q, empty neighbouring levels and a single sample at each end
// unless an analog stage saturated, which piles equal values there and is
// reported the same way.
func railPileAt(x, s []float64, q float64, high bool) railPile {
	n := len(s)
	r, dir := s[0], 1.0
	if high {
		r, dir = s[n-1], -1.0
	}
	// Counts on the extreme level and on each of the first clipMaxInner
	// levels inward; runs of consecutive samples on the inner levels.
	var c [clipMaxInner + 1]int
	var runs int
	prev := -1
	for _, v := range x {
		k := int(math.Round(dir * (v - r) / q))
		if k < 0 || k > clipMaxInner { // k < 0: rounding of the rail value
			if k < 0 {
				k = 0
			} else {
				prev = -1
				continue
			}
		}
		c[k]++
		if k != prev && k > 0 {
			runs++
		}
		prev = k
	}
	// Group the inner levels in blocks of g so that the trend is read from
	// at least clipShapeCount samples (or all clipMaxInner levels).
	g := 1
	for ; 4*g < clipMaxInner; g *= 2 {
		if sum(c[1:4*g+1]) >= clipShapeCount {
			break
		}
	}
	g = min(g, clipMaxInner/4)
	in, out := float64(sum(c[1:2*g+1])), float64(sum(c[2*g+1:4*g+1]))
	ell := 1.0 // mean run length on the inner levels
	if runs > 0 {
		ell = math.Max(1, float64(sum(c[1:]))/float64(runs))
	}
	rho := math.Inf(1)
	if in > 0 && out > 0 {
		rho = in / out * math.Exp(clipShapeZ*math.Sqrt(ell*(1/in+1/out)))
	}
	c0, c1 := float64(c[0]), float64(c[1])
	ratio := edgeRatio(rho, g)
	p := railPile{Count: c[0], Next: c[1], Bound: ratio * c1, Z: math.Inf(1)}
	if v := ell * (c0 + ratio*ratio*c1); v > 0 {
		p.Z = (c0 - p.Bound) / math.Sqrt(v)
	}
	minPile := max(clipMinCount, int(math.Ceil(clipMinFraction*float64(n))))
	p.Clipped = p.Count >= minPile && c0 > clipExcess*p.Bound && p.Z >= clipZ
	return p
}

// edgeRatio returns the largest ratio c₀/c₁ of the extreme level's count
// to its neighbour's for an edge density ∝ u^{b−1} (u the distance from
// the extreme, 1/2 ≤ b ≤ 1) whose inner levels show the trend rho =
// (c₁ + c₂)/(c₃ + c₄). With the extreme level one full step wide (the
// largest c₀), the level counts are ∝ (k+1)^b − k^b, so rho = (3^b − 1)/
// (5^b − 3^b) and c₀/c₁ = 1/(2^b − 1) (analytic). b = 1 is a flat density
// (1), b = 1/2 a smooth turning point (turningPointRatio, rho = 1.45); rho
// ≤ 1 (a tail thinning towards the rail) gives 1, the bound of any density
// that does not rise towards it.
func edgeRatio(rho float64, g int) float64 {
	gg := float64(g)
	shape := func(b float64) float64 {
		a := math.Pow(2*gg+1, b)
		return (a - 1) / (math.Pow(4*gg+1, b) - a)
	}
	switch {
	case rho <= 1:
		return 1
	case rho >= shape(0.5):
		return turningPointRatio
	}
	lo, hi := 0.5, 1.0 // shape falls as b grows
	for range 50 {
		mid := (lo + hi) / 2
		if shape(mid) > rho {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 1 / (math.Pow(2, (lo+hi)/2) - 1)
}

// sum returns the sum of c.
func sum(c []int) int {
	s := 0
	for _, v := range c {
		s += v
	}
	return s
}
