package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// SineMap is the sine map x' = r·sin(πx) on [0, 1], a unimodal map with the
// same period-doubling route to chaos as the logistic map; it is chaotic at
// r = 1.
type SineMap struct {
	R float64 // amplitude, 0 < R ≤ 1
}

func (m SineMap) dim() int { return 1 }

func (m SineMap) next(dst, v []float64) { dst[0] = m.R * math.Sin(math.Pi*v[0]) }

func (m SineMap) jacobian(j, v []float64) { j[0] = m.R * math.Pi * math.Cos(math.Pi*v[0]) }

// Generate returns n iterates after the transient from a random x0 in
// (0.05, 0.95).
func (m SineMap) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if !(m.R > 0 && m.R <= 1) {
		return nil, fmt.Errorf("sine-map: r = %g, want 0 < r ≤ 1", m.R)
	}
	return iterateMap("sine-map", m, m.start(rng), n, 0)
}

// start draws the initial state of Generate: x0 uniform in (0.05, 0.95).
func (m SineMap) start(rng *rand.Rand) []float64 { return []float64{0.05 + 0.9*rng.Float64()} }

func init() {
	registerMap(&System{
		Name:         "sine-map",
		Title:        "sine map x' = r sin(pi x)",
		Doc:          "Chaotic at r = 1; period-doubling and periodic windows below. Below r ≈ 0.72 the orbit settles on a fixed point, so r starts at 0.75. Label: chaotic when λ1 from the tangent map (orbit from 0.3, 10^5 iterations after 10^4) exceeds 0.01 per iteration.",
		Params:       []Param{{Name: "r", Default: 1, Min: 0.75, Max: 1, Doc: "amplitude"}},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) SineMap { return SineMap{R: p["r"]} }, 0.3)
}
