package surrogate

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"
)

// naiveDFT is the O(n²) definition X_k = Σ_t x_t e^{−2πi tk/n}.
func naiveDFT(x []float64) []complex128 {
	n := len(x)
	out := make([]complex128, n/2+1)
	for k := range out {
		var s complex128
		for t, v := range x {
			q := (t * k) % n
			s += complex(v, 0) * cmplx.Exp(complex(0, -2*math.Pi*float64(q)/float64(n)))
		}
		out[k] = s
	}
	return out
}

// TestRealFFT checks the forward transform (gonum direct and Bluestein)
// against the DFT definition, and that inverse∘forward = n·identity, for
// odd, even and prime lengths. Reference: the DFT definition (analytic).
func TestRealFFT(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 7))
	for _, n := range []int{8, 9, 12, 15, 67, 128, 131, 134, 2 * 127, 997} {
		x := make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64() + 3
		}
		tr := newRealFFT(n, nil)
		if got, want := tr.bs != nil, largestPrimeFactor(n) > maxDirectFactor; got != want {
			t.Fatalf("n=%d: bluestein %v, want %v", n, got, want)
		}
		c := make([]complex128, n/2+1)
		tr.forward(c, x)
		want := naiveDFT(x)
		var scale float64
		for _, w := range want {
			scale = math.Max(scale, cmplx.Abs(w))
		}
		for k := range c {
			// Rounding of an O(n log n) transform against an O(n²) sum:
			// relative 1e-10 of the largest coefficient is ample at n < 10^3.
			if d := cmplx.Abs(c[k] - want[k]); d > 1e-10*scale {
				t.Fatalf("n=%d k=%d: %v, want %v (|diff| %g)", n, k, c[k], want[k], d)
			}
		}
		if imag(c[0]) != 0 || (n%2 == 0 && imag(c[n/2]) != 0) {
			t.Fatalf("n=%d: DC or Nyquist not real: %v %v", n, c[0], c[n/2])
		}
		y := make([]float64, n)
		tr.inverse(y, c)
		for i := range y {
			if d := math.Abs(y[i]/float64(n) - x[i]); d > 1e-10 {
				t.Fatalf("n=%d: round trip x[%d] = %g, want %g", n, i, y[i]/float64(n), x[i])
			}
		}
	}
}

// TestFactors checks the length helpers on hand-factored numbers.
func TestFactors(t *testing.T) {
	for _, tc := range []struct {
		n, lpf int
		smooth bool
	}{
		{1, 1, true}, {2, 2, true}, {10000, 5, true}, {9973, 9973, false},
		{2 * 3 * 5 * 7 * 7, 7, true}, {22, 11, false}, {1 << 20, 2, true}, {2 * 10007, 10007, false},
	} {
		if got := largestPrimeFactor(tc.n); got != tc.lpf {
			t.Errorf("largestPrimeFactor(%d) = %d, want %d", tc.n, got, tc.lpf)
		}
		if got := isSmooth(tc.n); got != tc.smooth {
			t.Errorf("isSmooth(%d) = %v, want %v", tc.n, got, tc.smooth)
		}
	}
}

// TestNextSmooth5 checks against a linear search for the least 5-smooth
// number (prime factors 2, 3, 5) at or above n.
func TestNextSmooth5(t *testing.T) {
	smooth5 := func(m int) bool {
		for _, p := range []int{2, 3, 5} {
			for m%p == 0 {
				m /= p
			}
		}
		return m == 1
	}
	for n := 1; n < 5000; n++ {
		want := n
		for !smooth5(want) {
			want++
		}
		if got := nextSmooth5(n); got != want {
			t.Fatalf("nextSmooth5(%d) = %d, want %d", n, got, want)
		}
	}
}
