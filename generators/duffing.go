package generators

import (
	"math"
	"math/rand/v2"
)

// Duffing is the forced Duffing oscillator
// x” + δ·x' + α·x + β·x³ = γ·cos(ω·t), written autonomously with the
// forcing phase θ = ωt as a third coordinate (reduced modulo 2π between
// samples) and observed through x (Obs = 0) or the velocity x' (Obs = 1).
// At δ = 0.3, α = −1, β = 1, γ = 0.5, ω = 1.2 (the double-well oscillator) it is chaotic. The divergence of the
// field is −δ, so λ1 + λ2 = −δ beside the zero exponent of the phase
// (analytic). Integrated by RK4 with internal step ≤ 0.01.
type Duffing struct {
	Delta, Alpha, Beta, Gamma, Omega float64
	Dt                               float64 // sample interval in time units, > 0
	Obs                              int     // observed coordinate: 0 = x, 1 = x'
}

const (
	duffingStep      = 0.01
	duffingTransient = 300.0
)

// duffingRule is the label rule: 300 time units of transient, 2000
// averaged, re-orthonormalised every time unit; Class starts from (1, 0, 0).
var duffingRule = flowRule{h: duffingStep, transient: duffingTransient, span: 2000, renorm: 1}

func (m Duffing) dim() int { return 3 }

func (m Duffing) eval(dst, v []float64) {
	x := v[0]
	dst[0] = v[1]
	dst[1] = -m.Delta*v[1] - m.Alpha*x - m.Beta*x*x*x + m.Gamma*math.Cos(v[2])
	dst[2] = m.Omega
}

func (m Duffing) jacobian(j, v []float64) {
	x := v[0]
	j[0], j[1], j[2] = 0, 1, 0
	j[3], j[4], j[5] = -m.Alpha-3*m.Beta*x*x, -m.Delta, -m.Gamma*math.Sin(v[2])
	j[6], j[7], j[8] = 0, 0, 0
}

func (m Duffing) wrap(v []float64) {
	if v[2] >= 2*math.Pi || v[2] < 0 {
		v[2] = math.Mod(v[2], 2*math.Pi)
		if v[2] < 0 {
			v[2] += 2 * math.Pi
		}
	}
}

// start draws the initial state of Generate: (x, x') uniform in
// [0.5, 1.5) × [−0.5, 0.5) at forcing phase 0.
func (m Duffing) start(rng *rand.Rand) []float64 {
	return []float64{0.5 + rng.Float64(), rng.Float64() - 0.5, 0}
}

// Generate returns n samples of the observed coordinate after a transient
// of 300 time units, started from a random point of [0.5, 1.5) × [−0.5, 0.5)
// at forcing phase 0. The forcing phase itself is not observable (Obs ≤ 1).
func (m Duffing) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkObs("duffing", m.Obs, 2); err != nil {
		return nil, err
	}
	return sampleFlow("duffing", m, m.start(rng), n, m.Dt, duffingStep, duffingTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "duffing",
		Title: "forced Duffing oscillator x'' + delta x' + alpha x + beta x³ = gamma cos(omega t) (observed x), RK4",
		Doc:   "Chaotic double-well oscillator at delta = 0.3, alpha = -1, beta = 1, gamma = 0.5, omega = 1.2; smaller forcing gives periodic motion. Internal RK4 step ≤ 0.01; transient 300 time units. Label: chaotic when λ1 of the variational equations (orbit from (1, 0, 0), 2000 time units after 300) exceeds 0.02 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "delta", Default: 0.3, Min: 0.05, Max: 1, Doc: "damping δ"},
			{Name: "alpha", Default: -1, Min: -2, Max: 2, Doc: "linear stiffness α (negative: double well)"},
			{Name: "beta", Default: 1, Min: 0.1, Max: 5, Doc: "cubic stiffness β"},
			{Name: "gamma", Default: 0.5, Min: 0.1, Max: 2, Doc: "forcing amplitude γ"},
			{Name: "omega", Default: 1.2, Min: 0.1, Max: 5, Doc: "forcing angular frequency ω"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 1, Doc: "sample interval (time units); the forcing period is 2π/ω"},
			obsParam("x", "velocity x'"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: -0.3, Unit: "per time unit", Source: "analytic: divergence of the vector field is -δ"},
		},
		DefaultClass: Chaotic,
		threshold:    0.02,
	}, func(p map[string]float64) Duffing {
		return Duffing{Delta: p["delta"], Alpha: p["alpha"], Beta: p["beta"], Gamma: p["gamma"], Omega: p["omega"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(1, 0, 0), duffingRule)
}
