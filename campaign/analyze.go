package campaign

import (
	"cmp"
	"errors"
	"fmt"
	"hash/fnv"
	"math"
	"math/rand/v2"
	"slices"
	"sort"
	"strconv"

	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/groups"
)

// The questions a test answers (Test.Question).
const (
	QuestionGroups       = "groups"       // group against group at one level
	QuestionTrend        = "trend"        // metric against the control parameter, per group
	QuestionSurrogate    = "surrogate"    // original against a surrogate method, per group and level
	QuestionTrace        = "trace"        // original against its own surrogates, one trace
	QuestionDistribution = "distribution" // pooled distributions
)

// The tests (Test.Test).
const (
	TestKS          = "ks"               // groups.KS
	TestMW          = "mann-whitney"     // groups.MannWhitney
	TestSignedRank  = "signed-rank"      // groups.SignedRank, paired by device or by trace
	TestSpearman    = "spearman"         // groups.Spearman, with the Theil–Sen slope
	TestRank        = "rank"             // surrogate.RankP of one trace
	TestPermKS      = "permutation-ks"   // KS distance, traces relabelled
	TestPermChi     = "permutation-chi2" // χ² distance of the bins, traces relabelled
	TestGaussFlip   = "paired-flip-ks"   // increments against their Gaussianised surrogates
	defaultMinTrace = 3
)

// AnalyzeOptions control Analyze. The zero value means α = 0.05, Holm,
// the alphabetically first group as reference, at least 3 values per
// group, and the permutation defaults above.
type AnalyzeOptions struct {
	Alpha float64
	// Adjust decides Test.Significant; both Holm and BH are always
	// reported. "" means groups.AdjustHolm.
	Adjust groups.Adjustment
	// Reference is group A of every comparison (the others are B).
	Reference string
	// MinSamples is the fewest values per side for a test; 0 means 3.
	MinSamples int
	// ExactLimit and Permutations control the permutation tests.
	ExactLimit, Permutations int
}

func (o AnalyzeOptions) resolve() (AnalyzeOptions, error) {
	if o.Alpha == 0 {
		o.Alpha = 0.05
	}
	if !(o.Alpha > 0 && o.Alpha < 1) {
		return o, fmt.Errorf("alpha %v outside (0, 1)", o.Alpha)
	}
	if o.Adjust == "" {
		o.Adjust = groups.AdjustHolm
	}
	if o.Adjust != groups.AdjustHolm && o.Adjust != groups.AdjustBH {
		return o, fmt.Errorf("adjustment %q: want holm or bh", o.Adjust)
	}
	if o.MinSamples <= 0 {
		o.MinSamples = defaultMinTrace
	}
	if o.ExactLimit <= 0 {
		o.ExactLimit = DefaultExactLimit
	}
	if o.Permutations <= 0 {
		o.Permutations = DefaultPermutations
	}
	return o, nil
}

// Test is one hypothesis test of the campaign.
type Test struct {
	// Family is the multiple-testing family: the question and the test
	// (e.g. "groups/mann-whitney", "surrogate/shuffle", "trace/<file>").
	Family   string `json:"family"`
	Question string `json:"question"`
	Test     string `json:"test"`
	// Name is the metric or distribution.
	Name  string  `json:"name"`
	Level string  `json:"level"`
	Param float64 `json:"param"`
	// Group is the group of a within-group test; A and B the groups
	// compared (B against A).
	Group string `json:"group"`
	A     string `json:"a"`
	B     string `json:"b"`
	// Condition is the surrogate method of surrogate and trace tests.
	Condition string `json:"condition"`
	File      string `json:"file"`
	// N and M are the sample sizes (pairs in N for paired tests).
	N         int     `json:"n"`
	M         int     `json:"m"`
	Statistic float64 `json:"statistic"`
	P         float64 `json:"p"`
	PHolm     float64 `json:"p_holm"`
	PBH       float64 `json:"p_bh"`
	// Significant: the adjusted p of AnalyzeOptions.Adjust is ≤ α.
	Significant bool `json:"significant"`
	// Estimate is the effect on the metric's scale with its interval Low,
	// High where there is one: median of B minus median of A (groups),
	// Hodges–Lehmann shift for Mann–Whitney, median paired difference
	// (signed-rank), Theil–Sen slope and interval (trend), median of
	// original minus surrogate mean (surrogate), original minus surrogate
	// mean (trace).
	Estimate float64 `json:"estimate"`
	Low      float64 `json:"low"`
	High     float64 `json:"high"`
	// Effect is a scale-free effect size named by EffectKind.
	Effect     float64 `json:"effect"`
	EffectKind string  `json:"effect_kind"`
	// MinP is the smallest p-value the test could give at these sizes
	// (0 when the method is asymptotic and has no floor).
	MinP    float64 `json:"min_p"`
	PMethod string  `json:"p_method"`
	Note    string  `json:"note"`
}

