package features

import (
	"math"
	"math/rand/v2"
	"slices"
)

// Grid is what Extract found out about the resolution of a series: whether
// its standardised samples lie on the uniform grid of a recorder's codes
// (an ADC with 8 to 4096 levels, or integer counts), and whether they were
// spread over their grid cells (dithered) before the families ran. See
// DetectGrid for the rule.
type Grid struct {
	// Step is the grid step q in standard deviations of the series; 0 when
	// no grid coarser than Standardise's rounding was found.
	Step float64 `json:"step"`
	// Levels is the number of distinct values (occupied levels); 0 when the
	// quick test found no repeated value to examine.
	Levels int `json:"levels"`
	// Repeated is the fraction of samples equal to an earlier sample,
	// 1 − Levels/n.
	Repeated float64 `json:"repeated"`
	// LowRail and HighRail count the samples at the lowest and the highest
	// level when they pile up there (more samples than on the level next
	// to it, and at least max(3, n/200)); 0 otherwise. Clipping does this,
	// and so does a distribution that peaks at its ends (the logistic map's
	// arcsine density). Rail cells are dithered like any other cell.
	LowRail  int `json:"low_rail,omitempty"`
	HighRail int `json:"high_rail,omitempty"`
	// Period is the period in samples of an exactly periodic series (left
	// as recorded); 0 otherwise.
	Period int `json:"period,omitempty"`
	// Persistence is the fraction of consecutive level changes that keep
	// the direction of the previous one: about 1/3 for i.i.d. noise, at
	// most about 1/2 for a random walk, near 1 for a smooth signal that
	// creeps through the grid.
	Persistence float64 `json:"persistence"`
	// Order is the probability w = min(1, max(0, (Persistence − 1/2)/0.1))
	// with which a run of equal samples was placed in order inside its
	// cell rather than at random (see DetectGrid).
	Order float64 `json:"order"`
	// Dithered reports whether the samples were spread over their cells.
	Dithered bool `json:"dithered"`
	// Reason says why a series was left as recorded; empty when dithered.
	Reason string `json:"reason,omitempty"`
}

// Thresholds of the grid detection (see DetectGrid).
const (
	// gridMinLevels: fewer occupied levels are read as a genuinely
	// discrete signal (two-level telegraph, square wave, a three- or
	// four-valued orbit or multi-trap telegraph), not as a quantised
	// continuous one.
	gridMinLevels = 5
	// gridMinRepeated: with fewer repeated samples there are too few ties
	// to matter.
	gridMinRepeated = 0.01
	// gridMinStep: a grid finer than 64 of Standardise's quanta
	// (≈ 3.8·10⁻⁶ sd) is indistinguishable from its rounding.
	gridMinStep = 64 * quantum
	// gridTolQuanta and gridTolRel: a value is on the grid when it lies
	// within max(3 quanta, 1% of q) of a grid point. Three quanta cover the
	// rounding of Standardise (half a quantum per value, one for the step
	// estimate); 1% of q covers codes written to a text file with six
	// significant digits on a large DC level.
	gridTolQuanta = 3 * quantum
	gridTolRel    = 0.01
	// railMinFraction: a rail pile must hold at least this share of the
	// samples (as the recording-quality warning does).
	railMinFraction = 0.005
	// orderRamp: the persistence above 1/2 at which runs are always placed
	// in order.
	orderRamp = 0.1
	// ditherStream is the second word of the PCG that draws the dither, so
	// that it does not replay the stream of any estimator seeded with
	// Options.Seed.
	ditherStream = 0x9e3779b97f4a7c15
)

