package visibility

import (
	"math"
	"math/cmplx"
	"math/rand/v2"

	"gonum.org/v1/gonum/dsp/fourier"
)

// fgnDaviesHarte returns n samples of unit-variance fractional Gaussian noise
// with Hurst exponent h by circulant embedding (Davies & Harte, Biometrika 74
// (1987) 95), with the fGn autocovariance γ(k) = ½(|k+1|^{2H} − 2|k|^{2H} +
// |k−1|^{2H}) (Mandelbrot & Van Ness, SIAM Review 10 (1968) 422). A local
// test helper, independent of the generators package.
func fgnDaviesHarte(n int, h float64, rng *rand.Rand) []float64 {
	m := 2 * n
	c := make([]complex128, m)
	acov := func(k float64) float64 {
		return 0.5 * (math.Pow(math.Abs(k+1), 2*h) - 2*math.Pow(math.Abs(k), 2*h) + math.Pow(math.Abs(k-1), 2*h))
	}
	for k := 0; k <= n; k++ {
		c[k] = complex(acov(float64(k)), 0)
	}
	for k := n + 1; k < m; k++ {
		c[k] = c[m-k]
	}
	fft := fourier.NewCmplxFFT(m)
	lam := fft.Coefficients(nil, c)
	v := make([]complex128, m)
	for k := 0; k <= n; k++ {
		l := math.Max(real(lam[k]), 0)
		switch k {
		case 0, n:
			v[k] = complex(math.Sqrt(l/float64(m))*rng.NormFloat64(), 0)
		default:
			s := math.Sqrt(l / (2 * float64(m)))
			v[k] = complex(s*rng.NormFloat64(), s*rng.NormFloat64())
			v[m-k] = cmplx.Conj(v[k])
		}
	}
	z := fft.Coefficients(nil, v)
	x := make([]float64, n)
	for i := range x {
		x[i] = real(z[i])
	}
	return x
}
