package generators

import "math/rand/v2"

// DelayedLogistic is the delayed logistic map x_{t+1} = A·x_t·(1 − x_{t−1}),
// written as x' = A·x·(1 − y), y' = x and observed through x (Obs = 0) or
// y (Obs = 1, the same series one step late). Its fixed point loses
// stability to an invariant circle at A = 2 (a Neimark–Sacker
// bifurcation) and the circle breaks into chaos near A ≈ 2.27.
type DelayedLogistic struct {
	A   float64
	Obs int // observed coordinate: 0 = x, 1 = y
}

func (m DelayedLogistic) dim() int { return 2 }

func (m DelayedLogistic) next(dst, v []float64) {
	dst[0] = m.A * v[0] * (1 - v[1])
	dst[1] = v[0]
}

func (m DelayedLogistic) jacobian(j, v []float64) {
	j[0], j[1] = m.A*(1-v[1]), -m.A*v[0]
	j[2], j[3] = 1, 0
}

// start draws the initial state of Generate: uniform within 0.05 of the
// fixed point (1 − 1/A, 1 − 1/A).
func (m DelayedLogistic) start(rng *rand.Rand) []float64 {
	f := 1 - 1/m.A
	return []float64{f + 0.1*(rng.Float64()-0.5), f + 0.1*(rng.Float64()-0.5)}
}

// Generate returns n values of the observed coordinate after the
// transient, started at a random point within 0.05 of the fixed point.
func (m DelayedLogistic) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return iterateMap("delayed-logistic", m, m.start(rng), n, m.Obs)
}

func init() {
	registerMap(&System{
		Name:         "delayed-logistic",
		Title:        "delayed logistic map x' = A x (1 - y), y' = x (observed x)",
		Doc:          "Quasi-periodic (invariant circle) for 2 < A ≲ 2.27 and chaotic near A = 2.27. Orbits are started near the fixed point; escapes are reported as ErrDiverged. Label: chaotic when λ1 from the tangent map (orbit from (0.56, 0.56), 10^5 iterations after 10^4) exceeds 0.01 per iteration, otherwise regular.",
		Params:       []Param{{Name: "a", Default: 2.27, Min: 2.01, Max: 2.27, Doc: "growth parameter"}, obsParam("x", "y (x one step earlier)")},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) DelayedLogistic { return DelayedLogistic{A: p["a"], Obs: int(p["obs"])} }, 0.56, 0.56)
}
