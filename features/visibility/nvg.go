package visibility

import "math"

// Natural returns the natural visibility graph of x: samples a < b are linked
// iff every c with a < c < b lies strictly below the straight line joining
// (a, x_a) and (b, x_b), i.e. x_c < x_b + (x_a − x_b)(b − c)/(b − a). A point
// exactly on the line blocks (it is not strictly below); consecutive samples
// always see each other. Lacasa et al., PNAS 105 (2008) 4972.
//
// Algorithm: divide and conquer at the maximum (Lan et al., Chaos 25 (2015)
// 083105). The maximum m of a segment sees, on each side, exactly the
// records of the slope (x_c − x_m)/|c − m| met while sweeping away from m,
// and no sample left of m sees one right of m (m blocks it: a line between
// them passes m at a height ≤ x_m). The segments left and right of m are then
// split at their own maxima. Those maxima form the Cartesian tree of x, built
// here in O(n) with a stack, and the tree is walked with an explicit stack, so
// monotone or trending input cannot overflow the call stack. The geometric
// test is exact (see crossSign), so the result equals the definition even
// with ties and collinear points.
//
// Each sweep walks m's Cartesian subtree in order of distance from m and
// skips a whole subtree when its maximum, placed at its far end, is not above
// the current record line (then no sample in it can be). On noise-like input
// this costs O(n log n) on average (Lan et al.). Where the tree is deep —
// monotone, concave or strongly trending stretches — the walk alone would be
// O(n) per sweep and O(n²) in all (a concave monotone series has n − 1 edges
// but n²/2 candidate tests; a trend of 0.3σ per sample on 10^6 samples would
// take hours). So a sweep that has walked more than 128 + 48·(edges found)
// subtree frames finishes by ray shooting on a segment tree of upper convex
// hulls (hullTree, built once on first need, O(n log n)): each further
// visible sample costs O(log² n). Measured on one core at n = 10^6: white
// noise 0.2–0.45 s, Brownian motion ≈ 1 s, trend + noise ≈ 1 s; at
// n = 4·10^4, √i (a path) takes 0.1 s instead of 18 s.
//
// The worst case left is output size: a convex sequence has n(n−1)/2 edges
// (every pair sees each other); construction stops with ErrTooManyEdges once
// Options.MaxEdges is passed, before memory runs out. NVGs are unchanged by
// adding a linear trend a·i + b to x (in exact arithmetic: lines stay
// lines), so a trended series gives the graph of the detrended one; only the
// work differs.
//
// x must be finite (ErrNonFinite) and non-empty (ErrEmpty).
func Natural(x []float64, opts Options) (*Graph, error) {
	if err := checkSeries(x, "natural visibility"); err != nil {
		return nil, err
	}
	n := len(x)
	maxEdges := opts.maxEdges()
	left, right, root := cartesianTree(x)

	sw := &sweeper{
		x: x, left: left, right: right,
		stack: make([]frame, 0, 64),
	}
	type seg struct{ m, l, r int32 }
	stack := make([]seg, 0, 64)
	stack = append(stack, seg{root, 0, int32(n - 1)})
	for len(stack) > 0 {
		s := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		m, l, r := int(s.m), s.l, s.r
		if lc := left[m]; lc >= 0 {
			sw.sweep(m, lc, l, int32(m-1), -1)
			stack = append(stack, seg{lc, l, int32(m - 1)})
		}
		if rc := right[m]; rc >= 0 {
			sw.sweep(m, rc, int32(m+1), r, 1)
			stack = append(stack, seg{rc, int32(m + 1), r})
		}
		if sw.pairs.n > maxEdges {
			return nil, errTooMany("natural visibility", maxEdges)
		}
	}
	return fromPairs(n, &sw.pairs, KindNVG), nil
}

// frame is a pending subtree (or, with self set, a pending node) of a sweep.
type frame struct {
	u, a, b int32 // node and the index span [a, b] of its subtree
	self    bool  // test u itself rather than expand its subtree
}

// sweeper holds the reusable traversal stack of the sweeps.
type sweeper struct {
	x     []float64
	left  []int32
	right []int32
	stack []frame
	pairs pairBuf
	tree  *hullTree // built on first need
}

// A sweep that has walked more than switchBase + switchPer·(edges found)
// Cartesian-tree frames finishes with hull ray shooting instead. Noise
// rarely gets there; monotone and trending stretches do, where the walk
// would cost O(n) per sweep.
// They are variables only so that tests can force either path.
var (
	switchBase = 128
	switchPer  = 48
)

// above reports whether the point (c, y) lies strictly above the line from the
// apex (m, xm) through the record (at distance pv, height yv − xm = dv), i.e.
// (y − x_m)·pv − dv·|m − c| > 0, with pc = |m − c|. The filter of crossSign
// is inlined; ambiguous cases go to the exact test.
func above(y, xm, yrec, dv, pv, pc float64) bool {
	a := (y - xm) * pv
	b := dv * pc
	d := a - b
	s := math.Abs(a) + math.Abs(b)
	switch {
	case d > filterBound*s && s > 0x1p-900:
		return true
	case d < -filterBound*s && s > 0x1p-900:
		return false
	}
	return crossSign(y, yrec, xm, pv, pc) > 0
}

