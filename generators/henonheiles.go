package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// HenonHeiles is the Hénon–Heiles Hamiltonian flow (Hénon & Heiles,
// Astron. J. 69 (1964) 73) with
//
//	H = (p_x² + p_y²)/2 + (x² + y²)/2 + x²·y − y³/3,
//
// dx/dt = p_x, dy/dt = p_y, dp_x/dt = −x − 2xy, dp_y/dt = −y − x² + y²,
// integrated by RK4 with internal step ≤ 0.02 and observed through x
// (Obs = 0; y, p_x, p_y with Obs = 1, 2, 3). The energy E = H is conserved
// (RK4 loses less than 10^−6 of it over 4·10^4 time units at this step,
// measured) and the flow is symplectic, so the exponents come in pairs
// ±λ and sum to zero (analytic; divergence 0). Below the escape energy
// E = 1/6 the motion is bounded and the phase space mixed: at E = 1/12
// nearly every orbit lies on an invariant torus, and as E grows a chaotic
// sea spreads over the energy shell until near 1/6 it covers almost all
// of it (Hénon & Heiles 1964). Of starts drawn as below, 28 of 40 are
// chaotic at E = 1/8, 31 of 40 at E = 0.14 and all 40 at E = 0.1657 (λ1
// over 3000 time units, measured). The same E therefore gives regular and
// chaotic series depending on the start, which Generate draws on the
// energy shell: on the surface of section x = 0, (y, p_y) uniform over
// the region the energy allows and p_x = +√(2E − p_y² − y² + 2y³/3).
type HenonHeiles struct {
	E   float64 // energy, 0 < E < 1/6
	Dt  float64 // sample interval in time units, > 0
	Obs int     // observed coordinate: 0 = x, 1 = y, 2 = p_x, 3 = p_y
}

const (
	henonHeilesStep      = 0.02
	henonHeilesTransient = 10.0
)

func (m HenonHeiles) dim() int { return 4 }

func (m HenonHeiles) eval(dst, v []float64) {
	x, y := v[0], v[1]
	dst[0] = v[2]
	dst[1] = v[3]
	dst[2] = -x - 2*x*y
	dst[3] = -y - x*x + y*y
}

func (m HenonHeiles) jacobian(j, v []float64) {
	x, y := v[0], v[1]
	j[0], j[1], j[2], j[3] = 0, 0, 1, 0
	j[4], j[5], j[6], j[7] = 0, 0, 0, 1
	j[8], j[9], j[10], j[11] = -1-2*y, -2*x, 0, 0
	j[12], j[13], j[14], j[15] = -2*x, -1+2*y, 0, 0
}

// henonHeilesEnergy returns H at the state v = (x, y, p_x, p_y).
func henonHeilesEnergy(v []float64) float64 {
	x, y, px, py := v[0], v[1], v[2], v[3]
	return (px*px+py*py)/2 + (x*x+y*y)/2 + x*x*y - y*y*y/3
}

// onShell returns the state (0, y, p_x, p_y) of energy E with p_x ≥ 0 and
// false when the energy does not reach (y, p_y).
func (m HenonHeiles) onShell(y, py float64) ([]float64, bool) {
	k := 2*m.E - py*py - y*y + 2*y*y*y/3
	if !(k >= 0) || y >= 1 {
		return nil, false
	}
	return []float64{0, y, math.Sqrt(k), py}, true
}

// start draws the initial state of Generate on the energy shell: (y, p_y)
// uniform over the part of the section x = 0 the energy reaches (by
// rejection from [−1, 1) × [−√(2E), √(2E)), which contains it for
// E < 1/6: y²/2 − y³/3 ≤ E < 1/6 holds only for y > −1 on the bounded
// side y < 1), p_x ≥ 0 from the energy.
func (m HenonHeiles) start(rng *rand.Rand) []float64 {
	pm := math.Sqrt(2 * m.E)
	for {
		y := 2*rng.Float64() - 1
		py := pm * (2*rng.Float64() - 1)
		if v, ok := m.onShell(y, py); ok {
			return v
		}
	}
}

func (m HenonHeiles) check() error {
	if !(m.E > 0 && m.E < 1.0/6) {
		return fmt.Errorf("henon-heiles: %w: e = %g, want 0 < e < 1/6 (bounded motion)", ErrParamRange, m.E)
	}
	return nil
}

// Generate returns n samples of the observed coordinate, started on the
// energy shell, after 10 time units.
func (m HenonHeiles) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := m.check(); err != nil {
		return nil, err
	}
	return sampleFlow("henon-heiles", m, m.start(rng), n, m.Dt, henonHeilesStep, henonHeilesTransient, m.Obs)
}

// henonHeilesClassStart is the fixed start of the parameter-only label
// rule: (0, −0.1, p_x, 0) on the energy shell, in the chaotic sea at
// E = 1/8 (λ1 ≈ 0.047 per time unit over 5000 time units, measured).
func henonHeilesClassStart(p map[string]float64) []float64 {
	v, _ := HenonHeiles{E: p["e"]}.onShell(-0.1, 0)
	return v
}

func init() {
	registerFlow(&System{
		Name:  "henon-heiles",
		Title: "Hénon–Heiles Hamiltonian flow at energy E, started on the energy shell (observed x), RK4",
		Doc:   "H = (px² + py²)/2 + (x² + y²)/2 + x² y - y³/3 (Hénon & Heiles 1964), bounded below E = 1/6; mostly invariant tori at E = 1/12, a chaotic sea growing with E that covers almost all of the shell near 1/6 (of drawn starts, 70% chaotic at E = 1/8, measured). Starts drawn on the energy shell: on the section x = 0, (y, py) uniform over the allowed region, px ≥ 0 from E. Energy conserved, exponents in ± pairs summing to 0. Internal RK4 step ≤ 0.02; 10 time units discarded. Label (per series): chaotic when λ1 of the variational equations (5000 time units from the drawn start) exceeds 0.005 per time unit, otherwise regular (tori measure 0.001-0.002 over that span); the parameter-only label (Class) follows the orbit from (0, -0.1, px, 0).",
		Params: []Param{
			{Name: "e", Default: 0.125, Min: 0.08, Max: 0.166, Doc: "energy E (escape at 1/6)"},
			{Name: "dt", Default: 0.1, Min: 1e-3, Max: 2, Doc: "sample interval (time units); the small-oscillation period is 2π"},
			obsParam("x", "y", "px", "py"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: 0, Unit: "per time unit", Source: "analytic: Hamiltonian flow, divergence 0 (exponents in ± pairs)"},
			{Name: "energy", Value: 0.125, Unit: "", Source: "analytic: H is conserved along every orbit (Hénon & Heiles 1964)"},
		},
		DefaultClass: Chaotic,
		threshold:    0.005,
	}, func(p map[string]float64) HenonHeiles {
		return HenonHeiles{E: p["e"], Dt: p["dt"], Obs: int(p["obs"])}
	}, henonHeilesClassStart, flowRule{h: henonHeilesStep, transient: henonHeilesTransient, span: 5000, renorm: 1})
}
