package surrogate

import (
	"math/rand/v2"
	"slices"
)

// aaft writes an amplitude-adjusted FT surrogate into dst: (1) a sorted
// sample of n N(0,1) draws is put in the rank order of x; (2) that Gaussian
// series is phase randomised; (3) the values of x are put in the rank order
// of the result. Keeps the values of x exactly and its spectrum
// approximately. Null hypothesis: a static monotone transform of a linear
// Gaussian process. Theiler et al., Physica D 58 (1992) 77.
func aaft(dst []float64, p *prepared, rng *rand.Rand, w *workspace) info {
	for i := range w.g {
		w.g[i] = rng.NormFloat64()
	}
	slices.Sort(w.g)
	for j, i := range p.order {
		w.buf[i] = w.g[j]
	}
	w.fft.forward(w.c, w.buf)
	randomisePhases(w.c, p.n, rng)
	w.fft.inverse(w.buf, w.c)
	for j, i := range w.sort.argsort(w.buf) {
		dst[i] = p.sorted[j]
	}
	w.fft.forward(w.c, dst)
	return info{specErr: p.spectralError(w.c), converged: true}
}
