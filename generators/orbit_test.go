package generators

import (
	"math"
	"testing"
)

// orbitStats follows the orbit of f from x0 with the step schedule of
// flowSpectrum (RK4 step h; ceil(transient/h) steps discarded; then
// blocks of round(renorm/h) steps covering total time units) and returns
// the state at the start and at the end of the averaging span, the span,
// and the time average of g over it (trapezoid rule over the RK4 steps).
// The state part of flowSpectrum's augmented integration performs the
// same floating-point operations, so this is the orbit its exponents were
// averaged along; the tests compare the sum of the exponents with the
// average divergence (Liouville's formula: the volume growth rate is the
// divergence of the field).
func orbitStats(f field, x0 []float64, h, transient, total, renorm float64, g func(v []float64) float64) (start, end []float64, span, mean float64) {
	x := append([]float64(nil), x0...)
	ig := newRK4(len(x))
	for i := 0; i < int(math.Ceil(transient/h)); i++ {
		ig.step(f.eval, x, h)
	}
	start = append([]float64(nil), x...)
	per := int(math.Max(1, math.Round(renorm/h)))
	steps := int(math.Ceil(total/(float64(per)*h))) * per
	var sum float64
	prev := g(x)
	for i := 0; i < steps; i++ {
		ig.step(f.eval, x, h)
		cur := g(x)
		sum += 0.5 * (prev + cur) * h
		prev = cur
	}
	span = float64(steps) * h
	return start, x, span, sum / span
}

// sum returns the sum of xs.
func sum(xs []float64) float64 {
	var s float64
	for _, x := range xs {
		s += x
	}
	return s
}

// checkFlow computes the label-rule spectrum (Lyapunov) and label (Class)
// of the flow sys at set and checks the label, that the exponents sum to
// wantSum within tol (the caller states why), and for a regular label the
// signature of a limit cycle or torus: λ1 below the chaos threshold and a
// contracting λ2 < −0.001 beside the neutral flow direction.
func checkFlow(t *testing.T, sys string, set map[string]float64, class Class, wantSum, tol float64) Spectrum {
	t.Helper()
	s, err := Lookup(sys)
	if err != nil {
		t.Fatal(err)
	}
	sp, err := s.Lyapunov(set)
	if err != nil {
		t.Fatalf("%s %v: %v", sys, set, err)
	}
	c, err := s.Class(set)
	e := sp.Exponents
	t.Logf("%s %v: %v, sum %.6f (want %.6f), %s", sys, set, e, sum(e), wantSum, c)
	if err != nil || c != class {
		t.Errorf("%s %v: %s (%v), want %s", sys, set, c, err, class)
	}
	if math.Abs(sum(e)-wantSum) > tol {
		t.Errorf("%s %v: sum of exponents %.6f, want %.6f ± %g", sys, set, sum(e), wantSum, tol)
	}
	if class == Regular && !(e[0] < s.threshold && e[1] < -0.001) {
		t.Errorf("%s %v: spectrum %v, want λ1 ≈ 0 > λ2", sys, set, e)
	}
	return sp
}
