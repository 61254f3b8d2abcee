package generators

import (
	"math"
	"testing"
)

// ikedaHopfDelay returns the delay at which the fixed point x* ∈ (0, π) of
// x = μ sin x loses stability (analytic, linearisation
// y' = −y + k·y(t − τ), k = μ cos x*: roots λ = iω when k cos ωτ = 1 and
// ω = −k sin ωτ, so τ_H = arccos(1/k)/√(k² − 1) for k < −1).
func ikedaHopfDelay(mu float64) float64 {
	lo, hi := 1e-6, math.Pi
	for i := 0; i < 200; i++ {
		mid := (lo + hi) / 2
		if mu*math.Sin(mid) > mid {
			lo = mid
		} else {
			hi = mid
		}
	}
	k := mu * math.Cos(lo)
	return math.Acos(1/k) / math.Sqrt(k*k-1)
}

// TestIkedaDelay checks the delay equation against its linear stability,
// its mean balance and its odd symmetry, and the label on both sides of
// the Hopf point and of the onset of chaos.
//
// Hopf point (analytic, ikedaHopfDelay): at μ = 2.5, τ_H = 2.843; at
// τ = 0.8·τ_H the history settles on the fixed point (λ1 clearly negative,
// below −0.01, and a constant series), at τ = 1.15·τ_H it oscillates on a
// limit cycle (|λ1| < 0.002, the label threshold, and a varying series);
// both are labelled regular.
//
// Onset of chaos (measured when the ranges were chosen): at τ = 10 the
// orbit is periodic at μ = 2.7 and chaotic at μ = 3.5 and at the defaults
// (μ = 5, λ1 ≈ 0.056 per time unit).
//
// Mean balance (analytic): the time average of dx/dt over a bounded orbit
// vanishes, so ⟨x⟩ = μ⟨sin x(t − τ)⟩. Over a record of length T the
// balance holds up to the boundary terms (|x(T) − x(0)| + 2μτ)/T (the
// delayed window is shifted by τ and |sin| ≤ 1); the sample means add a
// quadrature error of O(dt²) at dt = 0.05, allowed 1e-3.
//
// Symmetry: sin is odd, so the history −x0 gives the orbit −x(t), bit for
// bit (math.Sin(−x) = −math.Sin(x) exactly).
func TestIkedaDelay(t *testing.T) {
	s, err := Lookup("ikeda-delay")
	if err != nil {
		t.Fatal(err)
	}
	const mu = 2.5
	tauH := ikedaHopfDelay(mu)
	if math.Abs(tauH-2.8426) > 1e-3 {
		t.Fatalf("τ_H(2.5) = %.4f, want 2.8426", tauH)
	}
	for _, tc := range []struct {
		tau    float64
		cycle  bool
		lo, hi float64
	}{{0.8 * tauH, false, math.Inf(-1), -0.01}, {1.15 * tauH, true, -0.002, 0.002}} {
		m := IkedaDelay{Mu: mu, Tau: tc.tau, Dt: 0.5}
		sp, err := ikedaDelayLyapunov(m, 1.2, ikedaDelaySpan)
		if err != nil {
			t.Fatal(err)
		}
		x, err := m.Generate(400, newRand(1))
		if err != nil {
			t.Fatal(err)
		}
		v := variance(x)
		t.Logf("τ = %.4f: λ1 = %.5f, variance %.3g", tc.tau, sp.Exponents[0], v)
		if l := sp.Exponents[0]; !(l > tc.lo && l < tc.hi) {
			t.Errorf("τ = %.4f: λ1 = %.5f, want in (%g, %g)", tc.tau, l, tc.lo, tc.hi)
		}
		if (v > 1e-6) != tc.cycle {
			t.Errorf("τ = %.4f: variance %.3g, limit cycle %v expected", tc.tau, v, tc.cycle)
		}
		if c, err := s.classify(sp, nil); c != Regular || err != nil {
			t.Errorf("τ = %.4f: %s (%v), want regular", tc.tau, c, err)
		}
	}
	for _, tc := range []struct {
		mu    float64
		class Class
	}{{2.7, Regular}, {3.5, Chaotic}, {5, Chaotic}} {
		c, err := s.Class(map[string]float64{"mu": tc.mu, "tau": 10})
		if err != nil || c != tc.class {
			t.Errorf("μ = %g, τ = 10: %s (%v), want %s", tc.mu, c, err, tc.class)
		}
	}
	if c, err := s.computeClass(s.Defaults()); err != nil || c != Chaotic {
		t.Errorf("defaults (computed): %s (%v), want chaotic", c, err)
	}

	// Chaotic (λ1 ≈ 0.022) about the fixed point x* ≈ 2.28, so ⟨x⟩ is far
	// from 0 (at the defaults the orbit visits ±x* alike and ⟨x⟩ ≈ 0).
	m := IkedaDelay{Mu: 3, Tau: 10, Dt: 0.05}
	const n = 400000
	x, err := m.Generate(n, newRand(2))
	if err != nil {
		t.Fatal(err)
	}
	var mx, ms float64
	for _, v := range x {
		mx += v
		ms += math.Sin(v)
	}
	mx /= n
	ms /= n
	T := float64(n) * m.Dt
	tol := (math.Abs(x[n-1]-x[0])+2*m.Mu*m.Tau)/T + 1e-3
	t.Logf("⟨x⟩ = %.5f, μ⟨sin x⟩ = %.5f, tolerance %.4f", mx, m.Mu*ms, tol)
	if math.Abs(mx-m.Mu*ms) > tol { // analytic mean balance
		t.Errorf("⟨x⟩ = %.5f, μ⟨sin x⟩ = %.5f", mx, m.Mu*ms)
	}

	m = IkedaDelay{Mu: 5, Tau: 10}
	a, b := m.newState(0.8), m.newState(-0.8)
	for i := 0; i < 20000; i++ {
		m.step(a)
		m.step(b)
		if a.x[a.head] != -b.x[b.head] {
			t.Fatalf("odd symmetry broken at step %d: %v vs %v", i, a.x[a.head], b.x[b.head])
		}
	}
}
