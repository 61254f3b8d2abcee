package generators

import (
	"fmt"
	"math"
)

// delayModel is a scalar delay-differential equation integrated on a grid
// held in an mgState (history buffer of values and derivatives): the
// Mackey–Glass and Ikeda delay systems.
type delayModel interface {
	check() error
	newState(x0 float64) *mgState
	step(s *mgState)
}

// sampleDelay integrates m from a constant history x0 for transient time
// units and returns n samples dt apart, each the cubic Hermite interpolant
// of the grid solution (values and derivatives at both ends of its step).
func sampleDelay(name string, m delayModel, x0 float64, n int, dt, transient float64) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := m.check(); err != nil {
		return nil, err
	}
	if !(dt > 0) || math.IsInf(dt, 0) {
		return nil, fmt.Errorf("%s: dt = %g, want dt > 0", name, dt)
	}
	s := m.newState(x0)
	warm := int(math.Ceil(transient / s.h))
	for i := 0; i < warm; i++ {
		m.step(s)
	}
	out := make([]float64, n)
	var k int // grid steps taken since the first sample
	for i := range out {
		pos := float64(i) * dt / s.h
		for float64(k) < pos {
			m.step(s)
			k++
		}
		// The sample lies in [t_{k−1}, t_k]; interpolate there.
		if k == 0 {
			out[i] = s.x[s.head]
		} else {
			out[i] = hermiteLast(s, pos-float64(k-1))
		}
		if !(math.Abs(out[i]) < divergeBound) {
			return nil, fmt.Errorf("%s: %w after %d samples", name, ErrDiverged, i)
		}
	}
	return out, nil
}

// hermiteLast returns the cubic Hermite interpolant of the grid solution at
// the fraction th ∈ [0, 1] of the last grid step.
func hermiteLast(s *mgState, th float64) float64 {
	prev := (s.head + s.d) % (s.d + 1) // grid point before head
	h00 := (1 + 2*th) * (1 - th) * (1 - th)
	h10 := th * (1 - th) * (1 - th)
	h01 := th * th * (3 - 2*th)
	h11 := th * th * (th - 1)
	return h00*s.x[prev] + h10*s.h*s.f[prev] + h01*s.x[s.head] + h11*s.h*s.f[s.head]
}

// delayLyapunov returns the largest Lyapunov exponent of the discretised
// delay equation by Benettin's two-trajectory method: a reference history
// constant at x0 and a perturbed copy, their difference over the whole
// buffer rescaled to d0 = 1e-8 (Euclidean norm) every delay time, the log
// growth factors averaged over span time units after transient.
func delayLyapunov(name string, m delayModel, x0, span, transient float64) (Spectrum, error) {
	if err := m.check(); err != nil {
		return Spectrum{}, err
	}
	ref := m.newState(x0)
	warm := int(math.Ceil(transient / ref.h))
	for i := 0; i < warm; i++ {
		m.step(ref)
	}
	per := ref.d // steps per renormalisation: one delay time
	const d0 = 1e-8
	pert := &mgState{x: append([]float64(nil), ref.x...), f: append([]float64(nil), ref.f...), head: ref.head, d: ref.d, h: ref.h, steps: ref.steps}
	dn := d0 / math.Sqrt(float64(len(pert.x)))
	for i := range pert.x {
		pert.x[i] += dn
	}
	blocks := int(math.Ceil(span / (float64(per) * ref.h)))
	var sum float64
	for b := 0; b < blocks; b++ {
		for i := 0; i < per; i++ {
			m.step(ref)
			m.step(pert)
		}
		var ss float64
		for i := range ref.x {
			dx := pert.x[i] - ref.x[i]
			ss += dx * dx
		}
		dist := math.Sqrt(ss)
		if !(dist > 0) || math.IsInf(dist, 0) || math.IsNaN(dist) {
			return Spectrum{}, fmt.Errorf("%s: %w: perturbation lost", name, ErrDiverged)
		}
		sum += math.Log(dist / d0)
		sc := d0 / dist
		for i := range ref.x {
			pert.x[i] = ref.x[i] + (pert.x[i]-ref.x[i])*sc
			pert.f[i] = ref.f[i] + (pert.f[i]-ref.f[i])*sc
		}
	}
	t := float64(blocks*per) * ref.h
	return Spectrum{Exponents: []float64{sum / t}, Unit: "per time unit", Span: t}, nil
}
