package generators

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestWebMapExponents: the kick (u, v) ↦ (u + K sin v, v) and the
// rotation both have determinant 1, so det J = 1 at every point and
// λ1 + λ2 = 0 along every orbit (analytic; the Gram–Schmidt norms multiply
// to |det J| each iteration, tolerance 1e-9), for chaotic and regular
// orbits alike.
func TestWebMapExponents(t *testing.T) {
	j := make([]float64, 4)
	for _, tc := range []struct {
		k  float64
		q  int
		x0 []float64
	}{
		{2.5, 4, []float64{3, 0.1}},
		{1.5, 6, []float64{3, 0.1}},
		{0.4, 4, []float64{0.2, 0.2}},
		{1, 5, []float64{1, -2}},
	} {
		m := newWebMap(tc.k, tc.q, 0)
		for _, v := range randomStates(20, 2, -10, 10, 5) {
			m.jacobian(j, v)
			if d := j[0]*j[3] - j[1]*j[2]; math.Abs(d-1) > 1e-12 { // analytic: det J = 1
				t.Errorf("K = %g, q = %d at %v: det J = %.15f, want 1", tc.k, tc.q, v, d)
			}
		}
		sp, err := mapSpectrum(m, tc.x0, mapTransient, mapLyapIters, 2)
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("K = %g, q = %d from %v: %v", tc.k, tc.q, tc.x0, sp.Exponents)
		if s := sp.Exponents[0] + sp.Exponents[1]; math.Abs(s) > 1e-9 { // analytic: det J = 1
			t.Errorf("K = %g, q = %d: λ1 + λ2 = %g, want 0", tc.k, tc.q, s)
		}
	}
}

// TestWebMapLabels: the origin is a fixed point whose linearisation has
// trace 2cos α − K sin α (analytic), inside (−2, 2) for q = 4 and K < 2,
// so it is elliptic and orbits started close to it stay on invariant
// curves of its cell: regular. The orbit from (3, 0.1) lies on the web
// (chaotic) at K = 1.5 and q = 4 and 6. Across the regime change in K,
// at K = 0.4 the web is exponentially thin and every drawn start of 8 is
// regular; at K = 2.5 (q = 4) the web covers the square of starts and
// every one of 8 is chaotic (scan of 12 starts: 0 of 12 chaotic for
// K < 1, 12 of 12 at K = 2.5 and 3, 4 of 12 at K = 1.5).
func TestWebMapLabels(t *testing.T) {
	s, _ := Lookup("web-map")
	for _, tc := range []struct {
		set   map[string]float64
		x0    []float64
		class Class
	}{
		{map[string]float64{"k": 1.5, "q": 4}, []float64{0.2, 0.2}, Regular},
		{map[string]float64{"k": 1.5, "q": 4}, []float64{3, 0.1}, Chaotic},
		{map[string]float64{"k": 1.5, "q": 6}, []float64{3, 0.1}, Chaotic},
		{map[string]float64{"k": 0.4, "q": 6}, []float64{0.2, 0.2}, Regular},
	} {
		p, _ := s.Resolve(tc.set)
		c, err := s.classify(s.lyapFrom(p, tc.x0))
		if err != nil || c != tc.class {
			t.Errorf("%v from %v: %s (%v), want %s", tc.set, tc.x0, c, err, tc.class)
		}
	}
	if got := classesOver(t, "web-map", map[string]float64{"k": 0.4, "q": 4}, 8); got[Chaotic] != 0 {
		t.Errorf("K = 0.4: %v, want all regular", got)
	}
	if got := classesOver(t, "web-map", map[string]float64{"k": 2.5, "q": 4}, 8); got[Regular] != 0 {
		t.Errorf("K = 2.5: %v, want all chaotic", got)
	}
}