// sweep appends the edges from the segment maximum m to the samples it sees
// in the subtree rooted at child (its left subtree for dir = −1, spanning
// [lo, m−1], or its right one for dir = +1, spanning [m+1, hi]). Sample c is
// visible iff it lies strictly above the line from m through the current
// record v (the last visible sample): (x_c − x_m)·|m − v| > (x_v − x_m)·|m − c|.
// Samples are visited in order of distance from m by walking the Cartesian
// subtree in (reverse) in-order; a whole subtree spanning [a, b] is skipped
// when the point (far end, subtree maximum) is not above that line, since
// every sample in it is then on or below the line (the line falls away from
// m, and the record line only rises as the sweep goes on).
func (s *sweeper) sweep(m int, child int32, a, b int32, dir int) {
	x := s.x
	xm := x[m]
	var (
		have   bool
		yrec   float64 // x_v
		dv, pv float64 // x_v − x_m and |m − v|
	)
	st := s.stack[:0]
	st = append(st, frame{u: child, a: a, b: b})
	work, found := 0, 0
	for len(st) > 0 {
		if have && work > switchBase+switchPer*found {
			// Hand the rest, the index block next to the samples already
			// swept, to ray shooting.
			f := st[len(st)-1]
			lo, hi := int(a), int(f.b)
			if f.self {
				hi = int(f.u)
			}
			if dir > 0 {
				lo, hi = int(f.a), int(b)
				if f.self {
					lo = int(f.u)
				}
			}
			s.shoot(m, lo, hi, dir, &rayQuery{m: m, xm: xm, yrec: yrec, dv: dv, pv: pv, dir: dir})
			break
		}
		work++
		f := st[len(st)-1]
		st = st[:len(st)-1]
		u := int(f.u)
		if f.self {
			pc := float64(dir * (u - m))
			if !have || above(x[u], xm, yrec, dv, pv, pc) {
				s.pairs.add(m, u)
				have = true
				found++
				yrec, dv, pv = x[u], x[u]-xm, pc
				if dv == 0 {
					// The record is as high as m: no later slope exceeds it.
					break
				}
			}
			continue
		}
		far := f.a
		if dir > 0 {
			far = f.b
		}
		if have && !above(x[u], xm, yrec, dv, pv, float64(dir*(int(far)-m))) {
			continue
		}
		l, r := s.left[u], s.right[u]
		if dir < 0 {
			// Reverse in-order: right subtree (nearer m) first.
			if l >= 0 {
				st = append(st, frame{u: l, a: f.a, b: int32(u - 1)})
			}
			st = append(st, frame{u: int32(u), self: true})
			if r >= 0 {
				st = append(st, frame{u: r, a: int32(u + 1), b: f.b})
			}
		} else {
			if r >= 0 {
				st = append(st, frame{u: r, a: int32(u + 1), b: f.b})
			}
			st = append(st, frame{u: int32(u), self: true})
			if l >= 0 {
				st = append(st, frame{u: l, a: f.a, b: int32(u - 1)})
			}
		}
	}
	s.stack = st
}

// shoot finishes a sweep from apex m over [lo, hi] by repeated ray shooting:
// the nearest sample strictly above the current record line is the next
// visible one.
func (s *sweeper) shoot(m, lo, hi, dir int, q *rayQuery) {
	if s.tree == nil {
		s.tree = newHullTree(s.x)
	}
	x := s.x
	for lo <= hi {
		c := s.tree.nearest(1, 0, s.tree.size-1, lo, hi, q)
		if c < 0 {
			return
		}
		s.pairs.add(m, c)
		q.yrec, q.dv, q.pv = x[c], x[c]-q.xm, float64(dir*(c-m))
		if q.dv == 0 {
			return
		}
		if dir < 0 {
			hi = c - 1
		} else {
			lo = c + 1
		}
	}
}

// cartesianTree returns the max-Cartesian tree of x (children by index, −1
// for none) and its root: each node is the maximum of its subtree's index
// range, ties going to the leftmost sample. O(n) with a stack.
func cartesianTree(x []float64) (left, right []int32, root int32) {
	n := len(x)
	left = make([]int32, n)
	right = make([]int32, n)
	stack := make([]int32, 0, 64)
	for i := 0; i < n; i++ {
		left[i], right[i] = -1, -1
		last := int32(-1)
		for len(stack) > 0 && x[stack[len(stack)-1]] < x[i] {
			last = stack[len(stack)-1]
			stack = stack[:len(stack)-1]
		}
		left[i] = last
		if len(stack) > 0 {
			right[stack[len(stack)-1]] = int32(i)
		}
		stack = append(stack, int32(i))
	}
	return left, right, stack[0]
}
