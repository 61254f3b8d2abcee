package nonlinear

import (
	"fmt"
	"math"
)

// caoWho names the method in error messages.
const caoWho = "nonlinear: cao"

// CaoOptions configures Cao. The zero value gives the documented defaults.
type CaoOptions struct {
	// Delay is the embedding delay in samples. Default: chosen as in Embed
	// (first genuine AMI minimum, else the autocorrelation 1/e time).
	Delay int
	// MaxDim is the largest dimension d for which E1(d) and E2(d) are
	// computed (this needs neighbour searches up to d+1). Default 10.
	MaxDim int
	// Theiler is the temporal exclusion window in samples (neighbours j of i
	// need |i − j| > Theiler). Default: 2·max(autocorrelation time, delay).
	Theiler int
	// MaxRef caps the number of reference points, evenly spaced over the
	// searched vectors. Default 1000.
	MaxRef int
	// MaxPoints caps the samples used: neighbours are searched among the
	// delay vectors of the first MaxPoints samples only. Default 20000
	// (E1 and E2 are ratios of averages and settle long before that; the
	// cap bounds the cost of nearest-neighbour search in high dimension,
	// where a k-d tree degrades towards brute force).
	MaxPoints int
	// Threshold is the least E1 level taken as saturated. Default 0.85.
	Threshold float64
}

// CaoResult holds Cao's E1 and E2 curves and the dimension they suggest.
type CaoResult struct {
	// E1[d−1] = E(d+1)/E(d) and E2[d−1] = E*(d+1)/E*(d) for d = 1..MaxDim.
	E1, E2 []float64
	// Dim is the smallest d at which E1 has saturated: E1(d) ≥ Threshold
	// and E1 stops changing, E1(d+1) ≤ 1.1·E1(d) (for d = MaxDim only the
	// first condition); MaxDim when E1 never saturates.
	Dim int
	// Saturated reports whether E1 reached Threshold within MaxDim.
	Saturated bool
	// E2Deviation is max_d |E2(d) − 1|: near 0 for independent noise, for
	// which every E2(d) ≈ 1 (Cao 1997); clearly positive for determinism.
	E2Deviation float64
	Delay       int
	Theiler     int
	Refs        int // reference points used
	Points      int // samples searched (≤ MaxPoints)
}

// Cao returns the minimum embedding dimension by Cao's method (Cao, Physica
// D 110 (1997) 43): with y_i(d) the delay vectors and n(i,d) the nearest
// neighbour of y_i in dimension d (maximum norm, outside the Theiler window),
//
//	E(d)  = ⟨ ‖y_i(d+1) − y_n(i,d)(d+1)‖ / ‖y_i(d) − y_n(i,d)(d)‖ ⟩,  E1(d) = E(d+1)/E(d),
//	E*(d) = ⟨ |x_{i+dτ} − x_{n(i,d)+dτ}| ⟩,                          E2(d) = E*(d+1)/E*(d).
//
// E1 stops changing (≈ 1) once d is a sufficient dimension; E2 ≈ 1 for all
// d signals independent noise. Averages run over up to MaxRef evenly spaced
// reference points among the first MaxPoints samples; a repeated vector's
// neighbour is its nearest distinct vector (Cao 1997). The series needs room for MaxDim+1 coordinates plus the Theiler
// window and at least 50 vectors.
func Cao(x []float64, opts CaoOptions) (*CaoResult, error) {
	z, delay, w, err := dimSearchInput(x, opts.Delay, opts.Theiler, caoWho)
	if err != nil {
		return nil, err
	}
	return caoStd(z, delay, w, opts, nil)
}

// caoStd runs Cao's method on a standardised series with a known delay and
// Theiler window; its neighbour searches share the sorted projection of rec
// (which may be nil).
func caoStd(z []float64, delay, w int, opts CaoOptions, rec *Reconstruction) (*CaoResult, error) {
	// E(d) is needed for d = 1..MaxDim+1, each reading a (d+1)-th
	// coordinate: vectors of dimension MaxDim+2 must exist.
	s, err := newDimSearch(z, delay, w, opts.MaxDim, opts.MaxRef, opts.MaxPoints, 2, caoWho)
	if err != nil {
		return nil, err
	}
	s.rec = rec
	maxDim := s.maxDim
	thr := orDefault(opts.Threshold, 0.85)
	E := make([]float64, maxDim+2)     // E[d] for d = 1..maxDim+1
	Estar := make([]float64, maxDim+2) // E*[d]
	for d := 1; d <= maxDim+1; d++ {
		var sa, ss float64
		used := 0
		s.neighbours(d, false, func(dist, extra float64) {
			sa += math.Max(dist, extra) / dist
			ss += extra
			used++
		})
		if used == 0 {
			return nil, fmt.Errorf("%s: no reference point has a distinct neighbour outside the Theiler window at dimension %d: %w", caoWho, d, ErrTooShort)
		}
		E[d] = sa / float64(used)
		Estar[d] = ss / float64(used)
	}
	res := &CaoResult{
		E1: make([]float64, maxDim), E2: make([]float64, maxDim),
		Dim: maxDim, Delay: delay, Theiler: w, Refs: len(s.refs), Points: len(s.z),
	}
	for d := 1; d <= maxDim; d++ {
		res.E1[d-1] = E[d+1] / E[d]
		res.E2[d-1] = Estar[d+1] / Estar[d]
		res.E2Deviation = math.Max(res.E2Deviation, math.Abs(res.E2[d-1]-1))
	}
	for d := 1; d <= maxDim; d++ {
		if res.E1[d-1] >= thr && (d == maxDim || res.E1[d] <= 1.1*res.E1[d-1]) {
			res.Dim, res.Saturated = d, true
			break
		}
	}
	return res, nil
}
