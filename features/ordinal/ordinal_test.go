package ordinal

import (
	"errors"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestPatternCodesBijective checks that the Lehmer encoding is a bijection:
// a window whose ranks are Pattern(c) encodes back to c, for every c and
// every order (analytic: the Lehmer code enumerates permutations).
func TestPatternCodesBijective(t *testing.T) {
	for d := MinOrder; d <= MaxOrder; d++ {
		n := factorial(d)
		seen := make(map[string]bool, n)
		for c := 0; c < n; c++ {
			r, err := Pattern(c, d)
			if err != nil {
				t.Fatal(err)
			}
			x := make([]float64, d)
			for i, v := range r {
				x[i] = float64(v)
			}
			dist, err := Patterns(x, Options{Order: d})
			if err != nil {
				t.Fatal(err)
			}
			if dist.Windows != 1 || dist.Counts[c] != 1 {
				t.Fatalf("d=%d: ranks %v do not encode to %d", d, r, c)
			}
			key := string(rune(0)) + string(rune(len(r)))
			for _, v := range r {
				key += string(rune('a' + v))
			}
			if seen[key] {
				t.Fatalf("d=%d: pattern %v decoded twice", d, r)
			}
			seen[key] = true
		}
	}
	if r, _ := Pattern(0, 3); !slices.Equal(r, []int{0, 1, 2}) {
		t.Errorf("code 0 = %v, want increasing [0 1 2]", r)
	}
	if r, _ := Pattern(5, 3); !slices.Equal(r, []int{2, 1, 0}) {
		t.Errorf("code 5 = %v, want decreasing [2 1 0]", r)
	}
}

// TestTieRule checks the documented stable ranking: of two equal values the
// earlier counts as the smaller (common practice, order of appearance).
func TestTieRule(t *testing.T) {
	tests := []struct {
		x     []float64 // one window, or windows that all share one pattern
		ranks []int
	}{
		{[]float64{1, 1, 1, 2}, []int{0, 1, 2}}, // all ties: increasing
		{[]float64{2, 1, 1}, []int{2, 0, 1}},
		{[]float64{1, 2, 1}, []int{0, 2, 1}},
		{[]float64{3, 3, 1}, []int{1, 2, 0}},
	}
	for _, tc := range tests {
		dist, err := Patterns(tc.x, Options{Order: 3})
		if err != nil {
			t.Fatal(err)
		}
		code := slices.IndexFunc(dist.Counts, func(c int) bool { return c > 0 })
		if dist.Counts[code] != dist.Windows {
			t.Fatalf("%v: windows have different patterns %v", tc.x, dist.Counts)
		}
		r, _ := Pattern(code, 3)
		if !slices.Equal(r, tc.ranks) {
			t.Errorf("%v: ranks %v, want %v", tc.x, r, tc.ranks)
		}
		if dist.Ties != dist.Windows {
			t.Errorf("%v: %d tied windows, want %d", tc.x, dist.Ties, dist.Windows)
		}
	}
}

// TestIIDEntropyAndComplexity checks permutation entropy ≈ 1 (Bandt &
// Pompe, Phys. Rev. Lett. 88 (2002) 174102) and complexity ≈ 0 (Rosso et
// al., Phys. Rev. Lett. 99 (2007) 154102) for i.i.d. noise, n = 2^15. The
// tolerance comes from the finite-sample bias: 1 − H_S ≈ (d!−1)/(2W ln d!)
// (derived, Miller–Madow-type bias), so 1 − H_S must lie within [0, 2·bias]
// (the measured ratio is 1.02–1.25 here, and the relative sd of the plug-in
// deficit is √(2/(d!−1)) ≤ 0.82 at d = 3, hence the looser factor 4 there).
// To second order in P − P_e, J = ln(d!)·(1 − H_S)/4 (derived: both are
// quadratic in the deviations), so C_JS ≈ Q0·ln(d!)·(1 − H_S)·H_S/4 within
// 5%, which bounds C_JS by the same bias.
func TestIIDEntropyAndComplexity(t *testing.T) {
	x := white(1<<15, newRNG(1))
	for d := MinOrder; d <= MaxOrder; d++ {
		dist, err := Patterns(x, Options{Order: d})
		if err != nil {
			t.Fatal(err)
		}
		e := dist.Entropy()
		c := dist.Complexity()
		def := 1 - e.Entropy
		factor := 2.0
		if d == 3 {
			factor = 4
		}
		if def < 0 || def > factor*e.BiasIID {
			t.Errorf("d=%d: 1 − H = %.5f, i.i.d. bias %.5f", d, def, e.BiasIID)
		}
		n := float64(factorial(d))
		pred := Q0(factorial(d)) * math.Log(n) * def * e.Entropy / 4
		if math.Abs(c.Complexity-pred) > 0.05*pred {
			t.Errorf("d=%d: C = %.5f, second-order prediction %.5f", d, c.Complexity, pred)
		}
		t.Logf("d=%d: H = %.5f (1−H %.5f, bias %.5f), C = %.5f (predicted %.5f)", d, e.Entropy, def, e.BiasIID, c.Complexity, pred)
	}
}

// TestLogisticForbiddenTriple checks that the logistic map at r = 4 never
// shows x_t > x_{t+1} > x_{t+2} (Amigó, Zambrano & Sanjuán, EPL 79 (2007)
// 50001) while white noise of the same length shows every pattern.
func TestLogisticForbiddenTriple(t *testing.T) {
	const n = 20000
	m, err := Missing(logistic(t, n, 2), Options{Order: 3})
	if err != nil {
		t.Fatal(err)
	}
	dec := factorial(3) - 1 // Lehmer code of the decreasing triple
	if m.Missing != 1 || m.Codes[0] != dec {
		t.Errorf("logistic d=3: missing codes %v, want only %d (decreasing)", m.Codes, dec)
	}
	w, err := Missing(white(n, newRNG(3)), Options{Order: 3})
	if err != nil {
		t.Fatal(err)
	}
	if w.Missing != 0 {
		t.Errorf("white d=3: %d patterns missing", w.Missing)
	}
}

// TestChaosVersusNoise checks that chaotic maps have lower permutation
// entropy and higher complexity than noise (Bandt & Pompe 2002; Rosso et al.
// 2007), and that the logistic map at r = 4 with d = 6 lies near the upper
// boundary of the complexity–entropy plane (Rosso et al. 2007). "Near" is
// C ≥ 0.9·C_max(H_S): the map sits at 0.98 here, while the plane spans
// C_min = 0.18 to C_max = 0.49 at its entropy.
func TestChaosVersusNoise(t *testing.T) {
	const n = 1 << 15
	noise, err := Complexity(white(n, newRNG(4)), Options{Order: 6})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name string
		x    []float64
	}{{"logistic", logistic(t, n, 5)}, {"henon", henon(t, n, 6)}} {
		for _, d := range []int{4, 5, 6} {
			c, err := Complexity(tc.x, Options{Order: d})
			if err != nil {
				t.Fatal(err)
			}
			w, err := Complexity(white(n, newRNG(uint64(10+d))), Options{Order: d})
			if err != nil {
				t.Fatal(err)
			}
			if c.Entropy >= w.Entropy-0.1 || c.Complexity <= w.Complexity+0.1 {
				t.Errorf("%s d=%d: (H, C) = (%.3f, %.3f), noise (%.3f, %.3f)", tc.name, d, c.Entropy, c.Complexity, w.Entropy, w.Complexity)
			}
			t.Logf("%s d=%d: H = %.4f, C = %.4f ∈ [%.4f, %.4f]; noise H = %.4f, C = %.4f", tc.name, d, c.Entropy, c.Complexity, c.MinComplexity, c.MaxComplexity, w.Entropy, w.Complexity)
		}
	}
	c, err := Complexity(logistic(t, n, 7), Options{Order: 6})
	if err != nil {
		t.Fatal(err)
	}
	_, cmax, err := Bounds(6, c.Entropy)
	if err != nil {
		t.Fatal(err)
	}
	if cmax != c.MaxComplexity {
		t.Errorf("Bounds and Complexity disagree: %g vs %g", cmax, c.MaxComplexity)
	}
	if c.Complexity < 0.9*cmax || c.Complexity > cmax+1e-12 {
		t.Errorf("logistic d=6: C = %.4f, C_max(H=%.4f) = %.4f, want 0.9·C_max ≤ C ≤ C_max", c.Complexity, c.Entropy, cmax)
	}
	t.Logf("logistic d=6: C/C_max = %.3f; noise C = %.4f", c.Complexity/cmax, noise.Complexity)
}

