package networks

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"
)

// Sentinel errors that callers may need to tell apart (test with errors.Is).
var (
	// ErrEmpty: the series (or graph) has no samples.
	ErrEmpty = errors.New("networks: empty input")
	// ErrNonFinite: the series holds NaN or ±Inf.
	ErrNonFinite = errors.New("networks: non-finite sample")
	// ErrTooLong: the series has more samples than int32 node indices allow.
	ErrTooLong = errors.New("networks: series too long for int32 node indices")
	// ErrTooManyEdges: construction would exceed Options.MaxEdges.
	ErrTooManyEdges = errors.New("networks: too many edges")
	// ErrBadEdge: an edge list names a node out of range or a self-loop.
	ErrBadEdge = errors.New("networks: bad edge")
	// ErrUndefined: the metric is undefined on this graph (e.g. assortativity
	// of a graph whose edge ends all have the same degree).
	ErrUndefined = errors.New("networks: metric undefined for this graph")
	// ErrTooFewPoints: a fit has too few data to be meaningful.
	ErrTooFewPoints = errors.New("networks: too few points for a fit")
	// ErrUnknownKind: ParseKind was given a name it does not know.
	ErrUnknownKind = errors.New("networks: unknown graph kind")
)

// Kind names the criterion a graph was built with.
type Kind uint8

// The graph kinds.
const (
	KindOther Kind = iota // built from an edge list (FromEdges)
	KindNVG               // natural visibility graph (visibility.Natural)
	KindHVG               // horizontal visibility graph (visibility.Horizontal)
	KindRN                // recurrence network (recurrence.Build)
	KindOPN               // ordinal partition network, undirected (ordinal.Build)
)

// String returns "nvg", "hvg", "rn", "opn" or "other".
func (k Kind) String() string {
	switch k {
	case KindNVG:
		return "nvg"
	case KindHVG:
		return "hvg"
	case KindRN:
		return "rn"
	case KindOPN:
		return "opn"
	default:
		return "other"
	}
}

// ParseKind maps "nvg"/"natural", "hvg"/"horizontal", "rn"/"recurrence"
// and "opn"/"ordinal" (any case) to a Kind.
func ParseKind(s string) (Kind, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "nvg", "natural":
		return KindNVG, nil
	case "hvg", "horizontal":
		return KindHVG, nil
	case "rn", "recurrence":
		return KindRN, nil
	case "opn", "ordinal":
		return KindOPN, nil
	}
	return KindOther, fmt.Errorf("%w: %q (want nvg, hvg, rn or opn)", ErrUnknownKind, s)
}

// MaxEdges returns the edge budget a construction honours when it was
// given max: max itself when positive, DefaultMaxEdges otherwise. Every
// construction stops with an *EdgeBudgetError (errors.Is ErrTooManyEdges)
// once its graph would have more edges. The NVG of a convex sequence has
// n(n−1)/2 edges, so without a budget a long convex or strongly
// accelerating trace could exhaust memory; a graph that is built and then
// measured holds about BytesPerEdge bytes per edge at the peak.
func MaxEdges(max int64) int64 {
	if max > 0 {
		return max
	}
	return DefaultMaxEdges
}

// DefaultMaxEdges is the edge budget used when a construction's MaxEdges
// option is zero:
// 2^27 ≈ 1.3·10^8 edges, about 2 GB at the peak of construction and
// Measure (BytesPerEdge). A 10^6-sample NVG of white noise has 3·10^6
// edges, of Brownian motion 1.3·10^7, of a Lorenz coordinate 3.8·10^7; the
// NVG of 10^7 samples of Brownian motion passes the default budget.
const DefaultMaxEdges int64 = 1 << 27

// BytesPerEdge is the peak memory per edge of a visibility graph that is
// built and measured with every metric of Measure (the CSR arrays, the
// sweep log, triangle counting and the Louvain levels), rounded up:
// measured 14–15 bytes per edge from the peak resident memory of
// 'tracesift graph' on 10^6-sample NVGs with 3·10^6 to 3.8·10^7 edges
// (white noise, a sine, Brownian motion, a Lévy walk, Lorenz x), over and
// above about 130 bytes per sample, and 14.6 on the 1.6·10^8-edge NVG of
// 10^7 samples of Brownian motion (3.7 GB without the path metrics). Use
// it to turn an edge budget into memory.
const BytesPerEdge = 16

