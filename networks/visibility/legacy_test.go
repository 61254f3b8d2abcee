package visibility

// This file keeps the previous natural-visibility sweep (a plain Cartesian
// tree walk that collects index pairs, handing over to ray shooting after
// 128 + 48·(edges found) steps, then sorting the pairs into CSR), so that
// TestBuildersMatchLegacy can check that the optimised Natural (gap-doubling
// hull probes, delta-coded edge log, sort-free placement) gives bit-identical
// CSR arrays on long series, where the O(n³) definition (naive_test.go) is
// too slow to run. It shares the exact predicate (above), the pair buffer
// (pairBuf, fromPairs, still used by networks.FromEdges) and the hull tree with the
// package; those are checked against the definition in naive_test.go. It
// also keeps the previous HVG builder (one pass keeping every edge, then a
// placement pass), replaced by two passes that write the CSR arrays
// directly.

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	"github.com/tracesift/tracesift/networks"
)

func legacyNatural(x []float64, opts Options) (*networks.Graph, error) {
	if err := networks.CheckSeries(x, "natural visibility"); err != nil {
		return nil, err
	}
	n := len(x)
	maxEdges := networks.MaxEdges(opts.MaxEdges)
	t, root := cartesianTree(x)
	left, right := make([]int32, n), make([]int32, n)
	for i, nd := range t {
		left[i], right[i] = nd.l, nd.r
	}

	sw := &legacySweeper{
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
		if sw.pairs.Len() > maxEdges {
			return nil, &networks.EdgeBudgetError{Graph: "natural visibility", Nodes: len(x), Budget: maxEdges}
		}
	}
	return sw.pairs.Build(n, networks.KindNVG), nil
}

// legacySweeper holds the reusable traversal stack of the sweeps.
type legacySweeper struct {
	x     []float64
	left  []int32
	right []int32
	stack []frame
	pairs networks.EdgeBuffer
	tree  *hullTree // built on first need
}