// TestBoundsEnclosePlane checks the boundary curves of the complexity–
// entropy plane (Martin, Plastino & Rosso, Physica A 369 (2006) 439
// checked: search.r-project.org/CRAN/refmans/statcomp/html/maxd6.html) numerically: random distributions over the d! patterns (from
// near-uniform to sparse) never leave the band between C_min(H) and
// C_max(H), and the extremes are attained by the curves' own families. It
// also checks Q0: a delta distribution has Q_J = 1 (derived: Q0 is the
// inverse of its divergence) and the uniform one C = 0.
func TestBoundsEnclosePlane(t *testing.T) {
	rng := newRNG(8)
	for _, d := range []int{3, 4, 5} {
		n := factorial(d)
		counts := make([]int, n)
		for trial := 0; trial < 3000; trial++ {
			sparsity := rng.Float64()
			power := 1 + 8*rng.Float64()
			total := 0
			for i := range counts {
				counts[i] = 0
				if rng.Float64() > sparsity || i == 0 {
					counts[i] = 1 + int(1000*math.Pow(rng.Float64(), power))
				}
				total += counts[i]
			}
			dist := &Distribution{Order: d, Delay: 1, Counts: counts, Windows: total}
			c := dist.Complexity()
			if c.Complexity > c.MaxComplexity+1e-9 || c.Complexity < c.MinComplexity-1e-9 {
				t.Fatalf("d=%d: C = %.6f outside [%.6f, %.6f] at H = %.6f", d, c.Complexity, c.MinComplexity, c.MaxComplexity, c.Entropy)
			}
		}
		delta := make([]int, n)
		delta[3] = 10
		c := (&Distribution{Order: d, Delay: 1, Counts: delta, Windows: 10}).Complexity()
		if math.Abs(c.Disequilibrium-1) > 1e-12 || c.Complexity != 0 {
			t.Errorf("d=%d delta: Q_J = %.15f (want 1), C = %g (want 0)", d, c.Disequilibrium, c.Complexity)
		}
		uni := make([]int, n)
		for i := range uni {
			uni[i] = 7
		}
		c = (&Distribution{Order: d, Delay: 1, Counts: uni, Windows: 7 * n}).Complexity()
		if c.Complexity > 1e-12 || math.Abs(c.Entropy-1) > 1e-12 {
			t.Errorf("d=%d uniform: H = %g, C = %g", d, c.Entropy, c.Complexity)
		}
	}
	lo, hi, err := BoundaryCurves(6, 101)
	if err != nil {
		t.Fatal(err)
	}
	for i := range lo {
		if lo[i].Complexity > hi[i].Complexity+1e-12 || lo[i].Complexity < 0 || hi[i].Complexity > 1 {
			t.Errorf("H = %.2f: C_min %.4f, C_max %.4f", lo[i].Entropy, lo[i].Complexity, hi[i].Complexity)
		}
	}
}

