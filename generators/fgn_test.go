package generators

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// TestFGNAutocovariance: for H ∈ {0.2, 0.5, 0.8} the sample autocovariance
// at lags 0..10, averaged over R = 40 independent series of n = 4096, equals
// γ(k) = ½σ²(|k+1|^{2H} − 2|k|^{2H} + |k−1|^{2H}) (Mandelbrot & Van Ness,
// SIAM Review 10 (1968) 422) with σ = 1.5. The estimator Σ x_t x_{t+k}/(n−k)
// uses the known zero mean, so it is unbiased for an exact synthesis
// (Davies & Harte 1987); the tolerance is four standard errors, the
// standard error taken from the spread of the R replicates (independent by
// construction), and that standard error must itself be small (< 0.02σ²) so
// the check has power.
func TestFGNAutocovariance(t *testing.T) {
	const n, reps, maxLag, sigma = 4096, 40, 10, 1.5
	rng := newRand(41)
	for _, h := range []float64{0.2, 0.5, 0.8} {
		est := make([][]float64, maxLag+1)
		for r := 0; r < reps; r++ {
			x, err := FGN{H: h, Sigma: sigma}.Generate(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			for k := 0; k <= maxLag; k++ {
				var s float64
				for i := 0; i+k < n; i++ {
					s += x[i] * x[i+k]
				}
				est[k] = append(est[k], s/float64(n-k))
			}
		}
		gamma := fgnAcov(h)
		for k := 0; k <= maxLag; k++ {
			mean, se := meanSE(est[k])
			want := sigma * sigma * gamma(k)
			if math.Abs(mean-want) > 4*se || se > 0.02*sigma*sigma {
				t.Errorf("H = %g, lag %d: γ̂ = %.5f ± %.5f, want %.5f", h, k, mean, se, want)
			}
			if k <= 2 || k == maxLag {
				t.Logf("H = %g, lag %2d: γ̂ = %+.5f ± %.5f, γ = %+.5f", h, k, mean, se, want)
			}
		}
	}
}

// meanSE returns the mean of v and its standard error sd/√len.
func meanSE(v []float64) (float64, float64) {
	var m, s float64
	for _, x := range v {
		m += x
	}
	m /= float64(len(v))
	for _, x := range v {
		s += (x - m) * (x - m)
	}
	return m, math.Sqrt(s / float64(len(v)-1) / float64(len(v)))
}

// TestFBM: fBm is the running sum of fGn with the same seed.
func TestFBM(t *testing.T) {
	g, err := FGN{H: 0.3}.Generate(1000, newRand(42))
	if err != nil {
		t.Fatal(err)
	}
	b, err := FBM{H: 0.3}.Generate(1000, newRand(42))
	if err != nil {
		t.Fatal(err)
	}
	var s float64
	for i := range g {
		s += g[i]
		if math.Abs(b[i]-s) > 1e-9 {
			t.Fatalf("fbm[%d] = %v, running sum %v", i, b[i], s)
		}
	}
	if _, err := (FBM{H: 1}).Generate(10, newRand(1)); err == nil {
		t.Error("H = 1 accepted")
	}
}

// TestCirculantEmbedding: the embedding refuses a "covariance" that is not
// positive definite (γ(0) = 1, γ(1) = 0.9, γ(2) = −0.9 gives a negative
// eigenvalue at every size) with ErrEmbedding, and fGn lengths that are not
// 5-smooth work (n − 1 prime).
func TestCirculantEmbedding(t *testing.T) {
	bad := func(c []float64) {
		for k := range c {
			c[k] = 0
		}
		c[0], c[1], c[2] = 1, 0.9, -0.9
	}
	if _, err := circulantGaussian(bad, 100, newRand(43)); !errors.Is(err, ErrEmbedding) {
		t.Errorf("err = %v, want ErrEmbedding", err)
	}
	// The table of fgnAcovFill equals the closed form lag by lag.
	tab := make([]float64, 50)
	fgnAcovFill(0.7)(tab)
	for k, v := range tab {
		if w := fgnAcov(0.7)(k); math.Abs(v-w) > 1e-12 {
			t.Errorf("γ(%d): table %v, formula %v", k, v, w)
		}
	}
	for _, n := range []int{1, 2, 3, 1010, 4099} {
		x, err := FGN{H: 0.75}.Generate(n, newRand(44))
		if err != nil || len(x) != n {
			t.Errorf("n = %d: len %d, %v", n, len(x), err)
		}
	}
	for _, tc := range []struct{ in, want int }{{1, 1}, {7, 8}, {11, 12}, {17, 18}, {1000, 1000}, {1001, 1024}, {4098, 4320}} {
		if got := fftSize(tc.in); got != tc.want {
			t.Errorf("fftSize(%d) = %d, want %d", tc.in, got, tc.want)
		}
	}
}

func ExampleFGN() {
	x, err := FGN{H: 0.8}.Generate(4096, newRand(1))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(len(x))
	// Output: 4096
}