// Family describes one multiple-testing family.
type Family struct {
	Name string `json:"name"`
	// Tests is the number of tests with a p-value (m).
	Tests int `json:"tests"`
	// MinP is the smallest attainable p over the family's tests.
	MinP float64 `json:"min_p"`
	// Reachable is false when no test in the family can reach the
	// adjusted level (Holm: MinP > α/m; BH: MinP > α).
	Reachable   bool `json:"reachable"`
	Significant int  `json:"significant"`
}

// LevelInfo describes one level of the control parameter.
type LevelInfo struct {
	Level string  `json:"level"`
	Param float64 `json:"param"`
	// Traces counts the traces per group (aligned with Report.Groups).
	Traces []int `json:"traces"`
	// Paired counts the devices measured in the reference group and in
	// another group at this level (the largest over the other groups).
	Paired int `json:"paired"`
}

// Band is a metric of one group at one level: the originals' median and
// quartiles, and per surrogate method the median over traces of the
// surrogate mean, 2.5 % and 97.5 % quantiles.
type Band struct {
	Name    string       `json:"name"`
	Group   string       `json:"group"`
	Level   string       `json:"level"`
	Param   float64      `json:"param"`
	N       int          `json:"n"`
	Median  float64      `json:"median"`
	Q1      float64      `json:"q1"`
	Q3      float64      `json:"q3"`
	Methods []MethodBand `json:"methods"`
}

// MethodBand is one surrogate method's band in a Band.
type MethodBand struct {
	Method string  `json:"method"`
	Mean   float64 `json:"mean"`
	Lo     float64 `json:"lo"`
	Hi     float64 `json:"hi"`
}

// Histogram is a pooled distribution (equal weight per trace) of one
// group at one level, in the bins of the group comparison at that level.
type Histogram struct {
	Name     string    `json:"name"`
	Group    string    `json:"group"`
	Level    string    `json:"level"`
	Traces   int       `json:"traces"`
	Discrete bool      `json:"discrete"`
	Upper    []float64 `json:"upper"` // bin b holds (Upper[b−1], Upper[b]]
	P        []float64 `json:"p"`
	// X and F are the pooled CDF at every support value of the
	// comparison (the distinct values of both groups' traces), for
	// figures finer than the bins.
	X []float64 `json:"x"`
	F []float64 `json:"f"`
}

// Report is the outcome of Analyze. Every slice is in a fixed order, so
// the same table gives the same Report.
type Report struct {
	Alpha  float64           `json:"alpha"`
	Adjust groups.Adjustment `json:"adjust"`
	Seed   uint64            `json:"seed"`
	// Parameter names the control parameter ("" without one).
	Parameter string      `json:"parameter"`
	Traces    int         `json:"traces"`
	Groups    []string    `json:"groups"`
	Reference string      `json:"reference"`
	Levels    []LevelInfo `json:"levels"`
	Metrics   []string    `json:"metrics"`
	// Methods are the surrogate methods and Counts the surrogates made per
	// trace (the largest count seen per method).
	Methods       []string    `json:"methods"`
	Counts        []int       `json:"counts"`
	Distributions []string    `json:"distributions"`
	Tests         []Test      `json:"tests"`
	Families      []Family    `json:"families"`
	Bands         []Band      `json:"bands"`
	Histograms    []Histogram `json:"histograms"`
	// Tails are the pooled degree distributions of every group at every
	// level with their fitted tails (exponential for the HVG, power law
	// for the NVG).
	Tails []Tail `json:"tails"`
	// Verdicts are the classifier's verdicts, one per classified trace in
	// the canonical trace order (group, device, parameter, file).
	Verdicts []TraceVerdict `json:"verdicts"`
	// Warnings are statements a reader must not miss: families in which
	// nothing can be significant, and what would make them reachable.
	Warnings []string `json:"warnings"`
	Notes    []string `json:"notes"`
}

// traceData is one trace rebuilt from the table.
type traceData struct {
	id, group, device, level string
	param                    float64
	samples                  int
	seed                     uint64
	parameter                string
	orig                     map[string]float64
	surr                     map[string]map[string]Row // method → metric → row
	dists                    map[[2]string]*Distribution
	verdict                  *Verdict
	mixedModels              bool
}

