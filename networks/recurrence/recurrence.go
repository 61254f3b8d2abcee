// Package recurrence builds recurrence networks of a time series: one node
// per delay vector y_i = (x_i, x_{i+τ}, …, x_{i+(m−1)τ}), and an edge
// between i and j when the two states recur,
// ‖y_i − y_j‖ ≤ ε — the recurrence matrix read as an adjacency matrix,
// without self-loops (Marwan, Donges, Zou, Donner & Kurths, Phys. Lett. A
// 373 (2009) 4246; Donner, Zou, Donges, Marwan & Kurths, New J. Phys. 12
// (2010) 033025). The network describes the geometry of the reconstructed
// attractor, not the order of time: its transitivity measures the
// attractor's dimension (Donner et al., Eur. Phys. J. B 84 (2011) 653).
//
// The graph is a networks.Graph (node i is the vector starting at sample
// i), measured with networks.Measure for the metrics every network shares
// and with Network.Measure for the recurrence-specific ones.
package recurrence

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"

	"github.com/tracesift/tracesift/features/nonlinear"
	"github.com/tracesift/tracesift/internal/jsonsafe"
	"github.com/tracesift/tracesift/internal/order"
	"github.com/tracesift/tracesift/networks"
)

// DefaultRate is the recurrence rate used when neither Options.Epsilon
// nor Options.K is set: 5% of the eligible pairs linked, common practice
// for recurrence networks (Donner et al. 2010 recommend rates of a few per
// cent, well below the percolation of the network into one blob).
const DefaultRate = 0.05

// ErrBadOption: an option is out of range or several threshold rules were
// given at once.
var ErrBadOption = errors.New("recurrence: bad option")

// Options controls Build. The zero value: automatic embedding, maximum
// norm, no Theiler window beyond self-loops, recurrence rate DefaultRate.
type Options struct {
	// Dim and Delay are the embedding dimension m and delay τ in samples;
	// either left at zero is chosen as the nonlinear family chooses it
	// (nonlinear.Embed: τ at the first minimum of the average mutual
	// information, m by Cao's method), which needs at least 200 samples.
	Dim, Delay int
	// Theiler excludes pairs of vectors closer in time than this many
	// samples, |i − j| ≤ Theiler (Theiler, Phys. Rev. A 34 (1986) 2427);
	// 0 excludes only the self-loops, the plain recurrence network.
	Theiler int
	// One threshold rule, at most one set: Rate links exactly the
	// K = ⌊Rate·P + ½⌋ closest of the P eligible pairs (ε is the distance of
	// the K-th; pairs at distance exactly ε, common under the maximum norm
	// because successive pairs of delay vectors share coordinate
	// differences, are linked earliest first, by (i, j), up to K);
	// Epsilon links pairs closer than a fixed distance, in standard
	// deviations of x; K links each vector to its K nearest neighbours
	// outside the Theiler window (i ~ j when j is among the K nearest of i
	// or i among those of j, so degrees are at least K). None set: Rate =
	// DefaultRate.
	Rate    float64
	Epsilon float64
	K       int
	// Euclidean measures distances in the Euclidean norm; the default is
	// the maximum norm, for which the transitivity dimension is exact.
	Euclidean bool
	// MaxEdges is the edge budget (networks.MaxEdges; zero means
	// networks.DefaultMaxEdges).
	MaxEdges int64
}

// Threshold rules reported in Network.Rule.
const (
	RuleRate     = "rate"
	RuleDistance = "distance"
	RuleKNN      = "knn"
)

// Network is a recurrence network with how it was built.
type Network struct {
	Graph *networks.Graph `json:"-"`
	// Dim, Delay and Theiler as used; DimMethod and DelayMethod say how
	// they were chosen (nonlinear.Method... constants).
	Dim         int    `json:"dim"`
	Delay       int    `json:"delay"`
	Theiler     int    `json:"theiler"`
	DimMethod   string `json:"dim_method"`
	DelayMethod string `json:"delay_method"`
	// Rule is the threshold rule (RuleRate, RuleDistance, RuleKNN), Norm
	// "max" or "euclidean".
	Rule string `json:"rule"`
	Norm string `json:"norm"`
	// Epsilon is the threshold distance in standard deviations (for the
	// k-nearest rule, the largest distance linked).
	Epsilon float64 `json:"epsilon"`
	// TargetRate is the rate asked for (NaN for the other rules), Rate the
	// fraction of the eligible pairs linked, Pairs the number of eligible
	// pairs (|i − j| > Theiler).
	TargetRate float64 `json:"target_rate"`
	Rate       float64 `json:"rate"`
	Pairs      int64   `json:"pairs"`

	epsRaw float64 // ε in the units of x
}

