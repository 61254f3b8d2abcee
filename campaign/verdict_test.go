package campaign

import (
	"bytes"
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/networks"
)

// TestVerdictRows: a verdict goes into the table as one row per class
// (the verdict's class marked n = 1; an undetermined verdict adds a row of
// its own), reads back from CSV, and comes out of Analyze in the
// canonical trace order with its classes sorted, whatever the row order.
func TestVerdictRows(t *testing.T) {
	tr := Trace{ID: "b.csv", Group: "g", Device: "D1", Level: "1.0"}
	rec := Record{Trace: tr, Samples: 100, Verdict: &Verdict{Class: "stochastic",
		Classes: []string{"stochastic", "chaotic", "regular"}, Probabilities: []float64{0.7, 0.2, 0.1}, Model: "m1"}}
	rows := Rows(rec, "bias_V")
	if len(rows) != 3 {
		t.Fatalf("%d verdict rows, want 3", len(rows))
	}
	for _, r := range rows {
		if r.Kind != KindVerdict || (r.N == 1) != (r.Name == "stochastic") || r.Condition != "m1" {
			t.Errorf("row %+v", r)
		}
	}
	und := rec
	und.Trace.ID, und.Trace.Level = "a.csv", "0.5"
	und.Verdict = &Verdict{Class: Undetermined, Classes: []string{"chaotic", "regular", "stochastic"}, Probabilities: []float64{0.4, 0.2, 0.4}, Model: "m1"}
	urows := Rows(und, "bias_V")
	if len(urows) != 4 || urows[3].Name != Undetermined || urows[3].N != 1 || !math.IsNaN(urows[3].Value) {
		t.Fatalf("undetermined rows %+v", urows)
	}
	// Analyze needs metrics too: one per trace.
	all := append(rows, urows...)
	for _, id := range []string{"a.csv", "b.csv"} {
		r := rows[0]
		r.Kind, r.File, r.Name, r.Value, r.N = KindMetric, id, "m", 1, 1
		if id == "a.csv" {
			r.Level = "0.5"
		}
		all = append(all, r)
	}
	slices.Reverse(all)
	SortRows(all)
	var b bytes.Buffer
	if err := WriteTableCSV(&b, all); err != nil {
		t.Fatal(err)
	}
	back, err := ReadTableCSV(&b, "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	slices.Reverse(back)
	rep, err := Analyze(back, AnalyzeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Verdicts) != 2 {
		t.Fatalf("verdicts %+v", rep.Verdicts)
	}
	a, v := rep.Verdicts[0], rep.Verdicts[1]
	if a.File != "a.csv" || a.Class != Undetermined || a.Level != "0.5" {
		t.Errorf("first verdict %+v", a)
	}
	if v.File != "b.csv" || v.Class != "stochastic" || v.Top != "stochastic" ||
		!slices.Equal(v.Classes, []string{"chaotic", "regular", "stochastic"}) || !slices.Equal(v.Probabilities, []float64{0.2, 0.1, 0.7}) {
		t.Errorf("second verdict %+v", v)
	}
	if got := rep.VerdictClasses(); !slices.Equal(got, []string{"chaotic", "regular", "stochastic", Undetermined}) {
		t.Errorf("classes %v", got)
	}
	if got := rep.VerdictModels(); !slices.Equal(got, []string{"m1"}) {
		t.Errorf("models %v", got)
	}
	// The rows of one trace must name one model.
	var mixed []Row
	for _, r := range back {
		if r.Kind == KindVerdict && r.File == "b.csv" && r.Name == "regular" {
			r.Condition = "m2"
		}
		mixed = append(mixed, r)
	}
	if _, err := Analyze(mixed, AnalyzeOptions{}); !errors.Is(err, ErrTable) || !strings.Contains(err.Error(), "different models") {
		t.Errorf("mixed models: %v", err)
	}
	// Rows that mark no class as the verdict are refused.
	var bad []Row
	for _, r := range back {
		if r.Kind == KindVerdict {
			r.N = 0
		}
		bad = append(bad, r)
	}
	if _, err := Analyze(bad, AnalyzeOptions{}); !errors.Is(err, ErrTable) || !strings.Contains(err.Error(), "no class") {
		t.Errorf("verdict without class: %v", err)
	}
}

// TestTails: the pooled HVG degree counts of i.i.d.-like traces (each the
// law P(k) = (1/3)(2/3)^{k−2}, Luque et al., Phys. Rev. E 80 (2009)
// 046103, rounded to whole nodes) are the sum of the traces' counts, and
// their fit is networks.ExponentialTailCounts of that sum, with λ within
// 4 standard errors of ln(3/2). A trace stored as quantiles is scaled to
// its length and flagged.
func TestTails(t *testing.T) {
	nan := math.NaN()
	var rows []Row
	var want []int64
	for d := 0; d < 4; d++ {
		var counts []float64
		total := 0
		for k := 2; k <= 40; k++ {
			c := math.Round(float64(2000+500*d) * math.Pow(2.0/3, float64(k-2)) / 3)
			counts = append(counts, c)
			total += int(c)
		}
		base := Row{File: string(rune('a' + d)), Group: "g", Device: "D", Level: "1", Samples: total, X: nan, SD: nan, Lo: nan, Hi: nan, PRank: nan, Condition: Original}
		m := base
		m.Kind, m.Name, m.Value, m.N = KindMetric, "m", 1, 1
		rows = append(rows, m)
		for i, c := range counts {
			if c == 0 {
				continue
			}
			r := base
			r.Kind, r.Name, r.X, r.Value = KindDistribution, DistHVGDegree, float64(i+2), c
			rows = append(rows, r)
			for len(want) <= i+2 {
				want = append(want, 0)
			}
			want[i+2] += int64(c)
		}
	}
	rep, err := Analyze(rows, AnalyzeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Tails) != 1 {
		t.Fatalf("tails %+v", rep.Tails)
	}
	tl := rep.Tails[0]
	f, err := networks.ExponentialTailCounts(want, networks.TailOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if tl.Sketched || tl.Traces != 4 || tl.Exponent != f.Lambda || tl.KMin != f.KMin || tl.Law != LawExponential {
		t.Errorf("tail %+v, want the fit %+v of the summed counts", tl, f)
	}
	if math.Abs(tl.Exponent-math.Log(1.5)) > 4*tl.StdErr {
		t.Errorf("λ = %v ± %v, want ln(3/2)", tl.Exponent, tl.StdErr)
	}
	sum := 0.0
	for _, p := range tl.P {
		sum += p
	}
	if math.Abs(sum-1) > 1e-12 || tl.K[0] != 2 {
		t.Errorf("P sums to %v, first degree %d", sum, tl.K[0])
	}
	// A trace longer than its stored weights (quantiles) is scaled up:
	// trace a's weights count twice.
	var countA int64
	for i := range rows {
		if rows[i].File == "a" {
			rows[i].Samples *= 2
			if rows[i].Kind == KindDistribution {
				countA += int64(rows[i].Value)
			}
		}
	}
	rep, err = Analyze(rows, AnalyzeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if tl := rep.Tails[0]; !tl.Sketched || tl.Nodes != sumOf(want)+countA {
		t.Errorf("scaled tail %+v", tl)
	}
}

func sumOf(v []int64) int64 {
	var s int64
	for _, x := range v {
		s += x
	}
	return s
}
