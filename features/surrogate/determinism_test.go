package surrogate

import (
	"errors"
	"math"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// system returns n samples of a registered reference system at its default
// parameters.
func system(t testing.TB, name string, n int, seed uint64) []float64 {
	t.Helper()
	s, err := generators.Lookup(name)
	if err != nil {
		t.Fatal(err)
	}
	x, err := s.Generate(n, nil, rand.New(rand.NewPCG(seed, 0xd1ce)))
	if err != nil {
		t.Fatal(err)
	}
	return x
}

// TestDeterminismRejectsChaos: deterministic chaos is far more predictable
// one delay ahead than surrogates with its spectrum and values, so the
// null of a transformed linear Gaussian process is rejected at n = 2000
// with M = 39 (the smallest adjusted p, 2/40 = 0.05, is reached). Theiler
// et al., Physica D 58 (1992) 77; Schreiber & Schmitz, Phys. Rev. Lett. 77
// (1996) 635; simplex forecasting of chaos: Sugihara & May, Nature 344
// (1990) 734. The maps are also time-irreversible (dissipative chaos,
// Theiler et al. 1992); the Lorenz flow's x has the odd symmetry x → −x,
// which makes the increment skewness vanish, so there the forecast alone
// rejects.
func TestDeterminismRejectsChaos(t *testing.T) {
	cases := []struct {
		system      string
		reversalToo bool // the time-reversal statistic also rejects
		maxDelay    int
	}{
		{"henon", true, 3},
		{"logistic", true, 3},
		{"lorenz", false, 40},
	}
	for _, c := range cases {
		t.Run(c.system, func(t *testing.T) {
			x := system(t, c.system, 2000, 1)
			r, err := Determinism(x, DeterminismOptions{Count: 39, Seed: 3})
			if err != nil {
				t.Fatal(err)
			}
			if !r.Rejected || !(r.P() <= 0.05) {
				t.Fatalf("not rejected: p = %g, stats %+v", r.P(), brief(r))
			}
			pred, rev := r.Stats[0], r.Stats[1]
			// Above all 39 surrogates: p = 1/40, Holm 2/40 (rank formula).
			if pred.Name != StatPredSkill || pred.P != 1.0/40 || pred.PHolm != 2.0/40 || !pred.Significant {
				t.Errorf("forecast statistic %+v", brief(r)[0])
			}
			if c.reversalToo && !(rev.Significant && rev.P == 1.0/40) {
				t.Errorf("time-reversal statistic %+v", brief(r)[1])
			}
			if r.Delay < 1 || r.Delay > c.maxDelay || r.Dim < 1 || r.Horizon != min(r.Delay, 50) {
				t.Errorf("embedding d = %d, τ = %d, horizon %d", r.Dim, r.Delay, r.Horizon)
			}
			if r.Count != 39 || r.MinSurrogates != 39 || r.N != 2000 || !r.EndMatched ||
				r.Len < 1800 || r.Start < 0 || r.Start+r.Len > 2000 {
				t.Errorf("bookkeeping %+v", r)
			}
			if a := r.Agreement("chaotic"); a.Kind != Agree {
				t.Errorf("agreement with a chaotic verdict: %+v", a)
			}
		})
	}
}

func brief(r *DeterminismResult) []DeterminismStat {
	out := append([]DeterminismStat(nil), r.Stats...)
	for i := range out {
		out[i].Values = nil
	}
	return out
}

// TestDeterminismSize checks that the test holds its level on series that
// satisfy the null hypothesis: linear Gaussian processes (AR(1), fractional
// Gaussian noise, 1/f noise) and a static monotone transform of one
// (exp of a standardised AR(1), a lognormal process). Under the null the
// trace and its surrogates are (approximately) exchangeable, so each rank
// p is uniform on {1/(M+1), …, 1} and Holm's procedure keeps the error
// rate at most α (Theiler et al. 1992; Holm, Scand. J. Statist. 6 (1979)
// 65). To stay fast the check uses short series (n = 512) and M = 19 at
// α = 0.1, a legitimate operating point: with two one-sided statistics the
// smallest adjusted p is 2/20 = 0.1, and the size bound is α = 0.1. Over
// 100 series the number of rejections is Binomial(100, ≤ 0.1): the check
// fails when it exceeds 18, which has probability 0.0046 at exactly 0.1
// (binomial tail, derived), so a failure means real size inflation. About
// 4.5 CPU-seconds (2.3 s on two idle cores); skipped under -short.
func TestDeterminismSize(t *testing.T) {
	if testing.Short() {
		t.Skip("size check of the determinism test: 100 series × 20 surrogates")
	}
	const (
		perProcess = 25
		n          = 512
		m          = 19
		alpha      = 0.1
		maxReject  = 18
	)
	processes := []string{"ar1", "fgn", "powerlaw", "exp-ar1"}
	type outcome struct {
		rejected bool
		err      error
	}
	out := make([]outcome, len(processes)*perProcess)
	forEachIndex(len(out), func(i int) {
		proc, k := processes[i/perProcess], i%perProcess
		x := nullSeries(t, proc, n, uint64(100+k))
		r, err := Determinism(x, DeterminismOptions{Count: m, Seed: uint64(k), Alpha: alpha, Workers: 1})
		if err != nil {
			out[i].err = err
			return
		}
		if r.MinSurrogates != m {
			out[i].err = errors.New("unexpected minimum surrogate count")
		}
		out[i].rejected = r.Rejected
	})
	rejected := 0
	byProcess := map[string]int{}
	for i, o := range out {
		if o.err != nil {
			t.Fatalf("%s series %d: %v", processes[i/perProcess], i%perProcess, o.err)
		}
		if o.rejected {
			rejected++
			byProcess[processes[i/perProcess]]++
		}
	}
	t.Logf("rejected %d of %d null series at α = %g (by process: %v)", rejected, len(out), alpha, byProcess)
	if rejected > maxReject {
		t.Errorf("rejected %d of %d series satisfying the null at α = %g (want ≤ %d): the test is too liberal", rejected, len(out), alpha, maxReject)
	}
}

// nullSeries returns n samples of a process satisfying the IAAFT null.
func nullSeries(t testing.TB, proc string, n int, seed uint64) []float64 {
	if proc != "exp-ar1" {
		return system(t, proc, n, seed)
	}
	x := system(t, "ar1", n, seed)
	// AR(1) with φ = 0.9 and unit innovations has variance 1/(1 − φ²);
	// exp of the standardised process is lognormal with σ = 1.
	s := math.Sqrt(1 - 0.9*0.9)
	for i := range x {
		x[i] = math.Exp(s * x[i])
	}
	return x
}

// forEachIndex runs f(0..n−1) on two goroutines; f places its results by
// index.
func forEachIndex(n int, f func(i int)) {
	done := make(chan struct{})
	next := make(chan int)
	for range 2 {
		go func() {
			for i := range next {
				f(i)
			}
			done <- struct{}{}
		}()
	}
	for i := range n {
		next <- i
	}
	close(next)
	<-done
	<-done
}

// TestDeterminismIsDeterministic: the same seed gives the same result on
// any number of workers; another seed gives other surrogates.
func TestDeterminismIsDeterministic(t *testing.T) {
	x := system(t, "ar1", 1500, 2)
	a, err := Determinism(x, DeterminismOptions{Count: 19, Seed: 5, Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	b, err := Determinism(x, DeterminismOptions{Count: 19, Seed: 5, Workers: 3})
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(a, b) {
		t.Fatal("1 and 3 workers gave different results")
	}
	c, err := Determinism(x, DeterminismOptions{Count: 19, Seed: 6, Workers: 3})
	if err != nil {
		t.Fatal(err)
	}
	if reflect.DeepEqual(a.Stats[0].Values, c.Stats[0].Values) {
		t.Error("seeds 5 and 6 gave the same surrogate values")
	}
}

// TestDeterminismScaleFree: the test sees only the ranks of the values
// (it runs on the Gaussianised stretch), so a trace in amperes
// (10⁻⁶·x + 5·10⁻⁶) and any increasing transform (exp) get exactly the
// same result as x (DESIGN.md: units never change a verdict).
func TestDeterminismScaleFree(t *testing.T) {
	x := system(t, "henon", 1000, 4)
	amps := make([]float64, len(x))
	expd := make([]float64, len(x))
	for i, v := range x {
		amps[i] = 1e-6*v + 5e-6
		expd[i] = math.Exp(v)
	}
	a, err := Determinism(x, DeterminismOptions{Count: 19, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	for name, y := range map[string][]float64{"amperes": amps, "exp": expd} {
		b, err := Determinism(y, DeterminismOptions{Count: 19, Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		if a.Start != b.Start || a.Len != b.Len || !reflect.DeepEqual(a.Stats, b.Stats) || a.Delay != b.Delay || a.Dim != b.Dim {
			t.Errorf("%s: the result changed: %+v vs %+v", name, brief(a), brief(b))
		}
	}
}

// TestDeterminismStretch: a long trace is tested on its middle
// DefaultDeterminismLength samples, end matched (at least 90% kept).
func TestDeterminismStretch(t *testing.T) {
	x := system(t, "ar1", 10000, 3)
	r, err := Determinism(x, DeterminismOptions{Count: 1, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	lo := (10000 - DefaultDeterminismLength) / 2
	if r.N != 10000 || r.Start < lo || r.Start+r.Len > lo+DefaultDeterminismLength || r.Len < DefaultDeterminismLength*9/10 || !r.EndMatched {
		t.Errorf("stretch [%d, %d) of %d, want inside [%d, %d) and ≥ 90%% of it", r.Start, r.Start+r.Len, r.N, lo, lo+DefaultDeterminismLength)
	}
	// The stretch really is the one end matching picks on the Gaussianised
	// middle stretch.
	g, err := Gaussianise(x[lo : lo+DefaultDeterminismLength])
	if err != nil {
		t.Fatal(err)
	}
	tr, err := MatchEnds(g, 0)
	if err != nil || lo+tr.Start != r.Start || tr.Len != r.Len {
		t.Errorf("stretch [%d, +%d), end matching gives [%d, +%d) (err %v)", r.Start, r.Len, lo+tr.Start, tr.Len, err)
	}
	r, err = Determinism(x[:3000], DeterminismOptions{Count: 1, MaxLength: -1, NoEndMatch: true})
	if err != nil {
		t.Fatal(err)
	}
	if r.Start != 0 || r.Len != 3000 || r.EndMatched {
		t.Errorf("whole trace: stretch [%d, +%d), end matched %v", r.Start, r.Len, r.EndMatched)
	}
}

// TestDeterminismSurrogates: the least M for two one-sided statistics
// under Holm is ⌈2/α − 1⌉ (derived from the smallest rank p 1/(M+1),
// Theiler et al. 1992, times 2 by Holm 1979).
func TestDeterminismSurrogates(t *testing.T) {
	cases := []struct {
		alpha float64
		want  int
	}{{0.05, 39}, {0.1, 19}, {0.01, 199}, {0.2, 9}, {0, 0}, {1, 0}}
	for _, c := range cases {
		if got := DeterminismSurrogates(c.alpha); got != c.want {
			t.Errorf("DeterminismSurrogates(%g) = %d, want %d", c.alpha, got, c.want)
		}
	}
}

// TestDeterminismTooFewSurrogates: with M = 19 at α = 0.05 even Hénon
// cannot be rejected (smallest adjusted p 2/20 = 0.1); the result warns
// and the agreement is inconclusive, whatever the verdict.
func TestDeterminismTooFewSurrogates(t *testing.T) {
	r, err := Determinism(system(t, "henon", 1000, 1), DeterminismOptions{Count: 19, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	if r.Rejected || r.P() != 0.1 || r.MinSurrogates != 39 {
		t.Fatalf("rejected %v, p %g, min %d", r.Rejected, r.P(), r.MinSurrogates)
	}
	if !hasWarning(r.Warnings, "use at least 39") {
		t.Errorf("no warning about the surrogate count: %v", r.Warnings)
	}
	for _, w := range r.Warnings {
		if strings.Contains(w, "p_holm") || strings.Contains(w, "cannot reach p ≤") {
			t.Errorf("runner note leaked: %q", w)
		}
	}
	if a := r.Agreement("chaotic"); a.Kind != Inconclusive || !strings.Contains(a.Text, "39") {
		t.Errorf("agreement %+v", a)
	}
}

func TestDeterminismErrors(t *testing.T) {
	x := system(t, "ar1", 600, 1)
	constant := make([]float64, 600)
	withNaN := append([]float64(nil), x...)
	withNaN[10] = math.NaN()
	cases := []struct {
		name string
		x    []float64
		opts DeterminismOptions
		want error
	}{
		{"alpha", x, DeterminismOptions{Alpha: 1.5}, ErrDeterminismOption},
		{"count", x, DeterminismOptions{Count: -1}, ErrDeterminismOption},
		{"delay", x, DeterminismOptions{Delay: -2}, ErrDeterminismOption},
		{"max length", x, DeterminismOptions{MaxLength: 100}, ErrDeterminismOption},
		{"short", x[:200], DeterminismOptions{}, ErrTooShort},
		{"constant", constant, DeterminismOptions{}, ErrConstant},
		{"nan", withNaN, DeterminismOptions{}, ErrNonFinite},
	}
	for _, c := range cases {
		if _, err := Determinism(c.x, c.opts); !errors.Is(err, c.want) {
			t.Errorf("%s: err %v, want %v", c.name, err, c.want)
		}
	}
}

// TestAgreement checks the comparison of verdicts with the test outcome on
// hand-made results.
func TestAgreement(t *testing.T) {
	mk := func(rejected bool, p float64) *DeterminismResult {
		return &DeterminismResult{Count: 39, MinSurrogates: 39, Alpha: 0.05, Rejected: rejected,
			Stats: []DeterminismStat{{Name: StatPredSkill, PHolm: p}, {Name: StatReversal, PHolm: math.NaN()}}}
	}
	cases := []struct {
		class    string
		rejected bool
		kind     string
		text     string
	}{
		{"chaotic", true, Agree, "significant"},
		{"chaotic", false, Disagree, "treat the chaotic verdict with caution"},
		{"stochastic", true, Disagree, "nonlinear noise"},
		{"stochastic", false, Agree, "consistent with the stochastic verdict"},
		{"regular", true, NotInformative, "confirms structure, not chaos"},
		{"regular", false, NotInformative, "says nothing against the regular verdict"},
		{"undetermined", true, Undetermined, "finds nonlinear structure"},
		{"undetermined", false, Undetermined, "consistent with a monotone transform"},
	}
	for _, c := range cases {
		p := 0.5
		if c.rejected {
			p = 0.05
		}
		a := mk(c.rejected, p).Agreement(c.class)
		if a.Kind != c.kind || !strings.Contains(a.Text, c.text) || !strings.Contains(a.Text, "39 IAAFT surrogates") {
			t.Errorf("%s, rejected %v: %+v", c.class, c.rejected, a)
		}
	}
	if p := mk(false, 0.5).P(); p != 0.5 {
		t.Errorf("P() = %g, want the smallest adjusted p 0.5 (NaN skipped)", p)
	}
	none := &DeterminismResult{Count: 39, MinSurrogates: 39, Stats: []DeterminismStat{{PHolm: math.NaN()}}}
	if a := none.Agreement("chaotic"); a.Kind != Inconclusive {
		t.Errorf("no statistic computed: %+v", a)
	}
}
