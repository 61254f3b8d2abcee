package generators

import (
	"math"
	"math/rand/v2"
)

// Lozi is the Lozi map x' = 1 − a·|x| + y, y' = b·x, a piecewise-linear
// relative of the Hénon map (Lozi, J. Phys. Colloques 39 (1978) C5-9),
// observed through x (Obs = 0) or y (Obs = 1). Its Jacobian determinant is −b, so λ1 + λ2 = ln|b|
// (analytic).
type Lozi struct {
	A, B float64
	Obs  int // observed coordinate: 0 = x, 1 = y
}

func (m Lozi) dim() int { return 2 }

func (m Lozi) next(dst, v []float64) {
	dst[0] = 1 - m.A*math.Abs(v[0]) + v[1]
	dst[1] = m.B * v[0]
}

func (m Lozi) jacobian(j, v []float64) {
	s := 1.0
	if v[0] < 0 {
		s = -1
	}
	j[0], j[1] = -m.A*s, 1
	j[2], j[3] = m.B, 0
}

// start draws the initial state of Generate: uniform in (−0.1, 0.1)².
func (m Lozi) start(rng *rand.Rand) []float64 {
	return []float64{0.2*rng.Float64() - 0.1, 0.2*rng.Float64() - 0.1}
}

// Generate returns n values of the observed coordinate after the
// transient, started at a random point of (−0.1, 0.1)².
func (m Lozi) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return iterateMap("lozi", m, m.start(rng), n, m.Obs)
}

func init() {
	registerMap(&System{
		Name:  "lozi",
		Title: "Lozi map x' = 1 - a|x| + y, y' = b x (observed x)",
		Doc:   "Chaotic at the classical a = 1.7, b = 0.5 (Lozi 1978). Some (a, b) let the orbit escape (ErrDiverged). Label: chaotic when λ1 from the tangent map (orbit from (0, 0), 10^5 iterations after 10^4) exceeds 0.01 per iteration.",
		Params: []Param{
			{Name: "a", Default: 1.7, Min: 1, Max: 1.75, Doc: "slope of the tent-like fold"},
			{Name: "b", Default: 0.5, Min: 0.05, Max: 0.6, Doc: "contraction (Jacobian determinant is -b)"},
			obsParam("x", "y"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: math.Log(0.5), Unit: "per iteration", Source: "analytic: ln|det J| = ln b"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) Lozi { return Lozi{A: p["a"], B: p["b"], Obs: int(p["obs"])} }, 0, 0)
}