// TestMissingIIDBaseline checks the expected number of patterns an i.i.d.
// series misses by chance, d!·(1 − 1/d!)^W (derived; approximate because
// windows overlap), for d = 6 and n = 2000 (W/d! ≈ 2.8): the count must
// agree within 4·√expected (the missing count is a sum of nearly
// independent indicators, so its variance is below its mean; derived).
func TestMissingIIDBaseline(t *testing.T) {
	m, err := Missing(white(2000, newRNG(9)), Options{Order: 6})
	if err != nil {
		t.Fatal(err)
	}
	if d := math.Abs(float64(m.Missing) - m.ExpectedIID); d > 4*math.Sqrt(m.ExpectedIID) {
		t.Errorf("white d=6 n=2000: %d missing, i.i.d. expectation %.1f", m.Missing, m.ExpectedIID)
	}
	if m.Fraction != float64(m.Missing)/720 || len(m.Codes) != m.Missing {
		t.Errorf("inconsistent result %+v", m)
	}
	t.Logf("white d=6 n=2000: %d missing, expected %.1f (W/d! = %.2f)", m.Missing, m.ExpectedIID, m.WindowsPerPattern)
}

// TestInvariance checks x → a·x + b: for a > 0 the distribution is
// identical (patterns depend on order relations only, analytic); for a < 0
// code c maps to d!−1−c (the ranks reverse, analytic for tie-free data),
// so entropy, complexity and the missing count are unchanged.
func TestInvariance(t *testing.T) {
	x := henon(t, 5000, 11)
	for _, d := range []int{3, 5, 7} {
		for _, tau := range []int{1, 3} {
			opts := Options{Order: d, Delay: tau}
			ref, err := Patterns(x, opts)
			if err != nil {
				t.Fatal(err)
			}
			for _, ab := range [][2]float64{{1e-6, 3}, {2e4, -7}, {-1, 0}, {-3e-3, 12}} {
				y := make([]float64, len(x))
				for i, v := range x {
					y[i] = ab[0]*v + ab[1]
				}
				got, err := Patterns(y, opts)
				if err != nil {
					t.Fatal(err)
				}
				n := len(ref.Counts)
				for c := range ref.Counts {
					want := ref.Counts[c]
					idx := c
					if ab[0] < 0 {
						idx = n - 1 - c
					}
					if got.Counts[idx] != want {
						t.Fatalf("d=%d τ=%d a=%g: count of code %d is %d, want %d", d, tau, ab[0], idx, got.Counts[idx], want)
					}
				}
				e1, e2 := ref.Entropy().Entropy, got.Entropy().Entropy
				c1, c2 := ref.Complexity().Complexity, got.Complexity().Complexity
				if math.Abs(e1-e2) > 1e-12 || math.Abs(c1-c2) > 1e-12 || ref.Missing().Missing != got.Missing().Missing {
					t.Errorf("d=%d τ=%d a=%g: H %g vs %g, C %g vs %g", d, tau, ab[0], e1, e2, c1, c2)
				}
			}
		}
	}
}

