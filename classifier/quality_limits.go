package classifier

import (
	"fmt"
	"strings"
	"unicode/utf8"
)

// RecordingWarningLimit says when one recording warning of
// QualityWarnings fires and what it can detect.
type RecordingWarningLimit struct {
	// Warning is the name that starts the warning's text, before the
	// colon ("clipped", "drift", ...).
	Warning string
	// Rule is the test applied, in a sentence or two.
	Rule string
	// Limit is the detection limit and the false-alarm rate measured by
	// the package tests (quality_*_test.go), with the conditions of the
	// measurement; empty for plain counting rules.
	Limit string
}

// clipStated are the stated detection limits of the clipping warning on
// Gaussian-like noise, n = 10^4: with this many converter codes between
// the signal's minimum and the rail, this share of the samples clipped at
// the rail is reported on at least 90% of records (TestClippedIsDetected
// measures them).
var clipStated = []struct {
	codes int
	share float64
}{{440, 0.005}, {128, 0.005}, {64, 0.01}, {32, 0.05}, {24, 0.10}}

// driftStated are the stated detection limits of the drift warning: a
// straight ramp of size s.d. across n samples of the system is reported
// on at least the given share of records, and so is a ramp twice as large
// (TestDriftIsDetected measures them).
var driftStated = []struct {
	label, system string
	params        map[string]float64
	n             int
	size, share   float64
}{
	{"a sine with harmonics", "sine", map[string]float64{"period": 37.3}, 2000, 0.5, 0.95},
	{"the logistic map", "logistic", nil, 10000, 0.5, 0.95},
	{"the Henon map", "henon", nil, 2000, 0.5, 0.95},
	{"Lorenz z at dt = 0.02", "lorenz", map[string]float64{"dt": 0.02, "obs": 2}, 10000, 0.5, 0.95},
	{"Lorenz x at dt = 0.05", "lorenz", map[string]float64{"dt": 0.05}, 20000, 1, 0.9},
	{"Lorenz x at dt = 0.01", "lorenz", nil, 20000, 2, 0.7},
	{"white noise", "white", nil, 2000, 0.5, 0.8},
	{"white noise", "white", nil, 10000, 0.5, 0.95},
	{"AR(1) noise with phi = 0.9", "ar1", map[string]float64{"phi": 0.9}, 10000, 1, 0.75},
}

// mainsStated are the stated detection limits of the mains warning at a
// sampling rate of about 1 kHz: a line of peak amplitude amp (in s.d. of
// the floor) is found on at least 90% of records of n samples, on the
// first floors of white and 1/f noise (TestMainsDetectionLimit measures
// them).
var mainsStated = []struct {
	amp    float64
	n      int
	floors int
}{{0.05, 60000, 2}, {0.02, 600000, 2}, {0.01, 4800000, 1}}

