package networks_test

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// legacyLouvain is the previous Louvain (every level with n-sized strength,
// self-loop, weight-to-community and flag arrays, and an n-sized
// modularity at the end), kept so that TestLouvainMatchesLegacy can check
// that the leaner one gives the same partition, bit for bit, on graphs of
// every regime: nv_comm_q feeds the default model.
func legacyLouvain(g *Graph, opts LouvainOptions) (Partition, error) {
	n := g.Len()
	p := Partition{Modularity: math.NaN()}
	if g.Edges() == 0 {
		return p, fmt.Errorf("legacy louvain: no edges: %w", ErrUndefined)
	}
	res := opts.Resolution
	if res == 0 {
		res = 1
	}
	off, adj := g.CSR()
	lv := &legacyWgraph{off: off, nbr: adj, loop: make([]float64, n), k: make([]float64, n)}
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
		nc := legacyRenumber(comm)
		if !moved || nc == lv.n() {
			break
		}
		for i := range member {
			member[i] = comm[member[i]]
		}
		lv = lv.aggregate(comm, nc)
		p.Levels++
	}
	legacyRenumber(member)
	p.Community = member
	nc := 0
	for _, c := range member {
		nc = max(nc, int(c)+1)
	}
	p.Communities = nc
	q, err := Modularity(g, member, res)
	if err != nil {
		return p, fmt.Errorf("legacy louvain: %w", err)
	}
	p.Modularity = q
	return p, nil
}

// legacyWgraph is a weighted graph of one Louvain level: neighbours in CSR (each
// non-loop edge listed at both ends), weights w (nil means all 1), self-loop
// weights loop, strengths k_i = Σ_j w_ij + 2·loop_i and 2m = Σ k.
type legacyWgraph struct {
	off  []int64
	nbr  []int32
	w    []float64
	loop []float64
	k    []float64
	m2   float64
}

func (g *legacyWgraph) n() int { return len(g.k) }

// localMove runs the node-moving phase and returns the community of each
// node and whether any node moved. It uses a queue instead of repeated full
// passes ("fast local moving", Traag, Waltman & van Eck, Sci. Rep. 9 (2019)
// 5233; citation checked: search.r-project.org/CRAN/packages/leidenAlg/index.html): every node is queued once, and when a node moves, its
// neighbours outside its new community are queued again. The phase ends when
// the queue is empty, i.e. no node can gain more than gainTol by moving —
// the same stopping point as passes until nothing moves, without rescanning
// settled nodes. FIFO order keeps it deterministic.
func (g *legacyWgraph) localMove(res float64, rng *rand.Rand) ([]int32, bool) {
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
func legacyRenumber(comm []int32) int {
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
func (g *legacyWgraph) aggregate(comm []int32, nc int) *legacyWgraph {
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
	out := &legacyWgraph{off: make([]int64, nc+1), loop: make([]float64, nc), k: make([]float64, nc), m2: g.m2}
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

// TestLouvainMatchesLegacy: the same communities, modularity and levels as
// the previous implementation (index order, shuffled orders, resolution 1
// and 0.5), on the
// NVG and HVG of noise, Brownian motion and a noisy sine, where nodes of
// degree above and below the small-degree path mix. Reference: the
// previous Louvain, checked against gonum and NetworkX in
// reference_test.go.
func TestLouvainMatchesLegacy(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 32))
	const n = 60_000
	sine := make([]float64, n)
	for i := range sine {
		sine[i] = math.Sin(0.05*float64(i)) + 0.01*rng.NormFloat64()
	}
	series := map[string][]float64{
		"gauss": testseries.Bench("gauss", n),
		"brown": testseries.Bench("brown", n),
		"sine":  sine,
	}
	for name, x := range series {
		for _, kind := range []Kind{KindNVG, KindHVG} {
			g, err := visibility.Build(x, kind, visibility.Options{})
			if err != nil {
				t.Fatal(err)
			}
			for _, seed := range []uint64{0, 5, 6} {
				o, lo := LouvainOptions{}, LouvainOptions{}
				if seed > 0 {
					o.Rand = rand.New(rand.NewPCG(seed, 1))
					lo.Rand = rand.New(rand.NewPCG(seed, 1))
				}
				if seed == 6 {
					o.Resolution, lo.Resolution = 0.5, 0.5
				}
				p, err := Louvain(g, o)
				if err != nil {
					t.Fatal(err)
				}
				want, err := legacyLouvain(g, lo)
				if err != nil {
					t.Fatal(err)
				}
				if p.Modularity != want.Modularity || p.Communities != want.Communities || p.Levels != want.Levels || !slices.Equal(p.Community, want.Community) {
					t.Errorf("%s %v seed %d: Q %v C %d levels %d, previous Q %v C %d levels %d", name, kind, seed,
						p.Modularity, p.Communities, p.Levels, want.Modularity, want.Communities, want.Levels)
				}
				if seed == 0 {
					// The float64 weights used when 2E ≥ 2^32 give the same levels.
					m, l := LouvainLevels64(g, 1, nil)
					Renumber(m)
					if l != want.Levels || !slices.Equal(m, want.Community) {
						t.Errorf("%s %v: float64 weights give %d levels, a different partition", name, kind, l)
					}
				}
			}
		}
	}
}

// BenchmarkLouvainPrevious times the previous implementation on the graphs
// of BenchmarkLouvain (and the HVGs), for the comparison in BENCHMARKS.md.
func BenchmarkLouvainPrevious(b *testing.B) {
	for _, kind := range []Kind{KindNVG, KindHVG} {
		for _, series := range []string{"gauss", "brown"} {
			for _, n := range benchSizes {
				b.Run(fmt.Sprintf("%v/%s/n=%d", kind, series, n), func(b *testing.B) {
					g := benchGraph(b, kind, series, n)
					b.ReportAllocs()
					for b.Loop() {
						legacyLouvain(g, LouvainOptions{})
					}
				})
			}
		}
	}
}
