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

// gridIID returns n i.i.d. N(0,1) samples recorded by an ADC with levels
// codes over ±3 (rounding to the nearest code, clipping at the rails),
// as code·q, and the code probabilities p_k (from Φ, the rails holding the
// tails) and the step q. With dither, each sample is spread uniformly over
// its cell (code ± q/2).
func gridIID(n, levels int, dither bool, seed uint64) (x, p []float64, q float64) {
	const c = 3.0
	q = 2 * c / float64(levels-1)
	p = make([]float64, levels)
	for k := range p {
		lo, hi := math.Inf(-1), math.Inf(1)
		if k > 0 {
			lo = -c + (float64(k)-0.5)*q
		}
		if k < levels-1 {
			hi = -c + (float64(k)+0.5)*q
		}
		p[k] = phi(hi) - phi(lo)
	}
	rng := rand.New(rand.NewPCG(seed, 0x9d))
	x = make([]float64, n)
	for i := range x {
		k := math.Max(0, math.Min(float64(levels-1), math.Round((rng.NormFloat64()+c)/q)))
		x[i] = k * q
		if dither {
			x[i] += q * (rng.Float64() - 0.5)
		}
	}
	return x, p, q
}

// gridSampEn is the limit of SampEn(m, r·sd) for i.i.d. data on the grid of
// gridIID (derived, as for TestSampleEntropyIIDGaussian: for i.i.d. data
// A/B → P(|Y − Y'| ≤ r) for two independent samples). With codes K, K' the
// difference is q·(K − K') on the grid, and q·(K − K' + D) when dithered,
// D = U − U' triangular on (−1, 1) with CDF F(t) = (1 + t)²/2 for t ≤ 0,
// 1 − (1 − t)²/2 for t ≥ 0. So P = Σ_j a_j·π_j with a_j = Σ_k p_k·p_{k+j},
// π_j = [|j|·q ≤ r] on the grid and F(ρ − j) − F(−ρ − j), ρ = r/q, dithered;
// r is rel times the standard deviation of Y, whose variance is that of the
// codes times q² plus q²/12 when dithered.
func gridSampEn(p []float64, q, rel float64, dither bool) float64 {
	var mean, m2 float64
	for k, pk := range p {
		mean += pk * float64(k) * q
		m2 += pk * float64(k) * q * float64(k) * q
	}
	v := m2 - mean*mean
	if dither {
		v += q * q / 12
	}
	r := rel * math.Sqrt(v)
	tri := func(t float64) float64 {
		switch {
		case t <= -1:
			return 0
		case t >= 1:
			return 1
		case t <= 0:
			return (1 + t) * (1 + t) / 2
		}
		return 1 - (1-t)*(1-t)/2
	}
	var match float64
	for k, pk := range p {
		for l, pl := range p {
			j := float64(k - l)
			if dither {
				match += pk * pl * (tri(r/q-j) - tri(-r/q-j))
			} else if math.Abs(j)*q <= r {
				match += pk * pl
			}
		}
	}
	return -math.Log(match)
}

// TestSampleEntropyOnAGrid documents the tie rule (a match is ≤ r, so on a
// grid only differences of whole steps within r count) and checks the
// derived limits of gridSampEn, n = 20000, m = 2, r = 0.2: on the grid
// SampEn is a step function of r/q (16 levels: only equal codes match, r <
// q; 8 levels likewise but with far likelier ties), and dithering each
// sample over its cell brings it back to within 0.01 of the continuous
// 2.185 (Richman & Moorman, Am. J. Physiol. 278 (2000) H2039). The
// tolerance 0.02 is four times the spread over seeds (0.005 measured at 16
// levels, the widest).
func TestSampleEntropyOnAGrid(t *testing.T) {
	continuous := -math.Log(2*phi(0.2/math.Sqrt2) - 1)
	for _, levels := range []int{8, 16, 64} {
		for _, dither := range []bool{false, true} {
			x, p, q := gridIID(20000, levels, dither, uint64(levels))
			res, err := SampleEntropy(x, SampEnOptions{})
			if err != nil {
				t.Fatal(err)
			}
			want := gridSampEn(p, q, 0.2, dither)
			if math.Abs(res.Value-want) > 0.02 {
				t.Errorf("%d levels, dither %v: SampEn = %.4f, derived %.4f", levels, dither, res.Value, want)
			}
			if dither && math.Abs(want-continuous) > 0.01 {
				t.Errorf("%d levels dithered: derived %.4f, continuous %.4f", levels, want, continuous)
			}
			t.Logf("%d levels (q = %.3f), dither %v: SampEn = %.4f, derived %.4f, continuous %.4f", levels, q, dither, res.Value, want, continuous)
		}
	}
}
