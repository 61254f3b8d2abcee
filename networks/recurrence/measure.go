package recurrence

import (
	"fmt"
	"math"

	"github.com/tracesift/tracesift/internal/jsonsafe"
	"github.com/tracesift/tracesift/networks"
)

// Metrics are the metrics particular to a recurrence network; the common
// ones (degrees, tails, clustering, assortativity, communities, paths) are
// in the networks.Metrics Measure returns beside them.
type Metrics struct {
	// EdgeDensity is 2E / (N(N − 1)), the fraction of all node pairs
	// linked (equal to Rate when the Theiler window is 0).
	EdgeDensity float64 `json:"edge_density"`
	// Rate is the recurrence rate: the fraction of the eligible pairs
	// (|i − j| > Theiler) linked.
	Rate float64 `json:"rate"`
	// Transitivity is the global clustering coefficient T = 3 × triangles
	// / connected triples; ClusteringMean the average local clustering
	// coefficient (nodes of degree < 2 count as 0).
	Transitivity   float64 `json:"transitivity"`
	ClusteringMean float64 `json:"clustering_mean"`
	// TransitivityDim is D_T = ln T / ln(3/4) and ClusteringDim the same
	// of ClusteringMean (Donner et al., Eur. Phys. J. B 84 (2011) 653):
	// under the maximum norm, three points of a D-dimensional set that are
	// each within ε of a fourth are within ε of each other with probability
	// (3/4)^D (per coordinate, two points uniform in [−ε, ε] lie within ε
	// of each other with probability 3/4), so D_T estimates the dimension of
	// the attractor at the scale ε. Under the Euclidean norm the law is
	// different above one dimension and the values are only indicative.
	TransitivityDim float64 `json:"transitivity_dim"`
	ClusteringDim   float64 `json:"clustering_dim"`
	// AvgPathLength is the mean shortest-path length (exact up to
	// networks.DefaultExactMax nodes, from sampled sources above; NaN when
	// the paths were not measured).
	AvgPathLength float64 `json:"avg_path_length"`
}

// MarshalJSON writes the metrics with NaN as null.
func (m Metrics) MarshalJSON() ([]byte, error) { return jsonsafe.Marshal(m, jsonsafe.Options{}) }

// Measure measures the network: the common metrics by networks.Measure
// (without the time-order irreversibility, which has no meaning for
// recurrences) and the recurrence metrics derived from them.
func (nw *Network) Measure(opts networks.MeasureOptions) (networks.Metrics, Metrics, error) {
	opts.NoIrreversibility = true
	m, err := networks.Measure(nw.Graph, opts)
	if err != nil {
		return m, Metrics{}, fmt.Errorf("recurrence network: %w", err)
	}
	return m, nw.Derive(m), nil
}

// Derive computes the recurrence metrics from the common metrics of the
// network's graph.
func (nw *Network) Derive(m networks.Metrics) Metrics {
	n := float64(nw.Graph.Len())
	r := Metrics{
		EdgeDensity:    2 * float64(nw.Graph.Edges()) / (n * (n - 1)),
		Rate:           nw.Rate,
		Transitivity:   m.Clustering.Transitivity,
		ClusteringMean: m.ClusteringMean,
		AvgPathLength:  m.AvgPathLength,
	}
	r.TransitivityDim = dimension(r.Transitivity)
	r.ClusteringDim = dimension(r.ClusteringMean)
	return r
}

// dimension returns ln c / ln(3/4) (NaN unless 0 < c ≤ 1).
func dimension(c float64) float64 {
	if !(c > 0 && c <= 1) {
		return math.NaN()
	}
	return math.Log(c) / math.Log(0.75)
}
