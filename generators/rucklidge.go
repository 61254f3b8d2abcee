package generators

import "math/rand/v2"

// Rucklidge is the Rucklidge model of double convection (Rucklidge,
// J. Fluid Mech. 237 (1992) 209)
//
//	dx/dt = −κ·x + λ·y − y·z,  dy/dt = x,  dz/dt = −z + y²,
//
// integrated by RK4 with internal step ≤ 0.01 and observed through x
// (Obs = 0; y, z with Obs = 1, 2). Its divergence is −(κ + 1)
// everywhere, so the exponents sum to −(κ + 1) (analytic); at κ = 2,
// λ = 6.7 it is chaotic.
type Rucklidge struct {
	Kappa, Lambda float64
	Dt            float64 // sample interval in time units, > 0
	Obs           int     // observed coordinate: 0 = x, 1 = y, 2 = z
}

const (
	rucklidgeStep      = 0.01
	rucklidgeTransient = 200.0
)

func (m Rucklidge) dim() int { return 3 }

func (m Rucklidge) eval(dst, v []float64) {
	x, y, z := v[0], v[1], v[2]
	dst[0] = -m.Kappa*x + m.Lambda*y - y*z
	dst[1] = x
	dst[2] = -z + y*y
}

func (m Rucklidge) jacobian(j, v []float64) {
	y, z := v[1], v[2]
	j[0], j[1], j[2] = -m.Kappa, m.Lambda-z, -y
	j[3], j[4], j[5] = 1, 0, 0
	j[6], j[7], j[8] = 0, 2*y, -1
}

// start draws the initial state of Generate: uniform in [0.5, 1.5)³.
func (m Rucklidge) start(rng *rand.Rand) []float64 {
	return []float64{0.5 + rng.Float64(), 0.5 + rng.Float64(), 0.5 + rng.Float64()}
}

// Generate returns n samples of the observed coordinate after a transient
// of 200 time units.
func (m Rucklidge) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("rucklidge", m, m.start(rng), n, m.Dt, rucklidgeStep, rucklidgeTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "rucklidge",
		Title: "Rucklidge double-convection model (observed x), RK4",
		Doc:   "dx/dt = -kappa x + lambda y - y z, dy/dt = x, dz/dt = -z + y²; chaotic at kappa = 2, lambda = 6.7 (Rucklidge 1992), periodic windows nearby. The exponents sum to -(kappa + 1). Internal RK4 step ≤ 0.01; transient 200 time units. Label: chaotic when λ1 of the variational equations (orbit from (1, 1, 1), 1500 time units after 200; per series from the drawn start) exceeds 0.01 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "kappa", Default: 2, Min: 1, Max: 3, Doc: "damping κ"},
			{Name: "lambda", Default: 6.7, Min: 3, Max: 10, Doc: "forcing λ"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units)"},
			obsParam("x", "y", "z"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: -3, Unit: "per time unit", Source: "analytic: divergence of the vector field -(κ + 1)"},
		},
		DefaultClass: Chaotic,
		threshold:    0.01,
	}, func(p map[string]float64) Rucklidge {
		return Rucklidge{Kappa: p["kappa"], Lambda: p["lambda"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(1, 1, 1), flowRule{h: rucklidgeStep, transient: rucklidgeTransient, span: 1500, renorm: 1})
}
