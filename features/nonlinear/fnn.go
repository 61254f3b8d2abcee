package nonlinear

import (
	"fmt"
	"math"
)

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
	const who = "nonlinear: false nearest neighbours"
	z, err := standardize(x, 50, who)
	if err != nil {
		return nil, err
	}
	delay, acf, _, err := chooseDelay(z, EmbedOptions{Delay: opts.Delay})
	if err != nil {
		return nil, fmt.Errorf("%s: %w", who, err)
	}
	w := opts.Theiler
	if w <= 0 {
		w = defaultTheiler(acf, delay)
	}
	return fnnStd(z, delay, w, opts)
}

func fnnStd(z []float64, delay, w int, opts FNNOptions) (*FNNResult, error) {
	const who = "nonlinear: false nearest neighbours"
	maxDim := opts.MaxDim
	if maxDim <= 0 {
		maxDim = 10
	}
	maxRef := opts.MaxRef
	if maxRef <= 0 {
		maxRef = 1000
	}
	if opts.MaxPoints <= 0 {
		opts.MaxPoints = 20000
	}
	if len(z) > opts.MaxPoints {
		z = z[:opts.MaxPoints]
	}
	rtol, atol, frac := opts.RTol, opts.ATol, opts.Fraction
	if rtol <= 0 {
		rtol = 15
	}
	if atol <= 0 {
		atol = 2
	}
	if frac <= 0 {
		frac = 0.01
	}
	n := len(z)
	valid := n - maxDim*delay
	if valid < 50 || valid <= 2*w+10 {
		return nil, fmt.Errorf("%s: %d samples leave %d vectors at dimension %d, delay %d, Theiler window %d: %w",
			who, n, valid, maxDim+1, delay, w, ErrTooShort)
	}
	refs := evenlySpaced(valid, maxRef)
	res := &FNNResult{Fractions: make([]float64, maxDim), Dim: maxDim, Delay: delay, Theiler: w, Refs: len(refs)}
	q := make([]float64, maxDim)
	for d := 1; d <= maxDim; d++ {
		m := n - d*delay
		pts := delayVectors(z, d, delay, m)
		tree := newKDTree(pts, d, m)
		falseCount, used := 0, 0
		for _, i := range refs {
			copy(q[:d], pts[i*d:(i+1)*d])
			j, rd := tree.nearest(q[:d], i, w, true)
			if j < 0 {
				continue
			}
			extra := math.Abs(z[i+d*delay] - z[j+d*delay])
			rd1 := math.Sqrt(rd*rd + extra*extra)
			if extra/rd > rtol || rd1 > atol {
				falseCount++
			}
			used++
		}
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
