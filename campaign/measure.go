package campaign

import (
	"encoding/binary"
	"errors"
	"fmt"
	"hash/fnv"
	"math"
	"slices"
	"sort"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/features/increments"
	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/groups"
	"github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// Defaults of MeasureOptions.
const (
	// DefaultSurrogates is the number of surrogates per trace and method:
	// 19 keeps a 36-trace campaign with three methods within a minute on
	// two cores; the campaign-level tests (signed-rank across traces) use
	// each trace's surrogate mean and do not need more. A per-trace rank
	// test needs far more (see Analyze's warnings).
	DefaultSurrogates = 19
	// SketchPoints bounds the support points stored per trace and
	// distribution: a distribution with more distinct values is kept as
	// this many equally spaced quantiles (groups.Sketch), a resolution of
	// 1/SketchPoints in probability per trace.
	SketchPoints = 128
)

// Condition names: the measured trace, or a surrogate method's name.
const Original = "original"

// The per-trace distributions.
const (
	DistNVGDegree     = "nvg_degree"
	DistHVGDegree     = "hvg_degree"
	DistNVGClustering = "nvg_clustering"
	DistHVGClustering = "hvg_clustering"
	DistIncrements    = "increments"
)

// DistributionNames lists the per-trace distributions in output order.
func DistributionNames() []string {
	return []string{DistNVGDegree, DistHVGDegree, DistNVGClustering, DistHVGClustering, DistIncrements}
}

// DefaultMethods are the surrogate methods used when none are chosen:
// shuffle (are the metrics carried by temporal correlations?), gauss (by
// the shape of the value distribution, e.g. fat tails?) and IAAFT (by
// anything beyond a linear Gaussian process seen through a monotone
// transform?).
func DefaultMethods() []surrogate.Method {
	return []surrogate.Method{surrogate.Shuffle, surrogate.Gauss, surrogate.IAAFT}
}

// DefaultMetrics are the visibility-graph and increment features of the
// catalogue, in catalogue order.
func DefaultMetrics() []string {
	var out []string
	for _, e := range features.Catalogue() {
		if e.Family == features.FamilyGraph || e.Family == features.FamilyIncrements {
			out = append(out, e.Name)
		}
	}
	return out
}

// ResolveMetrics expands a list of feature names and family names
// ("graph", "increments", "all", …) into feature names in catalogue
// order, without duplicates. An empty list gives DefaultMetrics. "all" is
// the schema's features; the extended families (recurrence and ordinal
// partition networks, rn_* and opn_*: about 0.3 s more per series for
// the recurrence network) are measured when named, by feature or family.
func ResolveMetrics(list []string) ([]string, error) {
	if len(list) == 0 {
		return DefaultMetrics(), nil
	}
	want := map[string]bool{}
	for _, s := range list {
		matched := false
		for _, e := range catalogueAll() {
			if (s == "all" && !features.IsExtended(e.Name)) || s == e.Name || s == string(e.Family) {
				want[e.Name] = true
				matched = true
			}
		}
		if !matched {
			return nil, fmt.Errorf("%w %q (see 'tracesift features --list'; families: %s)", features.ErrUnknownFeature, s, familyList())
		}
	}
	var out []string
	for _, e := range catalogueAll() {
		if want[e.Name] {
			out = append(out, e.Name)
		}
	}
	return out, nil
}

// catalogueAll is the schema's catalogue followed by the extended families.
func catalogueAll() []features.Entry {
	return append(features.Catalogue(), features.Extended()...)
}

func familyList() string {
	seen := map[features.Family]bool{}
	var out []string
	for _, e := range catalogueAll() {
		if !seen[e.Family] {
			seen[e.Family] = true
			out = append(out, string(e.Family))
		}
	}
	return fmt.Sprint(out)
}

// MeasureOptions control Measure. The zero value means DefaultMetrics,
// DefaultMethods, DefaultSurrogates surrogates and seed 0.
type MeasureOptions struct {
	Metrics []string
	Methods []surrogate.Method
	// Surrogates is the count per method; 0 means DefaultSurrogates.
	Surrogates int
	// NoSurrogates measures the originals only.
	NoSurrogates bool
	// Seed drives the randomised estimators (features.Options.Seed, the
	// same for every series) and, mixed with the trace ID and the method,
	// the surrogates: a trace gets the same surrogates whichever run,
	// machine or worker measures it.
	Seed uint64
}

func (o MeasureOptions) resolve() (MeasureOptions, error) {
	if len(o.Metrics) == 0 {
		o.Metrics = DefaultMetrics()
	}
	for _, m := range o.Metrics {
		if _, ok := features.Lookup(m); !ok {
			return o, fmt.Errorf("%w %q", features.ErrUnknownFeature, m)
		}
	}
	if o.NoSurrogates {
		o.Methods = nil
		o.Surrogates = 0
		return o, nil
	}
	if len(o.Methods) == 0 {
		o.Methods = DefaultMethods()
	}
	for _, m := range o.Methods {
		if _, err := surrogate.ParseMethod(string(m)); err != nil || m == "" {
			return o, fmt.Errorf("surrogate method %q: %w", m, surrogate.ErrUnknownMethod)
		}
	}
	if o.Surrogates == 0 {
		o.Surrogates = DefaultSurrogates
	}
	if o.Surrogates < 0 {
		return o, fmt.Errorf("surrogate count %d < 0", o.Surrogates)
	}
	return o, nil
}

// Record is what Measure finds for one trace.
type Record struct {
	Trace   Trace
	Samples int
	Seed    uint64
	Metrics []string
	// Original holds the metrics of the trace (NaN: missing).
	Original []float64
	// Surrogates holds one summary per method.
	Surrogates []MethodSummary
	// Distributions holds the per-trace distributions of the trace and, for
	// the increments, of its Gaussianised surrogates pooled.
	Distributions []Distribution
	// Verdict is the classifier's verdict on the trace, set by the caller
	// (Measure does not classify); nil for none.
	Verdict *Verdict
}

// Verdict is a classifier's verdict on one trace: the class (one of
// Classes, or Undetermined), the probability of every class, and the
// model that gave it.
type Verdict struct {
	Class         string
	Classes       []string
	Probabilities []float64
	Model         string
}

// MethodSummary is a metric's distribution over one method's surrogates of
// a trace. Every slice is aligned with Record.Metrics.
type MethodSummary struct {
	Method string
	// Count is the number of surrogates made.
	Count int
	// Mean, SD (n − 1), Lo and Hi (2.5 % and 97.5 % quantiles, linear
	// interpolation) of the finite surrogate values; Finite their number.
	Mean, SD, Lo, Hi []float64
	Finite           []int
	// RankP is the two-sided rank p-value of the original among the finite
	// surrogate values (surrogate.RankP), NaN when the original is missing.
	RankP []float64
}

// Distribution is a per-trace distribution stored as support points with
// weights: every distinct value with its count when there are at most
// SketchPoints of them, otherwise SketchPoints quantiles (groups.Sketch)
// with duplicates merged.
type Distribution struct {
	Name      string
	Condition string
	X, W      []float64
}

// Measure measures one trace: the metrics, the surrogates of every method
// with the same metrics, and the per-trace distributions. x is the trace;
// t names it (t.ID seeds the surrogates). Failures of a single surrogate
// leave its values out (counted by Finite); a trace the features cannot be
// measured on at all is an error.
func Measure(x []float64, t Trace, opts MeasureOptions) (Record, error) {
	o, err := opts.resolve()
	if err != nil {
		return Record{}, err
	}
	rec := Record{Trace: t, Samples: len(x), Seed: o.Seed, Metrics: o.Metrics}
	fo := features.Options{Seed: o.Seed, Only: o.Metrics, Sequential: true}
	v, err := features.Extract(x, fo)
	if err != nil {
		return Record{}, err
	}
	rec.Original = pick(v, o.Metrics)
	dists, err := traceDistributions(x)
	if err != nil {
		return Record{}, err
	}
	rec.Distributions = dists
	for _, m := range o.Methods {
		set, err := surrogate.Generate(x, surrogate.Options{
			Method: m, Count: o.Surrogates, Seed: SurrogateSeed(o.Seed, t.ID, string(m)), Workers: 1,
		})
		if err != nil {
			return Record{}, fmt.Errorf("%s surrogates: %w", m, err)
		}
		vals := make([][]float64, len(o.Metrics)) // vals[metric] = finite surrogate values
		var incs [][]float64
		for _, s := range set.Surrogates {
			sv, err := features.Extract(s, fo)
			if err == nil {
				for k, val := range pick(sv, o.Metrics) {
					if finite(val) {
						vals[k] = append(vals[k], val)
					}
				}
			}
			if m == surrogate.Gauss {
				if z, err := increments.Normalized(s, increments.Options{}); err == nil {
					incs = append(incs, z)
				}
			}
		}
		rec.Surrogates = append(rec.Surrogates, summarise(string(m), len(set.Surrogates), rec.Original, vals))
		if len(incs) > 0 {
			rec.Distributions = append(rec.Distributions, compact(DistIncrements, string(m), poolEqual(incs)))
		}
	}
	return rec, nil
}

// SurrogateSeed returns the surrogate seed of a trace and method: FNV-1a
// (64 bit) over the run seed, the trace ID and the method name. The seed
// depends only on these, not on the order or the machine traces are
// measured on.
func SurrogateSeed(seed uint64, id, method string) uint64 {
	h := fnv.New64a()
	var b [8]byte
	binary.LittleEndian.PutUint64(b[:], seed)
	h.Write(b[:])
	h.Write([]byte(id))
	h.Write([]byte{0})
	h.Write([]byte(method))
	return h.Sum64()
}

// pick returns the named values of v in order (NaN when missing).
func pick(v features.Vector, names []string) []float64 {
	out := make([]float64, len(names))
	for i, n := range names {
		val, _ := v.Get(n)
		out[i] = val
	}
	return out
}

// summarise reduces each metric's surrogate values.
func summarise(method string, count int, orig []float64, vals [][]float64) MethodSummary {
	k := len(vals)
	s := MethodSummary{Method: method, Count: count,
		Mean: make([]float64, k), SD: make([]float64, k), Lo: make([]float64, k), Hi: make([]float64, k),
		Finite: make([]int, k), RankP: make([]float64, k)}
	for i, v := range vals {
		d := groups.Describe(v)
		s.Mean[i], s.SD[i], s.Finite[i] = d.Mean, d.SD, d.N
		s.Lo[i], s.Hi[i] = math.NaN(), math.NaN()
		if d.N > 0 {
			sorted := slices.Clone(v)
			sort.Float64s(sorted)
			s.Lo[i] = groups.Quantile(sorted, 0.025)
			s.Hi[i] = groups.Quantile(sorted, 0.975)
		}
		s.RankP[i] = math.NaN()
		if finite(orig[i]) {
			_, _, s.RankP[i] = surrogate.RankP(orig[i], v)
		}
	}
	return s
}

// traceDistributions returns the degree and local clustering sequences of
// the natural and horizontal visibility graphs of the standardised trace
// and its normalised increments.
func traceDistributions(x []float64) ([]Distribution, error) {
	z, err := features.Standardise(x)
	if err != nil {
		return nil, err
	}
	var out []Distribution
	for _, kind := range []struct {
		deg, clu string
		build    func([]float64, visibility.Options) (*networks.Graph, error)
	}{
		{DistNVGDegree, DistNVGClustering, visibility.Natural},
		{DistHVGDegree, DistHVGClustering, visibility.Horizontal},
	} {
		g, err := kind.build(z, visibility.Options{})
		if err != nil {
			if errors.Is(err, networks.ErrTooManyEdges) {
				continue // the metrics say why; the distribution is left out
			}
			return nil, err
		}
		deg := make([]float64, g.Len())
		for i := range deg {
			deg[i] = float64(g.Degree(i))
		}
		out = append(out, compact(kind.deg, Original, deg), compact(kind.clu, Original, networks.LocalClustering(g)))
	}
	inc, err := increments.Normalized(x, increments.Options{})
	if err != nil {
		return nil, err
	}
	out = append(out, compact(DistIncrements, Original, inc))
	sort.SliceStable(out, func(i, j int) bool {
		return slices.Index(DistributionNames(), out[i].Name) < slices.Index(DistributionNames(), out[j].Name)
	})
	return out, nil
}

// poolEqual pools several value lists (surrogates of one trace) into one
// list in which every list carries the same weight: lists are sketched to
// a common length first.
func poolEqual(lists [][]float64) []float64 {
	var out []float64
	for _, l := range lists {
		out = append(out, groups.Sketch(l, 4*SketchPoints)...)
	}
	return out
}

// compact stores values as support points and weights (see Distribution).
func compact(name, cond string, values []float64) Distribution {
	v := make([]float64, 0, len(values))
	for _, x := range values {
		if finite(x) {
			v = append(v, x)
		}
	}
	sort.Float64s(v)
	if distinct(v) > SketchPoints {
		v = groups.Sketch(v, SketchPoints)
	}
	d := Distribution{Name: name, Condition: cond}
	for i := 0; i < len(v); {
		j := i + 1
		for j < len(v) && v[j] == v[i] {
			j++
		}
		d.X = append(d.X, v[i])
		d.W = append(d.W, float64(j-i))
		i = j
	}
	return d
}

// distinct counts the distinct values of an ascending slice.
func distinct(sorted []float64) int {
	n := 0
	for i := range sorted {
		if i == 0 || sorted[i] != sorted[i-1] {
			n++
		}
	}
	return n
}

// finite reports whether v is neither NaN nor ±Inf.
func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
