package surrogate

import (
	"errors"
	"math"
	"slices"
	"testing"
)

// TestValuesKept: shuffle, AAFT and IAAFT surrogates hold exactly the values
// of the data (sorted equality, bit for bit), for even, odd and prime
// lengths. Theiler et al., Physica D 58 (1992) 77 (shuffle, AAFT);
// Schreiber & Schmitz, Phys. Rev. Lett. 77 (1996) 635 (IAAFT).
func TestValuesKept(t *testing.T) {
	for _, n := range []int{1000, 999, 997} {
		x := series(t, "henon", n, 1)
		want := sortedCopy(x)
		for _, m := range []Method{Shuffle, AAFT, IAAFT} {
			set, err := Generate(x, Options{Method: m, Count: 5, Seed: 9})
			if err != nil {
				t.Fatal(err)
			}
			for i, s := range set.Surrogates {
				if !slices.Equal(sortedCopy(s), want) {
					t.Fatalf("%s n=%d surrogate %d: values differ from the data's", m, n, i)
				}
				if slices.Equal(s, x) {
					t.Fatalf("%s n=%d surrogate %d equals the data", m, n, i)
				}
			}
		}
	}
}

// TestFTKeepsPeriodogram: phase randomisation keeps |X_k|² for every k to
// rounding error (relative 1e-9 of the largest |X_k|²), for even, odd and
// Bluestein lengths. Theiler et al., Physica D 58 (1992) 77.
func TestFTKeepsPeriodogram(t *testing.T) {
	for _, n := range []int{1024, 1001, 997} {
		x := series(t, "ar1", n, 2)
		px := periodogram(x)
		top := slices.Max(px)
		set, err := Generate(x, Options{Method: FT, Count: 5, Seed: 3})
		if err != nil {
			t.Fatal(err)
		}
		for i, s := range set.Surrogates {
			ps := periodogram(s)
			for k := range px {
				if d := math.Abs(ps[k] - px[k]); d > 1e-9*top {
					t.Fatalf("n=%d surrogate %d k=%d: |X_k|² %g, data %g", n, i, k, ps[k], px[k])
				}
			}
			if e := relPeriodogramError(s, x); e > 1e-9 {
				t.Fatalf("n=%d surrogate %d: relative periodogram error %g > 1e-9", n, i, e)
			}
		}
	}
}

// TestIAAFTSpectrum measures how closely IAAFT surrogates (default options:
// tolerance 1e-3, cap 200) match the data's spectrum, n = 2000, 10
// surrogates each. Measured (max over surrogates, relative amplitude error
// / relative periodogram error, see spectralErrorOf and
// relPeriodogramError): AR(1) φ = 0.7 0.0020 / 0.0017 (≤ 48 iterations);
// Hénon 0.0033 / 0.0036 (≤ 59); logistic r = 4 0.0036 / 0.0051 (≤ 79).
// Stated bounds: amplitude ≤ 0.006, periodogram ≤ 0.01 at n = 2000 (the
// error falls roughly like 1/n: 0.00037 for AR(1) at n = 10^4). AAFT
// surrogates of the same series are checked to be clearly worse (its
// spectral bias, which IAAFT removes: Schreiber & Schmitz, Phys. Rev. Lett.
// 77 (1996) 635); measured AAFT amplitude errors 0.04, 0.24, 0.31.
func TestIAAFTSpectrum(t *testing.T) {
	for _, sys := range []string{"ar1", "henon", "logistic"} {
		x := series(t, sys, 2000, 4)
		set, err := Generate(x, Options{Method: IAAFT, Count: 10, Seed: 5})
		if err != nil {
			t.Fatal(err)
		}
		aa, err := Generate(x, Options{Method: AAFT, Count: 10, Seed: 5})
		if err != nil {
			t.Fatal(err)
		}
		if set.NotConverged != 0 {
			t.Errorf("%s: %d surrogates hit the iteration cap", sys, set.NotConverged)
		}
		var maxAmp, maxPer, maxIt, meanAA float64
		for i, s := range set.Surrogates {
			e := set.SpectralError[i]
			// The reported error must be the error of the returned series.
			if got := spectralErrorOf(s, x); math.Abs(got-e) > 1e-12 {
				t.Fatalf("%s surrogate %d: reported spectral error %g, recomputed %g", sys, i, e, got)
			}
			maxAmp = math.Max(maxAmp, e)
			maxPer = math.Max(maxPer, relPeriodogramError(s, x))
			maxIt = math.Max(maxIt, float64(set.Iterations[i]))
			meanAA += aa.SpectralError[i] / 10
		}
		t.Logf("%s n=2000: IAAFT max amplitude error %.4g, max periodogram error %.4g, max iterations %g; AAFT mean amplitude error %.4g",
			sys, maxAmp, maxPer, maxIt, meanAA)
		if maxAmp > 0.006 || maxPer > 0.01 {
			t.Errorf("%s: IAAFT spectral error %g (periodogram %g), want ≤ 0.006 (0.01)", sys, maxAmp, maxPer)
		}
		if meanAA < 3*maxAmp {
			t.Errorf("%s: AAFT error %g not clearly above IAAFT's %g", sys, meanAA, maxAmp)
		}
	}
}

