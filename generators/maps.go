package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// mapTransient is the number of iterations discarded before a map's orbit is
// recorded: long enough for the orbit to settle on its attractor from a random
// start (common practice; the maps here contract onto their attractors within
// a few dozen iterations).
const mapTransient = 1000

// Logistic is the logistic map x' = r·x·(1−x) on [0, 1]. It is chaotic at
// r = 4, where its largest Lyapunov exponent is ln 2 and its invariant density
// is 1/(π√(x(1−x))) (Ulam & von Neumann 1947), and periodic in windows such
// as r = 3.5 (period 4) and r = 3.83 (period 3).
type Logistic struct {
	R float64 // growth parameter, 0 < R ≤ 4
}

// Generate returns n iterates after the transient, started from a random x0
// in (0.05, 0.95).
func (m Logistic) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(m.R > 0 && m.R <= 4) {
		return nil, fmt.Errorf("logistic: r = %g, want 0 < r ≤ 4", m.R)
	}
	x := 0.05 + 0.9*rng.Float64()
	out := make([]float64, n)
	for i := -mapTransient; i < n; i++ {
		x = m.R * x * (1 - x)
		// In floating point an orbit at r = 4 can land exactly on the
		// repelling fixed point 0 (via x = 0.5 → 1 → 0) and stay there;
		// nudge it back onto the attractor with a fresh draw.
		if x <= 0 || x >= 1 {
			x = 0.05 + 0.9*rng.Float64()
		}
		if i >= 0 {
			out[i] = x
		}
	}
	return out, nil
}

// LogisticLyapunov returns the largest Lyapunov exponent of the logistic map
// at r, the orbit average of ln|r(1−2x)|, from a fixed start and iters
// iterations after a transient. It is the labelling rule of the registry:
// positive means chaotic, otherwise the orbit is periodic (regular).
func LogisticLyapunov(r float64, iters int) float64 {
	x := 0.3141592653589793
	for i := 0; i < 10*mapTransient; i++ {
		x = r * x * (1 - x)
	}
	var sum float64
	for i := 0; i < iters; i++ {
		d := math.Abs(r * (1 - 2*x))
		if d < 1e-300 {
			d = 1e-300
		}
		sum += math.Log(d)
		x = r * x * (1 - x)
	}
	return sum / float64(iters)
}

// Henon is the Hénon map x' = 1 − a·x² + y, y' = b·x, observed through x.
// At a = 1.4, b = 0.3 its Lyapunov exponents are λ1 ≈ 0.419 per iteration and
// λ1 + λ2 = ln b (Sprott 2003).
type Henon struct {
	A, B float64
}

// Generate returns n values of x after the transient, started near the
// attractor at a random point of (−0.1, 0.1)².
func (m Henon) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	x, y := 0.2*rng.Float64()-0.1, 0.2*rng.Float64()-0.1
	out := make([]float64, n)
	for i := -mapTransient; i < n; i++ {
		x, y = 1-m.A*x*x+y, m.B*x
		if math.IsInf(x, 0) || math.IsNaN(x) || math.Abs(x) > 1e6 {
			return nil, fmt.Errorf("henon: orbit escaped to infinity at a = %g, b = %g", m.A, m.B)
		}
		if i >= 0 {
			out[i] = x
		}
	}
	return out, nil
}

func init() {
	register(&System{
		Name:  "logistic",
		Title: "logistic map x' = r x (1 - x)",
		Doc:   "Chaotic at r = 4; periodic windows at r = 3.5 (period 4) and r = 3.83 (period 3). Label: chaotic when the map's Lyapunov exponent at r, computed from the equation over 10^5 iterations, exceeds 0.01; otherwise regular.",
		Params: []Param{
			{Name: "r", Default: 4, Min: 0.01, Max: 4, Doc: "growth parameter"},
		},
		Invariants: []Invariant{
			{Name: "lyap_max", Value: math.Ln2, Unit: "per iteration", Source: "analytic (conjugacy to the tent map), r = 4"},
			{Name: "invariant_density", Value: math.NaN(), Unit: "1/(π√(x(1−x)))", Source: "Ulam & von Neumann (1947), analytic, r = 4"},
		},
		TimeAxis: "iteration",
		label: func(p map[string]float64) Class {
			if LogisticLyapunov(p["r"], 100000) > 0.01 {
				return Chaotic
			}
			return Regular
		},
		build: func(p map[string]float64) (Generator, float64, error) {
			return Logistic{R: p["r"]}, 1, nil
		},
	})
	register(&System{
		Name:  "henon",
		Title: "Hénon map x' = 1 - a x² + y, y' = b x (observed x)",
		Doc:   "Chaotic at the classical a = 1.4, b = 0.3.",
		Params: []Param{
			{Name: "a", Default: 1.4, Min: 0, Max: 1.42, Doc: "nonlinearity"},
			{Name: "b", Default: 0.3, Min: -1, Max: 1, Doc: "contraction (Jacobian determinant is -b)"},
		},
		Invariants: []Invariant{
			{Name: "lyap_max", Value: 0.41922, Unit: "per iteration", Source: "Sprott, Chaos and Time-Series Analysis (2003), appendix (memory)"},
			{Name: "lyap_sum", Value: math.Log(0.3), Unit: "per iteration", Source: "analytic: ln|det J| = ln b"},
			{Name: "corr_dim", Value: 1.21, Unit: "", Source: "Grassberger & Procaccia, Physica D 9 (1983) 189 (memory)"},
		},
		TimeAxis: "iteration",
		label:    fixed(Chaotic),
		build: func(p map[string]float64) (Generator, float64, error) {
			return Henon{A: p["a"], B: p["b"]}, 1, nil
		},
	})
}
