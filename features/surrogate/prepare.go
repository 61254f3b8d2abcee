package surrogate

import (
	"math"
	"math/cmplx"
	"math/rand/v2"

	"gonum.org/v1/gonum/mathext"
)

// prepared holds what every surrogate of one series needs, computed once and
// read-only afterwards, so workers share it.
type prepared struct {
	opt     resolved
	x       []float64 // the series the surrogates copy (after any truncation)
	n       int
	sorted  []float64    // x ascending
	order   []int32      // indices that sort x ascending (ties by index)
	groups  []int32      // for Gauss: start of each run of equal values in sorted, plus n
	quant   []float64    // for Gauss quantiles: value at each sorted position
	coeff   []complex128 // X_k of x, k = 0..n/2 (FFT methods)
	amp     []float64    // |X_k| (IAAFT, spectral error)
	ampNorm float64      // Σ_{k≥1} w_k A_k², w_k = 1 at Nyquist, else 2
	bs      *bluesteinPlan
}

// info is what one surrogate's construction reports.
type info struct {
	iter      int     // IAAFT iterations used
	specErr   float64 // relative spectral error (AAFT, IAAFT)
	converged bool    // IAAFT stopped by a criterion, not by the cap
}

// workspace is the per-worker scratch: FFT plan and buffers.
type workspace struct {
	fft  *realFFT
	c    []complex128
	buf  []float64
	g    []float64
	sort *sorter
	perm []int32   // IAAFT: rank order of the previous iterate
	vals []float64 // IAAFT: scratch for resort
	mag  []float64 // IAAFT: |S_k| of the iterate
}

func newPrepared(x []float64, opt resolved) *prepared {
	n := len(x)
	p := &prepared{opt: opt, x: x, n: n}
	s := newSorter(n)
	p.order = append([]int32(nil), s.argsort(x)...)
	p.sorted = make([]float64, n)
	for j, i := range p.order {
		p.sorted[j] = x[i]
	}
	m := opt.Method
	if m == Gauss {
		p.groups = tieGroups(p.sorted)
		if opt.GaussQuantiles {
			p.quant = gaussQuantiles(n, p.groups)
		}
	}
	if m.usesFFT() {
		if needsBluestein(n) {
			p.bs = newBluesteinPlan(n)
		}
		t := newRealFFT(n, p.bs)
		p.coeff = make([]complex128, n/2+1)
		t.forward(p.coeff, x)
		p.amp = make([]float64, len(p.coeff))
		for k, c := range p.coeff {
			p.amp[k] = cmplx.Abs(c)
		}
		for k := 1; k < len(p.amp); k++ {
			p.ampNorm += specWeight(k, n) * p.amp[k] * p.amp[k]
		}
	}
	return p
}

func (p *prepared) newWorkspace() *workspace {
	w := &workspace{sort: newSorter(p.n)}
	if p.opt.Method.usesFFT() {
		w.fft = newRealFFT(p.n, p.bs)
		w.c = make([]complex128, p.n/2+1)
		w.buf = make([]float64, p.n)
	}
	if p.opt.Method == IAAFT {
		w.perm = make([]int32, p.n)
		w.vals = make([]float64, p.n)
		w.mag = make([]float64, p.n/2+1)
	}
	if p.opt.Method == AAFT || p.opt.Method == Gauss {
		w.g = make([]float64, p.n)
	}
	return w
}

// make writes one surrogate into dst (length n) using rng.
func (p *prepared) make(dst []float64, rng *rand.Rand, w *workspace) info {
	switch p.opt.Method {
	case Shuffle:
		shuffle(dst, p.x, rng)
	case FT:
		phaseRandomise(dst, p, rng, w)
	case AAFT:
		return aaft(dst, p, rng, w)
	case IAAFT:
		return iaaft(dst, p, rng, w)
	case Gauss:
		gaussianSurrogate(dst, p, rng, w)
	}
	return info{converged: true}
}

// specWeight is the multiplicity of coefficient k of a length-n real DFT in
// the full two-sided spectrum: 1 for DC and (even n) Nyquist, else 2.
func specWeight(k, n int) float64 {
	if k == 0 || (n%2 == 0 && k == n/2) {
		return 1
	}
	return 2
}

// spectralError returns the relative RMS amplitude error of c against the
// target amplitudes, DC excluded (so an offset of the data does not enter):
// sqrt(Σ_{k≥1} w_k (|c_k| − A_k)² / Σ_{k≥1} w_k A_k²).
func (p *prepared) spectralError(c []complex128) float64 {
	var num float64
	for k := 1; k < len(c); k++ {
		d := cmplx.Abs(c[k]) - p.amp[k]
		num += specWeight(k, p.n) * d * d
	}
	return math.Sqrt(num / p.ampNorm)
}

// randomisePhases multiplies c_k, 1 ≤ k < n/2 (k ≤ (n−1)/2 for odd n), by
// independent e^{iφ}, φ uniform on [0, 2π). DC and, for even n, the Nyquist
// term stay real and unchanged, as the real DFT requires.
func randomisePhases(c []complex128, n int, rng *rand.Rand) {
	last := len(c) - 1
	if n%2 == 1 {
		last = len(c)
	}
	for k := 1; k < last; k++ {
		s, co := math.Sincos(2 * math.Pi * rng.Float64())
		c[k] *= complex(co, s)
	}
}

// tieGroups returns the start index of each run of equal values in sorted,
// followed by len(sorted).
func tieGroups(sorted []float64) []int32 {
	g := []int32{0}
	for j := 1; j < len(sorted); j++ {
		if sorted[j] != sorted[j-1] {
			g = append(g, int32(j))
		}
	}
	return append(g, int32(len(sorted)))
}

// gaussQuantiles returns, for each sorted position, Φ⁻¹((r+0.5)/n) with r
// the mid-rank of its run of ties (so tied data stay tied).
func gaussQuantiles(n int, groups []int32) []float64 {
	q := make([]float64, n)
	for gi := 0; gi+1 < len(groups); gi++ {
		a, b := groups[gi], groups[gi+1]
		mid := float64(a+b-1) / 2
		v := mathext.NormalQuantile((mid + 0.5) / float64(n))
		for j := a; j < b; j++ {
			q[j] = v
		}
	}
	return q
}
