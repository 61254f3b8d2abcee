package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// LevyWalk is a random walk with heavy-tailed independent increments (a
// Lévy flight sampled at unit steps): x_k = x_{k−1} + ξ_k with x_{−1} = 0,
// where ξ is α-stable in the S0 form of Stable (Nu = 0) or Student-t with
// Nu degrees of freedom (Nu > 0, StudentT). For β = 0 the stable walk is
// self-similar: x_{m−1}/m^{1/α} has the law of one increment (stability
// under addition; Samorodnitsky & Taqqu, Stable Non-Gaussian Random
// Processes (1994) (memory)), so α = 2 is Brownian motion and smaller α
// gives rarer, larger jumps. The Student-t walk has finite variance for
// ν > 2 and then converges to Brownian motion on long scales.
//
// Values grow like m^{1/α} and are never clipped; they stay finite for any
// length a []float64 can hold.
type LevyWalk struct {
	Alpha, Beta float64 // stable increments (used when Nu = 0): 0 < Alpha ≤ 2, −1 ≤ Beta ≤ 1
	Nu          float64 // > 0 selects Student-t increments with Nu degrees of freedom
}

// Generate returns n samples of the walk: the increments are drawn first
// (Stable or StudentT with the same rng), then summed.
func (g LevyWalk) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	var step Generator = Stable{Alpha: g.Alpha, Beta: g.Beta}
	switch {
	case g.Nu > 0 && !math.IsInf(g.Nu, 0):
		step = StudentT{Nu: g.Nu}
	case g.Nu != 0:
		return nil, fmt.Errorf("levy-walk: nu = %g, want nu > 0 (Student-t increments) or 0 (stable)", g.Nu)
	default:
		if err := (Stable{Alpha: g.Alpha, Beta: g.Beta}).check("levy-walk"); err != nil {
			return nil, err
		}
	}
	x, err := step.Generate(n, rng)
	if err != nil {
		return nil, fmt.Errorf("levy-walk: %w", err)
	}
	for i := 1; i < len(x); i++ {
		x[i] += x[i-1]
	}
	return x, nil
}

func init() {
	registerNoise(&System{
		Name:  "levy-walk",
		Title: "heavy-tailed random walk (Lévy flight: α-stable or Student-t steps)",
		Doc:   "Cumulative sum of i.i.d. α-stable (S0, unit scale; increments = 0) or Student-t (increments = 1, nu degrees of freedom) steps; non-stationary, with rare large jumps. Label: stochastic.",
		Params: []Param{
			{Name: "increments", Default: 0, Min: 0, Max: 1, Integer: true, Doc: "step law: 0 α-stable, 1 Student-t"},
			{Name: "alpha", Default: 1.5, Min: 0.8, Max: 2, Doc: "stability index α of stable steps"},
			{Name: "beta", Default: 0, Min: -1, Max: 1, Doc: "skewness β of stable steps"},
			{Name: "nu", Default: 2, Min: 0.5, Max: 100, Doc: "degrees of freedom ν of Student-t steps"},
		},
		Invariants: []Invariant{
			{Name: "self_similarity", Value: 1 / 1.5, Unit: "", Source: "Samorodnitsky & Taqqu, Stable Non-Gaussian Random Processes (1994) (memory): x_m ~ m^{1/α} x_1 for β = 0"},
		},
	}, func(p map[string]float64) (Generator, error) {
		if p["increments"] == 1 {
			return LevyWalk{Nu: p["nu"]}, nil
		}
		return LevyWalk{Alpha: p["alpha"], Beta: p["beta"]}, nil
	})
}
