package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// MackeyGlass is the Mackey–Glass delay equation
// dx/dt = β·x(t−τ)/(1 + x(t−τ)^N) − γ·x(t) (Mackey & Glass, Science 197
// (1977) 287), observed every Dt time units. At β = 0.2, γ = 0.1, N = 10 it
// is periodic for small delays and chaotic at τ = 17 and above.
//
// Method: classical RK4 on a grid of step h = τ/D with D = ⌈τ/0.05⌉, so the
// delayed value at the start and end of a step is a stored grid value; the
// delayed value at the half step comes from cubic Hermite interpolation of
// the stored values and derivatives, x_mid = (x_a + x_b)/2 + h(f_a − f_b)/8,
// which keeps the scheme fourth-order accurate. The history is a ring buffer
// of D + 1 values and derivatives; the initial history is constant at a
// random x0 in [0.5, 1.5) (derivative 0; the kink of the solution at t = 0
// is respected by the interpolation). Samples between grid points are
// read off the same cubic Hermite interpolant. The transient is 1000 time
// units.
type MackeyGlass struct {
	Beta, Gamma, N, Tau float64
	Dt                  float64 // sample interval in time units, > 0
}

const (
	mgMaxStep   = 0.05
	mgTransient = 1000.0
)

// mgState is the delay-equation state: the last D + 1 grid values of x and
// dx/dt in a ring, the newest at index head.
type mgState struct {
	x, f  []float64
	head  int
	d     int
	h     float64
	steps int // grid steps taken since the constant history
}

func (m MackeyGlass) rhs(x, xd float64) float64 {
	return m.Beta*xd/(1+m.pow(xd)) - m.Gamma*x
}

// pow returns xd^N, by repeated squaring when N is a whole number (the
// usual N = 10), which is several times faster than math.Pow.
func (m MackeyGlass) pow(xd float64) float64 {
	if m.N != math.Trunc(m.N) || m.N > 64 || xd < 0 {
		return math.Pow(xd, m.N)
	}
	r, b := 1.0, xd
	for e := int(m.N); e > 0; e >>= 1 {
		if e&1 == 1 {
			r *= b
		}
		b *= b
	}
	return r
}

func (m MackeyGlass) newState(x0 float64) *mgState {
	return m.newStateD(x0, int(math.Ceil(m.Tau/mgMaxStep-1e-9)))
}

// newStateD returns the constant history x0 on a grid of d steps per delay.
func (m MackeyGlass) newStateD(x0 float64, d int) *mgState {
	s := &mgState{x: make([]float64, d+1), f: make([]float64, d+1), d: d, h: m.Tau / float64(d)}
	for i := range s.x {
		s.x[i] = x0
	}
	s.head = d
	// The newest point's derivative is the right derivative from the
	// equation (the start of the solution); the older ones belong to the
	// constant history. At t = 0 the solution has a kink, handled in step.
	s.f[d] = m.rhs(x0, x0)
	return s
}

// delayed returns the indices of x(t−τ) and x(t−τ+h) for the current head.
func (s *mgState) delayed() (int, int) {
	a := (s.head + 1) % (s.d + 1) // oldest: t − τ
	b := (a + 1) % (s.d + 1)      // t − τ + h
	return a, b
}

// step advances the state by one grid step h.
func (m MackeyGlass) step(s *mgState) {
	h := s.h
	a, b := s.delayed()
	xa, xb := s.x[a], s.x[b]
	fa, fb := s.f[a], s.f[b]
	if s.steps == s.d-1 {
		// The delayed interval is [−h, 0], the end of the constant
		// history: its derivative at 0 from the left is 0, not the
		// stored right derivative of the solution (keeps the scheme
		// fourth-order across the kink).
		fb = 0
	}
	mid := 0.5*(xa+xb) + h*(fa-fb)/8
	x := s.x[s.head]
	k1 := s.f[s.head]
	k2 := m.rhs(x+0.5*h*k1, mid)
	k3 := m.rhs(x+0.5*h*k2, mid)
	k4 := m.rhs(x+h*k3, xb)
	xn := x + h/6*(k1+2*k2+2*k3+k4)
	// The new point overwrites the oldest (index a); its delayed value is
	// the grid point b, now the oldest.
	s.head = a
	s.x[a] = xn
	s.f[a] = m.rhs(xn, xb)
	s.steps++
}

func (m MackeyGlass) check() error {
	if !(m.Beta > 0 && m.Gamma > 0 && m.N > 0 && m.Tau > 0) {
		return fmt.Errorf("mackey-glass: beta = %g, gamma = %g, n = %g, tau = %g, want all > 0", m.Beta, m.Gamma, m.N, m.Tau)
	}
	return nil
}

// start draws the constant initial history of Generate: x0 uniform in
// [0.5, 1.5).
func (m MackeyGlass) start(rng *rand.Rand) []float64 { return []float64{0.5 + rng.Float64()} }

// Generate returns n samples after the transient.
func (m MackeyGlass) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return sampleDelay("mackey-glass", m, m.start(rng)[0], n, m.Dt, mgTransient)
}

// mgLyapunov returns the largest Lyapunov exponent of the delay equation
// (delayLyapunov) after the generator's transient; the reference history
// is constant at x0.
func mgLyapunov(m MackeyGlass, x0, span float64) (Spectrum, error) {
	return delayLyapunov("mackey-glass", m, x0, span, mgTransient)
}

// mgLabelSpan is the span of the parameter-only label rule (Class) and
// mgSeriesSpan that of the per-series rule (ClassFrom), in time units.
const (
	mgLabelSpan  = 20000
	mgSeriesSpan = 20000
)

func init() {
	mk := func(p map[string]float64) MackeyGlass {
		return MackeyGlass{Beta: p["beta"], Gamma: p["gamma"], N: p["n"], Tau: p["tau"], Dt: p["dt"]}
	}
	register(&System{
		Name:  "mackey-glass",
		Title: "Mackey–Glass delay equation (RK4 with Hermite history)",
		Doc:   "dx/dt = beta x(t-tau)/(1 + x(t-tau)^n) - gamma x; chaotic at tau = 17 with beta = 0.2, gamma = 0.1, n = 10, periodic for smaller delays. RK4 on a grid h = tau/ceil(tau/0.05), half-step delayed values and samples by cubic Hermite interpolation; transient 1000 time units. Label: chaotic when λ1 from two nearby histories (renormalised every tau, 20000 time units after 1000) exceeds 0.002 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "beta", Default: 0.2, Min: 0.1, Max: 0.4, Doc: "production rate β"},
			{Name: "gamma", Default: 0.1, Min: 0.05, Max: 0.15, Doc: "decay rate γ"},
			{Name: "n", Default: 10, Min: 8, Max: 20, Doc: "Hill exponent"},
			{Name: "tau", Default: 17, Min: 6, Max: 30, Doc: "delay τ (time units)"},
			{Name: "dt", Default: 1, Min: 0.01, Max: 10, Doc: "sample interval (time units)"},
		},
		TimeAxis:     AxisTime,
		DefaultClass: Chaotic,
		lyap: func(p map[string]float64) (Spectrum, error) {
			return mgLyapunov(mk(p), 1.2, mgLabelSpan)
		},
		initial: func(p map[string]float64, rng *rand.Rand) []float64 {
			return mk(p).start(rng)
		},
		lyapFrom: func(p map[string]float64, x0 []float64) (Spectrum, error) {
			return mgLyapunov(mk(p), x0[0], mgSeriesSpan)
		},
		threshold: 0.002,
		build: func(p map[string]float64) (Generator, float64, error) {
			return mk(p), p["dt"], nil
		},
	})
}
