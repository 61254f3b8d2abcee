package scaling

import (
	"math"
	"testing"
)

// TestDFAFractionalGaussianNoise checks α = H for fGn (Peng et al., Phys.
// Rev. E 49 (1994) 1685) for DFA-1 and DFA-2 at n = 2^14. The estimate is
// averaged over 8 seeds; the seed-to-seed sd measured at this length is
// about 0.02–0.035 (largest for H = 0.9), so the mean has sd ≤ 0.013 and
// the 0.05 tolerance is about 4 sd.
func TestDFAFractionalGaussianNoise(t *testing.T) {
	const n, seeds = 1 << 14, 8
	for _, order := range []int{1, 2} {
		for _, h := range []float64{0.3, 0.5, 0.7, 0.9} {
			var mean float64
			for s := uint64(1); s <= seeds; s++ {
				x := fgnSeed(t, n, h, s)
				r, err := DFA(x, DFAOptions{Order: order})
				if err != nil {
					t.Fatal(err)
				}
				if r.R2 < 0.98 {
					t.Errorf("order %d H=%.1f seed %d: r² = %.4f, want a clean power law (≥ 0.98)", order, h, s, r.R2)
				}
				mean += r.Alpha / seeds
			}
			// α = H for fGn: Peng et al. (1994).
			if math.Abs(mean-h) > 0.05 {
				t.Errorf("DFA-%d fGn H=%.1f: mean α = %.3f, want %.1f ± 0.05", order, h, mean, h)
			}
			t.Logf("DFA-%d fGn H=%.1f: mean α = %.3f", order, h, mean)
		}
	}
}

// TestDFAWhiteAndBrownian checks α = 0.5 for white noise and α = 1.5 for
// Brownian motion (Peng et al. 1994) at n = 2^14, averaged over 8 seeds
// (measured seed sd 0.018 for white noise and 0.035 for Brownian motion,
// so the means have sd ≤ 0.013; tolerance 0.05).
func TestDFAWhiteAndBrownian(t *testing.T) {
	const n, seeds = 1 << 14, 8
	tests := []struct {
		name     string
		brownian bool
		order    int
		want     float64 // Peng et al. (1994)
	}{
		{"white DFA-1", false, 1, 0.5},
		{"white DFA-2", false, 2, 0.5},
		{"brownian DFA-1", true, 1, 1.5},
		{"brownian DFA-2", true, 2, 1.5},
	}
	for _, tc := range tests {
		var mean float64
		var last DFAResult
		for s := uint64(1); s <= seeds; s++ {
			x := white(n, newRNG(100+s))
			if tc.brownian {
				x = cumsum(x)
			}
			r, err := DFA(x, DFAOptions{Order: tc.order})
			if err != nil {
				t.Fatalf("%s: %v", tc.name, err)
			}
			mean += r.Alpha / seeds
			last = r
		}
		if math.Abs(mean-tc.want) > 0.05 {
			t.Errorf("%s: mean α = %.3f, want %.1f ± 0.05", tc.name, mean, tc.want)
		}
		t.Logf("%s: mean α = %.3f (last seed r² %.4f, windows %d…%d, %d points)", tc.name, mean, last.R2, last.MinWindow, last.MaxWindow, last.Points)
	}
}

// TestDFAPolynomialRemoved checks the closed-form detrending against the
// algebra: a linear trend added to the series adds a quadratic to the
// profile, which DFA-2 removes exactly, so F(s) is unchanged (analytic).
func TestDFAPolynomialRemoved(t *testing.T) {
	x := white(4096, newRNG(3))
	y := make([]float64, len(x))
	for i := range x {
		y[i] = x[i] + 0.01*float64(i)
	}
	a, err := DFA(x, DFAOptions{Order: 2})
	if err != nil {
		t.Fatal(err)
	}
	b, err := DFA(y, DFAOptions{Order: 2})
	if err != nil {
		t.Fatal(err)
	}
	for i := range a.Fluctuation {
		if d := math.Abs(a.Fluctuation[i]-b.Fluctuation[i]) / a.Fluctuation[i]; d > 1e-8 {
			t.Errorf("window %d: F = %g with trend, %g without (rel diff %g)", a.Windows[i], b.Fluctuation[i], a.Fluctuation[i], d)
		}
	}
}

// TestDFAWindowRSSMatchesDirectFit compares the orthogonal-projection
// residual with a direct least-squares fit by normal equations (analytic
// identity of least squares).
func TestDFAWindowRSSMatchesDirectFit(t *testing.T) {
	rng := newRNG(5)
	for _, s := range []int{5, 16, 101} {
		y := make([]float64, s)
		for i := range y {
			y[i] = 100 + rng.NormFloat64() + 0.3*float64(i)
		}
		u := make([]float64, s)
		q := make([]float64, s)
		var uu, qq float64
		for i := range u {
			u[i] = float64(i) - float64(s-1)/2
			uu += u[i] * u[i]
		}
		for i := range q {
			q[i] = u[i]*u[i] - uu/float64(s)
			qq += q[i] * q[i]
		}
		for _, order := range []int{1, 2} {
			got := detrendRSS(y, u, q, uu, qq, order)
			want := directRSS(y, order)
			if math.Abs(got-want) > 1e-9*math.Max(1, want) {
				t.Errorf("s=%d order %d: RSS %g, direct fit %g", s, order, got, want)
			}
		}
	}
}

// directRSS fits a polynomial of the given order by solving the normal
// equations with Gaussian elimination and returns the residual sum of
// squares.
func directRSS(y []float64, order int) float64 {
	p := order + 1
	a := make([][]float64, p)
	for i := range a {
		a[i] = make([]float64, p+1)
	}
	for t, v := range y {
		ft := float64(t)
		for i := 0; i < p; i++ {
			for j := 0; j < p; j++ {
				a[i][j] += math.Pow(ft, float64(i+j))
			}
			a[i][p] += v * math.Pow(ft, float64(i))
		}
	}
	for i := 0; i < p; i++ {
		for k := i + 1; k < p; k++ {
			f := a[k][i] / a[i][i]
			for j := i; j <= p; j++ {
				a[k][j] -= f * a[i][j]
			}
		}
	}
	c := make([]float64, p)
	for i := p - 1; i >= 0; i-- {
		s := a[i][p]
		for j := i + 1; j < p; j++ {
			s -= a[i][j] * c[j]
		}
		c[i] = s / a[i][i]
	}
	var rss float64
	for t, v := range y {
		var f float64
		for i := 0; i < p; i++ {
			f += c[i] * math.Pow(float64(t), float64(i))
		}
		rss += (v - f) * (v - f)
	}
	return rss
}
