package nonlinear

import (
	"math"
	"math/bits"
	"slices"

	"github.com/tracesift/tracesift/internal/order"
)

// kdLeafSize is the largest number of points a k-d tree leaf holds.
const kdLeafSize = 10

// kdTree is a static k-d tree over points of a fixed dimension with exact
// (tight) bounding boxes per node. It answers nearest-neighbour queries
// under the maximum or Euclidean norm with a temporal exclusion window
// (Theiler), k-nearest queries, and exact fixed-radius counts under the
// maximum norm. Points are copied in tree order for cache locality.
type kdTree struct {
	dim   int
	leaf  int       // largest leaf size
	data  []float64 // points in tree order, row-major
	ids   []int32   // original index of each point in tree order
	nodes []kdNode
	box   []float64 // per node: lo[0..dim), hi[0..dim)
	// sorted[c·n + k] holds coordinate c of the points of each leaf, sorted
	// within the leaf's range; built on demand by pairsWithin.
	sorted []float64
	// splitDim[n] and splitVal[n] are the split coordinate and value of
	// internal node n (left: ≤ splitVal, right: ≥ splitVal); recorded by
	// newDelayTree for the order-free search (nearestTie).
	splitDim []int8
	splitVal []float64
}

type kdNode struct {
	start, end  int32 // point range in tree order
	left, right int32 // children; left < 0 marks a leaf
}

// newDelayTree builds a tree over the first count delay vectors of z,
// y_k = (z_k, z_{k+delay}, …, z_{k+(dim−1)·delay}), with leaves of at most
// leaf points. The split coordinate of a node is the widest side of its
// outer box (the parent's box cut at the split value), the split is at
// the median (Hoare's selection, median-of-three pivot), and the tight
// boxes used for pruning are computed bottom-up (leaves scan their points,
// parents take the union). The points are then copied in tree order, so
// every pass over a node's points is sequential in memory.
//
// The selections run on point indices with one coordinate column gathered
// from z, instead of swapping whole rows of materialised vectors; the
// comparisons and swaps are those of the row-by-row builder the estimators
// used before (kept in the tests), so the tree — nodes, boxes, point order
// — is the same and every query answers identically, ties included.
// z must hold count + (dim−1)·delay samples; count ≥ 1.
func newDelayTree(z []float64, dim, delay, count, leaf int) *kdTree {
	t := &kdTree{dim: dim, leaf: max(1, leaf)}
	t.ids = make([]int32, count)
	for i := range t.ids {
		t.ids[i] = int32(i)
	}
	t.nodes = make([]kdNode, 0, 4*count/t.leaf+2)
	t.box = make([]float64, 0, cap(t.nodes)*2*dim)
	t.splitDim = make([]int8, 0, cap(t.nodes))
	t.splitVal = make([]float64, 0, cap(t.nodes))
	outer := make([]float64, 2*dim)
	for c := 0; c < dim; c++ {
		col := z[c*delay : c*delay+count]
		lo, hi := col[0], col[0]
		for _, v := range col[1:] {
			lo = min(lo, v)
			hi = max(hi, v)
		}
		outer[c], outer[dim+c] = lo, hi
	}
	b := delayBuilder{t: t, z: z, delay: delay, key: make([]float64, count)}
	b.build(0, count, outer)
	t.data = make([]float64, count*dim)
	for k, id := range t.ids {
		row := t.data[k*dim : (k+1)*dim]
		for c := range row {
			row[c] = z[int(id)+c*delay]
		}
	}
	return t
}

// delayBuilder holds the state of newDelayTree.
type delayBuilder struct {
	t     *kdTree
	z     []float64
	delay int
	key   []float64 // scratch: one coordinate of the points, in tree order
}

// coord returns coordinate c of the point in tree position k.
func (b *delayBuilder) coord(k, c int) float64 {
	return b.z[int(b.t.ids[k])+c*b.delay]
}

