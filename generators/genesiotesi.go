package generators

import "math/rand/v2"

// GenesioTesi is the Genesio–Tesi jerk flow
//
//	d³x/dt³ + C·d²x/dt² + B·dx/dt + A·x = x²
//
// (Genesio & Tesi, Automatica 28 (1992) 531 (memory)), written as
// dx/dt = y, dy/dt = z, dz/dt = −C·z − B·y − A·x + x², integrated by RK4
// with internal step ≤ 0.02 and observed through x (Obs = 0; y, z with
// Obs = 1, 2). Its divergence is −C everywhere, so the exponents sum to −C
// (analytic). The equilibria are x = 0, unstable while B·C < A
// (Routh–Hurwitz), and x = A, a saddle; the attractor winds around the
// origin and orbits that cross the saddle's stable manifold escape to
// infinity (reported as ErrDiverged). Rescaling x by A and time by
// A^(−1/3) turns A into 1, so A sets the amplitude and time scale and
// (B, C) the dynamics. At A = 1, B = 1.1, C = 0.44 it is chaotic (λ1 ≈ 0.10
// per time unit, measured). Measured at A = 1 (λ1 over 1000 time units on
// a 0.02 grid of C and B): chaos lies in a band of width about 0.07 in C
// just above the escape edge C ≈ 0.415 − 0.65·(B − 1.1) (for B in 1.0–1.3),
// with periodic windows in it; larger C gives periodic orbits up to the
// Hopf point B·C = A.
type GenesioTesi struct {
	A, B, C float64
	Dt      float64 // sample interval in time units, > 0
	Obs     int     // observed coordinate: 0 = x, 1 = x', 2 = x''
}

const (
	genesioTesiStep      = 0.02
	genesioTesiTransient = 500.0
)

func (m GenesioTesi) dim() int { return 3 }

func (m GenesioTesi) eval(dst, v []float64) {
	dst[0] = v[1]
	dst[1] = v[2]
	dst[2] = -m.C*v[2] - m.B*v[1] - m.A*v[0] + v[0]*v[0]
}

func (m GenesioTesi) jacobian(j, v []float64) {
	j[0], j[1], j[2] = 0, 1, 0
	j[3], j[4], j[5] = 0, 0, 1
	j[6], j[7], j[8] = 2*v[0]-m.A, -m.B, -m.C
}

// start draws the initial state of Generate: uniform in [−0.2, 0.2)³,
// around the unstable origin inside the attractor's basin (none of 100
// starts escaped at each of eight settings across the parameter ranges,
// while a box of half-width 0.5 loses 5–21% of them).
func (m GenesioTesi) start(rng *rand.Rand) []float64 {
	return []float64{0.4*rng.Float64() - 0.2, 0.4*rng.Float64() - 0.2, 0.4*rng.Float64() - 0.2}
}

// Generate returns n samples of the observed coordinate after a transient
// of 500 time units; an orbit that escapes gives ErrDiverged.
func (m GenesioTesi) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleFlow("genesio-tesi", m, m.start(rng), n, m.Dt, genesioTesiStep, genesioTesiTransient, m.Obs)
}

func init() {
	registerFlow(&System{
		Name:  "genesio-tesi",
		Title: "Genesio–Tesi jerk x''' + C x'' + B x' + A x = x² (observed x), RK4",
		Doc:   "Chaotic at A = 1, B = 1.1, C = 0.44 (Genesio & Tesi 1992; λ1 ≈ 0.10 measured); at A = 1 chaos fills a band about 0.07 wide in C above the escape edge C ≈ 0.415 - 0.65 (B - 1.1), periodic orbits above it up to the Hopf point B C = A, escape to infinity below it (ErrDiverged). The exponents sum to -C. Internal RK4 step ≤ 0.02; transient 500 time units; starts uniform in [-0.2, 0.2)³. Label: chaotic when λ1 of the variational equations (orbit from (0.1, -0.05, 0.08), 2000 time units after 500; per series from the drawn start) exceeds 0.01 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "a", Default: 1, Min: 0.85, Max: 1.03, Doc: "coefficient A of x (amplitude and time scale; above about 1.04 at the other defaults orbits escape)"},
			{Name: "b", Default: 1.1, Min: 1.08, Max: 1.4, Doc: "coefficient B of x' (below about 1.06 at the other defaults orbits escape)"},
			{Name: "c", Default: 0.44, Min: 0.42, Max: 0.8, Doc: "damping C, the coefficient of x'' (below about 0.415 at the other defaults orbits escape)"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units); one loop takes about 6 time units"},
			obsParam("x", "x'", "x''"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: -0.44, Unit: "per time unit", Source: "analytic: divergence of the vector field -C"},
		},
		DefaultClass: Chaotic,
		threshold:    0.01,
	}, func(p map[string]float64) GenesioTesi {
		return GenesioTesi{A: p["a"], B: p["b"], C: p["c"], Dt: p["dt"], Obs: int(p["obs"])}
	}, fixedStart(0.1, -0.05, 0.08), flowRule{h: genesioTesiStep, transient: genesioTesiTransient, span: 2000, renorm: 1})
}
