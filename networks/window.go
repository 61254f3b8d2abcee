package networks

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// Window is the stretch [Start, End) of a series.
type Window struct {
	Start int `json:"start"`
	End   int `json:"end"`
}

// Len returns the number of samples in the window.
func (w Window) Len() int { return w.End - w.Start }

// Windows cuts n samples into k = ⌈n/length⌉ consecutive windows that cover
// every sample and differ in length by at most one: window i is
// [⌊i·n/k⌋, ⌊(i+1)·n/k⌋), so each holds ⌊n/k⌋ or ⌈n/k⌉ ≤ length samples,
// and at least length/2 when k > 1. n ≤ length (or length ≤ 0) gives the
// single window [0, n); n ≤ 0 gives none.
//
// Equal lengths matter because several visibility-graph metrics depend on
// the number of nodes (the NVG mean degree of a random walk grows with it):
// windows cut at a fixed length would leave one short window whose
// metrics stand apart from the rest.
func Windows(n, length int) []Window {
	if n <= 0 {
		return nil
	}
	if length <= 0 || n <= length {
		return []Window{{0, n}}
	}
	k := (n + length - 1) / length
	ws := make([]Window, k)
	for i := range ws {
		ws[i] = Window{i * n / k, (i + 1) * n / k}
	}
	return ws
}

// WindowOptions configures MeasureWindows.
type WindowOptions struct {
	// Kind names the graph built in each window (for the output).
	Kind Kind
	// Build builds the graph of one window's samples (for example
	// visibility.Natural with its options bound); required.
	Build func(x []float64) (*Graph, error)
	// Length is the longest window in samples (see Windows); ≤ 0 builds one
	// graph of the whole series.
	Length int
	// Measure is passed to Measure for every window.
	// With more than one window, window i measures with a seed drawn from
	// Measure.Seed (the i-th draw of its own PCG stream), so the sampled
	// path-length sources differ between windows; a single window uses
	// Measure.Seed itself and gives exactly the metrics of Build + Measure.
	Measure MeasureOptions
	// Progress, when not nil, is called after each window with the number
	// of windows done and their total.
	Progress func(done, total int)
}

// Windowed holds the visibility graphs' metrics of consecutive windows of a
// series and each headline metric's distribution over the windows.
type Windowed struct {
	Kind    string `json:"kind"`
	Samples int    `json:"samples"`
	// Length is the window length asked for.
	Length  int             `json:"length"`
	Windows []WindowMetrics `json:"windows"`
	// Summary has one entry per headline metric, in the order of
	// SummaryMetrics.
	Summary []Distribution `json:"summary"`
}

// WindowMetrics are the metrics of one window's graph.
type WindowMetrics struct {
	Window
	Metrics Metrics `json:"metrics"`
}

// Distribution summarises one metric over the windows in which it is
// defined (not NaN): the mean, the sample standard deviation (n − 1 in the
// denominator; NaN for one window), the extremes and the median (the mean
// of the middle two for an even count). Everything but Defined is NaN when
// no window defines the metric.
type Distribution struct {
	Metric  string  `json:"metric"`
	Defined int     `json:"defined"`
	Mean    float64 `json:"mean"`
	SD      float64 `json:"sd"`
	Min     float64 `json:"min"`
	Median  float64 `json:"median"`
	Max     float64 `json:"max"`
}

// MarshalJSON writes the distribution with NaN as null.
func (d Distribution) MarshalJSON() ([]byte, error) { return jsonsafe.Marshal(d, jsonsafe.Options{}) }

// summaryMetric names a headline metric and reads it from Metrics (NaN when
// not computed).
type summaryMetric struct {
	name string
	get  func(m *Metrics) float64
}

var summaryMetrics = []summaryMetric{
	{"edges", func(m *Metrics) float64 { return float64(m.Edges) }},
	{"mean_degree", func(m *Metrics) float64 { return m.MeanDegree }},
	{"degree_entropy", func(m *Metrics) float64 { return m.Degree.Entropy }},
	{"lambda", func(m *Metrics) float64 { return m.Lambda }},
	{"gamma", func(m *Metrics) float64 { return m.Gamma }},
	{"clustering_mean", func(m *Metrics) float64 { return m.ClusteringMean }},
	{"transitivity", func(m *Metrics) float64 { return m.Clustering.Transitivity }},
	{"assortativity", func(m *Metrics) float64 { return m.Assortativity }},
	{"modularity", func(m *Metrics) float64 { return m.Modularity }},
	{"communities", func(m *Metrics) float64 {
		if m.Partition == nil {
			return math.NaN()
		}
		return float64(m.Communities)
	}},
	{"avg_path_length", func(m *Metrics) float64 { return m.AvgPathLength }},
	{"diameter", func(m *Metrics) float64 {
		if m.Paths == nil {
			return math.NaN()
		}
		return float64(m.Diameter)
	}},
	{"local_dimension", func(m *Metrics) float64 { return m.LocalDimension }},
	{"irreversibility_kld", func(m *Metrics) float64 { return m.IrreversibilityKLD }},
}

