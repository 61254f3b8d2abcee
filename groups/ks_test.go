package groups

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

// ksBrute returns the exact two-sided p-value by enumerating every
// arrangement of n a's and m b's (each equally likely under H₀ without
// ties) and counting those whose statistic is at least h (= D·n·m).
// Independent of the lattice recursion: it walks all C(n+m, n) sequences.
func ksBrute(n, m, h int) float64 {
	total, hit := 0, 0
	var rec func(i, j, maxd int)
	rec = func(i, j, maxd int) {
		d := i*m - j*n
		if d < 0 {
			d = -d
		}
		maxd = max(maxd, d)
		if i == n && j == m {
			total++
			if maxd >= h {
				hit++
			}
			return
		}
		if i < n {
			rec(i+1, j, maxd)
		}
		if j < m {
			rec(i, j+1, maxd)
		}
	}
	rec(0, 0, 0)
	return float64(hit) / float64(total)
}

// TestKSExactEnumeration checks the exact p-value against brute-force
// enumeration of all arrangements (definition of the permutation null
// distribution, Smirnov 1948) for every attainable statistic.
func TestKSExactEnumeration(t *testing.T) {
	for _, c := range [][2]int{{1, 1}, {1, 5}, {3, 3}, {4, 6}, {5, 7}, {6, 6}, {7, 3}, {8, 5}} {
		n, m := c[0], c[1]
		for h := 1; h <= n*m; h++ {
			got, want := ksExactSF(n, m, h), ksBrute(n, m, h)
			if math.Abs(got-want) > 1e-14 { // enumeration: exact rational up to rounding
				t.Errorf("n=%d m=%d h=%d: p = %.17g, enumeration %.17g", n, m, h, got, want)
			}
		}
	}
}

// TestKSSeparation checks complete separation of n versus n values:
// exactly 2 of the C(2n, n) arrangements reach D = 1, so p = 2/C(2n, n)
// (analytic), e.g. 2/C(60, 30) = 1.691e-17 for n = 30, with full relative
// precision.
func TestKSSeparation(t *testing.T) {
	for _, n := range []int{3, 10, 30, 60} {
		a := make([]float64, n)
		b := make([]float64, n)
		for i := range a {
			a[i] = float64(i)
			b[i] = float64(i) + 1000
		}
		r, err := KS(a, b, KSOptions{})
		if err != nil {
			t.Fatal(err)
		}
		lc, _ := math.Lgamma(float64(2*n + 1))
		ln, _ := math.Lgamma(float64(n + 1))
		want := 2 * math.Exp(-(lc - 2*ln))
		if r.D != 1 || r.Method != MethodExact || math.Abs(r.P-want) > 1e-12*want { // analytic 2/C(2n,n); Lgamma rounding ~1e-14 rel
			t.Errorf("n=%d: D = %v p = %.17g (%s), want 1 and %.17g", n, r.D, r.P, r.Method, want)
		}
	}
}

