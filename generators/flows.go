package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Lorenz is the Lorenz flow dx/dt = σ(y − x), dy/dt = x(ρ − z) − y,
// dz/dt = xy − βz, integrated with the classical fourth-order Runge–Kutta
// scheme and observed through x every Dt time units. The internal step is
// the largest h ≤ 0.005 that divides Dt into whole steps (RK4 at h = 0.005
// keeps the global error on this attractor far below the sampling scale;
// common practice). At σ = 10, ρ = 28, β = 8/3, λ1 ≈ 0.9056 per time unit
// (Sprott 2003) and the exponents sum to −(σ + 1 + β).
type Lorenz struct {
	Sigma, Rho, Beta float64
	Dt               float64 // sample interval in time units, > 0
}

// lorenzTransient is the time discarded before sampling (time units).
const lorenzTransient = 50.0

// maxStep is the largest internal integration step of the flows here.
const maxStep = 0.005

// Generate returns n samples of x after a transient of 50 time units,
// started from a random point near (1, 1, 20).
func (m Lorenz) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(m.Dt > 0) {
		return nil, fmt.Errorf("lorenz: dt = %g, want dt > 0", m.Dt)
	}
	steps, h := substeps(m.Dt)
	s := [3]float64{1 + rng.Float64(), 1 + rng.Float64(), 20 + rng.Float64()}
	f := func(v [3]float64) [3]float64 {
		return [3]float64{
			m.Sigma * (v[1] - v[0]),
			v[0]*(m.Rho-v[2]) - v[1],
			v[0]*v[1] - m.Beta*v[2],
		}
	}
	warm := int(math.Ceil(lorenzTransient / h))
	for i := 0; i < warm; i++ {
		s = rk4(f, s, h)
	}
	out := make([]float64, n)
	for i := 0; i < n; i++ {
		out[i] = s[0]
		for k := 0; k < steps; k++ {
			s = rk4(f, s, h)
		}
		if math.IsNaN(s[0]) || math.Abs(s[0]) > 1e9 {
			return nil, fmt.Errorf("lorenz: integration diverged")
		}
	}
	return out, nil
}

// substeps returns the number of internal steps per sample and their size.
func substeps(dt float64) (int, float64) {
	k := int(math.Ceil(dt/maxStep - 1e-9))
	if k < 1 {
		k = 1
	}
	return k, dt / float64(k)
}

// rk4 advances the state v of dv/dt = f(v) by one classical Runge–Kutta step h.
func rk4(f func([3]float64) [3]float64, v [3]float64, h float64) [3]float64 {
	k1 := f(v)
	var t [3]float64
	for i := range t {
		t[i] = v[i] + 0.5*h*k1[i]
	}
	k2 := f(t)
	for i := range t {
		t[i] = v[i] + 0.5*h*k2[i]
	}
	k3 := f(t)
	for i := range t {
		t[i] = v[i] + h*k3[i]
	}
	k4 := f(t)
	for i := range v {
		v[i] += h / 6 * (k1[i] + 2*k2[i] + 2*k3[i] + k4[i])
	}
	return v
}

func init() {
	register(&System{
		Name:  "lorenz",
		Title: "Lorenz flow (observed x), RK4",
		Doc:   "Chaotic at σ = 10, ρ = 28, β = 8/3. Internal RK4 step ≤ 0.005 time units; transient 50 time units.",
		Params: []Param{
			{Name: "sigma", Default: 10, Min: 0.1, Max: 100, Doc: "Prandtl number σ"},
			{Name: "rho", Default: 28, Min: 0, Max: 500, Doc: "Rayleigh number ρ"},
			{Name: "beta", Default: 8.0 / 3.0, Min: 0.01, Max: 20, Doc: "geometric factor β"},
			{Name: "dt", Default: 0.01, Min: 1e-4, Max: 1, Doc: "sample interval (time units)"},
		},
		Invariants: []Invariant{
			{Name: "lyap_max", Value: 0.9056, Unit: "per time unit", Source: "Sprott, Chaos and Time-Series Analysis (2003) (memory)"},
			{Name: "lyap_sum", Value: -(10 + 1 + 8.0/3.0), Unit: "per time unit", Source: "analytic: divergence of the vector field -(σ + 1 + β)"},
			{Name: "corr_dim", Value: 2.05, Unit: "", Source: "Grassberger & Procaccia, Physica D 9 (1983) 189 (memory)"},
		},
		TimeAxis: "time",
		label:    fixed(Chaotic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return Lorenz{Sigma: p["sigma"], Rho: p["rho"], Beta: p["beta"], Dt: p["dt"]}, p["dt"], nil
		},
	})
}
