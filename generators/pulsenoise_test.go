package generators

import (
	"fmt"
	"math"
	"testing"
)

// TestPulseNoiseShapeIntegrals: the closed forms of ∫g and ∫g² behind
// Campbell's moments agree with the trapezoid rule on the pulse shapes
// themselves (step 10^−4 widths; the rectangular length averaged over its
// uniform law in closed form, E[L] = W), and the double exponential
// peaks at 1 (its normalisation g_max, analytic).
func TestPulseNoiseShapeIntegrals(t *testing.T) {
	for _, tc := range []struct{ w, r float64 }{{5, 0.2}, {1, 0.01}, {30, 0.9}} {
		g := PulseNoise{Rate: 1, Width: tc.w, Rise: tc.r}
		s := tc.w * fwhmToSigma
		gmax := math.Pow(tc.r, tc.r/(1-tc.r)) * (1 - tc.r)
		gauss := func(t float64) float64 { return math.Exp(-(t - 6*s) * (t - 6*s) / (2 * s * s)) }
		dexp := func(t float64) float64 { return (math.Exp(-t/tc.w) - math.Exp(-t/(tc.r*tc.w))) / gmax }
		trap := func(f func(float64) float64, hi float64, pow int) float64 {
			const m = 400000
			h := hi / m
			var sum float64
			for i := 0; i <= m; i++ {
				v := math.Pow(f(float64(i)*h), float64(pow))
				if i == 0 || i == m {
					v /= 2
				}
				sum += v
			}
			return sum * h
		}
		var peak float64
		for i := 0; i <= 100000; i++ {
			peak = max(peak, dexp(float64(i)*tc.w*1e-4))
		}
		if math.Abs(peak-1) > 1e-6 {
			t.Errorf("w = %g, r = %g: double-exponential peak %.8f, want 1", tc.w, tc.r, peak)
		}
		i1 := (tc.w + trap(gauss, 12*s, 1) + trap(dexp, 60*tc.w, 1)) / 3
		i2 := (tc.w + trap(gauss, 12*s, 2) + trap(dexp, 60*tc.w, 2)) / 3
		c1, c2 := g.pulseShapeIntegrals()
		if math.Abs(c1-i1) > 1e-6*i1 || math.Abs(c2-i2) > 1e-6*i2 {
			t.Errorf("w = %g, r = %g: closed forms (%.8f, %.8f), trapezoid (%.8f, %.8f)", tc.w, tc.r, c1, c2, i1, i2)
		}
	}
}

// TestPulseNoiseCampbell: the sample mean and variance match Campbell's
// theorem, E[x] = ν E[A] E[∫g], Var x = ν E[A²] E[∫g²] + σ_b² (analytic),
// for sparse and overlapping pulses, both amplitude laws and a
// background, within four standard errors of 24 replicates of 20000
// samples (checkReplicates). The record is stationary from its first
// sample: the mean of x_0 over 400 replicates matches too.
func TestPulseNoiseCampbell(t *testing.T) {
	for _, g := range []PulseNoise{
		{Rate: 0.05, Width: 5, Rise: 0.2, AmpSD: 0.5},
		{Rate: 0.002, Width: 20, Rise: 0.1, Amp: PulseAmpLogNormal, AmpSD: 1},
		{Rate: 2, Width: 8, Rise: 0.5, Amp: PulseAmpLogNormal, AmpSD: 0.3, Background: 0.3},
		{Rate: 0.3, Width: 0.5, Rise: 0.05},
	} {
		mean, variance := g.Moments()
		est := [][]float64{nil, nil}
		for rep := uint64(0); rep < 24; rep++ {
			x, err := g.Generate(20000, newRand(100+rep))
			if err != nil {
				t.Fatal(err)
			}
			m := meanOf(x, func(v float64) float64 { return v })
			est[0] = append(est[0], m)
			est[1] = append(est[1], meanOf(x, func(v float64) float64 { return (v - m) * (v - m) }))
		}
		checkReplicates(t, fmt.Sprintf("%+v", g), []string{"mean", "variance"}, []float64{mean, variance}, est)
		var first []float64
		for rep := uint64(0); rep < 400; rep++ {
			x, err := g.Generate(1, newRand(1000+rep))
			if err != nil {
				t.Fatal(err)
			}
			first = append(first, x[0])
		}
		checkReplicates(t, fmt.Sprintf("%+v", g), []string{"first sample"}, []float64{mean}, [][]float64{first})
	}
}

// TestPulseNoiseRegistry: the registry's invariants are Campbell's moments
// at the defaults, and the build rejects out-of-range combinations.
func TestPulseNoiseRegistry(t *testing.T) {
	s, err := Lookup("pulse-noise")
	if err != nil {
		t.Fatal(err)
	}
	g := pulseNoiseFrom(s.Defaults())
	mean, variance := g.Moments()
	for _, iv := range s.Invariants {
		want := map[string]float64{"mean": mean, "variance": variance}[iv.Name]
		if iv.Value != want {
			t.Errorf("invariant %s = %g, Campbell at the defaults %g", iv.Name, iv.Value, want)
		}
	}
	for _, set := range []map[string]float64{{"rate": 100, "width": 100}, {"rise": 0.95}} {
		if _, err := s.Generate(100, set, newRand(1)); err == nil {
			t.Errorf("%v: no error", set)
		}
	}
}
