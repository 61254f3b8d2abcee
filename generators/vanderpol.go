package generators

import "math/rand/v2"

// VanDerPol is the van der Pol oscillator x” − μ(1 − x²)x' + x = 0,
// written as x' = y, y' = μ(1 − x²)y − x (van der Pol, Phil. Mag. 2 (1926)
// 978). For every μ > 0 it has one attracting limit cycle, so its motion
// after the transient is periodic: λ1 = 0 (the flow direction) and the other
// exponent is negative. Integrated by RK4 with internal step ≤ 0.01 and
// observed through x (Obs = 0) or y = x' (Obs = 1).
type VanDerPol struct {
	Mu  float64
	Dt  float64 // sample interval in time units, > 0
	Obs int     // observed coordinate: 0 = x, 1 = y
}

const (
	vdpStep      = 0.01
	vdpTransient = 200.0
)

func (m VanDerPol) dim() int { return 2 }

func (m VanDerPol) eval(dst, v []float64) {
	dst[0] = v[1]
	dst[1] = m.Mu*(1-v[0]*v[0])*v[1] - v[0]
}

func (m VanDerPol) jacobian(j, v []float64) {
	j[0], j[1] = 0, 1
	j[2], j[3] = -2*m.Mu*v[0]*v[1]-1, m.Mu*(1-v[0]*v[0])
}

// start draws the initial state of Generate: uniform in [−1, 1)².
func (m VanDerPol) start(rng *rand.Rand) []float64 {
	return []float64{2*rng.Float64() - 1, 2*rng.Float64() - 1}
}

// Generate returns n samples of the observed coordinate after a transient
// of 200 time units, started from a random point of [−1, 1)².
func (m VanDerPol) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("van-der-pol", m, m.start(rng), n, m.Dt, vdpStep, vdpTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "van-der-pol",
		Title: "van der Pol limit-cycle oscillator (observed x), RK4",
		Doc:   "Periodic limit cycle for every mu > 0: near-sinusoidal for small mu, relaxation oscillation for large mu. Internal RK4 step ≤ 0.01; transient 200 time units. Label: the flow label rule (chaotic when λ1 of the variational equations, orbit from (1, 0), 1000 time units after 200, exceeds 0.02 per time unit) gives regular throughout the range.",
		Params: []Param{
			{Name: "mu", Default: 1, Min: 0.1, Max: 5, Doc: "nonlinearity μ"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 1, Doc: "sample interval (time units); the period is 2π at small μ"},
			obsParam("x", "y = x'"),
		},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0, Unit: "per time unit", Source: "analytic: an attracting limit cycle of an autonomous flow"},
		},
		DefaultClass: Regular,
		threshold:    0.02,
	}, func(p map[string]float64) VanDerPol {
		return VanDerPol{Mu: p["mu"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(1, 0), flowRule{h: vdpStep, transient: vdpTransient, span: 1000, renorm: 1})
}
