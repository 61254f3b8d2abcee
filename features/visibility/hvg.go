package visibility

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
// x must be finite (ErrNonFinite) and non-empty (ErrEmpty). Options.MaxEdges
// is never reached in practice (the HVG has < 2n edges) but is honoured.
func Horizontal(x []float64, opts Options) (*Graph, error) {
	if err := checkSeries(x, "horizontal visibility"); err != nil {
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
	if max := opts.maxEdges(); edges > max {
		return nil, errTooMany("horizontal visibility", max)
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
	sum := degreesToOffsets(offsets)
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
	return &Graph{kind: KindHVG, offsets: offsets, adj: adj, lower: lower}, nil
}
