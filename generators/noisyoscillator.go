package generators

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/integrate/quad"
)

// NoisyOscillator is a linear damped harmonic oscillator driven by white
// noise,
//
//	ẍ + γ ẋ + ω0² x = σ ξ(t),   ω0 = 2π/Period,  γ = ω0/Q,
//
// sampled once per time unit (Period is in samples) and scaled to unit
// variance (σ² = 2γω0²). It is narrow-band noise: its continuous-time
// spectrum is the squared transfer function
//
//	S(ω) = σ² / ((ω0² − ω²)² + γ²ω²),
//
// a Lorentzian-like peak at ω0√(1 − 1/(2Q²)) of half-power width ≈ γ for
// large Q (standard result for a driven damped oscillator), aliased by the
// sampling to S_d(ω) = Σ_m S(ω + 2πm); its autocorrelation is
// e^{−γk/2}(C(k) + (γ/2) S(k)) with C(t) = cos ω_d t, S(t) = sin(ω_d t)/ω_d,
// ω_d² = ω0² − γ²/4 (cosh and sinh when ω_d² < 0; 1 and t at critical
// damping, Q = ½).
//
// Exact discretisation: the state X = (x, ẋ) is a two-dimensional OU
// process (Gillespie, Phys. Rev. E 54 (1996) 2084, for the scalar case),
// X_{k+1} = M X_k + L η_k with M = e^{A} for A = [[0, 1], [−ω0², −γ]], η
// standard normal pairs, and L the Cholesky factor of the one-step noise
// covariance Σ = σ² ∫_0^1 m(s) m(s)ᵀ ds, m(s) = e^{As}(0, 1)ᵀ =
// e^{−γs/2}(S(s), C(s) − (γ/2) S(s)). Σ is integrated by 20-point
// Gauss–Legendre quadrature of the smooth integrand (rather than as
// P − MPMᵀ, which cancels catastrophically for slow oscillators). The
// state starts from its stationary law N(0, diag(1, ω0²)), so no burn-in
// is needed.
type NoisyOscillator struct {
	Q      float64 // quality factor, ≥ 0.5
	Period float64 // undamped period 2π/ω0 (samples), > 0
}

// oscCS returns C(t) and S(t) for ω_d² = w2, by series near ω_d² t² = 0
// (critical damping) so that both stay accurate across it.
func oscCS(w2, t float64) (c, s float64) {
	z := w2 * t * t
	switch {
	case math.Abs(z) < 1e-3:
		// Taylor series of cos √z and sin √z / √z; the next terms are
		// below 1e−3⁴/40320 ≈ 2.5·10^{−17}.
		c = 1 - z/2*(1-z/12*(1-z/30))
		s = t * (1 - z/6*(1-z/20*(1-z/42)))
	case w2 > 0:
		w := math.Sqrt(w2)
		c, s = math.Cos(w*t), math.Sin(w*t)/w
	default:
		w := math.Sqrt(-w2)
		c, s = math.Cosh(w*t), math.Sinh(w*t)/w
	}
	return c, s
}

// oscStep returns the one-sample transition matrix M (row-major 2×2) and
// the noise covariance Σ (Σ11, Σ12, Σ22) for unit stationary variance of x.
func (g NoisyOscillator) oscStep() (m [4]float64, s11, s12, s22 float64) {
	w0 := 2 * math.Pi / g.Period
	gam := w0 / g.Q
	w2 := w0*w0 - gam*gam/4
	sig2 := 2 * gam * w0 * w0
	c, s := oscCS(w2, 1)
	e := math.Exp(-gam / 2)
	m = [4]float64{e * (c + gam/2*s), e * s, -e * w0 * w0 * s, e * (c - gam/2*s)}
	const nodes = 20
	x := make([]float64, nodes)
	wt := make([]float64, nodes)
	quad.Legendre{}.FixedLocations(x, wt, 0, 1)
	for i, u := range x {
		c, s := oscCS(w2, u)
		e := math.Exp(-gam * u / 2)
		a, b := e*s, e*(c-gam/2*s)
		s11 += wt[i] * a * a
		s12 += wt[i] * a * b
		s22 += wt[i] * b * b
	}
	return m, sig2 * s11, sig2 * s12, sig2 * s22
}

// Generate returns n samples of x.
func (g NoisyOscillator) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(g.Q >= 0.5 && g.Period > 0) || math.IsInf(g.Q+g.Period, 0) {
		return nil, fmt.Errorf("noisy-oscillator: q = %g, period = %g, want q ≥ 0.5 and period > 0, finite", g.Q, g.Period)
	}
	m, s11, s12, s22 := g.oscStep()
	l11 := math.Sqrt(s11)
	l21 := s12 / l11
	l22 := math.Sqrt(math.Max(0, s22-l21*l21))
	w0 := 2 * math.Pi / g.Period
	x, v := rng.NormFloat64(), w0*rng.NormFloat64()
	out := make([]float64, n)
	for i := range out {
		out[i] = x
		a, b := rng.NormFloat64(), rng.NormFloat64()
		x, v = m[0]*x+m[1]*v+l11*a, m[2]*x+m[3]*v+l21*a+l22*b
	}
	return out, nil
}

func init() {
	registerNoise(&System{
		Name:  "noisy-oscillator",
		Title: "white-noise-driven damped harmonic oscillator (narrow-band noise)",
		Doc:   "x'' + (w0/q) x' + w0² x = white noise with w0 = 2π/period (samples), exact two-dimensional OU discretisation, unit variance, stationary start: a noisy resonance of quality factor q. Label: stochastic.",
		Params: []Param{
			{Name: "q", Default: 10, Min: 0.5, Max: 50, Doc: "quality factor Q (0.5 critical damping)"},
			{Name: "period", Default: 20, Min: 4, Max: 1e5, Doc: "undamped period 2π/ω0 (samples)"},
		},
		Invariants: []Invariant{
			{Name: "peak_frequency", Value: 2 * math.Pi / 20 * math.Sqrt(1-1/(2*100.0)), Unit: "rad per sample", Source: "standard result for a driven damped oscillator: ω0 √(1 - 1/(2Q²))"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return NoisyOscillator{Q: p["q"], Period: p["period"]}, nil
	})
}
