package campaign

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/tracesift/tracesift/features/increments"
	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/groups"
)

// studentT returns n i.i.d. Student-t draws with 3 degrees of freedom
// (z/√(χ²₃/3)): fat tails, finite variance.
func studentT(rng *rand.Rand, n int) []float64 {
	x := make([]float64, n)
	for i := range x {
		c := 0.0
		for k := 0; k < 3; k++ {
			g := rng.NormFloat64()
			c += g * g
		}
		x[i] = rng.NormFloat64() / math.Sqrt(c/3)
	}
	return x
}

// ksGauss returns the one-sample KS p-value of the normalised increments
// of x against N(0, 1) (Kolmogorov distribution at n, groups.KolmogorovSF;
// conservative because mean and sd are fitted — Lilliefors 1967, memory).
func ksGauss(t *testing.T, x []float64) (float64, float64) {
	t.Helper()
	z, err := increments.Normalized(x, increments.Options{})
	if err != nil {
		t.Fatal(err)
	}
	d := &Distribution{}
	*d = compactAll(z)
	grid := d.X
	F := cdfOn(d, grid)
	D := gaussDistance(grid, F)
	return D, groups.KolmogorovSF(len(z), D)
}

// compactAll keeps every value (no sketch) as support points.
func compactAll(v []float64) Distribution {
	s := slices.Clone(v)
	slices.Sort(s)
	d := Distribution{}
	for i := 0; i < len(s); {
		j := i + 1
		for j < len(s) && s[j] == s[i] {
			j++
		}
		d.X = append(d.X, s[i])
		d.W = append(d.W, float64(j-i))
		i = j
	}
	return d
}

// TestShuffleKeepsValues: every shuffled surrogate the campaign makes is a
// permutation of the trace — the same multiset of values, bit for bit
// (Theiler et al., Physica D 58 (1992) 77, algorithm 0) — and the
// surrogates depend only on the seed and the trace ID.
func TestShuffleKeepsValues(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	x := studentT(rng, 1000)
	seed := SurrogateSeed(7, "fresh/D01.csv", string(surrogate.Shuffle))
	set, err := surrogate.Generate(x, surrogate.Options{Method: surrogate.Shuffle, Count: 19, Seed: seed, Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	want := slices.Clone(x)
	slices.Sort(want)
	for i, s := range set.Surrogates {
		got := slices.Clone(s)
		slices.Sort(got)
		if !slices.Equal(got, want) {
			t.Fatalf("surrogate %d changes the values", i)
		}
		if slices.Equal(s, x) {
			t.Errorf("surrogate %d is the series itself", i)
		}
	}
	again, _ := surrogate.Generate(x, surrogate.Options{Method: surrogate.Shuffle, Count: 19, Seed: seed, Workers: 3})
	for i := range set.Surrogates {
		if !slices.Equal(set.Surrogates[i], again.Surrogates[i]) {
			t.Fatalf("surrogate %d differs with 3 workers", i)
		}
	}
	if SurrogateSeed(7, "fresh/D01.csv", "shuffle") == SurrogateSeed(7, "fresh/D02.csv", "shuffle") ||
		SurrogateSeed(7, "fresh/D01.csv", "shuffle") == SurrogateSeed(8, "fresh/D01.csv", "shuffle") ||
		SurrogateSeed(7, "fresh/D01.csv", "shuffle") == SurrogateSeed(7, "fresh/D01.csv", "gauss") {
		t.Error("surrogate seeds collide across traces, seeds or methods")
	}
}

// TestGaussianisedKeepsRanksGaussianIncrements: a Gaussianised surrogate
// keeps the temporal rank order exactly, and on i.i.d. fat-tailed data
// (Student-t, 3 degrees of freedom) it makes the increments Gaussian: the
// one-sample KS test rejects the original's increments (D far above the
// 1 % critical value 1.63/√n, Smirnov's asymptotic table, memory) and does
// not reject the surrogates' at 1 % (the increments of i.i.d. Gaussian
// values are Gaussian; analytic).
func TestGaussianisedKeepsRanksGaussianIncrements(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	x := studentT(rng, 4000)
	set, err := surrogate.Generate(x, surrogate.Options{Method: surrogate.Gauss, Count: 19, Seed: 11, Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	for i, s := range set.Surrogates {
		for a := 1; a < len(x); a++ {
			if (x[a] < x[a-1]) != (s[a] < s[a-1]) || (x[a] > x[a-1]) != (s[a] > s[a-1]) {
				t.Fatalf("surrogate %d: order of samples %d and %d changed", i, a-1, a)
			}
		}
		// The full rank order, not only neighbours.
		ox, os := argsort(x), argsort(s)
		if !slices.Equal(ox, os) {
			t.Fatalf("surrogate %d: rank order changed", i)
		}
	}
	D, p := ksGauss(t, x)
	if p > 1e-6 {
		t.Errorf("Student-t increments: KS D = %.4f p = %.3g; want a clear rejection", D, p)
	}
	rejected := 0
	for _, s := range set.Surrogates {
		if _, p := ksGauss(t, s); p < 0.01 {
			rejected++
		}
	}
	// Each surrogate rejects with probability below 1 % under the null
	// (conservative with fitted moments): more than 2 of 19 would be
	// P < 2e-2 (binomial(19, 0.01) upper tail).
	if rejected > 2 {
		t.Errorf("%d of 19 Gaussianised surrogates have non-Gaussian increments at 1 %%", rejected)
	}
}

func argsort(x []float64) []int {
	idx := make([]int, len(x))
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int {
		switch {
		case x[a] < x[b]:
			return -1
		case x[a] > x[b]:
			return 1
		}
		return 0
	})
	return idx
}

// TestShuffleTestSize runs the campaign's original-against-shuffle test of
// one trace (Measure: the two-sided rank test of the metric among 19
// shuffled surrogates) on 240 i.i.d. Gaussian series, where the null
// hypothesis holds. Without ties the rank test is exact:
// P(p ≤ 0.1) = 2/20 = 0.1 (Theiler et al. 1992; surrogate.RankP). The
// number of rejections is binomial(240, 0.1): mean 24, sd 4.65; the test
// accepts 24 ± 3.3 sd, [9, 39] (two-sided probability of a false alarm
// below 0.1 %, normal approximation to the binomial).
func TestShuffleTestSize(t *testing.T) {
	if testing.Short() {
		t.Skip("size check: 240 series × 20 measurements")
	}
	const series = 240
	metrics := []string{"dx_acf_1", "hv_clust_mean"}
	rejected := make([]int, len(metrics))
	rng := rand.New(rand.NewPCG(2026, 17))
	for k := 0; k < series; k++ {
		x := make([]float64, 300)
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		rec, err := Measure(x, Trace{ID: "iid/" + string(rune('a'+k%26)) + string(rune('0'+k/26))}, MeasureOptions{
			Metrics: metrics, Methods: []surrogate.Method{surrogate.Shuffle}, Surrogates: 19, Seed: uint64(k),
		})
		if err != nil {
			t.Fatal(err)
		}
		for m := range metrics {
			if p := rec.Surrogates[0].RankP[m]; p <= 0.1 {
				rejected[m]++
			}
		}
	}
	for m, name := range metrics {
		t.Logf("%s: %d of %d rejected at p ≤ 0.1", name, rejected[m], series)
		if rejected[m] < 9 || rejected[m] > 39 {
			t.Errorf("%s: %d of %d i.i.d. series rejected at 0.1; want 24 ± 15 (binomial, 3.3 sd)", name, rejected[m], series)
		}
	}
}
