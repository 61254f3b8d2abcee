package campaign

import (
	"math"
	"math/big"
	"math/rand/v2"
	"sort"

	"gonum.org/v1/gonum/stat/distuv"
)

// Defaults of the trace-level permutation tests.
const (
	// DefaultExactLimit is the largest number of relabellings enumerated
	// exactly; beyond it DefaultPermutations random ones are drawn.
	DefaultExactLimit = 20000
	// DefaultPermutations is the Monte Carlo count: p ≥ 1/10⁴.
	DefaultPermutations = 9999
	// DefaultBins is the number of equal-probability bins of a
	// distribution with more than MaxDiscreteBins distinct values.
	DefaultBins = 20
	// MaxDiscreteBins: a distribution with at most this many distinct
	// values (over all traces compared) gets one bin per value — degrees,
	// and the HVG clustering coefficients, which take few discrete values.
	MaxDiscreteBins = 40
)

// support is the common grid of several per-trace distributions: cdf[i]
// holds trace i's CDF at every grid point, equal weight per trace.
type support struct {
	grid []float64
	cdf  [][]float64
	// edges are the indices into grid that close each bin: bin b holds
	// the grid points (edges[b−1], edges[b]].
	edges []int
	// discrete is true when every distinct value is a bin.
	discrete bool
}

// newSupport builds the grid and the bins of the given distributions.
func newSupport(ds []*Distribution) *support {
	seen := map[float64]bool{}
	for _, d := range ds {
		for _, x := range d.X {
			seen[x] = true
		}
	}
	s := &support{grid: make([]float64, 0, len(seen))}
	for x := range seen {
		s.grid = append(s.grid, x)
	}
	sort.Float64s(s.grid)
	s.cdf = make([][]float64, len(ds))
	for i, d := range ds {
		s.cdf[i] = cdfOn(d, s.grid)
	}
	g := len(s.grid)
	if g <= MaxDiscreteBins {
		s.discrete = true
		s.edges = make([]int, g)
		for k := range s.edges {
			s.edges[k] = k
		}
		return s
	}
	// Equal-probability bins of the pooled distribution: close a bin at
	// the first grid point where the pooled CDF reaches j/DefaultBins.
	pooled := mean(s.cdf, nil)
	for j := 1; j <= DefaultBins; j++ {
		p := float64(j) / DefaultBins
		k := sort.Search(g, func(k int) bool { return pooled[k] >= p-1e-12 })
		k = min(k, g-1)
		if j == DefaultBins {
			k = g - 1
		}
		if len(s.edges) == 0 || k > s.edges[len(s.edges)-1] {
			s.edges = append(s.edges, k)
		}
	}
	return s
}

// cdfOn returns F(grid[k]) of d, its weights normalised to 1.
func cdfOn(d *Distribution, grid []float64) []float64 {
	total := 0.0
	for _, w := range d.W {
		total += w
	}
	out := make([]float64, len(grid))
	j, cum := 0, 0.0
	for k, x := range grid {
		for j < len(d.X) && d.X[j] <= x {
			cum += d.W[j]
			j++
		}
		out[k] = cum / total
	}
	return out
}

// mean returns the mean of the vectors vs[i] for i in idx (all when idx is
// nil).
func mean(vs [][]float64, idx []int) []float64 {
	out := make([]float64, len(vs[0]))
	n := 0
	add := func(v []float64) {
		for k := range out {
			out[k] += v[k]
		}
		n++
	}
	if idx == nil {
		for _, v := range vs {
			add(v)
		}
	} else {
		for _, i := range idx {
			add(vs[i])
		}
	}
	for k := range out {
		out[k] /= float64(n)
	}
	return out
}

// ksDistance is max_k |a[k] − b[k]| of two CDFs on a common grid.
func ksDistance(a, b []float64) float64 {
	d := 0.0
	for k := range a {
		d = math.Max(d, math.Abs(a[k]-b[k]))
	}
	return d
}

// chiDistance is the symmetric χ² distance Σ_b (p_b − q_b)²/(p_b + q_b)
// of the bin probabilities of two CDFs (bins with p_b + q_b = 0 add
// nothing); it lies in [0, 2].
func (s *support) chiDistance(a, b []float64) float64 {
	d := 0.0
	prevA, prevB := 0.0, 0.0
	for _, k := range s.edges {
		pa, pb := a[k]-prevA, b[k]-prevB
		prevA, prevB = a[k], b[k]
		if t := pa + pb; t > 0 {
			d += (pa - pb) * (pa - pb) / t
		}
	}
	return d
}

// binProbabilities returns the bin edges (upper values) and the
// probabilities of the CDF F in s's bins.
func (s *support) binProbabilities(F []float64) (upper, p []float64) {
	prev := 0.0
	for _, k := range s.edges {
		upper = append(upper, s.grid[k])
		p = append(p, F[k]-prev)
		prev = F[k]
	}
	return upper, p
}

// permResult is a permutation test's outcome.
type permResult struct {
	KS, Chi     float64 // observed statistics
	PKS, PChi   float64
	MinP        float64 // smallest attainable p
	Exact       bool
	Relabelings int
}

