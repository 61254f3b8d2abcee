package visibility

import (
	"math"

	"github.com/tracesift/tracesift/networks"
)

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
// take hours). So the hull tree (hullTree: a segment tree of upper convex
// hulls over blocks of 16 samples, built once on first need, O(n log n))
// backs the walk up: after 64 fruitless steps a sweep asks it whether any
// sample left in its range is above the record line at all, stopping at once
// if none is and asking again after twice as many steps otherwise; and a
// sweep that has walked more than 4096 + 1024·(edges found) steps finishes
// by ray shooting, each further visible sample costing O(log² n). Measured
// on one core at n = 10^6 (BENCHMARKS.md): white noise 0.26 s, Brownian
// motion 1.1 s, trend + noise 0.52 s; at n = 4·10^4, √i (a path) takes 0.1 s
// instead of 18 s.
//
// The sweeps only count degrees and log the visible samples, delta-coded
// (edgeLog, about one byte per edge); the CSR arrays are then written by
// replaying the walk, in an order that leaves every neighbour list sorted
// without a sort (placeEdges).
//
// The worst case left is output size: a convex sequence has n(n−1)/2 edges
// (every pair sees each other); construction stops with ErrTooManyEdges once
// Options.MaxEdges is passed, before memory runs out. NVGs are unchanged by
// adding a linear trend a·i + b to x (in exact arithmetic: lines stay
// lines), so a trended series gives the graph of the detrended one; only the
// work differs.
//
// Ties: a sample exactly on the line of sight blocks it, so collinear
// samples and equal heights on a plateau see only their neighbours, and of
// several samples sharing the maximum of a segment none sees past the next.
// Samples piled at a recorder's rail therefore break the hubs that the
// highest samples would otherwise be (measured: average path length /ln n
// of i.i.d. noise 0.72, with 13% of the samples clipped at each rail 15.7,
// n = 5000). features.Extract dithers a quantised series first.
//
// x must be finite (ErrNonFinite) and non-empty (ErrEmpty).
func Natural(x []float64, opts Options) (*networks.Graph, error) {
	if err := networks.CheckSeries(x, "natural visibility"); err != nil {
		return nil, err
	}
	n := len(x)
	maxEdges := networks.MaxEdges(opts.MaxEdges)
	t, root := cartesianTree(x)

	// The sweeps count degrees into offsets and in-degrees into lower as they
	// go and log each sweep's visible samples, delta-coded, in an edgeLog;
	// placeEdges then replays the same walk to write the CSR arrays. No list
	// of index pairs is built and nothing is sorted.
	offsets := make([]int64, n+1)
	lower := make([]int32, n)
	sw := &sweeper{
		x: x, t: t,
		stack: make([]frame, 0, 64),
		deg:   offsets[:n],
		lower: lower,
	}
	sw.log.init()
	type seg struct{ m, l, r int32 }
	stack := make([]seg, 0, 64)
	stack = append(stack, seg{root, 0, int32(n - 1)})
	for len(stack) > 0 {
		s := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		m, l, r := int(s.m), s.l, s.r
		if lc := t[m].l; lc >= 0 {
			sw.sweep(m, lc, l, int32(m-1), -1)
			stack = append(stack, seg{lc, l, int32(m - 1)})
		}
		if rc := t[m].r; rc >= 0 {
			sw.sweep(m, rc, int32(m+1), r, 1)
			stack = append(stack, seg{rc, int32(m + 1), r})
		}
		if sw.edges > maxEdges {
			return nil, &networks.EdgeBudgetError{Graph: "natural visibility", Nodes: n, Budget: maxEdges}
		}
	}
	sw.tree = nil
	adj := placeEdges(&sw.log, t, root, offsets, lower, sw.edges)
	return networks.NewCSR(networks.KindNVG, offsets, adj, lower), nil
}