// Build returns the recurrence network of x. x must be finite and not
// constant; with an automatic embedding it needs at least 200 samples.
// Cost: one k-d tree over the N delay vectors, N fixed-radius queries and,
// for the rate rule, 2·10^5 sampled pair distances to bracket ε and one
// selection among the pairs inside the bracket: about O(N log N + E).
func Build(x []float64, opts Options) (*Network, error) {
	rules := 0
	for _, set := range []bool{opts.Rate != 0, opts.Epsilon != 0, opts.K != 0} {
		if set {
			rules++
		}
	}
	switch {
	case rules > 1:
		return nil, fmt.Errorf("recurrence network: rate %g, epsilon %g, k %d: give one threshold rule: %w", opts.Rate, opts.Epsilon, opts.K, ErrBadOption)
	case opts.Rate < 0 || opts.Rate > 1 || opts.Epsilon < 0 || opts.K < 0 || opts.Theiler < 0 || opts.Dim < 0 || opts.Delay < 0:
		return nil, fmt.Errorf("recurrence network: rate %g (want 0–1), epsilon %g, k %d, Theiler %d, dim %d, delay %d: %w",
			opts.Rate, opts.Epsilon, opts.K, opts.Theiler, opts.Dim, opts.Delay, ErrBadOption)
	case rules == 0:
		opts.Rate = DefaultRate
	}
	if err := networks.CheckSeries(x, "recurrence network"); err != nil {
		return nil, err
	}
	nw := &Network{Dim: opts.Dim, Delay: opts.Delay, Theiler: opts.Theiler, DimMethod: nonlinear.MethodGiven, DelayMethod: nonlinear.MethodGiven,
		Norm: "max", Epsilon: math.NaN(), TargetRate: math.NaN(), Rate: math.NaN()}
	if opts.Euclidean {
		nw.Norm = "euclidean"
	}
	if opts.Dim == 0 || opts.Delay == 0 {
		emb, err := nonlinear.Embed(x, nonlinear.EmbedOptions{Dim: opts.Dim, Delay: opts.Delay})
		if err != nil {
			return nil, fmt.Errorf("recurrence network: %w", err)
		}
		nw.Dim, nw.Delay, nw.DimMethod, nw.DelayMethod = emb.Dim, emb.Delay, emb.DimMethod, emb.DelayMethod
	}
	// Distances are measured on x as given, so that equal differences
	// (quantised read-outs) stay exactly equal and ties break by (i, j);
	// ε is reported in standard deviations of x.
	_, sd, err := nonlinear.Standardize(x, 2)
	if err != nil {
		return nil, fmt.Errorf("recurrence network: %w", err)
	}
	ix, err := nonlinear.NewIndex(x, nw.Dim, nw.Delay, opts.Euclidean)
	if err != nil {
		return nil, fmt.Errorf("recurrence network: %w", err)
	}
	n, w := ix.Len(), nw.Theiler
	if n-w-1 < 1 {
		return nil, fmt.Errorf("recurrence network: %d delay vectors and Theiler window %d leave no pair: %w", n, w, networks.ErrEmpty)
	}
	nw.Pairs = int64(n-w-1) * int64(n-w) / 2
	budget := networks.MaxEdges(opts.MaxEdges)
	var buf networks.EdgeBuffer
	switch {
	case opts.K > 0:
		nw.Rule = RuleKNN
		if nw.epsRaw, err = linkNearest(ix, w, opts.K, budget, &buf); err != nil {
			return nil, err
		}
	case opts.Epsilon > 0:
		nw.Rule, nw.epsRaw = RuleDistance, opts.Epsilon*sd
		pairs, _, err := collect(ix, w, nw.epsRaw, budget, 0, false)
		if err != nil {
			return nil, err
		}
		for _, p := range pairs {
			buf.Add(int(p>>32), int(uint32(p)))
		}
	default:
		nw.Rule, nw.TargetRate = RuleRate, opts.Rate
		if nw.epsRaw, err = linkRate(ix, w, opts.Rate, nw.Pairs, budget, &buf); err != nil {
			return nil, err
		}
	}
	nw.Epsilon = nw.epsRaw / sd
	nw.Graph = buf.Build(n, networks.KindRN)
	nw.Rate = float64(nw.Graph.Edges()) / float64(nw.Pairs)
	return nw, nil
}

// budgetError reports a recurrence network past its edge budget.
func budgetError(n int, budget int64) error {
	return &networks.EdgeBudgetError{Graph: "recurrence network", Nodes: n, Budget: budget}
}

