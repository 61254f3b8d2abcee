package order

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestSelectMatchesSort: Select returns the value sort.Float64s puts at
// rank k (the standard library as the reference) and partitions around it.
func TestSelectMatchesSort(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1, 2, 3, 10, 101, 1000} {
		for trial := 0; trial < 20; trial++ {
			x := make([]float64, n)
			for i := range x {
				x[i] = math.Round(10 * rng.NormFloat64()) // ties on purpose
			}
			s := slices.Clone(x)
			slices.Sort(s)
			k := rng.IntN(n)
			if got := Select(x, k); got != s[k] {
				t.Fatalf("n=%d k=%d: %v, want %v", n, k, got, s[k])
			}
			for i := range x {
				if (i < k && x[i] > x[k]) || (i > k && x[i] < x[k]) {
					t.Fatalf("n=%d k=%d: not partitioned at %d", n, k, i)
				}
			}
		}
	}
	if v := Select([]float64{1, 2}, 2); !math.IsNaN(v) {
		t.Errorf("k out of range: %v, want NaN", v)
	}
}

// TestSelectKeyedMatchesSort: SelectKeyed puts the value of sorted rank k
// (slices.Sort as the reference) at k, partitions around it, and keeps
// every id with its key.
func TestSelectKeyedMatchesSort(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, n := range []int{1, 2, 3, 10, 101, 1000} {
		for trial := 0; trial < 20; trial++ {
			key := make([]float64, n)
			ids := make([]int32, n)
			orig := make([]float64, n)
			for i := range key {
				key[i] = math.Round(10 * rng.NormFloat64()) // ties on purpose
				ids[i] = int32(i)
				orig[i] = key[i]
			}
			s := slices.Clone(key)
			slices.Sort(s)
			k := rng.IntN(n)
			SelectKeyed(key, ids, k)
			if key[k] != s[k] {
				t.Fatalf("n=%d k=%d: %v, want %v", n, k, key[k], s[k])
			}
			for i := range key {
				if (i < k && key[i] > key[k]) || (i > k && key[i] < key[k]) {
					t.Fatalf("n=%d k=%d: not partitioned at %d", n, k, i)
				}
				if orig[ids[i]] != key[i] {
					t.Fatalf("n=%d k=%d: id %d no longer beside its key", n, k, ids[i])
				}
			}
		}
	}
}
