// Package ordinal builds ordinal partition networks of a time series (also
// called ordinal transition networks): the windows (x_t, x_{t+τ}, …,
// x_{t+(d−1)τ}) are replaced by their ordinal patterns (Bandt & Pompe,
// Phys. Rev. Lett. 88 (2002) 174102), each distinct pattern is a node, and
// each step t → t+1 is a directed transition from the pattern of window t
// to that of window t+1, weighted by how often it occurs (Small, Proc. IEEE
// ISCAS (2013) 2509; McCullough, Small, Stemler & Iu, Chaos 25 (2015)
// 053101). The network describes the order of the dynamics: which patterns
// follow which, and which never do.
//
// Tie rule: as in features/ordinal (TiesStable by default), equal values
// are ranked by order of appearance, the earlier as the smaller, so every
// window has one pattern; with TiesSkip a window holding equal values has
// none and breaks the chain of transitions there.
//
// Network.Graph is the undirected, unweighted form (an edge wherever a
// transition runs either way, self-loops dropped) as a networks.Graph, for
// the metrics every network shares; Network.Measure adds the metrics of
// the directed weighted network.
package ordinal

import (
	"errors"
	"fmt"
	"slices"

	"github.com/tracesift/tracesift/features/ordinal"
	"github.com/tracesift/tracesift/networks"
)

// DefaultOrder is the pattern order used when Options.Order is 0: d = 5,
// 120 possible patterns, which a few thousand samples cover (common
// practice: McCullough et al. use orders of 4–8 for series of 10^4–10^5).
const DefaultOrder = 5

// ErrBadOption: an option is out of range.
var ErrBadOption = errors.New("ordinal network: bad option")

// Options controls Build. The zero value means order DefaultOrder, delay 1,
// stable tie rule.
type Options struct {
	// Order is the pattern order d (samples per window),
	// ordinal.MinOrder ≤ d ≤ ordinal.MaxOrder (3–7); 0 means DefaultOrder.
	Order int
	// Delay is the delay τ between the samples of a window; 0 means 1.
	// Successive windows are always one sample apart.
	Delay int
	// Ties is the tie rule (features/ordinal); the zero value is
	// ordinal.TiesStable.
	Ties ordinal.Ties
}

// Network is an ordinal partition network. Node i stands for the pattern
// whose Lehmer code (features/ordinal) is Patterns[i]; nodes are in
// ascending code order.
type Network struct {
	Order int `json:"order"`
	Delay int `json:"delay"`
	// TieRule is "stable" or "skip".
	TieRule string `json:"tie_rule"`
	// Patterns holds the code of each node and Counts how many windows
	// had it.
	Patterns []int32 `json:"patterns"`
	Counts   []int64 `json:"counts"`
	// The directed weighted transitions in CSR form: the successors of
	// node i are Succ[Off[i]:Off[i+1]], ascending, each Weight times.
	Off    []int64 `json:"-"`
	Succ   []int32 `json:"-"`
	Weight []int64 `json:"-"`
	// Transitions is the number of steps counted (windows − 1, less the
	// steps into or out of a window skipped for a tie).
	Transitions int64 `json:"transitions"`
	// Graph is the undirected unweighted network without self-loops.
	Graph *networks.Graph `json:"-"`
}

