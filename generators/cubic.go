package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Cubic is the cubic map x' = r·x − x³ on [−2, 2]. At r = 3 it is conjugate
// to angle tripling (x = 2cos θ gives x' = −2cos 3θ, the Chebyshev
// polynomial), so its Lyapunov exponent is ln 3 (analytic).
//
// Like the logistic map at r = 4, a float orbit at r = 3 can land exactly on
// the repelling cycle ±2 or the fixed point 0 and stay there; Generate then
// redraws the state, a measure-zero event on the attractor.
type Cubic struct {
	R float64 // 0 < R ≤ 3
}

func (m Cubic) dim() int { return 1 }

func (m Cubic) next(dst, v []float64) { dst[0] = m.R*v[0] - v[0]*v[0]*v[0] }

func (m Cubic) jacobian(j, v []float64) { j[0] = m.R - 3*v[0]*v[0] }

// start draws the initial state of Generate: x0 uniform in (0.1, 1.9).
func (m Cubic) start(rng *rand.Rand) []float64 { return []float64{0.1 + 1.8*rng.Float64()} }

// Generate returns n iterates after the transient from a random x0 in
// (0.1, 1.9).
func (m Cubic) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(m.R > 0 && m.R <= 3) {
		return nil, fmt.Errorf("cubic: r = %g, want 0 < r ≤ 3", m.R)
	}
	// The bound 2 is the edge of the invariant interval at r = 3; below
	// r = 3 the attractor lies strictly inside it.
	x := m.start(rng)[0]
	out := make([]float64, n)
	for i := -mapTransient; i < n; i++ {
		x = m.R*x - x*x*x
		if math.Abs(x) >= 2 || (m.R > 1 && x == 0) {
			x = m.start(rng)[0]
		}
		if i >= 0 {
			out[i] = x
		}
	}
	return out, nil
}

func init() {
	registerMap(&System{
		Name:   "cubic",
		Title:  "cubic map x' = r x - x³",
		Doc:    "Chaotic at r = 3 (conjugate to angle tripling, λ = ln 3); symmetric period doubling below. Below r = 2 the orbit settles on a fixed point or 2-cycle, so r starts at 2.3. Label: chaotic when λ1 from the tangent map (orbit from 0.3, 10^5 iterations after 10^4) exceeds 0.01 per iteration.",
		Params: []Param{{Name: "r", Default: 3, Min: 2.3, Max: 3, Doc: "linear gain"}},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: math.Log(3), Unit: "per iteration", Source: "analytic: conjugacy to angle tripling via x = 2 cos θ, r = 3"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) Cubic { return Cubic{R: p["r"]} }, 0.3)
}
