package generators

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/dsp/fourier"
)

// ErrEmbedding is returned when the circulant embedding of a covariance has
// negative eigenvalues even after enlarging it, so Davies–Harte synthesis
// cannot be exact.
var ErrEmbedding = errors.New("circulant embedding is not non-negative definite")

// embeddingTries is how many times the embedding size is doubled before
// giving up with ErrEmbedding.
const embeddingTries = 4

// fftSize returns the smallest 5-smooth number (2^a·3^b·5^c) not below n,
// the sizes gonum's FFT (fftpack) transforms fastest.
func fftSize(n int) int {
	if n <= 1 {
		return 1
	}
	best := math.MaxInt
	for p5 := 1; p5 < 2*n; p5 *= 5 {
		for p35 := p5; p35 < 2*n; p35 *= 3 {
			p := p35
			for p < n {
				p *= 2
			}
			if p < best {
				best = p
			}
		}
	}
	return best
}

// circulantGaussian returns n samples of the zero-mean stationary Gaussian
// process whose autocovariance acov writes into c (c[k] = γ(k) for
// k = 0..len(c)−1), by circulant embedding
// (Davies & Harte, Biometrika 74 (1987) 95). The covariance is embedded in a
// circulant of size M = 2m with m ≥ n − 1 5-smooth; its eigenvalues are the
// real FFT of the first row, λ_k = Σ_j c_j e^{−2πijk/M}. Then
// V_0 = √λ_0·Z, V_m = √λ_m·Z, V_k = √(λ_k/2)(Z + iZ') for 0 < k < m, and
// X_j = M^{−1/2} Σ_k V_k e^{2πijk/M} (Hermitian extension) has exactly the
// covariance c; the first n values are returned.
//
// Negative eigenvalues within 1e−10 of the largest are rounding and are set
// to zero. Larger ones mean the embedding is not non-negative definite: m is
// doubled up to embeddingTries times (a larger circulant often is), and
// ErrEmbedding is returned if that fails. For fractional Gaussian noise the
// minimal embedding is non-negative definite for every H in (0, 1)
// (Craigmile, J. Time Ser. Anal. 24 (2003) 505 (memory)), so the fallback is
// never needed there.
func circulantGaussian(acov func(c []float64), n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	m := fftSize(max(n-1, 1))
	for try := 0; try <= embeddingTries; try, m = try+1, 2*m {
		big := 2 * m
		c := make([]float64, big)
		acov(c[:m+1])
		for k := 1; k < m; k++ {
			c[big-k] = c[k]
		}
		fft := fourier.NewFFT(big)
		coef := fft.Coefficients(nil, c)
		lam := make([]float64, m+1)
		var top float64
		for k := range lam {
			lam[k] = real(coef[k])
			top = math.Max(top, math.Abs(lam[k]))
		}
		ok := true
		for k, l := range lam {
			if l < 0 {
				if l < -1e-10*top {
					ok = false
					break
				}
				lam[k] = 0
			}
		}
		if !ok {
			continue
		}
		for k := range coef {
			switch k {
			case 0, m:
				coef[k] = complex(math.Sqrt(lam[k])*rng.NormFloat64(), 0)
			default:
				s := math.Sqrt(lam[k] / 2)
				coef[k] = complex(s*rng.NormFloat64(), s*rng.NormFloat64())
			}
		}
		y := fft.Sequence(c, coef)
		scale := 1 / math.Sqrt(float64(big))
		out := make([]float64, n)
		for j := range out {
			out[j] = scale * y[j]
		}
		return out, nil
	}
	return nil, fmt.Errorf("davies-harte: n = %d: %w after %d enlargements", n, ErrEmbedding, embeddingTries)
}