// Analyze runs every test of the campaign on the per-trace table (rows
// in any order: the traces are put in a canonical order first, so tables
// merged from several runs give the same Report as one run).
//
// Families (one per question and test; Holm and BH within each):
//   - groups/<test>: at each level, every other group against the
//     reference, per metric: KS and Mann–Whitney on the traces, and the
//     Wilcoxon signed-rank test on the paired differences B − A when
//     devices were measured in both groups (replicates of a device are
//     represented by their median);
//   - trend/spearman: per group and metric, Spearman's ρ against the
//     parameter, with the Theil–Sen slope and its 1 − α interval;
//   - surrogate/<method>: per group, level and metric, the signed-rank
//     test of original minus surrogate mean over the traces (paired trace
//     by trace);
//   - trace/<file>: the rank test of each metric against each method's
//     surrogates of that trace;
//   - distribution/<test>: per level and distribution, the reference
//     against every other group by the KS and χ² distances of the pooled
//     distributions with traces relabelled, and per group and level the
//     pooled normalised increments against those of the Gaussianised
//     surrogates (paired flips).
func Analyze(rows []Row, opts AnalyzeOptions) (Report, error) {
	o, err := opts.resolve()
	if err != nil {
		return Report{}, err
	}
	traces, err := rebuild(rows)
	if err != nil {
		return Report{}, err
	}
	if len(traces) == 0 {
		return Report{}, ErrNoTraces
	}
	rep := Report{Alpha: o.Alpha, Adjust: o.Adjust, Traces: len(traces)}
	a := &analysis{o: o, rep: &rep, traces: traces}
	if err := a.layout(); err != nil {
		return Report{}, err
	}
	a.groupTests()
	a.trendTests()
	a.surrogateTests()
	a.traceTests()
	a.distributionTests()
	a.bands()
	a.tails()
	a.verdicts()
	a.adjust()
	return rep, nil
}

