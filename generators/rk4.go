package generators

import (
	"fmt"
	"math"
)

// field is an autonomous vector field dv/dt = F(v) with its Jacobian. The
// flows of this package implement it; the same eval drives Generate and the
// Lyapunov computation, so the label rule sees exactly the integrated
// equations.
type field interface {
	dim() int
	// eval stores F(v) in dst; len(dst) = len(v) = dim().
	eval(dst, v []float64)
	// jacobian stores ∂F_i/∂v_j at v in dst[i*dim()+j].
	jacobian(dst, v []float64)
}

// wrapper is implemented by fields with an angle coordinate that may be
// reduced modulo 2π between samples without changing the dynamics.
type wrapper interface {
	wrap(v []float64)
}

// rk4 is the classical fourth-order Runge–Kutta scheme for dv/dt = f(v) with
// preallocated stage buffers (no allocation per step).
type rk4 struct {
	k1, k2, k3, k4, tmp []float64
}

func newRK4(d int) *rk4 {
	b := make([]float64, 5*d)
	return &rk4{k1: b[:d], k2: b[d : 2*d], k3: b[2*d : 3*d], k4: b[3*d : 4*d], tmp: b[4*d:]}
}

// step advances v in place by one step h of v' = f(v).
func (r *rk4) step(f func(dst, v []float64), v []float64, h float64) {
	f(r.k1, v)
	for i := range v {
		r.tmp[i] = v[i] + 0.5*h*r.k1[i]
	}
	f(r.k2, r.tmp)
	for i := range v {
		r.tmp[i] = v[i] + 0.5*h*r.k2[i]
	}
	f(r.k3, r.tmp)
	for i := range v {
		r.tmp[i] = v[i] + h*r.k3[i]
	}
	f(r.k4, r.tmp)
	for i := range v {
		v[i] += h / 6 * (r.k1[i] + 2*r.k2[i] + 2*r.k3[i] + r.k4[i])
	}
}

// substeps returns the number k of internal steps per sample interval dt
// and their size dt/k, the largest size not above maxH.
func substeps(dt, maxH float64) (int, float64) {
	k := int(math.Ceil(dt/maxH - 1e-9))
	if k < 1 {
		k = 1
	}
	return k, dt / float64(k)
}

// divergeBound is the magnitude beyond which a flow or map state counts as
// escaped to infinity.
const divergeBound = 1e9

// finite reports whether every coordinate of v is finite and below
// divergeBound in magnitude.
func finite(v []float64) bool {
	for _, x := range v {
		if !(math.Abs(x) < divergeBound) {
			return false
		}
	}
	return true
}

// sampleFlow integrates f from v (modified in place) with RK4 steps of at
// most maxH, discards transient time units, then records coordinate obs
// every dt for n samples.
func sampleFlow(name string, f field, v []float64, n int, dt, maxH, transient float64, obs int) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(dt > 0) || math.IsInf(dt, 0) {
		return nil, fmt.Errorf("%s: dt = %g, want dt > 0", name, dt)
	}
	if err := checkObs(name, obs, len(v)); err != nil {
		return nil, err
	}
	steps, h := substeps(dt, maxH)
	ig := newRK4(len(v))
	w, _ := f.(wrapper)
	warm := int(math.Ceil(transient / h))
	for i := 0; i < warm; i++ {
		ig.step(f.eval, v, h)
		if w != nil && i%steps == 0 {
			w.wrap(v)
		}
	}
	if !finite(v) {
		return nil, fmt.Errorf("%s: %w during the transient", name, ErrDiverged)
	}
	out := make([]float64, n)
	for i := 0; i < n; i++ {
		out[i] = v[obs]
		for k := 0; k < steps; k++ {
			ig.step(f.eval, v, h)
		}
		if w != nil {
			w.wrap(v)
		}
		if !finite(v) {
			return nil, fmt.Errorf("%s: %w after %d samples", name, ErrDiverged, i+1)
		}
	}
	return out, nil
}