// build creates the node for points [start, end) inside the outer box
// (lo then hi; modified and restored) and returns its number.
func (b *delayBuilder) build(start, end int, outer []float64) int32 {
	t := b.t
	d := t.dim
	me := int32(len(t.nodes))
	t.nodes = append(t.nodes, kdNode{start: int32(start), end: int32(end), left: -1, right: -1})
	t.splitDim = append(t.splitDim, -1)
	t.splitVal = append(t.splitVal, 0)
	off := len(t.box)
	for k := 0; k < 2*d; k++ {
		t.box = append(t.box, 0)
	}
	split, spread := 0, -1.0
	for c := 0; c < d; c++ {
		if s := outer[d+c] - outer[c]; s > spread {
			split, spread = c, s
		}
	}
	if end-start > t.leaf && spread > 0 {
		mid := (start + end) / 2
		key := b.key[start:end]
		for k := range key {
			key[k] = b.coord(start+k, split)
		}
		order.SelectKeyed(key, t.ids[start:end], mid-start)
		sv := b.key[mid]
		t.splitDim[me], t.splitVal[me] = int8(split), sv
		keep := outer[d+split]
		outer[d+split] = sv
		l := b.build(start, mid, outer)
		outer[d+split] = keep
		keep = outer[split]
		outer[split] = sv
		r := b.build(mid, end, outer)
		outer[split] = keep
		t.nodes[me].left, t.nodes[me].right = l, r
		lo, hi := t.box[off:off+d], t.box[off+d:off+2*d]
		lb, rb := int(l)*2*d, int(r)*2*d
		for c := 0; c < d; c++ {
			lo[c] = min(t.box[lb+c], t.box[rb+c])
			hi[c] = max(t.box[lb+d+c], t.box[rb+d+c])
		}
		return me
	}
	lo, hi := t.box[off:off+d], t.box[off+d:off+2*d]
	for c := 0; c < d; c++ {
		v := b.coord(start, c)
		lo[c], hi[c] = v, v
	}
	for i := start + 1; i < end; i++ {
		for c := 0; c < d; c++ {
			v := b.coord(i, c)
			lo[c] = min(lo[c], v)
			hi[c] = max(hi[c], v)
		}
	}
	return me
}

// boxLower returns a lower bound of the distance from q to any point of node
// n: the maximum-norm distance, or the squared Euclidean distance.
//
// Per coordinate the gap is max(lo − v, v − hi, 0): the distance to the
// nearer face when v is outside, +0 inside (lo − v is +0 or negative
// there, and max takes +0 over −0), computed without branches.
func (t *kdTree) boxLower(n int32, q []float64, euclid bool) float64 {
	d := t.dim
	off := int(n) * 2 * d
	lo, hi := t.box[off:off+len(q)], t.box[off+d:off+d+len(q)]
	var s float64
	if euclid {
		for k, v := range q {
			g := max(lo[k]-v, v-hi[k], 0)
			s += g * g
		}
		return s
	}
	for k, v := range q {
		s = max(s, lo[k]-v, v-hi[k])
	}
	return s
}

// nnSearch holds the state of one nearest-neighbour query.
type nnSearch struct {
	q      []float64
	qi, w  int  // exclude original indices j with |j − qi| ≤ w
	euclid bool // squared Euclidean instead of maximum norm
	best   int
	bd     float64
}

// nearest returns the original index of the point nearest to q whose index j
// satisfies |j − qi| > w and which is distinct from q (distance > 0, as
// Cao 1997 prescribes for repeated vectors), and its distance (maximum norm,
// or Euclidean when euclid is set). It returns −1 and +Inf when every point
// is excluded.
func (t *kdTree) nearest(q []float64, qi, w int, euclid bool) (int, float64) {
	s := nnSearch{q: q, qi: qi, w: w, euclid: euclid, best: -1, bd: math.Inf(1)}
	t.nn(0, &s)
	if euclid {
		return s.best, math.Sqrt(s.bd)
	}
	return s.best, s.bd
}

