package classifier

import (
	"fmt"
	"math"
	"slices"
)

// Thresholds of the recording-quality warnings. They are screening rules of
// thumb (common practice), chosen so that the reference systems of the
// generators package do not trigger them, except the stationarity rule,
// which Brownian and 1/f noise rightly trigger. The clipping, drift and
// mains rules are statistical tests with their own files
// (quality_clip.go, quality_drift.go, quality_mains.go); their detection
// limits are measured in the tests and listed by RecordingWarningLimits.
const (
	// ShortTrace: below this many samples the verdict rests on thin
	// statistics (the benchmark reports accuracy against length).
	ShortTrace = 2000
	// quantLevels: fewer distinct values than this means the recorder's
	// resolution is coarse relative to the fluctuations.
	quantLevels = 64
	// stationSegments: the record is split into this many segments for the
	// stationarity checks; stationMean is the largest spread of segment
	// means, in within-segment standard deviations, and stationVar the largest
	// ratio of segment variances, before a warning.
	stationSegments = 8
	stationMean     = 3.0
	stationVar      = 4.0
)

// QualityWarnings returns one-line warnings about how x was recorded:
// short, clipped (a pile-up of samples at a converter rail), quantised,
// few cycles of its slowest motion, drift (a straight-line trend that
// stands out from the trace's own slow fluctuations, see DriftTest),
// non-stationary (wandering mean or variance, after removing a reported
// drift) and, when the sample interval in seconds is known (interval >
// 0), lines at the mains frequencies 50 or 60 Hz or their harmonics (see
// MainsLines). Each warning starts with its name (and for non-stationary
// a note) and a colon; RecordingWarningLimits lists the names, the rules
// and their measured detection limits.
func QualityWarnings(x []float64, interval float64) []string {
	var out []string
	n := len(x)
	if n == 0 {
		return nil
	}
	if n < ShortTrace {
		out = append(out, fmt.Sprintf("short trace: %d samples; verdicts below %d samples are less reliable", n, ShortTrace))
	}
	sorted := slices.Clone(x)
	slices.Sort(sorted)
	levels := 1
	for i := 1; i < n; i++ {
		if sorted[i] != sorted[i-1] {
			levels++
		}
	}
	if levels >= clipMinLevels {
		q := gridStep(sorted)
		lo, hi := railPileAt(x, sorted, q, false), railPileAt(x, sorted, q, true)
		for _, r := range []struct {
			p    railPile
			side string
		}{{lo, "minimum"}, {hi, "maximum"}} {
			if !r.p.Clipped {
				continue
			}
			pile := "the levels beside it are (nearly) empty"
			if r.p.Bound >= 1 {
				pile = fmt.Sprintf("%.1f times the most an unclipped edge holds given the levels beside it", float64(r.p.Count)/r.p.Bound)
			}
			out = append(out, fmt.Sprintf("clipped: %.1f%% of samples sit at the %s, %s; the recorder's range cut the signal there",
				100*float64(r.p.Count)/float64(n), r.side, pile))
		}
	}
	if levels < quantLevels && levels < n/4 {
		out = append(out, fmt.Sprintf("quantised: only %d distinct levels; on a uniform converter grid the features spread each sample within its step (a seeded dither) and read the grid as measurement noise", levels))
	}
	if c := MeanCrossings(x); c < MinCrossings {
		out = append(out, fmt.Sprintf("few cycles: the trace crosses its mean only %d times; a verdict needs about ten oscillations of the slowest motion in the record (the reference set holds no deterministic series with fewer than %d crossings)", c, MinCrossings))
	}
	stat := x
	note := ""
	if d := DriftTest(x); d.Drift {
		out = append(out, fmt.Sprintf("drift: the mean changes by %+.2g s.d. along the record (a straight-line trend %.1f standard errors from zero against the trace's own slow fluctuations); an instrumental drift or a slow change of the device", d.Size, math.Abs(d.Z)))
		stat = make([]float64, n)
		detrend(stat, x)
		note = " after removing the drift"
	}
	if w := stationarityWarning(stat, note); w != "" {
		out = append(out, w)
	}
	if interval > 0 {
		out = append(out, mainsWarnings(x, interval)...)
	}
	return out
}

// stationarityWarning applies the segment rule (stationSegments, stationMean,
// stationVar) to x; note is appended to the warning's name.
func stationarityWarning(x []float64, note string) string {
	seg := len(x) / stationSegments
	if seg < 32 {
		return ""
	}
	means := make([]float64, stationSegments)
	vars := make([]float64, stationSegments)
	for s := range stationSegments {
		part := x[s*seg : (s+1)*seg]
		var m, v float64
		for _, a := range part {
			m += a
		}
		m /= float64(seg)
		for _, a := range part {
			v += (a - m) * (a - m)
		}
		means[s], vars[s] = m, v/float64(seg)
	}
	within := math.Sqrt(median(vars))
	if !(within > 0) {
		return ""
	}
	spread := (slices.Max(means) - slices.Min(means)) / within
	ratio := slices.Max(vars) / math.Max(slices.Min(vars), 1e-300)
	switch {
	case spread > stationMean && ratio > stationVar:
		return fmt.Sprintf("non-stationary%s: the mean wanders by %.1f and the variance by a factor %.1f across %d segments; random-walk or 1/f-like wander, or an instrumental drift", note, spread, ratio, stationSegments)
	case spread > stationMean:
		return fmt.Sprintf("non-stationary%s: segment means spread over %.1f within-segment standard deviations; random-walk or 1/f-like wander, or an instrumental drift", note, spread)
	case ratio > stationVar:
		return fmt.Sprintf("non-stationary%s: the variance changes by a factor %.1f across %d segments", note, ratio, stationSegments)
	}
	return ""
}

func median(v []float64) float64 {
	if len(v) == 0 {
		return math.NaN()
	}
	s := slices.Clone(v)
	slices.Sort(s)
	if len(s)%2 == 1 {
		return s[len(s)/2]
	}
	return (s[len(s)/2-1] + s[len(s)/2]) / 2
}

// detrend writes to dst the residuals of src about its least-squares
// straight line.
func detrend(dst, src []float64) {
	if len(src) < 2 {
		copy(dst, make([]float64, len(src)))
		return
	}
	n := float64(len(src))
	c := (n - 1) / 2
	var sy, sty float64
	for i, v := range src {
		sy += v
		sty += (float64(i) - c) * v
	}
	mean := sy / n
	slope := sty / (n * (n*n - 1) / 12)
	for i, v := range src {
		dst[i] = v - mean - slope*(float64(i)-c)
	}
}

// smooth5Below returns the largest number of the form 2^a·3^b·5^c not
// above n (n ≥ 1): a length gonum's FFT transforms in O(n log n).
func smooth5Below(n int) int {
	best := 1
	for p2 := 1; p2 <= n; p2 *= 2 {
		for p3 := p2; p3 <= n; p3 *= 3 {
			for p5 := p3; p5 <= n; p5 *= 5 {
				best = max(best, p5)
			}
		}
	}
	return best
}

// stdDev returns the population standard deviation of x.
func stdDev(x []float64) float64 {
	var m float64
	for _, v := range x {
		m += v
	}
	m /= float64(len(x))
	var ss float64
	for _, v := range x {
		ss += (v - m) * (v - m)
	}
	return math.Sqrt(ss / float64(len(x)))
}
