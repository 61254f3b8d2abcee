package report

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"
	"sync"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/features/increments"
	"github.com/tracesift/tracesift/features/ordinal"
	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/trace"
)

// Defaults used when an Options field is left at its zero value, and the
// floor of the automatic surrogate count of the feature tests.
const (
	// MinSurrogates is the smallest surrogate count the automatic choice
	// for the feature tests (see Options.StatSurrogates) makes: 39 is the
	// least with which one two-sided rank test can reach p = 0.05
	// (M = 2/α − 1; Theiler et al., Physica D 58 (1992) 77).
	MinSurrogates = 39
	// DefaultOrder is the ordinal-pattern order of the complexity–entropy
	// plane: 720 patterns, the finest order that a trace of a few thousand
	// samples still fills (Bandt & Pompe, Phys. Rev. Lett. 88 (2002) 174102
	// recommend 3 ≤ d ≤ 7 with n ≫ d!; the report flags W/d! < 10).
	DefaultOrder = 6
	// DefaultSurrogateLength caps the stretch of the trace the surrogate
	// tests use (the middle of a longer trace), as the determinism test of
	// 'classify --significance' does (surrogate.DefaultDeterminismLength):
	// the report and the command test the same samples.
	DefaultSurrogateLength = surrogate.DefaultDeterminismLength
	// DefaultGraphLength caps the stretch (the middle of a longer trace)
	// whose visibility graphs are drawn; 2^16 nodes fill the degree
	// distributions well past their tails and take well under a second.
	DefaultGraphLength = 1 << 16
	// DefaultAlpha is the significance level of the surrogate tests.
	DefaultAlpha = 0.05
)

// ErrOption reports an invalid Options field.
var ErrOption = errors.New("invalid report option")

// Options configures Build. The zero value selects the documented defaults.
type Options struct {
	// Seed drives every randomised step (feature estimators, surrogates).
	// The reference systems of the complexity–entropy plane use fixed seeds
	// of their own, so they look the same in every report.
	Seed uint64
	// Surrogates is the number of IAAFT surrogates M of the determinism
	// test (surrogate.Determinism, the test of 'classify --significance').
	// Zero chooses the least M with which it can reject at Alpha after
	// Holm's adjustment over its two one-sided statistics,
	// surrogate.DeterminismSurrogates (39 at α = 0.05). A negative value
	// skips every surrogate test.
	Surrogates int
	// Stats are feature names tested against surrogates in addition to
	// the determinism test (two-sided rank tests, Holm-adjusted among
	// themselves); none by default. Each is computed by features.Value with
	// Seed.
	Stats []string
	// StatSurrogates is the number of surrogates of the feature tests.
	// Zero chooses the least M with which one of them can still be declared
	// significant after Holm's adjustment over the m statistics: the
	// smallest two-sided rank p-value is 2/(M+1) and Holm multiplies it by
	// m, so M = ⌈2m/α − 1⌉ (159 for four statistics at α = 0.05), and at
	// least MinSurrogates. With fewer the report says that no statistic can
	// reach significance.
	StatSurrogates int
	// Method is the surrogate generator of the feature tests (default
	// IAAFT; the determinism test always uses IAAFT).
	Method surrogate.Method
	// Alpha is the significance level of the surrogate tests (default 0.05).
	Alpha float64
	// Order is the ordinal-pattern order of the complexity–entropy plane
	// (default 6, between ordinal.MinOrder and ordinal.MaxOrder).
	Order int
	// SurrogateLength and GraphLength cap the stretch (taken from the
	// middle of the trace) used by the surrogate tests and the visibility
	// graphs (defaults DefaultSurrogateLength and DefaultGraphLength).
	SurrogateLength, GraphLength int
	// References are the systems placed on the complexity–entropy plane
	// (default DefaultReferences()).
	References []Reference
	// Screen configures the verdict; its Features.Seed and Interval are
	// filled in from Seed and the trace when zero.
	Screen classifier.ScreenOptions
	// Generator names the program in the footer, e.g. "tracesift 0.1.0".
	Generator string
	// Progress, if set, is called after each surrogate of either test with
	// the number finished and the total of both (see
	// surrogate.Options.Progress).
	Progress func(done, total int)
}