// A sweep that has walked more than legacySwitchBase + legacySwitchPer·(edges found)
// Cartesian-tree frames finishes with hull ray shooting instead. Noise
// rarely gets there; monotone and trending stretches do, where the walk
// would cost O(n) per sweep.
var (
	legacySwitchBase = 128
	legacySwitchPer  = 48
)

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
func (s *legacySweeper) sweep(m int, child int32, a, b int32, dir int) {
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
		if have && work > legacySwitchBase+legacySwitchPer*found {
			// Hand the rest, the index block next to the samples already
			// swept, to ray shooting.
			lo, hi := restSpan(st[len(st)-1], a, b, dir)
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
				s.pairs.Add(m, u)
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
func (s *legacySweeper) shoot(m, lo, hi, dir int, q *rayQuery) {
	if s.tree == nil {
		s.tree = newHullTree(s.x)
	}
	x := s.x
	for lo <= hi {
		c := s.tree.nearest(1, 0, s.tree.size*hullBlock-1, lo, hi, q)
		if c < 0 {
			return
		}
		s.pairs.Add(m, c)
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

// legacyHorizontal is the previous HVG builder: one stack pass keeping
// every edge, then a placement pass.
func legacyHorizontal(x []float64, opts Options) (*networks.Graph, error) {
	if err := networks.CheckSeries(x, "horizontal visibility"); err != nil {
		return nil, err
	}
	n := len(x)
	// One stack pass records the lower neighbours of every j, grouped by j
	// and descending within a group (at most 2n of them, < 2n edges); a
	// second, branch-free pass lays them into CSR: j's lower section is its
	// group reversed, and each t receives j in its upper section in ascending
	// order of j.
	lower := make([]int32, n)
	lows := make([]int32, 0, 2*n)
	stack := make([]int32, 0, 64)
	for j, xj := range x {
		for len(stack) > 0 {
			t := stack[len(stack)-1]
			if x[t] >= xj {
				break
			}
			lows = append(lows, t)
			stack = stack[:len(stack)-1]
		}
		if len(stack) > 0 {
			t := stack[len(stack)-1]
			lows = append(lows, t)
			if x[t] == xj {
				stack = stack[:len(stack)-1]
			}
		}
		lower[j] = int32(len(lows))
		stack = append(stack, int32(j))
	}
	edges := int64(len(lows))
	if max := networks.MaxEdges(opts.MaxEdges); edges > max {
		return nil, &networks.EdgeBudgetError{Graph: "horizontal visibility", Nodes: len(x), Budget: max}
	}
	// lower[j] holds the running count; turn it into per-node counts and
	// degrees.
	offsets := make([]int64, n+1)
	prev := int32(0)
	for j := 0; j < n; j++ {
		c := lower[j] - prev
		prev = lower[j]
		lower[j] = c
		offsets[j] += int64(c)
	}
	for _, t := range lows {
		offsets[t]++
	}
	sum := networks.DegreesToOffsets(offsets)
	adj := make([]int32, sum)
	up := make([]int32, n) // filled part of each upper section
	k := 0
	for j := 0; j < n; j++ {
		p := offsets[j] + int64(lower[j]) // j's lower section, filled backwards
		for _, t := range lows[k : k+int(lower[j])] {
			p--
			adj[p] = t
			adj[offsets[t]+int64(lower[t]+up[t])] = int32(j)
			up[t]++
		}
		k += int(lower[j])
	}
	return networks.NewCSR(networks.KindHVG, offsets, adj, lower), nil
}

// sameCSR returns an error describing the first difference between the CSR
// arrays of g and want (offsets, adjacency, in-degrees and kind).
func sameCSR(g, want *networks.Graph) error {
	if g.Kind() != want.Kind() || g.Len() != want.Len() || g.Edges() != want.Edges() {
		return fmt.Errorf("kind/n/edges %v/%d/%d, want %v/%d/%d", g.Kind(), g.Len(), g.Edges(), want.Kind(), want.Len(), want.Edges())
	}
	for i := 0; i < g.Len(); i++ {
		if g.Degree(i) != want.Degree(i) || g.InDegree(i) != want.InDegree(i) {
			return fmt.Errorf("node %d: degree %d (in %d), want %d (in %d)", i, g.Degree(i), g.InDegree(i), want.Degree(i), want.InDegree(i))
		}
		if !slices.Equal(g.Neighbors(i), want.Neighbors(i)) {
			return fmt.Errorf("node %d: neighbours differ", i)
		}
	}
	go1, ga := g.CSR()
	wo, wa := want.CSR()
	if !slices.Equal(go1, wo) || !slices.Equal(ga, wa) {
		return fmt.Errorf("raw CSR arrays differ")
	}
	return nil
}

// TestBuildersMatchLegacy: the optimised NVG builder gives exactly the CSR
// arrays of the previous sweep (kept above) on long series of every regime
// the sweep distinguishes — noise (shallow Cartesian tree), Brownian motion
// (deep tree, many edges, ray shooting now and then), trend + noise (ray
// shooting on most sweeps), integer walks and three-level noise (ties and
// collinear triples through the exact predicate) and a concave path; and
// the same for the HVG builder. Reference: the previous builders, which
// passed the checks against the definitions in naive_test.go.
func TestBuildersMatchLegacy(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	const n = 200_000
	series := map[string][]float64{
		"gauss": testseries.Bench("gauss", n),
		"brown": testseries.Bench("brown", n),
		"trend": testseries.Bench("trend", n/2),
	}
	walk := make([]float64, n)
	ties := make([]float64, n)
	v := 0.0
	for i := range walk {
		v += float64(1 - 2*rng.IntN(2))
		walk[i] = v
		ties[i] = float64(rng.IntN(3))
	}
	series["intwalk"] = walk
	series["ties"] = ties
	concave := make([]float64, 30_000)
	for i := range concave {
		concave[i] = math.Sqrt(float64(i)) + 1e-3*rng.NormFloat64()
	}
	series["concave"] = concave
	for name, x := range series {
		g, err := Natural(x, Options{})
		if err != nil {
			t.Fatalf("nvg %s: %v", name, err)
		}
		want, err := legacyNatural(x, Options{})
		if err != nil {
			t.Fatalf("legacy nvg %s: %v", name, err)
		}
		if err := sameCSR(g, want); err != nil {
			t.Errorf("nvg %s: %v", name, err)
		}
		h, err := Horizontal(x, Options{})
		if err != nil {
			t.Fatalf("hvg %s: %v", name, err)
		}
		want, err = legacyHorizontal(x, Options{})
		if err != nil {
			t.Fatalf("legacy hvg %s: %v", name, err)
		}
		if err := sameCSR(h, want); err != nil {
			t.Errorf("hvg %s: %v", name, err)
		}
	}
}
