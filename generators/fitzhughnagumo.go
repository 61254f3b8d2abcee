package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// FitzHughNagumo is the FitzHugh–Nagumo model of an excitable neuron,
// dv/dt = v − v³/3 − w + I, dw/dt = ε·(v + a − b·w) (FitzHugh, Biophys. J.
// 1 (1961) 445), integrated by RK4 with internal step ≤ 0.05 and observed
// through the voltage v (Obs 0) or the recovery variable w (Obs 1). For
// 0 < b < 1 it has exactly one fixed point v*, the root of
// v − v³/3 − (v + a)/b + I = 0 (the left side decreases in v), with
// Jacobian trace 1 − v*² − ε·b and determinant ε·(1 − b(1 − v*²)) > 0.
// When the trace is positive the fixed point repels and, the flow being
// planar and bounded, every other orbit tends to a limit cycle
// (Poincaré–Bendixson): a spike train, relaxation-like for small ε
// (analytic; HopfMargin returns the trace).
type FitzHughNagumo struct {
	A, B float64 // a, and 0 < b < 1
	Eps  float64 // time-scale ratio ε > 0
	I    float64 // applied current
	Dt   float64 // sample interval in time units, > 0
	Obs  int     // recorded coordinate: 0 v, 1 w
}

const (
	fhnStep      = 0.05
	fhnTransient = 300.0
)

// fhnRule is the label rule: λ1 of the variational equations over 1000
// time units after the generator's 300 of transient, RK4 at h = 0.05,
// re-orthonormalised every time unit; Class starts from (−1, 1).
var fhnRule = flowRule{h: fhnStep, transient: fhnTransient, span: 1000, renorm: 1, k: 1}

func (m FitzHughNagumo) dim() int { return 2 }

func (m FitzHughNagumo) eval(dst, v []float64) {
	x, w := v[0], v[1]
	dst[0] = x - x*x*x/3 - w + m.I
	dst[1] = m.Eps * (x + m.A - m.B*w)
}

func (m FitzHughNagumo) jacobian(j, v []float64) {
	x := v[0]
	j[0], j[1] = 1-x*x, -1
	j[2], j[3] = m.Eps, -m.Eps*m.B
}

// FixedPoint returns the voltage v* of the unique fixed point (the fixed
// point is (v*, (v* + a)/b)), found by bisection on the decreasing
// function v − v³/3 − (v + a)/b + I. It requires 0 < b < 1.
func (m FitzHughNagumo) FixedPoint() float64 {
	g := func(v float64) float64 { return v - v*v*v/3 - (v+m.A)/m.B + m.I }
	// g → +∞ as v → −∞ and −∞ as v → +∞; widen until the root is bracketed.
	lo, hi := -1.0, 1.0
	for g(lo) < 0 {
		lo *= 2
	}
	for g(hi) > 0 {
		hi *= 2
	}
	for i := 0; i < 200 && hi-lo > 1e-15*math.Max(1, math.Abs(lo)); i++ {
		mid := 0.5 * (lo + hi)
		if g(mid) > 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi)
}

// HopfMargin returns the trace 1 − v*² − ε·b of the Jacobian at the fixed
// point: positive means the fixed point repels and the model oscillates
// on a limit cycle, negative that it is stable (a small-amplitude or
// canard cycle may still coexist near the boundary).
func (m FitzHughNagumo) HopfMargin() float64 {
	v := m.FixedPoint()
	return 1 - v*v - m.Eps*m.B
}

// start draws the initial state uniform in [−2, 2) × [−1, 2).
func (m FitzHughNagumo) start(rng *rand.Rand) []float64 {
	return []float64{4*rng.Float64() - 2, 3*rng.Float64() - 1}
}

// Generate returns n samples of the observed coordinate after a transient
// of 300 time units from a random start.
func (m FitzHughNagumo) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if !(m.Eps > 0) || !(m.B > 0 && m.B < 1) || math.IsNaN(m.A+m.I) || math.IsInf(m.A+m.I+m.Eps, 0) {
		return nil, fmt.Errorf("fitzhugh-nagumo: %w: a = %g, b = %g, eps = %g, i = %g, want finite values, eps > 0, 0 < b < 1", ErrParamRange, m.A, m.B, m.Eps, m.I)
	}
	if err := checkObs("fitzhugh-nagumo", m.Obs, 2); err != nil {
		return nil, err
	}
	return sampleFlow("fitzhugh-nagumo", m, m.start(rng), n, m.Dt, fhnStep, fhnTransient, m.Obs)
}

// FitzHugh's values of a and b, fixed in the registry entry.
const (
	fhnA = 0.7
	fhnB = 0.8
)

func init() {
	mk := func(p map[string]float64) FitzHughNagumo {
		return FitzHughNagumo{A: fhnA, B: fhnB, Eps: p["eps"], I: p["i"], Dt: p["dt"], Obs: int(p["obs"])}
	}
	registerFlow(&System{
		Name:  "fitzhugh-nagumo",
		Title: "FitzHugh-Nagumo relaxation oscillator dv/dt = v - v³/3 - w + I, dw/dt = eps (v + 0.7 - 0.8 w), RK4",
		Doc:   "Excitable neuron model with FitzHugh's a = 0.7, b = 0.8, in its oscillating regime: the fixed point repels when 1 - v*² - eps·b > 0 (v* the fixed point's voltage), which holds over the whole box 0.45 ≤ i ≤ 1.3, 0.01 ≤ eps ≤ 0.25 (the window is 0.30 < i < 1.45 at eps = 0.01 and 0.41 < i < 1.34 at eps = 0.25). Small eps gives spiky relaxation oscillations with a period of order 1/eps. Internal RK4 step ≤ 0.05 (the extrema of the cycle agree with step 0.002 to six digits); transient 300 time units; random start in [-2, 2) × [-1, 2). Label: chaotic when λ1 of the variational equations (orbit from (-1, 1), 1000 time units after 300) exceeds 0.02 per time unit, otherwise regular; a planar flow cannot be chaotic (Poincaré–Bendixson), so the rule gives regular throughout.",
		Params: []Param{
			{Name: "i", Default: 0.5, Min: 0.45, Max: 1.3, Doc: "applied current I"},
			{Name: "eps", Default: 0.08, Min: 0.01, Max: 0.25, Doc: "time-scale ratio ε of the recovery variable"},
			{Name: "dt", Default: 1, Min: 1e-3, Max: 5, Doc: "sample interval (time units); the period is about 40 at the defaults, 20 at eps = 0.25 (5: 4 samples per period), 230 at eps = 0.01"},
			obsParam("v", "w"),
		},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0, Unit: "per time unit", Source: "analytic: an attracting limit cycle of an autonomous flow"},
		},
		DefaultClass: Regular,
		threshold:    0.02,
	}, mk, fixedStart(-1, 1), fhnRule)
}
