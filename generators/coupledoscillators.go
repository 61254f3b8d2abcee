package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// CoupledVanDerPol is a group of M = 2 or 3 van der Pol oscillators with
// natural angular frequencies ω_j, all coupled to each other through their
// positions:
//
//	x_j” − μ(1 − x_j²)x_j' + ω_j²·x_j = κ·Σ_{k≠j} (x_k − x_j),
//
// written as first-order equations in the state (x_1, y_1, x_2, y_2[, x_3,
// y_3]), y_j = x_j', integrated by RK4 with internal step ≤ 0.01 and
// observed through coordinate Obs of that state. With incommensurate
// frequencies and weak coupling the phases drift independently: a 2-torus
// (M = 2) or 3-torus (M = 3), quasi-periodic motion with M zero Lyapunov
// exponents; stronger coupling locks some or all of them (fewer zero
// exponents, periodic motion when all lock), and strongly nonlinear
// oscillators can turn chaotic (Pikovsky, Rosenblum & Kurths,
// Synchronization (2001) (memory)). Position coupling keeps the origin
// unstable (every oscillator has negative damping near x = 0), so the
// motion never dies out.
type CoupledVanDerPol struct {
	M     int       // number of oscillators, 2 or 3
	Mu    float64   // nonlinearity μ > 0, shared
	Omega []float64 // natural angular frequencies ω_1..ω_M, > 0
	Kappa float64   // coupling strength κ ≥ 0
	Dt    float64   // sample interval in time units, > 0
	Obs   int       // recorded coordinate of (x_1, y_1, x_2, y_2, ...)
}

const (
	coupledStep      = 0.01
	coupledTransient = 200.0
)

// coupledRule is the label rule: λ1 of the variational equations over 500
// time units after the generator's 200 of transient, RK4 at h = 0.01,
// re-orthonormalised every time unit; Class starts from x_j = 2, y_j = 0.
var coupledRule = flowRule{h: coupledStep, transient: coupledTransient, span: 500, renorm: 1, k: 1}

func (m CoupledVanDerPol) dim() int { return 2 * m.M }

func (m CoupledVanDerPol) eval(dst, v []float64) {
	var sum float64
	for j := 0; j < m.M; j++ {
		sum += v[2*j]
	}
	for j := 0; j < m.M; j++ {
		x, y := v[2*j], v[2*j+1]
		w := m.Omega[j]
		// Σ_{k≠j} (x_k − x_j) = sum − M·x_j.
		dst[2*j] = y
		dst[2*j+1] = m.Mu*(1-x*x)*y - w*w*x + m.Kappa*(sum-float64(m.M)*x)
	}
}

func (m CoupledVanDerPol) jacobian(jac, v []float64) {
	d := m.dim()
	clear(jac[:d*d])
	for j := 0; j < m.M; j++ {
		x, y := v[2*j], v[2*j+1]
		w := m.Omega[j]
		rx, ry := (2*j)*d, (2*j+1)*d
		jac[rx+2*j+1] = 1
		for k := 0; k < m.M; k++ {
			jac[ry+2*k] = m.Kappa
		}
		jac[ry+2*j] = -2*m.Mu*x*y - w*w - m.Kappa*float64(m.M-1)
		jac[ry+2*j+1] = m.Mu * (1 - x*x)
	}
}

// start draws the initial state: every oscillator at a random point of
// the circle of radius 2 in its (x, y/ω) plane, near its free limit cycle.
func (m CoupledVanDerPol) start(rng *rand.Rand) []float64 {
	v := make([]float64, m.dim())
	for j := 0; j < m.M; j++ {
		a := 2 * math.Pi * rng.Float64()
		v[2*j] = 2 * math.Cos(a)
		v[2*j+1] = 2 * m.Omega[j] * math.Sin(a)
	}
	return v
}

func (m CoupledVanDerPol) check() error {
	if m.M < 2 || m.M > 3 || len(m.Omega) < m.M {
		return fmt.Errorf("coupled-oscillators: %w: %d oscillators with %d frequencies, want 2 or 3", ErrParamRange, m.M, len(m.Omega))
	}
	if !(m.Mu > 0) || !(m.Kappa >= 0) || math.IsInf(m.Mu+m.Kappa, 0) {
		return fmt.Errorf("coupled-oscillators: %w: mu = %g, kappa = %g, want mu > 0, kappa ≥ 0", ErrParamRange, m.Mu, m.Kappa)
	}
	for j, w := range m.Omega[:m.M] {
		if !(w > 0) || math.IsInf(w, 0) {
			return fmt.Errorf("coupled-oscillators: %w: omega_%d = %g, want > 0", ErrParamRange, j+1, w)
		}
	}
	return checkObs("coupled-oscillators", m.Obs, m.dim())
}

// Generate returns n samples of the observed coordinate after a transient
// of 200 time units from a random start.
func (m CoupledVanDerPol) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := m.check(); err != nil {
		return nil, err
	}
	return sampleFlow("coupled-oscillators", m, m.start(rng), n, m.Dt, coupledStep, coupledTransient, m.Obs)
}

// classStart is the fixed start of the parameter-only label rule:
// x_j = 2, y_j = 0.
func (m CoupledVanDerPol) classStart() []float64 {
	x0 := make([]float64, m.dim())
	for j := 0; j < m.M; j++ {
		x0[2*j] = 2
	}
	return x0
}

func init() {
	mk := func(p map[string]float64) CoupledVanDerPol {
		return CoupledVanDerPol{M: int(p["m"]), Mu: p["mu"], Omega: []float64{1, p["w2"], p["w3"]}, Kappa: p["kappa"], Dt: p["dt"], Obs: int(p["obs"])}
	}
	registerFlow(&System{
		Name:  "coupled-oscillators",
		Title: "two or three position-coupled van der Pol oscillators (2- or 3-torus or locked), RK4",
		Doc:   "x_j'' - mu (1 - x_j²) x_j' + w_j² x_j = kappa Σ_{k≠j} (x_k - x_j), w_1 = 1. Incommensurate w_j with weak coupling give quasi-periodic motion on an m-torus, stronger coupling frequency locking; observed coordinate obs of (x1, y1, x2, y2, x3, y3), y = x' (obs ≤ 3 when m = 2). Internal RK4 step ≤ 0.01; transient 200 time units; random start near each free limit cycle. Label: chaotic when λ1 of the variational equations (orbit from x_j = 2, y_j = 0, 500 time units after 200) exceeds 0.02 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "m", Default: 3, Min: 2, Max: 3, Integer: true, Doc: "number of oscillators"},
			{Name: "mu", Default: 0.5, Min: 0.05, Max: 3, Doc: "nonlinearity μ (shared)"},
			{Name: "w2", Default: GoldenMean, Min: 0.2, Max: 5, Doc: "natural angular frequency of oscillator 2 (oscillator 1: 1)"},
			{Name: "w3", Default: math.Sqrt(5), Min: 0.2, Max: 5, Doc: "natural angular frequency of oscillator 3 (used when m = 3)"},
			{Name: "kappa", Default: 0.05, Min: 0, Max: 1, Doc: "coupling strength κ"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 0.7, Doc: "sample interval (time units); the fastest free period is 2π/max(1, w2, w3), 2.8 at the defaults (0.7: 4 samples per period)"},
			obsParam("x1", "y1", "x2", "y2", "x3", "y3"),
		},
		DefaultClass: Regular,
		threshold:    0.02,
	}, mk, func(p map[string]float64) []float64 { return mk(p).classStart() }, coupledRule)
}