// placeEdges writes the CSR adjacency from the sweep log. It replays the
// walk of Natural (same pre-order over the Cartesian tree, left sweep before
// right sweep), so every record is met in the order it was written. On entry
// offsets[:n] holds the degrees and lower the in-degrees; offsets becomes the
// CSR offsets.
//
// No sort is needed: the neighbours of a node u, ascending, are (1) the
// ancestors left of u that see it, met in the walk top-down, i.e. in
// ascending index (a deeper left ancestor lies in the right subtree of a
// shallower one), (2) u's own left sweep, logged nearest first, i.e.
// descending, (3) u's own right sweep, ascending, and (4) the ancestors
// right of u that see it, met in descending index. Parts (1) and (2) are
// u's lower section. So (1) fills forwards from the section start, (2)
// backwards from the end of the lower section, (3) forwards from there, and
// (4) backwards from the end of u's list.
func placeEdges(log *edgeLog, t []ctNode, root int32, offsets []int64, lower []int32, edges int64) []int32 {
	n := len(lower)
	networks.DegreesToOffsets(offsets)
	adj := make([]int32, 2*edges)
	// Filled counts of parts (1) and (4).
	fromLeft := make([]int32, n)
	fromRight := make([]int32, n)
	rd := log.reader()
	stack := make([]int32, 0, 64)
	stack = append(stack, root)
	for len(stack) > 0 {
		m := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		if lc := t[m].l; lc >= 0 {
			p := offsets[m] + int64(lower[m])
			u := m
			for {
				// The next distance (see nextSlow).
				var d uint32
				if q := rd.pos; q < len(rd.buf) && rd.buf[q] < 0x80 {
					d, rd.pos = uint32(rd.buf[q]), q+1
				} else {
					d = rd.nextSlow()
				}
				if d == 0 {
					break
				}
				u -= int32(d)
				p--
				adj[p] = u
				fromRight[u]++
				adj[offsets[u+1]-int64(fromRight[u])] = m
			}
			stack = append(stack, lc)
		}
		if rc := t[m].r; rc >= 0 {
			p := offsets[m] + int64(lower[m])
			u := m
			for {
				// The next distance (see nextSlow).
				var d uint32
				if q := rd.pos; q < len(rd.buf) && rd.buf[q] < 0x80 {
					d, rd.pos = uint32(rd.buf[q]), q+1
				} else {
					d = rd.nextSlow()
				}
				if d == 0 {
					break
				}
				u += int32(d)
				adj[p] = u
				p++
				adj[offsets[u]+int64(fromLeft[u])] = m
				fromLeft[u]++
			}
			stack = append(stack, rc)
		}
	}
	return adj
}

// ctNode is a node of the Cartesian tree with its sample, packed so that a
// sweep reads one cache line per node it visits.
type ctNode struct {
	x    float64
	l, r int32 // children, −1 for none
}

// frame is a pending subtree (or, with self set, a pending node) of a sweep.
type frame struct {
	u, a, b int32 // node and the index span [a, b] of its subtree
	self    bool  // test u itself rather than expand its subtree
}

// sweeper holds the reusable traversal stack of the sweeps and collects
// their output: the log of visible samples, the degree and in-degree counts.
type sweeper struct {
	x     []float64
	t     []ctNode
	stack []frame
	tree  *hullTree // built on first need
	log   edgeLog
	deg   []int64 // degree counts
	lower []int32 // in-degree counts
	edges int64   // edges found so far
	last  int     // the last sample logged in the current sweep (m at its start)
}

// visible records the edge from the apex m of the current sweep to u, the
// next visible sample (farther from m than the last one), for a sweep in
// direction dir.
func (s *sweeper) visible(u, dir int) {
	d := u - s.last
	if dir < 0 {
		d = -d
	}
	s.last = u
	s.log.put(uint32(d))
	s.deg[u]++
	if dir > 0 {
		s.lower[u]++
	}
}

// endSweep closes the log record of the sweep from m that found k samples.
func (s *sweeper) endSweep(m, dir, k int) {
	s.log.end()
	s.deg[m] += int64(k)
	if dir < 0 {
		s.lower[m] += int32(k)
	}
	s.edges += int64(k)
}

