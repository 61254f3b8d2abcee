package groups

import (
	"bytes"
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// iidSamples makes two groups of n traces whose nf features are drawn
// independently; features listed in shifted get +shift standard
// deviations in group "B".
func iidSamples(rng *rand.Rand, n, nf int, shift float64, shifted map[int]bool) ([]string, []Sample) {
	features := make([]string, nf)
	for f := range features {
		features[f] = "f" + itoa(f)
	}
	var out []Sample
	for _, g := range []string{"A", "B"} {
		for i := 0; i < n; i++ {
			v := make([]float64, nf)
			for f := range v {
				v[f] = rng.NormFloat64()
				if f%3 == 1 {
					v[f] = math.Exp(v[f]) // skewed feature
				}
				if g == "B" && shifted[f] {
					v[f] += shift
				}
			}
			out = append(out, Sample{File: g + itoa(i), Group: g, Param: math.NaN(), Values: v})
		}
	}
	return features, out
}

// TestCompareNull: two groups of 15 from the same process, 8 independent
// features, 400 repetitions. Holm controls the family-wise error rate at
// α (Holm 1979), so the fraction of repetitions with any significant
// feature must be ≤ 0.05 + 4·√(0.05·0.95/400) = 0.094; on average far
// fewer than one feature in a hundred is flagged.
func TestCompareNull(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 32))
	const reps = 400
	anySig, flagged, total := 0, 0, 0
	for r := 0; r < reps; r++ {
		features, samples := iidSamples(rng, 15, 8, 0, nil)
		res, err := Compare(features, samples, Options{Workers: 1})
		if err != nil {
			t.Fatal(err)
		}
		p := res.Pairs[0]
		if p.Significant > 0 {
			anySig++
		}
		flagged += p.Significant
		total += len(p.Tests)
	}
	rate := float64(anySig) / reps
	t.Logf("null: %d of %d repetitions with a significant feature (%.3f); %d of %d features flagged", anySig, reps, rate, flagged, total)
	if rate > 0.094 {
		t.Errorf("family-wise error rate %.3f > 0.094", rate)
	}
}

// TestCompareShift: 4 of 8 features (normal ones) shifted by 2 SD in
// group B (n = 15).
// Per-feature Mann–Whitney power at d = 2, n = 15 and the strictest Holm
// level 0.05/8 is about 0.99 (normal theory: noncentrality 2·√7.5 = 5.48,
// z = 2.73, Φ(2.75) = 0.997, with the efficiency 3/π of Mann–Whitney
// against the t-test for normal data, Hodges & Lehmann 1956), so over 100
// repetitions at least 90 % of the shifted features must be found, and the unshifted ones must stay
// below the family-wise error rate bound (≤ 0.05 + 4 SD per repetition).
func TestCompareShift(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	shifted := map[int]bool{0: true, 2: true, 3: true, 5: true}
	const reps = 100
	found, falseRep := 0, 0
	for r := 0; r < reps; r++ {
		features, samples := iidSamples(rng, 15, 8, 2, shifted)
		res, err := Compare(features, samples, Options{})
		if err != nil {
			t.Fatal(err)
		}
		anyFalse := false
		for f, ft := range res.Pairs[0].Tests {
			if ft.Significant && shifted[f] {
				found++
				if ft.CliffDelta <= 0 || ft.HodgesLehmann <= 0 {
					t.Errorf("shift found with the wrong sign: δ %v HL %v", ft.CliffDelta, ft.HodgesLehmann)
				}
			}
			if ft.Significant && !shifted[f] {
				anyFalse = true
			}
		}
		if anyFalse {
			falseRep++
		}
	}
	t.Logf("shift: found %d of %d shifted features; %d repetitions with a false positive", found, 4*reps, falseRep)
	if float64(found) < 0.9*4*reps {
		t.Errorf("found %d of %d shifted features", found, 4*reps)
	}
	if float64(falseRep)/reps > 0.05+4*math.Sqrt(0.05*0.95/reps) {
		t.Errorf("%d repetitions with a false positive", falseRep)
	}
}

