package nonlinear

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

// naiveSampEnCounts is the O(N²) definition of Richman & Moorman (2000):
// templates i = 0..N−m−1, pairs i < j, match when every |x_{i+k} − x_{j+k}|
// ≤ r; A also requires k = m.
func naiveSampEnCounts(x []float64, m int, r float64) (a, b int64) {
	nt := len(x) - m
	for i := 0; i < nt; i++ {
	next:
		for j := i + 1; j < nt; j++ {
			for k := 0; k < m; k++ {
				if math.Abs(x[i+k]-x[j+k]) > r {
					continue next
				}
			}
			b++
			if math.Abs(x[i+m]-x[j+m]) <= r {
				a++
			}
		}
	}
	return a, b
}

// The fast counts must equal the O(N²) definition exactly on random inputs
// (reference: naiveSampEnCounts above), for continuous, heavy-tailed,
// quantised (ties at exactly r) and chaotic data.
func TestSampleEntropyMatchesNaive(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	kinds := map[string]func(int) []float64{
		"gauss": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = rng.NormFloat64()
			}
			return x
		},
		"cauchy": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = math.Tan(math.Pi * (rng.Float64() - 0.5))
			}
			return x
		},
		"quantised": func(n int) []float64 {
			x := make([]float64, n)
			for i := range x {
				x[i] = float64(rng.IntN(7))
			}
			return x
		},
		"henon": func(n int) []float64 { return series(t, henon, n, rng.Uint64()) },
	}
	for name, gen := range kinds {
		for _, n := range []int{50, 300, 1200} {
			x := gen(n)
			for _, m := range []int{1, 2, 3} {
				for _, r := range []float64{0.1, 0.2, 0.5} {
					res, err := SampleEntropy(x, SampEnOptions{M: m, R: r})
					if err != nil {
						t.Fatal(err)
					}
					a, b := naiveSampEnCounts(x, m, res.Tolerance)
					if res.A != a || res.B != b {
						t.Fatalf("%s n=%d m=%d r=%g: fast A=%d B=%d, naive A=%d B=%d", name, n, m, r, res.A, res.B, a, b)
					}
					if a > 0 && b > 0 && res.Value != -math.Log(float64(a)/float64(b)) {
						t.Fatalf("%s: value %g not −ln(A/B)", name, res.Value)
					}
				}
			}
		}
	}
}

// i.i.d. N(0,1), m = 2, r = 0.2: SampEn → −ln(2Φ(0.2/√2) − 1) = 2.1851
// (Richman & Moorman, Am. J. Physiol. 278 (2000) H2039; value derived: for
// i.i.d. data the conditional match probability is the one-point one,
// P(|X−Y| ≤ r) with X−Y ~ N(0, 2)). At n = 20000 the spread over 20 seeds
// was 0.0037, so 0.015 is four standard deviations.
func TestSampleEntropyIIDGaussian(t *testing.T) {
	want := -math.Log(2*phi(0.2/math.Sqrt2) - 1)
	if math.Abs(want-2.1851) > 1e-3 {
		t.Fatalf("derived value %g", want)
	}
	res, err := SampleEntropy(series(t, white, 20000, 1), SampEnOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(res.Value-want) > 0.015 {
		t.Errorf("SampEn = %.4f, want %.4f ± 0.015", res.Value, want)
	}
	t.Logf("SampEn(iid N(0,1)) = %.4f (derived %.4f), A = %d, B = %d", res.Value, want, res.A, res.B)
}

// phi is the standard normal CDF.
func phi(x float64) float64 { return 0.5 * math.Erfc(-x/math.Sqrt2) }

func TestSampleEntropyUndefined(t *testing.T) {
	// Strictly increasing steps far apart: no template matches another.
	x := make([]float64, 100)
	for i := range x {
		x[i] = float64(i * i)
	}
	res, err := SampleEntropy(x, SampEnOptions{R: 0.001})
	if err != nil {
		t.Fatal(err)
	}
	if res.Defined || !math.IsNaN(res.Value) || res.B != 0 {
		t.Errorf("want undefined, got %+v", res)
	}
	if _, err := SampleEntropy(make([]float64, 100), SampEnOptions{}); !errors.Is(err, ErrConstant) {
		t.Errorf("constant: err = %v, want ErrConstant", err)
	}
}
