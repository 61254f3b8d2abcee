package groups

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"sort"
	"sync"
)

// Compare compares groups of traces feature by feature.
//
// features names the entries of every Sample.Values (non-empty, no
// duplicates, ErrShape otherwise). Samples are grouped by Sample.Group;
// at least two groups are needed (ErrTooFewGroups).
//
// Pairs: each group against Options.Reference when it is set; otherwise all
// pairs when there are at most four groups (or Options.AllPairs); otherwise
// each group against the first. In a pair (A, B), differences and effect
// sizes are B relative to A.
//
// For every pair and feature, on the finite values of the two groups: the
// group Summary, the two-sided KS and Mann–Whitney tests, Cliff's δ, the
// Hodges–Lehmann shift and the median difference, raw and relative to the
// pooled MAD. The p-values of each test are adjusted (Options.Adjust)
// across the features within each pair (Options.Family = FamilyPair, the
// default) or across all pairs and features (FamilyAll); untested features
// (fewer than Options.MinSamples values in a group) are left out of the
// family. Significant marks adjusted p ≤ Options.Alpha for Options.Test.
//
// When some sample has a finite Param: for every feature and group, the
// median and quartiles of the feature at each parameter value and the
// Spearman correlation of the feature with the parameter, its p-value
// adjusted across features within the group.
//
// Named distributions in Sample.Distributions are pooled per group with
// equal weight per trace (see Distribution).
//
// Work is spread over Options.Workers goroutines with results placed by
// index: the Result is the same for any number of workers.
func Compare(features []string, samples []Sample, opts Options) (Result, error) {
	o, err := opts.resolve()
	if err != nil {
		return Result{}, fmt.Errorf("compare: %w", err)
	}
	if err := checkFeatures(features, samples); err != nil {
		return Result{}, fmt.Errorf("compare: %w", err)
	}
	res := Result{
		Features: append([]string(nil), features...),
		Settings: Settings{
			Alpha: o.Alpha, Adjust: o.Adjust, Family: o.Family, Test: o.Test,
			Reference: o.Reference, AllPairs: o.AllPairs, MinSamples: o.MinSamples,
			KSMethod: o.KS.Method, KSExactMax: o.KS.ExactMax,
			MWMethod: o.MW.Method, MWExactMax: o.MW.ExactMax,
		},
	}

	// Groups, in order, and their samples.
	order, members, err := groupSamples(samples, o.Groups)
	if err != nil {
		return Result{}, fmt.Errorf("compare: %w", err)
	}
	if skipped := len(samples) - countMembers(members); skipped > 0 {
		res.Notes = append(res.Notes, fmt.Sprintf("%d sample(s) in groups not selected were left out", skipped))
	}
	if len(order) < 2 {
		return Result{}, fmt.Errorf("compare: %d group(s) %q: %w", len(order), order, ErrTooFewGroups)
	}
	for _, g := range order {
		for _, i := range members[g] {
			s := samples[i]
			s.Values = append([]float64(nil), s.Values...)
			s.Distributions = nil
			res.Samples = append(res.Samples, s)
			if finite(s.Param) {
				res.HasParam = true
			}
		}
	}

	// values[g][f] = finite values of feature f in group g (sample order),
	// missing[g][f] = number of non-finite ones.
	nf := len(features)
	values := make([][][]float64, len(order))
	missing := make([][]int, len(order))
	for gi, g := range order {
		values[gi] = make([][]float64, nf)
		missing[gi] = make([]int, nf)
		for _, i := range members[g] {
			for f, v := range samples[i].Values {
				if finite(v) {
					values[gi][f] = append(values[gi][f], v)
				} else {
					missing[gi][f]++
				}
			}
		}
		info := GroupInfo{Name: g, Traces: len(members[g]), Summaries: make([]Summary, nf)}
		for f := range features {
			info.Summaries[f] = Describe(values[gi][f])
			info.Summaries[f].Missing = missing[gi][f]
		}
		levels := map[float64]bool{}
		for _, i := range members[g] {
			if p := samples[i].Param; finite(p) {
				info.WithParam++
				levels[p] = true
			}
		}
		info.Levels = sortedKeys(levels)
		res.Groups = append(res.Groups, info)
	}

	// Pairs.
	pairs, note, err := choosePairs(order, o)
	if err != nil {
		return Result{}, fmt.Errorf("compare: %w", err)
	}
	if note != "" {
		res.Notes = append(res.Notes, note)
	}
	index := make(map[string]int, len(order))
	for i, g := range order {
		index[g] = i
	}
	res.Pairs = make([]PairResult, len(pairs))
	type job struct{ p, f int }
	jobs := make([]job, 0, len(pairs)*nf)
	for pi, pr := range pairs {
		res.Pairs[pi] = PairResult{A: pr[0], B: pr[1], Tests: make([]FeatureTest, nf)}
		for f := range features {
			jobs = append(jobs, job{pi, f})
		}
	}
	parallel(len(jobs), o.Workers, func(k int) {
		j := jobs[k]
		a, b := index[res.Pairs[j.p].A], index[res.Pairs[j.p].B]
		t := compareFeature(values[a][j.f], values[b][j.f], o)
		t.Feature = features[j.f]
		t.A, t.B = res.Groups[a].Summaries[j.f], res.Groups[b].Summaries[j.f]
		res.Pairs[j.p].Tests[j.f] = t
	})
	if err := adjustPairs(res.Pairs, o); err != nil {
		return Result{}, fmt.Errorf("compare: %w", err)
	}

	if res.HasParam {
		curves, notes, err := paramCurves(features, order, members, samples, o)
		if err != nil {
			return Result{}, fmt.Errorf("compare: %w", err)
		}
		res.Curves = curves
		res.Notes = append(res.Notes, notes...)
	}
	res.Distributions = poolDistributions(order, members, samples, o.DistributionPoints)
	return res, nil
}

