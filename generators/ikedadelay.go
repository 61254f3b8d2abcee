package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// IkedaDelay is the Ikeda delay-differential equation
//
//	dx/dt = −x(t) + μ·sin x(t − τ)
//
// (Ikeda & Matsumoto, Physica D 29 (1987) 223 (memory)), the response of a
// nonlinear optical ring cavity with delayed feedback, time in units of
// the medium's response time, observed every Dt time units. Its state is
// a whole history over one delay, and for large μτ the chaos is
// high-dimensional: the number of positive exponents grows with τ while
// their size falls roughly as 1/τ (Ikeda & Matsumoto 1987). Analytic
// (linear stability): x = 0 is stable for μ < 1; the fixed point x* of
// x = μ sin x in (0, π), where a history started in [0.5, 1.5) settles
// for small μ, loses stability when k = μ cos x* < −1 and
// τ > arccos(1/k)/√(k² − 1) through a Hopf bifurcation (μ ≳ 2.27; for μ =
// 2.5, at τ ≈ 2.84). Measured (λ1 as below over 2·10^4 time units): past
// the Hopf point the orbit is periodic up to μ ≈ 2.8–2.9 and chaotic above
// for τ ≳ 3, with λ1 from about 0.01 (τ = 20, μ = 3) to 0.4 (τ = 1,
// μ = 6).
//
// Method: as MackeyGlass, classical RK4 on a grid of step h = τ/D with
// D = ⌈τ/0.05⌉, half-step delayed values by cubic Hermite interpolation of
// the stored values and derivatives, samples by the same interpolant; the
// initial history is constant at a random x0 in [0.5, 1.5) and the
// transient is 500 time units.
type IkedaDelay struct {
	Mu, Tau float64
	Dt      float64 // sample interval in time units, > 0
}

const (
	ikedaDelayMaxStep   = 0.05
	ikedaDelayTransient = 500.0
)

// newState returns the constant history x0 on the integration grid.
func (m IkedaDelay) newState(x0 float64) *mgState {
	d := int(math.Ceil(m.Tau/ikedaDelayMaxStep - 1e-9))
	s := &mgState{x: make([]float64, d+1), f: make([]float64, d+1), d: d, h: m.Tau / float64(d)}
	for i := range s.x {
		s.x[i] = x0
	}
	s.head = d
	// The newest point's derivative is the right derivative (the start of
	// the solution); the kink at t = 0 is handled in step.
	s.f[d] = -x0 + m.Mu*math.Sin(x0)
	return s
}

// step advances the state by one grid step h (the scheme of
// MackeyGlass.step with the Ikeda right-hand side; the delayed term is
// evaluated once for the two half-step stages and once for the end).
func (m IkedaDelay) step(s *mgState) {
	h := s.h
	a, b := s.delayed()
	xa, xb := s.x[a], s.x[b]
	fa, fb := s.f[a], s.f[b]
	if s.steps == s.d-1 {
		// Left derivative of the constant history at t = 0.
		fb = 0
	}
	gMid := m.Mu * math.Sin(0.5*(xa+xb)+h*(fa-fb)/8)
	gEnd := m.Mu * math.Sin(xb)
	x := s.x[s.head]
	k1 := s.f[s.head]
	k2 := -(x + 0.5*h*k1) + gMid
	k3 := -(x + 0.5*h*k2) + gMid
	k4 := -(x + h*k3) + gEnd
	xn := x + h/6*(k1+2*k2+2*k3+k4)
	s.head = a
	s.x[a] = xn
	s.f[a] = -xn + gEnd
	s.steps++
}

func (m IkedaDelay) check() error {
	if !(m.Mu > 0 && m.Tau > 0) || math.IsInf(m.Mu+m.Tau, 0) {
		return fmt.Errorf("ikeda-delay: %w: mu = %g, tau = %g, want both > 0", ErrParamRange, m.Mu, m.Tau)
	}
	return nil
}

// start draws the constant initial history of Generate: x0 uniform in
// [0.5, 1.5).
func (m IkedaDelay) start(rng *rand.Rand) []float64 { return []float64{0.5 + rng.Float64()} }

// Generate returns n samples after the transient.
func (m IkedaDelay) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleDelay("ikeda-delay", m, m.start(rng)[0], n, m.Dt, ikedaDelayTransient)
}

// ikedaDelayLyapunov returns the largest Lyapunov exponent of the
// discretised delay equation (delayLyapunov) after the generator's
// transient; the reference history is constant at x0.
func ikedaDelayLyapunov(m IkedaDelay, x0, span float64) (Spectrum, error) {
	return delayLyapunov("ikeda-delay", m, x0, span, ikedaDelayTransient)
}

// ikedaDelaySpan is the span of both label rules (Class and ClassFrom),
// in time units.
const ikedaDelaySpan = 20000

func init() {
	mk := func(p map[string]float64) IkedaDelay {
		return IkedaDelay{Mu: p["mu"], Tau: p["tau"], Dt: p["dt"]}
	}
	register(&System{
		Name:  "ikeda-delay",
		Title: "Ikeda delay equation dx/dt = -x + mu sin x(t - tau) (RK4 with Hermite history)",
		Doc:   "Nonlinear optical cavity with delayed feedback (Ikeda & Matsumoto 1987): a Hopf bifurcation of the fixed point x = mu sin x at mu cos x = -1/cos(w tau) (mu ≈ 2.27-2.55 for tau ≥ 2.5), periodic up to mu ≈ 2.8-2.9, high-dimensional chaos above (λ1 falling roughly as 1/tau). RK4 on a grid h = tau/ceil(tau/0.05), half-step delayed values and samples by cubic Hermite interpolation; constant initial history x0 uniform in [0.5, 1.5); transient 500 time units. Label: chaotic when λ1 from two nearby histories (renormalised every tau, 20000 time units after 500; per series from the drawn history) exceeds 0.002 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "mu", Default: 5, Min: 2.6, Max: 10, Doc: "feedback strength μ (below the Hopf point, μ ≈ 2.27-2.55 for τ ≥ 2.5, the orbit settles on a fixed point)"},
			{Name: "tau", Default: 10, Min: 2.5, Max: 30, Doc: "delay τ in response times (τ ≥ 2.5 keeps the fixed point unstable for every μ ≥ 2.6)"},
			{Name: "dt", Default: 0.5, Min: 0.01, Max: 5, Doc: "sample interval (time units); the response time is 1, slow oscillations have period about 2τ"},
		},
		Invariants: []Invariant{
			{Name: "mean", Value: math.NaN(), Unit: "μ⟨sin x⟩", Source: "analytic: the time average of dx/dt vanishes on a bounded orbit, so ⟨x⟩ = μ⟨sin x(t - τ)⟩ = μ⟨sin x⟩"},
		},
		TimeAxis:     AxisTime,
		DefaultClass: Chaotic,
		lyap: func(p map[string]float64) (Spectrum, error) {
			return ikedaDelayLyapunov(mk(p), 1.2, ikedaDelaySpan)
		},
		initial: func(p map[string]float64, rng *rand.Rand) []float64 {
			return mk(p).start(rng)
		},
		lyapFrom: func(p map[string]float64, x0 []float64) (Spectrum, error) {
			return ikedaDelayLyapunov(mk(p), x0[0], ikedaDelaySpan)
		},
		threshold: 0.002,
		build: func(p map[string]float64) (Generator, float64, error) {
			return mk(p), p["dt"], nil
		},
	})
}
