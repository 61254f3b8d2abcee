package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// RosslerRing is a ring of N diffusively coupled Rössler oscillators with
// slightly detuned frequencies,
//
//	dx_i/dt = −ω_i·y_i − z_i + ε·(x_{i+1} − 2x_i + x_{i−1}),
//	dy_i/dt = ω_i·x_i + a·y_i,
//	dz_i/dt = b + z_i·(x_i − c),
//
// i = 0..N−1 with periodic boundary, a = b = 0.2 and ω_i spread evenly over
// [1 − Δ/2, 1 + Δ/2] (ω_i = 1 + Δ·(i/(N−1) − 1/2)); chains of this kind,
// with ω_i growing along the chain, are the classical setting of phase
// synchronisation of chaotic oscillators (Osipov, Pikovsky, Rosenblum &
// Kurths, Phys. Rev. E 55 (1997) 2353 (memory)). Integrated by RK4 with
// internal step ≤ 0.05 (λ1..λ3 of the single Rössler flow agree with step
// 0.01 to within their statistical error over 5000 time units, measured)
// and observed through x_0 (Obs = 0) or the mean field
// X = (1/N)·Σ x_i (Obs = 1). Each oscillator alone is chaotic for
// c ≳ 4.2 (Rössler, Phys. Lett. A 57 (1976) 397): with weak coupling the
// ring then has several positive exponents, a high-dimensional chaos (at
// N = 5, Δ = 0.05, c = 5.7 five for ε = 0.02, three for ε = 0.05, one for
// ε = 0.1 and 0.2 as the coupling synchronises the ring, measured over
// 3000 time units); for c below about
// 4.2 the oscillators are periodic and the ring moves on a torus or a
// locked cycle (λ1 = 0). The divergence is N(a − 2ε − c) + Σ x_i, so the
// exponents sum to its time average along the orbit (Liouville's formula).
type RosslerRing struct {
	N      int     // number of oscillators, ≥ 3
	Eps    float64 // diffusive coupling ε ≥ 0
	Spread float64 // detuning Δ: the ω_i span [1 − Δ/2, 1 + Δ/2]
	C      float64 // Rössler c, > 0
	Dt     float64 // sample interval in time units, > 0
	Obs    int     // 0 = x_0, 1 = mean field (1/N)·Σ x_i
	om     []float64
}

const (
	rosslerRingA         = 0.2
	rosslerRingB         = 0.2
	rosslerRingStep      = 0.05
	rosslerRingTransient = 300.0
)

// omega returns ω_i, from the precomputed table when there is one.
func (m RosslerRing) omega(i int) float64 {
	if m.om != nil {
		return m.om[i]
	}
	return 1 + m.Spread*(float64(i)/float64(m.N-1)-0.5)
}

// withOmegas returns m with the table of ω_i filled in (eval reads it in
// the hot loop instead of recomputing each ω_i; the values are the same).
func (m RosslerRing) withOmegas() RosslerRing {
	om := make([]float64, m.N)
	for i := range om {
		om[i] = m.omega(i)
	}
	m.om = om
	return m
}

func (m RosslerRing) dim() int { return 3 * m.N }

func (m RosslerRing) eval(dst, v []float64) {
	n := m.N
	for i := 0; i < n; i++ {
		l, r := i-1, i+1
		if l < 0 {
			l = n - 1
		}
		if r == n {
			r = 0
		}
		x, y, z := v[3*i], v[3*i+1], v[3*i+2]
		w := m.omega(i)
		dst[3*i] = -w*y - z + m.Eps*(v[3*r]-2*x+v[3*l])
		dst[3*i+1] = w*x + rosslerRingA*y
		dst[3*i+2] = rosslerRingB + z*(x-m.C)
	}
}

func (m RosslerRing) jacobian(j, v []float64) {
	d := m.dim()
	clear(j[:d*d])
	n := m.N
	for i := 0; i < n; i++ {
		l, r := (i+n-1)%n, (i+1)%n
		w := m.omega(i)
		rx, ry, rz := 3*i*d, (3*i+1)*d, (3*i+2)*d
		j[rx+3*i] -= 2 * m.Eps
		j[rx+3*r] += m.Eps
		j[rx+3*l] += m.Eps
		j[rx+3*i+1] = -w
		j[rx+3*i+2] = -1
		j[ry+3*i] = w
		j[ry+3*i+1] = rosslerRingA
		j[rz+3*i] = v[3*i+2]
		j[rz+3*i+2] = v[3*i] - m.C
	}
}

// tangent stores J(v)·w in dst in O(N): each oscillator's Rössler
// Jacobian plus the coupling's discrete Laplacian on the x components.
func (m RosslerRing) tangent(dst, v, w []float64) {
	n := m.N
	for i := 0; i < n; i++ {
		l, r := i-1, i+1
		if l < 0 {
			l = n - 1
		}
		if r == n {
			r = 0
		}
		om := m.omega(i)
		wx := w[3*i]
		dst[3*i] = -om*w[3*i+1] - w[3*i+2] + m.Eps*(w[3*r]-2*wx+w[3*l])
		dst[3*i+1] = om*wx + rosslerRingA*w[3*i+1]
		dst[3*i+2] = v[3*i+2]*wx + (v[3*i]-m.C)*w[3*i+2]
	}
}

