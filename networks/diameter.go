package networks

import (
	"fmt"
)

// ExactDiameterMax is the largest graph ExactDiameter accepts: 10^5 nodes.
// iFUB usually needs a few dozen breadth-first searches, but on graphs
// with many nodes at the same maximal distance from its centre it needs
// one per such node, so the cost is bounded by n searches, O(n·E).
const ExactDiameterMax = 100_000

// DiameterStats is the exact diameter of a graph with the work it took.
type DiameterStats struct {
	// Diameter is the largest finite distance between two nodes (the
	// largest diameter of the connected components).
	Diameter int `json:"diameter"`
	// Components is the number of connected components (isolated nodes
	// included), BFS the number of breadth-first searches run.
	Components int `json:"components"`
	BFS        int `json:"bfs"`
}

// ErrTooLarge: the graph has more nodes than an exact method accepts.
var ErrTooLarge = fmt.Errorf("networks: graph too large for the exact method")

// ExactDiameter returns the exact diameter of g by iFUB (iterative
// fringe upper bound; Crescenzi, Grossi, Habib, Lanzi & Marino, Theor.
// Comput. Sci. 514 (2013) 84), component by component. From a central node
// u (the middle of a longest path found by two double sweeps) a BFS sorts
// the nodes into fringes F_i at distance i; every pair farther apart than
// 2(i − 1) has an end in a fringe at i or beyond, so the eccentricities of
// the fringes, from the outermost inwards, raise a lower bound lb until it
// passes 2(i − 1), the upper bound left for the rest. It needs far fewer
// searches than one per node on the graphs met here. ErrTooLarge above
// ExactDiameterMax nodes; ErrEmpty for an empty graph.
func ExactDiameter(g *Graph) (DiameterStats, error) {
	n := g.Len()
	var st DiameterStats
	if n == 0 {
		return st, fmt.Errorf("exact diameter: %w", ErrEmpty)
	}
	if n > ExactDiameterMax {
		return st, fmt.Errorf("exact diameter: %d nodes, at most %d: %w", n, ExactDiameterMax, ErrTooLarge)
	}
	b := newBFS(n)
	comp := make([]int32, n)
	for i := range comp {
		comp[i] = -1
	}
	for s := 0; s < n; s++ {
		if comp[s] >= 0 {
			continue
		}
		// The component of s, labelled through one BFS.
		b.run(g, s)
		st.BFS++
		for _, v := range b.order {
			comp[v] = int32(st.Components)
		}
		st.Components++
		if len(b.order) <= 2 {
			st.Diameter = max(st.Diameter, len(b.order)-1)
			continue
		}
		st.Diameter = max(st.Diameter, b.componentDiameter(g, s, &st.BFS))
	}
	return st, nil
}

// bfs is a reusable breadth-first search: dist holds −1 for unreached
// nodes, order the nodes in the order reached.
type bfs struct {
	dist  []int32
	order []int32
}

func newBFS(n int) *bfs {
	b := &bfs{dist: make([]int32, n), order: make([]int32, 0, n)}
	for i := range b.dist {
		b.dist[i] = -1
	}
	return b
}

// run searches from s (clearing the previous search first) and returns
// the eccentricity of s and the last node reached (a farthest one).
func (b *bfs) run(g *Graph, s int) (ecc int, far int) {
	for _, v := range b.order {
		b.dist[v] = -1
	}
	b.order = append(b.order[:0], int32(s))
	b.dist[s] = 0
	for h := 0; h < len(b.order); h++ {
		u := b.order[h]
		du := b.dist[u]
		for _, v := range g.Neighbors(int(u)) {
			if b.dist[v] < 0 {
				b.dist[v] = du + 1
				b.order = append(b.order, v)
			}
		}
	}
	last := b.order[len(b.order)-1]
	return int(b.dist[last]), int(last)
}

// middle returns the node halfway along a shortest path from the source of
// the current search to t (walking back through the distances).
func (b *bfs) middle(g *Graph, t int) int {
	steps := b.dist[t] / 2
	v := t
	for range steps {
		for _, w := range g.Neighbors(v) {
			if b.dist[w] == b.dist[v]-1 {
				v = int(w)
				break
			}
		}
	}
	return v
}

// componentDiameter runs iFUB in the component of s.
func (b *bfs) componentDiameter(g *Graph, s int, searches *int) int {
	// Two double sweeps (the 4-sweep start of Crescenzi et al.): from the
	// highest-degree node of the component, the farthest node a1, the
	// farthest from it b1, the middle r2 of that path, and again.
	start := s
	for _, v := range b.order {
		if g.Degree(int(v)) > g.Degree(start) {
			start = int(v)
		}
	}
	lb := 0
	_, a1 := b.run(g, start)
	e, b1 := b.run(g, a1)
	lb = max(lb, e)
	r2 := b.middle(g, b1)
	_, a2 := b.run(g, r2)
	e, b2 := b.run(g, a2)
	lb = max(lb, e)
	u := b.middle(g, b2)
	*searches += 4
	eu, _ := b.run(g, u)
	*searches++
	lb = max(lb, eu)
	// Fringes of u, outermost first.
	fringe := make([][]int32, eu+1)
	for _, v := range b.order {
		fringe[b.dist[v]] = append(fringe[b.dist[v]], v)
	}
	ub := 2 * eu
	for i := eu; i > 0 && ub > lb; i-- {
		bi := 0
		for _, v := range fringe[i] {
			e, _ := b.run(g, int(v))
			*searches++
			bi = max(bi, e)
		}
		if max(lb, bi) > 2*(i-1) {
			return max(lb, bi)
		}
		lb = max(lb, bi)
		ub = 2 * (i - 1)
	}
	return lb
}