// checkFeatures validates the feature list and the vector lengths.
func checkFeatures(features []string, samples []Sample) error {
	if len(features) == 0 {
		return fmt.Errorf("empty feature list: %w", ErrShape)
	}
	seen := make(map[string]bool, len(features))
	for _, f := range features {
		if seen[f] {
			return fmt.Errorf("feature %q listed twice: %w", f, ErrShape)
		}
		seen[f] = true
	}
	for i, s := range samples {
		if len(s.Values) != len(features) {
			name := s.File
			if name == "" {
				name = fmt.Sprintf("sample %d", i)
			}
			return fmt.Errorf("%s: %d values for %d features: %w", name, len(s.Values), len(features), ErrShape)
		}
	}
	return nil
}

// groupSamples returns the group names in order and the sample indices of
// each group.
func groupSamples(samples []Sample, want []string) ([]string, map[string][]int, error) {
	all := map[string][]int{}
	var seen []string
	for i, s := range samples {
		if _, ok := all[s.Group]; !ok {
			seen = append(seen, s.Group)
		}
		all[s.Group] = append(all[s.Group], i)
	}
	if len(want) == 0 {
		return seen, all, nil
	}
	members := map[string][]int{}
	var order []string
	for _, g := range want {
		if _, dup := members[g]; dup {
			continue
		}
		idx, ok := all[g]
		if !ok {
			return nil, nil, fmt.Errorf("group %q has no samples: %w", g, ErrUnknownGroup)
		}
		members[g] = idx
		order = append(order, g)
	}
	return order, members, nil
}

func countMembers(m map[string][]int) int {
	n := 0
	for _, v := range m {
		n += len(v)
	}
	return n
}

