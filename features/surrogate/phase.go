package surrogate

import "math/rand/v2"

// phaseRandomise writes an FT surrogate into dst: the data's Fourier
// coefficients X_k with independent uniform phases added (DC and Nyquist
// unchanged), transformed back. |X_k|² is kept to rounding error. Null
// hypothesis: stationary linear Gaussian process. Theiler et al., Physica D
// 58 (1992) 77.
func phaseRandomise(dst []float64, p *prepared, rng *rand.Rand, w *workspace) {
	copy(w.c, p.coeff)
	randomisePhases(w.c, p.n, rng)
	w.fft.inverse(dst, w.c)
	inv := 1 / float64(p.n)
	for i := range dst {
		dst[i] *= inv
	}
}