// start draws the initial state of Generate: for every oscillator
// independently, (x_i, y_i, z_i) uniform in [1, 2) × [1, 2) × [0, 1)
// (the single Rössler flow's start box).
func (m RosslerRing) start(rng *rand.Rand) []float64 {
	v := make([]float64, m.dim())
	for i := 0; i < m.N; i++ {
		v[3*i] = 1 + rng.Float64()
		v[3*i+1] = 1 + rng.Float64()
		v[3*i+2] = rng.Float64()
	}
	return v
}

// observe returns the recorded quantity at state v.
func (m RosslerRing) observe(v []float64) float64 {
	if m.Obs == 0 {
		return v[0]
	}
	var s float64
	for i := 0; i < m.N; i++ {
		s += v[3*i]
	}
	return s / float64(m.N)
}

func (m RosslerRing) check() error {
	if m.N < 3 || !(m.Eps >= 0) || !(m.Spread >= 0 && m.Spread < 1) || !(m.C > 0) || math.IsInf(m.Eps+m.C, 0) {
		return fmt.Errorf("rossler-ring: %w: n = %d, eps = %g, spread = %g, c = %g, want n ≥ 3, eps ≥ 0, 0 ≤ spread < 1, c > 0", ErrParamRange, m.N, m.Eps, m.Spread, m.C)
	}
	if m.Obs < 0 || m.Obs > 1 {
		return fmt.Errorf("rossler-ring: %w: obs = %d, want 0 (x_0) or 1 (mean field)", ErrParamRange, m.Obs)
	}
	return nil
}

// Generate returns n samples of x_0 or the mean field after a transient
// of 300 time units, the RK4 step being the largest h ≤ 0.05 that divides
// Dt (as sampleFlow does).
func (m RosslerRing) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := m.check(); err != nil {
		return nil, err
	}
	if !(m.Dt > 0) || math.IsInf(m.Dt, 0) {
		return nil, fmt.Errorf("rossler-ring: dt = %g, want dt > 0", m.Dt)
	}
	v := m.start(rng)
	m = m.withOmegas()
	steps, h := substeps(m.Dt, rosslerRingStep)
	ig := newRK4(len(v))
	warm := int(math.Ceil(rosslerRingTransient / h))
	for i := 0; i < warm; i++ {
		ig.step(m.eval, v, h)
	}
	if !finite(v) {
		return nil, fmt.Errorf("rossler-ring: %w during the transient", ErrDiverged)
	}
	out := make([]float64, n)
	for i := range out {
		out[i] = m.observe(v)
		for k := 0; k < steps; k++ {
			ig.step(m.eval, v, h)
		}
		if !finite(v) {
			return nil, fmt.Errorf("rossler-ring: %w after %d samples", ErrDiverged, i+1)
		}
	}
	return out, nil
}

// rosslerRingClassStart is the fixed start of the parameter-only label
// rule: oscillator i at (1 + 0.1 i, 1, 0).
func rosslerRingClassStart(p map[string]float64) []float64 {
	n := int(p["n"])
	v := make([]float64, 3*n)
	for i := 0; i < n; i++ {
		v[3*i], v[3*i+1] = 1+0.1*float64(i), 1
	}
	return v
}

func init() {
	registerFlow(&System{
		Name:  "rossler-ring",
		Title: "ring of N diffusively coupled, detuned Rössler oscillators (observed x_0 or the mean field), RK4",
		Doc:   "dx_i/dt = -w_i y_i - z_i + eps (x_{i+1} - 2 x_i + x_{i-1}), dy_i/dt = w_i x_i + 0.2 y_i, dz_i/dt = 0.2 + z_i (x_i - c), periodic ring, w_i spread evenly over [1 - spread/2, 1 + spread/2]. High-dimensional chaos (three positive exponents at the defaults, five at eps = 0.02, one once strong coupling synchronises the ring) for c above about 4.3, a torus or locked cycle below; the exponents sum to the mean divergence N (0.2 - 2 eps - c) + Σ<x_i>. Internal RK4 step ≤ 0.05; transient 300 time units; each oscillator starts uniform in [1, 2) × [1, 2) × [0, 1). Label: chaotic when λ1 of the variational equations (sparse tangent, orbit from (1 + 0.1 i, 1, 0), 2000 time units after 300; per series from the drawn start) exceeds 0.01 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "n", Default: 5, Min: 3, Max: 8, Integer: true, Doc: "number of oscillators N"},
			{Name: "eps", Default: 0.05, Min: 0, Max: 0.5, Doc: "diffusive coupling ε (weak coupling leaves several exponents positive, strong coupling synchronises the ring)"},
			{Name: "spread", Default: 0.05, Min: 0, Max: 0.2, Doc: "detuning Δ: the angular frequencies span [1 - Δ/2, 1 + Δ/2]"},
			{Name: "c", Default: 5.7, Min: 2.5, Max: 10, Doc: "Rössler c (each oscillator alone: periodic below about 4.2, chaotic with windows above)"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units); one loop takes about 6 time units"},
			obsParam("x_0", "mean field (1/N) Σ x_i"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: math.NaN(), Unit: "per time unit", Source: "analytic: Liouville's formula, the time average of the divergence N (a - 2 eps - c) + Σ x_i along the orbit"},
		},
		DefaultClass: Chaotic,
		threshold:    0.01,
	}, func(p map[string]float64) RosslerRing {
		return RosslerRing{N: int(p["n"]), Eps: p["eps"], Spread: p["spread"], C: p["c"], Dt: p["dt"], Obs: int(p["obs"])}.withOmegas()
	}, rosslerRingClassStart, flowRule{h: rosslerRingStep, transient: rosslerRingTransient, span: 2000, renorm: 1, k: 1})
}
