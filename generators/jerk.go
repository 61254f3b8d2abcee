package generators

import "math/rand/v2"

// Jerk is Sprott's simplest dissipative chaotic jerk flow
// d³x/dt³ = −A·d²x/dt² + (dx/dt)² − x (Sprott, Phys. Lett. A 228 (1997) 271),
// written as dx/dt = y, dy/dt = z, dz/dt = −A·z + y² − x, integrated by RK4
// with internal step ≤ 0.01 and observed through x (Obs = 0; y, z with
// Obs = 1, 2). Its divergence is −A everywhere, so the exponents sum to
// −A (analytic). At A = 2.017 it is chaotic with λ1 ≈ 0.055 per time unit
// (Sprott 1997 (memory)). Below A ≈ 2.017 the bounded attractor is gone
// (every orbit escapes); above it the chaos persists to A ≈ 2.05 and gives
// way to periodic orbits (λ1 = 0) from A ≈ 2.06 to the range's end, 2.28.
type Jerk struct {
	A   float64
	Dt  float64 // sample interval in time units, > 0
	Obs int     // observed coordinate: 0 = x, 1 = x', 2 = x''
}

const (
	jerkStep      = 0.01
	jerkTransient = 500.0
)

func (m Jerk) dim() int { return 3 }

func (m Jerk) eval(dst, v []float64) {
	dst[0] = v[1]
	dst[1] = v[2]
	dst[2] = -m.A*v[2] + v[1]*v[1] - v[0]
}

func (m Jerk) jacobian(j, v []float64) {
	j[0], j[1], j[2] = 0, 1, 0
	j[3], j[4], j[5] = 0, 0, 1
	j[6], j[7], j[8] = -1, 2*v[1], -m.A
}

// start draws the initial state of Generate: uniform within 0.01 of
// (0.43, 1.42, −0.3). The basin of the bounded attractor is small and
// interleaved with escaping orbits; this box lies inside it for every
// A in [2.017, 2.28] (none of 200 drawn starts escaped at nine values of
// A across the range, while 10 of 200 escape at A = 2.3 and boxes ten
// times wider lose up to half of their starts).
func (m Jerk) start(rng *rand.Rand) []float64 {
	return []float64{0.42 + 0.02*rng.Float64(), 1.41 + 0.02*rng.Float64(), -0.31 + 0.02*rng.Float64()}
}

// Generate returns n samples of the observed coordinate after a transient
// of 500 time units.
func (m Jerk) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("jerk", m, m.start(rng), n, m.Dt, jerkStep, jerkTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "jerk",
		Title: "Sprott's simplest chaotic jerk x''' = -A x'' + (x')² - x (observed x), RK4",
		Doc:   "Chaotic at A = 2.017 (Sprott 1997) up to A ≈ 2.05, periodic from A ≈ 2.06 on; below 2.017 every orbit escapes, so A starts there, and it stops at 2.28, where drawn starts begin to leave the basin. The exponents sum to -A. Internal RK4 step ≤ 0.01; transient 500 time units; starts in a small box inside the basin of the bounded attractor. Label: chaotic when λ1 of the variational equations (orbit from (0.43, 1.42, -0.3), 2000 time units after 500; per series from the drawn start) exceeds 0.01 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "a", Default: 2.017, Min: 2.017, Max: 2.28, Doc: "damping A (below 2.017 orbits escape; above 2.28 some drawn starts leave the basin)"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units); one loop takes about 4 time units"},
			obsParam("x", "x'", "x''"),
		},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0.0550, Unit: "per time unit", Source: "Sprott, Phys. Lett. A 228 (1997) 271 (memory); his 2003 table gives 0.0551 (DuncDennis/rescomp rescomp/simulations_new.py)"},
			{Name: "lyap_sum", Value: -2.017, Unit: "per time unit", Source: "analytic: divergence of the vector field -A"},
		},
		DefaultClass: Chaotic,
		threshold:    0.01,
	}, func(p map[string]float64) Jerk {
		return Jerk{A: p["a"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(0.43, 1.42, -0.3), flowRule{h: jerkStep, transient: jerkTransient, span: 2000, renorm: 1})
}
