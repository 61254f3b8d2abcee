package groups

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestCliffHL checks Cliff's δ and the Hodges–Lehmann shift against their
// definitions computed by brute force over all pairs (cliffBrute,
// medianPairwise), on samples with and without ties, of odd and even n·m.
func TestCliffHL(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for trial := 0; trial < 200; trial++ {
		n, m := 1+rng.IntN(25), 1+rng.IntN(25)
		a, b := make([]float64, n), make([]float64, m)
		ties := trial%2 == 0
		for i := range a {
			a[i] = rng.NormFloat64()
			if ties {
				a[i] = float64(rng.IntN(5))
			}
		}
		for i := range b {
			b[i] = 0.3 + rng.NormFloat64()
			if ties {
				b[i] = float64(rng.IntN(6)) - 0.0
			}
		}
		if got, want := CliffDelta(a, b), cliffBrute(a, b); math.Abs(got-want) > 1e-14 {
			t.Errorf("trial %d: δ = %v, brute %v", trial, got, want)
		}
		if got, want := HodgesLehmann(a, b), medianPairwise(a, b); got != want {
			t.Errorf("trial %d: HL = %v, brute %v", trial, got, want)
		}
	}
	// Analytic: a = {1,2,3}, b = {4,5,6}: differences 1,2,2,3,3,3,4,4,5,
	// median 3; every b exceeds every a, δ = 1.
	a, b := []float64{1, 2, 3}, []float64{4, 5, 6}
	if HodgesLehmann(a, b) != 3 || CliffDelta(a, b) != 1 || CliffDelta(b, a) != -1 {
		t.Errorf("HL %v δ %v %v", HodgesLehmann(a, b), CliffDelta(a, b), CliffDelta(b, a))
	}
	// Signed zeros and extreme magnitudes in the bisection key.
	a, b = []float64{-0.0, 0, 1e300, -1e300}, []float64{0, -1e-300, 5}
	if got, want := HodgesLehmann(a, b), medianPairwise(a, b); got != want {
		t.Errorf("extremes: %v vs %v", got, want)
	}
	if !math.IsNaN(HodgesLehmann(nil, b)) || !math.IsNaN(CliffDelta(a, nil)) {
		t.Error("empty input should give NaN")
	}
}

// TestEffectInvariance: δ is invariant under any strictly increasing map
// and changes sign under negation (definition); HL is equivariant,
// HL(αa+β, αb+β) = α·HL(a, b) (median of differences); the median
// difference over the pooled MAD is invariant under αx + β for α > 0 and
// flips sign for α < 0 (ratio of equivariant quantities).
func TestEffectInvariance(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	a, b := normals(rng, 21, 0, 1), normals(rng, 16, 0.8, 1.5)
	o, _ := Options{}.resolve()
	ref := compareFeature(a, b, o)
	for _, c := range []struct{ al, be float64 }{{1e-6, 3}, {2.5e3, -1}, {-2, 0.5}} {
		ta, tb := make([]float64, len(a)), make([]float64, len(b))
		for i := range a {
			ta[i] = c.al*a[i] + c.be
		}
		for i := range b {
			tb[i] = c.al*b[i] + c.be
		}
		got := compareFeature(ta, tb, o)
		sign := math.Copysign(1, c.al)
		if !near(got.CliffDelta, sign*ref.CliffDelta, 1e-15, 0) {
			t.Errorf("α=%v: δ %v, want %v", c.al, got.CliffDelta, sign*ref.CliffDelta)
		}
		// Rounding of αx + β: a few ulps of the transformed magnitudes.
		if !near(got.HodgesLehmann, c.al*ref.HodgesLehmann, 1e-15*(math.Abs(c.be)+10*math.Abs(c.al)), 1e-12) {
			t.Errorf("α=%v: HL %v, want %v", c.al, got.HodgesLehmann, c.al*ref.HodgesLehmann)
		}
		if !near(got.MedianDiffMAD, sign*ref.MedianDiffMAD, 0, 1e-8) { // same rounding, relative to a MAD-sized difference
			t.Errorf("α=%v: Δmed/MAD %v, want %v", c.al, got.MedianDiffMAD, sign*ref.MedianDiffMAD)
		}
		if got.MW.P != ref.MW.P || got.KS.P != ref.KS.P {
			t.Errorf("α=%v: p-values changed: %v %v vs %v %v", c.al, got.MW.P, got.KS.P, ref.MW.P, ref.KS.P)
		}
	}
}

// TestCliffMagnitude checks the thresholds of Romano et al. (2006;
// thresholds as in rdrr.io/github/MHS-R/mhs/man/getCliffsD.html): 0.147, 0.33, 0.474.
func TestCliffMagnitude(t *testing.T) {
	for _, c := range []struct {
		d    float64
		want string
	}{{0, MagnitudeNegligible}, {-0.146, MagnitudeNegligible}, {0.147, MagnitudeSmall}, {-0.329, MagnitudeSmall},
		{0.33, MagnitudeMedium}, {0.4739, MagnitudeMedium}, {-0.474, MagnitudeLarge}, {1, MagnitudeLarge}, {math.NaN(), ""}} {
		if got := CliffMagnitude(c.d); got != c.want {
			t.Errorf("CliffMagnitude(%v) = %q, want %q", c.d, got, c.want)
		}
	}
}

