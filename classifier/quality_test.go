package classifier

import (
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
	"unicode/utf8"
)

func hasWarning(ws []string, prefix string) bool {
	for _, w := range ws {
		if strings.HasPrefix(w, prefix) {
			return true
		}
	}
	return false
}

// TestFewCyclesWarning: a sine holding 5 periods crosses its mean 10 times
// (twice per period, analytic), below MinCrossings; 50 periods and white
// noise (about n/2 crossings for an i.i.d. symmetric series) do not warn.
func TestFewCyclesWarning(t *testing.T) {
	sine := func(n int, periods float64) []float64 {
		x := make([]float64, n)
		for i := range x {
			x[i] = math.Sin(2*math.Pi*periods*float64(i)/float64(n) + 0.3)
		}
		return x
	}
	if w := QualityWarnings(sine(4000, 5), 0); !hasWarning(w, "few cycles: the trace crosses its mean only 10 times") {
		t.Errorf("5 periods: %v", w)
	}
	if w := QualityWarnings(sine(4000, 50), 0); hasWarning(w, "few cycles") {
		t.Errorf("50 periods: %v", w)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	x := make([]float64, 4000)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	if w := QualityWarnings(x, 0); len(w) != 0 {
		t.Errorf("white noise: %v", w)
	}
	for i := range x { // 8 levels
		x[i] = math.Round(2 * x[i])
	}
	if w := QualityWarnings(x, 0); !hasWarning(w, "quantised: only") {
		t.Errorf("8-level noise: %v", w)
	}
}

// TestRecordingWarningLimits: the limits table names exactly the warnings
// QualityWarnings emits (each warning starts with a table name and a
// colon, and every name is emitted by one of these traces), and the help
// text holds every name within its width.
func TestRecordingWarningLimits(t *testing.T) {
	rng := rand.New(rand.NewPCG(12, 12))
	var traces [][]float64
	traces = append(traces, whiteNoise(500, rng)) // short
	clipped := whiteNoise(10000, rng)
	for i, v := range clipped {
		clipped[i] = math.Min(v, 2) // 2.3% saturated at 2 s.d.
	}
	traces = append(traces, clipped)
	coarse := whiteNoise(4000, rng)
	for i, v := range coarse {
		coarse[i] = math.Round(2 * v)
	}
	traces = append(traces, coarse)
	slow := make([]float64, 4000)
	for i := range slow {
		slow[i] = math.Sin(2 * math.Pi * 5 * float64(i) / 4000)
	}
	traces = append(traces, slow)
	ramp := whiteNoise(10000, rng)
	addRamp(ramp, 2)
	traces = append(traces, ramp)
	step := whiteNoise(10000, rng)
	for i := 5000; i < len(step); i++ {
		step[i] *= 3
	}
	traces = append(traces, step)
	mains := whiteNoise(16000, rng)
	for i := range mains {
		mains[i] += 0.3 * math.Sin(2*math.Pi*50*float64(i)/1000)
	}
	names := map[string]bool{}
	for _, l := range RecordingWarningLimits() {
		names[l.Warning] = false
	}
	for i, x := range append(traces, mains) {
		interval := 0.0
		if i == len(traces) {
			interval = 1e-3
		}
		for _, w := range QualityWarnings(x, interval) {
			found := false
			for name := range names {
				if strings.HasPrefix(w, name+":") || strings.HasPrefix(w, name+" ") {
					names[name], found = true, true
				}
			}
			if !found {
				t.Errorf("warning %q has no entry in RecordingWarningLimits", w)
			}
		}
	}
	for name, seen := range names {
		if !seen {
			t.Errorf("RecordingWarningLimits names %q, which no test trace produced", name)
		}
	}
	help := RecordingWarningHelp(78, "  ")
	for _, line := range strings.Split(strings.TrimRight(help, "\n"), "\n") {
		if utf8.RuneCountInString(line) > 78 {
			t.Errorf("help line longer than 78 columns: %q", line)
		}
	}
	for name := range names {
		if !strings.Contains(help, "  "+name+": ") {
			t.Errorf("help text lacks %q", name)
		}
	}
}

// BenchmarkQualityWarnings measures the recording warnings on a 10^4-sample
// trace of white noise with a sample interval (so the mains test runs),
// and each statistical test on its own.
func BenchmarkQualityWarnings(b *testing.B) {
	x := whiteNoise(10000, rand.New(rand.NewPCG(1, 1)))
	b.Run("all", func(b *testing.B) {
		for b.Loop() {
			QualityWarnings(x, 1e-3)
		}
	})
	b.Run("clip", func(b *testing.B) {
		s := slices.Clone(x)
		slices.Sort(s)
		q := gridStep(s)
		for b.Loop() {
			railPileAt(x, s, q, true)
			railPileAt(x, s, q, false)
		}
	})
	b.Run("drift", func(b *testing.B) {
		for b.Loop() {
			DriftTest(x)
		}
	})
	b.Run("mains", func(b *testing.B) {
		for b.Loop() {
			MainsLines(x, 1e-3)
		}
	})
}
