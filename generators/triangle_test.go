package generators

import (
	"math"
	"testing"
)

// TestTriangleFourier: the symmetric triangle wave between 0 and 1 has
// mean ½ and only odd harmonics, of amplitude 4/(π²h²) (analytic Fourier
// series). Sampled with P = 1000 samples per period the harmonics
// mP ± h alias onto line h; the tolerance is their summed amplitude
// (aliasBound, about 1.3e−6).
func TestTriangleFourier(t *testing.T) {
	const period = 1000
	x, err := Triangle{Period: period, Rise: 0.5}.Generate(4*period, newRand(3))
	if err != nil {
		t.Fatal(err)
	}
	checkPeriodic(t, "triangle", x, period)
	var mean float64
	for _, v := range x {
		mean += v
	}
	mean /= float64(len(x))
	coef := func(k int) float64 { // analytic line amplitudes
		if k%2 == 0 {
			return 0
		}
		return 4 / (math.Pi * math.Pi * float64(k) * float64(k))
	}
	if math.Abs(mean-0.5) > aliasBound(coef, 0, period) {
		t.Errorf("mean %.8f, want 0.5", mean)
	}
	for h := 1; h <= 6; h++ {
		want := coef(h)
		if got := lineAmplitude(x, float64(h)/period); math.Abs(got-want) > aliasBound(coef, h, period) {
			t.Errorf("harmonic %d: amplitude %.8f, want %.8f", h, got, want)
		}
	}
}

// TestTriangleRise: the wave rises during a fraction rise of each period
// and falls during the rest, spanning [0, 1].
func TestTriangleRise(t *testing.T) {
	for _, r := range []float64{0.1, 0.5, 0.8} {
		const period = 200
		x, err := Triangle{Period: period, Rise: r}.Generate(period+1, newRand(4))
		if err != nil {
			t.Fatal(err)
		}
		up, lo, hi := 0, 1.0, 0.0
		for i := 1; i <= period; i++ {
			if x[i] > x[i-1] {
				up++
			}
			lo, hi = math.Min(lo, x[i]), math.Max(hi, x[i])
		}
		// The turning points fall between samples: up to one sample of
		// each kind may be counted on the other side.
		if math.Abs(float64(up)-r*period) > 1 || lo < 0 || hi > 1 || hi-lo < 0.99 {
			t.Errorf("rise %g: %d rising steps of %d (want %g), range [%g, %g]", r, up, period, r*period, lo, hi)
		}
	}
	if _, err := (Triangle{Period: 10, Rise: 1}).Generate(10, newRand(1)); err == nil {
		t.Error("rise = 1 accepted")
	}
}