// TestDescribe checks Describe on small examples computed by hand with
// Hyndman & Fan definition 7 and the normal-consistent MAD (1.4826…).
func TestDescribe(t *testing.T) {
	// {1,2,3,4}: h = 3p; Q1 = 1 + 0.75 = 1.75, median 2.5, Q3 3.25;
	// |x − 2.5| = {1.5, .5, .5, 1.5}, median 1 → MAD 1.482602218505602;
	// mean 2.5, SD √(5/3).
	s := Describe([]float64{4, 1, math.NaN(), 3, 2, math.Inf(1)})
	want := Summary{N: 4, Missing: 2, Median: 2.5, Q1: 1.75, Q3: 3.25, IQR: 1.5, MAD: madNormal, Mean: 2.5, SD: math.Sqrt(5.0 / 3), Min: 1, Max: 4}
	if s != want {
		t.Errorf("Describe = %+v\nwant %+v", s, want)
	}
	// Outlier: {1,2,3,4,100}: median 3, deviations {2,1,0,1,97}, MAD raw 1.
	if s := Describe([]float64{1, 2, 3, 4, 100}); s.Median != 3 || s.MAD != madNormal {
		t.Errorf("outlier: median %v MAD %v", s.Median, s.MAD)
	}
	if s := Describe([]float64{7}); s.N != 1 || s.Median != 7 || s.IQR != 0 || !math.IsNaN(s.SD) {
		t.Errorf("single: %+v", s)
	}
	if s := Describe([]float64{math.NaN()}); s.N != 0 || s.Missing != 1 || !math.IsNaN(s.Median) {
		t.Errorf("all missing: %+v", s)
	}
}

// TestSpearman checks limiting cases: a strictly increasing relation has
// ρ = 1 and p = 0, a decreasing one ρ = −1 (definition); a constant
// coordinate or fewer than 3 pairs give NaN; pairs with NaN are dropped;
// ρ is invariant under strictly increasing maps of either coordinate.
func TestSpearman(t *testing.T) {
	x := []float64{1, 2, 3, 4, 5, 6}
	y := []float64{1, 8, 27, 64, 125, 216}
	if r := Spearman(x, y); r.Rho != 1 || r.P != 0 || r.N != 6 {
		t.Errorf("increasing: %+v", r)
	}
	if r := Spearman(x, []float64{6, 5, 4, 3, 2, 1}); r.Rho != -1 {
		t.Errorf("decreasing: %+v", r)
	}
	if r := Spearman(x, []float64{2, 2, 2, 2, 2, 2}); !math.IsNaN(r.Rho) || !math.IsNaN(r.P) {
		t.Errorf("constant: %+v", r)
	}
	if r := Spearman([]float64{1, 2, math.NaN()}, []float64{3, 4, 5}); r.N != 2 || !math.IsNaN(r.Rho) {
		t.Errorf("two pairs: %+v", r)
	}
	if r := Spearman(x, y[:3]); !math.IsNaN(r.Rho) {
		t.Errorf("length mismatch: %+v", r)
	}
	rng := rand.New(rand.NewPCG(11, 12))
	a, b := normals(rng, 30, 0, 1), normals(rng, 30, 0, 1)
	ref := Spearman(a, b)
	ea := make([]float64, len(a))
	for i := range a {
		ea[i] = math.Exp(3 * a[i])
	}
	if r := Spearman(ea, b); !near(r.Rho, ref.Rho, 1e-15, 0) {
		t.Errorf("monotone map: %v vs %v", r.Rho, ref.Rho)
	}
}

// TestSketchPool checks Sketch (inverse ECDF at (i+½)/k) and Pool (equal
// weight per trace) on hand examples.
func TestSketchPool(t *testing.T) {
	x := []float64{5, 1, 4, 2, 3, math.NaN(), 6, 8, 7, 10, 9}
	// 10 finite values, k = 5: probabilities 0.1, 0.3, …, 0.9 → the
	// ⌈10p⌉-th smallest: 1, 3, 5, 7, 9.
	got := Sketch(x, 5)
	want := []float64{1, 3, 5, 7, 9}
	for i := range want {
		if got[i] != want[i] {
			t.Fatalf("Sketch = %v, want %v", got, want)
		}
	}
	if got := Sketch([]float64{3, 1, 2}, 5); len(got) != 3 || got[0] != 1 || got[2] != 3 {
		t.Errorf("short Sketch = %v", got)
	}
	// Trace 1 {0, 0, 0, 1} and trace 2 {1}: weights ¼ per value of trace
	// 1 and 1 for trace 2, halved: F(0) = 3/8, F(1) = 1; mean = (¼ + 1)/2.
	d := Pool([][]float64{{0, 0, 0, 1}, {1}, {math.NaN()}}, 0)
	if d.Traces != 2 || d.Values != 5 || len(d.X) != 2 || d.CDF[0] != 0.375 || d.CDF[1] != 1 || d.Mean != 0.625 || d.Median != 1 || d.Q1 != 0 {
		t.Errorf("Pool = %+v", d)
	}
	// Reduction keeps at most points+1 points, ascending, ending at 1.
	var big []float64
	for i := 0; i < 5000; i++ {
		big = append(big, float64(i%997)+0.5*float64(i%3))
	}
	d = Pool([][]float64{big}, 64)
	if len(d.X) > 65 || d.CDF[len(d.CDF)-1] != 1 {
		t.Errorf("reduced Pool: %d points, last %v", len(d.X), d.CDF[len(d.CDF)-1])
	}
	for i := 1; i < len(d.X); i++ {
		if d.X[i] <= d.X[i-1] || d.CDF[i] < d.CDF[i-1] {
			t.Fatalf("reduced Pool not ascending at %d", i)
		}
	}
}
