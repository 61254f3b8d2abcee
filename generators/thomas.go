package generators

import (
	"math"
	"math/rand/v2"
)

// Thomas is Thomas' cyclically symmetric flow (Thomas, Int. J. Bifurcation
// Chaos 9 (1999) 1889)
//
//	dx/dt = sin y − b·x,  dy/dt = sin z − b·y,  dz/dt = sin x − b·z,
//
// integrated by RK4 with internal step ≤ 0.05 and observed through x
// (Obs = 0; y, z with Obs = 1, 2). Its divergence is −3b everywhere, so
// the exponents sum to −3b (analytic). b is the damping: for b ≈ 0.1–0.2
// the motion is weakly and slowly chaotic (λ1 of a few hundredths per time
// unit), above b ≈ 0.21 it is periodic, and as b → 0 it becomes a
// conservative "labyrinth" walk.
type Thomas struct {
	B   float64
	Dt  float64 // sample interval in time units, > 0
	Obs int     // observed coordinate: 0 = x, 1 = y, 2 = z
}

const (
	thomasStep      = 0.05
	thomasTransient = 1000.0
)

func (m Thomas) dim() int { return 3 }

func (m Thomas) eval(dst, v []float64) {
	sx, sy, sz := math.Sin(v[0]), math.Sin(v[1]), math.Sin(v[2])
	dst[0] = sy - m.B*v[0]
	dst[1] = sz - m.B*v[1]
	dst[2] = sx - m.B*v[2]
}

func (m Thomas) jacobian(j, v []float64) {
	j[0], j[1], j[2] = -m.B, math.Cos(v[1]), 0
	j[3], j[4], j[5] = 0, -m.B, math.Cos(v[2])
	j[6], j[7], j[8] = math.Cos(v[0]), 0, -m.B
}

// start draws the initial state of Generate: uniform in [−2, 2)³.
func (m Thomas) start(rng *rand.Rand) []float64 {
	return []float64{4*rng.Float64() - 2, 4*rng.Float64() - 2, 4*rng.Float64() - 2}
}

// Generate returns n samples of the observed coordinate after a transient
// of 1000 time units.
func (m Thomas) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("thomas", m, m.start(rng), n, m.Dt, thomasStep, thomasTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "thomas",
		Title: "Thomas cyclically symmetric flow dx/dt = sin y - b x, ... (observed x), RK4",
		Doc:   "Weak, slow chaos for b ≈ 0.1-0.2, periodic above b ≈ 0.21 (Thomas 1999); the exponents sum to -3b. Internal RK4 step ≤ 0.05; transient 1000 time units. Label: chaotic when λ1 of the variational equations (orbit from (0.1, 0, 0), 4000 time units after 1000; per series from the drawn start) exceeds 0.005 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "b", Default: 0.18, Min: 0.1, Max: 0.3, Doc: "damping b"},
			{Name: "dt", Default: 0.5, Min: 0.01, Max: 10, Doc: "sample interval (time units); the orbits turn in tens of time units"},
			obsParam("x", "y", "z"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: -3 * 0.18, Unit: "per time unit", Source: "analytic: divergence of the vector field -3b"},
		},
		DefaultClass: Chaotic,
		threshold:    0.005,
	}, func(p map[string]float64) Thomas {
		return Thomas{B: p["b"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(0.1, 0, 0), flowRule{h: thomasStep, transient: thomasTransient, span: 4000, renorm: 1})
}