// spectralErrorOf recomputes the relative amplitude error of s against x.
func spectralErrorOf(s, x []float64) float64 {
	ps, px := periodogram(s), periodogram(x)
	var num, den float64
	for k := 1; k < len(px); k++ {
		w := specWeight(k, len(x))
		d := math.Sqrt(ps[k]) - math.Sqrt(px[k])
		num += w * d * d
		den += w * px[k]
	}
	return math.Sqrt(num / den)
}

// TestGauss: Gaussianisation keeps the temporal rank order exactly (ties
// stay tied) and gives an N(0,1) marginal: the Kolmogorov–Smirnov distance
// from Φ is below the α = 0.01 critical value 1.628/√n (asymptotic
// Kolmogorov distribution, standard statistics tables). The data are
// heavy-tailed (ratio of normals) and then quantised to make ties.
// Rank-based transform, common practice.
func TestGauss(t *testing.T) {
	n := 4000
	x := series(t, "cauchy", n, 6)
	for i := range x {
		x[i] = math.Round(x[i]*50) / 50 // ties
	}
	crit := 1.628 / math.Sqrt(float64(n))
	det, err := Gaussianise(x)
	if err != nil {
		t.Fatal(err)
	}
	set, err := Generate(x, Options{Method: Gauss, Count: 4, Seed: 7})
	if err != nil {
		t.Fatal(err)
	}
	q, err := Generate(x, Options{Method: Gauss, Count: 2, Seed: 7, GaussQuantiles: true})
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(q.Surrogates[0], det) || !slices.Equal(q.Surrogates[1], det) {
		t.Fatal("quantile surrogates differ from Gaussianise")
	}
	all := append([][]float64{det}, set.Surrogates...)
	for i, g := range all {
		for a := 0; a < n; a += 7 {
			for b := a + 1; b < n; b += 13 {
				if (x[a] < x[b]) != (g[a] < g[b]) || (x[a] == x[b]) != (g[a] == g[b]) {
					t.Fatalf("series %d: order of (%d, %d) not kept: x %g %g, g %g %g", i, a, b, x[a], x[b], g[a], g[b])
				}
			}
		}
		// Ties are averaged, which moves the sample slightly off N(0,1);
		// the quantised data here have few ties among n, so the distance
		// stays well below the critical value.
		d := ksNormal(g)
		t.Logf("series %d: KS distance from N(0,1) %.4f (critical %.4f)", i, d, crit)
		if d > crit {
			t.Errorf("series %d: KS distance %g from N(0,1) > %g", i, d, crit)
		}
	}
	if d := ksNormal(x); d < 3*crit {
		t.Fatalf("test data not heavy-tailed enough: KS %g", d)
	}
}

// TestDeterminism: same seed ⇒ bit-identical surrogates whatever the number
// of workers; another seed gives other surrogates (project rule).
func TestDeterminism(t *testing.T) {
	x := series(t, "henon", 1000, 8)
	for _, m := range Methods() {
		var ref *Set
		for _, w := range []int{1, 3, 8} {
			set, err := Generate(x, Options{Method: m, Count: 7, Seed: 42, Workers: w})
			if err != nil {
				t.Fatal(err)
			}
			if ref == nil {
				ref = set
				continue
			}
			for i := range set.Surrogates {
				for j := range set.Surrogates[i] {
					if math.Float64bits(set.Surrogates[i][j]) != math.Float64bits(ref.Surrogates[i][j]) {
						t.Fatalf("%s: workers %d surrogate %d differs at %d", m, w, i, j)
					}
				}
			}
			if !slices.Equal(set.Iterations, ref.Iterations) {
				t.Fatalf("%s: iterations differ with %d workers", m, w)
			}
		}
		other, err := Generate(x, Options{Method: m, Count: 1, Seed: 43})
		if err != nil {
			t.Fatal(err)
		}
		if slices.Equal(other.Surrogates[0], ref.Surrogates[0]) {
			t.Fatalf("%s: seeds 42 and 43 give the same surrogate", m)
		}
	}
}

