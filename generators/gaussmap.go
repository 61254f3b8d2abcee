package generators

import (
	"math"
	"math/rand/v2"
)

// GaussMap is the Gauss ("mouse") map x' = exp(−α·x²) + β, a unimodal map
// with a smooth maximum whose bifurcation diagram in β shows chaotic bands
// and periodic windows.
type GaussMap struct {
	Alpha, Beta float64
}

func (m GaussMap) dim() int { return 1 }

func (m GaussMap) next(dst, v []float64) { dst[0] = math.Exp(-m.Alpha*v[0]*v[0]) + m.Beta }

func (m GaussMap) jacobian(j, v []float64) {
	j[0] = -2 * m.Alpha * v[0] * math.Exp(-m.Alpha*v[0]*v[0])
}

// start draws the initial state of Generate: x0 uniform in (−0.5, 0.5).
func (m GaussMap) start(rng *rand.Rand) []float64 { return []float64{rng.Float64() - 0.5} }

// Generate returns n iterates after the transient from a random x0 in
// (−0.5, 0.5).
func (m GaussMap) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return iterateMap("gauss-map", m, m.start(rng), n, 0)
}

func init() {
	registerMap(&System{
		Name:  "gauss-map",
		Title: "Gauss (mouse) map x' = exp(-alpha x²) + beta",
		Doc:   "Chaotic bands and periodic windows as beta varies. Label: chaotic when λ1 from the tangent map (orbit from 0.1, 10^5 iterations after 10^4) exceeds 0.01 per iteration, otherwise regular.",
		Params: []Param{
			{Name: "alpha", Default: 6.2, Min: 4, Max: 8, Doc: "width parameter"},
			{Name: "beta", Default: -0.55, Min: -0.8, Max: -0.3, Doc: "offset"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) GaussMap { return GaussMap{Alpha: p["alpha"], Beta: p["beta"]} }, 0.1)
}
