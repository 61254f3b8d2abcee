package generators

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// torusLines returns the frequencies and amplitudes of the lines of
// Torus s (analytic): with u = Σ a_i cos φ_i / A, A = Σ|a_i|, the
// linear term puts a_i/A at f_i, and Mix·u² puts Mix·a_i²/(2A²) at 2f_i
// (cos² = ½ + ½ cos 2φ) and Mix·a_i·a_j/A² at f_i + f_j and |f_i − f_j|
// (product-to-sum).
func torusLines(s Torus) (freqs, amps []float64) {
	f := []float64{1 / s.Period}
	a := []float64{1}
	for i, r := range s.Ratios {
		f = append(f, r/s.Period)
		a = append(a, s.Amps[i])
	}
	var norm float64
	for _, v := range a {
		norm += math.Abs(v)
	}
	for i := range f {
		freqs = append(freqs, f[i])
		amps = append(amps, a[i]/norm)
	}
	if s.Mix == 0 {
		return freqs, amps
	}
	for i := range f {
		freqs = append(freqs, 2*f[i])
		amps = append(amps, s.Mix*a[i]*a[i]/(2*norm*norm))
		for j := i + 1; j < len(f); j++ {
			c := s.Mix * a[i] * a[j] / (norm * norm)
			freqs = append(freqs, f[i]+f[j], math.Abs(f[i]-f[j]))
			amps = append(amps, c, c)
		}
	}
	return freqs, amps
}

// TestTorusSpectrum: the periodogram of a k-torus has lines exactly at the
// integer combinations the observable carries — f_i, and with mixing 2f_i
// and |f_i ± f_j| — and nowhere else: every periodogram peak lies within
// one bin of a predicted line and every predicted line has a peak within
// one bin (analytic: a trigonometric polynomial of the phases has a pure
// line spectrum). The line amplitudes, measured at the exact frequencies
// through a Blackman–Harris window, match the product-to-sum expansion to
// 1e-3 of the largest line.
func TestTorusSpectrum(t *testing.T) {
	const n = 16384
	tests := []Torus{
		{Period: 50, Ratios: []float64{math.Sqrt2}, Amps: []float64{0.7}},
		{Period: 50, Ratios: []float64{math.Sqrt2, math.Sqrt(3)}, Amps: []float64{0.8, 0.6}, Mix: 0.3},
		// √10, √11, √14, √21: rationally independent with 1 and chosen so
		// that all 30 lines are at least 60 bins apart.
		{Period: 37.7, Ratios: []float64{math.Sqrt(10), math.Sqrt(11), math.Sqrt(14), math.Sqrt(21)}, Amps: []float64{0.8, 0.6, 0.5, 0.4}, Mix: 1},
	}
	for _, s := range tests {
		name := fmt.Sprintf("k=%d mix=%g", len(s.Ratios)+1, s.Mix)
		t.Run(name, func(t *testing.T) {
			x, err := s.Generate(n, newRand(3))
			if err != nil {
				t.Fatal(err)
			}
			freqs, amps := torusLines(s)
			// Precondition: the predicted lines are resolved (≥ 10 bins
			// apart), so "within one bin" identifies one line.
			for i := range freqs {
				for j := i + 1; j < len(freqs); j++ {
					if math.Abs(freqs[i]-freqs[j]) < 10.0/n {
						t.Fatalf("lines %g and %g closer than 10 bins; choose other ratios", freqs[i], freqs[j])
					}
				}
			}
			peaks := spectralPeaks(x, 1e-7, 5)
			for _, p := range peaks {
				if d := nearest(p, freqs); d > 1.0/n {
					t.Errorf("periodogram peak at %g cycles/sample is %.2f bins from every predicted line", p, d*n)
				}
			}
			for _, f := range freqs {
				if d := nearest(f, peaks); d > 1.0/n {
					t.Errorf("predicted line at %g has no periodogram peak within one bin (nearest %.2f bins)", f, d*n)
				}
			}
			var top float64
			for _, a := range amps {
				top = math.Max(top, a)
			}
			for i, f := range freqs {
				got := windowedAmplitude(x, f)
				if math.Abs(got-amps[i]) > 1e-3*top {
					t.Errorf("line %g: amplitude %.5f, want %.5f", f, got, amps[i])
				}
			}
			t.Logf("%d lines predicted, %d peaks found", len(freqs), len(peaks))
		})
	}
}