// TestEquivariance: surrogates of a·x + b are a·s + b (a > 0) for every
// method but Gauss, which returns the same series (project rule on scale
// and offset; FT is linear in x; the others depend on x only through its
// values in rank order and linear FFT steps).
func TestEquivariance(t *testing.T) {
	x := series(t, "henon", 1200, 9)
	const a, b = 1e-6, 3.0 // amperes to microamperes, with an offset
	y := make([]float64, len(x))
	for i, v := range x {
		y[i] = a*v + b
	}
	for _, m := range Methods() {
		sx, err := Generate(x, Options{Method: m, Count: 3, Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		sy, err := Generate(y, Options{Method: m, Count: 3, Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		for i := range sx.Surrogates {
			for j, v := range sx.Surrogates[i] {
				want := a*v + b
				if m == Gauss {
					want = v
				}
				// Rounding: b/a = 3e6 times the unit round-off of y.
				if d := math.Abs(sy.Surrogates[i][j] - want); d > 1e-12*math.Abs(b)+1e-9*a {
					t.Fatalf("%s surrogate %d [%d]: %g, want %g", m, i, j, sy.Surrogates[i][j], want)
				}
			}
		}
	}
}

// TestTestInvariance: the rank test of a scale- and offset-invariant
// statistic gives the same p-values for a·x + b, a > 0 (project rule),
// since the surrogates are equivariant (TestEquivariance) and the
// statistic invariant (TestTimeAsymmetry).
func TestTestInvariance(t *testing.T) {
	x := series(t, "ar1", 1500, 10)
	y := make([]float64, len(x))
	for i, v := range x {
		y[i] = 2e-6*v - 0.7
	}
	for _, m := range Methods() {
		opts := TestOptions{Options: Options{Method: m, Count: 39, Seed: 4}}
		rx, err := Test(x, []Statistic{TimeAsymmetryStat}, opts)
		if err != nil {
			t.Fatal(err)
		}
		ry, err := Test(y, []Statistic{TimeAsymmetryStat}, opts)
		if err != nil {
			t.Fatal(err)
		}
		a, b := rx.Tests[0], ry.Tests[0]
		if a.PUpper != b.PUpper || a.PLower != b.PLower || math.Abs(a.Z-b.Z) > 1e-6*math.Abs(a.Z)+1e-9 {
			t.Errorf("%s: p %g/%g z %g for x, p %g/%g z %g for a·x+b", m, a.PUpper, a.PLower, a.Z, b.PUpper, b.PLower, b.Z)
		}
	}
}

// TestGenerateErrors: bad input and options give the documented errors.
func TestGenerateErrors(t *testing.T) {
	good := series(t, "white", 64, 1)
	nan := slices.Clone(good)
	nan[5] = math.NaN()
	for _, tc := range []struct {
		name string
		x    []float64
		opt  Options
		want error
	}{
		{"short", good[:5], Options{}, ErrTooShort},
		{"nan", nan, Options{}, ErrNonFinite},
		{"constant", make([]float64, 20), Options{}, ErrConstant},
		{"method", good, Options{Method: "wavelet"}, ErrUnknownMethod},
		{"count", good, Options{Count: -1}, ErrOption},
		{"fraction", good, Options{EndMatch: true, MinFraction: 1.5}, ErrOption},
		{"maxiter", good, Options{MaxIter: -2}, ErrOption},
	} {
		if _, err := Generate(tc.x, tc.opt); !errors.Is(err, tc.want) {
			t.Errorf("%s: error %v, want %v", tc.name, err, tc.want)
		}
	}
	if _, err := ParseMethod("IAAFT"); err != nil {
		t.Errorf("ParseMethod(IAAFT): %v", err)
	}
	if m, _ := ParseMethod(""); m != IAAFT {
		t.Errorf("ParseMethod(\"\") = %q, want iaaft", m)
	}
}