// EdgeBudgetError reports a construction stopped at its edge budget
// (the construction's MaxEdges option). It matches ErrTooManyEdges under errors.Is; callers
// that let their users set the budget can name their own setting from its
// fields.
type EdgeBudgetError struct {
	// Graph names the construction ("natural visibility").
	Graph string
	// Nodes is the number of samples, Budget the edge budget passed.
	Nodes  int
	Budget int64
}

func (e *EdgeBudgetError) Error() string {
	return fmt.Sprintf("%s of %d samples: more than %d edges, the edge budget (Options.MaxEdges; about %s at the peak): %v",
		e.Graph, e.Nodes, e.Budget, formatBytes(e.Budget*BytesPerEdge), ErrTooManyEdges)
}

// Unwrap returns ErrTooManyEdges.
func (e *EdgeBudgetError) Unwrap() error { return ErrTooManyEdges }

// formatBytes writes a byte count for people: "2.1 GB", "340 MB", "12 kB"
// (decimal units).
func formatBytes(b int64) string {
	switch {
	case b >= 1e9:
		return fmt.Sprintf("%.1f GB", float64(b)/1e9)
	case b >= 1e6:
		return fmt.Sprintf("%.0f MB", float64(b)/1e6)
	case b >= 1e3:
		return fmt.Sprintf("%.0f kB", float64(b)/1e3)
	}
	return fmt.Sprintf("%d B", b)
}

// Graph is a simple undirected graph on the nodes 0..Len()−1 in compressed
// sparse row form: the neighbours of node i are Adj[Offsets[i]:Offsets[i+1]],
// sorted ascending, without duplicates or self-loops. Node indices are time
// indices, so each edge {i, j}, i < j, is also the arc i → j forward in time.
// A Graph is immutable after construction and safe for concurrent reads.
// Obtain one from a construction (visibility.Natural, visibility.Horizontal,
// recurrence.Build, ordinal.Build) or FromEdges; the zero Graph is an empty
// graph.
type Graph struct {
	kind    Kind
	offsets []int64 // len n+1
	adj     []int32 // len 2·edges
	lower   []int32 // lower[i] = number of neighbours j < i (the in-degree)
}

// Len returns the number of nodes (0 for the zero Graph).
func (g *Graph) Len() int { return max(len(g.offsets)-1, 0) }

// Edges returns the number of undirected edges.
func (g *Graph) Edges() int64 { return int64(len(g.adj)) / 2 }

// Kind returns the criterion the graph was built with.
func (g *Graph) Kind() Kind { return g.kind }

// Degree returns the degree of node i (0 ≤ i < Len()).
func (g *Graph) Degree(i int) int { return int(g.offsets[i+1] - g.offsets[i]) }

// Neighbors returns the sorted neighbours of node i. The slice aliases the
// graph's storage: do not modify it.
func (g *Graph) Neighbors(i int) []int32 { return g.adj[g.offsets[i]:g.offsets[i+1]] }

// Predecessors returns the neighbours j < i of node i (the sources of the arcs
// j → i when edges point forward in time), sorted. Do not modify the slice.
func (g *Graph) Predecessors(i int) []int32 {
	s := g.offsets[i]
	return g.adj[s : s+int64(g.lower[i])]
}

// Successors returns the neighbours j > i of node i (the targets of the arcs
// i → j when edges point forward in time), sorted. Do not modify the slice.
func (g *Graph) Successors(i int) []int32 {
	return g.adj[g.offsets[i]+int64(g.lower[i]) : g.offsets[i+1]]
}

// InDegree returns the number of arcs j → i, j < i, with edges pointing
// forward in time (the in-degree of the directed visibility graph).
func (g *Graph) InDegree(i int) int { return int(g.lower[i]) }

// OutDegree returns the number of arcs i → j, j > i, with edges pointing
// forward in time (the out-degree of the directed visibility graph).
func (g *Graph) OutDegree(i int) int { return g.Degree(i) - int(g.lower[i]) }

// CSR returns the raw compressed adjacency: offsets (length Len()+1) and the
// concatenated sorted neighbour lists. The slices alias the graph's storage:
// do not modify them.
func (g *Graph) CSR() (offsets []int64, adj []int32) { return g.offsets, g.adj }