// rebuild groups the rows by trace and checks their consistency.
func rebuild(rows []Row) ([]*traceData, error) {
	byID := map[string]*traceData{}
	type key struct {
		file, kind, cond, name string
		x                      float64
	}
	seen := map[key]bool{}
	for _, r := range rows {
		k := key{r.File, r.Kind, r.Condition, r.Name, r.X}
		if r.Kind != KindDistribution {
			k.x = 0
		}
		if seen[k] {
			return nil, fmt.Errorf("%s: %s %s (%s) appears twice: %w (do merged tables overlap?)", r.File, r.Kind, r.Name, r.Condition, ErrTable)
		}
		seen[k] = true
		t := byID[r.File]
		if t == nil {
			param := math.NaN()
			if r.Level != "" {
				v, err := strconv.ParseFloat(r.Level, 64)
				if err != nil {
					return nil, fmt.Errorf("%s: level %q is not a number: %w", r.File, r.Level, ErrTable)
				}
				param = v
			}
			t = &traceData{id: r.File, group: r.Group, device: r.Device, level: r.Level, param: param,
				samples: r.Samples, seed: r.Seed, parameter: r.Parameter,
				orig: map[string]float64{}, surr: map[string]map[string]Row{}, dists: map[[2]string]*Distribution{}}
			byID[r.File] = t
		} else if t.group != r.Group || t.device != r.Device || t.level != r.Level || t.samples != r.Samples || t.seed != r.Seed || t.parameter != r.Parameter {
			return nil, fmt.Errorf("%s: rows disagree on group, device, level, length, seed or parameter: %w", r.File, ErrTable)
		}
		switch {
		case r.Kind == KindMetric && r.Condition == Original:
			t.orig[r.Name] = r.Value
		case r.Kind == KindVerdict:
			t.addVerdict(r)
		case r.Kind == KindMetric:
			if t.surr[r.Condition] == nil {
				t.surr[r.Condition] = map[string]Row{}
			}
			t.surr[r.Condition][r.Name] = r
		default:
			k := [2]string{r.Name, r.Condition}
			d := t.dists[k]
			if d == nil {
				d = &Distribution{Name: r.Name, Condition: r.Condition}
				t.dists[k] = d
			}
			d.X = append(d.X, r.X)
			d.W = append(d.W, r.Value)
		}
	}
	out := make([]*traceData, 0, len(byID))
	for _, t := range byID {
		for _, d := range t.dists {
			sortByKey(d.X, d.W)
		}
		out = append(out, t)
	}
	slices.SortFunc(out, func(a, b *traceData) int {
		return cmp.Or(cmp.Compare(a.group, b.group), cmp.Compare(a.device, b.device),
			cmpNaN(a.param, b.param), cmp.Compare(a.id, b.id))
	})
	for _, t := range out {
		if err := t.checkVerdict(); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// methodOrder is the order of the surrogate methods in every output: the
// defaults first, then the other generators.
func methodOrder() []surrogate.Method {
	out := DefaultMethods()
	for _, m := range surrogate.Methods() {
		if !slices.Contains(out, m) {
			out = append(out, m)
		}
	}
	return out
}

// cmpNaN compares floats with NaN first.
func cmpNaN(a, b float64) int {
	switch {
	case math.IsNaN(a) && math.IsNaN(b):
		return 0
	case math.IsNaN(a):
		return -1
	case math.IsNaN(b):
		return 1
	}
	return cmp.Compare(a, b)
}

type analysis struct {
	o      AnalyzeOptions
	rep    *Report
	traces []*traceData
	// levels in order; levelOf maps a parameter value to its index.
	levelOf map[float64]int
}

// layout fills groups, levels, metrics, methods and distributions.
func (a *analysis) layout() error {
	rep := a.rep
	gset := map[string]bool{}
	metrics := map[string]bool{}
	methods := map[string]int{}
	dists := map[string]bool{}
	params := map[string]bool{}
	seeds := map[uint64]bool{}
	for _, t := range a.traces {
		gset[t.group] = true
		for m := range t.orig {
			metrics[m] = true
		}
		for m, byMetric := range t.surr {
			for _, r := range byMetric {
				methods[m] = max(methods[m], r.Count)
			}
		}
		for k := range t.dists {
			dists[k[0]] = true
		}
		params[t.parameter] = true
		seeds[t.seed] = true
	}
	rep.Groups = sortedKeys(gset)
	rep.Reference = rep.Groups[0]
	if a.o.Reference != "" {
		if !gset[a.o.Reference] {
			return fmt.Errorf("reference group %q has no traces (groups: %v)", a.o.Reference, rep.Groups)
		}
		rep.Reference = a.o.Reference
		rep.Groups = append([]string{a.o.Reference}, slices.DeleteFunc(rep.Groups, func(g string) bool { return g == a.o.Reference })...)
	}
	if len(params) > 1 {
		return fmt.Errorf("the traces name different control parameters %v: %w", sortedKeys(params), ErrTable)
	}
	for p := range params {
		rep.Parameter = p
	}
	for s := range seeds {
		rep.Seed = s
	}
	if len(seeds) > 1 {
		rep.Notes = append(rep.Notes, fmt.Sprintf("the traces were measured with %d different seeds; the seed shown is one of them", len(seeds)))
		rep.Seed = slices.Min(sortedSeeds(seeds))
	}
	rep.Metrics = orderNames(metrics)
	for _, m := range methodOrder() {
		if c, ok := methods[string(m)]; ok {
			rep.Methods = append(rep.Methods, string(m))
			rep.Counts = append(rep.Counts, c)
			delete(methods, string(m))
		}
	}
	for _, m := range sortedKeys(boolKeys(methods)) {
		rep.Methods = append(rep.Methods, m)
		rep.Counts = append(rep.Counts, methods[m])
	}
	rep.Distributions = orderNames(dists)

	// Levels by parameter value; the label is the first spelling met.
	a.levelOf = map[float64]int{}
	var vals []float64
	label := map[float64]string{}
	for _, t := range a.traces {
		key := t.param
		if math.IsNaN(key) {
			key = math.Inf(-1) // the single level of a campaign without parameter
		}
		if _, ok := label[key]; !ok {
			label[key] = t.level
			vals = append(vals, key)
		}
	}
	sort.Float64s(vals)
	for i, v := range vals {
		a.levelOf[v] = i
		p := v
		if math.IsInf(v, -1) {
			p = math.NaN()
		}
		li := LevelInfo{Level: label[v], Param: p, Traces: make([]int, len(rep.Groups))}
		rep.Levels = append(rep.Levels, li)
	}
	for _, t := range a.traces {
		rep.Levels[a.level(t)].Traces[slices.Index(rep.Groups, t.group)]++
	}
	for li := range rep.Levels {
		for _, g := range rep.Groups[1:] {
			rep.Levels[li].Paired = max(rep.Levels[li].Paired, len(a.pairs(li, rep.Reference, g, "")))
		}
	}
	return nil
}

func (a *analysis) level(t *traceData) int {
	if math.IsNaN(t.param) {
		return a.levelOf[math.Inf(-1)]
	}
	return a.levelOf[t.param]
}

// at returns the traces of group g at level li (canonical order).
func (a *analysis) at(g string, li int) []*traceData {
	var out []*traceData
	for _, t := range a.traces {
		if t.group == g && a.level(t) == li {
			out = append(out, t)
		}
	}
	return out
}

// pairs returns, for devices measured in groups ga and gb at level li,
// the median of each device's finite values of metric in both groups
// (metric "" counts the devices only, values NaN).
func (a *analysis) pairs(li int, ga, gb, metric string) [][2]float64 {
	collect := func(g string) map[string][]float64 {
		m := map[string][]float64{}
		for _, t := range a.at(g, li) {
			if t.device == "" {
				continue
			}
			if metric == "" {
				m[t.device] = append(m[t.device], math.NaN())
				continue
			}
			if v, ok := t.orig[metric]; ok && finite(v) {
				m[t.device] = append(m[t.device], v)
			}
		}
		return m
	}
	ma, mb := collect(ga), collect(gb)
	var devs []string
	for d := range ma {
		if _, ok := mb[d]; ok {
			devs = append(devs, d)
		}
	}
	sort.Strings(devs)
	out := make([][2]float64, 0, len(devs))
	for _, d := range devs {
		out = append(out, [2]float64{medianOf(ma[d]), medianOf(mb[d])})
	}
	return out
}

func medianOf(v []float64) float64 {
	if len(v) == 0 || math.IsNaN(v[0]) {
		return math.NaN()
	}
	return groups.Quantile(sortedCopy(v), 0.5)
}

// values returns the finite values of metric in traces.
func values(ts []*traceData, metric string) []float64 {
	var out []float64
	for _, t := range ts {
		if v, ok := t.orig[metric]; ok && finite(v) {
			out = append(out, v)
		}
	}
	return out
}

func (a *analysis) newTest(family, question, test, name string, li int) Test {
	nan := math.NaN()
	t := Test{Family: family, Question: question, Test: test, Name: name,
		Statistic: nan, P: nan, PHolm: nan, PBH: nan, Estimate: nan, Low: nan, High: nan, Effect: nan, MinP: nan, Param: nan}
	if li >= 0 {
		t.Level, t.Param = a.rep.Levels[li].Level, a.rep.Levels[li].Param
	}
	return t
}

// groupTests: every other group against the reference at each level.
func (a *analysis) groupTests() {
	rep := a.rep
	for li := range rep.Levels {
		for _, gb := range rep.Groups[1:] {
			ga := rep.Reference
			ta, tb := a.at(ga, li), a.at(gb, li)
			for _, m := range rep.Metrics {
				va, vb := values(ta, m), values(tb, m)
				base := a.newTest("", QuestionGroups, "", m, li)
				base.A, base.B, base.N, base.M = ga, gb, len(va), len(vb)
				if len(va) > 0 && len(vb) > 0 {
					base.Estimate = groups.Quantile(sortedCopy(vb), 0.5) - groups.Quantile(sortedCopy(va), 0.5)
					base.Effect, base.EffectKind = groups.CliffDelta(va, vb), "cliff_delta"
				}
				ks, mw := base, base
				ks.Family, ks.Test = QuestionGroups+"/"+TestKS, TestKS
				mw.Family, mw.Test = QuestionGroups+"/"+TestMW, TestMW
				if len(va) >= a.o.MinSamples && len(vb) >= a.o.MinSamples {
					lo, hi := separated(va, vb)
					if r, err := groups.KS(va, vb, groups.KSOptions{}); err == nil {
						ks.Statistic, ks.P, ks.PMethod = r.D, r.P, string(r.Method)
						if f, err := groups.KS(lo, hi, groups.KSOptions{Method: r.Method}); err == nil {
							ks.MinP = f.P
						}
					}
					r, err := groups.MannWhitney(va, vb, groups.MWOptions{})
					if errors.Is(err, groups.ErrTiesExact) {
						r, err = groups.MannWhitney(va, vb, groups.MWOptions{Method: groups.MethodAsymptotic})
					}
					if err == nil {
						mw.Statistic, mw.P, mw.PMethod = r.U, r.P, string(r.Method)
						mw.MinP = 0
						if f, err := groups.MannWhitney(lo, hi, groups.MWOptions{Method: r.Method}); err == nil {
							mw.MinP = f.P
						} else if f, err := groups.MannWhitney(lo, hi, groups.MWOptions{Method: groups.MethodAsymptotic}); err == nil {
							mw.MinP = f.P
						}
						mw.Estimate = groups.HodgesLehmann(va, vb)
					}
				} else {
					note := fmt.Sprintf("not tested: %d and %d values (need %d per group)", len(va), len(vb), a.o.MinSamples)
					ks.Note, mw.Note = note, note
				}
				rep.Tests = append(rep.Tests, ks, mw)
				pr := a.pairs(li, ga, gb, m)
				if len(pr) == 0 {
					continue
				}
				sr := a.newTest(QuestionGroups+"/"+TestSignedRank, QuestionGroups, TestSignedRank, m, li)
				sr.A, sr.B, sr.N, sr.M = ga, gb, len(pr), len(pr)
				d := make([]float64, len(pr))
				for i, p := range pr {
					d[i] = p[1] - p[0]
				}
				a.signedRank(&sr, d)
				rep.Tests = append(rep.Tests, sr)
			}
		}
	}
}

// signedRank fills a signed-rank test of the differences d.
func (a *analysis) signedRank(t *Test, d []float64) {
	t.N = len(d)
	if len(d) == 0 {
		t.Note = "no pairs"
		return
	}
	t.Estimate = groups.Quantile(sortedCopy(d), 0.5)
	if len(d) < a.o.MinSamples {
		t.Note = fmt.Sprintf("not tested: %d pairs (need %d)", len(d), a.o.MinSamples)
		return
	}
	r, err := groups.SignedRank(d, groups.SignedRankOptions{})
	if err != nil {
		t.Note = err.Error()
		return
	}
	t.Statistic, t.P, t.PMethod = r.T, r.P, string(r.Method)
	// The floor: every difference of one sign, same |d| (same ties).
	var abs []float64
	for _, v := range d {
		if v != 0 {
			abs = append(abs, math.Abs(v))
		}
	}
	t.MinP = 1
	if f, err := groups.SignedRank(abs, groups.SignedRankOptions{Method: r.Method}); err == nil {
		t.MinP = f.P
	}
	// Matched-pairs rank-biserial correlation (W⁺ − W⁻)/(W⁺ + W⁻)
	// (Kerby, Compr. Psychol. 3 (2014) 11, memory).
	if total := float64(r.N) * float64(r.N+1) / 2; total > 0 {
		t.Effect, t.EffectKind = (2*r.WPlus-total)/total, "rank_biserial"
	}
	if r.Zeros > 0 {
		t.Note = fmt.Sprintf("%d zero differences dropped", r.Zeros)
	}
}

// separated returns the pooled values of a and b rearranged into the most
// extreme split: the len(a) smallest and the rest. A test's p-value on it
// is the smallest the test can give for these values and sizes (2/C(n+m,
// n) for the exact rank and KS tests; the tie structure for the
// approximations).
func separated(a, b []float64) (lo, hi []float64) {
	pooled := sortedCopy(append(slices.Clone(a), b...))
	return pooled[:len(a)], pooled[len(a):]
}

// trendTests: Spearman and Theil–Sen per group and metric.
func (a *analysis) trendTests() {
	rep := a.rep
	if len(rep.Levels) < 2 {
		return
	}
	for _, g := range rep.Groups {
		for _, m := range rep.Metrics {
			var xs, ys []float64
			for _, t := range a.traces {
				if t.group != g || math.IsNaN(t.param) {
					continue
				}
				if v, ok := t.orig[m]; ok && finite(v) {
					xs = append(xs, t.param)
					ys = append(ys, v)
				}
			}
			tt := a.newTest(QuestionTrend+"/"+TestSpearman, QuestionTrend, TestSpearman, m, -1)
			tt.Group, tt.N = g, len(xs)
			s := groups.Spearman(xs, ys)
			ts := groups.TheilSen(xs, ys, 1-a.o.Alpha)
			tt.Estimate, tt.Low, tt.High = ts.Slope, ts.Low, ts.High
			tt.Effect, tt.EffectKind = s.Rho, "spearman_rho"
			switch {
			case len(xs) < a.o.MinSamples:
				tt.Note = fmt.Sprintf("not tested: %d values (need %d)", len(xs), a.o.MinSamples)
			case math.IsNaN(s.Rho):
				tt.Note = "constant metric or parameter: no correlation"
			default:
				tt.Statistic, tt.P, tt.PMethod = s.Rho, s.P, "t-approximation"
				// The floor: y sorted along x (the largest ρ the ties of x allow).
				ix := make([]int, len(xs))
				for i := range ix {
					ix[i] = i
				}
				sort.SliceStable(ix, func(i, j int) bool { return xs[ix[i]] < xs[ix[j]] })
				xo := make([]float64, len(xs))
				for i, j := range ix {
					xo[i] = xs[j]
				}
				tt.MinP = groups.Spearman(xo, sortedCopy(ys)).P
			}
			rep.Tests = append(rep.Tests, tt)
		}
	}
}

// surrogateTests: original minus surrogate mean, signed-rank over the
// traces of each group and level.
func (a *analysis) surrogateTests() {
	rep := a.rep
	for _, method := range rep.Methods {
		for li := range rep.Levels {
			for _, g := range rep.Groups {
				ts := a.at(g, li)
				for _, m := range rep.Metrics {
					t := a.newTest(QuestionSurrogate+"/"+method, QuestionSurrogate, TestSignedRank, m, li)
					t.Group, t.Condition = g, method
					var d []float64
					for _, tr := range ts {
						o, ok := tr.orig[m]
						s, sok := tr.surr[method][m]
						if ok && sok && finite(o) && finite(s.Value) {
							d = append(d, o-s.Value)
						}
					}
					t.M = len(ts)
					a.signedRank(&t, d)
					t.M = len(d)
					rep.Tests = append(rep.Tests, t)
				}
			}
		}
	}
}

// traceTests: each trace's metric against its own surrogates.
func (a *analysis) traceTests() {
	rep := a.rep
	for _, tr := range a.traces {
		for _, method := range rep.Methods {
			for _, m := range rep.Metrics {
				s, ok := tr.surr[method][m]
				if !ok {
					continue
				}
				t := a.newTest(QuestionTrace+"/"+tr.id, QuestionTrace, TestRank, m, a.level(tr))
				t.Group, t.Condition, t.File, t.N = tr.group, method, tr.id, s.N
				o := tr.orig[m]
				t.Estimate, t.Low, t.High = o-s.Value, s.Lo, s.Hi
				if s.SD > 0 {
					t.Effect, t.EffectKind = (o-s.Value)/s.SD, "z_surrogates"
				}
				if finite(s.PRank) {
					t.P, t.PMethod, t.Statistic = s.PRank, "rank", o
					t.MinP = math.Min(1, 2/float64(s.N+1))
				} else {
					t.Note = "metric missing on the trace"
				}
				rep.Tests = append(rep.Tests, t)
			}
		}
	}
}

// distributionTests: pooled distributions between groups, and the
// increments against their Gaussianised surrogates.
func (a *analysis) distributionTests() {
	rep := a.rep
	for li := range rep.Levels {
		for _, name := range rep.Distributions {
			for _, gb := range rep.Groups[1:] {
				ga := rep.Reference
				da, db := a.dists(a.at(ga, li), name, Original), a.dists(a.at(gb, li), name, Original)
				ks := a.newTest(QuestionDistribution+"/"+TestPermKS, QuestionDistribution, TestPermKS, name, li)
				ks.A, ks.B, ks.N, ks.M = ga, gb, len(da), len(db)
				chi := ks
				chi.Family, chi.Test = QuestionDistribution+"/"+TestPermChi, TestPermChi
				if len(da) == 0 || len(db) == 0 {
					continue
				}
				s := newSupport(append(slices.Clone(da), db...))
				fa := mean(s.cdf[:len(da)], nil)
				fb := mean(s.cdf[len(da):], nil)
				a.histogram(s, fa, name, ga, li, len(da), gb == rep.Groups[1])
				a.histogram(s, fb, name, gb, li, len(db), true)
				if len(da) < a.o.MinSamples || len(db) < a.o.MinSamples {
					note := fmt.Sprintf("not tested: %d and %d traces (need %d per group)", len(da), len(db), a.o.MinSamples)
					ks.Note, chi.Note = note, note
					ks.Statistic, chi.Statistic = ksDistance(fa, fb), s.chiDistance(fa, fb)
					rep.Tests = append(rep.Tests, ks, chi)
					continue
				}
				r := s.twoSample(len(da), len(db), a.o.ExactLimit, a.o.Permutations, a.rng("dist", name, ga, gb, strconv.Itoa(li)))
				method := "permutation (exact)"
				if !r.Exact {
					method = fmt.Sprintf("permutation (%d random)", r.Relabelings)
				}
				bins := "bins: one per distinct value"
				if !s.discrete {
					bins = fmt.Sprintf("bins: %d of equal pooled probability", len(s.edges))
				}
				ks.Statistic, ks.P, ks.MinP, ks.PMethod = r.KS, r.PKS, r.MinP, method
				chi.Statistic, chi.P, chi.MinP, chi.PMethod, chi.Note = r.Chi, r.PChi, r.MinP, method, bins
				rep.Tests = append(rep.Tests, ks, chi)
			}
		}
	}
	if !slices.Contains(rep.Methods, string(surrogate.Gauss)) {
		return
	}
	for li := range rep.Levels {
		for _, g := range rep.Groups {
			var orig, surr []*Distribution
			for _, tr := range a.at(g, li) {
				o, s := tr.dists[[2]string{DistIncrements, Original}], tr.dists[[2]string{DistIncrements, string(surrogate.Gauss)}]
				if o != nil && s != nil {
					orig, surr = append(orig, o), append(surr, s)
				}
			}
			if len(orig) == 0 {
				continue
			}
			t := a.newTest(QuestionDistribution+"/"+TestGaussFlip, QuestionDistribution, TestGaussFlip, DistIncrements, li)
			t.Group, t.Condition, t.N, t.M = g, string(surrogate.Gauss), len(orig), len(orig)
			s := newSupport(append(slices.Clone(orig), surr...))
			co, cs := s.cdf[:len(orig)], s.cdf[len(orig):]
			t.Estimate = gaussDistance(s.grid, mean(co, nil))
			t.Effect, t.EffectKind = gaussDistance(s.grid, mean(cs, nil)), "ks_gauss_of_surrogates"
			t.Note = "estimate: sup|F − Φ| of the pooled original increments; effect: the same for the Gaussianised surrogates"
			if len(orig) < a.o.MinSamples {
				t.Statistic = ksDistance(mean(co, nil), mean(cs, nil))
				t.Note = fmt.Sprintf("not tested: %d traces (need %d); ", len(orig), a.o.MinSamples) + t.Note
			} else {
				d, p, minP, exact := pairedFlip(co, cs, a.o.ExactLimit, a.o.Permutations, a.rng("flip", g, strconv.Itoa(li)))
				t.Statistic, t.P, t.MinP = d, p, minP
				t.PMethod = "paired flips (exact)"
				if !exact {
					t.PMethod = fmt.Sprintf("paired flips (%d random)", a.o.Permutations)
				}
			}
			rep.Tests = append(rep.Tests, t)
		}
	}
}

// dists returns the distributions name/cond of the traces that have it.
func (a *analysis) dists(ts []*traceData, name, cond string) []*Distribution {
	var out []*Distribution
	for _, t := range ts {
		if d := t.dists[[2]string{name, cond}]; d != nil && len(d.X) > 0 {
			out = append(out, d)
		}
	}
	return out
}

// histogram records a pooled histogram once per group, level and name.
func (a *analysis) histogram(s *support, F []float64, name, g string, li, traces int, record bool) {
	if !record {
		return
	}
	for _, h := range a.rep.Histograms {
		if h.Name == name && h.Group == g && h.Level == a.rep.Levels[li].Level {
			return
		}
	}
	up, p := s.binProbabilities(F)
	a.rep.Histograms = append(a.rep.Histograms, Histogram{Name: name, Group: g, Level: a.rep.Levels[li].Level,
		Traces: traces, Discrete: s.discrete, Upper: up, P: p, X: slices.Clone(s.grid), F: slices.Clone(F)})
}

// rng returns the generator of one Monte Carlo permutation test: a PCG
// keyed by the run seed and FNV-1a of the test's identity, so the p-value
// does not depend on which other tests ran.
func (a *analysis) rng(parts ...string) *rand.Rand {
	h := fnv.New64a()
	for _, p := range parts {
		h.Write([]byte(p))
		h.Write([]byte{0})
	}
	return rand.New(rand.NewPCG(a.rep.Seed, h.Sum64()))
}

// bands summarises each metric per group and level for the figures.
func (a *analysis) bands() {
	rep := a.rep
	for _, m := range rep.Metrics {
		for _, g := range rep.Groups {
			for li, lv := range rep.Levels {
				ts := a.at(g, li)
				d := groups.Describe(values(ts, m))
				b := Band{Name: m, Group: g, Level: lv.Level, Param: lv.Param, N: d.N, Median: d.Median, Q1: d.Q1, Q3: d.Q3}
				for _, method := range rep.Methods {
					var mu, lo, hi []float64
					for _, t := range ts {
						if s, ok := t.surr[method][m]; ok && finite(s.Value) {
							mu, lo, hi = append(mu, s.Value), append(lo, s.Lo), append(hi, s.Hi)
						}
					}
					b.Methods = append(b.Methods, MethodBand{Method: method, Mean: medianFinite(mu), Lo: medianFinite(lo), Hi: medianFinite(hi)})
				}
				rep.Bands = append(rep.Bands, b)
			}
		}
	}
}

func medianFinite(v []float64) float64 {
	var f []float64
	for _, x := range v {
		if finite(x) {
			f = append(f, x)
		}
	}
	if len(f) == 0 {
		return math.NaN()
	}
	return groups.Quantile(sortedCopy(f), 0.5)
}

// adjust computes Holm and BH within each family, the significance flags
// and the attainability warnings.
func (a *analysis) adjust() {
	rep := a.rep
	var names []string
	members := map[string][]int{}
	for i, t := range rep.Tests {
		if _, ok := members[t.Family]; !ok {
			names = append(names, t.Family)
		}
		members[t.Family] = append(members[t.Family], i)
	}
	for _, name := range names {
		idx := members[name]
		p := make([]float64, len(idx))
		for k, i := range idx {
			p[k] = rep.Tests[i].P
		}
		holm, bh := groups.Holm(p), groups.BH(p)
		f := Family{Name: name, MinP: math.Inf(1)}
		for k, i := range idx {
			t := &rep.Tests[i]
			t.PHolm, t.PBH = holm[k], bh[k]
			adj := t.PHolm
			if a.o.Adjust == groups.AdjustBH {
				adj = t.PBH
			}
			t.Significant = !math.IsNaN(adj) && adj <= a.o.Alpha
			if t.Significant {
				f.Significant++
			}
			if !math.IsNaN(t.P) {
				f.Tests++
				f.MinP = math.Min(f.MinP, t.MinP)
			}
		}
		if f.Tests == 0 {
			f.MinP = math.NaN()
			rep.Families = append(rep.Families, f)
			continue
		}
		limit := a.o.Alpha / float64(f.Tests)
		if a.o.Adjust == groups.AdjustBH {
			limit = a.o.Alpha
		}
		f.Reachable = f.MinP <= limit*(1+1e-9)
		rep.Families = append(rep.Families, f)
	}
	a.warn()
}

// sortedKeys returns the keys of a set, sorted.
func sortedKeys(m map[string]bool) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

func boolKeys(m map[string]int) map[string]bool {
	out := make(map[string]bool, len(m))
	for k := range m {
		out[k] = true
	}
	return out
}

func sortedSeeds(m map[uint64]bool) []uint64 {
	out := make([]uint64, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	slices.Sort(out)
	return out
}

// orderNames orders metric or distribution names canonically.
func orderNames(m map[string]bool) []string {
	out := sortedKeys(m)
	slices.SortStableFunc(out, func(a, b string) int { return cmp.Compare(nameRank(a), nameRank(b)) })
	return out
}

// sortByKey sorts keys ascending and moves vals (of the same length)
// with them; equal keys keep their order.
func sortByKey[K cmp.Ordered, V any](keys []K, vals []V) {
	idx := make([]int, len(keys))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return keys[idx[a]] < keys[idx[b]] })
	k, v := make([]K, len(idx)), make([]V, len(idx))
	for i, j := range idx {
		k[i], v[i] = keys[j], vals[j]
	}
	copy(keys, k)
	copy(vals, v)
}

func sortedCopy(x []float64) []float64 {
	s := slices.Clone(x)
	sort.Float64s(s)
	return s
}
