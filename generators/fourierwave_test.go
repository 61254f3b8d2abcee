package generators

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// TestFourierWavePeriodic: with a whole period the wave repeats bit for
// bit (the phase comes from t mod P), for every decay and up to 30
// harmonics.
func TestFourierWavePeriodic(t *testing.T) {
	for _, tc := range []FourierWave{
		{Period: 50, Harmonics: 30, Decay: 0.5},
		{Period: 64, Harmonics: 7, Decay: 3},
		{Period: 7, Harmonics: 30, Decay: 1}, // harmonics 4..30 above Nyquist, left out
	} {
		x, err := tc.Generate(1000, newRand(2))
		if err != nil {
			t.Fatal(err)
		}
		checkPeriodic(t, fmt.Sprintf("%+v", tc), x, int(tc.Period))
	}
}

// TestFourierWaveHarmonics: the line at h/P has amplitude h^(−p)·c_h with
// c_h in [0.5, 1.5) for every harmonic h ≤ H below Nyquist, and nothing
// else carries power: by Parseval the variance equals Σ a_h²/2 over those
// lines (analytic). With P = 9.5 the harmonics h ≥ 5 lie above Nyquist;
// had they been kept, their aliases would fall half-way between the
// harmonics (at (9.5 − h)/9.5) and break the Parseval sum. N = 1900 holds
// 200 whole periods, so the DFT projections are exact.
func TestFourierWaveHarmonics(t *testing.T) {
	const n = 1900
	for _, tc := range []struct {
		w    FourierWave
		kept int
	}{
		{FourierWave{Period: 9.5, Harmonics: 12, Decay: 1}, 4},
		{FourierWave{Period: 95, Harmonics: 30, Decay: 2}, 30},
		{FourierWave{Period: 95, Harmonics: 1, Decay: 0.5}, 1},
	} {
		x, err := tc.w.Generate(n, newRand(8))
		if err != nil {
			t.Fatal(err)
		}
		var power float64
		for h := 1; h <= tc.kept; h++ {
			a := lineAmplitude(x, float64(h)/tc.w.Period)
			c := a * math.Pow(float64(h), tc.w.Decay)
			if !(c >= 0.5-1e-9 && c < 1.5+1e-9) {
				t.Errorf("%+v: harmonic %d amplitude %.6g = %.4f·h^-p, want factor in [0.5, 1.5)", tc.w, h, a, c)
			}
			power += a * a / 2
		}
		if v := variance(x); math.Abs(v-power) > 1e-9*v {
			t.Errorf("%+v: variance %.12g, power in the %d harmonics %.12g: power elsewhere", tc.w, v, tc.kept, power)
		}
	}
}

func TestFourierWaveErrors(t *testing.T) {
	for _, w := range []FourierWave{
		{Period: 2, Harmonics: 3, Decay: 1},
		{Period: 10, Harmonics: 0, Decay: 1},
		{Period: 10, Harmonics: 3, Decay: math.NaN()},
	} {
		if _, err := w.Generate(10, newRand(1)); !errors.Is(err, ErrParamRange) {
			t.Errorf("%+v: %v, want ErrParamRange", w, err)
		}
	}
}
