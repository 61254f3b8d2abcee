package generators

import "math/rand/v2"

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

// maxStep is the largest internal integration step of the Lorenz flow.
const maxStep = 0.005

func (m Lorenz) dim() int { return 3 }

func (m Lorenz) eval(dst, v []float64) {
	dst[0] = m.Sigma * (v[1] - v[0])
	dst[1] = v[0]*(m.Rho-v[2]) - v[1]
	dst[2] = v[0]*v[1] - m.Beta*v[2]
}

func (m Lorenz) jacobian(j, v []float64) {
	j[0], j[1], j[2] = -m.Sigma, m.Sigma, 0
	j[3], j[4], j[5] = m.Rho-v[2], -1, -v[0]
	j[6], j[7], j[8] = v[1], v[0], -m.Beta
}

// Generate returns n samples of x after a transient of 50 time units,
// started from a random point of [1, 2) × [1, 2) × [20, 21).
func (m Lorenz) Generate(n int, rng *rand.Rand) ([]float64, error) {
	v := []float64{1 + rng.Float64(), 1 + rng.Float64(), 20 + rng.Float64()}
	return sampleFlow("lorenz", m, v, n, m.Dt, maxStep, lorenzTransient, 0)
}

// lorenzLyap is the label rule's spectrum: the orbit from (1, 1, 20), 50
// time units of transient, 300 time units averaged, RK4 at h = 0.005,
// re-orthonormalised every 0.5 time units.
func lorenzLyap(p map[string]float64) (Spectrum, error) {
	m := Lorenz{Sigma: p["sigma"], Rho: p["rho"], Beta: p["beta"]}
	return flowSpectrum(m, []float64{1, 1, 20}, maxStep, lorenzTransient, 300, 0.5, 3)
}

func init() {
	lorenzParams := func(rho float64) []Param {
		return []Param{
			{Name: "sigma", Default: 10, Min: 6, Max: 20, Doc: "Prandtl number σ"},
			{Name: "rho", Default: rho, Min: 24.8, Max: 400, Doc: "Rayleigh number ρ (above 24.74 the two non-trivial fixed points are unstable at σ = 10, β = 8/3)"},
			{Name: "beta", Default: 8.0 / 3.0, Min: 0.5, Max: 4, Doc: "geometric factor β"},
			{Name: "dt", Default: 0.01, Min: 1e-4, Max: 1, Doc: "sample interval (time units)"},
		}
	}
	build := func(p map[string]float64) (Generator, float64, error) {
		return Lorenz{Sigma: p["sigma"], Rho: p["rho"], Beta: p["beta"], Dt: p["dt"]}, p["dt"], nil
	}
	const rule = " Label: chaotic when λ1 of the variational equations (orbit from (1, 1, 20), 300 time units after 50 of transient) exceeds 0.05 per time unit, otherwise regular."
	register(&System{
		Name:   "lorenz",
		Title:  "Lorenz flow (observed x), RK4",
		Doc:    "Chaotic at σ = 10, ρ = 28, β = 8/3. Internal RK4 step ≤ 0.005 time units; transient 50 time units." + rule,
		Params: lorenzParams(28),
		Invariants: []Invariant{
			{Name: "lyap_max", Value: 0.9056, Unit: "per time unit", Source: "Sprott, Chaos and Time-Series Analysis (2003) (memory)"},
			{Name: "lyap_sum", Value: -(10 + 1 + 8.0/3.0), Unit: "per time unit", Source: "analytic: divergence of the vector field -(σ + 1 + β)"},
			{Name: "corr_dim", Value: 2.05, Unit: "", Source: "Grassberger & Procaccia, Physica D 9 (1983) 189 (memory)"},
		},
		TimeAxis:     AxisTime,
		DefaultClass: Chaotic,
		lyap:         lorenzLyap,
		threshold:    0.05,
		build:        build,
	})
	register(&System{
		Name:   "lorenz-periodic",
		Title:  "Lorenz flow at ρ = 350 (stable periodic orbit), RK4",
		Doc:    "The Lorenz entry preset to ρ = 350, where the attractor is a periodic orbit; the label rule is the Lorenz one, so moving ρ back into the chaotic range relabels it." + rule,
		Params: lorenzParams(350),
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: -(10 + 1 + 8.0/3.0), Unit: "per time unit", Source: "analytic: divergence of the vector field -(σ + 1 + β)"},
		},
		TimeAxis:     AxisTime,
		DefaultClass: Regular,
		lyap:         lorenzLyap,
		threshold:    0.05,
		build:        build,
	})
}
