package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// ForcedVanDerPol is the periodically forced van der Pol oscillator
// x” − μ(1 − x²)x' + x = A·cos(ω·t) (van der Pol & van der Mark, Nature
// 120 (1927) 363; volume and year as in zbmath.org Zbl 0793.34028, page (memory)), written autonomously as x' = y,
// y' = μ(1 − x²)y − x + A·cos θ, θ' = ω, with the forcing phase θ reduced
// modulo 2π between samples. Two frequencies compete, the limit cycle's
// and the forcing's: the motion is quasi-periodic (a 2-torus, two zero
// Lyapunov exponents), frequency-locked (a periodic orbit) or, for strong
// forcing of a strongly nonlinear oscillator, chaotic in thin windows
// (Parlitz & Lauterborn, Phys. Rev. A 36 (1987) 1428 (memory)). Integrated
// by RK4 with internal step ≤ 0.01 and observed through x (Obs 0) or
// y = x' (Obs 1). The divergence of the field is μ(1 − x²), so the
// exponents sum to the orbit average of μ(1 − x²) (Liouville, analytic).
type ForcedVanDerPol struct {
	Mu    float64 // nonlinearity μ > 0
	A     float64 // forcing amplitude
	Omega float64 // forcing angular frequency ω > 0
	Dt    float64 // sample interval in time units, > 0
	Obs   int     // recorded coordinate: 0 x, 1 x'
}

const (
	forcedVdpStep      = 0.01
	forcedVdpTransient = 200.0
)

// forcedVdpRule is the label rule: λ1 of the variational equations over
// 500 time units after the generator's 200 of transient, RK4 at h = 0.01,
// re-orthonormalised every time unit; Class starts from (1, 0, 0).
var forcedVdpRule = flowRule{h: forcedVdpStep, transient: forcedVdpTransient, span: 500, renorm: 1, k: 1}

func (m ForcedVanDerPol) dim() int { return 3 }

func (m ForcedVanDerPol) eval(dst, v []float64) {
	x, y := v[0], v[1]
	dst[0] = y
	dst[1] = m.Mu*(1-x*x)*y - x + m.A*math.Cos(v[2])
	dst[2] = m.Omega
}

func (m ForcedVanDerPol) jacobian(j, v []float64) {
	x, y := v[0], v[1]
	j[0], j[1], j[2] = 0, 1, 0
	j[3], j[4], j[5] = -2*m.Mu*x*y-1, m.Mu*(1-x*x), -m.A*math.Sin(v[2])
	j[6], j[7], j[8] = 0, 0, 0
}

func (m ForcedVanDerPol) wrap(v []float64) { v[2] = wrapAngle(v[2]) }

// wrapAngle reduces an angle to [0, 2π). The field depends on the forcing
// phase only through its cosine, so the reduction changes nothing but the
// growth of the coordinate.
func wrapAngle(a float64) float64 {
	if a >= 0 && a < 2*math.Pi {
		return a
	}
	a = math.Mod(a, 2*math.Pi)
	if a < 0 {
		a += 2 * math.Pi
	}
	if a >= 2*math.Pi { // −tiny + 2π rounds to 2π
		a = 0
	}
	return a
}

// start draws the initial state: (x, y) uniform in [−1, 1)², forcing
// phase uniform in [0, 2π).
func (m ForcedVanDerPol) start(rng *rand.Rand) []float64 {
	return []float64{2*rng.Float64() - 1, 2*rng.Float64() - 1, 2 * math.Pi * rng.Float64()}
}

// Generate returns n samples of the observed coordinate after a transient
// of 200 time units from a random start.
func (m ForcedVanDerPol) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if !(m.Mu > 0) || !(m.Omega > 0) || math.IsNaN(m.A) || math.IsInf(m.A, 0) {
		return nil, fmt.Errorf("forced-vdp: %w: mu = %g, omega = %g, a = %g, want mu > 0, omega > 0, finite a", ErrParamRange, m.Mu, m.Omega, m.A)
	}
	if err := checkObs("forced-vdp", m.Obs, 2); err != nil { // the phase is not observable
		return nil, err
	}
	return sampleFlow("forced-vdp", m, m.start(rng), n, m.Dt, forcedVdpStep, forcedVdpTransient, m.Obs)
}

func init() {
	mk := func(p map[string]float64) ForcedVanDerPol {
		return ForcedVanDerPol{Mu: p["mu"], A: p["a"], Omega: p["omega"], Dt: p["dt"], Obs: int(p["obs"])}
	}
	registerFlow(&System{
		Name:  "forced-vdp",
		Title: "periodically forced van der Pol oscillator x'' - mu (1 - x²) x' + x = a cos(omega t), RK4",
		Doc:   "Limit cycle under periodic forcing: quasi-periodic (2-torus) or frequency-locked motion, with thin chaotic windows at strong forcing and large mu. Internal RK4 step ≤ 0.01; transient 200 time units; random start in [-1, 1)² at a random forcing phase. The free period is 2π at small mu and about (3 - 2 ln 2) mu at large mu; the forcing period is 2π/omega. Label: chaotic when λ1 of the variational equations (orbit from (1, 0, 0), 500 time units after 200) exceeds 0.02 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "mu", Default: 1, Min: 0.1, Max: 10, Doc: "nonlinearity μ"},
			{Name: "a", Default: 0.5, Min: 0, Max: 10, Doc: "forcing amplitude A"},
			{Name: "omega", Default: GoldenMean, Min: 0.1, Max: 5, Doc: "forcing angular frequency ω (the free oscillator's is about 1)"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 1.5, Doc: "sample interval (time units); the free period is 2π at small mu (1.5: 4 samples per period), the forcing period 2π/omega"},
			obsParam("x", "x'"),
		},
		DefaultClass: Regular,
		threshold:    0.02,
	}, mk, fixedStart(1, 0, 0), forcedVdpRule)
}