func (t *kdTree) nn(n int32, s *nnSearch) {
	node := &t.nodes[n]
	if node.left < 0 {
		d := t.dim
		for k := int(node.start); k < int(node.end); k++ {
			id := int(t.ids[k])
			if dj := id - s.qi; dj <= s.w && dj >= -s.w {
				continue
			}
			p := t.data[k*d : k*d+d]
			// Partial distances with early exit: most points of a leaf
			// are rejected after one or two coordinates in high dimension.
			var dist float64
			bd := s.bd
			if s.euclid {
				for c, v := range s.q {
					g := p[c] - v
					dist += g * g
					if dist >= bd {
						break
					}
				}
			} else {
				for c, v := range s.q {
					g := math.Abs(p[c] - v)
					if g > dist {
						dist = g
						if dist >= bd {
							break
						}
					}
				}
			}
			if dist < bd && dist > 0 {
				s.bd, s.best = dist, id
			}
		}
		return
	}
	bl := t.boxLower(node.left, s.q, s.euclid)
	br := t.boxLower(node.right, s.q, s.euclid)
	first, second, b2 := node.left, node.right, br
	if br < bl {
		first, second, b2 = node.right, node.left, bl
		bl = br
	}
	if bl < s.bd {
		t.nn(first, s)
	}
	if b2 < s.bd {
		t.nn(second, s)
	}
}

// knnSearch holds the state of one k-nearest query: Euclidean (squared
// distances) or maximum norm, excluding the original indices j with
// |j − qi| ≤ w (w < 0 excludes none).
type knnSearch struct {
	q      []float64
	qi, w  int
	k      int
	euclid bool
	ids    []int     // sorted by distance, ascending
	dists  []float64 // squared for Euclidean
}

// kNearest fills ids and dists (length k, ascending Euclidean distance) with
// the k points nearest to q; it returns how many were found (< k only when
// the tree holds fewer than k points).
func (t *kdTree) kNearest(q []float64, ids []int, dists []float64) int {
	s := knnSearch{q: q, w: -1, k: len(ids), euclid: true, ids: ids[:0], dists: dists[:0]}
	t.knn(0, &s)
	for i := range s.dists {
		s.dists[i] = math.Sqrt(s.dists[i])
	}
	return len(s.ids)
}

func (t *kdTree) knn(n int32, s *knnSearch) {
	node := &t.nodes[n]
	if node.left < 0 {
		d := t.dim
		for k := int(node.start); k < int(node.end); k++ {
			id := int(t.ids[k])
			if dj := id - s.qi; dj <= s.w && dj >= -s.w {
				continue
			}
			p := t.data[k*d : k*d+d]
			full := len(s.ids) == s.k
			lim := math.Inf(1)
			if full {
				lim = s.dists[s.k-1]
			}
			var dist float64
			for c, v := range s.q {
				g := p[c] - v
				if s.euclid {
					dist += g * g
				} else {
					dist = max(dist, math.Abs(g))
				}
				if dist >= lim {
					break
				}
			}
			if dist >= lim {
				continue
			}
			// insertion into the sorted list
			pos := len(s.ids)
			if !full {
				s.ids = append(s.ids, 0)
				s.dists = append(s.dists, 0)
			} else {
				pos = s.k - 1
			}
			for pos > 0 && s.dists[pos-1] > dist {
				s.ids[pos], s.dists[pos] = s.ids[pos-1], s.dists[pos-1]
				pos--
			}
			s.ids[pos], s.dists[pos] = id, dist
		}
		return
	}
	bl := t.boxLower(node.left, s.q, s.euclid)
	br := t.boxLower(node.right, s.q, s.euclid)
	first, second, b2 := node.left, node.right, br
	if br < bl {
		first, second, b2 = node.right, node.left, bl
		bl = br
	}
	if len(s.ids) < s.k || bl < s.dists[s.k-1] {
		t.knn(first, s)
	}
	if len(s.ids) < s.k || b2 < s.dists[s.k-1] {
		t.knn(second, s)
	}
}