// HasEdge reports whether i and j are adjacent (binary search, O(log k)).
func (g *Graph) HasEdge(i, j int) bool {
	if i < 0 || j < 0 || i >= g.Len() || j >= g.Len() {
		return false
	}
	_, ok := slices.BinarySearch(g.Neighbors(i), int32(j))
	return ok
}

// FromEdges builds a graph of kind KindOther on n nodes from an edge list.
// Each pair is an undirected edge; order inside a pair does not matter and
// duplicates are merged. Self-loops and out-of-range nodes give ErrBadEdge.
// It exists for graphs that do not come from a series (tests, fixtures).
func FromEdges(n int, edges [][2]int32) (*Graph, error) {
	if n < 0 || n > math.MaxInt32 {
		return nil, fmt.Errorf("from edges: n = %d: %w", n, ErrTooLong)
	}
	var buf EdgeBuffer
	type pair struct{ a, b int32 }
	ps := make([]pair, 0, len(edges))
	for k, e := range edges {
		a, b := e[0], e[1]
		if a < 0 || b < 0 || int(a) >= n || int(b) >= n {
			return nil, fmt.Errorf("from edges: edge %d (%d,%d) with n = %d: %w", k, a, b, n, ErrBadEdge)
		}
		if a == b {
			return nil, fmt.Errorf("from edges: edge %d is a self-loop on %d: %w", k, a, ErrBadEdge)
		}
		if a > b {
			a, b = b, a
		}
		ps = append(ps, pair{a, b})
	}
	slices.SortFunc(ps, func(p, q pair) int {
		if p.a != q.a {
			return int(p.a) - int(q.a)
		}
		return int(p.b) - int(q.b)
	})
	for k, p := range ps {
		if k > 0 && p == ps[k-1] {
			continue
		}
		buf.Add(int(p.a), int(p.b))
	}
	return buf.Build(n, KindOther), nil
}

// pairChunk is the number of edges per chunk of an EdgeBuffer (512 KiB).
const pairChunk = 1 << 16

// EdgeBuffer collects the edges of a construction, (lo, hi), lo < hi,
// packed as lo<<32 | hi into fixed-size chunks, so that growing it never
// copies what is already stored; Build turns it into a Graph. The zero
// value is an empty buffer.
type EdgeBuffer struct {
	chunks [][]uint64
	n      int64
}

// Add appends the edge {a, b} (stored as min, max). The caller adds each
// edge once and never a self-loop.
func (p *EdgeBuffer) Add(a, b int) {
	if a > b {
		a, b = b, a
	}
	k := len(p.chunks)
	if k == 0 || len(p.chunks[k-1]) == cap(p.chunks[k-1]) {
		// Chunks grow from 1024 edges to pairChunk, so small graphs stay small.
		c := pairChunk
		if k < 6 {
			c = 1024 << (2 * k)
			c = min(c, pairChunk)
		}
		p.chunks = append(p.chunks, make([]uint64, 0, c))
		k++
	}
	p.chunks[k-1] = append(p.chunks[k-1], uint64(a)<<32|uint64(b))
	p.n++
}

// Len returns the number of edges added.
func (p *EdgeBuffer) Len() int64 { return p.n }

// Build returns the graph of kind on n nodes holding the edges in p (each
// lo < hi < n, no duplicates), and empties p. It builds the CSR arrays
// without per-edge allocation: a counting sort by the upper end
// fills each node's lower-neighbour section, which is then sorted (it is
// usually already sorted or reversed, both O(k)); walking the upper ends in
// ascending order then fills the upper sections already sorted. The chunks
// of p are released as they are consumed.
func (p *EdgeBuffer) Build(n int, kind Kind) *Graph {
	lower := make([]int32, n)
	offsets := make([]int64, n+1) // degree, then offsets
	for _, ch := range p.chunks {
		for _, e := range ch {
			lower[uint32(e)]++
			offsets[e>>32]++
			offsets[uint32(e)]++
		}
	}
	sum := DegreesToOffsets(offsets)
	adj := make([]int32, sum)
	cur := make([]int32, n)
	// Lower sections in emission order.
	for k, ch := range p.chunks {
		for _, e := range ch {
			j := uint32(e)
			adj[offsets[j]+int64(cur[j])] = int32(e >> 32)
			cur[j]++
		}
		p.chunks[k] = nil
	}
	p.chunks, p.n = nil, 0
	for j := 0; j < n; j++ {
		sortSection(adj[offsets[j] : offsets[j]+int64(lower[j])])
	}
	// Upper sections: for j ascending, append j to each lower neighbour i.
	clear(cur)
	for j := 0; j < n; j++ {
		s := offsets[j]
		for _, i := range adj[s : s+int64(lower[j])] {
			adj[offsets[i]+int64(lower[i])+int64(cur[i])] = int32(j)
			cur[i]++
		}
	}
	return &Graph{kind: kind, offsets: offsets, adj: adj, lower: lower}
}

