package surrogate

import (
	"math"
	"math/cmplx"

	"gonum.org/v1/gonum/dsp/fourier"
)

// maxDirectFactor is the largest prime factor of n for which gonum's real
// FFT (FFTPACK, whose cost for a prime factor p is O(n·p)) is used directly;
// lengths with a larger prime factor go through Bluestein's algorithm. At
// n ≈ 10^4 a prime length costs about 0.17 s per forward and inverse pair in
// FFTPACK against 0.3 ms for n = 10^4 (measured on the development machine).
const maxDirectFactor = 61

// largestPrimeFactor returns the largest prime factor of n ≥ 2 (1 for n < 2).
func largestPrimeFactor(n int) int {
	if n < 2 {
		return 1
	}
	lp := 1
	for p := 2; p*p <= n; p++ {
		for n%p == 0 {
			lp = p
			n /= p
		}
	}
	if n > 1 {
		lp = n
	}
	return lp
}

// isSmooth reports whether n ≥ 1 has no prime factor above 7, the lengths
// for which the real FFT runs fastest.
func isSmooth(n int) bool {
	if n < 1 {
		return false
	}
	for _, p := range [...]int{2, 3, 5, 7} {
		for n%p == 0 {
			n /= p
		}
	}
	return n == 1
}

// nextSmooth5 returns the least m ≥ n whose prime factors are 2, 3 and 5.
func nextSmooth5(n int) int {
	best := math.MaxInt
	for p2 := 1; p2 < best; p2 *= 2 {
		for p3 := p2; p3 < best; p3 *= 3 {
			p5 := p3
			for p5 < n {
				p5 *= 5
			}
			best = min(best, p5)
		}
		if p2 >= n {
			break
		}
	}
	return best
}

// realFFT is an unnormalised real DFT of fixed length n with gonum's
// conventions: forward gives X_k = Σ_t x_t e^{−2πi tk/n}, k = 0..n/2;
// inverse gives x_t = Σ_k X_k e^{+2πi tk/n} over the full Hermitian spectrum
// (so inverse∘forward multiplies by n), using only the real part of X_0 and,
// for even n, of X_{n/2}. A realFFT holds work space and is not safe for
// concurrent use; the read-only bluesteinPlan inside may be shared.
type realFFT struct {
	n      int
	direct *fourier.FFT
	bs     *bluesteinPlan
	cfft   *fourier.CmplxFFT
	a, b   []complex128 // Bluestein work, length m
	full   []complex128 // Bluestein work, length n
}

// bluesteinPlan holds the read-only parts of Bluestein's algorithm for length
// n: the chirp c_k = e^{−iπk²/n} and the transform of the convolution kernel
// conj(c_j), j ∈ (−n, n), laid out circularly in length m ≥ 2n−1, m the
// least number ≥ 2n−1 with prime factors 2, 3 and 5 only (gonum's complex
// FFT of 20736 = 2⁸·3⁴ points takes about half the time of 32768 = 2¹⁵,
// measured on the development machine).
// Bluestein, IEEE Trans. Audio Electroacoust. 18 (1970) 451.
type bluesteinPlan struct {
	n, m  int
	chirp []complex128 // length n
	kern  []complex128 // transform of the kernel, length m
}

func newBluesteinPlan(n int) *bluesteinPlan {
	m := nextSmooth5(2*n - 1)
	p := &bluesteinPlan{n: n, m: m, chirp: make([]complex128, n), kern: make([]complex128, m)}
	for k := 0; k < n; k++ {
		// k² mod 2n keeps the angle exact for large k.
		q := (uint64(k) * uint64(k)) % uint64(2*n)
		p.chirp[k] = cmplx.Exp(complex(0, -math.Pi*float64(q)/float64(n)))
	}
	p.kern[0] = cmplx.Conj(p.chirp[0])
	for j := 1; j < n; j++ {
		c := cmplx.Conj(p.chirp[j])
		p.kern[j] = c
		p.kern[m-j] = c
	}
	fourier.NewCmplxFFT(m).Coefficients(p.kern, p.kern)
	return p
}

// newRealFFT returns a transform of length n; bs must be nil or a plan for
// the same n (shared between workers), and is made when needed and nil.
func newRealFFT(n int, bs *bluesteinPlan) *realFFT {
	t := &realFFT{n: n}
	if largestPrimeFactor(n) <= maxDirectFactor {
		t.direct = fourier.NewFFT(n)
		return t
	}
	if bs == nil {
		bs = newBluesteinPlan(n)
	}
	t.bs = bs
	t.cfft = fourier.NewCmplxFFT(bs.m)
	t.a = make([]complex128, bs.m)
	t.b = make([]complex128, bs.m)
	t.full = make([]complex128, n)
	return t
}

// needsBluestein reports whether length n is transformed with Bluestein.
func needsBluestein(n int) bool { return largestPrimeFactor(n) > maxDirectFactor }

// forward writes X_0..X_{n/2} of x into dst (length n/2+1).
func (t *realFFT) forward(dst []complex128, x []float64) {
	if t.direct != nil {
		t.direct.Coefficients(dst, x)
		return
	}
	for i, v := range x {
		t.full[i] = complex(v, 0)
	}
	t.dft(t.full)
	copy(dst, t.full[:len(dst)])
	dst[0] = complex(real(dst[0]), 0)
	if t.n%2 == 0 {
		dst[len(dst)-1] = complex(real(dst[len(dst)-1]), 0)
	}
}

// inverse writes x_t = Σ_k X_k e^{+2πi tk/n} into dst (length n) from the
// half spectrum c (length n/2+1). c is not modified.
func (t *realFFT) inverse(dst []float64, c []complex128) {
	if t.direct != nil {
		t.direct.Sequence(dst, c)
		return
	}
	n := t.n
	// x = conj(DFT(conj X)) and x is real, so x = Re DFT(conj X).
	t.full[0] = complex(real(c[0]), 0)
	for k := 1; k < len(c); k++ {
		t.full[k] = cmplx.Conj(c[k])
		t.full[n-k] = c[k]
	}
	if n%2 == 0 {
		t.full[n/2] = complex(real(c[n/2]), 0)
	}
	t.dft(t.full)
	for i := range dst {
		dst[i] = real(t.full[i])
	}
}

// dft replaces z (length n) by its DFT with Bluestein's identity
// tk = (t² + k² − (k−t)²)/2: X_k = c_k Σ_t (z_t c_t) conj(c_{k−t}).
func (t *realFFT) dft(z []complex128) {
	p := t.bs
	for i := range t.a {
		t.a[i] = 0
	}
	for i, v := range z {
		t.a[i] = v * p.chirp[i]
	}
	t.cfft.Coefficients(t.b, t.a)
	for i := range t.b {
		t.b[i] *= p.kern[i]
	}
	t.cfft.Sequence(t.a, t.b)
	scale := 1 / float64(p.m)
	for k := range z {
		z[k] = t.a[k] * p.chirp[k] * complex(scale, 0)
	}
}
