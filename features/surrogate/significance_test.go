package surrogate

import (
	"encoding/json"
	"errors"
	"math"
	"strings"
	"testing"
)

// maxStat is the largest value: identical on the data and on every
// shuffle, so its rank test can never reject (ties count on both sides).
var maxStat = Statistic{Name: "max", Func: func(x []float64) (float64, error) {
	m := x[0]
	for _, v := range x {
		m = math.Max(m, v)
	}
	return m, nil
}}

// lag1 is the lag-one autocorrelation.
var lag1 = Statistic{Name: "lag1", Func: func(x []float64) (float64, error) {
	var m float64
	for _, v := range x {
		m += v
	}
	m /= float64(len(x))
	var num, den float64
	for i, v := range x {
		den += (v - m) * (v - m)
		if i > 0 {
			num += (v - m) * (x[i-1] - m)
		}
	}
	return num / den, nil
}}

// TestRunner checks the runner on cases whose answer is known exactly:
// AR(1) φ = 0.7 against shuffles with the lag-one autocorrelation (≈ 0.7
// against ≈ 0 ± 1/√n: observed above all 99 surrogates, so p_upper =
// 1/100 and p_two = 2/100 by the rank formula, Theiler et al. 1992), and
// the maximum (equal on every shuffle: all ties, p = 1). Holm over the two:
// min(1, 2·0.02) = 0.04 and max(0.04, 1) = 1 (Holm 1979).
func TestRunner(t *testing.T) {
	x := series(t, "ar1", 1000, 11)
	rep, err := Test(x, []Statistic{lag1, maxStat}, TestOptions{Options: Options{Method: Shuffle, Seed: 1}})
	if err != nil {
		t.Fatal(err)
	}
	if rep.Count != 99 || rep.MinSurrogates != 39 || rep.Side != TwoSided || rep.Alpha != 0.05 {
		t.Fatalf("defaults: %+v", rep)
	}
	r := rep.Tests[0]
	if r.PUpper != 1.0/100 || r.PLower != 1 || r.P != 2.0/100 || r.PTwo != r.P || r.PHolm != 0.04 || !r.Significant {
		t.Fatalf("lag1: %+v", r)
	}
	if r.Count != 99 || len(r.Values) != 99 || r.Failed != 0 || !(r.Z > 10) {
		t.Fatalf("lag1: count %d, z %g", r.Count, r.Z)
	}
	m := rep.Tests[1]
	if m.P != 1 || m.PHolm != 1 || m.Significant || !math.IsNaN(m.Z) || !hasWarning(m.Warnings, "z-score undefined") {
		t.Fatalf("max: %+v", m)
	}
	if !hasWarning(rep.Warnings, "p_holm") {
		t.Fatalf("no multiple-testing warning: %v", rep.Warnings)
	}
	// One-sided upper: p = p_upper = 0.01.
	rep, err = Test(x, []Statistic{lag1}, TestOptions{Options: Options{Method: Shuffle, Seed: 1}, Side: Upper})
	if err != nil {
		t.Fatal(err)
	}
	if r := rep.Tests[0]; r.P != 0.01 || r.PHolm != 0.01 || rep.MinSurrogates != 19 || hasWarning(rep.Warnings, "p_holm") {
		t.Fatalf("upper: %+v %v", r, rep.Warnings)
	}
	// Too few surrogates for α: warned.
	rep, err = Test(x, []Statistic{lag1}, TestOptions{Options: Options{Method: Shuffle, Count: 19}})
	if err != nil {
		t.Fatal(err)
	}
	if !hasWarning(rep.Warnings, "need at least 39") {
		t.Fatalf("no warning for 19 two-sided surrogates: %v", rep.Warnings)
	}
}

