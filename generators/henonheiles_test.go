package generators

import (
	"math"
	"testing"
)

// TestHenonHeiles checks the Hamiltonian structure and the mixed phase
// space.
//
// Energy (analytic: H is conserved): drawn starts lie on the shell H = E
// to rounding (1e-12), and along a recorded orbit of 2·10^4 time units
// H stays within 1e-6 of E (RK4 at step 0.02 loses below 10^−6 over
// 4·10^4 time units, measured).
//
// Exponents (analytic: symplectic flow, divergence 0): the spectrum comes
// in ± pairs, Σλ = 0 (tolerance 1e-6, RK4's volume error) and λ4 = −λ1,
// λ3 = −λ2 (tolerance 1e-4).
//
// Regimes (Hénon & Heiles 1964): at E = 1/8 the start (0, −0.1, p_x, 0)
// lies in the chaotic sea and (0, 0.1, p_x, 0) on a torus; at E = 0.08
// nearly every drawn start is on a torus and near E = 1/6 nearly every
// one in the sea: of 30 ClassFrom labels, at least 27 regular at E = 0.08
// and at least 24 chaotic at E = 0.166 (28 and 29 measured with this seed:
// thin chaotic layers along separatrices remain at E = 0.08, small tori
// near 1/6).
//
// Symmetry: H is even in x, so the orbit from (−x, y, −p_x, p_y) is the
// mirror image of the orbit from (x, y, p_x, p_y): the recorded x series
// is negated bit for bit.
func TestHenonHeiles(t *testing.T) {
	sp := checkFlow(t, "henon-heiles", nil, Chaotic, 0, 1e-6) // analytic: divergence 0
	e := sp.Exponents
	if math.Abs(e[0]+e[3]) > 1e-4 || math.Abs(e[1]+e[2]) > 1e-4 { // symplectic pairing
		t.Errorf("spectrum %v not in ± pairs", e)
	}
	m := HenonHeiles{E: 0.125}
	torus, _ := m.onShell(0.1, 0)
	r := flowRule{h: henonHeilesStep, transient: henonHeilesTransient, renorm: 1}
	st, err := r.spectrum(m, torus, 5000, 4)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("torus: %v", st.Exponents)
	if st.Exponents[0] > 0.005 || math.Abs(sum(st.Exponents)) > 1e-6 {
		t.Errorf("torus from %v: spectrum %v, want λ1 below 0.005 and Σλ = 0", torus, st.Exponents)
	}

	rng := newRand(5)
	for i := 0; i < 5; i++ {
		v := m.start(rng)
		if d := henonHeilesEnergy(v) - m.E; math.Abs(d) > 1e-12 {
			t.Errorf("start %v off the shell by %g", v, d)
		}
		if v[0] != 0 || v[2] < 0 {
			t.Errorf("start %v not on the section x = 0, p_x ≥ 0", v)
		}
	}
	const n, dt = 10000, 2.0
	start := m.start(rng)
	var cols [4][]float64
	for k := range cols {
		cols[k], err = sampleFlow("henon-heiles", m, append([]float64(nil), start...), n, dt, henonHeilesStep, 0, k)
		if err != nil {
			t.Fatal(err)
		}
	}
	var worst float64
	for i := 0; i < n; i++ {
		d := henonHeilesEnergy([]float64{cols[0][i], cols[1][i], cols[2][i], cols[3][i]}) - m.E
		worst = math.Max(worst, math.Abs(d))
	}
	t.Logf("energy drift over %g time units: %.3g", n*dt, worst)
	if worst > 1e-6 {
		t.Errorf("energy drifts by %.3g over %g time units", worst, n*dt)
	}

	s, err := Lookup("henon-heiles")
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		e     float64
		class Class
		min   int
	}{{0.08, Regular, 27}, {0.166, Chaotic, 24}} {
		rng := newRand(7)
		count := 0
		for i := 0; i < 30; i++ {
			c, err := s.ClassFrom(map[string]float64{"e": tc.e}, rng)
			if err != nil {
				t.Fatal(err)
			}
			if c == tc.class {
				count++
			}
		}
		t.Logf("E = %g: %d of 30 %s", tc.e, count, tc.class)
		if count < tc.min {
			t.Errorf("E = %g: %d of 30 draws %s, want ≥ %d", tc.e, count, tc.class, tc.min)
		}
	}

	mirror := []float64{-start[0], start[1], -start[2], start[3]}
	a, _ := sampleFlow("henon-heiles", m, append([]float64(nil), start...), 500, 0.3, henonHeilesStep, 0, 0)
	b, _ := sampleFlow("henon-heiles", m, mirror, 500, 0.3, henonHeilesStep, 0, 0)
	for i := range a {
		if a[i] != -b[i] {
			t.Fatalf("mirror symmetry broken at %d: %v vs %v", i, a[i], b[i])
		}
	}
}
