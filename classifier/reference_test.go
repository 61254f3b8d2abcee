package classifier

import (
	"errors"
	"math"
	"reflect"
	"testing"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/generators"
)

// Every registered generator must have a training regime in the plan, so a
// new reference system cannot be forgotten by the default model.
func TestReferencePlanCoversEveryGenerator(t *testing.T) {
	inPlan := map[string]bool{}
	for _, n := range ReferenceSystems() {
		if inPlan[n] {
			t.Errorf("%s appears twice in the plan", n)
		}
		inPlan[n] = true
		if _, err := generators.Lookup(n); err != nil {
			t.Errorf("plan names %s: %v", n, err)
		}
	}
	for _, n := range generators.Names() {
		if !inPlan[n] {
			t.Errorf("generator %s has no training regime in the reference plan", n)
		}
	}
}

func TestReferencePlanIsDeterministicAndInRange(t *testing.T) {
	opts := ReferenceOptions{PerClass: 60, Seed: 3}
	a, err := ReferencePlan(opts)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := ReferencePlan(opts)
	if !reflect.DeepEqual(a, b) {
		t.Fatal("same seed gave different plans")
	}
	count := map[string]int{}
	noisy := 0
	for _, s := range a {
		if s.N < 512 || s.N > 20000 {
			t.Errorf("%s: length %d outside 512..20000", s.System, s.N)
		}
		if snr := s.SNR(); !math.IsInf(snr, 1) {
			noisy++
			if snr < 10 || snr > 40 {
				t.Errorf("%s: SNR %g outside 10..40 dB", s.System, snr)
			}
		}
		if err := s.Recording.Validate(); err != nil {
			t.Errorf("%s: %v", s.System, err)
		}
		if s.Recording.Levels != 0 && (s.Recording.Levels < 8 || s.Recording.Levels > 4096) {
			t.Errorf("%s: %d ADC levels outside 8..4096", s.System, s.Recording.Levels)
		}
		if s.Family != Family(s.System) || s.Family == "" {
			t.Errorf("%s: family %q", s.System, s.Family)
		}
		sys, _ := generators.Lookup(s.System)
		if _, err := sys.Resolve(s.Params); err != nil {
			t.Errorf("%s: plan parameters rejected by the generator: %v", s.System, err)
		}
		count[s.Class]++
	}
	// Classes are balanced by construction up to draws whose computed
	// label differs from the entry's class (periodic windows).
	for _, c := range []string{"chaotic", "stochastic", "regular"} {
		if count[c] < 40 {
			t.Errorf("class %s has %d series of %d", c, count[c], len(a))
		}
	}
	// Defaults: a quarter clean, three quarters of the rest noisy: 0.5625.
	if f := float64(noisy) / float64(len(a)); f < 0.48 || f > 0.65 {
		t.Errorf("noisy fraction %.2f, want about 0.56", f)
	}
}