// Resolved returns the options with every default filled in (the
// surrogate count included), or an error wrapping ErrOption for an invalid
// field. Callers can use it to validate options before reading a trace.
func (o Options) Resolved() (Options, error) {
	if o.Method == "" {
		o.Method = surrogate.IAAFT
	}
	if o.Alpha == 0 {
		o.Alpha = DefaultAlpha
	}
	if o.Order == 0 {
		o.Order = DefaultOrder
	}
	if o.SurrogateLength == 0 {
		o.SurrogateLength = DefaultSurrogateLength
	}
	if o.GraphLength == 0 {
		o.GraphLength = DefaultGraphLength
	}
	if o.References == nil {
		o.References = DefaultReferences()
	}
	switch {
	case o.Order < ordinal.MinOrder || o.Order > ordinal.MaxOrder:
		return o, fmt.Errorf("%w: order %d outside [%d, %d]", ErrOption, o.Order, ordinal.MinOrder, ordinal.MaxOrder)
	case !(o.Alpha > 0 && o.Alpha < 1):
		return o, fmt.Errorf("%w: alpha %g outside (0, 1)", ErrOption, o.Alpha)
	case o.SurrogateLength < surrogate.DeterminismMinLength || o.GraphLength < 64:
		return o, fmt.Errorf("%w: the surrogate length must be at least %d and the graph length at least 64", ErrOption, surrogate.DeterminismMinLength)
	case o.StatSurrogates < 0:
		return o, fmt.Errorf("%w: %d surrogates for the feature tests", ErrOption, o.StatSurrogates)
	}
	if _, err := surrogate.ParseMethod(string(o.Method)); err != nil {
		return o, fmt.Errorf("%w: %w", ErrOption, err)
	}
	for _, s := range o.Stats {
		if _, ok := features.Lookup(s); !ok {
			return o, fmt.Errorf("%w: statistic %q: %w", ErrOption, s, features.ErrUnknownFeature)
		}
	}
	if o.Surrogates == 0 {
		o.Surrogates = surrogate.DeterminismSurrogates(o.Alpha)
	}
	if o.StatSurrogates == 0 && len(o.Stats) > 0 {
		o.StatSurrogates = max(MinSurrogates, HolmSurrogates(len(uniq(o.Stats)), o.Alpha))
	}
	return o, nil
}

// Report holds everything the HTML report shows. Build fills it; WriteHTML
// renders it. A panel that could not be computed is nil and Failures says
// why (keyed by section id).
type Report struct {
	Summary Summary
	Model   ModelInfo
	Verdict classifier.Verdict
	// Caution is the screening caution printed with the verdict.
	Caution string

	Trace      *TracePanel
	Increments *IncrementsPanel
	HVG, NVG   *GraphPanel
	// Networks compares the four network constructions on one stretch.
	Networks *NetworksPanel
	Plane    *PlanePanel
	// Determinism is the surrogate test of determinism (nil when skipped
	// or failed); Surrogates the tests of Options.Stats (nil without).
	Determinism *surrogate.DeterminismResult
	Surrogates  *surrogate.Report
	// Failures maps a section id to the reasons some of its panels are
	// missing.
	Failures map[string][]string

	// Options are the resolved options the report was built with.
	Options Options
}

// Caution is the screening caution every report carries.
const Caution = "This verdict is a screening aid, not a device qualification result; defer to your laboratory's qualification procedures and the applicable reliability standards."

// Summary describes the trace in the units of its file.
type Summary struct {
	Source   string
	Samples  int
	Interval float64 // in TimeUnit; 0 when unknown
	TimeUnit string
	// IntervalSeconds is Interval converted to seconds, 0 when the unit is
	// unknown.
	IntervalSeconds float64
	Uneven          bool
	Column, Unit    string
	Mean, SD        float64
	Min, Max        float64
	Warnings        []string
}

// ModelInfo describes the classifier model behind the verdict.
type ModelInfo struct {
	Source         string
	Trees          int
	Schema         classifier.Schema
	Training       string
	Rows           int
	OOBAccuracy    float64
	CVAccuracy     float64 // NaN without cross-validation figures
	CVFolds        int
	MinProbability float64
}

