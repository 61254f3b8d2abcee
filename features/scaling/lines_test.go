package scaling

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

func gen(t *testing.T, system string, n int, params map[string]float64, seed uint64) []float64 {
	t.Helper()
	sys, err := generators.Lookup(system)
	if err != nil {
		t.Fatal(err)
	}
	x, err := sys.Generate(n, params, rand.New(rand.NewPCG(seed, 3)))
	if err != nil {
		t.Fatal(err)
	}
	return x
}

// TestLinesNoise: noise of any colour has a continuous spectrum, so no bin
// may pass the threshold (the false-line probability per bin is below
// 10⁻⁹, see Lines): the fraction is 0 for white noise and for power-law
// noises up to β = 3, whose steep floors the log–log interpolation follows.
func TestLinesNoise(t *testing.T) {
	for _, tc := range []struct {
		system string
		params map[string]float64
	}{
		{"white", nil}, {"powerlaw", map[string]float64{"beta": 1}}, {"powerlaw", map[string]float64{"beta": 2}},
		{"powerlaw", map[string]float64{"beta": 3}}, {"ar1", map[string]float64{"phi": 0.95}}, {"brownian", nil},
	} {
		for _, n := range []int{600, 2000, 20000} {
			for seed := uint64(1); seed <= 3; seed++ {
				r, err := Lines(gen(t, tc.system, n, tc.params, seed), LinesOptions{})
				if err != nil {
					t.Fatal(err)
				}
				if r.Fraction > 0.02 {
					t.Errorf("%s %v n=%d seed %d: line fraction %.3f (%d lines), want ≈ 0", tc.system, tc.params, n, seed, r.Fraction, r.Lines)
				}
			}
		}
	}
}

// TestLinesPeriodicWithNoise: a sum of sines plus white noise at SNR s dB
// carries the fraction 1/(1 + 10^(−s/10)) of its variance in lines
// (definition of the SNR), less the noise power in the few line bins.
func TestLinesPeriodicWithNoise(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, n := range []int{2000, 20000} {
		for _, snr := range []float64{10, 20, 40} {
			x := make([]float64, n)
			p1, p2 := 2*math.Pi*rng.Float64(), 2*math.Pi*rng.Float64()
			var s float64
			for i := range x {
				x[i] = math.Sin(2*math.Pi*float64(i)/23.7+p1) + 0.6*math.Sin(2*math.Pi*float64(i)/7.31+p2)
				s += x[i] * x[i]
			}
			s /= float64(n)
			sd := math.Sqrt(s * math.Pow(10, -snr/10))
			for i := range x {
				x[i] += sd * rng.NormFloat64()
			}
			r, err := Lines(x, LinesOptions{})
			if err != nil {
				t.Fatal(err)
			}
			want := 1 / (1 + math.Pow(10, -snr/10))
			if math.Abs(r.Fraction-want) > 0.02 {
				t.Errorf("n=%d SNR %g dB: line fraction %.4f, want %.4f", n, snr, r.Fraction, want)
			}
		}
	}
}

// TestLinesChaosIsContinuous: the logistic map at r = 4 and the Lorenz flow
// have continuous spectra (mixing systems; the logistic map at r = 4 is
// even spectrally white, being conjugate to the tent map): little or no
// variance in lines.
func TestLinesChaosIsContinuous(t *testing.T) {
	for _, tc := range []struct {
		system string
		max    float64
	}{{"logistic", 0.02}, {"henon", 0.05}, {"lorenz", 0.15}} {
		r, err := Lines(gen(t, tc.system, 20000, nil, 2), LinesOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if r.Fraction > tc.max {
			t.Errorf("%s: line fraction %.3f, want ≤ %.2f", tc.system, r.Fraction, tc.max)
		}
	}
}
