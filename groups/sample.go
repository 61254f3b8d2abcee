package groups

import (
	"math"
	"sort"
)

// Sample is one trace's entry in a comparison: its feature vector and,
// optionally, per-trace distributions for overlay plots.
type Sample struct {
	// File names the trace (used in notes and the JSON output).
	File string `json:"file"`
	// Group is the group the trace belongs to (e.g. "fresh", "stressed").
	Group string `json:"group"`
	// Param is the control parameter of the trace (e.g. gate bias parsed
	// from the file name); NaN when the trace has none.
	Param float64 `json:"param"`
	// Values holds the feature values in the order of the feature list
	// given to Compare; NaN (or ±Inf) marks a missing value.
	Values []float64 `json:"values"`
	// Distributions holds optional per-trace distributions keyed by a
	// name, e.g. "hvg_degree" (the degree sequence) or "hvg_clustering"
	// (the local clustering coefficients). Compare pools them per group
	// with equal weight per trace; use AddDistribution to store a compact
	// quantile sketch instead of millions of values.
	Distributions map[string][]float64 `json:"-"`
}

// DefaultSketchPoints is the number of quantiles AddDistribution keeps.
const DefaultSketchPoints = 1024

// AddDistribution stores values (NaN and ±Inf dropped) under name in
// s.Distributions, reduced by Sketch to at most DefaultSketchPoints
// quantiles. Pooling weighs every trace equally whatever the number of
// values it stores, so the sketch changes the pooled distribution only by
// its resolution (1/1024 in probability). Empty input stores nothing.
func (s *Sample) AddDistribution(name string, values []float64) {
	v := Sketch(values, DefaultSketchPoints)
	if len(v) == 0 {
		return
	}
	if s.Distributions == nil {
		s.Distributions = make(map[string][]float64)
	}
	s.Distributions[name] = v
}

// Sketch returns the finite values of x sorted ascending, or, when there
// are more than k of them, the k quantiles Q((i + ½)/k), i = 0…k−1, of the
// empirical distribution (inverse ECDF, Hyndman & Fan definition 1), so
// that each returned point stands for an equal share of the values and
// integer data stay integers. k ≤ 0 means DefaultSketchPoints.
func Sketch(x []float64, k int) []float64 {
	if k <= 0 {
		k = DefaultSketchPoints
	}
	v := make([]float64, 0, len(x))
	for _, f := range x {
		if finite(f) {
			v = append(v, f)
		}
	}
	sort.Float64s(v)
	if len(v) <= k {
		return v
	}
	out := make([]float64, k)
	n := float64(len(v))
	for i := range out {
		j := int(math.Ceil((float64(i)+0.5)/float64(k)*n)) - 1
		out[i] = v[max(0, min(len(v)-1, j))]
	}
	return out
}
