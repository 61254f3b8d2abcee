package generators

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// besselIntegral returns J_n(x) from Bessel's integral
// J_n(x) = (1/π)∫_0^π cos(nτ − x sin τ) dτ (analytic), by the trapezoid
// rule on 256 intervals, which converges geometrically for this smooth
// periodic integrand (exact to rounding for n + x ≲ 100).
func besselIntegral(n int, x float64) float64 {
	const m = 256
	var s float64
	for i := 0; i <= m; i++ {
		tau := math.Pi * float64(i) / m
		w := 1.0
		if i == 0 || i == m {
			w = 0.5
		}
		s += w * math.Cos(float64(n)*tau-x*math.Sin(tau))
	}
	return s / m
}

// TestFMBesselSidebands: the line at f_c + n·f_m of the FM signal has
// amplitude |J_n(β)| (Jacobi–Anger expansion, analytic), checked against
// math.Jn for n = −12..12. P = 8 and P_m = 160 divide N = 3200, so every
// line completes whole cycles and the plain DFT projection is exact; the
// negative-frequency images of the sidebands fold onto f_c + n·f_m only
// for n + n' = −40, where J_n(8) < 1e-9. At β = 2.404825557695773, the
// first zero of J_0 (the carrier vanishes), math.Jn is unusable: it
// normalises its backward recurrence by J_0(x) alone and returns +Inf or
// wrong values there (Go 1.26), so the reference is Bessel's integral,
// itself checked against math.Jn at the other β.
func TestFMBesselSidebands(t *testing.T) {
	const n = 3200
	for _, beta := range []float64{0.5, 2.404825557695773, 5, 8} {
		t.Run(fmt.Sprintf("beta=%g", beta), func(t *testing.T) {
			x, err := FM{Period: 8, ModPeriod: 160, Index: beta}.Generate(n, newRand(9))
			if err != nil {
				t.Fatal(err)
			}
			carrierNull := math.Abs(math.J0(beta)) < 1e-12
			for k := -12; k <= 12; k++ {
				f := 1.0/8 + float64(k)/160
				got := lineAmplitude(x, f)
				want := math.Abs(besselIntegral(k, beta)) // Bessel's integral, analytic
				if !carrierNull {
					jn := math.Abs(math.Jn(k, beta)) // Go standard library
					if math.Abs(jn-want) > 1e-12 {
						t.Errorf("reference: |J_%d(%g)| = %.14f by Bessel's integral, %.14f by math.Jn", k, beta, want, jn)
					}
					want = jn
				}
				if math.Abs(got-want) > 1e-9 {
					t.Errorf("sideband n = %d: amplitude %.10f, want |J_%d(%g)| = %.10f", k, got, k, beta, want)
				}
			}
			// Nothing between the sidebands: half-way frequencies are empty.
			if a := lineAmplitude(x, 1.0/8+0.5/160); a > 1e-9 {
				t.Errorf("amplitude %.3g half-way between sidebands, want 0", a)
			}
		})
	}
}

// TestAMSidebands: (1 + m cos ω_m t)·cos ω_c t has the carrier at
// amplitude 1 and two sidebands at f_c ± f_m of amplitude m/2 each
// (product-to-sum, analytic). Whole cycles in N = 3000 make the DFT
// projection exact.
func TestAMSidebands(t *testing.T) {
	const n = 3000
	for _, m := range []float64{0, 0.3, 1} {
		x, err := AM{Period: 10, ModPeriod: 150, Depth: m}.Generate(n, newRand(4))
		if err != nil {
			t.Fatal(err)
		}
		carrier := lineAmplitude(x, 0.1)
		lower, upper := lineAmplitude(x, 0.1-1.0/150), lineAmplitude(x, 0.1+1.0/150)
		if math.Abs(carrier-1) > 1e-9 || math.Abs(lower/carrier-m/2) > 1e-9 || math.Abs(upper/carrier-m/2) > 1e-9 {
			t.Errorf("m = %g: carrier %.10f, sideband ratios %.10f and %.10f, want 1 and %g", m, carrier, lower/carrier, upper/carrier, m/2)
		}
	}
}

func TestModulationErrors(t *testing.T) {
	tests := []struct {
		name string
		g    Generator
	}{
		{"FM beyond Carson", FM{Period: 3, ModPeriod: 10, Index: 3}},
		{"FM negative index", FM{Period: 10, ModPeriod: 100, Index: -1}},
		{"FM short period", FM{Period: 1.5, ModPeriod: 100, Index: 1}},
		{"AM depth > 1", AM{Period: 10, ModPeriod: 100, Depth: 1.5}},
		{"AM sideband above Nyquist", AM{Period: 2.2, ModPeriod: 10, Depth: 0.5}},
	}
	for _, tc := range tests {
		if _, err := tc.g.Generate(10, newRand(1)); !errors.Is(err, ErrParamRange) {
			t.Errorf("%s: %v, want ErrParamRange", tc.name, err)
		}
	}
}
