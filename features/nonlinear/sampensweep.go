package nonlinear

import (
	"cmp"
	"slices"
)

// pairsWithin2 returns the number of pairs i < j of the templates
// (x_i, x_{i+1}), i = 0..nt−1, with |x_i − x_j| ≤ r and
// |x_{i+1} − x_{j+1}| ≤ r — sample entropy's B for m = 2 — in
// O(nt log nt), by a sweep with a Fenwick tree (offline orthogonal range
// counting: de Berg et al., Computational Geometry, 3rd ed. (2008), ch. 5
// (memory)).
//
// For each coordinate the templates are sorted by value (one sort of the
// samples serves both coordinates). Rounded
// subtraction is monotone, so the templates that match a value v in that
// coordinate, |v − u| ≤ r with the difference rounded as the pairwise test
// rounds it, form one contiguous run of the sorted order, found with two
// pointers. Template i then counts the templates whose position in the
// first order lies in its first run and whose position in the second
// order lies in its second run; a sweep over the first order inserts the
// templates into a Fenwick tree indexed by the second, and each count is
// the difference of two prefix queries. The count is exactly that of
// testing every pair.
func pairsWithin2(x []float64, nt int, r float64) int64 {
	if nt < 2 {
		return 0
	}
	// One sort of x_0..x_nt gives both orders: the first coordinates are
	// x_0..x_{nt−1}, the second ones x_1..x_nt.
	type entry struct {
		v float64
		i int32
	}
	e := make([]entry, nt+1)
	for i, v := range x[:nt+1] {
		e[i] = entry{v, int32(i)}
	}
	slices.SortFunc(e, func(a, b entry) int { return cmp.Compare(a.v, b.v) })
	order0, order1 := make([]int32, 0, nt), make([]int32, 0, nt)
	s0, s1 := make([]float64, 0, nt), make([]float64, 0, nt)
	for _, en := range e {
		if int(en.i) < nt {
			order0, s0 = append(order0, en.i), append(s0, en.v)
		}
		if en.i >= 1 {
			order1, s1 = append(order1, en.i-1), append(s1, en.v)
		}
	}
	lo0, hi0 := matchRuns(s0, r)
	lo1, hi1 := matchRuns(s1, r)
	// pos1[i]: position of template i in the second order.
	pos1 := make([]int32, nt)
	for p, i := range order1 {
		pos1[i] = int32(p)
	}
	// Run of template i in the second order, by template.
	rlo, rhi := make([]int32, nt), make([]int32, nt)
	for p, i := range order1 {
		rlo[i], rhi[i] = lo1[p], hi1[p]
	}
	// Queries: at sweep position q (templates at first-order positions
	// ≤ q inserted), add sign × count of second-order positions in the
	// run of template i. Bucketed by q (counting sort).
	type query struct {
		i    int32
		sign int64
	}
	start := make([]int32, nt+1)
	for p := range order0 {
		start[hi0[p]]++
		if lo0[p] > 0 {
			start[lo0[p]-1]++
		}
	}
	for q, sum := 0, int32(0); q <= nt; q++ {
		c := start[q]
		start[q] = sum
		sum += c
	}
	queries := make([]query, 2*nt)
	fill := slices.Clone(start)
	for p, i := range order0 {
		queries[fill[hi0[p]]] = query{i, 1}
		fill[hi0[p]]++
		if lo0[p] > 0 {
			queries[fill[lo0[p]-1]] = query{i, -1}
			fill[lo0[p]-1]++
		}
	}
	fen := make([]int32, nt+1)
	var ordered int64
	for q, i := range order0 {
		for k := pos1[i] + 1; int(k) <= nt; k += k & -k {
			fen[k]++
		}
		for _, qu := range queries[start[q]:start[q+1]] {
			c := fenwickSum(fen, rhi[qu.i]+1) - fenwickSum(fen, rlo[qu.i])
			ordered += qu.sign * int64(c)
		}
	}
	// Every template matches itself; each unordered pair counts twice.
	return (ordered - int64(nt)) / 2
}

// fenwickSum returns the sum of the first k entries of a Fenwick tree.
func fenwickSum(fen []int32, k int32) int32 {
	var s int32
	for ; k > 0; k -= k & -k {
		s += fen[k]
	}
	return s
}

// matchRuns returns, for each position p of the sorted values s, the run
// [lo[p], hi[p]] of positions q whose values match s_p: |s_q − s_p| ≤ r,
// the difference rounded as computed pairwise (fl(s_p − s_q) ≤ r below p,
// fl(s_q − s_p) ≤ r above).
func matchRuns(s []float64, r float64) (lo, hi []int32) {
	n := len(s)
	lo, hi = make([]int32, n), make([]int32, n)
	a, b := 0, 0
	for p, u := range s {
		for u-s[a] > r {
			a++
		}
		b = max(b, p)
		for b+1 < n && s[b+1]-u <= r {
			b++
		}
		lo[p], hi[p] = int32(a), int32(b)
	}
	return lo, hi
}
