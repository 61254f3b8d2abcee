package ordinal

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/internal/jsonsafe"
	"github.com/tracesift/tracesift/networks"
)

// Metrics are the metrics of the directed weighted ordinal partition
// network; the common metrics of its undirected form are in the
// networks.Metrics Measure returns beside them.
type Metrics struct {
	// Patterns is the number of distinct patterns seen, Possible = d!, and
	// PatternFraction their ratio. Missing patterns of a long record are
	// the forbidden patterns of deterministic dynamics (Amigó, Zambrano &
	// Sanjuán, EPL 79 (2007) 50001); noise shows all of them.
	Patterns        int     `json:"patterns"`
	Possible        int     `json:"possible"`
	PatternFraction float64 `json:"pattern_fraction"`
	// Transitions is the number of steps counted, Distinct the number of
	// distinct directed transitions (self-loops included).
	Transitions int64 `json:"transitions"`
	Distinct    int   `json:"distinct"`
	// Admissible is the number of transitions the seen patterns allow:
	// with delay 1 successive windows share d − 1 samples, so a pattern
	// can be followed only by the d patterns that agree with it on those
	// (the new sample's rank among them); with a longer delay they share
	// none and all d! can follow. Forbidden = Admissible − Distinct, the
	// allowed transitions never seen, and ForbiddenFraction their share.
	Admissible        int     `json:"admissible"`
	Forbidden         int     `json:"forbidden"`
	ForbiddenFraction float64 `json:"forbidden_fraction"`
	// SelfLoopFraction is the share of the steps that repeat the pattern
	// (π → π): high for smooth, slowly sampled series.
	SelfLoopFraction float64 `json:"self_loop_fraction"`
	// TransitionEntropy is the global transition (node) entropy
	// Σ_π p(π) H(π), H(π) = −Σ_π' p(π'|π) ln p(π'|π), in nats: the
	// entropy of the next pattern given the current one, weighted by how
	// often each pattern is left (McCullough et al., Phil. Trans. R. Soc. A
	// 375 (2017) 20160292 (memory)). TransitionEntropyNorm divides it by
	// ln of the admissible successors per pattern (d with delay 1, d!
	// otherwise), so 1 means every allowed successor equally likely.
	TransitionEntropy     float64 `json:"transition_entropy"`
	TransitionEntropyNorm float64 `json:"transition_entropy_norm"`
	// OutDegree is the distribution of the number of distinct successors
	// (self-loops counted), and OutDegreeMean its mean.
	OutDegree     []networks.DegreeCount `json:"out_degree"`
	OutDegreeMean float64                `json:"out_degree_mean"`
}

// MarshalJSON writes the metrics with NaN as null.
func (m Metrics) MarshalJSON() ([]byte, error) { return jsonsafe.Marshal(m, jsonsafe.Options{}) }

// Measure measures the network: the common metrics of its undirected form
// by networks.Measure (without the time-order irreversibility, which has no
// meaning for pattern nodes) and the metrics of the directed weighted
// network (Directed).
func (nw *Network) Measure(opts networks.MeasureOptions) (networks.Metrics, Metrics, error) {
	opts.NoIrreversibility = true
	m, err := networks.Measure(nw.Graph, opts)
	if err != nil {
		return m, Metrics{}, fmt.Errorf("ordinal network: %w", err)
	}
	return m, nw.Directed(), nil
}

// Directed computes the metrics of the directed weighted network.
func (nw *Network) Directed() Metrics {
	v := nw.Len()
	f := factorial(nw.Order)
	m := Metrics{Patterns: v, Possible: f, PatternFraction: float64(v) / float64(f),
		Transitions: nw.Transitions, Distinct: len(nw.Succ)}
	succ := f
	if nw.Delay == 1 {
		succ = nw.Order
	}
	m.Admissible = v * succ
	m.Forbidden = m.Admissible - m.Distinct
	m.ForbiddenFraction = float64(m.Forbidden) / float64(m.Admissible)
	var self int64
	var hsum float64
	outHist := map[int]int64{}
	maxOut := 0
	for i := 0; i < v; i++ {
		js, ws := nw.Successors(i)
		var out int64
		for k, j := range js {
			out += ws[k]
			if int(j) == i {
				self += ws[k]
			}
		}
		var h float64
		for _, w := range ws {
			p := float64(w) / float64(out)
			h -= p * math.Log(p)
		}
		if out > 0 {
			hsum += float64(out) * h
		}
		outHist[len(js)]++
		maxOut = max(maxOut, len(js))
	}
	nan := math.NaN()
	m.SelfLoopFraction, m.TransitionEntropy, m.TransitionEntropyNorm = nan, nan, nan
	if nw.Transitions > 0 {
		m.SelfLoopFraction = float64(self) / float64(nw.Transitions)
		m.TransitionEntropy = hsum / float64(nw.Transitions)
		m.TransitionEntropyNorm = m.TransitionEntropy / math.Log(float64(succ))
	}
	var sum float64
	for k := 0; k <= maxOut; k++ {
		if c := outHist[k]; c > 0 {
			m.OutDegree = append(m.OutDegree, networks.DegreeCount{K: k, Count: c, P: float64(c) / float64(v)})
			sum += float64(k) * float64(c)
		}
	}
	m.OutDegreeMean = sum / float64(v)
	return m
}
