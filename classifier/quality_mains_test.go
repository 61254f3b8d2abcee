package classifier

import (
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// TestLineThreshold checks the null law behind the mains test by Monte
// Carlo. One periodogram: an ordinate and m floor ordinates i.i.d.
// exponential; the ordinate exceeds c times the r-th smallest floor value
// with probability Π_{i≤r} (m−i+1)/(m−i+1+c) exactly (Rényi's
// representation), so the rate at lineThreshold's c must be α within
// binomial error (4 s.d.). An average of k = 4 periodograms: Gamma(4, 1/4)
// ordinates, where the threshold uses the normal law of the sample median;
// the rate must lie within 20% of α (4 s.d. of 40000 trials).
func TestLineThreshold(t *testing.T) {
	const alpha = 0.01
	rng := rand.New(rand.NewPCG(8, 8))
	rate := func(k, m, trials int) float64 {
		r := (m + 1) / 2
		c, _ := lineThreshold(k, m, r, alpha)
		floor := make([]float64, m)
		draw := func() float64 {
			var s float64
			for range k {
				s += rng.ExpFloat64()
			}
			return s / float64(k)
		}
		hits := 0
		for range trials {
			for i := range floor {
				floor[i] = draw()
			}
			slices.Sort(floor)
			if draw() > c*floor[r-1] {
				hits++
			}
		}
		return float64(hits) / float64(trials)
	}
	const trials = 100000
	tol := 4 * math.Sqrt(alpha*(1-alpha)/trials)
	if got := rate(1, 63, trials); math.Abs(got-alpha) > tol {
		t.Errorf("one periodogram, m = 63: exceedance rate %.4f, want %.4f ± %.4f", got, alpha, tol)
	}
	if got := rate(4, 201, 40000); math.Abs(got-alpha) > 0.2*alpha {
		t.Errorf("average of 4, m = 201: exceedance rate %.4f, want %.4f ± 20%%", got, alpha)
	}
}

// mainsFloors are the floors of the mains tests: white noise and 1/f
// noise (spectral synthesis), the two floors of a low-current recording.
var mainsFloors = []qualitySignal{
	{"white", func(_ testing.TB, n int, rng *rand.Rand) []float64 { return whiteNoise(n, rng) }},
	{"1/f", func(t testing.TB, n int, rng *rand.Rand) []float64 {
		t.Helper()
		x, err := generators.PowerLaw{Beta: 1}.Generate(n, rng)
		if err != nil {
			t.Fatal(err)
		}
		return x
	}},
}

// mainsTrace is a floor sampled at fs ∈ [1, 1.1) kHz (the line's
// frequency falls anywhere between two periodogram bins) with a line at
// 50 or 60 Hz (± 0.05 Hz) of peak amplitude amp times the floor's s.d.
func mainsTrace(t testing.TB, floor qualitySignal, n int, amp float64, seed uint64) (x []float64, interval float64) {
	rng := rand.New(rand.NewPCG(seed, uint64(n)))
	x = floor.gen(t, n, rng)
	fs := 1000 * (1 + 0.1*rng.Float64())
	f := []float64{50, 60}[seed%2] + 0.1*(rng.Float64()-0.5)
	if amp > 0 {
		addLine(x, f, fs, amp, rng)
	}
	return x, 1 / fs
}

// TestMainsDetectionLimit measures the stated limits (mainsStated, shown
// by RecordingWarningLimits) on white and 1/f floors at fs ≈ 1 kHz: at n
// the line is found on ≥ 90% of 20 records (10 for n = 4.8·10^6), at n/8
// on at most half — the limit is sharp, not a loose bound. A line of peak amplitude A on a
// floor of variance σ² raises its bin A²L/(4σ²) above the floor's mean
// (L the periodogram length, at most 64 s of samples; analytic for a
// rectangular window and a line on a bin centre).
func TestMainsDetectionLimit(t *testing.T) {
	for _, lim := range mainsStated {
		for _, floor := range mainsFloors[:lim.floors] {
			seeds := 20
			if lim.n > 1_000_000 {
				if testing.Short() {
					continue
				}
				seeds = 10
			}
			for _, n := range []int{lim.n, lim.n / 8} {
				hit := 0
				for seed := range seeds {
					x, dt := mainsTrace(t, floor, n, lim.amp, uint64(seed))
					if len(MainsLines(x, dt).Lines) > 0 {
						hit++
					}
				}
				t.Logf("%-5s floor, line %.0f%% of s.d., n = %7d: found on %2d/%d", floor.name, 100*lim.amp, n, hit, seeds)
				if n == lim.n && float64(hit) < 0.9*float64(seeds) {
					t.Errorf("%s floor, line at %.0f%% of s.d., n = %d: found on %d of %d records, the stated limit says ≥ 90%%", floor.name, 100*lim.amp, n, hit, seeds)
				}
				if n < lim.n && 2*hit > seeds {
					t.Errorf("%s floor, line at %.0f%% of s.d., n = %d: found on %d of %d records, eight times below the stated length", floor.name, 100*lim.amp, n, hit, seeds)
				}
			}
		}
	}
}

// TestMainsFalseAlarms: clean white and 1/f floors (4000 records of 4096
// and 10^4 samples) give the stated false-alarm rate of 0.1% per record
// (MainsAlpha), allowed up to 0.3%; chaotic traces (40 Lorenz records
// sampled at 0.2 to 2.2 kHz) and a regular signal with harmonics away
// from the mains frequencies give none.
func TestMainsFalseAlarms(t *testing.T) {
	alarms, total := 0, 0
	for _, floor := range mainsFloors {
		for _, n := range []int{4096, 10000} {
			for seed := range 1000 {
				x, dt := mainsTrace(t, floor, n, 0, uint64(seed))
				if r := MainsLines(x, dt); len(r.Lines) > 0 {
					alarms++
				}
				total++
			}
		}
	}
	t.Logf("clean floors: %d alarms in %d records (%.2f%%)", alarms, total, 100*float64(alarms)/float64(total))
	if float64(alarms) > 0.003*float64(total) {
		t.Errorf("clean floors: %d alarms in %d records, allowed 0.3%%", alarms, total)
	}
	lorenz := fromSystem("lorenz", "lorenz", nil)
	for seed := range 40 {
		rng := rand.New(rand.NewPCG(uint64(seed), 31))
		x := lorenz.gen(t, 10000, rng)
		fs := 200 + 2000*rng.Float64()
		if r := MainsLines(x, 1/fs); len(r.Lines) > 0 {
			t.Errorf("lorenz at %.0f Hz: %+v", fs, r.Lines)
		}
	}
	// A 37 Hz square-ish wave (harmonics 111, 185, ... Hz) on white noise.
	rng := rand.New(rand.NewPCG(4, 4))
	x := whiteNoise(20000, rng)
	for i := range x {
		ph := 2 * math.Pi * 37 * float64(i) / 1000
		x[i] += math.Sin(ph) + math.Sin(3*ph)/3 + math.Sin(5*ph)/5
	}
	if w := QualityWarnings(x, 1e-3); hasWarning(w, "periodic interference") {
		t.Errorf("37 Hz wave: %q", w)
	}
}

// TestMainsUsesInterval: the test reads frequencies in Hz from the sample
// interval. A 50 Hz line of 20% of the s.d. with its second harmonic,
// sampled at 1 kHz, is reported with both lines; its level above the
// floor matches A²L/(4σ²) (22.0 dB for A = 0.2, L = 16000, on a bin
// centre) within 1 dB and its amplitude within 10%. Without an interval
// there is no warning, and with a wrong one (0.8 ms: the lines then read
// 62.5 and 125 Hz) neither.
func TestMainsUsesInterval(t *testing.T) {
	rng := rand.New(rand.NewPCG(6, 6))
	const n, fs = 16000, 1000.0
	x := whiteNoise(n, rng)
	for i := range x {
		x[i] += 0.2*math.Sin(2*math.Pi*50*float64(i)/fs) + 0.1*math.Sin(2*math.Pi*100*float64(i)/fs+1)
	}
	r := MainsLines(x, 1/fs)
	if len(r.Lines) != 2 || r.Lines[0].Harmonic != 1 || r.Lines[1].Harmonic != 2 {
		t.Fatalf("50 + 100 Hz lines: %+v", r)
	}
	sd := 1.0 // the white floor's s.d.
	want := 10 * math.Log10(0.2*0.2*float64(r.Segment)/(4*sd*sd))
	if l := r.Lines[0]; math.Abs(l.DB-want) > 1 || math.Abs(l.Amplitude-0.2) > 0.02 || math.Abs(l.Freq-50) > r.Resolution {
		t.Errorf("50 Hz line: %+v, want %.1f dB and amplitude 0.2", l, want)
	}
	w := QualityWarnings(x, 1/fs)
	if !hasWarning(w, "periodic interference at 50 Hz, 100 Hz (mains 50 Hz?)") {
		t.Errorf("warnings %q", w)
	}
	for _, dt := range []float64{0, 0.8 / fs} {
		for _, m := range QualityWarnings(x, dt) {
			if strings.HasPrefix(m, "periodic interference") {
				t.Errorf("interval %g s: %q", dt, m)
			}
		}
	}
}
