package generators

import "math/rand/v2"

// Rossler is the Rössler flow dx/dt = −y − z, dy/dt = x + a·y,
// dz/dt = b + z·(x − c) (Rössler, Phys. Lett. A 57 (1976) 397), integrated
// by RK4 with internal step ≤ 0.01 and observed through x (Obs = 0; y
// and z with Obs = 1, 2) every Dt time units. At a = b = 0.2 it is chaotic at c = 5.7 (λ1 ≈ 0.0714 per time unit,
// Sprott 2003) and passes through period doubling below: period 1 at
// c = 2.5, period 2 at c = 3.5, period 4 at c = 4.
type Rossler struct {
	A, B, C float64
	Dt      float64 // sample interval in time units, > 0
	Obs     int     // observed coordinate: 0 = x, 1 = y, 2 = z
}

const (
	rosslerStep      = 0.01
	rosslerTransient = 300.0
)

func (m Rossler) dim() int { return 3 }

func (m Rossler) eval(dst, v []float64) {
	dst[0] = -v[1] - v[2]
	dst[1] = v[0] + m.A*v[1]
	dst[2] = m.B + v[2]*(v[0]-m.C)
}

func (m Rossler) jacobian(j, v []float64) {
	j[0], j[1], j[2] = 0, -1, -1
	j[3], j[4], j[5] = 1, m.A, 0
	j[6], j[7], j[8] = v[2], 0, v[0]-m.C
}

// start draws the initial state of Generate: uniform in
// [1, 2) × [1, 2) × [0, 1).
func (m Rossler) start(rng *rand.Rand) []float64 {
	return []float64{1 + rng.Float64(), 1 + rng.Float64(), rng.Float64()}
}

// Generate returns n samples of the observed coordinate after a transient
// of 300 time units, started from a random point of [1, 2) × [1, 2) × [0, 1).
func (m Rossler) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("rossler", m, m.start(rng), n, m.Dt, rosslerStep, rosslerTransient, m.Obs)
}

// rosslerRule is the label rule: 300 time units of transient, 2000
// averaged, re-orthonormalised every time unit; Class starts from
// (1, 1, 0).
var rosslerRule = flowRule{h: rosslerStep, transient: rosslerTransient, span: 2000, renorm: 1}

func init() {
	params := func(c float64) []Param {
		return []Param{
			{Name: "a", Default: 0.2, Min: 0.1, Max: 0.3, Doc: "coefficient a"},
			{Name: "b", Default: 0.2, Min: 0.1, Max: 2, Doc: "coefficient b"},
			{Name: "c", Default: c, Min: 2, Max: 14, Doc: "coefficient c (period doubling to chaos as c grows at a = b = 0.2)"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units); one loop takes about 6 time units"},
			obsParam("x", "y", "z"),
		}
	}
	mk := func(p map[string]float64) Rossler {
		return Rossler{A: p["a"], B: p["b"], C: p["c"], Dt: p["dt"], Obs: int(p["obs"])}
	}
	const rule = " Label: chaotic when λ1 of the variational equations (orbit from (1, 1, 0), 2000 time units after 300 of transient) exceeds 0.02 per time unit, otherwise regular."
	registerFlow(&System{
		Name:   "rossler",
		Title:  "Rössler flow (observed x), RK4",
		Doc:    "Chaotic at a = b = 0.2, c = 5.7. Internal RK4 step ≤ 0.01 time units; transient 300 time units." + rule,
		Params: params(5.7),
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0.0714, Unit: "per time unit", Source: "Sprott, Chaos and Time-Series Analysis (2003); confirmed: DuncDennis/rescomp rescomp/simulations_new.py"},
		},
		DefaultClass: Chaotic,
		threshold:    0.02,
	}, mk, fixedStart(1, 1, 0), rosslerRule)
	registerFlow(&System{
		Name:         "rossler-periodic",
		Title:        "Rössler flow at c = 4 (period-4 orbit), RK4",
		Doc:          "The Rössler entry preset to c = 4 on the period-doubling cascade (period 4); c = 2.5 gives period 1 and c = 3.5 period 2. Same equations and label rule as \"rossler\"." + rule,
		Params:       params(4),
		DefaultClass: Regular,
		threshold:    0.02,
	}, mk, fixedStart(1, 1, 0), rosslerRule)
}
