package generators

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// halfWidth returns the full width at half maximum, in samples, of the
// single pulse in one period x (circular), by linear interpolation of the
// two half-height crossings around the largest sample, measured above
// the smallest sample.
func halfWidth(x []float64) (width, left, right float64) {
	n := len(x)
	top, lo := 0, x[0]
	for i, v := range x {
		if v > x[top] {
			top = i
		}
		lo = math.Min(lo, v)
	}
	half := lo + (x[top]-lo)/2
	at := func(i int) float64 { return x[((i%n)+n)%n] }
	i := top
	for at(i-1) > half {
		i--
	}
	left = float64(top-i) + (at(i)-half)/(at(i)-at(i-1))
	j := top
	for at(j+1) > half {
		j++
	}
	right = float64(j-top) + (at(j)-half)/(at(j)-at(j+1))
	return left + right, left, right
}

// TestPulseTrainShapes: the pulses have the documented widths and shapes
// (analytic):
//   - Gaussian: FWHM = duty·P, within 0.01 sample (σ ≈ 170 samples, so
//     neither linear interpolation of the crossings nor the largest sample
//     standing in for the peak errs by more than 1e-3 sample);
//   - exponential: within a period successive samples fall by exactly
//     r = e^{−ln 2/(duty·P)} (decay time duty·P/ln 2, half-width duty·P),
//     and across the onset the train jumps by r^{−(P−1)}, the factor
//     that makes the summed tails of all earlier pulses one exponential;
//   - asymmetric: FWHM = duty·P within 0.05 sample, the rise taking 10 %
//     to 40 % of it.
func TestPulseTrainShapes(t *testing.T) {
	const period, duty = 20000, 0.02
	want := duty * period
	one := func(shape int, seed uint64) []float64 {
		x, err := PulseTrain{Period: period, Duty: duty, Shape: shape}.Generate(period, newRand(seed))
		if err != nil {
			t.Fatal(err)
		}
		return x
	}
	for seed := uint64(1); seed <= 3; seed++ {
		if w, _, _ := halfWidth(one(PulseGaussian, seed)); math.Abs(w-want) > 0.01 {
			t.Errorf("Gaussian seed %d: FWHM %.4f samples, want %g", seed, w, want)
		}
		w, l, _ := halfWidth(one(PulseAsymmetric, seed))
		if math.Abs(w-want) > 0.05 || !(l > 0.1*want-1 && l < 0.4*want+1) {
			t.Errorf("asymmetric seed %d: FWHM %.4f samples (want %g), rise half-width %.2f (want %g to %g)", seed, w, want, l, 0.1*want, 0.4*want)
		}
		x := one(PulseExponential, seed)
		r := math.Exp(-math.Ln2 / want)
		onset := 0
		for i := range x {
			if x[i] > x[onset] {
				onset = i
			}
		}
		for k := 1; k < period; k++ {
			i, j := (onset+k-1)%period, (onset+k)%period
			if got := x[j] / x[i]; math.Abs(got-r) > 1e-12 {
				t.Fatalf("exponential seed %d: x[%d]/x[%d] = %.15f, want e^(-ln2/%g) = %.15f", seed, j, i, got, want, r)
			}
		}
		jump := x[onset] / x[(onset+period-1)%period]
		if wantJump := math.Pow(r, -(period - 1)); math.Abs(jump/wantJump-1) > 1e-9 {
			t.Errorf("exponential seed %d: jump at the onset %.12g, want r^-(P-1) = %.12g", seed, jump, wantJump)
		}
	}
}

// TestPulseTrainPeriodic: with a whole period every shape repeats bit for
// bit, and the Gaussian train has exactly one local maximum per period
// while the composite (ECG-like) train has extra bumps.
func TestPulseTrainPeriodic(t *testing.T) {
	const period = 40
	for shape := 0; shape < pulseShapes; shape++ {
		x, err := PulseTrain{Period: period, Duty: 0.1, Shape: shape}.Generate(400, newRand(uint64(shape)+11))
		if err != nil {
			t.Fatal(err)
		}
		checkPeriodic(t, fmt.Sprintf("shape %d", shape), x, period)
		extrema := 0
		for i := period; i < 2*period; i++ {
			if (x[i] > x[i-1]) != (x[i+1] > x[i]) {
				extrema++
			}
		}
		switch shape {
		case PulseGaussian:
			if extrema != 2 { // one maximum, one minimum
				t.Errorf("Gaussian train: %d local extrema per period, want 2", extrema)
			}
		case PulseComposite:
			if extrema < 4 {
				t.Errorf("composite train: %d local extrema per period, want ≥ 4", extrema)
			}
		}
	}
}

func TestPulseTrainErrors(t *testing.T) {
	for _, s := range []PulseTrain{
		{Period: 40, Duty: 0.01},            // 0.4-sample pulses
		{Period: 40, Duty: 0.6},             // wider than half the period
		{Period: 40, Duty: 0.1, Shape: 4},   // unknown shape
		{Period: 1.5, Duty: 0.5},            // period below 2
		{Period: math.Inf(1), Duty: 0.1},    // infinite period
		{Period: 40, Duty: 0.1, Shape: -1},  // negative shape
		{Period: 40, Duty: math.NaN()},      // NaN duty
		{Period: 40, Duty: 0, Shape: 1},     // zero duty
		{Period: 40, Duty: -0.1, Shape: 2},  // negative duty
		{Period: 40, Duty: 0.025, Shape: 0}, // exactly one sample wide is accepted
	} {
		_, err := s.Generate(10, newRand(1))
		if s.Duty*s.Period == 1 {
			if err != nil {
				t.Errorf("%+v: %v, want accepted", s, err)
			}
			continue
		}
		if !errors.Is(err, ErrParamRange) {
			t.Errorf("%+v: %v, want ErrParamRange", s, err)
		}
	}
}
