package generators

import (
	"math"
	"testing"
)

// TestFroeschleExponents: the map is symplectic (a kick by a gradient
// followed by a drift; J = [[I + H, I], [H, I]] with H symmetric), so
// det J = 1 and the four exponents sum to 0 (analytic; the Gram–Schmidt
// norms multiply to |det J| each iteration, tolerance 1e-9), and they come
// in pairs λ1 = −λ4, λ2 = −λ3 (symplectic pairing, analytic; the
// finite-time estimates pair up to O(1/iterations), here 10^−5, so the
// tolerance is 10^−3).
func TestFroeschleExponents(t *testing.T) {
	j := make([]float64, 16)
	for _, m := range []Froeschle{
		{K1: 1.2, K2: 0.8, B: 0.3},
		{K1: 0.5, K2: 0.35, B: 0.1},
		{K1: 0.3, K2: 0.2, B: 0.003},
		{K1: 3, K2: 2, B: 1},
	} {
		for _, v := range randomStates(10, 4, 0, 2*math.Pi, 8) {
			m.jacobian(j, v)
			if d := det4(j); math.Abs(d-1) > 1e-9 { // analytic: det J = 1
				t.Errorf("%+v at %v: det J = %.12f, want 1", m, v, d)
			}
		}
		sp, err := mapSpectrum(m, []float64{0.1, 0.1, 0.1, 0.1}, mapTransient, mapLyapIters, 4)
		if err != nil {
			t.Fatal(err)
		}
		e := sp.Exponents
		t.Logf("%+v: %v", m, e)
		if s := e[0] + e[1] + e[2] + e[3]; math.Abs(s) > 1e-9 { // analytic: det J = 1
			t.Errorf("%+v: exponent sum %g, want 0", m, s)
		}
		if math.Abs(e[0]+e[3]) > 1e-3 || math.Abs(e[1]+e[2]) > 1e-3 { // symplectic pairing
			t.Errorf("%+v: exponents %v do not pair as λ1 = −λ4, λ2 = −λ3", m, e)
		}
	}
}

// det4 returns the determinant of the row-major 4×4 matrix a by cofactor
// expansion along the first row.
func det4(a []float64) float64 {
	det3 := func(r [3]int, c [3]int) float64 {
		g := func(i, k int) float64 { return a[r[i]*4+c[k]] }
		return g(0, 0)*(g(1, 1)*g(2, 2)-g(1, 2)*g(2, 1)) - g(0, 1)*(g(1, 0)*g(2, 2)-g(1, 2)*g(2, 0)) + g(0, 2)*(g(1, 0)*g(2, 1)-g(1, 1)*g(2, 0))
	}
	var d float64
	for k := 0; k < 4; k++ {
		var cols [3]int
		i := 0
		for c := 0; c < 4; c++ {
			if c != k {
				cols[i] = c
				i++
			}
		}
		sign := 1.0
		if k%2 == 1 {
			sign = -1
		}
		d += sign * a[k] * det3([3]int{1, 2, 3}, cols)
	}
	return d
}

// TestFroeschleUncoupled: at B = 0 the map falls apart into two standard
// maps (analytic): the (x1, p1) orbit is the standard map's orbit with
// K = K1, to the bit (the coupling term adds an exact zero).
func TestFroeschleUncoupled(t *testing.T) {
	m := Froeschle{K1: 1.4, K2: 0.6}
	sm := StandardMap{K: 1.4}
	v, w := []float64{0.3, 2, 1.1, 5}, make([]float64, 4)
	a, b := []float64{0.3, 1.1}, make([]float64, 2)
	for i := 0; i < 5000; i++ {
		m.next(w, v)
		v, w = w, v
		sm.next(b, a)
		a, b = b, a
		if v[0] != a[0] || v[2] != a[1] {
			t.Fatalf("iteration %d: (x1, p1) = (%v, %v), standard map (%v, %v)", i, v[0], v[2], a[0], a[1])
		}
	}
}

// TestFroeschleLabels: the label changes with the coupling. Uncoupled
// maps with small kicks lie on invariant tori (the standard map has
// invariant curves spanning the torus for K below about 0.97, Chirikov
// 1979 (memory)), so every drawn start is regular at K1 = 0.5, K2 = 0.35, B = 0;
// the coupling B = 0.3 opens chaotic layers that most starts meet (scan of
// 16 starts: 0 of 16 chaotic at B ≤ 0.01, 15 of 16 at B = 0.3), and large
// kicks make every start chaotic.
func TestFroeschleLabels(t *testing.T) {
	for _, tc := range []struct {
		set        map[string]float64
		minC, maxC int
		seeds      int
		want       string
	}{
		{map[string]float64{"k1": 0.5, "k2": 0.35, "b": 0}, 0, 0, 8, "all regular"},
		{map[string]float64{"k1": 0.5, "k2": 0.35, "b": 0.3}, 6, 8, 8, "mostly chaotic"},
		{map[string]float64{"k1": 2.5, "k2": 2, "b": 0.5}, 8, 8, 8, "all chaotic"},
	} {
		got := classesOver(t, "froeschle", tc.set, tc.seeds)
		if got[Chaotic] < tc.minC || got[Chaotic] > tc.maxC {
			t.Errorf("%v: %v, want %s", tc.set, got, tc.want)
		}
	}
}