// twoSample tests whether the traces 0…na−1 and na…na+nb−1 of s (their
// CDFs) come from one population: the statistics are the KS and χ²
// distances of the two groups' pooled (equal weight per trace)
// distributions, and the p-values count the relabellings of traces to
// groups — all C(na+nb, na) when at most limit, otherwise perms random
// ones (p = (1 + #{T* ≥ T})/(perms + 1)) — whose statistic reaches the
// observed one. The trace, not the node or the increment, is the unit
// exchanged, so the dependence between the values of one trace does not
// make the test liberal (a permutation test on the units that were
// randomised; Good, Permutation Tests, Springer 2000, ch. 3, memory).
func (s *support) twoSample(na, nb, limit, perms int, rng *rand.Rand) permResult {
	n := na + nb
	all := make([]int, n)
	for i := range all {
		all[i] = i
	}
	g := len(s.grid)
	total := make([]float64, g)
	for _, c := range s.cdf {
		for k, v := range c {
			total[k] += v
		}
	}
	fa, fb := make([]float64, g), make([]float64, g)
	stat := func(idxA []int) (float64, float64) {
		clear(fa)
		for _, i := range idxA {
			for k, v := range s.cdf[i] {
				fa[k] += v
			}
		}
		for k := range fa {
			fb[k] = (total[k] - fa[k]) / float64(nb)
			fa[k] /= float64(na)
		}
		return ksDistance(fa, fb), s.chiDistance(fa, fb)
	}
	r := permResult{}
	r.KS, r.Chi = stat(all[:na])
	tolKS, tolChi := 1e-12*math.Max(1, r.KS), 1e-12*math.Max(1, r.Chi)
	geKS, geChi := 0, 0
	count := binomial(n, na)
	if count <= float64(limit) {
		r.Exact = true
		idx := make([]int, na)
		for i := range idx {
			idx[i] = i
		}
		visited := 0
		for {
			ks, chi := stat(idx)
			visited++
			if ks >= r.KS-tolKS {
				geKS++
			}
			if chi >= r.Chi-tolChi {
				geChi++
			}
			if !nextCombination(idx, n) {
				break
			}
		}
		r.Relabelings = visited
		r.PKS, r.PChi = float64(geKS)/float64(visited), float64(geChi)/float64(visited)
		r.MinP = 1 / float64(visited)
		if na == nb {
			r.MinP = 2 / float64(visited) // a labelling and its swap give the same statistic
		}
		return r
	}
	perm := make([]int, n)
	for b := 0; b < perms; b++ {
		copy(perm, all)
		rng.Shuffle(n, func(i, j int) { perm[i], perm[j] = perm[j], perm[i] })
		ks, chi := stat(perm[:na])
		if ks >= r.KS-tolKS {
			geKS++
		}
		if chi >= r.Chi-tolChi {
			geChi++
		}
	}
	r.Relabelings = perms
	r.PKS = float64(1+geKS) / float64(perms+1)
	r.PChi = float64(1+geChi) / float64(perms+1)
	r.MinP = 1 / float64(perms+1)
	return r
}

// pairedFlip tests whether the paired CDFs orig[i] and surr[i] (one trace
// and its surrogates) differ: the statistic is the KS distance between
// the pooled originals and the pooled surrogates; the null swaps the two
// within each trace (2^n sign patterns, all when 2^n ≤ limit, otherwise
// perms random ones).
func pairedFlip(orig, surr [][]float64, limit, perms int, rng *rand.Rand) (d, p, minP float64, exact bool) {
	n := len(orig)
	stat := func(flip func(i int) bool) float64 {
		a := make([]float64, len(orig[0]))
		b := make([]float64, len(orig[0]))
		for i := 0; i < n; i++ {
			x, y := orig[i], surr[i]
			if flip(i) {
				x, y = y, x
			}
			for k := range a {
				a[k] += x[k]
				b[k] += y[k]
			}
		}
		for k := range a {
			a[k] /= float64(n)
			b[k] /= float64(n)
		}
		return ksDistance(a, b)
	}
	d = stat(func(int) bool { return false })
	tol := 1e-12 * math.Max(1, d)
	ge := 0
	if n < 62 && float64(uint64(1)<<n) <= float64(limit) {
		total := 1 << n
		for mask := 0; mask < total; mask++ {
			if stat(func(i int) bool { return mask&(1<<i) != 0 }) >= d-tol {
				ge++
			}
		}
		return d, float64(ge) / float64(total), 2 / float64(total), true
	}
	flips := make([]bool, n)
	for b := 0; b < perms; b++ {
		for i := range flips {
			flips[i] = rng.IntN(2) == 1
		}
		if stat(func(i int) bool { return flips[i] }) >= d-tol {
			ge++
		}
	}
	return d, float64(1+ge) / float64(perms+1), 1 / float64(perms+1), false
}

// gaussDistance is sup |F(x) − Φ(x)| of a CDF on a grid, checked on both
// sides of every step.
func gaussDistance(grid, F []float64) float64 {
	d, prev := 0.0, 0.0
	for k, x := range grid {
		phi := distuv.UnitNormal.CDF(x)
		d = math.Max(d, math.Max(math.Abs(F[k]-phi), math.Abs(prev-phi)))
		prev = F[k]
	}
	return d
}

// nextCombination advances idx (ascending indices < n) to the next
// combination in lexicographic order; false after the last.
func nextCombination(idx []int, n int) bool {
	k := len(idx)
	i := k - 1
	for i >= 0 && idx[i] == n-k+i {
		i--
	}
	if i < 0 {
		return false
	}
	idx[i]++
	for j := i + 1; j < k; j++ {
		idx[j] = idx[j-1] + 1
	}
	return true
}

// binomial returns C(n, k) as a float64 (exact for the sizes used here,
// +Inf past float64 range).
func binomial(n, k int) float64 {
	if k < 0 || k > n {
		return 0
	}
	f, _ := new(big.Float).SetInt(new(big.Int).Binomial(int64(n), int64(k))).Float64()
	return f
}
