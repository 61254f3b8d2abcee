package nonlinear

import (
	"fmt"
	"math"
)

// Defaults shared by the dimension searches (Cao, FalseNeighbours) and by
// Embed, which runs them.
const (
	defaultMaxDim    = 10    // largest dimension tested
	defaultMaxRef    = 1000  // reference points
	defaultMaxPoints = 20000 // samples searched (a prefix)
)

// dimSearchInput is the input stage shared by Cao and FalseNeighbours: it
// standardises x (at least 50 samples) and resolves the delay (given, or
// chosen as in Embed) and the Theiler window (given, or defaultTheiler).
// who names the caller in error messages.
func dimSearchInput(x []float64, delay, theiler int, who string) (z []float64, tau, w int, err error) {
	z, err = standardize(x, 50, who)
	if err != nil {
		return nil, 0, 0, err
	}
	tau, acf, _, err := chooseDelay(z, EmbedOptions{Delay: delay})
	if err != nil {
		return nil, 0, 0, fmt.Errorf("%s: %w", who, err)
	}
	return z, tau, orDefault(theiler, defaultTheiler(acf, tau)), nil
}

// dimSearch is the nearest-neighbour set-up shared by Cao's method and false
// nearest neighbours: both compare, for evenly spaced reference vectors in
// dimension d, the nearest neighbour's distance with the gap that the
// (d+1)-th coordinate adds.
type dimSearch struct {
	z      []float64 // standardised series, cut to MaxPoints samples
	delay  int
	w      int // Theiler window
	maxDim int // resolved MaxDim
	refs   []int
	q      []float64 // query scratch
	// rec, when not nil, shares its sorted projection of the series;
	// proj is the projection in use (built on the first maximum-norm
	// search).
	rec    *Reconstruction
	proj   *projection
	shared *kdTree // search tree of every dimension (Reconstruction.searchTree)
	// carried from one dimension to the next (dimensions are searched in
	// increasing order, and neither the projection's pruning nor the ties
	// get better with the dimension): the projection was given up, ties
	// were common.
	noProj, noFast bool
}

// newDimSearch resolves MaxDim, MaxRef and MaxPoints (≤ 0: the defaults),
// cuts z to MaxPoints samples and picks the reference points among the
// vectors that exist up to dimension maxDim+extra (extra: how many
// dimensions beyond MaxDim the method reads). It fails with ErrTooShort
// when fewer than 50 such vectors, or not more than 2w+10, remain.
func newDimSearch(z []float64, delay, w, maxDim, maxRef, maxPoints, extra int, who string) (*dimSearch, error) {
	maxDim = orDefault(maxDim, defaultMaxDim)
	maxRef = orDefault(maxRef, defaultMaxRef)
	maxPoints = orDefault(maxPoints, defaultMaxPoints)
	if len(z) > maxPoints {
		z = z[:maxPoints]
	}
	n := len(z)
	top := maxDim + extra
	valid := n - (top-1)*delay
	if valid < 50 || valid <= 2*w+10 {
		return nil, fmt.Errorf("%s: %d samples leave %d vectors at dimension %d, delay %d, Theiler window %d: %w",
			who, n, valid, top, delay, w, ErrTooShort)
	}
	return &dimSearch{
		z: z, delay: delay, w: w, maxDim: maxDim,
		refs: evenlySpaced(valid, maxRef),
		q:    make([]float64, top-1),
	}, nil
}

// neighbours calls visit, in the order of the reference points, for every
// reference vector y_i of dimension d that has a nearest neighbour y_j
// outside the Theiler window (distinct from it; maximum norm, or Euclidean
// when euclid is set), with their distance dist and the gap
// extra = |z_{i+dτ} − z_{j+dτ}| of the (d+1)-th coordinate. The vectors
// searched are those that have a (d+1)-th coordinate.
//
// Under the maximum norm the neighbours are found by sorted projection
// (one sort of the samples serves every dimension) or in one search tree
// shared by every dimension (Reconstruction.searchTree), as searchPlan
// decides; a reference whose nearest distance is shared by several vectors
// is settled by the k-d tree of dimension d, built only then, so the
// answers are those of that tree alone (see projection).
func (s *dimSearch) neighbours(d int, euclid bool, visit func(dist, extra float64)) {
	z, delay := s.z, s.delay
	m := len(z) - d*delay
	var tree *kdTree // the k-d tree of dimension d, on the first tie
	if euclid {
		tree = newDelayTree(z, d, delay, m, kdLeafSize)
	} else if s.proj == nil {
		s.proj = s.rec.projectionOf(z, s.maxDim+2, delay)
	}
	q := s.q[:d]
	plan := searchPlan{n: m, noProj: euclid || s.noProj, noFast: euclid || s.noFast}
	for _, i := range s.refs {
		var j int
		var dist float64
		tie := true
		for c := range q {
			q[c] = z[i+c*delay]
		}
		switch proj, fast := plan.next(); {
		case proj:
			var c int
			j, dist, tie, c = s.proj.nearestMax(i, d, m, s.w, plan.limit())
			plan.record(c, tie)
		case fast:
			if s.shared == nil {
				s.shared = s.rec.searchTree(z, s.maxDim+1, delay)
			}
			j, dist, tie = s.shared.nearestTie(q, i, s.w, m, false)
			plan.record(0, tie)
		}
		if tie {
			if tree == nil {
				tree = newDelayTree(z, d, delay, m, kdLeafSize)
			}
			j, dist = tree.nearest(q, i, s.w, euclid)
		}
		if j < 0 {
			continue
		}
		visit(dist, math.Abs(z[i+d*delay]-z[j+d*delay]))
	}
	if !euclid {
		s.noProj, s.noFast = plan.noProj, plan.noFast
	}
	if plan.noProj && !euclid && s.rec != nil {
		if s.rec.noProj == nil {
			s.rec.noProj = map[int]bool{}
		}
		s.rec.noProj[d] = true
	}
}
