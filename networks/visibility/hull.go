package visibility

// hullTree answers the ray-shooting queries of the natural-visibility sweep
// when walking the Cartesian subtree would be slow (monotone or trending
// input): "which sample of the index range [lo, hi] nearest to the apex m
// lies strictly above the line from m through the current record?".
//
// It is a segment tree over the points (i, x_i) whose every node keeps the
// upper convex hull of the points in its index range (Overmars & van
// Leeuwen, J. Comput. Syst. Sci. 23 (1981) 166, in its static form). A
// linear function of the points is maximal at a hull vertex, and along the
// upper hull the edge slopes decrease, so the vertex farthest above a line is
// found by binary search; a node can then be skipped or entered in O(log n),
// and the nearest sample above the line is found in O(log² n). Hulls are
// built with the exact orientation test (dropping exactly collinear middle
// points, which can never be the only point above a line) and searched with
// exact slope comparisons, so answers equal the definition.
//
// The leaves are blocks of hullBlock consecutive samples, searched by a
// plain scan once the tree has narrowed the answer to one block: the levels
// below would hold almost every sample once more and cost more to descend
// than the scan. Memory is at most about n·⌈log2(n/hullBlock)⌉ int32
// vertices (convex input), about n/2 for noise.
type hullTree struct {
	x    []float64
	size int // leaf blocks, a power of two ≥ ⌈n/hullBlock⌉
	// Node k (1 ≤ k < 2·size; leaves from size on) covers the samples
	// [s, e] passed along with it, and has its hull at
	// verts[start[k] : start[k]+cnt[k]] (empty past the end of x).
	start []int64
	cnt   []int32
	verts []int32
}

// hullBlock is the number of samples in a leaf of the hull tree.
const hullBlock = 16

// newHullTree builds the tree over x in O(n log n), bottom-up: each hull by
// Andrew's monotone chain over the children's hull vertices (the points are
// sorted by index already).
func newHullTree(x []float64) *hullTree {
	n := len(x)
	size := 1
	for size*hullBlock < n {
		size *= 2
	}
	h := &hullTree{x: x, size: size, start: make([]int64, 2*size), cnt: make([]int32, 2*size)}
	h.verts = make([]int32, 0, n)
	for k := size; k < 2*size; k++ {
		base := len(h.verts)
		for p := (k - size) * hullBlock; p < min((k-size+1)*hullBlock, n); p++ {
			h.push(base, int32(p))
		}
		h.start[k], h.cnt[k] = int64(base), int32(len(h.verts)-base)
	}
	for k := size - 1; k >= 1; k-- {
		base := len(h.verts)
		for _, c := range [2]int{2 * k, 2*k + 1} {
			for i := h.start[c]; i < h.start[c]+int64(h.cnt[c]); i++ {
				h.push(base, h.verts[i])
			}
		}
		h.start[k], h.cnt[k] = int64(base), int32(len(h.verts)-base)
	}
	return h
}

// push appends p to the hull being built in verts[base:], first popping the
// last vertex b while it is not strictly above the line from the one before
// it (a) to p.
func (h *hullTree) push(base int, p int32) {
	x := h.x
	for len(h.verts)-base >= 2 {
		a := h.verts[len(h.verts)-2]
		b := h.verts[len(h.verts)-1]
		if crossSign(x[b], x[p], x[a], float64(p-a), float64(b-a)) > 0 {
			break
		}
		h.verts = h.verts[:len(h.verts)-1]
	}
	h.verts = append(h.verts, p)
}

func (h *hullTree) hull(k int) []int32 {
	return h.verts[h.start[k] : h.start[k]+int64(h.cnt[k])]
}

// rayQuery is the line of a sweep: apex m, current record v at distance pv
// with x_v − x_m = dv; dir is −1 for the left sweep, +1 for the right one.
type rayQuery struct {
	m            int
	xm, yrec, dv float64
	pv           float64
	dir          int
}

// anyAbove reports whether some point of node k lies strictly above the
// query line. The height above the line, f(c) = (x_c − x_m)·pv − dv·|c − m|,
// is linear in (c, x_c), so its maximum over the hull is where the edge gain
// pv·(x_b − x_a) − dir·dv·(b − a) turns non-positive (edges of an upper hull
// have decreasing slopes).
func (h *hullTree) anyAbove(k int, q *rayQuery) bool {
	hv := h.hull(k)
	if len(hv) == 0 {
		return false
	}
	x := h.x
	// gain(j) > 0 ⇔ moving from hv[j] to hv[j+1] increases f.
	gain := func(j int) bool {
		a, b := hv[j], hv[j+1]
		if q.dir < 0 {
			// pv·(x_b − x_a) − (x_m − x_v)·(b − a)
			return cross4Sign(x[b], x[a], q.pv, q.xm, q.yrec, float64(b-a)) > 0
		}
		// pv·(x_b − x_a) − (x_v − x_m)·(b − a)
		return cross4Sign(x[b], x[a], q.pv, q.yrec, q.xm, float64(b-a)) > 0
	}
	lo, hi := 0, len(hv)-1 // the maximiser is the first j with !gain(j), or the last vertex
	for lo < hi {
		mid := (lo + hi) / 2
		if gain(mid) {
			lo = mid + 1
		} else {
			hi = mid
		}
	}
	c := int(hv[lo])
	return above(x[c], q.xm, q.yrec, q.dv, q.pv, float64(q.dir*(c-q.m)))
}

// scan returns the sample of [lo, hi] nearest to the apex strictly above the
// query line, testing them one by one, or −1.
func (h *hullTree) scan(lo, hi int, q *rayQuery) int {
	x := h.x
	if q.dir < 0 {
		for c := hi; c >= lo; c-- {
			if above(x[c], q.xm, q.yrec, q.dv, q.pv, float64(q.m-c)) {
				return c
			}
		}
		return -1
	}
	for c := lo; c <= hi; c++ {
		if above(x[c], q.xm, q.yrec, q.dv, q.pv, float64(c-q.m)) {
			return c
		}
	}
	return -1
}

// nearest returns the sample of [lo, hi] (within the series) nearest to the
// apex (the largest index for dir < 0, the smallest for dir > 0) strictly
// above the query line, or −1. Node k covers [s, e].
func (h *hullTree) nearest(k, s, e, lo, hi int, q *rayQuery) int {
	if e < lo || s > hi {
		return -1
	}
	if k >= h.size {
		return h.scan(max(s, lo), min(e, hi), q)
	}
	if lo <= s && e <= hi {
		if !h.anyAbove(k, q) {
			return -1
		}
		// The answer is inside: go to the nearer child when it has one.
		for k < h.size {
			mid := (s + e) / 2
			if q.dir < 0 {
				if h.anyAbove(2*k+1, q) {
					k, s = 2*k+1, mid+1
				} else {
					k, e = 2*k, mid
				}
			} else {
				if h.anyAbove(2*k, q) {
					k, e = 2*k, mid
				} else {
					k, s = 2*k+1, mid+1
				}
			}
		}
		return h.scan(s, e, q)
	}
	mid := (s + e) / 2
	if q.dir < 0 {
		if r := h.nearest(2*k+1, mid+1, e, lo, hi, q); r >= 0 {
			return r
		}
		return h.nearest(2*k, s, mid, lo, hi, q)
	}
	if r := h.nearest(2*k, s, mid, lo, hi, q); r >= 0 {
		return r
	}
	return h.nearest(2*k+1, mid+1, e, lo, hi, q)
}