// TestDelay checks the delay: with τ = 2 a series alternating between two
// interleaved increasing ramps is entirely increasing (analytic).
func TestDelay(t *testing.T) {
	x := make([]float64, 100)
	for i := range x {
		x[i] = float64(i/2) + 1000*float64(i%2)
	}
	dist, err := Patterns(x, Options{Order: 4, Delay: 2})
	if err != nil {
		t.Fatal(err)
	}
	if dist.Windows != 94 || dist.Counts[0] != 94 {
		t.Errorf("windows %d, increasing %d; want 94, 94", dist.Windows, dist.Counts[0])
	}
}

// TestEdgeCases checks the errors for short, constant and non-finite input
// and invalid options.
func TestEdgeCases(t *testing.T) {
	tests := []struct {
		name string
		x    []float64
		opts Options
		want error
	}{
		{"empty", nil, Options{}, ErrTooShort},
		{"shorter than a window", []float64{1, 2, 3, 4}, Options{Order: 5}, ErrTooShort},
		{"delay too long", []float64{1, 2, 3, 4, 5, 6, 7}, Options{Order: 3, Delay: 4}, ErrTooShort},
		{"constant", []float64{2, 2, 2, 2, 2, 2, 2, 2}, Options{Order: 3}, ErrConstant},
		{"nan", []float64{1, 2, math.NaN(), 4, 5}, Options{Order: 3}, ErrNonFinite},
		{"inf", []float64{1, 2, 3, math.Inf(1), 5}, Options{Order: 3}, ErrNonFinite},
		{"order 2", []float64{1, 2, 3, 4, 5}, Options{Order: 2}, ErrBadOption},
		{"order 8", []float64{1, 2, 3, 4, 5}, Options{Order: 8}, ErrBadOption},
		{"negative delay", []float64{1, 2, 3, 4, 5}, Options{Order: 3, Delay: -1}, ErrBadOption},
	}
	for _, tc := range tests {
		_, err1 := Entropy(tc.x, tc.opts)
		_, err2 := Complexity(tc.x, tc.opts)
		_, err3 := Missing(tc.x, tc.opts)
		for _, err := range []error{err1, err2, err3} {
			if !errors.Is(err, tc.want) {
				t.Errorf("%s: error %v, want %v", tc.name, err, tc.want)
			}
		}
		t.Logf("%s: %v", tc.name, err1)
	}
	if _, err := Pattern(6, 3); !errors.Is(err, ErrBadOption) {
		t.Errorf("Pattern(6, 3): %v", err)
	}
	if _, _, err := Bounds(5, 1.5); !errors.Is(err, ErrBadOption) {
		t.Errorf("Bounds(5, 1.5): %v", err)
	}
}

