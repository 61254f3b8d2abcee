package classifier

import (
	"math"
	"math/rand/v2"
	"reflect"
	"testing"
)

// TestPermutationImportanceSeparable: only f0 carries the class. Shuffling
// it makes the prediction independent of the label, so accuracy falls from
// 1 to about 0.5 for balanced classes (analytic: P(pred = y) = 1/2 when
// pred ⟂ y and y is balanced); shuffling a noise feature changes nothing
// the trees rely on. Tolerances: 400 rows × 5 repeats, the mean of a
// binomial proportion has s.d. ≈ √(0.25/2000) ≈ 0.011, so 0.5 ± 0.06.
func TestPermutationImportanceSeparable(t *testing.T) {
	m, err := Train(separable(400, 6, 1), Config{Trees: 50, Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	held := separable(400, 6, 2)
	imp, err := PermutationImportance(m, held, 5, rand.New(rand.NewPCG(1, 2)))
	if err != nil {
		t.Fatal(err)
	}
	if imp[0].Feature != "f0" {
		t.Fatalf("most important %v, want f0", imp)
	}
	if math.Abs(imp[0].Drop-0.5) > 0.06 {
		t.Fatalf("f0 drop %.3f, want 0.5 ± 0.06", imp[0].Drop)
	}
	for _, im := range imp[1:] {
		// A noise feature can only matter through the few splits trees make
		// on it inside a pure region; its drop must be tiny.
		if math.Abs(im.Drop) > 0.02 {
			t.Fatalf("noise feature %s drop %.3f", im.Feature, im.Drop)
		}
	}
	again, _ := PermutationImportance(m, held, 5, rand.New(rand.NewPCG(1, 2)))
	if !reflect.DeepEqual(imp, again) {
		t.Fatal("same generator state gave different importances")
	}
}

// TestPermutationImportanceNoisy: with informative features 0–2 among 8,
// the three informative ones rank first.
func TestPermutationImportanceNoisy(t *testing.T) {
	m, err := Train(noisy(600, 8, 3, 41), Config{Trees: 60, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	imp, err := PermutationImportance(m, noisy(600, 8, 3, 42), 3, rand.New(rand.NewPCG(3, 4)))
	if err != nil {
		t.Fatal(err)
	}
	for _, im := range imp[:3] {
		if im.Index > 2 {
			t.Fatalf("noise feature %s among the top three: %+v", im.Feature, imp)
		}
	}
}