// RecordingWarningLimits returns the rules and the measured detection
// limits of the recording warnings, in the order QualityWarnings emits
// them, for help texts and reports. The numbers are checked by the tests
// that measure them.
func RecordingWarningLimits() []RecordingWarningLimit {
	var clip []string
	for i, c := range clipStated {
		unit := ""
		if i == 0 {
			unit = " codes"
		}
		clip = append(clip, fmt.Sprintf("%g%% with %d%s", 100*c.share, c.codes, unit))
	}
	var drift []string
	for _, d := range driftStated {
		drift = append(drift, fmt.Sprintf("%g s.d. on %s (n=%d, %.0f%%)", d.size, d.label, d.n, 100*d.share))
	}
	var mains []string
	for _, m := range mainsStated {
		floor := "white or 1/f floor"
		if m.floors == 1 {
			floor = "white floor"
		}
		mains = append(mains, fmt.Sprintf("%g%% of the s.d. from n=%d (%s)", 100*m.amp, m.n, floor))
	}
	return []RecordingWarningLimit{
		{
			Warning: "short trace",
			Rule:    fmt.Sprintf("fewer than %d samples.", ShortTrace),
		},
		{
			Warning: "clipped",
			Rule: "the extreme level of the values holds at least 0.5% of the samples and more than 1.5 times, and 3 standard deviations above, " +
				"the most an unclipped edge allows given the levels inside it: as many as its neighbour for a distribution that thins out " +
				"towards the rail, up to 2.4 times as many at the smooth turning point of an oscillation.",
			Limit: "clipping at one rail of Gaussian-like noise (white, AR(1), 1/f, telegraph traps on a 1/f floor), n = 10^4, is found on " +
				"at least 90% of records from " + strings.Join(clip, ", ") + " across the signal. With 20 codes or fewer a clipped rail " +
				"looks like a turning point and even 20% clipping is mostly missed. No false alarm on 672 unclipped coarse records " +
				"(16 to 440 levels over 30-100% of the converter range; noises, telegraph traps, Lorenz, the logistic map, a sine).",
		},
		{
			Warning: "quantised",
			Rule:    fmt.Sprintf("fewer than %d distinct values (and fewer than n/4).", quantLevels),
		},
		{
			Warning: "few cycles",
			Rule:    fmt.Sprintf("fewer than %d crossings of the mean.", MinCrossings),
		},
		{
			Warning: "drift",
			Rule: fmt.Sprintf("the least-squares straight line changes by at least %.2g s.d. of the detrended trace across the record "+
				"(1%% of the variance) and lies at least %.0f standard errors from zero; the error comes from the trace's own spectrum "+
				"at the lowest frequencies (a power law fitted to the periodogram of %d block means and integrated down to zero frequency).",
				DriftMinSize, DriftZ, driftBlocks),
			Limit: "a ramp across the record is found on the given share of records from " + strings.Join(drift, ", ") +
				". 1/f noise wanders by about 1 s.d. across any record, so a drift on it must exceed about 4 s.d. to stand out. " +
				"False alarms at most 1%: 0.5% of 2000 records of 1/f noise (n = 10^4), 0.25% of 400 of Lorenz x (n = 10^4), none of the " +
				"chaotic maps and flows, white, AR(1) and telegraph records tested.",
		},
		{
			Warning: "non-stationary",
			Rule: fmt.Sprintf("over %d segments the segment means spread over more than %g within-segment s.d., or the segment variances "+
				"differ by more than a factor %g (a screening rule, common practice); after a drift warning it is applied to the detrended trace.",
				stationSegments, stationMean, stationVar),
		},
		{
			Warning: "periodic interference",
			Rule: fmt.Sprintf("needs the sample interval in seconds. A periodogram bin within %g Hz of 50 or 60 Hz or their second and "+
				"third harmonics stands above the median of the %g Hz on each side by a threshold set for a %g%% false-alarm chance per "+
				"trace (10-12 dB above the floor's mean); periodograms span at most %d s, longer traces average several.",
				mainsBand, mainsFloorWidth, 100*MainsAlpha, mainsMaxSeconds),
			Limit: "a line of peak amplitude A on a floor of s.d. s stands A^2 L/(4 s^2) above the floor's mean (L samples per " +
				"periodogram) and is found on at least 90% of records from about 16 dB. Sampled at 1 kHz: " + strings.Join(mains, ", ") +
				"; records 8 times shorter find it on at most half. Floors that fall steeply by 50 Hz (telegraph noise, filtered " +
				"read-outs) reveal far weaker lines. False alarms at most 0.3%: 0.15% of 4000 clean white and 1/f records.",
		},
	}
}

// RecordingWarningHelp formats RecordingWarningLimits as text for a
// command's help: one paragraph per warning, its name first, wrapped at
// width columns (0: 78) after indent.
func RecordingWarningHelp(width int, indent string) string {
	if width <= 0 {
		width = 78
	}
	var b strings.Builder
	for i, l := range RecordingWarningLimits() {
		if i > 0 {
			b.WriteString("\n")
		}
		text := l.Warning + ": " + l.Rule
		if l.Limit != "" {
			text += " Measured: " + l.Limit
		}
		line := indent
		for _, w := range strings.Fields(text) {
			if len(line) > len(indent) && utf8.RuneCountInString(line)+1+utf8.RuneCountInString(w) > width {
				b.WriteString(strings.TrimRight(line, " ") + "\n")
				line = indent + "  "
			}
			if len(line) > len(indent) && !strings.HasSuffix(line, "  ") {
				line += " "
			}
			line += w
		}
		b.WriteString(line + "\n")
	}
	return b.String()
}
