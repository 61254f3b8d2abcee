package groups

// Result is the outcome of Compare. Every slice is in a fixed order
// (groups in the order of Options.Groups or of first appearance, features
// in the given order), so the same input gives the same Result.
type Result struct {
	// Features is the feature list, as given.
	Features []string `json:"features"`
	// Groups describes each group, with per-feature summaries.
	Groups []GroupInfo `json:"groups"`
	// Pairs holds one entry per compared pair of groups.
	Pairs []PairResult `json:"pairs"`
	// HasParam is true when at least one sample has a finite Param.
	HasParam bool `json:"has_param"`
	// Curves holds, when HasParam, one entry per feature and group
	// (feature-major): the feature against the parameter.
	Curves []Curve `json:"curves,omitempty"`
	// Distributions holds one entry per distribution name and group
	// (name-major, names sorted): the pooled per-trace distributions.
	Distributions []Distribution `json:"distributions,omitempty"`
	// Samples are the input samples (without their distributions), for
	// plots and for the JSON output.
	Samples []Sample `json:"samples"`
	// Settings are the options used, defaults resolved.
	Settings Settings `json:"settings"`
	// Notes are remarks on the whole comparison (skipped groups, samples
	// without parameter, the choice of pairs).
	Notes []string `json:"notes,omitempty"`
}

// GroupInfo describes one group.
type GroupInfo struct {
	Name string `json:"name"`
	// Traces is the number of samples in the group.
	Traces int `json:"traces"`
	// WithParam is the number of samples with a finite Param.
	WithParam int `json:"with_param"`
	// Levels are the distinct finite Param values, ascending.
	Levels []float64 `json:"levels,omitempty"`
	// Summaries holds one Summary per feature (aligned with
	// Result.Features).
	Summaries []Summary `json:"summaries"`
}

// PairResult compares group B against group A feature by feature.
// Differences and effect sizes are B relative to A (B − A).
type PairResult struct {
	A string `json:"a"`
	B string `json:"b"`
	// Tests holds one entry per feature (aligned with Result.Features).
	Tests []FeatureTest `json:"tests"`
	// Significant counts the features flagged significant.
	Significant int `json:"significant"`
}

// FeatureTest is the comparison of one feature between the groups of a
// pair.
type FeatureTest struct {
	Feature string `json:"feature"`
	// A and B summarise the feature's values in the two groups.
	A Summary `json:"a"`
	B Summary `json:"b"`
	// Tested is false when a group has fewer than Options.MinSamples
	// finite values; the p-values are then NaN and Note says why.
	Tested bool `json:"tested"`
	// KS and MW are the raw two-sided tests; KSAdj and MWAdj their
	// adjusted p-values (Settings.Adjust over Settings.Family).
	KS    KSResult `json:"ks"`
	KSAdj float64  `json:"ks_p_adj"`
	MW    MWResult `json:"mw"`
	MWAdj float64  `json:"mw_p_adj"`
	// CliffDelta is Cliff's δ of B over A and Magnitude its label.
	CliffDelta float64 `json:"cliff_delta"`
	Magnitude  string  `json:"magnitude"`
	// HodgesLehmann is the median of all differences b − a.
	HodgesLehmann float64 `json:"hodges_lehmann"`
	// MedianDiff is median(B) − median(A); MedianDiffMAD divides it by
	// the pooled MAD √(((n_A−1)MAD_A² + (n_B−1)MAD_B²)/(n_A+n_B−2)) (NaN
	// when that is 0 or undefined).
	MedianDiff    float64 `json:"median_diff"`
	MedianDiffMAD float64 `json:"median_diff_mad"`
	// Significant is true when the adjusted p-value of Settings.Test is
	// at most Settings.Alpha.
	Significant bool `json:"significant"`
	// Note explains an untested feature or a method fallback.
	Note string `json:"note,omitempty"`
}

// Curve is one feature of one group against the control parameter.
type Curve struct {
	Feature string `json:"feature"`
	Group   string `json:"group"`
	// Levels holds one point per distinct parameter value, ascending.
	Levels []Level `json:"levels"`
	// Spearman is the rank correlation of the feature with the parameter
	// over the group's traces; PAdj its p-value adjusted across features
	// within the group (Settings.Adjust).
	Spearman SpearmanResult `json:"spearman"`
	PAdj     float64        `json:"p_adj"`
	Note     string         `json:"note,omitempty"`
}

// Level summarises a feature at one parameter value.
type Level struct {
	Param   float64 `json:"param"`
	N       int     `json:"n"`
	Missing int     `json:"missing"`
	Median  float64 `json:"median"`
	Q1      float64 `json:"q1"`
	Q3      float64 `json:"q3"`
}

// Distribution is a named per-trace distribution pooled over a group,
// every trace weighted equally (each of a trace's k values has weight
// 1/k, the traces' ECDFs are averaged).
type Distribution struct {
	Name   string `json:"name"`
	Group  string `json:"group"`
	Traces int    `json:"traces"` // traces contributing
	Values int    `json:"values"` // values pooled
	// Median, Q1 and Q3 are quantiles of the pooled (weighted) ECDF,
	// Q(p) = min{x : F(x) ≥ p}; Mean is the weighted mean.
	Median float64 `json:"median"`
	Q1     float64 `json:"q1"`
	Q3     float64 `json:"q3"`
	Mean   float64 `json:"mean"`
	Min    float64 `json:"min"`
	Max    float64 `json:"max"`
	// X and CDF are points of the pooled ECDF, F(X[i]) = CDF[i], X
	// ascending: every distinct value when there are at most
	// Options.DistributionPoints of them, otherwise the inverse ECDF at
	// evenly spaced probabilities.
	X   []float64 `json:"x"`
	CDF []float64 `json:"cdf"`
}

// Pair returns the pair comparing b against a (in either order of the
// arguments it was computed in) and whether it exists.
func (r *Result) Pair(a, b string) (PairResult, bool) {
	for _, p := range r.Pairs {
		if (p.A == a && p.B == b) || (p.A == b && p.B == a) {
			return p, true
		}
	}
	return PairResult{}, false
}

// FeatureIndex returns the index of the named feature, or −1.
func (r *Result) FeatureIndex(name string) int {
	for i, f := range r.Features {
		if f == name {
			return i
		}
	}
	return -1
}