func TestBuildReferenceIsIndependentOfWorkers(t *testing.T) {
	opts := ReferenceOptions{PerClass: 6, MaxLength: 1500, Systems: []string{"henon", "white", "sine", "logistic", "ar1"}, Seed: 9}
	opts.Workers = 1
	a, _, err := BuildReference(opts, features.Options{})
	if err != nil {
		t.Fatal(err)
	}
	opts.Workers = 3
	b, _, err := BuildReference(opts, features.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(a.Y, b.Y) || !reflect.DeepEqual(a.Groups, b.Groups) {
		t.Fatal("labels or groups depend on the worker count")
	}
	for i := range a.X {
		for j := range a.X[i] {
			if math.Float64bits(a.X[i][j]) != math.Float64bits(b.X[i][j]) {
				t.Fatalf("row %d feature %s: %v vs %v", i, a.Features[j], a.X[i][j], b.X[i][j])
			}
		}
	}
	if len(a.Features) != len(features.Names()) {
		t.Fatalf("dataset has %d features, catalogue %d", len(a.Features), len(features.Names()))
	}
}

func TestReferenceRejectsUnknownSystem(t *testing.T) {
	if _, err := ReferencePlan(ReferenceOptions{Systems: []string{"nosuch"}}); err == nil {
		t.Fatal("no error for an unknown system")
	}
}

// Every draw of the plan must be generable: a regime range that strays into
// invalid parameters (a harmonic above Nyquist, an escaping orbit) would
// silently thin the training set.
func TestReferencePlanDrawsAreGenerable(t *testing.T) {
	plan, err := ReferencePlan(ReferenceOptions{PerClass: 170, MaxLength: 1200, Seed: 11})
	if err != nil {
		t.Fatal(err)
	}
	// Some attractors coexist with escaping orbits (the hyperchaotic
	// Rössler system loses a few random starts); BuildReference drops
	// those draws, which is harmless while they stay rare.
	drawn, escaped := map[string]int{}, map[string]int{}
	for _, s := range plan {
		drawn[s.System]++
		x, err := s.Generate()
		if errors.Is(err, ErrFewCycles) {
			continue // too short for its time scale: see TestFewCyclesRuleIsRare
		}
		if errors.Is(err, generators.ErrDiverged) || errors.Is(err, generators.ErrConstant) {
			escaped[s.System]++
			continue
		}
		if err == nil {
			_, err = features.Standardise(x)
		}
		if errors.Is(err, features.ErrConstant) { // a stable fixed point, dropped too
			escaped[s.System]++
			continue
		}
		if err != nil {
			t.Errorf("%s %v: %v", s.System, s.Params, err)
		}
	}
	// Flag a system whose escape rate is significantly above 10%: a
	// one-sided binomial tail below 1% (a 6% rate, as the hyperchaotic
	// Rössler system has from random starts, gives 2 of 10 often enough
	// that a plain count would be a coin toss).
	for sys, k := range escaped {
		if p := binomialTail(drawn[sys], k, 0.1); p < 0.01 {
			t.Errorf("%s: %d of %d draws escaped (P = %.2g under a 10%% escape rate)", sys, k, drawn[sys], p)
		}
	}
}

// binomialTail returns P(X ≥ k) for X ~ Binomial(n, p).
func binomialTail(n, k int, p float64) float64 {
	var s float64
	for i := k; i <= n; i++ {
		lg, _ := math.Lgamma(float64(n + 1))
		a, _ := math.Lgamma(float64(i + 1))
		b, _ := math.Lgamma(float64(n - i + 1))
		s += math.Exp(lg - a - b + float64(i)*math.Log(p) + float64(n-i)*math.Log1p(-p))
	}
	return s
}

// TestFewCyclesRuleIsRare: the rule that drops deterministic draws with
// fewer than MinCrossings mean crossings must trim only the extremes of
// the sampling ranges, not thin a system out, at the default lengths.
func TestFewCyclesRuleIsRare(t *testing.T) {
	plan, err := ReferencePlan(ReferenceOptions{PerClass: 400, Seed: 12})
	if err != nil {
		t.Fatal(err)
	}
	drawn, few := map[string]int{}, map[string]int{}
	for _, s := range plan {
		if s.Class == string(generators.Stochastic) {
			continue
		}
		drawn[s.System]++
		if _, err := s.Generate(); errors.Is(err, ErrFewCycles) {
			few[s.System]++
		}
	}
	for sys, k := range few {
		if p := binomialTail(drawn[sys], k, 0.25); p < 0.01 {
			t.Errorf("%s: %d of %d draws have too few cycles (P = %.2g under a 25%% rate): narrow its sampling range", sys, k, drawn[sys], p)
		}
	}
	if MeanCrossings([]float64{0, 1, 0, 1, 0}) != 4 || MeanCrossings([]float64{1, 2, 3, 4}) != 1 || MeanCrossings([]float64{1, 1, 1, 0, 1, 1, 1, 0}) != 3 {
		t.Error("MeanCrossings miscounts")
	}
}