func sortedKeys(m map[float64]bool) []float64 {
	out := make([]float64, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Float64s(out)
	return out
}

// choosePairs returns the (A, B) pairs to compare and a note on the
// choice.
func choosePairs(order []string, o Options) ([][2]string, string, error) {
	var pairs [][2]string
	ref := o.Reference
	note := ""
	if ref == "" && !o.AllPairs && len(order) > 4 {
		ref = order[0]
		note = fmt.Sprintf("%d groups: each compared against the first, %q (set a reference group or ask for all pairs to change this)", len(order), ref)
	}
	if ref != "" {
		found := false
		for _, g := range order {
			if g == ref {
				found = true
			}
		}
		if !found {
			return nil, "", fmt.Errorf("reference group %q: %w", ref, ErrUnknownGroup)
		}
		for _, g := range order {
			if g != ref {
				pairs = append(pairs, [2]string{ref, g})
			}
		}
		return pairs, note, nil
	}
	for i := range order {
		for j := i + 1; j < len(order); j++ {
			pairs = append(pairs, [2]string{order[i], order[j]})
		}
	}
	return pairs, note, nil
}

// compareFeature computes the tests and effect sizes of one feature for
// the finite values a (group A) and b (group B).
func compareFeature(a, b []float64, o Options) FeatureTest {
	nan := math.NaN()
	t := FeatureTest{
		KS:    KSResult{D: nan, P: nan, N: len(a), M: len(b)},
		MW:    MWResult{U: nan, P: nan, Z: nan, N: len(a), M: len(b)},
		KSAdj: nan, MWAdj: nan,
		CliffDelta: nan, HodgesLehmann: nan, MedianDiff: nan, MedianDiffMAD: nan,
	}
	if len(a) > 0 && len(b) > 0 {
		t.CliffDelta = CliffDelta(a, b)
		t.Magnitude = CliffMagnitude(t.CliffDelta)
		t.HodgesLehmann = HodgesLehmann(a, b)
		sa, sb := sortedCopy(a), sortedCopy(b)
		ma, mb := Quantile(sa, 0.5), Quantile(sb, 0.5)
		t.MedianDiff = mb - ma
		if len(a)+len(b) > 2 {
			da, db := madNormal*rawMAD(sa, ma), madNormal*rawMAD(sb, mb)
			pooled := math.Sqrt((float64(len(a)-1)*da*da + float64(len(b)-1)*db*db) / float64(len(a)+len(b)-2))
			if pooled > 0 {
				t.MedianDiffMAD = t.MedianDiff / pooled
			}
		}
	}
	if len(a) < o.MinSamples || len(b) < o.MinSamples {
		t.Note = fmt.Sprintf("not tested: %d and %d values (need at least %d per group)", len(a), len(b), o.MinSamples)
		return t
	}
	t.Tested = true
	ks, err := KS(a, b, o.KS)
	if err == nil {
		t.KS = ks
	}
	mw, err := MannWhitney(a, b, o.MW)
	if errors.Is(err, ErrTiesExact) {
		mwo := o.MW
		mwo.Method = MethodAsymptotic
		mw, err = MannWhitney(a, b, mwo)
		t.Note = "tied values: Mann–Whitney p from the tie-corrected normal approximation"
	}
	if err == nil {
		t.MW = mw
	}
	return t
}

// adjustPairs fills KSAdj, MWAdj and Significant.
func adjustPairs(pairs []PairResult, o Options) error {
	type ref struct{ p, f int }
	var families [][]ref
	if o.Family == FamilyAll {
		var all []ref
		for p := range pairs {
			for f := range pairs[p].Tests {
				all = append(all, ref{p, f})
			}
		}
		families = append(families, all)
	} else {
		for p := range pairs {
			fam := make([]ref, len(pairs[p].Tests))
			for f := range fam {
				fam[f] = ref{p, f}
			}
			families = append(families, fam)
		}
	}
	for _, fam := range families {
		ks := make([]float64, len(fam))
		mw := make([]float64, len(fam))
		for i, r := range fam {
			t := &pairs[r.p].Tests[r.f]
			ks[i], mw[i] = math.NaN(), math.NaN()
			if t.Tested {
				ks[i], mw[i] = t.KS.P, t.MW.P
			}
		}
		ksAdj, err := Adjust(ks, o.Adjust)
		if err != nil {
			return err
		}
		mwAdj, err := Adjust(mw, o.Adjust)
		if err != nil {
			return err
		}
		for i, r := range fam {
			t := &pairs[r.p].Tests[r.f]
			t.KSAdj, t.MWAdj = ksAdj[i], mwAdj[i]
			p := t.MWAdj
			if o.Test == TestKS {
				p = t.KSAdj
			}
			t.Significant = t.Tested && p <= o.Alpha
		}
	}
	for p := range pairs {
		pairs[p].Significant = 0
		for _, t := range pairs[p].Tests {
			if t.Significant {
				pairs[p].Significant++
			}
		}
	}
	return nil
}

// paramCurves computes the feature-versus-parameter curves.
func paramCurves(features []string, order []string, members map[string][]int, samples []Sample, o Options) ([]Curve, []string, error) {
	var notes []string
	curves := make([]Curve, len(features)*len(order))
	for gi, g := range order {
		idx := members[g]
		noParam := 0
		for _, i := range idx {
			if !finite(samples[i].Param) {
				noParam++
			}
		}
		if noParam > 0 {
			notes = append(notes, fmt.Sprintf("group %q: %d of %d traces have no parameter value and are left out of the parameter curves", g, noParam, len(idx)))
		}
		pvals := make([]float64, len(features))
		for f, name := range features {
			byLevel := map[float64][]float64{}
			var xs, ys []float64
			for _, i := range idx {
				p := samples[i].Param
				if !finite(p) {
					continue
				}
				v := samples[i].Values[f]
				byLevel[p] = append(byLevel[p], v)
				xs = append(xs, p)
				ys = append(ys, v)
			}
			levels := make(map[float64]bool, len(byLevel))
			for p := range byLevel {
				levels[p] = true
			}
			c := Curve{Feature: name, Group: g}
			for _, p := range sortedKeys(levels) {
				s := Describe(byLevel[p])
				c.Levels = append(c.Levels, Level{Param: p, N: s.N, Missing: s.Missing, Median: s.Median, Q1: s.Q1, Q3: s.Q3})
			}
			c.Spearman = Spearman(xs, ys)
			switch {
			case len(byLevel) == 0:
				c.Note = "no trace with a parameter value"
			case len(byLevel) == 1:
				c.Note = "a single parameter value: no correlation"
			case c.Spearman.N < 3:
				c.Note = fmt.Sprintf("%d traces with both values: no correlation (need at least 3)", c.Spearman.N)
			case math.IsNaN(c.Spearman.Rho):
				c.Note = "feature constant: no correlation"
			}
			pvals[f] = c.Spearman.P
			curves[f*len(order)+gi] = c
		}
		adj, err := Adjust(pvals, o.Adjust)
		if err != nil {
			return nil, nil, err
		}
		for f := range features {
			curves[f*len(order)+gi].PAdj = adj[f]
		}
	}
	return curves, notes, nil
}

// parallel runs fn(0…n−1) on at most workers goroutines (0: GOMAXPROCS).
func parallel(n, workers int, fn func(int)) {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, n)
	if workers <= 1 {
		for i := 0; i < n; i++ {
			fn(i)
		}
		return
	}
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				fn(i)
			}
		}()
	}
	for i := 0; i < n; i++ {
		next <- i
	}
	close(next)
	wg.Wait()
}
