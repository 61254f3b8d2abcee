package surrogate

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// stableOrder is the reference argsort: slices.SortStableFunc on indices.
func stableOrder(v []float64) []int32 {
	idx := make([]int32, len(v))
	for i := range idx {
		idx[i] = int32(i)
	}
	slices.SortStableFunc(idx, func(a, b int32) int {
		switch {
		case v[a] < v[b]:
			return -1
		case v[a] > v[b]:
			return 1
		}
		return 0
	})
	return idx
}

// TestArgsort compares the radix argsort with a stable comparison sort
// (reference: the standard library) on values with mixed signs, wide
// exponents, ties, ±0 and one repeated value.
func TestArgsort(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	cases := map[string][]float64{
		"single":   {42},
		"constant": {1, 1, 1, 1, 1},
		"signs":    {3, -1, 0, 2.5, -7e300, 1e-300, -1e-300, math.MaxFloat64, -math.MaxFloat64},
		"zeros":    {0, 1, 0, -1, 0, 2},
	}
	wide := make([]float64, 5000)
	ties := make([]float64, 5000)
	for i := range wide {
		wide[i] = rng.NormFloat64() * math.Pow(10, float64(rng.IntN(40)-20))
		ties[i] = float64(rng.IntN(7)) - 3
	}
	cases["wide"], cases["ties"] = wide, ties
	for name, v := range cases {
		s := newSorter(len(v))
		got := s.argsort(v)
		want := stableOrder(v)
		for j := range got {
			// −0 and +0 compare equal but get adjacent keys: compare values.
			if v[got[j]] != v[want[j]] || (v[got[j]] != 0 && got[j] != want[j]) {
				t.Fatalf("%s: position %d: index %d (%g), want %d (%g)", name, j, got[j], v[got[j]], want[j], v[want[j]])
			}
		}
		// Reuse of the same sorter must give the same answer.
		if again := s.argsort(v); !slices.Equal(again, got) {
			t.Fatalf("%s: second call differs", name)
		}
	}
}

// TestResort checks the insertion re-sort: it sorts a slightly perturbed
// series from the old order, and gives up when the budget is too small.
func TestResort(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 2))
	n := 3000
	v := make([]float64, n)
	for i := range v {
		v[i] = rng.NormFloat64()
	}
	perm := newSorter(n).argsort(v)
	perm = append([]int32(nil), perm...)
	for i := range v {
		v[i] += 1e-3 * rng.NormFloat64()
	}
	vals := make([]float64, n)
	if !resort(perm, vals, v, 4*n) {
		t.Fatal("resort gave up on a slightly perturbed series")
	}
	for j := 1; j < n; j++ {
		if v[perm[j-1]] > v[perm[j]] {
			t.Fatalf("not sorted at %d", j)
		}
	}
	for i := range v {
		v[i] = rng.NormFloat64()
	}
	if resort(perm, vals, v, n/10) {
		t.Fatal("resort of a fresh random series within n/10 moves: impossible in practice")
	}
	seen := make([]bool, n)
	for _, i := range perm {
		seen[i] = true
	}
	if slices.Contains(seen, false) {
		t.Fatal("perm is no longer a permutation after giving up")
	}
}
