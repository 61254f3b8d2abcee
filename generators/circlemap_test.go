package generators

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// TestCircleMapRotationNumber checks the rotation number against analytic
// values:
//   - K = 0 is the rigid rotation θ' = θ + Ω, so ρ = Ω to rounding;
//   - inside the 0/1 tongue |Ω| ≤ K/2π the map has the fixed points
//     sin(2πθ*) = 2πΩ/K, one of them stable for K < 1, so ρ = 0; just
//     outside it there is no fixed point and ρ > 0 (analytic);
//   - at Ω = ½ the map commutes with θ ↦ θ + ½, the orbit {0, ½} is a
//     2-cycle and for 0 < K < 1 ρ = ½ (analytic, symmetry);
//   - at K = 1, Ω = 0.606661063470 the rotation number is the golden mean
//     (√5 − 1)/2 (Shenker, Physica D 5 (1982) 405 (memory); Ω ≈ 0.60665 at K = 1 confirmed: cmp.caltech.edu/~mcc/Chaos_Course/Lesson19/Demo3.html), within 2e−6:
//     for a circle homeomorphism (K ≤ 1) the lift's mean advance over N
//     iterations is within 1/N of ρ (analytic), N = 10^6 here.
func TestCircleMapRotationNumber(t *testing.T) {
	golden := (math.Sqrt(5) - 1) / 2
	tests := []struct {
		omega, k float64
		want     float64
		tol      float64
	}{
		{0.1, 0, 0.1, 1e-12},
		{1.0 / 3, 0, 1.0 / 3, 1e-12},
		{golden, 0, golden, 1e-12},
		{math.Sqrt2 - 1, 0, math.Sqrt2 - 1, 1e-12},
		{0.1, 0.9, 0, 1e-12},                 // 0.1 ≤ 0.9/2π = 0.143
		{0.15, 0.99, 0, 1e-12},               // 0.15 ≤ 0.158
		{-0.05, 0.5, 0, 1e-12},               // |−0.05| ≤ 0.0796
		{0.5, 0.7, 0.5, 1e-12},               // the 1/2 tongue's centre
		{circleGoldenOmega, 1, golden, 2e-6}, // Shenker (1982) (memory)
	}
	for _, tc := range tests {
		m := CircleMap{Omega: tc.omega, K: tc.k}
		got := m.RotationNumber(0.1, 10000, 1000000)
		t.Logf("Ω = %g, K = %g: ρ = %.12f (want %.12f)", tc.omega, tc.k, got, tc.want)
		if math.Abs(got-tc.want) > tc.tol {
			t.Errorf("Ω = %g, K = %g: ρ = %.12f, want %.12f", tc.omega, tc.k, got, tc.want)
		}
	}
	// Just outside the 0/1 tongue the fixed points are gone: ρ > 0.
	if got := (CircleMap{Omega: 0.1, K: 0.6}).RotationNumber(0.1, 10000, 100000); !(got > 1e-3) {
		t.Errorf("Ω = 0.1, K = 0.6 (outside the tongue 0.6/2π = 0.0955): ρ = %g, want > 0", got)
	}
}

// TestCircleMapLabels: for K < 1 the map is a diffeomorphism of the circle
// and its Lyapunov exponent is ≤ 0 (zero on irrational rotation numbers,
// negative on the tongues), so the label is regular over a grid of the
// whole Ω range; above K = 1 chaotic orbits exist (Jensen, Bak & Bohr,
// Phys. Rev. A 30 (1984) 1960), e.g. at K = 2, Ω = 0.48, where the rule
// computes λ ≈ 0.40 per iteration.
func TestCircleMapLabels(t *testing.T) {
	s, err := Lookup("circle-map")
	if err != nil {
		t.Fatal(err)
	}
	worst := math.Inf(-1)
	for _, k := range []float64{0.2, 0.6, 0.95} {
		for om := 0.18; om <= 0.84; om += 0.06 {
			set := map[string]float64{"omega": om, "k": k}
			sp, err := s.Lyapunov(set)
			if err != nil {
				t.Fatal(err)
			}
			worst = math.Max(worst, sp.Exponents[0])
			if k < 0.9 {
				continue // the class API is exercised at the largest K
			}
			if c, err := s.Class(set); err != nil || c != Regular {
				t.Errorf("Ω = %.2f, K = %g: class %s (%v), λ = %.4f, want regular", om, k, c, err, sp.Exponents[0])
			}
		}
	}
	t.Logf("largest λ for K < 1: %.2g", worst)
	if worst > 1e-3 {
		t.Errorf("largest λ for K < 1 is %.3g, want ≤ 0 up to the O(1/N) bias", worst)
	}
	set := map[string]float64{"omega": 0.48, "k": 2}
	sp, _ := s.Lyapunov(set)
	if c, err := s.Class(set); err != nil || c != Chaotic || !(sp.Exponents[0] > 0.2) {
		t.Errorf("Ω = 0.48, K = 2: class %s (%v), λ = %.4f, want chaotic", c, err, sp.Exponents[0])
	}
}

// TestCircleMapConstant: inside the 0/1 tongue the orbit settles on the
// stable fixed point and Generate reports ErrConstant for either
// observable; on a quasi-periodic orbit sin(2πθ) fills [−1, 1].
func TestCircleMapConstant(t *testing.T) {
	for obs := 0; obs < 2; obs++ {
		_, err := CircleMap{Omega: 0.1, K: 0.9, Obs: obs}.Generate(500, newRand(1))
		if !errors.Is(err, ErrConstant) {
			t.Errorf("obs %d inside the 0/1 tongue: %v, want ErrConstant", obs, err)
		}
	}
	x, err := CircleMap{Omega: math.Sqrt2 - 1, K: 0}.Generate(5000, newRand(1))
	if err != nil {
		t.Fatal(err)
	}
	lo, hi := 1.0, -1.0
	for _, v := range x {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	if lo > -0.999 || hi < 0.999 {
		t.Errorf("rigid irrational rotation fills [%g, %g], want [−1, 1]", lo, hi)
	}
	if _, err := (CircleMap{Omega: 0.3, K: -1}).Generate(10, newRand(1)); !errors.Is(err, ErrParamRange) {
		t.Errorf("K < 0: %v, want ErrParamRange", err)
	}
}

// TestCircleMapJacobian: the tangent map 1 − K cos(2πθ) is the derivative
// of the lift θ + Ω − (K/2π) sin(2πθ), checked by central differences at
// states across the circle (the lift has no jump, unlike θ mod 1).
func TestCircleMapJacobian(t *testing.T) {
	const h = 1e-7
	for _, k := range []float64{0.5, 1, 2.4} {
		m := CircleMap{Omega: 0.37, K: k}
		lift := func(th float64) float64 { w, f := m.step(th); return w + f }
		for i := 0; i < 20; i++ {
			th := (float64(i) + 0.5) / 20
			j := make([]float64, 1)
			m.jacobian(j, []float64{th})
			num := (lift(th+h) - lift(th-h)) / (2 * h)
			if math.Abs(num-j[0]) > 1e-6*(1+math.Abs(num)) {
				t.Errorf("%s: derivative at θ = %g: %g, finite difference %g", fmt.Sprint("K = ", k), th, j[0], num)
			}
		}
	}
}
