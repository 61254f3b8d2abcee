package generators

import (
	"math"
	"sort"
	"testing"
)

// TestCMLNext: the in-place coupling equals the lattice equation written
// with explicit modulo indices (Kaneko 1984).
func TestCMLNext(t *testing.T) {
	m := CML{N: 7, Eps: 0.37, R: 3.9}
	v := m.start(newRand(1))
	got := make([]float64, m.N)
	m.next(got, v)
	f := func(x float64) float64 { return m.R * x * (1 - x) }
	for i := range v {
		want := (1-m.Eps)*f(v[i]) + m.Eps/2*(f(v[(i+m.N-1)%m.N])+f(v[(i+1)%m.N]))
		if math.Abs(got[i]-want) > 1e-15 {
			t.Errorf("site %d: %v, equation gives %v", i, got[i], want)
		}
	}
}

// TestCMLSpectra checks two analytic spectra of the lattice.
//
// Uncoupled (ε = 0), r = 4: every site is a logistic map, so all N
// exponents equal ln 2 (analytic); each is an orbit average over 10^5
// iterations with standard error ≈ 0.003, tolerance 0.02.
//
// Synchronised orbit (all sites equal, which the equations preserve
// exactly): the tangent map is f'(x_t)·C with C circulant, whose
// eigenvalues are μ_k = 1 − ε + ε·cos(2πk/N), so λ_k = λ_logistic +
// ln|μ_k| (derived). The differences λ_k − λ_0 = ln|μ_k| do not depend on
// the orbit and converge as O(1/iterations); tolerance 1e-3.
func TestCMLSpectra(t *testing.T) {
	const n = 8
	m := CML{N: n, Eps: 0, R: 4}
	sp, err := mapSpectrum(m, m.start(newRand(2)), mapTransient, mapLyapIters, n)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("ε = 0 spectrum %v", sp.Exponents)
	for k, l := range sp.Exponents {
		if math.Abs(l-math.Ln2) > 0.02 { // analytic: uncoupled logistic maps, ln 2
			t.Errorf("ε = 0: λ_%d = %.4f, want ln 2", k+1, l)
		}
	}
	m = CML{N: 4, Eps: 0.2, R: 4}
	x0 := []float64{0.3, 0.3, 0.3, 0.3}
	sp, err = mapSpectrum(m, x0, 0, 20000, 4)
	if err != nil {
		t.Fatal(err)
	}
	want := make([]float64, 4)
	for k := range want {
		want[k] = math.Log(math.Abs(1 - m.Eps + m.Eps*math.Cos(2*math.Pi*float64(k)/4)))
	}
	sort.Sort(sort.Reverse(sort.Float64Slice(want)))
	t.Logf("synchronised spectrum %v, ln|μ_k| %v", sp.Exponents, want)
	for k := range want {
		got := sp.Exponents[k] - sp.Exponents[0]
		if math.Abs(got-want[k]) > 1e-3 { // derived: Fourier modes of the circulant coupling
			t.Errorf("λ_%d − λ_1 = %.5f, want ln|μ| = %.5f", k+1, got, want[k])
		}
	}
	// The synchronised state stays synchronised exactly.
	v, w := append([]float64(nil), x0...), make([]float64, 4)
	for i := 0; i < 1000; i++ {
		m.next(w, v)
		v, w = w, v
	}
	for i := 1; i < 4; i++ {
		if v[i] != v[0] {
			t.Fatalf("synchronised lattice split: %v", v)
		}
	}
}

// TestCMLLabels: spatio-temporal chaos at the defaults (r = 4, ε = 0.2)
// and at ε = 0 (λ1 = ln 2); frozen periodic patterns at r = 3.5 (the
// logistic map's period-4 regime) with weak coupling, and in the coupling
// window r = 4, ε = 0.15 found by scanning ε (λ1 ≈ −0.13 from every start
// tried). The periodic series repeat exactly.
func TestCMLLabels(t *testing.T) {
	s, _ := Lookup("cml")
	for _, tc := range []struct {
		set   map[string]float64
		class Class
	}{
		{nil, Chaotic},
		{map[string]float64{"eps": 0}, Chaotic},
		{map[string]float64{"r": 3.5, "eps": 0.1}, Regular},
		{map[string]float64{"eps": 0.15}, Regular},
	} {
		c, err := s.Class(tc.set)
		sp, _ := s.Lyapunov(tc.set)
		t.Logf("%v: λ1 = %.4f, %s", tc.set, sp.Exponents[0], c)
		if err != nil || c != tc.class {
			t.Errorf("%v: class %s (%v), want %s", tc.set, c, err, tc.class)
		}
		if tc.class == Regular {
			x, err := s.Generate(3000, tc.set, newRand(3))
			if err != nil {
				t.Fatal(err)
			}
			if p := period(x[1000:], 64, 1e-9); p == 0 {
				t.Errorf("%v: no period ≤ 64 in the regular series", tc.set)
			}
		}
	}
}