// TestTorusNoReturn: with rationally independent frequencies the orbit on
// the torus never closes, so no lag L returns the series onto itself: the
// RMS difference between x and x shifted by L, relative to the standard
// deviation, stays far above rounding (> 1e-3) for every L up to n/2. The
// control with rational ratios 3/2 and 5/4 (common period 4·50 = 200
// samples) returns to rounding precision at L = 200, so the test does see
// a return when there is one.
func TestTorusNoReturn(t *testing.T) {
	const n = 4000
	minReturn := func(s Torus) (float64, int) {
		x, err := s.Generate(n, newRand(5))
		if err != nil {
			t.Fatal(err)
		}
		sd := math.Sqrt(variance(x))
		best, at := math.Inf(1), 0
		for lag := 1; lag <= n/2; lag++ {
			var ss float64
			for i := lag; i < n; i++ {
				d := x[i] - x[i-lag]
				ss += d * d
			}
			if r := math.Sqrt(ss/float64(n-lag)) / sd; r < best {
				best, at = r, lag
			}
		}
		return best, at
	}
	irr, at := minReturn(Torus{Period: 50, Ratios: []float64{math.Sqrt2, math.Sqrt(5)}, Amps: []float64{0.8, 0.6}, Mix: 0.3})
	t.Logf("irrational ratios: closest return %.4g at lag %d", irr, at)
	if !(irr > 1e-3) {
		t.Errorf("quasi-periodic torus returns to %.3g at lag %d, want no return", irr, at)
	}
	rat, at := minReturn(Torus{Period: 50, Ratios: []float64{1.5, 1.25}, Amps: []float64{0.8, 0.6}, Mix: 0.3})
	t.Logf("rational ratios: closest return %.4g at lag %d", rat, at)
	if rat > 1e-9 || at%200 != 0 {
		t.Errorf("resonant torus: closest return %.3g at lag %d, want < 1e-9 at a multiple of 200", rat, at)
	}
}

func TestTorusErrors(t *testing.T) {
	tests := []struct {
		name string
		s    Torus
	}{
		{"no ratio", Torus{Period: 50}},
		{"amps mismatch", Torus{Period: 50, Ratios: []float64{1.5}, Amps: []float64{1, 2}}},
		{"six frequencies", Torus{Period: 50, Ratios: []float64{1, 2, 3, 4, 5}, Amps: []float64{1, 1, 1, 1, 1}}},
		{"tone above Nyquist", Torus{Period: 4, Ratios: []float64{2.5}, Amps: []float64{1}}},
		{"harmonic above Nyquist", Torus{Period: 8, Ratios: []float64{2.5}, Amps: []float64{1}, Mix: 0.1}},
		{"zero ratio", Torus{Period: 50, Ratios: []float64{0}, Amps: []float64{1}}},
	}
	for _, tc := range tests {
		if _, err := tc.s.Generate(10, newRand(1)); !errors.Is(err, ErrParamRange) {
			t.Errorf("%s: %v, want ErrParamRange", tc.name, err)
		}
	}
	s, _ := Lookup("torus")
	for k := 2; k <= torusMaxDim; k++ {
		x, err := s.Generate(100, map[string]float64{"k": float64(k)}, newRand(1))
		if err != nil || len(x) != 100 {
			t.Errorf("k = %d: %v", k, err)
		}
	}
	if _, err := s.Generate(10, map[string]float64{"period": 3}, newRand(1)); !errors.Is(err, ErrParamRange) {
		t.Errorf("period 3 with ratio √3 and mixing: %v, want ErrParamRange", err)
	}
}