// TestKSInvariance: D depends only on the order of the pooled values, so
// it and p are unchanged by a·x + b with a > 0 and by any strictly
// increasing map (definition of D); a < 0 mirrors both samples, which
// leaves sup |F_a − F_b| unchanged as well.
func TestKSInvariance(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	a, b := normals(rng, 17, 0, 1), normals(rng, 23, 0.7, 1)
	ref, err := KS(a, b, KSOptions{})
	if err != nil {
		t.Fatal(err)
	}
	maps := map[string]func(float64) float64{
		"1e-6x+3": func(x float64) float64 { return 1e-6*x + 3 },
		"-2x+1":   func(x float64) float64 { return -2*x + 1 },
		"exp":     math.Exp,
	}
	for name, f := range maps {
		ta, tb := make([]float64, len(a)), make([]float64, len(b))
		for i := range a {
			ta[i] = f(a[i])
		}
		for i := range b {
			tb[i] = f(b[i])
		}
		r, err := KS(ta, tb, KSOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if r.D != ref.D || r.P != ref.P {
			t.Errorf("%s: D = %v p = %v, want %v %v", name, r.D, r.P, ref.D, ref.P)
		}
	}
	// Symmetric in the two samples.
	if r, _ := KS(b, a, KSOptions{}); r.D != ref.D || r.P != ref.P {
		t.Errorf("swapped: %v %v, want %v %v", r.D, r.P, ref.D, ref.P)
	}
}

// TestKSExactVersusAsymptotic: for n = m = 300 (N = 150) the exact
// two-sample p-value, a step function of D with steps 1/n, lies between
// the continuous Kolmogorov-distribution value at D and at D − 1/(2n)
// (the usual continuity correction), for p between 1e-4 and 0.9; both
// approximate the same limit law (Smirnov 1948).
func TestKSExactVersusAsymptotic(t *testing.T) {
	n := 300
	checked := 0
	for h := n * n / 20; h <= n*n/6; h += n * n / 100 {
		d := float64(h) / float64(n*n)
		ex := ksExactSF(n, n, h)
		if ex < 1e-4 || ex > 0.9 {
			continue
		}
		lo, hi := KolmogorovSF(n/2, d), KolmogorovSF(n/2, d-0.5/float64(n))
		if ex < lo || ex > hi {
			t.Errorf("D = %.4f: exact %.5f outside [%.5f, %.5f]", d, ex, lo, hi)
		}
		checked++
	}
	if checked < 5 {
		t.Fatalf("only %d points checked", checked)
	}
}

// TestKSAuto checks the automatic method choice and the ties flag.
func TestKSAuto(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	a, b := normals(rng, 50, 0, 1), normals(rng, 40, 0, 1)
	if r, _ := KS(a, b, KSOptions{}); r.Method != MethodExact || r.Ties {
		t.Errorf("50×40: %s ties=%v, want exact without ties", r.Method, r.Ties)
	}
	if r, _ := KS(a, b, KSOptions{ExactMax: 100}); r.Method != MethodAsymptotic {
		t.Errorf("ExactMax 100: %s, want asymptotic", r.Method)
	}
	if r, _ := KS([]float64{1, 2, 2, 3}, []float64{2, 4, 5}, KSOptions{}); !r.Ties {
		t.Error("tied data not flagged")
	}
	// Identical samples: D = 0, p = 1 (definition).
	if r, _ := KS(a, a, KSOptions{}); r.D != 0 || r.P != 1 {
		t.Errorf("identical: D = %v p = %v", r.D, r.P)
	}
}

// TestKSErrors checks the input errors.
func TestKSErrors(t *testing.T) {
	if _, err := KS(nil, []float64{1}, KSOptions{}); !errors.Is(err, ErrEmpty) {
		t.Errorf("empty: %v", err)
	}
	if _, err := KS([]float64{1, math.NaN()}, []float64{1}, KSOptions{}); !errors.Is(err, ErrNotFinite) {
		t.Errorf("NaN: %v", err)
	}
	if _, err := KS([]float64{1}, []float64{2}, KSOptions{Method: "bogus"}); err == nil {
		t.Error("unknown method accepted")
	}
}

// TestKolmogorovSFAnalytic checks KolmogorovSF against closed forms:
// N = 1: D₁ = max(U, 1−U), so P(D₁ ≥ d) = 1 for d ≤ ½ and 2(1−d) above
// (analytic); the Ruben–Gambino extreme tail 2(1−d)^N for d ≥ 1 − 1/N
// (analytic); and the limit's 5 % point x = 1.3581 (Smirnov 1948 table,
// confirmed: scipy/special/tests/test_kolmogorov.py test_linspacei, kolmogi(0.05) = 1.3580986393225507, stored copy MLXPorts/mlx-scipy) for KolmogorovLimitSF.
func TestKolmogorovSFAnalytic(t *testing.T) {
	for _, d := range []float64{0.1, 0.3, 0.5, 0.6, 0.75, 0.99} {
		want := 1.0
		if d > 0.5 {
			want = 2 * (1 - d)
		}
		if got := KolmogorovSF(1, d); math.Abs(got-want) > 1e-14 {
			t.Errorf("N=1 d=%v: %v, want %v", d, got, want)
		}
	}
	for _, n := range []int{3, 10, 50} {
		d := 1 - 0.5/float64(n)
		if got, want := KolmogorovSF(n, d), 2*math.Pow(1-d, float64(n)); math.Abs(got-want) > 1e-12*want {
			t.Errorf("N=%d d=%v: %v, want %v", n, d, got, want)
		}
	}
	if got := KolmogorovLimitSF(1.3581); math.Abs(got-0.05) > 1e-4 {
		t.Errorf("Q(1.3581) = %v, want 0.05", got)
	}
	// Both series branches meet continuously at x = 1.18 (same function).
	if a, b := KolmogorovLimitSF(1.18-1e-12), KolmogorovLimitSF(1.18); math.Abs(a-b) > 1e-11 {
		t.Errorf("branches disagree at 1.18: %v %v", a, b)
	}
}
