package generators

import "math/rand/v2"

// HyperRossler is Rössler's four-dimensional hyperchaotic flow
// dx/dt = −y − z, dy/dt = x + a·y + w, dz/dt = b + x·z, dw/dt = −c·z + d·w
// (Rössler, Phys. Lett. A 71 (1979) 155), integrated by RK4 with internal
// step ≤ 0.005 and observed through x (Obs = 0; y, z, w with Obs = 1, 2,
// 3). At a = 0.25, b = 3, c = 0.5,
// d = 0.05 it has two positive Lyapunov exponents.
type HyperRossler struct {
	A, B, C, D float64
	Dt         float64 // sample interval in time units, > 0
	Obs        int     // observed coordinate: 0 = x, 1 = y, 2 = z, 3 = w
}

const (
	hyperRosslerStep      = 0.005
	hyperRosslerTransient = 300.0
)

func (m HyperRossler) dim() int { return 4 }

func (m HyperRossler) eval(dst, v []float64) {
	dst[0] = -v[1] - v[2]
	dst[1] = v[0] + m.A*v[1] + v[3]
	dst[2] = m.B + v[0]*v[2]
	dst[3] = -m.C*v[2] + m.D*v[3]
}

func (m HyperRossler) jacobian(j, v []float64) {
	j[0], j[1], j[2], j[3] = 0, -1, -1, 0
	j[4], j[5], j[6], j[7] = 1, m.A, 0, 1
	j[8], j[9], j[10], j[11] = v[2], 0, v[0], 0
	j[12], j[13], j[14], j[15] = 0, 0, -m.C, m.D
}

// start draws the initial state of Generate: within 0.5 of
// (−10, −6, 0, 10), z = 0.
func (m HyperRossler) start(rng *rand.Rand) []float64 {
	return []float64{-10 + rng.Float64() - 0.5, -6 + rng.Float64() - 0.5, 0, 10 + rng.Float64() - 0.5}
}

// Generate returns n samples of the observed coordinate after a transient
// of 300 time units, started within 0.5 of (−10, −6, 0, 10).
func (m HyperRossler) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("hyper-rossler", m, m.start(rng), n, m.Dt, hyperRosslerStep, hyperRosslerTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "hyper-rossler",
		Title: "Rössler hyperchaotic flow (4-D, observed x), RK4",
		Doc:   "Hyperchaotic at a = 0.25, b = 3, c = 0.5, d = 0.05 (two positive exponents). Internal RK4 step ≤ 0.005; transient 300 time units. The coefficients are fixed at the classical set: small changes (a = 0.2 or 0.3, c = 0.55, d = 0.04 or 0.06) already let orbits escape. Label: chaotic when λ1 of the variational equations (orbit from (-10, -6, 0, 10), 2000 time units after 300; per series from the drawn start over 1000 time units, where λ1 ≈ 0.1) exceeds 0.02 per time unit.",
		Params: []Param{
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units)"},
			obsParam("x", "y", "z", "w"),
		},
		DefaultClass: Chaotic,
		threshold:    0.02,
	}, func(p map[string]float64) HyperRossler {
		return HyperRossler{A: 0.25, B: 3, C: 0.5, D: 0.05, Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(-10, -6, 0, 10), flowRule{h: hyperRosslerStep, transient: hyperRosslerTransient, span: 2000, renorm: 1, seriesSpan: 1000})
}