// sortSection sorts s ascending, in O(len) when it is already sorted or
// strictly reversed.
func sortSection(s []int32) {
	if len(s) < 2 {
		return
	}
	asc, desc := true, true
	for k := 1; k < len(s); k++ {
		if s[k] < s[k-1] {
			asc = false
		} else {
			desc = false
		}
		if !asc && !desc {
			break
		}
	}
	switch {
	case asc:
	case desc:
		slices.Reverse(s)
	default:
		slices.Sort(s)
	}
}

// CheckSeries validates a series for graph construction: non-empty
// (ErrEmpty), shorter than int32 node indices allow (ErrTooLong) and finite
// (ErrNonFinite); what names the construction in the error.
func CheckSeries(x []float64, what string) error {
	if len(x) == 0 {
		return fmt.Errorf("%s: %w", what, ErrEmpty)
	}
	if len(x) >= math.MaxInt32 {
		return fmt.Errorf("%s: n = %d: %w", what, len(x), ErrTooLong)
	}
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("%s: sample %d is %v: %w", what, i, v, ErrNonFinite)
		}
	}
	return nil
}

// NewCSR returns the graph of kind held by CSR arrays that a construction
// filled itself: offsets (length n+1, offsets[0] = 0, non-decreasing),
// adj (the neighbour lists, each sorted ascending, without duplicates or
// self-loops, every edge present at both ends) and lower (lower[i] = the
// number of neighbours j < i of node i). The graph keeps the slices; the
// caller guarantees the layout (Check verifies it, for tests) and must not
// modify them afterwards.
func NewCSR(kind Kind, offsets []int64, adj []int32, lower []int32) *Graph {
	return &Graph{kind: kind, offsets: offsets, adj: adj, lower: lower}
}

// Check verifies the CSR layout NewCSR promises (offsets, sorted lists
// without duplicates or self-loops, symmetry, the lower counts) and returns
// the first violation found, wrapping ErrBadEdge. It costs O(E log k);
// constructions' tests call it.
func (g *Graph) Check() error {
	n := g.Len()
	if len(g.lower) != n || (n > 0 && (g.offsets[0] != 0 || g.offsets[n] != int64(len(g.adj)))) {
		return fmt.Errorf("check: array lengths: %w", ErrBadEdge)
	}
	for i := 0; i < n; i++ {
		if g.offsets[i+1] < g.offsets[i] {
			return fmt.Errorf("check: offsets decrease at node %d: %w", i, ErrBadEdge)
		}
		nb := g.Neighbors(i)
		low := 0
		for k, j := range nb {
			if j < 0 || int(j) >= n || int(j) == i || (k > 0 && j <= nb[k-1]) {
				return fmt.Errorf("check: node %d: neighbour list not sorted, out of range or self-loop at %d: %w", i, j, ErrBadEdge)
			}
			if int(j) < i {
				low++
			}
			if !g.HasEdge(int(j), i) {
				return fmt.Errorf("check: edge %d–%d present at one end only: %w", i, j, ErrBadEdge)
			}
		}
		if low != int(g.lower[i]) {
			return fmt.Errorf("check: node %d has %d lower neighbours, lower says %d: %w", i, low, g.lower[i], ErrBadEdge)
		}
	}
	return nil
}

// DegreesToOffsets turns the degrees in offsets[:n] into CSR offsets in
// place (an exclusive prefix sum), sets offsets[n] to their total and
// returns it.
func DegreesToOffsets(offsets []int64) int64 {
	n := len(offsets) - 1
	var sum int64
	for i := 0; i < n; i++ {
		d := offsets[i]
		offsets[i] = sum
		sum += d
	}
	offsets[n] = sum
	return sum
}