// countWithin returns the number of points p with |p_c − q_c| ≤ r for every
// coordinate c (maximum norm ≤ r), q itself included if it is in the tree.
// The count is exact: it equals the one obtained by testing every point with
// math.Abs(p_c − q_c) ≤ r, because floating-point subtraction is monotone,
// so whole nodes are accepted or rejected by testing their box corners the
// same way.
func (t *kdTree) countWithin(q []float64, r float64) int {
	return t.count(0, q, r)
}

func (t *kdTree) count(n int32, q []float64, r float64) int {
	d := t.dim
	off := int(n) * 2 * d
	lo, hi := t.box[off:off+d], t.box[off+d:off+2*d]
	inside := true
	for c, v := range q {
		if lo[c]-v > r || v-hi[c] > r {
			return 0
		}
		if hi[c]-v > r || v-lo[c] > r {
			inside = false
		}
	}
	node := &t.nodes[n]
	if inside {
		return int(node.end - node.start)
	}
	if node.left >= 0 {
		return t.count(node.left, q, r) + t.count(node.right, q, r)
	}
	cnt := 0
outer:
	for k := int(node.start); k < int(node.end); k++ {
		p := t.data[k*d : k*d+d]
		for c, v := range q {
			if math.Abs(p[c]-v) > r {
				continue outer
			}
		}
		cnt++
	}
	return cnt
}

// pairsWithin returns the number of unordered pairs of distinct points whose
// maximum-norm distance is ≤ r. It is exact in the same sense as
// countWithin and uses a dual-tree recursion (Gray & Moore, NIPS 13 (2001)):
// two nodes whose boxes are entirely within r of each other contribute the
// product of their sizes at once, two nodes whose boxes are more than r
// apart contribute nothing, and only the rest are split. A coordinate found
// to be within r for a pair of nodes is within r for all their descendants,
// so it is dropped from further tests (a bit mask of undecided coordinates
// travels down the recursion); the dimension must be ≤ 64.
func (t *kdTree) pairsWithin(r float64) int64 {
	if len(t.nodes) == 0 {
		return 0
	}
	if t.sorted == nil {
		n, d := len(t.ids), t.dim
		t.sorted = make([]float64, n*d)
		for i := range t.nodes {
			nd := &t.nodes[i]
			if nd.left >= 0 {
				continue
			}
			for c := 0; c < d; c++ {
				seg := t.sorted[c*n+int(nd.start) : c*n+int(nd.end)]
				for k := range seg {
					seg[k] = t.data[(int(nd.start)+k)*d+c]
				}
				slices.Sort(seg)
			}
		}
	}
	return t.pairs(0, 0, r, uint64(1)<<t.dim-1)
}

func (t *kdTree) pairs(a, b int32, r float64, mask uint64) int64 {
	d := t.dim
	oa, ob := int(a)*2*d, int(b)*2*d
	box := t.box
	for m := mask; m != 0; m &= m - 1 {
		c := bits.TrailingZeros64(m)
		loA, hiA, loB, hiB := box[oa+c], box[oa+d+c], box[ob+c], box[ob+d+c]
		if loA-hiB > r || loB-hiA > r {
			return 0
		}
		if hiA-loB <= r && hiB-loA <= r {
			mask &^= 1 << c
		}
	}
	na, nb := &t.nodes[a], &t.nodes[b]
	sa, sb := int64(na.end-na.start), int64(nb.end-nb.start)
	if mask == 0 {
		if a == b {
			return sa * (sa - 1) / 2
		}
		return sa * sb
	}
	leafA, leafB := na.left < 0, nb.left < 0
	if leafA && leafB {
		return t.leafPairs(na, nb, a == b, r, mask)
	}
	if a == b {
		return t.pairs(na.left, na.left, r, mask) + t.pairs(na.right, na.right, r, mask) + t.pairs(na.left, na.right, r, mask)
	}
	// split the larger non-leaf node
	if leafB || (!leafA && sa >= sb) {
		return t.pairs(na.left, b, r, mask) + t.pairs(na.right, b, r, mask)
	}
	return t.pairs(a, nb.left, r, mask) + t.pairs(a, nb.right, r, mask)
}

