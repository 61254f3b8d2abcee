package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Brusselator is the Brusselator model of an autocatalytic reaction,
// dx/dt = a − (b + 1)·x + x²·y, dy/dt = b·x − x²·y (Prigogine & Lefever,
// J. Chem. Phys. 48 (1968) 1695), integrated by RK4 with internal step
// ≤ 0.005 and observed through x (Obs 0) or y (Obs 1). Its only fixed
// point (a, b/a) has Jacobian trace b − 1 − a² and determinant a² > 0, so
// it loses stability in a Hopf bifurcation at b = 1 + a² (analytic); above
// it every orbit except the fixed point tends to one limit cycle (a planar
// flow: Poincaré–Bendixson), nearly sinusoidal just above the bifurcation
// and a relaxation oscillation far above it. Below it every orbit settles
// on the fixed point.
type Brusselator struct {
	A, B float64 // a > 0, b > 0
	Dt   float64 // sample interval in time units, > 0
	Obs  int     // recorded coordinate: 0 x, 1 y
}

const (
	brusselatorStep      = 0.005
	brusselatorTransient = 200.0
)

// brusselatorRule is the label rule: λ1 of the variational equations over
// 500 time units after the generator's 200 of transient, RK4 at
// h = 0.005, re-orthonormalised every 0.1 time unit (during a spike the
// cycle contracts by up to e^{−30} within one time unit, which would
// leave the tangent vectors parallel to rounding); Class starts from
// (a, 1.5·b/a).
var brusselatorRule = flowRule{h: brusselatorStep, transient: brusselatorTransient, span: 500, renorm: 0.1, k: 1}

func (m Brusselator) dim() int { return 2 }

func (m Brusselator) eval(dst, v []float64) {
	x, y := v[0], v[1]
	dst[0] = m.A - (m.B+1)*x + x*x*y
	dst[1] = m.B*x - x*x*y
}

func (m Brusselator) jacobian(j, v []float64) {
	x, y := v[0], v[1]
	j[0], j[1] = -(m.B+1)+2*x*y, x*x
	j[2], j[3] = m.B-2*x*y, -x*x
}

// start draws the initial state: (a·u, (b/a)·w) with u, w uniform in
// [0.5, 1.5), a box around the fixed point.
func (m Brusselator) start(rng *rand.Rand) []float64 {
	return []float64{m.A * (0.5 + rng.Float64()), m.B / m.A * (0.5 + rng.Float64())}
}

// Generate returns n samples of the observed coordinate after a transient
// of 200 time units from a random start.
func (m Brusselator) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if !(m.A > 0) || !(m.B > 0) || math.IsInf(m.A+m.B, 0) {
		return nil, fmt.Errorf("brusselator: %w: a = %g, b = %g, want finite a > 0, b > 0", ErrParamRange, m.A, m.B)
	}
	if err := checkObs("brusselator", m.Obs, 2); err != nil {
		return nil, err
	}
	return sampleFlow("brusselator", m, m.start(rng), n, m.Dt, brusselatorStep, brusselatorTransient, m.Obs)
}

func init() {
	mk := func(p map[string]float64) Brusselator {
		a := p["a"]
		return Brusselator{A: a, B: p["b_hopf"] * (1 + a*a), Dt: p["dt"], Obs: int(p["obs"])}
	}
	registerFlow(&System{
		Name:  "brusselator",
		Title: "Brusselator limit cycle dx/dt = a - (b+1) x + x² y, dy/dt = b x - x² y, RK4",
		Doc:   "Autocatalytic reaction model with a Hopf bifurcation at b = 1 + a²; b is set as b_hopf·(1 + a²), so every parameter set in the ranges lies above the bifurcation, on the limit cycle (nearly sinusoidal near b_hopf = 1, spiky for large b_hopf: x peaks at up to 80 times its minimum). The period is about 2π/a near the bifurcation (6.3 time units at a = 1, 28 at a = 0.3). Internal RK4 step ≤ 0.005; the box a ≤ 1.5, b_hopf ≤ 2 keeps the spikes (x up to 12) resolved by it (the cycle's extrema agree with step 0.001 to 1e-3, the Lyapunov exponents sum to the mean divergence), while at a = 2, b_hopf = 2 the variational equations are no longer resolved and beyond that the step turns unstable; transient 200 time units; random start in a box around the fixed point (a, b/a). Label: chaotic when λ1 of the variational equations (orbit from (a, 1.5 b/a), 500 time units after 200, re-orthonormalised every 0.1) exceeds 0.02 per time unit, otherwise regular; a planar flow cannot be chaotic (Poincaré–Bendixson), so the rule gives regular throughout.",
		Params: []Param{
			{Name: "a", Default: 1, Min: 0.3, Max: 1.5, Doc: "feed concentration a"},
			{Name: "b_hopf", Default: 1.5, Min: 1.05, Max: 2, Doc: "b/(1 + a²): how far b lies above the Hopf bifurcation b = 1 + a²"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 1.8, Doc: "sample interval (time units); the period is 7.1 at the defaults (1.8: 4 samples per period), 2π/a near the bifurcation"},
			obsParam("x", "y"),
		},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0, Unit: "per time unit", Source: "analytic: an attracting limit cycle of an autonomous flow"},
		},
		DefaultClass: Regular,
		threshold:    0.02,
	}, mk, func(p map[string]float64) []float64 {
		m := mk(p)
		return []float64{m.A, 1.5 * m.B / m.A}
	}, brusselatorRule)
}