// FuzzPatterns checks that arbitrary input never panics and that the
// counts always add up to the number of windows.
func FuzzPatterns(f *testing.F) {
	f.Add([]byte{1, 2, 3, 4, 5, 6, 7, 8}, uint8(3), uint8(1))
	f.Add([]byte{9, 9, 9, 1, 9, 9}, uint8(4), uint8(2))
	f.Fuzz(func(t *testing.T, data []byte, d, tau uint8) {
		x := make([]float64, len(data))
		for i, b := range data {
			x[i] = float64(b)
		}
		dist, err := Patterns(x, Options{Order: int(d), Delay: int(tau)})
		if err != nil {
			return
		}
		sum := 0
		for _, c := range dist.Counts {
			sum += c
		}
		if sum != dist.Windows {
			t.Fatalf("counts sum %d, windows %d", sum, dist.Windows)
		}
		e := dist.Entropy().Entropy
		c := dist.Complexity()
		if e < 0 || e > 1+1e-12 || c.Complexity < 0 || c.Complexity > c.MaxComplexity+1e-9 {
			t.Fatalf("H = %g, C = %g (max %g)", e, c.Complexity, c.MaxComplexity)
		}
	})
}

// TestCodesMatchPatterns: the histogram of Codes is Patterns' Counts, under
// both tie rules (the two walk the same windows with the same encoding).
func TestCodesMatchPatterns(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 5))
	for _, ties := range []Ties{TiesStable, TiesSkip} {
		for d := MinOrder; d <= 7; d++ {
			x := make([]float64, 3000)
			for i := range x {
				x[i] = float64(rng.IntN(9))
			}
			o := Options{Order: d, Delay: 1 + rng.IntN(3), Ties: ties}
			dist, err := Patterns(x, o)
			if err != nil {
				t.Fatal(err)
			}
			codes, err := Codes(x, o)
			if err != nil {
				t.Fatal(err)
			}
			counts := make([]int, len(dist.Counts))
			for _, c := range codes {
				if c >= 0 {
					counts[c]++
				}
			}
			if !slices.Equal(counts, dist.Counts) {
				t.Fatalf("d %d ties %v: Codes histogram differs from Patterns", d, ties)
			}
		}
	}
}
