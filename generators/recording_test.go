package generators

import (
	"errors"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

func whiteSeries(n int, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 1))
	x := make([]float64, n)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	return x
}

func lag1(x []float64) float64 {
	m, s := recMeanSD(x)
	var c float64
	for i := 1; i < len(x); i++ {
		c += (x[i] - m) * (x[i-1] - m)
	}
	return c / float64(len(x)-1) / (s * s)
}

func TestRecordingZeroValueStandardises(t *testing.T) {
	x := whiteSeries(1000, 1)
	for i := range x {
		x[i] = 3e-6 + 2e-7*x[i]
	}
	y, err := Recording{}.Apply(x, rand.New(rand.NewPCG(1, 2)))
	if err != nil {
		t.Fatal(err)
	}
	m, s := recMeanSD(y)
	if math.Abs(m) > 1e-9 || math.Abs(s-1) > 1e-9 {
		t.Errorf("mean %g sd %g, want 0 and 1", m, s)
	}
	if got := (Recording{}).String(); got != "clean" {
		t.Errorf("String() = %q, want clean", got)
	}
}

// TestRecordingNoise checks the measurement noise against its definition:
// variance 10^(−SNR/10) of the signal's (definition of the SNR in dB), the
// lag-one autocorrelation φ of a stationary AR(1) (analytic), and the
// excess kurtosis 6/(ν − 4) of Student's t (standard result).
func TestRecordingNoise(t *testing.T) {
	n := 200000
	x := make([]float64, n)
	for i := range x { // a slow sine: its own lag-1 correlation is ≈ 1
		x[i] = math.Sin(2 * math.Pi * float64(i) / 5000)
	}
	for _, tc := range []struct {
		kind  NoiseKind
		param float64
	}{{NoiseWhite, 0}, {NoiseColoured, 0.8}, {NoiseHeavy, 8}, {NoiseFlicker, 1}} {
		r := Recording{Noise: tc.kind, NoiseParam: tc.param, SNR: 10}
		y, err := r.Apply(x, rand.New(rand.NewPCG(3, 4)))
		if err != nil {
			t.Fatal(err)
		}
		clean, _ := Recording{}.Apply(x, nil)
		e := make([]float64, n)
		for i := range e {
			e[i] = y[i] - clean[i]
		}
		_, s := recMeanSD(e)
		if math.Abs(s*s-0.1) > 0.004 {
			t.Errorf("%s: noise variance %.4f, want 0.1 (10 dB)", tc.kind, s*s)
		}
		want := 0.0
		switch tc.kind {
		case NoiseColoured:
			want = 0.8
		case NoiseFlicker:
			want = -1 // checked by its spectral slope below
		}
		if got := lag1(e); want >= 0 && math.Abs(got-want) > 0.01 {
			t.Errorf("%s: noise lag-1 correlation %.3f, want %.2f", tc.kind, got, want)
		}
		if tc.kind == NoiseFlicker {
			// Flicker noise is the PowerLaw generator rescaled: its lag-1
			// correlation is high and its variance exact (checked above);
			// the spectral exponent is checked in TestPowerLaw*.
			if got := lag1(e); got < 0.5 {
				t.Errorf("flicker noise lag-1 correlation %.3f, want a strongly correlated noise", got)
			}
		}
		if tc.kind == NoiseHeavy {
			m, s := recMeanSD(e)
			var k4 float64
			for _, v := range e {
				d := (v - m) / s
				k4 += d * d * d * d
			}
			if ex := k4/float64(n) - 3; math.Abs(ex-1.5) > 0.3 {
				t.Errorf("heavy noise: excess kurtosis %.2f, want 6/(ν−4) = 1.5", ex)
			}
		}
	}
}

// TestRecordingLowPassAndDecimation: white noise through the first-order
// low-pass becomes an AR(1) with coefficient a = e^{−1/τ} (analytic), and
// decimation by k keeps samples 0, k, 2k, ... .
func TestRecordingLowPassAndDecimation(t *testing.T) {
	x := whiteSeries(200000, 5)
	y, err := Recording{LowPass: 4}.Apply(x, nil)
	if err != nil {
		t.Fatal(err)
	}
	if got, want := lag1(y), math.Exp(-0.25); math.Abs(got-want) > 0.01 {
		t.Errorf("low-passed white noise: lag-1 correlation %.4f, want e^(−1/4) = %.4f", got, want)
	}
	z, err := Recording{Decimate: 3}.Apply(x, nil)
	if err != nil {
		t.Fatal(err)
	}
	full, _ := Recording{}.Apply(x, nil)
	if len(z) != len(x)/3 {
		t.Fatalf("decimated length %d, want %d", len(z), len(x)/3)
	}
	for _, i := range []int{0, 1, 100, len(z) - 1} {
		if z[i] != full[3*i] {
			t.Errorf("decimated sample %d = %g, want sample %d = %g", i, z[i], 3*i, full[3*i])
		}
	}
}