// leafPairs counts by brute force the pairs between two leaves (i < j
// within one leaf when same), testing only the coordinates in mask.
func (t *kdTree) leafPairs(na, nb *kdNode, same bool, r float64, mask uint64) int64 {
	d, data := t.dim, t.data
	var cnt int64
	if mask&(mask-1) == 0 {
		// A single undecided coordinate, the common case: count the pairs
		// with |a − b| ≤ r between two sorted lists with two pointers. The
		// valid b for a given a form an interval that moves right as a
		// grows, because rounded subtraction is monotone, so the count is
		// exact.
		c := bits.TrailingZeros64(mask)
		n := len(t.ids)
		A := t.sorted[c*n+int(na.start) : c*n+int(na.end)]
		if same {
			hi := 0
			for i, v := range A {
				hi = max(hi, i+1)
				for hi < len(A) && A[hi]-v <= r {
					hi++
				}
				cnt += int64(hi - i - 1)
			}
			return cnt
		}
		B := t.sorted[c*n+int(nb.start) : c*n+int(nb.end)]
		lo, hi := 0, 0
		for _, v := range A {
			for lo < len(B) && v-B[lo] > r {
				lo++
			}
			hi = max(hi, lo)
			for hi < len(B) && B[hi]-v <= r {
				hi++
			}
			cnt += int64(hi - lo)
		}
		return cnt
	}
	if d <= 3 {
		return t.leafPairs3(na, nb, same, r, mask)
	}
	for i := int(na.start); i < int(na.end); i++ {
		p := data[i*d : i*d+d]
		j0 := int(nb.start)
		if same {
			j0 = i + 1
		}
	next:
		for j := j0; j < int(nb.end); j++ {
			q := data[j*d : j*d+d]
			for m := mask; m != 0; m &= m - 1 {
				c := bits.TrailingZeros64(m)
				if math.Abs(q[c]-p[c]) > r {
					continue next
				}
			}
			cnt++
		}
	}
	return cnt
}

// leafPairs3 is the brute-force part of leafPairs for trees of dimension
// 2 or 3 (sample entropy's templates): every undecided coordinate is
// tested for every pair and the tests are combined without branching, so
// the count is the same as with leafPairs' early exit, at a fraction of
// the mispredicted branches. A decided coordinate is tested against +Inf,
// which always passes.
func (t *kdTree) leafPairs3(na, nb *kdNode, same bool, r float64, mask uint64) int64 {
	d, data := t.dim, t.data
	var rc [3]float64
	for c := range rc {
		rc[c] = math.Inf(1) // |a − b| > +Inf never
		if c < d && mask&(1<<c) != 0 {
			rc[c] = r
		}
	}
	var cnt int64
	for i := int(na.start); i < int(na.end); i++ {
		p := data[i*d : i*d+d]
		j0 := int(nb.start)
		if same {
			j0 = i + 1
		}
		if d == 2 {
			p0, p1 := p[0], p[1]
			for j := j0; j < int(nb.end); j++ {
				q := data[j*d : j*d+2]
				far := b2i(math.Abs(q[0]-p0) > rc[0]) | b2i(math.Abs(q[1]-p1) > rc[1])
				cnt += 1 - far
			}
			continue
		}
		p0, p1, p2 := p[0], p[1], p[2]
		for j := j0; j < int(nb.end); j++ {
			q := data[j*d : j*d+3]
			far := b2i(math.Abs(q[0]-p0) > rc[0]) | b2i(math.Abs(q[1]-p1) > rc[1]) | b2i(math.Abs(q[2]-p2) > rc[2])
			cnt += 1 - far
		}
	}
	return cnt
}

// b2i is 1 for true and 0 for false.
func b2i(b bool) int64 {
	if b {
		return 1
	}
	return 0
}