// DetectGrid standardises x (Standardise) and reports whether it lies on
// a uniform grid, with the diagnostics Extract records in Vector.Grid.
//
// The rule, on the standardised series z of n samples:
//
//  1. Quick test, one pass, O(n): if no sample equals one of the three
//     before it and the minimum and the maximum each occur once, the series
//     is continuous for every purpose here and is left as it is (this is
//     all an unquantised trace costs).
//  2. Sort a copy (O(n log n)) and count the distinct values L. Left as
//     recorded when L < 5 (a genuinely discrete signal: two-level telegraph
//     noise, a square wave, a few-valued orbit), when fewer than 1% of the
//     samples repeat an earlier value, or when the smallest gap between
//     distinct values is below 64·2^−24 sd.
//  3. Grid step: q = (max − min)/K, K = round((max − min)/ḡ), ḡ the mean of
//     the gaps between neighbouring distinct values smaller than 1.5 times
//     the smallest gap. Every distinct value must lie within max(3·2^−24,
//     0.01·q) of min + k·q, else there is no uniform grid (a periodic orbit
//     with irrational values, a nonlinear read-out).
//  4. Left as recorded when the series is exactly periodic with a period
//     of at most n/2 (prefix function of Knuth, Morris & Pratt, SIAM J.
//     Comput. 6 (1977) 323, O(n)): a square, triangle or sawtooth wave or a
//     quantised sine of an integer period repeats bit for bit, and
//     dithering would only add noise to it.
//
// Otherwise the series is dithered (Extract; see dither). Integer counts
// with five or more distinct values are quantised in this sense and are
// dithered too: equal counts are then ordered at random, so counting noise
// reads as the noise it is (Zunino et al., Phys. Lett. A 381 (2017) 1883,
// show how equal values otherwise mimic ordinal structure).
func DetectGrid(x []float64) (Grid, error) {
	z, err := Standardise(x)
	if err != nil {
		return Grid{}, err
	}
	return detectGrid(z), nil
}

// detectGrid applies DetectGrid's rule to a standardised series.
func detectGrid(z []float64) Grid {
	n := len(z)
	if !hasTies(z) {
		return Grid{Reason: "no repeated values"}
	}
	s := slices.Clone(z)
	slices.Sort(s)
	lo, hi := s[0], s[n-1]
	levels := 1
	gmin := math.Inf(1)
	for i := 1; i < n; i++ {
		if s[i] != s[i-1] {
			levels++
			gmin = math.Min(gmin, s[i]-s[i-1])
		}
	}
	g := Grid{Levels: levels, Repeated: 1 - float64(levels)/float64(n)}
	switch {
	case levels < gridMinLevels:
		g.Reason = "fewer than 5 levels: a genuinely discrete signal"
		return g
	case g.Repeated < gridMinRepeated:
		g.Reason = "fewer than 1% repeated values"
		return g
	case gmin < gridMinStep:
		g.Reason = "no grid coarser than the standardisation rounding"
		return g
	}
	var sum float64
	var unit int
	for i := 1; i < n; i++ {
		if d := s[i] - s[i-1]; d > 0 && d < 1.5*gmin {
			sum += d
			unit++
		}
	}
	q := (hi - lo) / math.Round((hi-lo)/(sum/float64(unit)))
	tol := math.Max(gridTolQuanta, gridTolRel*q)
	for i, v := range s {
		if i > 0 && v == s[i-1] {
			continue
		}
		if d := v - lo; math.Abs(d-math.Round(d/q)*q) > tol {
			g.Reason = "values off a uniform grid"
			return g
		}
	}
	g.Step = q
	if p := smallestPeriod(z); p <= n/2 {
		g.Period = p
		g.Reason = "exactly periodic: a genuinely discrete periodic signal"
		return g
	}
	g.LowRail, g.HighRail = rails(s, q, tol)
	g.Persistence = persistence(z)
	g.Order = math.Min(1, math.Max(0, (g.Persistence-0.5)/orderRamp))
	g.Dithered = true
	return g
}

// hasTies reports whether any sample equals one of the three before it or
// the minimum or maximum occurs more than once.
func hasTies(z []float64) bool {
	n := len(z)
	for i := 1; i < min(n, 3); i++ {
		if z[i] == z[i-1] || i == 2 && z[2] == z[0] {
			return true
		}
	}
	for i := 3; i < n; i++ {
		if v := z[i]; v == z[i-1] || v == z[i-2] || v == z[i-3] {
			return true
		}
	}
	lo, hi := z[0], z[0]
	nlo, nhi := 0, 0
	for _, v := range z {
		if v <= lo {
			if v < lo {
				lo, nlo = v, 0
			}
			nlo++
		}
		if v >= hi {
			if v > hi {
				hi, nhi = v, 0
			}
			nhi++
		}
	}
	return nlo > 1 || nhi > 1
}

// rails returns the number of samples piled at the lowest and the highest
// level of the sorted series s on a grid of step q, 0 for a rail without a
// pile.
func rails(s []float64, q, tol float64) (low, high int) {
	n := len(s)
	lo, hi := s[0], s[n-1]
	var atLo, nextLo, atHi, nextHi int
	for _, v := range s {
		switch {
		case v == lo:
			atLo++
		case math.Abs(v-lo-q) <= tol:
			nextLo++
		}
		switch {
		case v == hi:
			atHi++
		case math.Abs(hi-q-v) <= tol:
			nextHi++
		}
	}
	minPile := max(3, int(railMinFraction*float64(n)))
	if atLo > nextLo && atLo >= minPile {
		low = atLo
	}
	if atHi > nextHi && atHi >= minPile {
		high = atHi
	}
	return low, high
}

