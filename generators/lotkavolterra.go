package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// LotkaVolterra is the predator–prey model dx/dt = α·x − β·x·y,
// dy/dt = δ·x·y − γ·y (Lotka 1925; Volterra, Nature 118 (1926) 558
// (memory)), x the prey and y the predators, integrated by RK4 with
// internal step ≤ 0.01 and observed through x (Obs 0) or y (Obs 1). The
// quantity V = δ·x − γ·ln x + β·y − α·ln y is conserved (dV/dt = 0,
// analytic), so the positive quadrant is filled with closed orbits around
// the centre (γ/δ, α/β): every orbit is periodic, with period 2π/√(αγ)
// near the centre and longer for larger orbits. The orbit's size is set by
// the start, x0 = (γ/δ)·e^u at y0 = α/β with |u| between 0.3·Size and
// Size and a random sign. A centre has no attracting cycle: both Lyapunov
// exponents are zero (neighbouring orbits of different periods drift
// apart only linearly in time).
type LotkaVolterra struct {
	Alpha, Beta, Gamma, Delta float64 // all > 0
	Size                      float64 // orbit size: |ln(x0/x*)| ≤ Size, > 0
	Dt                        float64 // sample interval in time units, > 0
	Obs                       int     // recorded coordinate: 0 x, 1 y
}

const (
	lvStep      = 0.01
	lvTransient = 10.0
)

// lvRule is the label rule: λ1 of the variational equations over 1000
// time units after the generator's 10, RK4 at h = 0.01, re-orthonormalised
// every time unit; Class starts from ((γ/δ)·e^{0.7·Size}, α/β).
var lvRule = flowRule{h: lvStep, transient: lvTransient, span: 1000, renorm: 1, k: 1}

func (m LotkaVolterra) dim() int { return 2 }

func (m LotkaVolterra) eval(dst, v []float64) {
	x, y := v[0], v[1]
	dst[0] = m.Alpha*x - m.Beta*x*y
	dst[1] = m.Delta*x*y - m.Gamma*y
}

func (m LotkaVolterra) jacobian(j, v []float64) {
	x, y := v[0], v[1]
	j[0], j[1] = m.Alpha-m.Beta*y, -m.Beta*x
	j[2], j[3] = m.Delta*y, m.Delta*x-m.Gamma
}

// Conserved returns V(x, y) = δ·x − γ·ln x + β·y − α·ln y, constant along
// every orbit.
func (m LotkaVolterra) Conserved(x, y float64) float64 {
	return m.Delta*x - m.Gamma*math.Log(x) + m.Beta*y - m.Alpha*math.Log(y)
}

// start draws the initial state: x0 = (γ/δ)·e^u, y0 = α/β, with
// |u| uniform in [0.3·Size, Size) and a random sign.
func (m LotkaVolterra) start(rng *rand.Rand) []float64 {
	u := m.Size * (0.3 + 0.7*rng.Float64())
	if rng.Float64() < 0.5 {
		u = -u
	}
	return []float64{m.Gamma / m.Delta * math.Exp(u), m.Alpha / m.Beta}
}

// Generate returns n samples of the observed coordinate after a transient
// of 10 time units from a random start (the transient only decorrelates
// the phase: there is no attractor to settle on).
func (m LotkaVolterra) Generate(n int, rng *rand.Rand) ([]float64, error) {
	for _, c := range []float64{m.Alpha, m.Beta, m.Gamma, m.Delta, m.Size} {
		if !(c > 0) || math.IsInf(c, 0) {
			return nil, fmt.Errorf("lotka-volterra: %w: alpha = %g, beta = %g, gamma = %g, delta = %g, size = %g, want finite values > 0", ErrParamRange, m.Alpha, m.Beta, m.Gamma, m.Delta, m.Size)
		}
	}
	if err := checkObs("lotka-volterra", m.Obs, 2); err != nil {
		return nil, err
	}
	return sampleFlow("lotka-volterra", m, m.start(rng), n, m.Dt, lvStep, lvTransient, m.Obs)
}

// classStart is the fixed start of the parameter-only label rule:
// ((γ/δ)·e^{0.7·Size}, α/β), an orbit of typical size.
func (m LotkaVolterra) classStart() []float64 {
	return []float64{m.Gamma / m.Delta * math.Exp(0.7*m.Size), m.Alpha / m.Beta}
}

func init() {
	mk := func(p map[string]float64) LotkaVolterra {
		return LotkaVolterra{Alpha: p["alpha"], Beta: p["beta"], Gamma: p["gamma"], Delta: p["delta"], Size: p["size"], Dt: p["dt"], Obs: int(p["obs"])}
	}
	registerFlow(&System{
		Name:  "lotka-volterra",
		Title: "Lotka-Volterra predator-prey cycles dx/dt = alpha x - beta x y, dy/dt = delta x y - gamma y, RK4",
		Doc:   "Conservative centre: V = delta x - gamma ln x + beta y - alpha ln y is constant, every orbit is periodic; small orbits are nearly sinusoidal with period 2π/√(alpha gamma), large ones spiky (size sets |ln(x0/x*)|, drawn between 0.3 size and size). Internal RK4 step ≤ 0.01 (V drifts by about 1e-9 of V - V* over 10^4 samples); 10 time units discarded. Label: chaotic when λ1 of the variational equations (orbit from x0 = x* e^{0.7 size}, 1000 time units after 10; a centre gives about ln(T)/T = 0.007 at T = 1000 from the linear drift between neighbouring orbits) exceeds 0.02 per time unit, otherwise regular; a planar flow cannot be chaotic (Poincaré–Bendixson), so the rule gives regular throughout.",
		Params: []Param{
			{Name: "alpha", Default: 1, Min: 0.1, Max: 5, Doc: "prey growth rate α"},
			{Name: "beta", Default: 1, Min: 0.1, Max: 5, Doc: "predation rate β"},
			{Name: "gamma", Default: 1, Min: 0.1, Max: 5, Doc: "predator death rate γ"},
			{Name: "delta", Default: 1, Min: 0.1, Max: 5, Doc: "predator growth per prey δ"},
			{Name: "size", Default: 1, Min: 0.05, Max: 2.5, Doc: "orbit size: largest |ln(x0/x*)| of the start"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 1.5, Doc: "sample interval (time units); the period is 2π/√(alpha gamma) for small orbits (1.5: 4 samples per period at the defaults), longer for large ones"},
			obsParam("x (prey)", "y (predators)"),
		},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0, Unit: "per time unit", Source: "analytic: periodic orbits of a conservative planar flow"},
		},
		DefaultClass: Regular,
		threshold:    0.02,
	}, mk, func(p map[string]float64) []float64 { return mk(p).classStart() }, lvRule)
}