// SummaryMetrics lists the metrics Windowed.Summary describes, by their
// JSON names in Metrics (degree_entropy and transitivity are the entropy
// of DegreeStats and the transitivity of ClusteringStats).
func SummaryMetrics() []string {
	names := make([]string, len(summaryMetrics))
	for i, s := range summaryMetrics {
		names[i] = s.name
	}
	return names
}

// windowSeedStream is the PCG stream that draws the per-window seeds.
const windowSeedStream = 0x57696e64 // "Wind"

// MeasureWindows builds the graph of each window of x (Windows
// with opts.Length) and measures it, one window at a time, so memory is
// bounded by the largest window's graph whatever the length of x. A window
// whose graph cannot be built or measured (ErrTooManyEdges above all) stops
// the work with an error naming the window.
//
// Windowing trades the whole-series graph for a sample of graphs of one
// size: local metrics (degree distribution, λ, clustering, irreversibility)
// estimate the same quantities from the same data, while metrics that grow
// with the graph (NVG mean degree and path length of a random walk, γ's
// fit range) describe graphs of the window's size, not of the series.
func MeasureWindows(x []float64, opts WindowOptions) (Windowed, error) {
	if opts.Build == nil {
		return Windowed{}, fmt.Errorf("measure windows: kind %v without a construction: %w", opts.Kind, ErrUnknownKind)
	}
	if err := CheckSeries(x, "measure windows"); err != nil {
		return Windowed{}, err
	}
	ws := Windows(len(x), opts.Length)
	out := Windowed{Kind: opts.Kind.String(), Samples: len(x), Length: opts.Length, Windows: make([]WindowMetrics, 0, len(ws))}
	var seeds *rand.Rand
	if len(ws) > 1 {
		seeds = rand.New(rand.NewPCG(opts.Measure.Seed, windowSeedStream))
	}
	for i, w := range ws {
		mo := opts.Measure
		if seeds != nil {
			mo.Seed = seeds.Uint64()
		}
		where := func(err error) error {
			if len(ws) == 1 {
				return err
			}
			return fmt.Errorf("window %d of %d (samples %d–%d): %w", i+1, len(ws), w.Start, w.End-1, err)
		}
		g, err := opts.Build(x[w.Start:w.End])
		if err != nil {
			return Windowed{}, where(err)
		}
		m, err := Measure(g, mo)
		if err != nil {
			return Windowed{}, where(err)
		}
		out.Windows = append(out.Windows, WindowMetrics{Window: w, Metrics: m})
		if opts.Progress != nil {
			opts.Progress(i+1, len(ws))
		}
	}
	for _, s := range summaryMetrics {
		vals := make([]float64, 0, len(out.Windows))
		for k := range out.Windows {
			if v := s.get(&out.Windows[k].Metrics); !math.IsNaN(v) {
				vals = append(vals, v)
			}
		}
		out.Summary = append(out.Summary, distribution(s.name, vals))
	}
	return out, nil
}

// Metric returns the distribution of the named metric (one of
// SummaryMetrics) over the windows.
func (w *Windowed) Metric(name string) (Distribution, bool) {
	for _, d := range w.Summary {
		if d.Metric == name {
			return d, true
		}
	}
	return Distribution{}, false
}

// Headline returns the metrics named by SummaryMetrics, in that order (NaN
// where undefined or not computed).
func (m *Metrics) Headline() []float64 {
	out := make([]float64, len(summaryMetrics))
	for i, s := range summaryMetrics {
		out[i] = s.get(m)
	}
	return out
}

// distribution summarises vals (all finite).
func distribution(name string, vals []float64) Distribution {
	nan := math.NaN()
	d := Distribution{Metric: name, Defined: len(vals), Mean: nan, SD: nan, Min: nan, Median: nan, Max: nan}
	if len(vals) == 0 {
		return d
	}
	s := slices.Clone(vals)
	slices.Sort(s)
	var sum float64
	for _, v := range s {
		sum += v
	}
	d.Mean = sum / float64(len(s))
	if len(s) > 1 {
		var ss float64
		for _, v := range s {
			ss += (v - d.Mean) * (v - d.Mean)
		}
		d.SD = math.Sqrt(ss / float64(len(s)-1))
	}
	d.Min, d.Max = s[0], s[len(s)-1]
	h := len(s) / 2
	if len(s)%2 == 1 {
		d.Median = s[h]
	} else {
		d.Median = (s[h-1] + s[h]) / 2
	}
	return d
}
