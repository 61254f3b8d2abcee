package surrogate

import (
	"math"
	"math/rand/v2"
)

// resortBudget bounds the element moves (per sample) of the insertion sort
// that ranks an IAAFT iterate before it falls back to the radix argsort.
const resortBudget = 4

// iaaft writes an iterated AAFT surrogate into dst. Starting from a random
// shuffle s of x it repeats
//
//	S = FFT(s);  S_k ← A_k·S_k/|S_k|  (A_k = |X_k| of the data);
//	r = IFFT(S); s ← values of x in the rank order of r
//
// and stops when the rank order no longer changes (s is a fixed point), when
// an iteration improves the relative spectral error (see spectralError) by
// less than Tol of its previous value, or after MaxIter iterations. The
// result holds the values of x exactly (it is the rank-adjusted iterate);
// its spectral error is reported. Schreiber & Schmitz, Phys. Rev. Lett. 77
// (1996) 635.
func iaaft(dst []float64, p *prepared, rng *rand.Rand, w *workspace) info {
	shuffle(dst, p.x, rng)
	tol := p.opt.Tol
	prev := math.Inf(1)
	changed := true
	for it := 0; ; it++ {
		w.fft.forward(w.c, dst)
		// One pass for the magnitudes and the spectral error.
		var num float64
		for k, c := range w.c {
			re, im := real(c), imag(c)
			a := math.Sqrt(re*re + im*im)
			w.mag[k] = a
			if k > 0 {
				d := a - p.amp[k]
				num += specWeight(k, p.n) * d * d
			}
		}
		e := math.Sqrt(num / p.ampNorm)
		switch {
		case !changed:
			return info{iter: it, specErr: e, converged: true}
		case tol > 0 && it > 0 && prev-e < tol*prev:
			return info{iter: it, specErr: e, converged: true}
		case it >= p.opt.MaxIter:
			return info{iter: it, specErr: e, converged: false}
		}
		prev = e
		for k, c := range w.c {
			if a := w.mag[k]; a > 0 {
				w.c[k] = c * complex(p.amp[k]/a, 0)
			} else {
				w.c[k] = complex(p.amp[k], 0)
			}
		}
		// The inverse is unnormalised (×n); ranks do not care.
		w.fft.inverse(w.buf, w.c)
		// Rank the iterate: insertion sort from the previous order while
		// it is nearly sorted, a radix argsort otherwise.
		if it == 0 || !resort(w.perm, w.vals, w.buf, resortBudget*p.n) {
			copy(w.perm, w.sort.argsort(w.buf))
		}
		changed = false
		for j, i := range w.perm {
			v := p.sorted[j]
			if dst[i] != v {
				changed = true
				dst[i] = v
			}
		}
	}
}