// TestCompareDemo checks the structure of a full comparison with a
// parameter and distributions: the shifted features are flagged, the
// Spearman correlation of hv_tail_exprate with the bias is found in both
// groups (built in with slope 0.1 per volt against noise 0.05), the
// curves hold the 5 levels with 6 traces each, and the pooled degree
// distribution has median 3 for P(k) = (1/3)(2/3)^(k−3) (Luque et al.,
// Phys. Rev. E 80 (2009) 046103: the HVG of an i.i.d. series; our
// synthetic degrees follow it by construction, median 3 as
// P(k = 3) = 1/3 < ½ ≤ P(k ≤ 4) = 5/9).
func TestCompareDemo(t *testing.T) {
	levels := []float64{-1, -0.5, 0, 0.5, 1}
	samples := demoSamples(1, 6, levels, 3)
	res, err := Compare(demoFeatures, samples, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Pairs) != 1 || res.Pairs[0].A != "fresh" || res.Pairs[0].B != "stressed" {
		t.Fatalf("pairs %+v", res.Pairs)
	}
	tests := res.Pairs[0].Tests
	for _, f := range []int{0, 2} {
		if !tests[f].Significant {
			t.Errorf("%s not significant: %+v", demoFeatures[f], tests[f])
		}
	}
	if !res.HasParam || len(res.Curves) != len(demoFeatures)*2 {
		t.Fatalf("curves: %d", len(res.Curves))
	}
	for gi := 0; gi < 2; gi++ {
		c := res.Curves[2*2+gi] // hv_tail_exprate
		if c.Feature != "hv_tail_exprate" || len(c.Levels) != 5 || c.Levels[0].N != 6 {
			t.Errorf("curve %+v", c)
		}
		if c.Spearman.Rho < 0.5 || c.PAdj > 0.01 {
			t.Errorf("%s: ρ %v p adj %v", c.Group, c.Spearman.Rho, c.PAdj)
		}
	}
	if len(res.Distributions) != 2 || res.Distributions[0].Name != "hvg_degree" {
		t.Fatalf("distributions %+v", res.Distributions)
	}
	if d := res.Distributions[0]; d.Median != 3 || d.Traces != 30 || d.Min < 2 {
		t.Errorf("fresh degree distribution: %+v", d)
	}
	if len(res.Samples) != len(samples) || res.Samples[0].Distributions != nil {
		t.Error("samples not copied without distributions")
	}
}

// TestComparePairs checks the choice of pairs, the reference group, group
// selection and FamilyAll.
func TestComparePairs(t *testing.T) {
	rng := rand.New(rand.NewPCG(51, 52))
	mk := func(groups ...string) []Sample {
		var out []Sample
		for _, g := range groups {
			for i := 0; i < 5; i++ {
				out = append(out, Sample{Group: g, Param: math.NaN(), Values: []float64{rng.NormFloat64(), rng.NormFloat64()}})
			}
		}
		return out
	}
	feats := []string{"x", "y"}
	pairNames := func(r Result) string {
		var s []string
		for _, p := range r.Pairs {
			s = append(s, p.A+"-"+p.B)
		}
		return strings.Join(s, ",")
	}
	cases := []struct {
		groups []string
		opts   Options
		want   string
	}{
		{[]string{"a", "b", "c"}, Options{}, "a-b,a-c,b-c"},
		{[]string{"a", "b", "c"}, Options{Reference: "b"}, "b-a,b-c"},
		{[]string{"a", "b", "c", "d", "e"}, Options{}, "a-b,a-c,a-d,a-e"},
		{[]string{"a", "b", "c", "d", "e"}, Options{AllPairs: true}, "a-b,a-c,a-d,a-e,b-c,b-d,b-e,c-d,c-e,d-e"},
		{[]string{"a", "b", "c"}, Options{Groups: []string{"c", "a"}}, "c-a"},
	}
	for _, c := range cases {
		r, err := Compare(feats, mk(c.groups...), c.opts)
		if err != nil {
			t.Fatal(err)
		}
		if got := pairNames(r); got != c.want {
			t.Errorf("%v %+v: pairs %s, want %s", c.groups, c.opts, got, c.want)
		}
	}
	// FamilyAll adjusts over all pairs × features: Holm's factor is then
	// the total number of tests, 3 pairs × 2 features = 6, for the
	// smallest p (Holm 1979).
	r, _ := Compare(feats, mk("a", "b", "c"), Options{Family: FamilyAll, Adjust: AdjustHolm})
	minP, minAdj := 2.0, 0.0
	for _, p := range r.Pairs {
		for _, ft := range p.Tests {
			if ft.MW.P < minP {
				minP, minAdj = ft.MW.P, ft.MWAdj
			}
		}
	}
	if !near(minAdj, math.Min(1, 6*minP), 1e-15, 1e-14) {
		t.Errorf("FamilyAll: smallest p %v adjusted %v, want %v", minP, minAdj, 6*minP)
	}
}

