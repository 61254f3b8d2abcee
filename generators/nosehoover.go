package generators

import "math/rand/v2"

// NoseHoover is the Nosé–Hoover oscillator, a harmonic oscillator
// thermostatted by a friction variable (Hoover, Phys. Rev. A 31 (1985)
// 1695), in the form of Sprott's system A (Sprott, Phys. Rev. E 50 (1994)
// R647):
//
//	dx/dt = y,  dy/dt = −x + y·z,  dz/dt = 1 − y²,
//
// integrated by RK4 with internal step ≤ 0.01 and observed through x
// (Obs = 0; y, z with Obs = 1, 2). It is time-reversible and conservative
// on average: the divergence is z and H = (x² + y² + z²)/2 obeys
// dH/dt = z, so along a bounded orbit the time average of z, which is the
// sum of the exponents, is zero (analytic). Its phase space is mixed: a
// chaotic sea (λ1 ≈ 0.014 per time unit from (0, 5, 0), Sprott 1994
// (memory)) surrounds nested invariant tori (λ1 = 0), so the label
// depends on the initial condition.
type NoseHoover struct {
	Dt  float64 // sample interval in time units, > 0
	Obs int     // observed coordinate: 0 = x, 1 = y, 2 = z
}

const (
	noseHooverStep      = 0.01
	noseHooverTransient = 100.0
)

func (m NoseHoover) dim() int { return 3 }

func (m NoseHoover) eval(dst, v []float64) {
	dst[0] = v[1]
	dst[1] = -v[0] + v[1]*v[2]
	dst[2] = 1 - v[1]*v[1]
}

func (m NoseHoover) jacobian(j, v []float64) {
	j[0], j[1], j[2] = 0, 1, 0
	j[3], j[4], j[5] = -1, v[2], v[1]
	j[6], j[7], j[8] = 0, -2*v[1], 0
}

// start draws the initial state of Generate: x = z = 0 and y uniform in
// [0.25, 6), a line that crosses the nested tori (y0 below about 4.3) and
// the chaotic sea (above). y0 = 0 is excluded: the z axis is invariant and
// z grows without bound along it.
func (m NoseHoover) start(rng *rand.Rand) []float64 {
	return []float64{0, 0.25 + 5.75*rng.Float64(), 0}
}

// Generate returns n samples of the observed coordinate after a transient
// of 100 time units.
func (m NoseHoover) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("nose-hoover", m, m.start(rng), n, m.Dt, noseHooverStep, noseHooverTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "nose-hoover",
		Title: "Nosé–Hoover oscillator (Sprott system A) dx/dt = y, dy/dt = -x + y z, dz/dt = 1 - y² (observed x), RK4",
		Doc:   "Conservative on average and time-reversible, with a mixed phase space: a chaotic sea (from (0, 5, 0)) and invariant tori, so the same equations give chaotic and quasi-periodic series depending on the start, drawn as (0, y0, 0) with y0 uniform in [0.25, 6) (tori below y0 ≈ 4.3, the sea above). The exponents sum to zero on average. Internal RK4 step ≤ 0.01; transient 100 time units. Label (per series): chaotic when λ1 of the variational equations (3000 time units after the transient, from the drawn start) exceeds 0.005 per time unit, otherwise regular; the parameter-only label (Class) follows the orbit from (0, 5, 0).",
		Params: []Param{
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units); the oscillator period is about 2π"},
			obsParam("x", "y", "z"),
		},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0.014, Unit: "per time unit", Source: "Sprott, Phys. Rev. E 50 (1994) R647 (memory), chaotic sea from (0, 5, 0)"},
			{Name: "lyap_sum", Value: 0, Unit: "per time unit", Source: "analytic: divergence z, and dH/dt = z with H = (x² + y² + z²)/2 bounded"},
		},
		DefaultClass: Chaotic,
		threshold:    0.005,
	}, func(p map[string]float64) NoseHoover {
		return NoseHoover{Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(0, 5, 0), flowRule{h: noseHooverStep, transient: noseHooverTransient, span: 3000, renorm: 1})
}