// After switchGap fruitless steps (doubling each time) a sweep asks the hull
// tree whether anything is left to find; a sweep that has walked more than
// switchBase + switchPer·(edges found) Cartesian-tree nodes finishes with
// hull ray shooting instead. Noise rarely gets there; monotone and trending
// stretches do, where the walk would cost O(n) per sweep.
// They are variables only so that tests can force each path.
var (
	switchBase = 4096
	switchPer  = 1024
	switchGap  = 64
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

// apexFilter is the floating-point filter of above for points under the
// apex: y ≤ xm and dv ≤ 0, so both products are ≤ 0 and |a| + |b| is −(a+b),
// the same value above computes. It returns +1 (strictly above), −1 (on or
// below) or 0 (undecided: call above's exact test).
func apexFilter(y, xm, dv, pv, pc float64) int {
	a := (y - xm) * pv
	b := dv * pc
	d := a - b
	s := -(a + b)
	if s > 0x1p-900 {
		if d > filterBound*s {
			return 1
		}
		if d < -filterBound*s {
			return -1
		}
	}
	return 0
}

// exactAbove is the exact test of above, out of line: (y − x_m)·pv −
// (yrec − x_m)·pc > 0.
//
//go:noinline
func exactAbove(y, yrec, xm, pv, pc float64) bool {
	return crossSign(y, yrec, xm, pv, pc) > 0
}

// sweep logs the edges from the segment maximum m to the samples it sees in
// the subtree rooted at child (its left subtree for dir = −1, spanning
// [lo, m−1], or its right one for dir = +1, spanning [m+1, hi]). Sample c is
// visible iff it lies strictly above the line from m through the current
// record v (the last visible sample): (x_c − x_m)·|m − v| > (x_v − x_m)·|m − c|.
// Samples are visited in order of distance from m by walking the Cartesian
// subtree in (reverse) in-order; a whole subtree spanning [a, b] is skipped
// when the point (far end, subtree maximum) is not above that line, since
// every sample in it is then on or below the line (the line falls away from
// m, and the record line only rises as the sweep goes on). The walk goes
// down the chain of nearer children directly, pushing only the pending
// nodes and farther subtrees.
func (s *sweeper) sweep(m int, child int32, a, b int32, dir int) {
	t := s.t
	xm := t[m].x
	var (
		have   bool
		yrec   float64 // x_v
		dv, pv float64 // x_v − x_m and |m − v|
	)
	st := s.stack[:0]
	st = append(st, frame{u: child, a: a, b: b})
	work, found := 0, 0
	lastWork, gap := 0, switchGap // work when the last visible sample was found
	s.last = m
	for len(st) > 0 {
		if have && work-lastWork > gap {
			// The walk has gone a while without finding anything. The rest
			// of the sweep is the index block next to the samples already
			// swept.
			lo, hi := restSpan(st[len(st)-1], a, b, dir)
			q := rayQuery{m: m, xm: xm, yrec: yrec, dv: dv, pv: pv, dir: dir}
			if work > switchBase+switchPer*found {
				// The walk is slow all along: finish by ray shooting.
				found += s.shoot(m, lo, hi, dir, &q)
				break
			}
			// Ask the hull tree whether anything in the rest is visible at
			// all; if so, walk on and ask again after twice as long.
			if s.probe(lo, hi, &q) < 0 {
				break
			}
			lastWork, gap = work, 2*gap
		}
		work++
		f := st[len(st)-1]
		st = st[:len(st)-1]
		u := int(f.u)
		if f.self {
			y := t[u].x
			pc := float64(dir * (u - m))
			if f := apexFilter(y, xm, dv, pv, pc); !have || f > 0 || f == 0 && exactAbove(y, yrec, xm, pv, pc) {
				// s.visible(u, dir), written out: neither it nor the log's
				// put fits the compiler's inlining budget, and this is the
				// hot path.
				d := (u - s.last) * dir
				s.last = u
				if lc := s.log.cur; d < 0x80 && len(lc) < cap(lc) {
					s.log.cur = append(lc, byte(d))
				} else {
					s.log.putSlow(uint32(d))
				}
				s.deg[u]++
				if dir > 0 {
					s.lower[u]++
				}
				have = true
				found++
				lastWork = work
				yrec, dv, pv = y, y-xm, pc
				if dv == 0 {
					// The record is as high as m: no later slope exceeds it.
					break
				}
			}
			continue
		}
		fa, fb := f.a, f.b
		if dir < 0 {
			// Reverse in-order: right subtree (nearer m) first.
			for {
				nd := t[u]
				if have {
					pc := float64(m - int(fa))
					if f := apexFilter(nd.x, xm, dv, pv, pc); f < 0 || f == 0 && !exactAbove(nd.x, yrec, xm, pv, pc) {
						break
					}
				}
				if nd.l >= 0 {
					st = append(st, frame{u: nd.l, a: fa, b: int32(u - 1)})
				}
				st = append(st, frame{u: int32(u), self: true})
				if nd.r < 0 {
					break
				}
				fa, u = int32(u+1), int(nd.r)
				work++
			}
		} else {
			for {
				nd := t[u]
				if have {
					pc := float64(int(fb) - m)
					if f := apexFilter(nd.x, xm, dv, pv, pc); f < 0 || f == 0 && !exactAbove(nd.x, yrec, xm, pv, pc) {
						break
					}
				}
				if nd.r >= 0 {
					st = append(st, frame{u: nd.r, a: int32(u + 1), b: fb})
				}
				st = append(st, frame{u: int32(u), self: true})
				if nd.l < 0 {
					break
				}
				fb, u = int32(u-1), int(nd.l)
				work++
			}
		}
	}
	s.stack = st
	s.endSweep(m, dir, found)
}

// restSpan returns the index block a sweep over [a, b] in direction dir has
// still to cover when f is on top of its stack: from the top frame's span (or
// node) to the far end.
func restSpan(f frame, a, b int32, dir int) (lo, hi int) {
	if dir > 0 {
		if f.self {
			return int(f.u), int(b)
		}
		return int(f.a), int(b)
	}
	if f.self {
		return int(a), int(f.u)
	}
	return int(a), int(f.b)
}

// probe returns the sample of [lo, hi] nearest to the apex strictly above the
// line of q, or −1.
func (s *sweeper) probe(lo, hi int, q *rayQuery) int {
	if s.tree == nil {
		s.tree = newHullTree(s.x)
	}
	return s.tree.nearest(1, 0, s.tree.size*hullBlock-1, lo, hi, q)
}

// shoot finishes a sweep from apex m over [lo, hi] by repeated ray shooting:
// the nearest sample strictly above the current record line is the next
// visible one. It returns the number of samples found.
func (s *sweeper) shoot(m, lo, hi, dir int, q *rayQuery) (found int) {
	x := s.x
	for lo <= hi {
		c := s.probe(lo, hi, q)
		if c < 0 {
			return found
		}
		s.visible(c, dir)
		found++
		q.yrec, q.dv, q.pv = x[c], x[c]-q.xm, float64(dir*(c-m))
		if q.dv == 0 {
			return found
		}
		if dir < 0 {
			hi = c - 1
		} else {
			lo = c + 1
		}
	}
	return found
}

// cartesianTree returns the max-Cartesian tree of x (children by index, −1
// for none, each node holding its sample) and its root: each node is the
// maximum of its subtree's index range, ties going to the leftmost sample.
// O(n) with a stack.
func cartesianTree(x []float64) (t []ctNode, root int32) {
	n := len(x)
	t = make([]ctNode, n)
	// The right spine, with its samples beside it (no load through t to
	// compare).
	stack := make([]int32, 0, 64)
	top := make([]float64, 0, 64)
	for i, xi := range x {
		last := int32(-1)
		for len(top) > 0 && top[len(top)-1] < xi {
			last = stack[len(stack)-1]
			stack, top = stack[:len(stack)-1], top[:len(top)-1]
		}
		t[i] = ctNode{x: xi, l: last, r: -1}
		if len(stack) > 0 {
			t[stack[len(stack)-1]].r = int32(i)
		}
		stack, top = append(stack, int32(i)), append(top, xi)
	}
	return t, stack[0]
}
