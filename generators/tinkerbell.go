package generators

import "math/rand/v2"

// Tinkerbell is the Tinkerbell map x' = x² − y² + a·x + b·y,
// y' = 2·x·y + c·x + d·y, observed through x (Obs = 0) or y (Obs = 1).
// At a = 0.9, b = −0.6013, c = 2, d = 0.5 it has a chaotic attractor whose
// basin is small: orbits start near (−0.72, −0.64).
type Tinkerbell struct {
	A, B, C, D float64
	Obs        int // observed coordinate: 0 = x, 1 = y
}

func (m Tinkerbell) dim() int { return 2 }

func (m Tinkerbell) next(dst, v []float64) {
	x, y := v[0], v[1]
	dst[0] = x*x - y*y + m.A*x + m.B*y
	dst[1] = 2*x*y + m.C*x + m.D*y
}

func (m Tinkerbell) jacobian(j, v []float64) {
	x, y := v[0], v[1]
	j[0], j[1] = 2*x+m.A, -2*y+m.B
	j[2], j[3] = 2*y+m.C, 2*x+m.D
}

// start draws the initial state of Generate: uniform within 0.01 of
// (−0.72, −0.64).
func (m Tinkerbell) start(rng *rand.Rand) []float64 {
	return []float64{-0.72 + 0.02*(rng.Float64()-0.5), -0.64 + 0.02*(rng.Float64()-0.5)}
}

// Generate returns n values of the observed coordinate after the
// transient, started at a random point within 0.01 of (−0.72, −0.64).
func (m Tinkerbell) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return iterateMap("tinkerbell", m, m.start(rng), n, m.Obs)
}

func init() {
	registerMap(&System{
		Name:  "tinkerbell",
		Title: "Tinkerbell map (observed x)",
		Doc:   "x' = x² - y² + a x + b y, y' = 2 x y + c x + d y; chaotic at a = 0.9, b = -0.6013, c = 2, d = 0.5. The classical set sits next to a crisis (b below -0.6013 or c above 2 lets orbits escape), so parameters move only a little, towards the interior; escapes are reported as ErrDiverged. Label: chaotic when λ1 from the tangent map (orbit from (-0.72, -0.64), 10^5 iterations after 10^4) exceeds 0.01 per iteration.",
		Params: []Param{
			{Name: "a", Default: 0.9, Min: 0.8, Max: 0.9, Doc: "coefficient a"},
			{Name: "b", Default: -0.6013, Min: -0.6013, Max: -0.58, Doc: "coefficient b"},
			{Name: "c", Default: 2, Min: 1.95, Max: 2, Doc: "coefficient c"},
			{Name: "d", Default: 0.5, Min: 0.4, Max: 0.5, Doc: "coefficient d"},
			obsParam("x", "y"),
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) Tinkerbell {
		return Tinkerbell{A: p["a"], B: p["b"], C: p["c"], D: p["d"], Obs: int(p["obs"])}
	}, -0.72, -0.64)
}
