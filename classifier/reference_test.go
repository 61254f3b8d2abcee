package classifier

import (
	"errors"
	"math"
	"reflect"
	"testing"

	"tracesift/features"
	"tracesift/generators"
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
		if !math.IsInf(s.SNR, 1) {
			noisy++
			if s.SNR < 10 || s.SNR > 40 {
				t.Errorf("%s: SNR %g outside 10..40 dB", s.System, s.SNR)
			}
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
	if f := float64(noisy) / float64(len(a)); f < 0.45 || f > 0.75 {
		t.Errorf("noisy fraction %.2f, want about 0.6", f)
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
		if errors.Is(err, generators.ErrDiverged) || errors.Is(err, generators.ErrConstant) {
			escaped[s.System]++
			continue
		}
		if err == nil {
			_, err = features.Standardise(x)
		}
		if err != nil {
			t.Errorf("%s %v: %v", s.System, s.Params, err)
		}
	}
	for sys, k := range escaped {
		if float64(k) > 0.1*float64(drawn[sys]) {
			t.Errorf("%s: %d of %d draws escaped", sys, k, drawn[sys])
		}
	}
}
