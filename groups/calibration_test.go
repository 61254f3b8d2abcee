package groups

import (
	"math"
	"math/rand/v2"
	"testing"
)

// attainableSize returns the largest null rejection probability ≤ alpha
// of a discrete test whose p-values are ps (the exact size of "reject when
// p ≤ alpha").
func attainableSize(ps []float64, alpha float64) float64 {
	best := 0.0
	for _, p := range ps {
		if p <= alpha && p > best {
			best = p
		}
	}
	return best
}

// TestCalibration draws two groups of 20 from the same normal
// distribution 2000 times and counts rejections at α = 0.05, then repeats
// with a shift of one standard deviation.
//
// Null: both exact tests are discrete, so their true size is the largest
// attainable p-value ≤ 0.05 (KS: P(D ≥ 9/20) for n = m = 20; MW: the
// largest two-sided tail ≤ 0.05), both ≤ 0.05. With 2000 repetitions the
// rejection rate has standard deviation ≤ √(0.05·0.95/2000) = 0.0049, so
// "rate ≤ 0.07" is 4 SD above the nominal level (false alarm < 1e-4), and
// the rate must also lie within 4 SD of the computed exact size, which
// checks that the p-values are calibrated, not merely conservative.
//
// Shift of 1 SD: the two-sample t-test has power 0.87 at d = 1, n = 20
// per group, α = 0.05 (Cohen, Statistical Power Analysis (1988), table
// 2.3.5; memory), and Mann–Whitney's asymptotic relative efficiency to it
// is 3/π ≈ 0.955 for normal data (Hodges & Lehmann 1956), so its power is
// about 0.85; with 500 repetitions (SD 0.016) we require ≥ 0.78. KS has
// lower power against a pure shift (no textbook value); "detects it in
// most repetitions" is checked as ≥ 0.5.
func TestCalibration(t *testing.T) {
	const n, reps, alpha = 20, 2000, 0.05
	rng := rand.New(rand.NewPCG(2024, 6))
	var ksRej, mwRej int
	for r := 0; r < reps; r++ {
		a, b := normals(rng, n, 0, 1), normals(rng, n, 0, 1)
		ks, err := KS(a, b, KSOptions{})
		if err != nil {
			t.Fatal(err)
		}
		mw, err := MannWhitney(a, b, MWOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if ks.Method != MethodExact || mw.Method != MethodExact {
			t.Fatalf("methods %s %s, want exact", ks.Method, mw.Method)
		}
		if ks.P <= alpha {
			ksRej++
		}
		if mw.P <= alpha {
			mwRej++
		}
	}
	var ksPs, mwPs []float64
	for h := 1; h <= n*n; h++ {
		ksPs = append(ksPs, ksExactSF(n, n, h))
	}
	for k := 0; k <= n*n/2; k++ {
		mwPs = append(mwPs, math.Min(1, 2*mwLowerTail(n, n, k)))
	}
	sd := math.Sqrt(alpha * (1 - alpha) / reps)
	for _, c := range []struct {
		name string
		rej  int
		size float64
	}{{"KS", ksRej, attainableSize(ksPs, alpha)}, {"MW", mwRej, attainableSize(mwPs, alpha)}} {
		rate := float64(c.rej) / reps
		t.Logf("%s: null rejection rate %.4f (exact size %.4f)", c.name, rate, c.size)
		if rate > 0.07 {
			t.Errorf("%s: rejection rate %.4f > 0.07 under H0", c.name, rate)
		}
		if math.Abs(rate-c.size) > 4*sd {
			t.Errorf("%s: rejection rate %.4f, exact size %.4f (±%.4f)", c.name, rate, c.size, 4*sd)
		}
	}

	const powReps = 500
	ksRej, mwRej = 0, 0
	for r := 0; r < powReps; r++ {
		a, b := normals(rng, n, 0, 1), normals(rng, n, 1, 1)
		ks, _ := KS(a, b, KSOptions{})
		mw, _ := MannWhitney(a, b, MWOptions{})
		if ks.P <= alpha {
			ksRej++
		}
		if mw.P <= alpha {
			mwRej++
		}
	}
	ksPow, mwPow := float64(ksRej)/powReps, float64(mwRej)/powReps
	t.Logf("power at a 1 SD shift, n = 20: KS %.3f, MW %.3f", ksPow, mwPow)
	if mwPow < 0.78 {
		t.Errorf("MW power %.3f < 0.78", mwPow)
	}
	if ksPow < 0.5 {
		t.Errorf("KS power %.3f < 0.5", ksPow)
	}
}
