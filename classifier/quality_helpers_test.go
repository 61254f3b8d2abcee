package classifier

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// qualitySignal is a named series generator for the recording-warning
// tests.
type qualitySignal struct {
	name string
	gen  func(t testing.TB, n int, rng *rand.Rand) []float64
}

// fromSystem wraps a registered generators system.
func fromSystem(name, system string, params map[string]float64) qualitySignal {
	return qualitySignal{name, func(t testing.TB, n int, rng *rand.Rand) []float64 {
		t.Helper()
		sys, err := generators.Lookup(system)
		if err != nil {
			t.Fatal(err)
		}
		x, err := sys.Generate(n, params, rng)
		if err != nil {
			t.Fatal(err)
		}
		return x
	}}
}

// sineSignal is a sine of a random period between 20 and 50 samples and
// random phase.
var sineSignal = qualitySignal{"sine", func(_ testing.TB, n int, rng *rand.Rand) []float64 {
	x := make([]float64, n)
	period, phase := 20+30*rng.Float64(), 2*math.Pi*rng.Float64()
	for i := range x {
		x[i] = math.Sin(2*math.Pi*float64(i)/period + phase)
	}
	return x
}}

// lowCurrent imitates a low-current recording before its converter: two
// telegraph traps (dwell times of hundreds of samples, the larger one
// twice the 1/f floor's s.d.), a 1/f floor, white amplifier noise, a
// drift of one floor s.d. and a small periodic pick-up.
var lowCurrent = qualitySignal{"low-current", func(t testing.TB, n int, rng *rand.Rand) []float64 {
	t.Helper()
	trap := func(up, down, a float64) []float64 {
		x, err := generators.Telegraph{TauUp: up, TauDown: down, Dt: 1, Amplitude: a}.Generate(n, rng)
		if err != nil {
			t.Fatal(err)
		}
		return x
	}
	a, b := trap(300, 200, 2), trap(40, 90, 0.7)
	floor, err := generators.PowerLaw{Beta: 1}.Generate(n, rng)
	if err != nil {
		t.Fatal(err)
	}
	x := make([]float64, n)
	f := 0.02 + 0.03*rng.Float64()
	for i := range x {
		x[i] = a[i] + b[i] + floor[i] + 0.3*rng.NormFloat64() + float64(i)/float64(n) + 0.05*math.Sin(2*math.Pi*f*float64(i))
	}
	return x
}}

// quantiseRange rounds x to the codes of a converter with the given
// number of codes spread evenly over its full scale [lo, hi]; values
// beyond a rail are clamped to it (clipped).
func quantiseRange(x []float64, codes int, lo, hi float64) []float64 {
	y := make([]float64, len(x))
	step := (hi - lo) / float64(codes-1)
	for i, v := range x {
		c := math.Max(0, math.Min(float64(codes-1), math.Round((v-lo)/step)))
		y[i] = lo + c*step
	}
	return y
}

// extremeShare returns the largest share of samples sitting exactly at
// the minimum or the maximum of x: the previous clipping rule reported
// any share above 0.5%.
func extremeShare(x []float64) float64 {
	lo, hi := slices.Min(x), slices.Max(x)
	var a, b int
	for _, v := range x {
		if v == lo {
			a++
		}
		if v == hi {
			b++
		}
	}
	return float64(max(a, b)) / float64(len(x))
}

// addRamp adds a straight line rising by size·sd(x) from the first to the
// last sample.
func addRamp(x []float64, size float64) {
	sd := stdDev(x)
	for i := range x {
		x[i] += size * sd * (float64(i)/float64(len(x)-1) - 0.5)
	}
}

// addLine adds a sinusoid of frequency f Hz, amplitude amp·sd(x) and
// random phase to x sampled at fs Hz.
func addLine(x []float64, f, fs, amp float64, rng *rand.Rand) {
	a, ph := amp*stdDev(x), 2*math.Pi*rng.Float64()
	for i := range x {
		x[i] += a * math.Sin(2*math.Pi*f*float64(i)/fs+ph)
	}
}

// whiteNoise returns n i.i.d. N(0, 1) samples.
func whiteNoise(n int, rng *rand.Rand) []float64 {
	x := make([]float64, n)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	return x
}
