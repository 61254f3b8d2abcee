package generators

import (
	"math"
	"testing"
)

// TestFitzHughNagumoFixedPoint: FixedPoint solves the fixed-point cubic
// v − v³/3 − (v + a)/b + I = 0 to rounding; HopfMargin is the trace of
// the analytic Jacobian there; below the oscillating window (I = 0, trace
// < 0) every orbit settles on (v*, (v* + a)/b).
func TestFitzHughNagumoFixedPoint(t *testing.T) {
	for _, I := range []float64{-1, 0, 0.5, 1.3, 3} {
		m := FitzHughNagumo{A: fhnA, B: fhnB, Eps: 0.08, I: I}
		v := m.FixedPoint()
		if r := v - v*v*v/3 - (v+m.A)/m.B + I; math.Abs(r) > 1e-12 {
			t.Errorf("I = %g: residual %g at v* = %g", I, r, v)
		}
		j := make([]float64, 4)
		m.jacobian(j, []float64{v, (v + m.A) / m.B})
		if math.Abs(j[0]+j[3]-m.HopfMargin()) > 1e-12 {
			t.Errorf("I = %g: trace %g, HopfMargin %g", I, j[0]+j[3], m.HopfMargin())
		}
	}
	m := FitzHughNagumo{A: fhnA, B: fhnB, Eps: 0.08, I: 0, Dt: 1}
	if !(m.HopfMargin() < 0) {
		t.Fatalf("I = 0: margin %g, want a stable fixed point", m.HopfMargin())
	}
	v := m.FixedPoint()
	for obs, want := range []float64{v, (v + m.A) / m.B} {
		m.Obs = obs
		x, err := m.Generate(2000, newRand(3))
		if err != nil {
			t.Fatal(err)
		}
		if got := x[len(x)-1]; math.Abs(got-want) > 1e-9 {
			t.Errorf("I = 0: coordinate %d ends at %.12f, want the fixed point's %.12f", obs, got, want)
		}
	}
}

// TestFitzHughNagumoBox: the registry's box (0.45 ≤ i ≤ 1.3,
// 0.01 ≤ eps ≤ 0.25 at a = 0.7, b = 0.8) lies inside the oscillating
// regime — the fixed point repels at every point of a 10 × 10 grid — and
// at its corners the model spikes between the outer branches of the cubic
// nullcline (v spans more than 2.5) with a regular label.
func TestFitzHughNagumoBox(t *testing.T) {
	for i := 0; i <= 9; i++ {
		for k := 0; k <= 9; k++ {
			m := FitzHughNagumo{A: fhnA, B: fhnB, I: 0.45 + 0.85*float64(i)/9, Eps: 0.01 + 0.24*float64(k)/9}
			if !(m.HopfMargin() > 0) {
				t.Errorf("I = %.3f, eps = %.3f: margin %g, want an oscillating model", m.I, m.Eps, m.HopfMargin())
			}
		}
	}
	s, _ := Lookup("fitzhugh-nagumo")
	for _, I := range []float64{0.45, 1.3} {
		for _, eps := range []float64{0.01, 0.25} {
			set := map[string]float64{"i": I, "eps": eps}
			x, err := s.Generate(3000, set, newRand(4))
			if err != nil {
				t.Fatal(err)
			}
			if lo, hi := extrema(x); hi-lo < 2.5 {
				t.Errorf("%v: v spans [%.3f, %.3f], want a relaxation spike", set, lo, hi)
			}
			if c, err := s.Class(set); err != nil || c != Regular {
				t.Errorf("%v: class %s (%v), want regular", set, c, err)
			}
		}
	}
}

// fhnSlowPeriod returns the leading-order period of the relaxation
// oscillation as ε → 0: the time spent on the two outer branches of the
// nullcline w = v − v³/3 + I, from the landing points v = ±2 to the knees
// v = ±1, dt = (1 − v²) dv/(ε(v + a − b·w)) (singular perturbation theory
// of relaxation oscillations; Mishchenko & Rozov, Differential Equations
// with Small Parameters and Relaxation Oscillations (1980) (memory)), by
// Simpson's rule on 2000 intervals per branch.
func fhnSlowPeriod(m FitzHughNagumo) float64 {
	g := func(v float64) float64 {
		w := v - v*v*v/3 + m.I
		return (1 - v*v) / (v + m.A - m.B*w)
	}
	simpson := func(lo, hi float64) float64 {
		const n = 2000
		h := (hi - lo) / n
		s := g(lo) + g(hi)
		for i := 1; i < n; i++ {
			c := 2.0
			if i%2 == 1 {
				c = 4
			}
			s += c * g(lo+float64(i)*h)
		}
		return s * h / 3
	}
	return (simpson(2, 1) + simpson(-2, -1)) / m.Eps
}

// TestFitzHughNagumoRelaxationPeriod: for small ε the period approaches
// the slow-branch time T₀ = O(1/ε) of fhnSlowPeriod, the relative excess
// (the time spent passing the knees) shrinking as ε^{2/3} (same source
// (memory)): the exponent fitted between successive ε a factor 5 apart
// must be 2/3 within 0.1.
func TestFitzHughNagumoRelaxationPeriod(t *testing.T) {
	var rel []float64
	epss := []float64{0.01, 0.002, 0.0004}
	for _, eps := range epss {
		m := FitzHughNagumo{A: fhnA, B: fhnB, Eps: eps, I: 0.5}
		t0 := fhnSlowPeriod(m)
		m.Dt = t0 / 500
		x, err := m.Generate(3000, newRand(5))
		if err != nil {
			t.Fatal(err)
		}
		p := meanPeriod(x, m.Dt)
		rel = append(rel, p/t0-1)
		t.Logf("eps = %g: period %.3f, slow-branch time %.3f (excess %.4f)", eps, p, t0, p/t0-1)
	}
	for i := 1; i < len(rel); i++ {
		k := math.Log(rel[i-1]/rel[i]) / math.Log(epss[i-1]/epss[i])
		if math.Abs(k-2.0/3) > 0.1 {
			t.Errorf("excess %.4f at eps %g, %.4f at eps %g: exponent %.3f, want 2/3", rel[i-1], epss[i-1], rel[i], epss[i], k)
		}
	}
}
