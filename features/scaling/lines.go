package scaling

import (
	"fmt"
	"math"
	"slices"
)

// LinesOptions configures Lines. The zero value selects the defaults.
type LinesOptions struct {
	// Segment is the Welch segment length (a power of two); 0 means the
	// largest power of two not above n/2 and at most 16384, so that at
	// least three half-overlapping segments are averaged.
	Segment int
	// Threshold is how far above the local noise floor (the lower quartile
	// of the spectrum around it) a bin must rise to count as a line
	// (default 20).
	Threshold float64
}

// LinesResult is the split of a spectrum into lines and continuum.
type LinesResult struct {
	// Fraction is the share of the variance carried by narrow spectral
	// lines: periodic and quasi-periodic motion has a pure point spectrum
	// (Fraction → 1, less the measurement noise), noise and chaos a
	// continuous one (Fraction near 0, or the share of a few dominant
	// oscillations).
	Fraction float64
	// Lines is the number of separate lines found, Bins the number of
	// spectral bins examined, Segment and Segments the Welch parameters.
	Lines, Bins       int
	Segment, Segments int
}

// Lines estimates the fraction of x's variance carried by narrow spectral
// lines. The power spectrum is a Welch average of Hann-windowed segments;
// a bin is a line when its power exceeds Threshold times the local noise
// floor, a local power law fitted to the spectrum on a geometric block
// around it (±12% of its frequency, at least 16 bins) raised to the lower
// quartile of the block; the line's power is summed over the Hann main
// lobe (±2 bins). Only frequencies of at least four cycles per segment
// are examined: below that a line cannot be told from a red-noise rise
// at this resolution (the lowest bins still count in the total). The spectral decomposition into a point part
// (periodic and quasi-periodic components) and a continuous part (noise,
// chaos) is the classical distinction of regular from irregular motion
// (e.g. Bergé, Pomeau & Vidal, Order within Chaos (1984) ch. 2 (memory));
// the estimator is our own and common practice in line detection. For a
// series of white noise the chance that one bin of a three-segment
// average passes the default threshold is below 10⁻⁹ (the averaged
// ordinate is χ²₆/6 distributed and its lower quartile 0.57).
//
// The caller must supply at least 256 finite samples that are not all
// equal. Cost O(n log n).
func Lines(x []float64, opts LinesOptions) (LinesResult, error) {
	if err := checkSeries("lines", x, 256); err != nil {
		return LinesResult{}, err
	}
	seg := opts.Segment
	if seg == 0 {
		seg = 256
		for 2*seg <= len(x)/2 && 2*seg <= 16384 {
			seg *= 2
		}
	}
	thr := opts.Threshold
	if thr == 0 {
		thr = 20
	}
	if !(thr > 1) {
		return LinesResult{}, fmt.Errorf("lines: threshold %g, want > 1", thr)
	}
	sp, err := Welch(x, WelchOptions{Segment: seg})
	if err != nil {
		return LinesResult{}, fmt.Errorf("lines: %w", err)
	}
	p := sp.Power[1:] // drop DC
	k := len(p)
	floor := quartileFloor(p)
	mask := make([]bool, k)
	lines := 0
	inLine := false
	for i, v := range p {
		// Bin i is frequency i+1 cycles per segment; below minCycles a
		// line cannot be told from the rise of a red-noise spectrum (or
		// from the leakage of a segment's trend) at this resolution.
		if i+1 >= minCycles && v > thr*floor[i] {
			if !inLine {
				lines++
			}
			inLine = true
			for j := max(0, i-2); j <= min(k-1, i+2); j++ {
				mask[j] = true
			}
		} else {
			inLine = false
		}
	}
	var total, line float64
	for i, v := range p {
		total += v
		if mask[i] {
			line += v
		}
	}
	res := LinesResult{Lines: lines, Bins: k, Segment: sp.Segment, Segments: sp.Segments}
	if total > 0 {
		res.Fraction = line / total
	}
	return res, nil
}

// minCycles is the fewest cycles per Welch segment a line must complete.
const minCycles = 4

// quartileFloor returns, for every bin of p, the local noise floor. The
// bins are cut into geometric blocks (each at least 16 bins and spanning a
// factor 1.25 in frequency); in each block a line is fitted by least
// squares to log power against log frequency (a local power law, so that
// steep red-noise spectra are followed), and the floor is that line
// raised by the lower quartile of the residuals, which ignores the lines
// themselves unless they fill most of a block.
func quartileFloor(p []float64) []float64 {
	k := len(p)
	out := make([]float64, k)
	res := make([]float64, 0, k)
	for lo := 0; lo < k; {
		hi := max(lo+16, int(math.Ceil(float64(lo+1)*1.25)))
		hi = min(hi, k)
		if k-hi < 8 { // fold a short tail into the last block
			hi = k
		}
		var sx, sy, sxx, sxy float64
		m := float64(hi - lo)
		for i := lo; i < hi; i++ {
			x, y := math.Log(float64(i+1)), safeLog(p[i])
			sx += x
			sy += y
			sxx += x * x
			sxy += x * y
		}
		slope := 0.0
		if d := m*sxx - sx*sx; d > 0 {
			slope = (m*sxy - sx*sy) / d
		}
		icpt := (sy - slope*sx) / m
		res = res[:0]
		for i := lo; i < hi; i++ {
			res = append(res, safeLog(p[i])-icpt-slope*math.Log(float64(i+1)))
		}
		slices.Sort(res)
		q := res[(len(res)-1)/4]
		for i := lo; i < hi; i++ {
			out[i] = math.Exp(icpt + slope*math.Log(float64(i+1)) + q)
		}
		lo = hi
	}
	return out
}

func safeLog(v float64) float64 {
	if !(v > 0) {
		return math.Log(math.SmallestNonzeroFloat64)
	}
	return math.Log(v)
}