// Build analyses the trace tr with model m and returns the report. Only a
// failure of the verdict itself (or invalid options) is an error; a panel
// that cannot be computed for this trace is recorded in Failures.
func Build(tr trace.Trace, m *classifier.Model, opts Options) (*Report, error) {
	o, err := opts.Resolved()
	if err != nil {
		return nil, err
	}
	if m == nil {
		return nil, fmt.Errorf("report: %w", classifier.ErrEmptyModel)
	}
	x := tr.Values
	if len(x) < features.MinLength {
		return nil, fmt.Errorf("%s: %d samples: %w (need at least %d)", tr.Source, len(x), features.ErrTooShort, features.MinLength)
	}
	r := &Report{Caution: Caution, Failures: map[string][]string{}, Options: o}
	r.Summary = summarise(tr)
	r.Model = modelInfo(m)

	so := o.Screen
	if so.Interval == 0 {
		so.Interval = r.Summary.IntervalSeconds
	}
	if so.Features.Seed == 0 {
		so.Features.Seed = o.Seed
	}

	var (
		wg        sync.WaitGroup
		mu        sync.Mutex
		screenErr error
		fail      = func(section, format string, a ...any) {
			mu.Lock()
			defer mu.Unlock()
			r.Failures[section] = append(r.Failures[section], fmt.Sprintf(format, a...))
		}
	)
	run := func(f func()) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			f()
		}()
	}
	run(func() {
		r.Verdict, screenErr = classifier.Screen(m, x, so)
	})
	run(func() {
		r.Trace = traceEnvelope(x, r.Summary.Interval, displayColumns)
		inc, err := buildIncrements(x)
		if err != nil {
			fail(sectionTrace, "increments: %v", err)
			return
		}
		r.Increments = inc
	})
	run(func() {
		h, n, errs := buildGraphs(x, o.GraphLength)
		r.HVG, r.NVG = h, n
		for _, e := range errs {
			fail(sectionDegrees, "%s", e)
		}
	})
	run(func() {
		r.Networks = buildNetworks(x, o.Seed)
	})
	run(func() {
		p, err := buildPlane(x, o.Order, o.References)
		if err != nil {
			fail(sectionPlane, "%v", err)
		}
		r.Plane = p
	})
	if o.Surrogates > 0 {
		progress := sharedProgress(o)
		run(func() {
			res, err := runDeterminism(x, o, progress(0))
			if err != nil {
				fail(sectionSurrogates, "determinism test: %v", err)
				return
			}
			r.Determinism = res
		})
		if len(o.Stats) > 0 {
			run(func() {
				rep, err := runSurrogates(x, o, progress(1))
				if err != nil {
					fail(sectionSurrogates, "feature tests: %v", err)
					return
				}
				r.Surrogates = rep
			})
		}
	}
	wg.Wait()
	if screenErr != nil {
		return nil, fmt.Errorf("%s: verdict: %w", tr.Source, screenErr)
	}
	for k := range r.Failures {
		// Goroutines append in any order; sort for deterministic output.
		slices.Sort(r.Failures[k])
	}
	return r, nil
}

// summarise collects what the file said about the trace and its moments.
func summarise(tr trace.Trace) Summary {
	s := Summary{
		Source: tr.Source, Samples: len(tr.Values), Interval: tr.Interval, TimeUnit: tr.TimeUnit,
		Uneven: tr.Uneven, Column: tr.Column, Unit: tr.Unit, Warnings: tr.Warnings,
		Min: math.Inf(1), Max: math.Inf(-1),
	}
	if f, ok := secondsPer(tr.TimeUnit); ok && tr.Interval > 0 {
		s.IntervalSeconds = tr.Interval * f
	}
	var sum float64
	for _, v := range tr.Values {
		sum += v
		s.Min = math.Min(s.Min, v)
		s.Max = math.Max(s.Max, v)
	}
	n := float64(len(tr.Values))
	s.Mean = sum / n
	var ss float64
	for _, v := range tr.Values {
		d := v - s.Mean
		ss += d * d
	}
	if len(tr.Values) > 1 {
		s.SD = math.Sqrt(ss / (n - 1))
	}
	return s
}

// secondsPer returns the length of one time unit in seconds for the units
// a trace header may name (see the trace package), false when unknown.
func secondsPer(unit string) (float64, bool) {
	switch strings.ToLower(strings.TrimSpace(unit)) {
	case "s", "sec", "secs", "second", "seconds":
		return 1, true
	case "ms":
		return 1e-3, true
	case "us", "µs", "μs":
		return 1e-6, true
	case "ns":
		return 1e-9, true
	case "ps":
		return 1e-12, true
	case "min":
		return 60, true
	case "h":
		return 3600, true
	}
	return 0, false
}

