package nonlinear

import (
	"cmp"
	"math"
	"slices"
)

// projection orders the samples of a series by value: the first
// coordinate of every delay vector y_j = (z_j, z_{j+τ}, …) is z_j, so one
// sort serves the neighbour searches of every dimension and delay. A search
// walks outward from the query's own value and stops once the gap in the
// first coordinate alone exceeds the best distance found (search by sorted
// projection: Friedman, Baskett & Shustek, IEEE Trans. Comput. C-24 (1975)
// 1000 (memory)). With a few hundred to a few thousand queries per series
// this costs less than building a k-d tree over every vector, which the
// queries would not repay.
//
// The searches compute distances exactly as the k-d tree does (the same
// operations in the same coordinate order), so a unique nearest neighbour
// is the tree's answer. When several vectors lie at exactly the nearest
// distance the tree's choice depends on its traversal order: the searches
// report such a tie, and the caller asks the k-d tree instead, so the
// results stay identical to a search by k-d tree alone.
type projection struct {
	dims, delay int
	val         []float64 // sorted values
	idx         []int32   // idx[p]: sample index of val[p]
	pos         []int32   // pos[i]: position of sample i in val
	// rows[p·dims + c] = z[idx[p] + c·delay] (0 past the end of z): the
	// delay vectors in sorted order, so that a search reads memory in
	// sequence.
	rows []float64
}

// newProjection sorts z (ties by index) and lays out its delay vectors of
// dims coordinates at delay in sorted order.
func newProjection(z []float64, dims, delay int) *projection {
	type entry struct {
		v float64
		i int32
	}
	e := make([]entry, len(z))
	for i, v := range z {
		e[i] = entry{v, int32(i)}
	}
	slices.SortFunc(e, func(a, b entry) int {
		if c := cmp.Compare(a.v, b.v); c != 0 {
			return c
		}
		return cmp.Compare(a.i, b.i)
	})
	p := &projection{
		dims: dims, delay: delay,
		val: make([]float64, len(z)), idx: make([]int32, len(z)), pos: make([]int32, len(z)),
		rows: make([]float64, len(z)*dims),
	}
	for k, x := range e {
		p.val[k], p.idx[k] = x.v, x.i
		p.pos[x.i] = int32(k)
		row := p.rows[k*dims : (k+1)*dims]
		for c := range row {
			if j := int(x.i) + c*delay; j < len(z) {
				row[c] = z[j]
			}
		}
	}
	return p
}

// nnScan is one nearest-neighbour search by sorted projection: the
// vectors are visited upward from the query's position, then downward,
// each direction until the gap in the first coordinate alone exceeds the
// best distance so far. The order of the visits does not change the
// answer: the search finds the least distance and every vector at it.
type nnScan struct {
	p       *projection
	q       []float64 // query coordinates (its dimension d)
	i, m, w int       // query index; candidates j < m with |j − i| > w
	euclid  bool      // squared Euclidean distance instead of maximum norm
	best    int
	bd      float64 // best distance (squared when euclid)
	tie     bool
	cost    int // candidates examined
	limit   int // candidates allowed; past them the search gives up
}

// nearestMax returns the nearest neighbour of the delay vector i, in
// dimension d ≤ dims, among the vectors j < m with |j − i| > w at a
// distance > 0 under the maximum norm, its distance, and whether another
// such vector lies at exactly that distance; cost counts the candidates
// examined. j is −1 and the distance +Inf when no vector qualifies. A
// search that would examine more than limit candidates gives up and
// reports a tie, so that the caller asks a tree.
func (p *projection) nearestMax(i, d, m, w, limit int) (best int, dist float64, tie bool, cost int) {
	s := p.scan(i, d, m, w, limit, false)
	return s.best, s.bd, s.tie, s.cost
}

// nearestEuclid is nearestMax under the Euclidean norm; the distance is
// √(Σ_c (y_{j,c} − y_{i,c})²) summed over c in order, as the k-d tree sums
// it.
func (p *projection) nearestEuclid(i, d, m, w, limit int) (best int, dist float64, tie bool, cost int) {
	s := p.scan(i, d, m, w, limit, true)
	return s.best, math.Sqrt(s.bd), s.tie, s.cost
}

func (p *projection) scan(i, d, m, w, limit int, euclid bool) nnScan {
	at := int(p.pos[i])
	s := nnScan{p: p, q: p.rows[at*p.dims : at*p.dims+d], i: i, m: m, w: w, euclid: euclid, best: -1, bd: math.Inf(1), limit: limit}
	s.walk(at+1, 1)
	if s.cost <= s.limit {
		s.walk(at-1, -1)
	}
	return s
}

// walk visits positions pp, pp+step, … (see nnScan).
func (s *nnScan) walk(pp, step int) {
	p, q := s.p, s.q
	D, d, q0 := p.dims, len(s.q), s.q[0]
	for ; pp >= 0 && pp < len(p.val); pp += step {
		dist := math.Abs(p.val[pp] - q0)
		if s.euclid {
			dist *= dist
		}
		if dist > s.bd {
			return
		}
		if s.cost++; s.cost > s.limit {
			s.tie = true // gave up: unsettled
			return
		}
		j := int(p.idx[pp])
		if j >= s.m || (j-s.i <= s.w && s.i-j <= s.w) {
			continue
		}
		row := p.rows[pp*D : pp*D+d]
		if s.euclid {
			for c := 1; c < d && dist <= s.bd; c++ {
				g := row[c] - q[c]
				dist += g * g
			}
		} else {
			for c := 1; c < d && dist <= s.bd; c++ {
				if g := math.Abs(row[c] - q[c]); g > dist {
					dist = g
				}
			}
		}
		switch {
		case dist > s.bd || dist == 0:
		case dist < s.bd:
			s.best, s.bd, s.tie = j, dist, false
		default:
			s.tie = true
		}
	}
}

