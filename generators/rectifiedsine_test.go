package generators

import (
	"math"
	"testing"
)

// TestRectifiedSineFourier: the full-wave rectified sine |sin(πt/P)| has
// mean 2/π and harmonics of amplitude 4/(π(4h² − 1)) at h/P; the
// half-wave max(0, sin(2πt/P)) has mean 1/π, fundamental ½ and even
// harmonics 2/(π(h² − 1)), odd ones above the first vanishing (analytic
// Fourier series). With P = 1000 samples per period the harmonics mP ± h
// alias onto line h; the tolerance is their summed amplitude (aliasBound,
// 1e−6 to 2e−6).
func TestRectifiedSineFourier(t *testing.T) {
	const period = 1000
	for _, half := range []bool{false, true} {
		x, err := RectifiedSine{Period: period, Half: half}.Generate(4*period, newRand(6))
		if err != nil {
			t.Fatal(err)
		}
		checkPeriodic(t, "rectified sine", x, period)
		coef := func(k int) float64 { // analytic line amplitudes (k = 0: mean)
			kf := float64(k)
			if !half {
				if k == 0 {
					return 2 / math.Pi
				}
				return 4 / (math.Pi * (4*kf*kf - 1))
			}
			switch {
			case k == 0:
				return 1 / math.Pi
			case k == 1:
				return 0.5
			case k%2 == 0:
				return 2 / (math.Pi * (kf*kf - 1))
			}
			return 0
		}
		var mean float64
		for _, v := range x {
			mean += v
		}
		mean /= float64(len(x))
		if math.Abs(mean-coef(0)) > aliasBound(coef, 0, period) {
			t.Errorf("half = %v: mean %.8f, want %.8f", half, mean, coef(0))
		}
		for h := 1; h <= 6; h++ {
			got, want := lineAmplitude(x, float64(h)/period), coef(h)
			if math.Abs(got-want) > aliasBound(coef, h, period) {
				t.Errorf("half = %v, harmonic %d: amplitude %.8f, want %.8f ± %.2g", half, h, got, want, aliasBound(coef, h, period))
			}
		}
	}
}
