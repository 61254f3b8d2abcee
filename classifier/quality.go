package classifier

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"tracesift/features/scaling"
)

// Thresholds of the recording-quality warnings. They are screening rules of
// thumb (common practice), chosen so that the reference systems of the
// generators package do not trigger them, except the drift rule, which
// Brownian and 1/f noise rightly trigger.
const (
	// ShortTrace: below this many samples the verdict rests on thin
	// statistics (the benchmark reports accuracy against length).
	ShortTrace = 2000
	// clipFraction: a share of samples sitting exactly at the minimum or the
	// maximum above this means the recorder's range clipped the signal.
	clipFraction = 0.005
	// quantLevels: fewer distinct values than this means the recorder's
	// resolution is coarse relative to the fluctuations.
	quantLevels = 64
	// driftSegments: the record is split into this many segments for the
	// stationarity checks; driftMean is the largest spread of segment
	// means, in within-segment standard deviations, and driftVar the largest
	// ratio of segment variances, before a warning.
	driftSegments = 8
	driftMean     = 3.0
	driftVar      = 4.0
	// mainsDB is how far a mains line (50 or 60 Hz or a harmonic) must
	// stand above the median of its neighbouring bins to be reported.
	mainsDB = 20.0
)

// QualityWarnings returns one-line warnings about how x was recorded:
// short, clipped, quantised, few cycles of its slowest motion, drifting
// (non-stationary) and, when the sample
// interval in seconds is known (interval > 0), strong periodic interference
// at the mains frequencies 50 or 60 Hz or their harmonics.
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
	lo, hi := sorted[0], sorted[n-1]
	atLo, atHi := 0, 0
	for atLo < n && sorted[atLo] == lo {
		atLo++
	}
	for atHi < n && sorted[n-1-atHi] == hi {
		atHi++
	}
	if f := float64(max(atLo, atHi)) / float64(n); f > clipFraction && max(atLo, atHi) >= 3 && lo != hi {
		side := "maximum"
		if atLo > atHi {
			side = "minimum"
		}
		out = append(out, fmt.Sprintf("clipped: %.1f%% of samples sit exactly at the %s; the recorder's range may have cut the signal", 100*f, side))
	}
	levels := 1
	for i := 1; i < n; i++ {
		if sorted[i] != sorted[i-1] {
			levels++
		}
	}
	if levels < quantLevels && levels < n/4 {
		out = append(out, fmt.Sprintf("quantised: only %d distinct levels; on a uniform converter grid the features spread each sample within its step (a seeded dither) and read the grid as measurement noise", levels))
	}
	if c := MeanCrossings(x); c < MinCrossings {
		out = append(out, fmt.Sprintf("few cycles: the trace crosses its mean only %d times; a verdict needs about ten oscillations of the slowest motion in the record (the reference set holds no deterministic series with fewer than %d crossings)", c, MinCrossings))
	}
	if w := driftWarning(x); w != "" {
		out = append(out, w)
	}
	if interval > 0 {
		out = append(out, mainsWarnings(x, interval)...)
	}
	return out
}

func driftWarning(x []float64) string {
	seg := len(x) / driftSegments
	if seg < 32 {
		return ""
	}
	means := make([]float64, driftSegments)
	vars := make([]float64, driftSegments)
	for s := range driftSegments {
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
	case spread > driftMean && ratio > driftVar:
		return fmt.Sprintf("non-stationary: the mean wanders by %.1f and the variance by a factor %.1f across %d segments; random-walk or 1/f-like wander, or an instrumental drift", spread, ratio, driftSegments)
	case spread > driftMean:
		return fmt.Sprintf("non-stationary: segment means spread over %.1f within-segment standard deviations; random-walk or 1/f-like wander, or an instrumental drift", spread)
	case ratio > driftVar:
		return fmt.Sprintf("non-stationary: the variance changes by a factor %.1f across %d segments", ratio, driftSegments)
	}
	return ""
}

// mainsWarnings looks for a narrow line at 50 or 60 Hz in a Welch spectrum
// of x sampled every interval seconds, and names its second and third
// harmonics when they are lines too. A line must stand mainsDB above the
// median of the bins 4–15 away on both sides and 10 dB above the bins 3
// away: a broad hump (a chaotic or noisy oscillation) is not a line. Long
// Welch segments (half the trace) give the needed resolution.
func mainsWarnings(x []float64, interval float64) []string {
	seg := 256
	for seg*2 <= len(x)/2 {
		seg *= 2
	}
	sp, err := scaling.Welch(x, scaling.WelchOptions{Segment: seg})
	if err != nil || len(sp.Freq) < 32 {
		return nil
	}
	df := sp.Freq[1] / interval // bin width in Hz
	line := func(f float64) (float64, bool) {
		k := int(math.Round(f / df))
		if df > f/4 || k < 16 || k+16 >= len(sp.Power) {
			return 0, false
		}
		peak := math.Max(sp.Power[k], math.Max(sp.Power[k-1], sp.Power[k+1]))
		shoulder := math.Max(sp.Power[k-3], sp.Power[k+3])
		var neigh []float64
		for d := 4; d <= 15; d++ {
			neigh = append(neigh, sp.Power[k-d], sp.Power[k+d])
		}
		floor := median(neigh)
		if !(floor > 0) || !(shoulder > 0) {
			return 0, false
		}
		db := 10 * math.Log10(peak/floor)
		return db, db > mainsDB && 10*math.Log10(peak/shoulder) > 10
	}
	var out []string
	for _, mains := range []float64{50, 60} {
		db, ok := line(mains)
		if !ok {
			continue
		}
		var harm []string
		for h := 2; h <= 3; h++ {
			if _, ok := line(mains * float64(h)); ok {
				harm = append(harm, fmt.Sprintf("%g Hz", mains*float64(h)))
			}
		}
		msg := fmt.Sprintf("periodic interference at %g Hz (mains?): a line %.0f dB above the local spectral floor", mains, db)
		if len(harm) > 0 {
			msg += ", with harmonics at " + strings.Join(harm, " and ")
		}
		out = append(out, msg)
	}
	return out
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
