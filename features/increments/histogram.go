package increments

import (
	"fmt"
	"math"
	"slices"
)

// HistogramOptions configures Histogram. The zero value selects the
// defaults.
type HistogramOptions struct {
	// Bins is the number of equal-width bins. 0 means the
	// Freedman–Diaconis rule, width 2·IQR·N^{−1/3} (Freedman & Diaconis,
	// Z. Wahrscheinlichkeitstheorie 57 (1981) 453; checked: pythonhosted.org/SpacePy/autosummary/spacepy.toolbox.binHisto.html), clamped to
	// 10…200 bins.
	Bins int
	// Min and Max bound the histogram range. Both 0 means the data range.
	// Values outside are counted in Outside, not in any bin.
	Min, Max float64
}

// Bins is a histogram normalised as a probability density, with the
// Gaussian fitted to the same values for comparison.
type Bins struct {
	Edges    []float64 // bin edges, len Bins+1, increasing
	Centers  []float64 // bin centres, len Bins
	Counts   []int     // values per bin (the last bin includes its upper edge)
	Density  []float64 // Counts / (N·width): integrates to the share of values inside the range
	Gaussian []float64 // fitted normal density at Centers, N(Mean, SD²)
	Mean, SD float64   // mean and standard deviation (divisor N) of all values
	N        int       // number of values
	Outside  int       // values outside [Min, Max]
}

// Histogram bins values into equal-width bins and returns the empirical
// density beside the density of the Gaussian with the same mean and
// standard deviation, for plots of (normalised) increment distributions on
// linear or logarithmic axes. The caller must supply at least 2 finite
// values that are not all equal (unless an explicit range is given).
func Histogram(values []float64, opts HistogramOptions) (Bins, error) {
	n := len(values)
	if n < 2 {
		return Bins{}, fmt.Errorf("histogram: %w: %d values, need at least 2", ErrTooShort, n)
	}
	if opts.Bins < 0 {
		return Bins{}, fmt.Errorf("histogram: %w: %d bins", ErrBadOption, opts.Bins)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	var mean float64
	for i, v := range values {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return Bins{}, fmt.Errorf("histogram: %w at index %d", ErrNonFinite, i)
		}
		lo = math.Min(lo, v)
		hi = math.Max(hi, v)
		mean += v
	}
	mean /= float64(n)
	var m2 float64
	for _, v := range values {
		m2 += (v - mean) * (v - mean)
	}
	sd := math.Sqrt(m2 / float64(n))
	if opts.Min != 0 || opts.Max != 0 {
		lo, hi = opts.Min, opts.Max
		if !(lo < hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
			return Bins{}, fmt.Errorf("histogram: %w: range [%g, %g]", ErrBadOption, opts.Min, opts.Max)
		}
	} else if lo == hi {
		return Bins{}, fmt.Errorf("histogram: %w: every value is %g; give an explicit range", ErrConstant, lo)
	}
	k := opts.Bins
	if k == 0 {
		k = freedmanDiaconis(values, lo, hi)
	}
	width := (hi - lo) / float64(k)
	b := Bins{
		Edges:    make([]float64, k+1),
		Centers:  make([]float64, k),
		Counts:   make([]int, k),
		Density:  make([]float64, k),
		Gaussian: make([]float64, k),
		Mean:     mean,
		SD:       sd,
		N:        n,
	}
	for i := range b.Edges {
		b.Edges[i] = lo + float64(i)*width
	}
	b.Edges[k] = hi
	for _, v := range values {
		if v < lo || v > hi {
			b.Outside++
			continue
		}
		i := int((v - lo) / width)
		if i >= k {
			i = k - 1
		}
		b.Counts[i]++
	}
	for i := range b.Centers {
		c := (b.Edges[i] + b.Edges[i+1]) / 2
		b.Centers[i] = c
		b.Density[i] = float64(b.Counts[i]) / (float64(n) * width)
		if sd > 0 {
			u := (c - mean) / sd
			b.Gaussian[i] = math.Exp(-u*u/2) / (sd * math.Sqrt(2*math.Pi))
		}
	}
	return b, nil
}

// freedmanDiaconis returns the Freedman–Diaconis bin count for the range
// [lo, hi], clamped to 10…200.
func freedmanDiaconis(values []float64, lo, hi float64) int {
	s := slices.Clone(values)
	slices.Sort(s)
	q := func(p float64) float64 {
		pos := p * float64(len(s)-1)
		i := int(pos)
		if i+1 >= len(s) {
			return s[len(s)-1]
		}
		return s[i] + (pos-float64(i))*(s[i+1]-s[i])
	}
	iqr := q(0.75) - q(0.25)
	k := 10
	if iqr > 0 {
		w := 2 * iqr * math.Pow(float64(len(s)), -1.0/3)
		k = int(math.Ceil((hi - lo) / w))
	}
	return min(max(k, 10), 200)
}
