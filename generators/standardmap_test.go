package generators

import (
	"math"
	"testing"
)

// TestStandardMapExponents: the map preserves area (det J = 1), so
// λ1 + λ2 = 0 for every orbit (analytic; the Gram–Schmidt norms multiply
// to det J each iteration, tolerance 1e-9); deep in the chaotic regime
// λ1 ≈ ln(K/2) (Chirikov, Phys. Rep. 52 (1979) 263, citation as in tkf/LyapunovExponents.jl src/examples/standard_map.jl; the law (memory)), an
// asymptotic law whose corrections fall as 1/K², so it is checked at
// K = 20 (ln 10 = 2.303) within 0.02.
func TestStandardMapExponents(t *testing.T) {
	for _, k := range []float64{1.5, 6, 20} {
		m := StandardMap{K: k}
		sp, err := mapSpectrum(m, []float64{0.1, 0.1}, mapTransient, mapLyapIters, 2)
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("K = %g: %v, ln(K/2) = %.4f", k, sp.Exponents, math.Log(k/2))
		if s := sp.Exponents[0] + sp.Exponents[1]; math.Abs(s) > 1e-9 { // analytic: det J = 1
			t.Errorf("K = %g: λ1 + λ2 = %g, want 0", k, s)
		}
		if k == 20 && math.Abs(sp.Exponents[0]-math.Log(k/2)) > 0.02 { // Chirikov (1979) (memory)
			t.Errorf("K = 20: λ1 = %.4f, want ln 10 = %.4f", sp.Exponents[0], math.Log(10))
		}
	}
}

// TestStandardMapMixed: at K = 1.5 the elliptic fixed point (π, 0) is
// stable (trace of J is 2 − K, inside (−2, 2) for 0 < K < 4, analytic), so
// orbits started close to it stay on invariant curves of its island and
// are regular, while the orbit from (0.1, 0.1) near the hyperbolic point
// (0, 0) is in the chaotic sea. The series of the island orbit stays near
// sin θ = 0.
func TestStandardMapMixed(t *testing.T) {
	s, _ := Lookup("standard-map")
	p, _ := s.Resolve(nil)
	for _, tc := range []struct {
		x0    []float64
		class Class
	}{
		{[]float64{math.Pi + 0.3, 0}, Regular},
		{[]float64{0.1, 0.1}, Chaotic},
	} {
		c, err := s.classify(s.lyapFrom(p, tc.x0))
		if err != nil || c != tc.class {
			t.Errorf("start %v: %s (%v), want %s", tc.x0, c, err, tc.class)
		}
	}
	m := StandardMap{K: 1.5}
	v, w := []float64{math.Pi + 0.3, 0}, make([]float64, 2)
	for i := 0; i < 10000; i++ {
		m.next(w, v)
		v, w = w, v
		if math.Abs(math.Sin(v[0])) > 0.5 {
			t.Fatalf("island orbit left the island at %d: %v", i, v)
		}
	}
	// K = 0.5: invariant curves span the torus and every drawn start is
	// regular.
	if got := classesOver(t, "standard-map", map[string]float64{"k": 0.5}, 6); got[Chaotic] != 0 {
		t.Errorf("K = 0.5: %v, want all regular", got)
	}
}