// TestRunnerFailures: a statistic that fails (error, NaN, panic) on some
// surrogates is counted and reported, the others go on; one that fails on
// the data is reported with Error and null numbers in JSON.
func TestRunnerFailures(t *testing.T) {
	x := series(t, "white", 500, 12)
	calls := 0
	picky := Statistic{Name: "picky", Func: func(s []float64) (float64, error) {
		switch {
		case s[0] > 1: // about 16% of N(0,1) first values
			return 0, errors.New("first value too large")
		case s[0] < -1.5:
			return math.NaN(), nil
		case s[0] < -1.2:
			panic("boom")
		}
		s[0] = 1e9 // modifying the input must not disturb other statistics
		return s[1], nil
	}}
	broken := Statistic{Name: "broken", Func: func(s []float64) (float64, error) {
		calls++ // only called once, on the data
		return 0, errors.New("cannot")
	}}
	x[0] = 0.5
	rep, err := Test(x, []Statistic{picky, broken, maxStat}, TestOptions{Options: Options{Method: Shuffle, Count: 199, Workers: 3}})
	if err != nil {
		t.Fatal(err)
	}
	p := rep.Tests[0]
	if p.Failed == 0 || p.Count+p.Failed != 199 || len(p.Values) != p.Count || !hasWarning(p.Warnings, "failed on") {
		t.Fatalf("picky: count %d failed %d warnings %v", p.Count, p.Failed, p.Warnings)
	}
	b := rep.Tests[1]
	if calls != 1 || b.Error == "" || !math.IsNaN(b.P) || !math.IsNaN(b.PHolm) || b.Significant {
		t.Fatalf("broken: calls %d %+v", calls, b)
	}
	// maxStat saw unmodified copies (picky wrote 1e9 into its own): its
	// value on every shuffle equals the observed one exactly.
	mr := rep.Tests[2]
	for _, v := range mr.Values {
		if v != mr.Observed {
			t.Fatalf("max disturbed: %g, observed %g", v, mr.Observed)
		}
	}
	// Holm counts only the two statistics that ran.
	if p.PHolm != math.Min(1, 2*math.Min(p.P, rep.Tests[2].P)) && p.PHolm != math.Min(1, math.Max(2*math.Min(p.P, rep.Tests[2].P), p.P)) {
		t.Fatalf("holm with a failed statistic: %g", p.PHolm)
	}
	buf, err := json.Marshal(rep)
	if err != nil {
		t.Fatal(err)
	}
	js := string(buf)
	for _, key := range []string{`"tests":`, `"stat":"broken"`, `"p":null`, `"p_upper":`, `"p_lower":`, `"p_holm":`, `"method":"shuffle"`, `"count":`, `"warnings":`} {
		if !strings.Contains(js, key) {
			t.Fatalf("JSON lacks %s: %s", key, js[:min(400, len(js))])
		}
	}
	var back Report
	if err := json.Unmarshal(buf, &back); err != nil {
		t.Fatal(err)
	}
	if !math.IsNaN(back.Tests[1].P) || back.Tests[0].P != p.P || back.Tests[0].Count != p.Count {
		t.Fatalf("round trip: %+v", back.Tests[:2])
	}
}

// TestRunnerDeterminism: same seed ⇒ identical report whatever the number
// of workers (project rule).
func TestRunnerDeterminism(t *testing.T) {
	x := series(t, "henon", 800, 13)
	var ref []byte
	for _, w := range []int{1, 2, 5} {
		rep, err := Test(x, []Statistic{TimeAsymmetryStat, lag1}, TestOptions{Options: Options{Count: 19, Seed: 5, Workers: w}, Side: Upper})
		if err != nil {
			t.Fatal(err)
		}
		b, err := json.Marshal(rep)
		if err != nil {
			t.Fatal(err)
		}
		if ref == nil {
			ref = b
		} else if string(b) != string(ref) {
			t.Fatalf("workers %d: report differs", w)
		}
	}
}

// TestRunnerErrors: bad options and input are errors.
func TestRunnerErrors(t *testing.T) {
	x := series(t, "white", 100, 1)
	if _, err := Test(x, nil, TestOptions{}); !errors.Is(err, ErrNoStatistic) {
		t.Errorf("no statistic: %v", err)
	}
	if _, err := Test(x, []Statistic{{Name: "nil"}}, TestOptions{}); err == nil {
		t.Error("nil func: no error")
	}
	if _, err := Test(x, []Statistic{lag1}, TestOptions{Side: "both"}); !errors.Is(err, ErrSide) {
		t.Errorf("side: %v", err)
	}
	if _, err := Test(x, []Statistic{lag1}, TestOptions{Alpha: 2}); !errors.Is(err, ErrOption) {
		t.Errorf("alpha: %v", err)
	}
	if _, err := Test(x[:3], []Statistic{lag1}, TestOptions{}); !errors.Is(err, ErrTooShort) {
		t.Errorf("short: %v", err)
	}
}

// TestTimeAsymmetry: 0 for a series and its mirror sum (reversible by
// construction), sign flip under time reversal and negation, invariance
// under a·x + b, a > 0 (analytic from the definition); hand value on
// x = (0, 1, 0, 2): increments 1, −1, 2; ⟨d³⟩ = 8/3, ⟨d²⟩ = 2,
// 8/3 / 2^{3/2} = 0.9428.
func TestTimeAsymmetry(t *testing.T) {
	v, err := TimeAsymmetry([]float64{0, 1, 0, 2})
	if err != nil || math.Abs(v-(8.0/3)/math.Pow(2, 1.5)) > 1e-15 {
		t.Fatalf("hand value: %g %v", v, err)
	}
	x := series(t, "henon", 500, 2)
	a, _ := TimeAsymmetry(x)
	rev := make([]float64, len(x))
	neg := make([]float64, len(x))
	sc := make([]float64, len(x))
	for i, v := range x {
		rev[len(x)-1-i] = v
		neg[i] = -v
		sc[i] = 2.5e-6*v + 40
	}
	r, _ := TimeAsymmetry(rev)
	n, _ := TimeAsymmetry(neg)
	s, _ := TimeAsymmetry(sc)
	if math.Abs(r+a) > 1e-12 || math.Abs(n+a) > 1e-12 || math.Abs(s-a) > 1e-6*math.Abs(a) {
		t.Fatalf("asym %g, reversed %g, negated %g, scaled %g", a, r, n, s)
	}
	if _, err := TimeAsymmetry([]float64{1, 1, 1}); err == nil {
		t.Fatal("constant series: no error")
	}
}
