package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Tent is the tent map x' = μ·min(x, 1 − x) on [0, 1]. Its slope is ±μ
// everywhere, so its Lyapunov exponent is ln μ for 1 < μ ≤ 2 (analytic).
//
// At μ = 2 exactly the map doubles and every float orbit collapses onto 0
// within 53 iterations (each doubling shifts a mantissa bit out), so the
// default is μ = 1.9999, whose products are not exact and keep the orbit on
// the attractor [μ(1 − μ/2), μ/2].
type Tent struct {
	Mu float64 // slope, 1 < Mu < 2
}

func (m Tent) dim() int { return 1 }

func (m Tent) next(dst, v []float64) { dst[0] = m.Mu * math.Min(v[0], 1-v[0]) }

func (m Tent) jacobian(j, v []float64) {
	j[0] = m.Mu
	if v[0] > 0.5 {
		j[0] = -m.Mu
	}
}

// Generate returns n iterates after the transient from a random x0 in
// (0.05, 0.95).
func (m Tent) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if !(m.Mu > 1 && m.Mu < 2) {
		return nil, fmt.Errorf("tent: mu = %g, want 1 < mu < 2 (mu = 2 collapses in floating point)", m.Mu)
	}
	return iterateMap("tent", m, m.start(rng), n, 0)
}

// start draws the initial state of Generate: x0 uniform in (0.05, 0.95).
func (m Tent) start(rng *rand.Rand) []float64 { return []float64{0.05 + 0.9*rng.Float64()} }

func init() {
	registerMap(&System{
		Name:   "tent",
		Title:  "tent map x' = mu min(x, 1 - x)",
		Doc:    "Chaotic for every 1 < mu < 2 (λ = ln mu). mu = 2 is excluded because float orbits of the doubling collapse onto 0; the default 1.9999 is the documented stand-in. Label: chaotic when λ1 from the tangent map (orbit from 0.3, 10^5 iterations after 10^4) exceeds 0.01 per iteration, i.e. mu > e^0.01 ≈ 1.01.",
		Params: []Param{{Name: "mu", Default: 1.9999, Min: 1.001, Max: 1.99999, Doc: "slope"}},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: math.Log(1.9999), Unit: "per iteration", Source: "analytic: |slope| = mu everywhere, λ = ln mu"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) Tent { return Tent{Mu: p["mu"]} }, 0.3)
}
