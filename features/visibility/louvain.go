package visibility

import (
	"fmt"
	"math"
	"math/rand/v2"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// Modularity returns the Newman–Girvan modularity of the partition of g given
// by community (community[i] is the community of node i, 0 ≤ community[i] < n):
//
//	Q = Σ_c [ L_c/E − γ·(d_c/2E)² ],
//
// with L_c the edges inside c, d_c the total degree of c, E the edges and γ
// the resolution (0 means 1). Newman & Girvan, Phys. Rev. E 69 (2004) 026113;
// resolution as in gonum's community.Q and NetworkX's modularity.
// ErrUndefined for a graph without edges.
func Modularity(g *Graph, community []int32, resolution float64) (float64, error) {
	n := g.Len()
	if len(community) != n {
		return math.NaN(), fmt.Errorf("modularity: %d labels for %d nodes", len(community), n)
	}
	if g.Edges() == 0 {
		return math.NaN(), fmt.Errorf("modularity: no edges: %w", ErrUndefined)
	}
	if resolution == 0 {
		resolution = 1
	}
	in := make([]float64, n)
	tot := make([]float64, n)
	for i := 0; i < n; i++ {
		c := community[i]
		if c < 0 || int(c) >= n {
			return math.NaN(), fmt.Errorf("modularity: node %d has community %d, want 0..%d", i, c, n-1)
		}
		tot[c] += float64(g.Degree(i))
		for _, j := range g.Neighbors(i) {
			if community[j] == c {
				in[c]++
			}
		}
	}
	m2 := float64(2 * g.Edges())
	var q float64
	for c := range in {
		if tot[c] > 0 {
			q += in[c]/m2 - resolution*(tot[c]/m2)*(tot[c]/m2)
		}
	}
	return q, nil
}

// LouvainOptions controls Louvain. The zero value means the defaults.
type LouvainOptions struct {
	// Resolution γ of the modularity; zero means 1.
	Resolution float64
	// Rand, when non-nil, shuffles the order in which nodes are visited at
	// each level (as in Blondel et al.); nil visits them in index order.
	// Either way the result is a deterministic function of the input (and of
	// the generator's state).
	Rand *rand.Rand
}

// Partition is the result of a community detection.
type Partition struct {
	// Community[i] is the community of node i, numbered 0..Communities−1 in
	// order of first appearance along the node index.
	Community   []int32 `json:"-"`
	Communities int     `json:"communities"`
	Modularity  float64 `json:"modularity"` // of Community on the input graph
	Levels      int     `json:"levels"`     // aggregation levels performed
}

// MarshalJSON writes the partition summary with NaN as null.
func (p Partition) MarshalJSON() ([]byte, error) { return jsonsafe.Marshal(p, jsonsafe.Options{}) }

// Louvain partitions g into communities by the Louvain method (Blondel,
// Guillaume, Lambiotte & Lefebvre, J. Stat. Mech. (2008) P10008): repeatedly
// move single nodes to the neighbouring community with the largest
// modularity gain ΔQ ∝ k_{i,C} − γ·Σ_C·k_i/2E until no move gains, then
// merge each community into one weighted node and repeat on that graph until
// nothing merges. It works on the CSR arrays directly (no maps) and revisits
// only nodes whose neighbourhood changed (see localMove), so 10^6-node
// graphs take seconds. Modularity as in Modularity.
// ErrUndefined for a graph without edges.
func Louvain(g *Graph, opts LouvainOptions) (Partition, error) {
	n := g.Len()
	p := Partition{Modularity: math.NaN()}
	if g.Edges() == 0 {
		return p, fmt.Errorf("louvain: no edges: %w", ErrUndefined)
	}
	res := opts.Resolution
	if res == 0 {
		res = 1
	}
	lv := &wgraph{off: g.offsets, nbr: g.adj, loop: make([]float64, n), k: make([]float64, n)}
	for i := 0; i < n; i++ {
		lv.k[i] = float64(g.Degree(i))
	}
	lv.m2 = float64(2 * g.Edges())
	member := make([]int32, n)
	for i := range member {
		member[i] = int32(i)
	}
	for {
		comm, moved := lv.localMove(res, opts.Rand)
		nc := renumber(comm)
		if !moved || nc == lv.n() {
			break
		}
		for i := range member {
			member[i] = comm[member[i]]
		}
		lv = lv.aggregate(comm, nc)
		p.Levels++
	}
	renumber(member)
	p.Community = member
	nc := 0
	for _, c := range member {
		nc = max(nc, int(c)+1)
	}
	p.Communities = nc
	q, err := Modularity(g, member, res)
	if err != nil {
		return p, fmt.Errorf("louvain: %w", err)
	}
	p.Modularity = q
	return p, nil
}

// wgraph is a weighted graph of one Louvain level: neighbours in CSR (each
// non-loop edge listed at both ends), weights w (nil means all 1), self-loop
// weights loop, strengths k_i = Σ_j w_ij + 2·loop_i and 2m = Σ k.
type wgraph struct {
	off  []int64
	nbr  []int32
	w    []float64
	loop []float64
	k    []float64
	m2   float64
}

func (g *wgraph) n() int { return len(g.k) }

// localMove runs the node-moving phase and returns the community of each
// node and whether any node moved. It uses a queue instead of repeated full
// passes ("fast local moving", Traag, Waltman & van Eck, Sci. Rep. 9 (2019)
// 5233 (memory)): every node is queued once, and when a node moves, its
// neighbours outside its new community are queued again. The phase ends when
// the queue is empty, i.e. no node can gain more than gainTol by moving —
// the same stopping point as passes until nothing moves, without rescanning
// settled nodes. FIFO order keeps it deterministic.
func (g *wgraph) localMove(res float64, rng *rand.Rand) ([]int32, bool) {
	n := g.n()
	comm := make([]int32, n)
	tot := make([]float64, n)
	for i := range comm {
		comm[i] = int32(i)
		tot[i] = g.k[i]
	}
	queue := make([]int32, n) // ring buffer, holds each node at most once
	for i := range queue {
		queue[i] = int32(i)
	}
	if rng != nil {
		rng.Shuffle(n, func(a, b int) { queue[a], queue[b] = queue[b], queue[a] })
	}
	queued := make([]bool, n)
	for i := range queued {
		queued[i] = true
	}
	head, size := 0, n
	wto := make([]float64, n) // weight from the current node to each community
	seen := make([]bool, n)
	touched := make([]int32, 0, 64)
	anyMove := false
	// A move is taken only if it gains more than gainTol (in units of edge
	// weight), so float rounding cannot make nodes oscillate.
	const gainTol = 1e-10
	for size > 0 {
		i := int(queue[head])
		head++
		if head == n {
			head = 0
		}
		size--
		queued[i] = false
		ci := comm[i]
		touched = touched[:0]
		for e := g.off[i]; e < g.off[i+1]; e++ {
			c := comm[g.nbr[e]]
			w := 1.0
			if g.w != nil {
				w = g.w[e]
			}
			if !seen[c] {
				seen[c] = true
				touched = append(touched, c)
			}
			wto[c] += w
		}
		ki := g.k[i]
		tot[ci] -= ki
		f := res * ki / g.m2
		stay := wto[ci] - f*tot[ci]
		best, bestGain := ci, stay
		for _, c := range touched {
			if c == ci {
				continue
			}
			if gain := wto[c] - f*tot[c]; gain > bestGain+gainTol {
				best, bestGain = c, gain
			}
		}
		tot[best] += ki
		for _, c := range touched {
			wto[c] = 0
			seen[c] = false
		}
		if best == ci {
			continue
		}
		comm[i] = best
		anyMove = true
		for e := g.off[i]; e < g.off[i+1]; e++ {
			j := g.nbr[e]
			if !queued[j] && comm[j] != best {
				queued[j] = true
				tail := head + size
				if tail >= n {
					tail -= n
				}
				queue[tail] = j
				size++
			}
		}
	}
	return comm, anyMove
}

// renumber relabels comm in place to 0..C−1 by first appearance and returns
// C. Labels must lie in [0, len(comm)).
func renumber(comm []int32) int {
	id := make([]int32, len(comm))
	for i := range id {
		id[i] = -1
	}
	nc := int32(0)
	for i, c := range comm {
		if id[c] < 0 {
			id[c] = nc
			nc++
		}
		comm[i] = id[c]
	}
	return int(nc)
}

// aggregate returns the graph whose nodes are the nc communities of comm:
// the weight between two communities is the total weight between them, and
// a community's self-loop holds its internal weight.
func (g *wgraph) aggregate(comm []int32, nc int) *wgraph {
	n := g.n()
	// Nodes grouped by community (counting sort).
	start := make([]int32, nc+1)
	for _, c := range comm {
		start[c+1]++
	}
	for c := 0; c < nc; c++ {
		start[c+1] += start[c]
	}
	members := make([]int32, n)
	fill := make([]int32, nc)
	for i, c := range comm {
		members[start[c]+fill[c]] = int32(i)
		fill[c]++
	}
	out := &wgraph{off: make([]int64, nc+1), loop: make([]float64, nc), k: make([]float64, nc), m2: g.m2}
	acc := make([]float64, nc)
	seen := make([]bool, nc)
	touched := make([]int32, 0, 64)
	for c := 0; c < nc; c++ {
		touched = touched[:0]
		var internal float64
		for _, u := range members[start[c]:start[c+1]] {
			out.loop[c] += g.loop[u]
			out.k[c] += g.k[u]
			for e := g.off[u]; e < g.off[u+1]; e++ {
				d := comm[g.nbr[e]]
				w := 1.0
				if g.w != nil {
					w = g.w[e]
				}
				if int(d) == c {
					internal += w
					continue
				}
				if !seen[d] {
					seen[d] = true
					touched = append(touched, d)
				}
				acc[d] += w
			}
		}
		out.loop[c] += internal / 2 // each internal edge was seen from both ends
		for _, d := range touched {
			out.nbr = append(out.nbr, d)
			out.w = append(out.w, acc[d])
			acc[d] = 0
			seen[d] = false
		}
		out.off[c+1] = int64(len(out.nbr))
	}
	return out
}
