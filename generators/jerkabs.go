package generators

import (
	"math"
	"math/rand/v2"
)

// JerkAbs is the Linz–Sprott piecewise-linear jerk flow
//
//	d³x/dt³ + A·d²x/dt² + dx/dt = |x| − 1
//
// (Linz & Sprott, Phys. Lett. A 259 (1999) 240 (memory)), written as
// dx/dt = y, dy/dt = z, dz/dt = −A·z − y + |x| − 1, integrated by RK4 with
// internal step ≤ 0.02 and observed through x (Obs = 0; y, z with Obs = 1,
// 2). The only nonlinearity is the kink of |x| at x = 0: the field is
// linear on either side, and so is its Jacobian, which jumps there
// (∂ż/∂x = sign x). Its divergence is −A everywhere, so the exponents sum to
// −A (analytic). At A = 0.6 it is chaotic with λ1 ≈ 0.035 per time unit
// (Linz & Sprott 1999 (memory); 0.036 measured over 5·10^4 time units).
// Measured along A (λ1 of the variational equations over 2000 time units):
// every orbit escapes below A ≈ 0.545; regular (λ1 ≤ 0) up to 0.56;
// chaotic from 0.565 to 0.64 with a periodic window at 0.59–0.595 (and
// mixed periodic and chaotic attractors near 0.57); periodic from 0.645
// on.
type JerkAbs struct {
	A   float64
	Dt  float64 // sample interval in time units, > 0
	Obs int     // observed coordinate: 0 = x, 1 = x', 2 = x''
}

const (
	jerkAbsStep      = 0.02
	jerkAbsTransient = 500.0
)

func (m JerkAbs) dim() int { return 3 }

func (m JerkAbs) eval(dst, v []float64) {
	dst[0] = v[1]
	dst[1] = v[2]
	dst[2] = -m.A*v[2] - v[1] + math.Abs(v[0]) - 1
}

// jacobian is piecewise constant: ∂ż/∂x = sign x, taken as +1 at x = 0
// (a plane the orbit crosses transversally, in zero time).
func (m JerkAbs) jacobian(j, v []float64) {
	s := 1.0
	if v[0] < 0 {
		s = -1
	}
	j[0], j[1], j[2] = 0, 1, 0
	j[3], j[4], j[5] = 0, 0, 1
	j[6], j[7], j[8] = s, -1, -m.A
}

// start draws the initial state of Generate: uniform in [−0.2, 0.2)³. The
// bounded attractor's basin is interleaved with escaping orbits away from
// the origin; none of 800 starts in this box escaped at eight values of A
// across [0.55, 1], while a box of half-width 1 loses 7–16% of them.
func (m JerkAbs) start(rng *rand.Rand) []float64 {
	return []float64{0.4*rng.Float64() - 0.2, 0.4*rng.Float64() - 0.2, 0.4*rng.Float64() - 0.2}
}

// Generate returns n samples of the observed coordinate after a transient
// of 500 time units.
func (m JerkAbs) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("jerk-abs", m, m.start(rng), n, m.Dt, jerkAbsStep, jerkAbsTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "jerk-abs",
		Title: "Linz–Sprott piecewise-linear jerk x''' + A x'' + x' = |x| - 1 (observed x), RK4",
		Doc:   "The simplest piecewise-linear chaotic jerk (Linz & Sprott 1999): chaotic at A = 0.6 (λ1 ≈ 0.035), measured chaotic for A in 0.565-0.64 with a periodic window at 0.59-0.595, periodic from 0.645, regular (λ1 ≤ 0) below 0.56; every orbit escapes below A ≈ 0.545. The exponents sum to -A. Internal RK4 step ≤ 0.02; transient 500 time units; starts uniform in [-0.2, 0.2)³. Label: chaotic when λ1 of the variational equations (orbit from (0.1, 0, 0), 2000 time units after 500; per series from the drawn start) exceeds 0.01 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "a", Default: 0.6, Min: 0.55, Max: 1, Doc: "damping A (below about 0.545 every orbit escapes)"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units); one loop takes about 6 time units"},
			obsParam("x", "x'", "x''"),
		},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0.035, Unit: "per time unit", Source: "Linz & Sprott, Phys. Lett. A 259 (1999) 240 (memory), A = 0.6"},
			{Name: "lyap_sum", Value: -0.6, Unit: "per time unit", Source: "analytic: divergence of the vector field -A"},
		},
		DefaultClass: Chaotic,
		threshold:    0.01,
	}, func(p map[string]float64) JerkAbs {
		return JerkAbs{A: p["a"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(0.1, 0, 0), flowRule{h: jerkAbsStep, transient: jerkAbsTransient, span: 2000, renorm: 1})
}