// kNearestEuclid fills ids and dists (length k) with the k vectors j in
// [from, to) nearest to the delay vector t in dimension d ≤ dims, under
// the Euclidean norm, in increasing order of distance, with the distances;
// zero distances count. tie reports that the k + 1 nearest distances are
// not all different, so that the set or the order of the k nearest
// depends on how ties are broken; cost counts the candidates examined, and
// a search past limit candidates gives up and reports a tie.
// top and topD are scratch of length k + 1. The range must hold more than
// k vectors, and t must lie outside it.
func (p *projection) kNearestEuclid(t, d, from, to, limit int, ids []int, dists []float64, top []int, topD []float64) (tie bool, cost int) {
	s := knnScan{p: p, from: from, to: to, top: top, topD: topD, bound: math.Inf(1), limit: limit}
	at := int(p.pos[t])
	s.q = p.rows[at*p.dims : at*p.dims+d]
	s.walk(at+1, 1)
	if s.cost > limit {
		return true, s.cost
	}
	s.walk(at-1, -1)
	if s.cost > limit {
		return true, s.cost
	}
	for a := 0; a+1 < s.found; a++ {
		if topD[a] == topD[a+1] {
			tie = true
		}
	}
	for a := range ids {
		ids[a], dists[a] = top[a], math.Sqrt(topD[a])
	}
	return tie, s.cost
}

// knnScan is the state of kNearestEuclid.
type knnScan struct {
	p        *projection
	q        []float64
	from, to int
	top      []int
	topD     []float64 // squared distances, ascending
	found    int
	bound    float64 // squared distance of the (k+1)-th so far
	cost     int
	limit    int
}

func (s *knnScan) walk(pp, step int) {
	p, q := s.p, s.q
	D, d, q0 := p.dims, len(s.q), s.q[0]
	for ; pp >= 0 && pp < len(p.val); pp += step {
		g0 := p.val[pp] - q0
		dist := g0 * g0
		if dist > s.bound {
			return
		}
		if s.cost++; s.cost > s.limit {
			return
		}
		j := int(p.idx[pp])
		if j < s.from || j >= s.to {
			continue
		}
		row := p.rows[pp*D : pp*D+d]
		for c := 1; c < d && dist <= s.bound; c++ {
			g := row[c] - q[c]
			dist += g * g
		}
		s.insert(j, dist)
	}
}

// insert records vector j at squared distance dist (ignored when beyond
// the bound) in the sorted list of the k+1 nearest.
func (s *knnScan) insert(j int, dist float64) {
	if dist > s.bound {
		return
	}
	k1 := len(s.top)
	slot := s.found
	if s.found < k1 {
		s.found++
	} else {
		slot = k1 - 1
		if !(dist < s.topD[slot]) {
			return // equal to the (k+1)-th: the distances do not change
		}
	}
	for slot > 0 && s.topD[slot-1] > dist {
		s.top[slot], s.topD[slot] = s.top[slot-1], s.topD[slot-1]
		slot--
	}
	s.top[slot], s.topD[slot] = j, dist
	if s.found == k1 {
		s.bound = s.topD[k1-1]
	}
}

// searchPlan chooses, query by query, which search answers a run of
// neighbour queries among n vectors: sorted projection while it pays, then
// a shared search tree where there is one, and the caller's own k-d tree
// once ties are common. In high dimension (noise, whose delay vectors fill
// the space) the first coordinate prunes little, and a tree, whose boxes
// prune in every coordinate, is cheaper once built: the projection is
// dropped when the first 32 queries examined more than max(256, n/32)
// candidates each on average, or at once when one query needs more than
// 16 times that (limit; the query then gives up and a tree answers it).
// Exactly periodic and discrete series repeat their delay vectors, so that
// many vectors share the nearest distance; every such tie is settled by
// the caller's k-d tree, so once more than a quarter of the queries (from
// the eighth on) tied, that tree answers alone. The answers are the same
// whichever search gives them.
type searchPlan struct {
	n                int
	done, cost, ties int
	noProj, noFast   bool
}

// next reports whether the next query should try the projection and
// whether it should try a shared search tree.
func (p *searchPlan) next() (proj, fast bool) {
	if p.done >= 32 && p.cost > p.done*max(256, p.n/32) {
		p.noProj = true
	}
	if p.done >= 8 && 4*p.ties > p.done {
		p.noProj, p.noFast = true, true
	}
	return !p.noProj, !p.noFast
}

// limit is the most candidates one query by projection may examine.
func (p *searchPlan) limit() int {
	return 16 * max(256, p.n/32)
}

// record notes a query that examined cost candidates by projection and
// whether it tied (or gave up).
func (p *searchPlan) record(cost int, tie bool) {
	if cost > p.limit() {
		p.noProj = true
	}
	p.done++
	p.cost += cost
	if tie {
		p.ties++
	}
}