// tieSearch holds the state of one nearest-neighbour query that reports
// ties (nearestTie).
type tieSearch struct {
	q      []float64 // the first len(q) coordinates are compared
	qi, w  int       // exclude original indices j with |j − qi| ≤ w
	m      int       // and j ≥ m
	euclid bool
	best   int
	bd     float64
	tie    bool
	off    []float64 // per coordinate: a lower bound of |p_c − q_c| in the current cell
}

// nearestTie is nearest restricted to points j < m, comparing only the
// first len(q) coordinates, and reporting whether another point lies at
// exactly the nearest distance (tie). Unlike nearest, its answer does not
// depend on the traversal order — the least distance and whether it is
// shared are properties of the point set — so any tree over a superset of
// the points serves, however it was built, and the traversal is free to be
// cheap: the child on q's side of the split first, the other pruned by the
// incremental distance to its cell (the split planes crossed; Arya &
// Mount, SODA 1993 (memory)), and a leaf scanned only when its tight box
// is within the best distance.
func (t *kdTree) nearestTie(q []float64, qi, w, m int, euclid bool) (int, float64, bool) {
	s := tieSearch{q: q, qi: qi, w: w, m: m, euclid: euclid, best: -1, bd: math.Inf(1), off: make([]float64, len(q))}
	t.nnTie(0, &s, 0)
	if euclid {
		return s.best, math.Sqrt(s.bd), s.tie
	}
	return s.best, s.bd, s.tie
}

func (t *kdTree) nnTie(n int32, s *tieSearch, rd float64) {
	if rd > s.bd {
		return
	}
	node := &t.nodes[n]
	if node.left < 0 {
		if t.boxLower(n, s.q, s.euclid) > s.bd {
			return
		}
		D := t.dim
		for k := int(node.start); k < int(node.end); k++ {
			id := int(t.ids[k])
			if dj := id - s.qi; id >= s.m || (dj <= s.w && dj >= -s.w) {
				continue
			}
			p := t.data[k*D : k*D+len(s.q)]
			var dist float64
			bd := s.bd
			if s.euclid {
				for c, v := range s.q {
					g := p[c] - v
					dist += g * g
					if dist > bd {
						break
					}
				}
			} else {
				for c, v := range s.q {
					dist = max(dist, math.Abs(p[c]-v))
					if dist > bd {
						break
					}
				}
			}
			switch {
			case dist > bd || dist == 0:
			case dist < bd:
				s.best, s.bd, s.tie = id, dist, false
			default:
				s.tie = true
			}
		}
		return
	}
	near, far, c, g := t.split(n, s.q)
	t.nnTie(near, s, rd)
	if c < 0 {
		t.nnTie(far, s, rd)
		return
	}
	old := s.off[c]
	s.off[c] = max(old, g)
	t.nnTie(far, s, cellBound(s.off, rd, c, s.euclid))
	s.off[c] = old
}

// split returns the children of internal node n, the one on q's side of
// the split first, the split coordinate (−1 when it is not among q's, and
// the order is then left, right) and the gap g = |q_c − split value|,
// a lower bound of |p_c − q_c| for every point p of the far child: the
// far child's points lie beyond the split value, and rounded subtraction
// is monotone.
func (t *kdTree) split(n int32, q []float64) (near, far int32, c int, g float64) {
	node := &t.nodes[n]
	c = int(t.splitDim[n])
	if c >= len(q) {
		return node.left, node.right, -1, 0
	}
	diff := q[c] - t.splitVal[n]
	if diff >= 0 {
		return node.right, node.left, c, diff
	}
	return node.left, node.right, c, -diff
}

// cellBound returns a lower bound of the distance from q to any point of a
// cell whose per-coordinate gaps are off (coordinate c just raised; rd is
// the bound before): the largest gap under the maximum norm, else the sum
// of squared gaps over the coordinates in order — each term at most the
// point's own, and floating-point addition is monotone, so the bound never
// exceeds a distance computed coordinate by coordinate.
func cellBound(off []float64, rd float64, c int, euclid bool) float64 {
	if !euclid {
		return max(rd, off[c])
	}
	var s float64
	for _, g := range off {
		s += g * g
	}
	return s
}
