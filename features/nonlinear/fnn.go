package nonlinear

import "math"

// fnnWho names the method in error messages.
const fnnWho = "nonlinear: false nearest neighbours"

// FNNOptions configures FalseNeighbours. The zero value gives the documented
// defaults.
type FNNOptions struct {
	Delay   int // default: as in Embed
	MaxDim  int // largest dimension tested, default 10
	Theiler int // default 2·max(autocorrelation time, delay)
	MaxRef  int // reference points, evenly spaced, default 1000
	// MaxPoints caps the samples searched (a prefix), default 20000, as
	// for Cao.
	MaxPoints int
	// RTol is the distance-ratio criterion, default 15; ATol the
	// attractor-size criterion, default 2 (Kennel et al. 1992).
	RTol, ATol float64
	// Fraction is the false-neighbour fraction accepted as zero, default 0.01.
	Fraction float64
}

// FNNResult holds the false-neighbour fractions and the chosen dimension.
type FNNResult struct {
	// Fractions[d−1] is the fraction of false nearest neighbours at d.
	Fractions []float64
	// Dim is the smallest d with Fractions[d−1] ≤ Fraction (MaxDim if none).
	Dim       int
	Saturated bool // whether some d reached Fraction
	Delay     int
	Theiler   int
	Refs      int
}

// FalseNeighbours returns the fraction of false nearest neighbours per
// embedding dimension (Kennel, Brown & Abarbanel, Phys. Rev. A 45 (1992)
// 3403). The nearest neighbour j of y_i in dimension d (Euclidean norm,
// outside the Theiler window) is false when
// |x_{i+dτ} − x_{j+dτ}| / R_d > RTol, or when R_{d+1} / σ > ATol, with R_d
// the distance in dimension d and σ the standard deviation of x (1 after
// standardisation). The dimension is the first d whose fraction is at most
// Fraction.
func FalseNeighbours(x []float64, opts FNNOptions) (*FNNResult, error) {
	z, delay, w, err := dimSearchInput(x, opts.Delay, opts.Theiler, fnnWho)
	if err != nil {
		return nil, err
	}
	return fnnStd(z, delay, w, opts)
}

// fnnStd runs the false-nearest-neighbour test on a standardised series with
// a known delay and Theiler window.
func fnnStd(z []float64, delay, w int, opts FNNOptions) (*FNNResult, error) {
	// Dimensions 1..MaxDim, each reading a (d+1)-th coordinate: vectors of
	// dimension MaxDim+1 must exist.
	s, err := newDimSearch(z, delay, w, opts.MaxDim, opts.MaxRef, opts.MaxPoints, 1, fnnWho)
	if err != nil {
		return nil, err
	}
	maxDim := s.maxDim
	rtol := orDefault(opts.RTol, 15)
	atol := orDefault(opts.ATol, 2)
	frac := orDefault(opts.Fraction, 0.01)
	res := &FNNResult{Fractions: make([]float64, maxDim), Dim: maxDim, Delay: delay, Theiler: w, Refs: len(s.refs)}
	for d := 1; d <= maxDim; d++ {
		falseCount, used := 0, 0
		s.neighbours(d, true, func(rd, extra float64) {
			rd1 := math.Sqrt(rd*rd + extra*extra)
			if extra/rd > rtol || rd1 > atol {
				falseCount++
			}
			used++
		})
		if used > 0 {
			res.Fractions[d-1] = float64(falseCount) / float64(used)
		}
	}
	for d := 1; d <= maxDim; d++ {
		if res.Fractions[d-1] <= frac {
			res.Dim, res.Saturated = d, true
			break
		}
	}
	return res, nil
}