// TestWebMapWeb: a chaotic orbit wanders along the connected web without
// bound (Zaslavsky et al. 1986 (memory)), a regular one stays in its
// cell. From (3, 0.1) at K = 2.5, q = 4 the orbit leaves the square
// |u|, |v| < 4π within 20000 iterations; from (0.2, 0.2) at K = 1.5 it
// stays within |u|, |v| < π, inside the cell around the origin (the web's
// skeleton for q = 4 is the net |u| ± |v| = π (mod 2π) (memory)). Measured
// extents: 144 for the web orbit, 0.55 for the cell orbit.
func TestWebMapWeb(t *testing.T) {
	extent := func(m WebMap, x0 []float64, n int) float64 {
		v, w := append([]float64(nil), x0...), make([]float64, 2)
		var r float64
		for i := 0; i < n; i++ {
			m.next(w, v)
			v, w = w, v
			r = max(r, math.Abs(v[0]), math.Abs(v[1]))
		}
		return r
	}
	if r := extent(newWebMap(2.5, 4, 0), []float64{3, 0.1}, 20000); r < 4*math.Pi {
		t.Errorf("web orbit stayed within %.2f, want it to wander beyond 4π", r)
	}
	if r := extent(newWebMap(1.5, 4, 0), []float64{0.2, 0.2}, 20000); r > math.Pi {
		t.Errorf("cell orbit reached %.2f, want within π", r)
	}
}

// TestWebMapOdd: the kick and the rotation are odd, so T(−z) = −T(z)
// (analytic); math.Sin is odd to the bit, so the orbit from −z is the
// negated orbit from z exactly.
func TestWebMapOdd(t *testing.T) {
	m := newWebMap(1.7, 6, 0)
	a, b := []float64{1.3, -0.4}, []float64{-1.3, 0.4}
	na, nb := make([]float64, 2), make([]float64, 2)
	for i := 0; i < 5000; i++ {
		m.next(na, a)
		m.next(nb, b)
		a, na = na, a
		b, nb = nb, b
		if a[0] != -b[0] || a[1] != -b[1] {
			t.Fatalf("iteration %d: %v and %v are not opposite", i, a, b)
		}
	}
}

func TestWebMapRejects(t *testing.T) {
	for _, m := range []WebMap{newWebMap(0, 4, 0), newWebMap(1, 2, 0), newWebMap(math.Inf(1), 4, 0), newWebMap(1, 4, 4), newWebMap(1, 4, -1)} {
		if _, err := m.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v: no error", m)
		}
	}
}

// TestWebMapSineObservable: for q = 4 the map commutes with 2π shifts of
// u and v (analytic, from u' = v, v' = −u − K sin v), so sin u of an orbit
// equals sin u of the orbit started 2π away (to rounding), and the sine observable is
// bounded even on the web, where u itself drifts.
func TestWebMapSineObservable(t *testing.T) {
	m := newWebMap(2.5, 4, 2)
	v := []float64{3, 0.1}
	w := []float64{3 + 2*math.Pi, 0.1 - 2*math.Pi}
	a, b := make([]float64, 2), make([]float64, 2)
	// Few iterations: cos(π/2) is not exactly 0 in floating point, and the
	// chaotic orbit amplifies that rounding exponentially.
	for i := 0; i < 20; i++ {
		m.next(a, v)
		m.next(b, w)
		v, a = a, v
		w, b = b, w
		if d := math.Abs(math.Sin(v[0]) - math.Sin(w[0])); d > 1e-6 {
			t.Fatalf("iteration %d: sin u differs by %g between lattice-shifted starts", i, d)
		}
	}
	x, err := m.Generate(5000, rand.New(rand.NewPCG(1, 2)))
	if err != nil {
		t.Fatal(err)
	}
	for i, s := range x {
		if math.Abs(s) > 1 {
			t.Fatalf("sample %d = %g outside [−1, 1]", i, s)
		}
	}
	if _, err := newWebMap(2.5, 4, 4).Generate(100, rand.New(rand.NewPCG(1, 2))); err == nil {
		t.Error("obs = 4 accepted")
	}
}
