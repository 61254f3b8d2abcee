package nonlinear

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"

	"gonum.org/v1/gonum/dsp/fourier"
)

// ZeroOneOptions configures ZeroOne. The zero value gives the documented
// defaults.
type ZeroOneOptions struct {
	// NumC is the number of frequencies c, drawn uniformly from
	// (π/5, 4π/5). Default 100 (Gottwald & Melbourne 2009).
	NumC int
	// Seed seeds the generator that draws c (PCG with streams Seed and
	// Seed^0x9e3779b97f4a7c15); the same seed gives the same K.
	Seed uint64
	// MaxLen caps the samples used: the test runs on the first MaxLen
	// samples. Default 10000 (the test costs O(N log N) per c here; the
	// published examples use a few thousand points).
	MaxLen int
	// Decimate, when > 1, keeps every Decimate-th sample before the cap —
	// the remedy for oversampled flows (see ZeroOne). Default 1 (none).
	Decimate int
}

// ZeroOneResult is the 0–1 test statistic with its spread over c.
type ZeroOneResult struct {
	// K is the median over c of K_c; ≈ 1 for chaos (and for noise), ≈ 0
	// for regular dynamics.
	K float64
	// KLow, KHigh are the 10th and 90th percentiles of K_c over c.
	KLow, KHigh float64
	// Kc are the per-frequency values, in the order of C.
	Kc, C []float64
	N     int // samples used (after decimation and the cap)
	NCut  int // largest displacement n = N/10
}

// ZeroOne returns the 0–1 test for chaos of Gottwald & Melbourne (Proc. R.
// Soc. A 460 (2004) 603), correlation method (SIAM J. Appl. Dyn. Syst. 8
// (2009) 129). For each c the series φ_j (mean removed, unit variance) drives
// the translation variables p_c(n) = Σ_{j≤n} φ_j cos(jc), q_c(n) = Σ_{j≤n}
// φ_j sin(jc); their mean-square displacement
//
//	M_c(n) = ⟨(p_c(j+n) − p_c(j))² + (q_c(j+n) − q_c(j))²⟩_j,  n = 1..N/10,
//
// grows linearly in n for chaos and stays bounded for regular motion. K_c is
// the correlation coefficient of M_c(n) with n, and K the median of K_c over
// NumC random c in (π/5, 4π/5), which discards isolated resonances. The
// oscillatory term that the modified displacement D_c(n) = M_c(n) −
// (Eφ)²(1 − cos nc)/(1 − cos c) removes is zero here because φ has mean 0.
// M_c(n) for all n is computed in O(N log N) per c from prefix sums of |z|²
// and the FFT autocorrelation of z = p + iq.
//
// Caveats for the feature catalogue: noise gives K ≈ 1 as chaos does (the
// test separates regular from irregular, not deterministic from
// stochastic); a flow sampled much faster than its decorrelation time
// looks locally smooth and gives a false K ≈ 0 — decimate such series
// with Decimate; Embedding.Delay (the first AMI minimum) is a good factor:
// it leaves maps (τ = 1) alone and brings flows to about one sample per
// decorrelation time (Lorenz at dt = 0.01: K ≈ 0 undecimated, ≈ 1 with
// Decimate = 18). The series needs at least
// 100 samples after decimation.
func ZeroOne(x []float64, opts ZeroOneOptions) (*ZeroOneResult, error) {
	const who = "nonlinear: 0-1 test"
	numC := orDefault(opts.NumC, 100)
	maxLen := orDefault(opts.MaxLen, 10000)
	dec := max(1, opts.Decimate)
	var y []float64
	if dec == 1 {
		y = x[:min(len(x), maxLen)]
	} else {
		for i := 0; i < len(x) && len(y) < maxLen; i += dec {
			y = append(y, x[i])
		}
	}
	phi, err := standardize(y, 100, who)
	if err != nil {
		return nil, err
	}
	N := len(phi)
	ncut := N / 10
	rng := rand.New(rand.NewPCG(opts.Seed, opts.Seed^0x9e3779b97f4a7c15))
	ws := newMSDWork(N, ncut)
	xi := make([]float64, ncut)
	for i := range xi {
		xi[i] = float64(i + 1)
	}
	res := &ZeroOneResult{Kc: make([]float64, numC), C: make([]float64, numC), N: N, NCut: ncut}
	for ci := 0; ci < numC; ci++ {
		c := math.Pi/5 + rng.Float64()*3*math.Pi/5
		res.C[ci] = c
		res.Kc[ci] = pearson(xi, ws.displacement(phi, c))
	}
	sorted := slices.Clone(res.Kc)
	slices.Sort(sorted)
	res.K = quantileSorted(sorted, 0.5)
	res.KLow = quantileSorted(sorted, 0.1)
	res.KHigh = quantileSorted(sorted, 0.9)
	if math.IsNaN(res.K) {
		return nil, fmt.Errorf("%s: displacement constant in n for every c", who)
	}
	return res, nil
}

// msdWork holds the buffers of the mean-square displacement computation.
type msdWork struct {
	n, ncut int
	fft     *fourier.CmplxFFT
	buf, zs []complex128
	sq      []float64 // prefix sums of |z_j|²
	out     []float64
}

func newMSDWork(n, ncut int) *msdWork {
	size := 1
	for size < n+ncut+1 {
		size <<= 1
	}
	return &msdWork{
		n: n, ncut: ncut, fft: fourier.NewCmplxFFT(size),
		buf: make([]complex128, size), zs: make([]complex128, n),
		sq: make([]float64, n+1), out: make([]float64, ncut),
	}
}

// displacement returns M_c(n), n = 1..ncut (index n−1), for the series phi:
// the mean over j of |z_{j+n} − z_j|², z_j = Σ_{k≤j} φ_k e^{ikc}, from
// Σ|z_{j+n}|² + Σ|z_j|² − 2 Re Σ conj(z_j) z_{j+n}, the last sum being the
// zero-padded FFT autocorrelation of z. The returned slice is reused.
func (w *msdWork) displacement(phi []float64, c float64) []float64 {
	N := w.n
	var z complex128
	for j := 0; j < N; j++ {
		s, co := math.Sincos(float64(j+1) * c)
		z += complex(phi[j]*co, phi[j]*s)
		w.zs[j] = z
		w.sq[j+1] = w.sq[j] + real(z)*real(z) + imag(z)*imag(z)
	}
	clear(w.buf)
	copy(w.buf, w.zs)
	w.fft.Coefficients(w.buf, w.buf)
	for k, v := range w.buf {
		w.buf[k] = complex(real(v)*real(v)+imag(v)*imag(v), 0)
	}
	w.fft.Sequence(w.buf, w.buf)
	inv := 1 / float64(len(w.buf))
	for n := 1; n <= w.ncut; n++ {
		cross := real(w.buf[n]) * inv
		s := (w.sq[N] - w.sq[n]) + w.sq[N-n] - 2*cross
		w.out[n-1] = s / float64(N-n)
	}
	return w.out
}

// quantileSorted returns the p-quantile of sorted data by linear
// interpolation between order statistics (type 7).
func quantileSorted(s []float64, p float64) float64 {
	if len(s) == 0 {
		return math.NaN()
	}
	h := p * float64(len(s)-1)
	lo := int(math.Floor(h))
	hi := min(lo+1, len(s)-1)
	return s[lo] + (h-float64(lo))*(s[hi]-s[lo])
}
