package nonlinear

import (
	"errors"
	"fmt"
	"math"
)

// ErrTooShort is returned (wrapped) when a series has fewer samples than an
// estimator needs; the message names the estimator and both lengths.
var ErrTooShort = errors.New("series too short")

// ErrConstant is returned (wrapped) when a series has no variation at
// floating-point resolution: its range max − min is at most 64 ulp of its
// largest magnitude, so every distance-based measure is undefined.
var ErrConstant = errors.New("series is constant")

// ErrDegenerate is returned (wrapped) when a series is not constant but its
// delay vectors repeat so exactly that a measure is undefined (e.g. every
// neighbour pair of an exactly periodic sequence re-merges).
var ErrDegenerate = errors.New("series is degenerate")

// ErrNonFinite is returned (wrapped) when a series holds NaN or ±Inf.
var ErrNonFinite = errors.New("series holds NaN or Inf")

// standardize checks x (at least minN samples, finite, not constant) and
// returns (x − mean)/sd as a new slice, sd being the population standard
// deviation. who names the caller in error messages.
func standardize(x []float64, minN int, who string) ([]float64, error) {
	z, _, err := standardizeSD(x, minN, who)
	return z, err
}

// standardizeSD is standardize that also returns the standard deviation of
// x. The moments are computed on x scaled by a power of two near its largest
// magnitude, which is exact, so huge or tiny values neither overflow nor
// lose precision to subnormals, and the result equals the unscaled formula.
func standardizeSD(x []float64, minN int, who string) ([]float64, float64, error) {
	if len(x) < minN {
		return nil, 0, fmt.Errorf("%s: %d samples, need at least %d: %w", who, len(x), minN, ErrTooShort)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, 0, fmt.Errorf("%s: sample %d is %g: %w", who, i, v, ErrNonFinite)
		}
		lo, hi = min(lo, v), max(hi, v)
	}
	maxAbs := max(-lo, hi)
	if !(hi-lo > 64*0x1p-52*maxAbs) {
		return nil, 0, fmt.Errorf("%s: range %g at magnitude %g: %w", who, hi-lo, maxAbs, ErrConstant)
	}
	_, e := math.Frexp(maxAbs)
	inv := math.Ldexp(1, -e) // x·inv has magnitude in [0.5, 1)
	var mean float64
	for _, v := range x {
		mean += v * inv
	}
	mean /= float64(len(x))
	var ss float64
	for _, v := range x {
		d := v*inv - mean
		ss += d * d
	}
	sd := math.Sqrt(ss / float64(len(x)))
	if !(sd > 0) {
		return nil, 0, fmt.Errorf("%s: standard deviation 0: %w", who, ErrConstant)
	}
	z := make([]float64, len(x))
	for i, v := range x {
		z[i] = (v*inv - mean) / sd
	}
	return z, math.Ldexp(sd, e), nil
}

// delayVectors returns the m = len(z) − (dim−1)·delay delay vectors
// y_i = (z_i, z_{i+delay}, …, z_{i+(dim−1)·delay}), i = 0..m−1, of which only
// the first count are kept (count ≤ 0 means all), flattened row-major.
func delayVectors(z []float64, dim, delay, count int) []float64 {
	m := len(z) - (dim-1)*delay
	if count > 0 && count < m {
		m = count
	}
	if m <= 0 {
		return nil
	}
	out := make([]float64, m*dim)
	for i := 0; i < m; i++ {
		row := out[i*dim : (i+1)*dim]
		for k := range row {
			row[k] = z[i+k*delay]
		}
	}
	return out
}

// evenlySpaced returns up to k indices spread evenly over [0, n), in
// increasing order (all of them when k ≥ n or k ≤ 0).
func evenlySpaced(n, k int) []int {
	if k <= 0 || k >= n {
		k = n
	}
	out := make([]int, k)
	for i := range out {
		out[i] = int(int64(i) * int64(n) / int64(k))
	}
	return out
}

// orDefault returns the option value v, or def when v ≤ 0: the zero value of
// an option selects its documented default. A NaN option is kept as given
// (NaN ≤ 0 is false), as the explicit comparisons it replaces did.
func orDefault[T int | float64](v, def T) T {
	if v <= 0 {
		return def
	}
	return v
}
