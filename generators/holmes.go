package generators

import (
	"math"
	"math/rand/v2"
)

// Holmes is the Holmes cubic map, a discrete analogue of the forced Duffing
// oscillator (Holmes, Phil. Trans. R. Soc. A 292 (1979) 419):
//
//	x' = y,  y' = −b·x + a·y − y³,
//
// observed through x (Obs = 0) or y (Obs = 1). Its Jacobian
// [[0, 1], [−b, a − 3y²]] has determinant b everywhere, so
// λ1 + λ2 = ln b (analytic). It is chaotic at a = 2.75, b = 0.2 and shows
// period doubling and periodic windows for smaller a.
type Holmes struct {
	A, B float64
	Obs  int // observed coordinate: 0 = x, 1 = y
}

func (m Holmes) dim() int { return 2 }

func (m Holmes) next(dst, v []float64) {
	y := v[1]
	dst[0] = y
	dst[1] = -m.B*v[0] + m.A*y - y*y*y
}

func (m Holmes) jacobian(j, v []float64) {
	j[0], j[1] = 0, 1
	j[2], j[3] = -m.B, m.A-3*v[1]*v[1]
}

// start draws the initial state of Generate: uniform in (0.5, 1.5)², in
// the basin of the positive attractor (the map is odd, so (−x, −y) has a
// mirror attractor where the two are separate).
func (m Holmes) start(rng *rand.Rand) []float64 {
	return []float64{0.5 + rng.Float64(), 0.5 + rng.Float64()}
}

// Generate returns n values of the observed coordinate after mapTransient
// iterations.
func (m Holmes) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return iterateMap("holmes", m, m.start(rng), n, m.Obs)
}

func init() {
	registerMap(&System{
		Name:  "holmes",
		Title: "Holmes cubic map x' = y, y' = -b x + a y - y³ (observed x or y)",
		Doc:   "Chaotic at a = 2.75, b = 0.2 (Holmes 1979); period doubling and periodic windows for smaller a (period orbits at a = 2.5, 2.63; quasi-periodic near 2.61 and 2.65). λ1 + λ2 = ln b (det J = b). Label: chaotic when λ1 of the tangent map (orbit from (1, 1), 10^5 iterations after 10^4; per series from the drawn start after the 1000-iteration transient) exceeds 0.01 per iteration, otherwise regular.",
		Params: []Param{
			{Name: "a", Default: 2.75, Min: 2.45, Max: 2.77, Doc: "gain a (below ≈ 2.4 the orbit settles on a fixed point; above 2.77 orbits escape)"},
			{Name: "b", Default: 0.2, Min: 0.1, Max: 0.25, Doc: "contraction b (det J = b; from b ≈ 0.27 some orbits escape)"},
			obsParam("x", "y"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: math.Log(0.2), Unit: "per iteration", Source: "analytic: ln|det J| = ln b"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) Holmes { return Holmes{A: p["a"], B: p["b"], Obs: int(p["obs"])} }, 1, 1)
}
