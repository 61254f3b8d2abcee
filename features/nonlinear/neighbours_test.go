package nonlinear

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestIndexAgainstBruteForce: Within and KNearest give exactly what testing
// every pair from the definition gives (the same distances, bit for bit),
// under both norms, with and without a Theiler window, on continuous and
// on tied (integer) data.
func TestIndexAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(16, 1))
	for trial := 0; trial < 24; trial++ {
		n := 50 + rng.IntN(400)
		x := make([]float64, n)
		for i := range x {
			if trial%3 == 2 {
				x[i] = float64(rng.IntN(5))
			} else {
				x[i] = rng.NormFloat64()
			}
		}
		dim, delay, w := 1+rng.IntN(4), 1+rng.IntN(3), rng.IntN(4)
		euclid := trial%2 == 1
		ix, err := NewIndex(x, dim, delay, euclid)
		if err != nil {
			t.Fatal(err)
		}
		r := 0.3 + rng.Float64()
		for i := 0; i < ix.Len(); i++ {
			var got, want [][2]float64
			ix.Within(i, r, w, nil, func(j int, d float64) { got = append(got, [2]float64{float64(j), d}) })
			for j := i + w + 1; j < ix.Len(); j++ {
				if d := ix.Distance(i, j); d <= r {
					want = append(want, [2]float64{float64(j), d})
				}
			}
			slices.SortFunc(got, func(a, b [2]float64) int { return int(a[0] - b[0]) })
			if !slices.Equal(got, want) {
				t.Fatalf("trial %d point %d: Within %v, brute force %v", trial, i, got, want)
			}
			k := 1 + rng.IntN(6)
			ids, dists := make([]int, k), make([]float64, k)
			m := ix.KNearest(i, w, nil, ids, dists)
			var all []float64
			for j := 0; j < ix.Len(); j++ {
				if j-i > w || i-j > w {
					all = append(all, ix.Distance(i, j))
				}
			}
			slices.Sort(all)
			if m != min(k, len(all)) {
				t.Fatalf("trial %d point %d: %d neighbours, want %d", trial, i, m, min(k, len(all)))
			}
			for q := 0; q < m; q++ {
				if math.Abs(dists[q]-all[q]) > 1e-12 || math.Abs(ix.Distance(i, ids[q])-dists[q]) > 1e-12 {
					t.Fatalf("trial %d point %d: k-nearest distances %v, brute force %v", trial, i, dists[:m], all[:m])
				}
			}
		}
	}
}