// collect returns the pairs i < j, j − i > w, with distance ≤ eps, packed
// as i<<32 | j in order of i, and (when withDist) their distances; more than
// budget pairs is an edge-budget error. expect sizes the slices.
func collect(ix *nonlinear.Index, w int, eps float64, budget, expect int64, withDist bool) ([]uint64, []float64, error) {
	expect = min(max(expect, 0), budget)
	pairs := make([]uint64, 0, expect)
	var dists []float64
	if withDist {
		dists = make([]float64, 0, expect)
	}
	q := make([]float64, ix.Dim())
	var cur uint64
	add := func(j int, d float64) {
		pairs = append(pairs, cur|uint64(j))
		if withDist {
			dists = append(dists, d)
		}
	}
	for i := 0; i < ix.Len(); i++ {
		cur = uint64(i) << 32
		ix.Within(i, eps, w, q, add)
		if int64(len(pairs)) > budget {
			return nil, nil, budgetError(ix.Len(), budget)
		}
	}
	return pairs, dists, nil
}

// rateSamples is the number of random pairs whose distances bracket the ε
// of a recurrence rate.
const rateSamples = 200_000

// rateStream is the PCG stream of the pair sample (fixed: the network is a
// function of the series and the options only).
const rateStream = 0x52617465 // "Rate"

// linkRate links the K = ⌊rate·P + ½⌋ closest eligible pairs, ties at
// the K-th distance broken by (i, j), and returns ε, the K-th smallest
// distance. The distances of rateSamples random eligible pairs give an
// upper bracket well above the rate's quantile (four binomial standard
// errors); every pair inside it is collected with the tree and the K-th
// distance selected among them exactly. Should the bracket hold fewer than
// K pairs (a chance below 10^-4), it is widened and the search repeated.
func linkRate(ix *nonlinear.Index, w int, rate float64, pairs, budget int64, buf *networks.EdgeBuffer) (float64, error) {
	k := int64(math.Floor(rate*float64(pairs) + 0.5))
	n := ix.Len()
	if k < 1 {
		return 0, fmt.Errorf("recurrence network: rate %g of %d eligible pairs links none: %w", rate, pairs, ErrBadOption)
	}
	if k > budget {
		return 0, budgetError(n, budget)
	}
	rng := rand.New(rand.NewPCG(uint64(n), rateStream))
	s := int(min(pairs, rateSamples))
	sample := make([]float64, 0, s)
	for len(sample) < s {
		i, j := rng.IntN(n), rng.IntN(n)
		if j-i > w || i-j > w {
			sample = append(sample, ix.Distance(i, j))
		}
	}
	slices.Sort(sample)
	margin := 4*math.Sqrt(rate*(1-rate)/float64(s)) + 1/float64(s)
	for {
		q := rate + margin
		eps := math.Inf(1)
		if at := int(math.Ceil(q * float64(s))); at < s {
			eps = sample[at]
		}
		ps, ds, err := collect(ix, w, eps, max(budget, 2*k), int64(1.02*q*float64(pairs))+1024, true)
		if err != nil {
			return 0, err
		}
		if int64(len(ps)) >= k {
			epsK := order.Select(slices.Clone(ds), int(k-1))
			var tied []uint64
			for m, p := range ps {
				switch {
				case ds[m] < epsK:
					buf.Add(int(p>>32), int(uint32(p)))
				case ds[m] == epsK:
					tied = append(tied, p)
				}
			}
			slices.Sort(tied) // by (i, j)
			for _, p := range tied[:k-buf.Len()] {
				buf.Add(int(p>>32), int(uint32(p)))
			}
			return epsK, nil
		}
		margin *= 2
	}
}

// linkNearest links each vector to its k nearest neighbours outside the
// Theiler window (symmetrised: i ~ j when either is among the other's k
// nearest) and returns the largest distance linked.
func linkNearest(ix *nonlinear.Index, w, k int, budget int64, buf *networks.EdgeBuffer) (float64, error) {
	n := ix.Len()
	ids, dists := make([]int, k), make([]float64, k)
	q := make([]float64, ix.Dim())
	pairs := make([]uint64, 0, n*k)
	far := 0.0
	for i := 0; i < n; i++ {
		m := ix.KNearest(i, w, q, ids, dists)
		for t := 0; t < m; t++ {
			a, b := i, ids[t]
			if a > b {
				a, b = b, a
			}
			pairs = append(pairs, uint64(a)<<32|uint64(b))
			far = max(far, dists[t])
		}
	}
	slices.Sort(pairs)
	pairs = slices.Compact(pairs)
	if int64(len(pairs)) > budget {
		return 0, budgetError(n, budget)
	}
	for _, p := range pairs {
		buf.Add(int(p>>32), int(uint32(p)))
	}
	return far, nil
}

// MarshalJSON writes the network's description with NaN as null.
func (nw Network) MarshalJSON() ([]byte, error) { return jsonsafe.Marshal(nw, jsonsafe.Options{}) }
