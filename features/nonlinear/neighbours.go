package nonlinear

import (
	"fmt"
	"math"
)

// Index is a neighbour-search index over the delay vectors of a series,
// y_i = (x_i, x_{i+τ}, …, x_{i+(d−1)τ}), i = 0 … Len()−1: the k-d tree the
// estimators of this package search, exported for the constructions that
// link delay vectors (recurrence networks). Distances are maximum-norm or
// Euclidean. Queries are read-only: an Index is safe for concurrent use.
type Index struct {
	t      *kdTree
	maxID  []int32 // per tree node, the largest original index below it
	z      []float64
	dim    int
	delay  int
	count  int
	euclid bool
}

// NewIndex builds the index over the delay vectors of x of dimension dim
// and delay τ (dim ≥ 1, delay ≥ 1, len(x) > (dim−1)·delay), under the
// Euclidean norm when euclid is set and the maximum norm otherwise. x is
// used as given (not standardised) and must not be modified while the index
// is in use.
func NewIndex(x []float64, dim, delay int, euclid bool) (*Index, error) {
	if dim < 1 || delay < 1 || dim > 64 {
		return nil, fmt.Errorf("neighbour index: dimension %d, delay %d: %w", dim, delay, ErrTooShort)
	}
	count := len(x) - (dim-1)*delay
	if count < 1 {
		return nil, fmt.Errorf("neighbour index: %d samples, dimension %d, delay %d: %w", len(x), dim, delay, ErrTooShort)
	}
	ix := &Index{t: newDelayTree(x, dim, delay, count, kdLeafSize), z: x, dim: dim, delay: delay, count: count, euclid: euclid}
	ix.maxID = make([]int32, len(ix.t.nodes))
	ix.fillMaxID(0)
	return ix, nil
}

// fillMaxID records the largest original index under node n.
func (ix *Index) fillMaxID(n int32) int32 {
	nd := &ix.t.nodes[n]
	m := int32(-1)
	if nd.left >= 0 {
		m = max(ix.fillMaxID(nd.left), ix.fillMaxID(nd.right))
	} else {
		for _, id := range ix.t.ids[nd.start:nd.end] {
			m = max(m, id)
		}
	}
	ix.maxID[n] = m
	return m
}

// Len returns the number of delay vectors.
func (ix *Index) Len() int { return ix.count }

// Vector copies delay vector i into dst (length Dim) and returns it.
func (ix *Index) Vector(i int, dst []float64) []float64 {
	dst = dst[:ix.dim]
	for c := range dst {
		dst[c] = ix.z[i+c*ix.delay]
	}
	return dst
}

// Dim returns the dimension of the vectors.
func (ix *Index) Dim() int { return ix.dim }

// Distance returns the distance between vectors i and j under the index's
// norm, computed exactly as the searches compute it.
func (ix *Index) Distance(i, j int) float64 {
	var s float64
	for c := 0; c < ix.dim; c++ {
		g := ix.z[i+c*ix.delay] - ix.z[j+c*ix.delay]
		if ix.euclid {
			s += g * g
		} else {
			s = max(s, math.Abs(g))
		}
	}
	if ix.euclid {
		return math.Sqrt(s)
	}
	return s
}

// Within calls visit(j, dist) for every vector j > i + w whose distance to
// vector i is at most r (w ≥ 0 is a Theiler window; w = 0 excludes only i
// itself), in no particular order. Looking only forward in time, calling it
// for every i enumerates each pair once. q is scratch of length Dim (nil:
// allocated).
func (ix *Index) Within(i int, r float64, w int, q []float64, visit func(j int, dist float64)) {
	if q == nil {
		q = make([]float64, ix.dim)
	}
	q = ix.Vector(i, q)
	rr := r
	if ix.euclid {
		rr = r * r
	}
	s := rangeSearch{q: q, from: i + w + 1, r: rr, euclid: ix.euclid, visit: visit, maxID: ix.maxID}
	ix.t.within(0, &s)
}

// rangeSearch holds the state of one fixed-radius query.
type rangeSearch struct {
	q      []float64
	from   int     // accept original indices ≥ from
	r      float64 // radius (squared for Euclidean)
	euclid bool
	visit  func(j int, dist float64)
	maxID  []int32 // per node, the largest original index below it
}

func (t *kdTree) within(n int32, s *rangeSearch) {
	if int(s.maxID[n]) < s.from || t.boxLower(n, s.q, s.euclid) > s.r {
		return
	}
	node := &t.nodes[n]
	if node.left >= 0 {
		t.within(node.left, s)
		t.within(node.right, s)
		return
	}
	d := t.dim
	for k := int(node.start); k < int(node.end); k++ {
		id := int(t.ids[k])
		if id < s.from {
			continue
		}
		p := t.data[k*d : k*d+d]
		var dist float64
		if s.euclid {
			for c, v := range s.q {
				g := p[c] - v
				dist += g * g
				if dist > s.r {
					break
				}
			}
		} else {
			for c, v := range s.q {
				if g := math.Abs(p[c] - v); g > dist {
					dist = g
					if dist > s.r {
						break
					}
				}
			}
		}
		if dist <= s.r {
			if s.euclid {
				dist = math.Sqrt(dist)
			}
			s.visit(id, dist)
		}
	}
}

// KNearest fills ids and dists (length k) with the k vectors nearest to
// vector i among those with |j − i| > w (w ≥ 0; w = 0 excludes only i
// itself), ascending by distance (ties by index order of discovery), and
// returns how many it found (fewer than k only when fewer vectors lie
// outside the window). q is scratch of length Dim (nil: allocated).
func (ix *Index) KNearest(i, w int, q []float64, ids []int, dists []float64) int {
	if q == nil {
		q = make([]float64, ix.dim)
	}
	q = ix.Vector(i, q)
	s := knnSearch{q: q, qi: i, w: w, k: len(ids), euclid: ix.euclid, ids: ids[:0], dists: dists[:0]}
	ix.t.knn(0, &s)
	if ix.euclid {
		for k := range s.dists {
			s.dists[k] = math.Sqrt(s.dists[k])
		}
	}
	return len(s.ids)
}

// Standardize returns (x − mean)/sd, as every estimator of this package
// sees its series (moments computed exactly scaled, see the package's
// input checks), and sd (population): ErrNonFinite, ErrConstant or, for
// fewer than minN samples, ErrTooShort.
func Standardize(x []float64, minN int) ([]float64, float64, error) {
	return standardizeSD(x, max(minN, 1), "standardize")
}