// Build returns the ordinal partition network of x. x must be finite, not
// constant, and hold at least (d−1)·τ + 2 samples (two windows). Cost:
// O(n·d²) to encode the windows, O(n) to count the transitions (in a
// table of the seen patterns squared, or a hash map when that would pass
// 2^20 cells).
func Build(x []float64, opts Options) (*Network, error) {
	if opts.Order == 0 {
		opts.Order = DefaultOrder
	}
	if opts.Delay == 0 {
		opts.Delay = 1
	}
	if opts.Order < ordinal.MinOrder || opts.Order > ordinal.MaxOrder || opts.Delay < 1 {
		return nil, fmt.Errorf("ordinal network: order %d (want %d–%d), delay %d (want ≥ 1): %w", opts.Order, ordinal.MinOrder, ordinal.MaxOrder, opts.Delay, ErrBadOption)
	}
	if err := networks.CheckSeries(x, "ordinal network"); err != nil {
		return nil, err
	}
	codes, err := ordinal.Codes(x, ordinal.Options{Order: opts.Order, Delay: opts.Delay, Ties: opts.Ties})
	if err != nil {
		return nil, fmt.Errorf("ordinal network: %w", err)
	}
	if len(codes) < 2 {
		return nil, fmt.Errorf("ordinal network: %d samples give %d window of order %d, delay %d; need two: %w", len(x), len(codes), opts.Order, opts.Delay, networks.ErrEmpty)
	}
	nw := &Network{Order: opts.Order, Delay: opts.Delay, TieRule: "stable"}
	if opts.Ties == ordinal.TiesSkip {
		nw.TieRule = "skip"
	}
	f := factorial(opts.Order)
	// Nodes: the codes that occur, ascending.
	count := make([]int64, f)
	for _, c := range codes {
		if c >= 0 {
			count[c]++
		}
	}
	node := make([]int32, f)
	for c, k := range count {
		node[c] = -1
		if k > 0 {
			node[c] = int32(len(nw.Patterns))
			nw.Patterns = append(nw.Patterns, int32(c))
			nw.Counts = append(nw.Counts, k)
		}
	}
	if len(nw.Patterns) == 0 {
		return nil, fmt.Errorf("ordinal network: every window holds equal values (tie rule skip): %w", networks.ErrEmpty)
	}
	nw.countTransitions(codes, node)
	nw.Graph = nw.undirected()
	return nw, nil
}

// countTransitions fills the transition CSR from the code sequence.
func (nw *Network) countTransitions(codes []int32, node []int32) {
	v := len(nw.Patterns)
	var keys []uint64 // from<<32 | to, sorted, with counts below
	var ws []int64
	if v*v <= 1<<20 {
		table := make([]int64, v*v)
		for t := 1; t < len(codes); t++ {
			a, b := codes[t-1], codes[t]
			if a >= 0 && b >= 0 {
				table[int(node[a])*v+int(node[b])]++
			}
		}
		for k, w := range table {
			if w > 0 {
				keys = append(keys, uint64(k/v)<<32|uint64(k%v))
				ws = append(ws, w)
			}
		}
	} else {
		// Order 7 with many patterns: tally in a map (with delay 1 at
		// most d successors per pattern), then sort its keys.
		tally := map[uint64]int64{}
		for t := 1; t < len(codes); t++ {
			a, b := codes[t-1], codes[t]
			if a >= 0 && b >= 0 {
				tally[uint64(node[a])<<32|uint64(node[b])]++
			}
		}
		keys = make([]uint64, 0, len(tally))
		for k := range tally {
			keys = append(keys, k)
		}
		slices.Sort(keys)
		ws = make([]int64, len(keys))
		for k, key := range keys {
			ws[k] = tally[key]
		}
	}
	nw.Off = make([]int64, v+1)
	nw.Succ = make([]int32, len(keys))
	nw.Weight = ws
	for k, key := range keys {
		nw.Off[key>>32+1]++
		nw.Succ[k] = int32(uint32(key))
		nw.Transitions += ws[k]
	}
	for i := 0; i < v; i++ {
		nw.Off[i+1] += nw.Off[i]
	}
}

// undirected returns the undirected graph of the transitions without
// self-loops.
func (nw *Network) undirected() *networks.Graph {
	v := len(nw.Patterns)
	pairs := make([]uint64, 0, len(nw.Succ))
	for i := 0; i < v; i++ {
		for _, j := range nw.Succ[nw.Off[i]:nw.Off[i+1]] {
			a, b := uint64(i), uint64(j)
			if a == b {
				continue
			}
			if a > b {
				a, b = b, a
			}
			pairs = append(pairs, a<<32|b)
		}
	}
	slices.Sort(pairs)
	pairs = slices.Compact(pairs)
	var buf networks.EdgeBuffer
	for _, p := range pairs {
		buf.Add(int(p>>32), int(uint32(p)))
	}
	return buf.Build(v, networks.KindOPN)
}

// Successors returns the successors of node i and the weights of the
// transitions to them. Do not modify the slices.
func (nw *Network) Successors(i int) ([]int32, []int64) {
	return nw.Succ[nw.Off[i]:nw.Off[i+1]], nw.Weight[nw.Off[i]:nw.Off[i+1]]
}

// Len returns the number of nodes (distinct patterns).
func (nw *Network) Len() int { return len(nw.Patterns) }

func factorial(d int) int {
	f := 1
	for k := 2; k <= d; k++ {
		f *= k
	}
	return f
}