// persistence returns the fraction of consecutive nonzero steps of z that
// have the sign of the step before them (0 when there are fewer than two).
func persistence(z []float64) float64 {
	same, total := 0, 0
	last := 0.0
	for i := 1; i < len(z); i++ {
		d := z[i] - z[i-1]
		if d == 0 {
			continue
		}
		if last != 0 {
			total++
			if (d > 0) == (last > 0) {
				same++
			}
		}
		last = d
	}
	if total == 0 {
		return 0
	}
	return float64(same) / float64(total)
}

// smallestPeriod returns the smallest p such that z[i] = z[i+p] for every
// valid i (n when z does not repeat), from the prefix function of Knuth,
// Morris & Pratt, SIAM J. Comput. 6 (1977) 323, in O(n).
func smallestPeriod(z []float64) int {
	n := len(z)
	pi := make([]int32, n)
	for i := 1; i < n; i++ {
		k := int(pi[i-1])
		for k > 0 && z[i] != z[k] {
			k = int(pi[k-1])
		}
		if z[i] == z[k] {
			k++
		}
		pi[i] = int32(k)
	}
	return n - int(pi[n-1])
}

// dither spreads every sample of z, which lies on the grid g, over its
// grid cell: y_i = z_i + q·(f_i − ½) with f_i ∈ [0, 1) drawn from rng, the
// cell being [z_i − q/2, z_i + q/2). The recorded code says only that the
// value lay in its cell, and uniform noise over one cell is the quantiser's
// noise model (Widrow & Kollár, Quantization Noise, Cambridge 2008). Two
// samples in different cells keep their order; samples sharing a cell get
// distinct values, so no ties are left. The rail cells of a clipped series
// are treated like the others: the clipped tail is not reconstructed, the
// pile only becomes a band one cell wide.
//
// How f_i is drawn depends on the run of equal consecutive samples
// z_a = … = z_b (m = b − a + 1) that holds i, j = i − a, u_j uniform on
// [0, 1):
//
//   - m = 1, a run at either end of the series, or (probability 1 − w) any
//     run: f = u_j, uniform over the cell.
//   - with probability w = g.Order, a run entered and left on opposite
//     sides (z_{a−1} < z_a < z_{b+1} or the reverse): the series crept
//     through the cell, so the run is spread across it in order, f =
//     (j + u_j)/m (rising; 1 − that when falling): linear interpolation
//     with jitter inside each m-th of the cell.
//   - with probability w, a run entered and left on the same side: the
//     series turned inside the cell, so the run is placed on a parabola
//     whose apex h (uniform on [0, 1)) lies inside it, f = h·(1 − t²),
//     t = 2(j + u_j)/m − 1 (a peak; 1 − that for a valley).
//
// w comes from the persistence of the level changes (Grid.Order): 0 for
// i.i.d. noise, random walks and chaotic maps, whose consecutive samples
// are independent at the scale of the grid, so that every sample is spread
// uniformly and an i.i.d. series stays i.i.d.; 1 for smooth signals (flows
// sampled finely), whose staircases would otherwise turn into noise. Our
// rule; the interpolation of staircases is common practice.
func dither(z []float64, g Grid, rng *rand.Rand) []float64 {
	n := len(z)
	q, w := g.Step, g.Order
	y := make([]float64, n)
	for a := 0; a < n; {
		b := a
		for b+1 < n && z[b+1] == z[a] {
			b++
		}
		m := b - a + 1
		const (
			uniform = iota
			through
			turning
		)
		shape, rising, apex := uniform, true, 0.0
		if m >= 2 && a > 0 && b+1 < n && w > 0 && (w >= 1 || rng.Float64() < w) {
			rising = z[a] > z[a-1]
			shape = through
			if (z[b+1] > z[b]) != rising {
				shape = turning
				apex = rng.Float64()
			}
		}
		for j := range m {
			u := rng.Float64()
			f := u
			switch shape {
			case through:
				f = (float64(j) + u) / float64(m)
			case turning:
				t := 2*(float64(j)+u)/float64(m) - 1
				f = apex * (1 - t*t)
			}
			if shape != uniform && !rising {
				f = 1 - f
			}
			y[a+j] = z[a] + q*(f-0.5)
		}
		a = b + 1
	}
	return y
}
