package generators

import "math/rand/v2"

// Chen is the Chen system (Chen & Ueta, Int. J. Bifurcation Chaos 9 (1999)
// 1465)
//
//	dx/dt = a(y − x),  dy/dt = (c − a)x − xz + cy,  dz/dt = xy − bz,
//
// a Lorenz-like flow that is not topologically equivalent to Lorenz's,
// integrated by RK4 with internal step ≤ 0.002 and observed through x
// (Obs = 0; y, z with Obs = 1, 2). The divergence of the field is
// c − a − b everywhere, so the exponents sum to c − a − b (analytic),
// −10 at the classical a = 35, b = 3, c = 28, where the flow is chaotic.
type Chen struct {
	A, B, C float64
	Dt      float64 // sample interval in time units, > 0
	Obs     int     // observed coordinate: 0 = x, 1 = y, 2 = z
}

const (
	chenStep      = 0.002
	chenTransient = 50.0
)

func (m Chen) dim() int { return 3 }

func (m Chen) eval(dst, v []float64) {
	x, y, z := v[0], v[1], v[2]
	dst[0] = m.A * (y - x)
	dst[1] = (m.C-m.A)*x - x*z + m.C*y
	dst[2] = x*y - m.B*z
}

func (m Chen) jacobian(j, v []float64) {
	x, y, z := v[0], v[1], v[2]
	j[0], j[1], j[2] = -m.A, m.A, 0
	j[3], j[4], j[5] = m.C-m.A-z, m.C, -x
	j[6], j[7], j[8] = y, x, -m.B
}

// start draws the initial state of Generate: uniform in
// [−1, 1) × [−1, 1) × [10, 12), away from the saddle at the origin.
func (m Chen) start(rng *rand.Rand) []float64 {
	return []float64{2*rng.Float64() - 1, 2*rng.Float64() - 1, 10 + 2*rng.Float64()}
}

// Generate returns n samples of the observed coordinate after a transient
// of 50 time units.
func (m Chen) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("chen", m, m.start(rng), n, m.Dt, chenStep, chenTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "chen",
		Title: "Chen system (Lorenz-like, observed x), RK4",
		Doc:   "dx/dt = a (y - x), dy/dt = (c - a) x - x z + c y, dz/dt = x y - b z; chaotic at a = 35, b = 3, c = 28 (Chen & Ueta 1999); periodic for a ≲ 34, b ≳ 3.6 and at c = 28.5 (reached from some starts only after chaotic transients of hundreds of time units, which the per-series label sees), a stable fixed point below c ≈ 19.5, and a small limit cycle beside the chaotic attractor at c = 20. Internal RK4 step ≤ 0.002; transient 50 time units. Label: chaotic when λ1 of the variational equations (orbit from (1, 1, 11), 200 time units after 50; per series from the drawn start) exceeds 0.1 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "a", Default: 35, Min: 30, Max: 40, Doc: "coefficient a"},
			{Name: "b", Default: 3, Min: 2, Max: 4, Doc: "coefficient b"},
			{Name: "c", Default: 28, Min: 20, Max: 28.5, Doc: "coefficient c (below ≈ 19.5 the orbit settles on a fixed point)"},
			{Name: "dt", Default: 0.01, Min: 1e-4, Max: 0.5, Doc: "sample interval (time units); one loop takes about 0.3 time units"},
			obsParam("x", "y", "z"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: 28 - 35 - 3, Unit: "per time unit", Source: "analytic: divergence of the vector field c - a - b"},
		},
		DefaultClass: Chaotic,
		threshold:    0.1,
	}, func(p map[string]float64) Chen {
		return Chen{A: p["a"], B: p["b"], C: p["c"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(1, 1, 11), flowRule{h: chenStep, transient: chenTransient, span: 200, renorm: 0.2})
}
