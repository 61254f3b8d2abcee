package visibility

import "github.com/tracesift/tracesift/networks"

// Horizontal returns the horizontal visibility graph of x: samples a < b are
// linked iff every c with a < c < b satisfies x_c < min(x_a, x_b) (strictly;
// equal heights block). Luque et al., Phys. Rev. E 80 (2009) 046103.
//
// Algorithm: one pass with a stack of samples of strictly decreasing height
// that can still see forward. A new sample j pops and links every lower
// sample on the stack, then links the first sample that is not lower; if that
// one has the same height it is popped too (j hides it from everything
// later). Every sample is pushed and popped at most once and the graph has
// fewer than 2n edges, so time and memory are O(n).
//
// With edges read forward in time (Graph.InDegree, OutDegree, Predecessors,
// Successors) this is the directed HVG of Lacasa et al., Eur. Phys. J. B 85
// (2012) 217.
//
// Ties: equal heights block. Two equal samples see each other only when
// every sample between them is lower, and a sample between a and b as high
// as the lower of the two hides them from each other; on a plateau of equal
// samples each sees only its neighbours. The published i.i.d. results
// (mean degree 4, λ = ln 3/2) assume distinct values: i.i.d. noise recorded
// with 16 levels over ±3 sd gives a mean degree of 3.42 and λ ≈ 0.57
// (measured, n = 5000). features.Extract dithers such a series first.
//
// x must be finite (ErrNonFinite) and non-empty (ErrEmpty). Options.MaxEdges
// is never reached in practice (the HVG has < 2n edges) but is honoured.
func Horizontal(x []float64, opts Options) (*networks.Graph, error) {
	if err := networks.CheckSeries(x, "horizontal visibility"); err != nil {
		return nil, err
	}
	n := len(x)
	// Two passes of the same stack walk. The first counts degrees (into
	// offsets) and lower neighbours; the second writes the CSR arrays
	// directly: j meets its lower neighbours nearest first, so its lower
	// section is filled backwards, and each sample on the stack carries the
	// next free slot of its upper section, which receives j in ascending
	// order. Walking twice costs far less than keeping the edges between
	// the passes: the output arrays are all the memory there is, which
	// matters at 10^7 samples, where touching fresh memory dominates.
	offsets := make([]int64, n+1)
	lower := make([]int32, n)
	stack := make([]int32, 0, 64)
	var edges int64
	for j, xj := range x {
		k := int32(0)
		for len(stack) > 0 {
			t := stack[len(stack)-1]
			if x[t] >= xj {
				break
			}
			offsets[t]++
			k++
			stack = stack[:len(stack)-1]
		}
		if len(stack) > 0 {
			t := stack[len(stack)-1]
			offsets[t]++
			k++
			if x[t] == xj {
				stack = stack[:len(stack)-1]
			}
		}
		lower[j] = k
		offsets[j] += int64(k)
		edges += int64(k)
		stack = append(stack, int32(j))
	}
	if max := networks.MaxEdges(opts.MaxEdges); edges > max {
		return nil, &networks.EdgeBudgetError{Graph: "horizontal visibility", Nodes: n, Budget: max}
	}
	networks.DegreesToOffsets(offsets)
	adj := make([]int32, 2*edges)
	type open struct {
		t    int32
		next int64 // next free slot of t's upper section
	}
	st := make([]open, 0, cap(stack))
	for j, xj := range x {
		p := offsets[j] + int64(lower[j]) // j's lower section, filled backwards
		for len(st) > 0 {
			e := st[len(st)-1]
			if x[e.t] >= xj {
				break
			}
			p--
			adj[p] = e.t
			adj[e.next] = int32(j)
			st = st[:len(st)-1]
		}
		if len(st) > 0 {
			e := &st[len(st)-1]
			p--
			adj[p] = e.t
			adj[e.next] = int32(j)
			e.next++
			if x[e.t] == xj {
				st = st[:len(st)-1]
			}
		}
		st = append(st, open{int32(j), offsets[j] + int64(lower[j])})
	}
	return networks.NewCSR(networks.KindHVG, offsets, adj, lower), nil
}