// TestCompareSmallGroups: a group with 2 traces or with too many missing
// values is not tested; the note says why and effect sizes remain.
func TestCompareSmallGroups(t *testing.T) {
	nan := math.NaN()
	samples := []Sample{
		{File: "a1", Group: "A", Param: nan, Values: []float64{1, 1}},
		{File: "a2", Group: "A", Param: nan, Values: []float64{2, nan}},
		{File: "a3", Group: "A", Param: nan, Values: []float64{3, nan}},
		{File: "b1", Group: "B", Param: nan, Values: []float64{4, 4}},
		{File: "b2", Group: "B", Param: nan, Values: []float64{5, 5}},
		{File: "b3", Group: "B", Param: nan, Values: []float64{6, 6}},
	}
	r, err := Compare([]string{"x", "y"}, samples, Options{})
	if err != nil {
		t.Fatal(err)
	}
	x, y := r.Pairs[0].Tests[0], r.Pairs[0].Tests[1]
	if !x.Tested || x.MW.P != 0.1 { // exact: 2/C(6,3) = 0.1 (complete separation)
		t.Errorf("x: %+v", x)
	}
	if y.Tested || !math.IsNaN(y.MW.P) || !math.IsNaN(y.MWAdj) || !strings.Contains(y.Note, "not tested") || y.A.Missing != 2 || y.CliffDelta != 1 {
		t.Errorf("y: %+v", y)
	}
	// Holm over the tested features only: m = 1.
	if x.MWAdj != x.MW.P {
		t.Errorf("x adjusted %v, want %v", x.MWAdj, x.MW.P)
	}
}

// TestCompareErrors checks the input errors.
func TestCompareErrors(t *testing.T) {
	ok := []Sample{{Group: "a", Values: []float64{1}}, {Group: "b", Values: []float64{2}}}
	cases := []struct {
		name     string
		features []string
		samples  []Sample
		opts     Options
		want     error
	}{
		{"no features", nil, ok, Options{}, ErrShape},
		{"duplicate", []string{"x", "x"}, ok, Options{}, ErrShape},
		{"length", []string{"x", "y"}, ok, Options{}, ErrShape},
		{"one group", []string{"x"}, ok[:1], Options{}, ErrTooFewGroups},
		{"no samples", []string{"x"}, nil, Options{}, ErrTooFewGroups},
		{"reference", []string{"x"}, ok, Options{Reference: "zz"}, ErrUnknownGroup},
		{"groups", []string{"x"}, ok, Options{Groups: []string{"a", "zz"}}, ErrUnknownGroup},
	}
	for _, c := range cases {
		if _, err := Compare(c.features, c.samples, c.opts); !errors.Is(err, c.want) {
			t.Errorf("%s: %v, want %v", c.name, err, c.want)
		}
	}
	for _, o := range []Options{{Alpha: 2}, {Adjust: "x"}, {Family: "x"}, {Test: "x"}, {KS: KSOptions{Method: "x"}}} {
		if _, err := Compare([]string{"x"}, ok, o); err == nil {
			t.Errorf("options %+v accepted", o)
		}
	}
}

// TestCompareDeterministic: the result (as JSON) is identical for 1 and 4
// workers and for repeated runs.
func TestCompareDeterministic(t *testing.T) {
	samples := demoSamples(3, 4, []float64{0, 1, 2}, 1)
	var out [3][]byte
	for i, w := range []int{1, 4, 4} {
		r, err := Compare(demoFeatures, samples, Options{Workers: w})
		if err != nil {
			t.Fatal(err)
		}
		var b bytes.Buffer
		if err := WriteJSON(&b, r); err != nil {
			t.Fatal(err)
		}
		out[i] = b.Bytes()
	}
	if !bytes.Equal(out[0], out[1]) || !bytes.Equal(out[1], out[2]) {
		t.Error("results differ between runs or worker counts")
	}
}
