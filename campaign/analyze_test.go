package campaign

import (
	"bytes"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// synthetic builds a table: 8 devices measured fresh and stressed at
// three biases. Metric "hv_tail_exprate" = device effect (sd 1) + 0.5·bias,
// plus 1 when stressed, plus small noise; "dx_kurt_ex" is noise only. Every
// trace has shuffle surrogates whose mean is the original minus 0.5 for
// hv_tail_exprate and the original plus noise for dx_kurt_ex; one discrete and
// one continuous distribution per trace, heavier in stressed.
func synthetic(seed uint64) []Row {
	rng := rand.New(rand.NewPCG(seed, 1))
	var rows []Row
	nan := math.NaN()
	for d := 1; d <= 8; d++ {
		dev := rng.NormFloat64()
		for _, g := range []string{"fresh", "stressed"} {
			for _, lv := range []string{"0.60", "0.90", "1.20"} {
				bias := map[string]float64{"0.60": 0.6, "0.90": 0.9, "1.20": 1.2}[lv]
				id := fmt.Sprintf("%s/D%02d_%s.csv", g, d, lv)
				base := Row{Kind: KindMetric, File: id, Group: g, Device: fmt.Sprintf("D%02d", d), Parameter: "bias_V", Level: lv,
					Samples: 4096, Seed: 5, X: nan, SD: nan, Lo: nan, Hi: nan, PRank: nan}
				lam := dev + 0.5*bias + 0.05*rng.NormFloat64()
				if g == "stressed" {
					lam++
				}
				kurt := rng.NormFloat64()
				for _, m := range []struct {
					name       string
					orig, surr float64
				}{{"hv_tail_exprate", lam, lam - 0.5 + 0.01*rng.NormFloat64()}, {"dx_kurt_ex", kurt, kurt + 0.3*rng.NormFloat64()}} {
					r := base
					r.Condition, r.Name, r.Value, r.N = Original, m.name, m.orig, 1
					rows = append(rows, r)
					r = base
					r.Condition, r.Name, r.Value, r.SD, r.Lo, r.Hi, r.N, r.Count = "shuffle", m.name, m.surr, 0.1, m.surr-0.2, m.surr+0.2, 19, 19
					r.PRank = 0.1
					rows = append(rows, r)
				}
				heavy := 0.0
				if g == "stressed" {
					heavy = 1
				}
				for k := 2; k <= 8; k++ {
					r := base
					r.Kind, r.Condition, r.Name, r.X = KindDistribution, Original, DistHVGDegree, float64(k)
					r.Value = math.Round(1000 * math.Pow(2.0/3+0.1*heavy, float64(k)))
					rows = append(rows, r)
				}
				for k := 0; k < 16; k++ {
					r := base
					r.Kind, r.Condition, r.Name = KindDistribution, Original, DistNVGClustering
					r.X, r.Value = rng.Float64()+0.2*heavy, 1
					rows = append(rows, r)
				}
			}
		}
	}
	return rows
}

func find(rep Report, question, test, name, level, group string) *Test {
	for i := range rep.Tests {
		t := &rep.Tests[i]
		if t.Question == question && t.Test == test && t.Name == name && t.Level == level && (group == "" || t.Group == group || t.B == group) {
			return t
		}
	}
	return nil
}

// TestAnalyzeSynthetic: the paired test finds the stress shift that the
// device-to-device spread hides from the unpaired ones; the trend and the
// surrogate shift are found; the null metric is not.
func TestAnalyzeSynthetic(t *testing.T) {
	rep, err := Analyze(synthetic(1), AnalyzeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	bh, err := Analyze(synthetic(1), AnalyzeOptions{Adjust: "bh"})
	if err != nil {
		t.Fatal(err)
	}
	if rep.Traces != 48 || len(rep.Levels) != 3 || rep.Reference != "fresh" || rep.Levels[0].Paired != 8 {
		t.Fatalf("layout: %d traces, levels %+v, reference %s", rep.Traces, rep.Levels, rep.Reference)
	}
	for _, lv := range []string{"0.60", "0.90", "1.20"} {
		sr := find(rep, QuestionGroups, TestSignedRank, "hv_tail_exprate", lv, "stressed")
		// All 8 paired differences ≈ +1: W⁺ = 36, exact p = 2/2^8 (Wilcoxon 1945).
		if sr == nil || sr.P != 2.0/256 || !sr.Significant || math.Abs(sr.Estimate-1) > 0.1 || sr.Effect != 1 {
			t.Errorf("%s: signed-rank %+v", lv, sr)
		}
		if null := find(rep, QuestionGroups, TestSignedRank, "dx_kurt_ex", lv, "stressed"); null == nil || null.Significant {
			t.Errorf("%s: null metric significant: %+v", lv, null)
		}
		// Original − surrogate mean ≈ 0.5 in all 8 traces: p = 2/2^8, but
		// Holm over the 12 tests of the family needs 0.05/12 < 2/2^8, so
		// only BH (12·(2/256)/6 = 0.0156 ≤ 0.05) can flag them.
		for _, g := range []string{"fresh", "stressed"} {
			s := find(rep, QuestionSurrogate, TestSignedRank, "hv_tail_exprate", lv, g)
			b := find(bh, QuestionSurrogate, TestSignedRank, "hv_tail_exprate", lv, g)
			if s == nil || s.P != 2.0/256 || math.Abs(s.Estimate-0.5) > 0.05 || s.Significant || !b.Significant || b.PBH != 12*(2.0/256)/6 {
				t.Errorf("%s %s: surrogate test %+v", lv, g, s)
			}
		}
	}
	for _, g := range []string{"fresh", "stressed"} {
		tr := find(rep, QuestionTrend, TestSpearman, "hv_tail_exprate", "", g)
		if tr == nil || !(tr.Low <= 0.5 && 0.5 <= tr.High) || tr.Effect <= 0 {
			t.Errorf("%s: trend %+v; the true slope 0.5 should lie in the interval", g, tr)
		}
	}
	if d := find(rep, QuestionDistribution, TestPermChi, DistHVGDegree, "0.60", "stressed"); d == nil || !strings.Contains(d.Note, "one per distinct value") || d.P != 2.0/12870 {
		t.Errorf("discrete distribution: %+v (every relabelling but the observed and its swap is less extreme: p = 2/C(16, 8))", d)
	}
	// Binning on the distinct values of a discrete distribution: degrees
	// 2…8, one bin each (not bins of fixed width).
	for _, h := range rep.Histograms {
		if h.Name == DistHVGDegree && h.Level == "0.60" {
			if !h.Discrete || len(h.Upper) != 7 || h.Upper[0] != 2 || h.Upper[6] != 8 {
				t.Errorf("%s histogram: discrete %v, bins %v", h.Group, h.Discrete, h.Upper)
			}
		}
	}
	if d := find(rep, QuestionDistribution, TestPermKS, DistNVGClustering, "0.60", "stressed"); d == nil || !strings.Contains(find(rep, QuestionDistribution, TestPermChi, DistNVGClustering, "0.60", "stressed").Note, "equal pooled probability") {
		t.Errorf("continuous distribution: %+v", d)
	}
	// Per trace: 19 surrogates and two tests per trace family; the rank
	// test needs 2/(N+1) ≤ 0.05/2, N ≥ 79 (Theiler et al. 1992 with
	// Holm's first step). The surrogate family needs 2/2^k ≤ 0.05/12,
	// k ≥ 9 traces.
	want := []string{"At least 79 surrogates per method", "surrogate/shuffle: Holm over its 12 tests", "at least 9 traces per group and level"}
	all := strings.Join(rep.Warnings, "\n")
	for _, w := range want {
		if !strings.Contains(all, w) {
			t.Errorf("warnings lack %q: %q", w, rep.Warnings)
		}
	}
	if len(bh.Warnings) != 1 {
		t.Errorf("BH warnings %q, want only the per-trace one (2/20 > 0.05)", bh.Warnings)
	}
	for _, f := range rep.Families {
		if strings.HasPrefix(f.Name, "groups/signed-rank") && !f.Reachable {
			t.Errorf("%s: 8 pairs and 6 tests should be reachable (2/256 ≤ 0.05/6)", f.Name)
		}
	}
}

// TestAnalyzeFromTable: the report from the table read back from CSV, and
// from the rows in any order, is byte for byte the report of the rows.
func TestAnalyzeFromTable(t *testing.T) {
	rows := synthetic(2)
	render := func(rows []Row) string {
		rep, err := Analyze(rows, AnalyzeOptions{})
		if err != nil {
			t.Fatal(err)
		}
		var b bytes.Buffer
		if err := WriteTestsCSV(&b, rep); err != nil {
			t.Fatal(err)
		}
		if err := WriteSummary(&b, rep, MarkdownOptions{}); err != nil {
			t.Fatal(err)
		}
		for li := range rep.Levels {
			if err := WriteLevel(&b, rep, li, MarkdownOptions{}); err != nil {
				t.Fatal(err)
			}
		}
		return b.String()
	}
	want := render(rows)
	var csvb bytes.Buffer
	SortRows(rows)
	if err := WriteTableCSV(&csvb, rows); err != nil {
		t.Fatal(err)
	}
	back, err := ReadTableCSV(bytes.NewReader(csvb.Bytes()), "table")
	if err != nil {
		t.Fatal(err)
	}
	var again bytes.Buffer
	WriteTableCSV(&again, back)
	if again.String() != csvb.String() {
		t.Fatal("table does not round-trip through CSV")
	}
	if got := render(back); got != want {
		t.Error("report from the CSV table differs")
	}
	rng := rand.New(rand.NewPCG(3, 3))
	rng.Shuffle(len(back), func(i, j int) { back[i], back[j] = back[j], back[i] })
	if got := render(back); got != want {
		t.Error("report depends on the row order")
	}
	dup := append(back, back[0])
	if _, err := Analyze(dup, AnalyzeOptions{}); err == nil {
		t.Error("a row given twice was accepted")
	}
}

// TestPermutationExact: the exact enumeration visits C(n, k) relabellings;
// identical traces give p = 1; completely separated groups of 4 give the
// smallest p, 2/C(8, 4) (the observed labelling and its swap).
func TestPermutationExact(t *testing.T) {
	idx := []int{0, 1, 2}
	n := 1
	for nextCombination(idx, 7) {
		n++
	}
	if n != 35 {
		t.Errorf("%d combinations of 3 from 7, want 35", n)
	}
	same := make([]*Distribution, 8)
	sep := make([]*Distribution, 8)
	for i := range same {
		same[i] = &Distribution{X: []float64{1, 2, 3}, W: []float64{1, 2, 1}}
		off := 0.0
		if i >= 4 {
			off = 10
		}
		sep[i] = &Distribution{X: []float64{1 + off, 2 + off}, W: []float64{1, 1}}
	}
	r := newSupport(same).twoSample(4, 4, 1000, 0, nil)
	if r.PKS != 1 || r.PChi != 1 || !r.Exact || r.Relabelings != 70 {
		t.Errorf("identical traces: %+v", r)
	}
	r = newSupport(sep).twoSample(4, 4, 1000, 0, nil)
	if r.KS != 1 || r.PKS != 2.0/70 || r.PChi != 2.0/70 || r.MinP != 2.0/70 {
		t.Errorf("separated traces: %+v", r)
	}
	// Monte Carlo when the enumeration is too large: p = (1 + b)/(B + 1).
	r = newSupport(sep).twoSample(4, 4, 10, 999, rand.New(rand.NewPCG(1, 1)))
	if r.Exact || r.PKS < 1.0/1000 || r.PKS > 0.06 {
		t.Errorf("Monte Carlo: %+v", r)
	}
}
