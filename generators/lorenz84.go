package generators

import "math/rand/v2"

// Lorenz84 is Lorenz's 1984 low-order model of the general circulation
// (Lorenz, Tellus A 36 (1984) 98)
//
//	dx/dt = −y² − z² − a·x + a·F,
//	dy/dt = x·y − b·x·z − y + G,
//	dz/dt = b·x·y + x·z − z,
//
// with x the strength of the westerly jet and (y, z) a travelling eddy,
// integrated by RK4 with internal step ≤ 0.01 and observed through x
// (Obs = 0; y, z with Obs = 1, 2). One time unit is about five days. The
// divergence is 2x − 2 − a, so the sum of the exponents is the orbit
// average 2⟨x⟩ − 2 − a (analytic, Liouville's formula). At a = 0.25,
// b = 4, F = 8, G = 1 the motion is slow and irregular (chaotic); smaller
// forcings give periodic and quasi-periodic circulations.
type Lorenz84 struct {
	A, B, F, G float64
	Dt         float64 // sample interval in time units, > 0
	Obs        int     // observed coordinate: 0 = x, 1 = y, 2 = z
}

const (
	lorenz84Step      = 0.01
	lorenz84Transient = 200.0
)

func (m Lorenz84) dim() int { return 3 }

func (m Lorenz84) eval(dst, v []float64) {
	x, y, z := v[0], v[1], v[2]
	dst[0] = -y*y - z*z - m.A*x + m.A*m.F
	dst[1] = x*y - m.B*x*z - y + m.G
	dst[2] = m.B*x*y + x*z - z
}

func (m Lorenz84) jacobian(j, v []float64) {
	x, y, z := v[0], v[1], v[2]
	j[0], j[1], j[2] = -m.A, -2*y, -2*z
	j[3], j[4], j[5] = y-m.B*z, x-1, -m.B*x
	j[6], j[7], j[8] = m.B*y+z, m.B*x, x-1
}

// start draws the initial state of Generate: uniform in [0, 2) × [−1, 1)².
func (m Lorenz84) start(rng *rand.Rand) []float64 {
	return []float64{2 * rng.Float64(), 2*rng.Float64() - 1, 2*rng.Float64() - 1}
}

// Generate returns n samples of the observed coordinate after a transient
// of 200 time units.
func (m Lorenz84) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("lorenz84", m, m.start(rng), n, m.Dt, lorenz84Step, lorenz84Transient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "lorenz84",
		Title: "Lorenz-84 general-circulation model (observed jet strength x), RK4",
		Doc:   "dx/dt = -y² - z² - a x + a F, dy/dt = x y - b x z - y + G, dz/dt = b x y + x z - z; slow irregular (chaotic) circulation at a = 0.25, b = 4, F = 8, G = 1 (Lorenz 1984), periodic and quasi-periodic for weaker forcing. Internal RK4 step ≤ 0.01; transient 200 time units. Label: chaotic when λ1 of the variational equations (orbit from (1, 0, 0), 1500 time units after 200; per series from the drawn start) exceeds 0.02 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "a", Default: 0.25, Min: 0.2, Max: 0.3, Doc: "damping a of the jet"},
			{Name: "b", Default: 4, Min: 3, Max: 5, Doc: "advection b of the eddies by the jet"},
			{Name: "f", Default: 8, Min: 5, Max: 10, Doc: "symmetric thermal forcing F"},
			{Name: "g", Default: 1, Min: 0.5, Max: 1.3, Doc: "asymmetric thermal forcing G (from G ≈ 1.4 the circulation settles on a steady state)"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units of about five days)"},
			obsParam("x", "y", "z"),
		},
		DefaultClass: Chaotic,
		threshold:    0.02,
	}, func(p map[string]float64) Lorenz84 {
		return Lorenz84{A: p["a"], B: p["b"], F: p["f"], G: p["g"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(1, 0, 0), flowRule{h: lorenz84Step, transient: lorenz84Transient, span: 1500, renorm: 1})
}