// TestRecordingADC checks the converter: at most Levels distinct values on a
// uniform grid, a signal using a fraction Span of the full scale occupies
// about that fraction of the codes, and with Clip the samples at each rail
// are the clipped fraction (by construction of the full scale from the
// quantiles).
func TestRecordingADC(t *testing.T) {
	x := whiteSeries(100000, 7)
	for _, tc := range []struct {
		r        Recording
		minCodes int
		maxCodes int
	}{
		{Recording{Levels: 16}, 16, 16},
		{Recording{Levels: 256, Span: 0.25, Position: 0.5}, 60, 66},
		{Recording{Levels: 16, Clip: 0.03}, 16, 16},
	} {
		y, err := tc.r.Apply(x, nil)
		if err != nil {
			t.Fatal(err)
		}
		vals := slices.Clone(y)
		slices.Sort(vals)
		vals = slices.Compact(vals)
		if len(vals) < tc.minCodes || len(vals) > tc.maxCodes {
			t.Errorf("%s: %d distinct values, want %d–%d", tc.r, len(vals), tc.minCodes, tc.maxCodes)
		}
		step := math.Inf(1)
		for i := 1; i < len(vals); i++ {
			step = min(step, vals[i]-vals[i-1])
		}
		for i := 2; i < len(vals); i++ {
			if q := (vals[i] - vals[0]) / step; math.Abs(q-math.Round(q)) > 1e-6 {
				t.Fatalf("%s: value %g is off the grid of step %g", tc.r, vals[i], step)
			}
		}
		if tc.r.Clip > 0 {
			lo, hi := 0, 0
			for _, v := range y {
				if v == vals[0] {
					lo++
				}
				if v == vals[len(vals)-1] {
					hi++
				}
			}
			// The rail codes hold the clipped tail plus the samples that
			// round to them: at least Clip, at most Clip plus half a code.
			for _, c := range []int{lo, hi} {
				f := float64(c) / float64(len(y))
				if f < 0.03 || f > 0.03+0.06 {
					t.Errorf("%s: %.3f of the samples on a rail, want ≥ 0.03", tc.r, f)
				}
			}
		}
	}
}

// TestRecordingDrift: a linear drift of size d shifts the mean of the last
// tenth of the record against the first by 0.9·d (analytic for the ramp).
func TestRecordingDrift(t *testing.T) {
	x := whiteSeries(100000, 9)
	base, _ := Recording{}.Apply(x, nil)
	y, err := Recording{Drift: 2}.Apply(x, rand.New(rand.NewPCG(1, 1)))
	if err != nil {
		t.Fatal(err)
	}
	n := len(y)
	var first, last float64
	for i := 0; i < n/10; i++ {
		first += y[i] - base[i]
		last += y[n-1-i] - base[n-1-i]
	}
	if got := math.Abs(last-first) / float64(n/10); math.Abs(got-1.8) > 0.01 {
		t.Errorf("linear drift moved the mean by %.3f, want 0.9·2 = 1.8", got)
	}
	w, err := Recording{Drift: 1, DriftKind: DriftWander}.Apply(x, rand.New(rand.NewPCG(1, 1)))
	if err != nil {
		t.Fatal(err)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := range w {
		d := w[i] - base[i]
		lo, hi = min(lo, d), max(hi, d)
	}
	if math.Abs(hi-lo-1) > 1e-9 {
		t.Errorf("wandering drift spans %.6f, want 1", hi-lo)
	}
}

func TestRecordingObservationsAndDeterminism(t *testing.T) {
	x := whiteSeries(5000, 11)
	for _, r := range []Recording{
		{Observe: ObservePoly, ObserveParam: 0.5}, {Observe: ObserveTanh, ObserveParam: 2},
		{Observe: ObserveExp, ObserveParam: 1}, {Observe: ObserveAbs, ObserveParam: 0.3},
		{Observe: ObserveCubic, ObserveParam: -0.2}, {Observe: ObserveSquare, ObserveParam: 1},
		{Observe: ObserveLog, ObserveParam: 0.5}, {Observe: ObserveSigmoid, ObserveParam: 3},
		{Noise: NoiseHeavy, NoiseParam: 3, SNR: 15, Drift: 0.5, DriftKind: DriftWander, Levels: 64, Clip: 0.01, Gain: 1e-6, Offset: 4e-6},
	} {
		a, err := r.Apply(x, rand.New(rand.NewPCG(2, 3)))
		if err != nil {
			t.Fatalf("%s: %v", r, err)
		}
		b, _ := r.Apply(x, rand.New(rand.NewPCG(2, 3)))
		if !slices.Equal(a, b) {
			t.Errorf("%s: two runs with the same seed differ", r)
		}
		for _, v := range a {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("%s: non-finite output", r)
			}
		}
	}
	// g(z) = z + c·z² at c = 0.5 on the standardised z = ∓1: −0.5 and 1.5.
	y, _ := Recording{Observe: ObservePoly, ObserveParam: 0.5}.Apply([]float64{-2, 2}, nil)
	if y[0] != -0.5 || y[1] != 1.5 {
		t.Errorf("poly observation of ±2 (standardised ∓1): %v, want [−0.5 1.5]", y)
	}
}

func TestRecordingValidate(t *testing.T) {
	for _, r := range []Recording{
		{Observe: "wobble"}, {Observe: ObserveExp, ObserveParam: 5}, {LowPass: -1}, {Decimate: -2},
		{Noise: NoiseColoured, NoiseParam: 1, SNR: 10}, {Noise: NoiseHeavy, NoiseParam: 2, SNR: 10},
		{Noise: NoiseWhite, SNR: math.Inf(1)}, {Drift: -1}, {DriftKind: "zigzag"}, {Levels: 1},
		{Levels: 8, Span: 1.5}, {Clip: 0.5}, {Gain: math.NaN()},
	} {
		if err := r.Validate(); !errors.Is(err, ErrRecording) {
			t.Errorf("%+v: error %v, want ErrRecording", r, err)
		}
	}
	if _, err := (Recording{}).Apply([]float64{1, 1, 1}, nil); !errors.Is(err, ErrConstant) {
		t.Errorf("constant input: %v, want ErrConstant", err)
	}
}