func modelInfo(m *classifier.Model) ModelInfo {
	mi := ModelInfo{
		Source: m.Source, Trees: m.NumTrees(), Schema: m.Config.Schema, Training: m.Training.Description,
		Rows: m.Training.Rows, OOBAccuracy: m.OOB.Accuracy, CVAccuracy: math.NaN(),
		MinProbability: m.Config.MinProbability,
	}
	if mi.Source == "" {
		mi.Source = "model given by the caller"
	}
	if m.CV != nil {
		mi.CVAccuracy = m.CV.Accuracy
		mi.CVFolds = m.CV.Folds
	}
	return mi
}

// IncrementsPanel holds the distribution of the normalised increments.
type IncrementsPanel struct {
	Stats increments.Result
	Hist  increments.Bins
}

func buildIncrements(x []float64) (*IncrementsPanel, error) {
	res, err := increments.Analyze(x, increments.Options{})
	if err != nil {
		return nil, err
	}
	z, err := increments.Normalized(x, increments.Options{})
	if err != nil {
		return nil, err
	}
	hopts := latticeBins(z)
	if hopts.Bins == 0 {
		// A symmetric range around 0 so both tails show on the same
		// footing; Freedman–Diaconis bins, or 40 for short traces.
		lim := math.Max(4, math.Ceil(res.MaxAbsZ*1.02))
		hopts = increments.HistogramOptions{Min: -lim, Max: lim}
		if len(z) < 2000 {
			hopts.Bins = 40
		}
	}
	h, err := increments.Histogram(z, hopts)
	if err != nil {
		return nil, err
	}
	return &IncrementsPanel{Stats: res, Hist: h}, nil
}

// latticeBins returns one bin per possible value when the increments of a
// quantised trace take few distinct values on a regular lattice (ADC
// steps): equal-width bins narrower than the lattice spacing would show
// spikes separated by empty bins and exaggerate the density. Zero Bins
// means the values are not on such a lattice.
func latticeBins(z []float64) increments.HistogramOptions {
	const maxLevels = 120
	var levels []float64
	for _, v := range z {
		i, found := slices.BinarySearch(levels, v)
		if found {
			continue
		}
		if len(levels) == maxLevels {
			return increments.HistogramOptions{}
		}
		levels = slices.Insert(levels, i, v)
	}
	if len(levels) < 3 {
		return increments.HistogramOptions{}
	}
	step := math.Inf(1)
	for i := 1; i < len(levels); i++ {
		step = math.Min(step, levels[i]-levels[i-1])
	}
	for _, v := range levels {
		k := (v - levels[0]) / step
		if math.Abs(k-math.Round(k)) > 1e-6*math.Max(1, k) {
			return increments.HistogramOptions{}
		}
	}
	bins := int(math.Round((levels[len(levels)-1]-levels[0])/step)) + 1
	if bins > 4*maxLevels {
		return increments.HistogramOptions{}
	}
	return increments.HistogramOptions{Bins: bins, Min: levels[0] - step/2, Max: levels[len(levels)-1] + step/2}
}

// middle returns the centred stretch of at most n samples of x and its
// offset.
func middle(x []float64, n int) ([]float64, int) {
	if len(x) <= n {
		return x, 0
	}
	off := (len(x) - n) / 2
	return x[off : off+n], off
}

// HolmSurrogates returns the least number of surrogates M with which the
// smallest of m two-sided rank-test p-values, 2/(M+1), survives Holm's
// adjustment (multiplication by m) at level alpha: M = ⌈2m/α − 1⌉
// (surrogate.MinSurrogates at α/m). Theiler et al., Physica D 58 (1992) 77;
// Holm, Scand. J. Statist. 6 (1979) 65.
func HolmSurrogates(m int, alpha float64) int {
	if m < 1 || !(alpha > 0 && alpha < 1) {
		return 0
	}
	n, err := surrogate.MinSurrogates(alpha/float64(m), surrogate.TwoSided)
	if err != nil {
		return 0
	}
	return n
}

// uniq returns s without repeated names, first occurrences in order.
func uniq(s []string) []string {
	seen := map[string]bool{}
	var out []string
	for _, v := range s {
		if !seen[v] {
			seen[v] = true
			out = append(out, v)
		}
	}
	return out
}
