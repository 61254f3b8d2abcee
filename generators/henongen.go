package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// HenonGen is the generalised Hénon map of dimension d (Baier & Klein,
// Phys. Lett. A 151 (1990) 281):
//
//	x_1' = a − x_{d−1}² − b·x_d,  x_i' = x_{i−1}  (i = 2, ..., d),
//
// observed through x_{Obs+1}. For d = 2 it is the Hénon map up to a change
// of variables; for d ≥ 3 it is hyperchaotic at a = 1.76, b = 0.1, with
// d − 1 positive exponents for small d. The Jacobian is a companion
// matrix with |det J| = |b| everywhere, so the exponents sum to ln|b|
// (analytic). In 0-based indices the state v = (x_1, ..., x_d) maps to
// v_0' = a − v_{d−2}² − b·v_{d−1}, v_i' = v_{i−1}.
type HenonGen struct {
	D    int     // dimension, ≥ 3
	A, B float64 // nonlinearity a, contraction b
	Obs  int     // observed coordinate, 0 ≤ Obs < D
}

func (m HenonGen) dim() int { return m.D }

// leading: the label rule follows λ1 and λ2 (two positive exponents mark
// hyperchaos); the full spectrum costs O(d²) per iteration for nothing
// the label needs.
func (m HenonGen) leading() int { return 2 }

func (m HenonGen) next(dst, v []float64) {
	d := m.D
	dst[0] = m.A - v[d-2]*v[d-2] - m.B*v[d-1]
	copy(dst[1:d], v[:d-1])
}

// tangent stores J(v)·w in dst in O(d).
func (m HenonGen) tangent(dst, v, w []float64) {
	d := m.D
	dst[0] = -2*v[d-2]*w[d-2] - m.B*w[d-1]
	copy(dst[1:d], w[:d-1])
}

func (m HenonGen) jacobian(j, v []float64) {
	d := m.D
	clear(j[:d*d])
	j[d-2] = -2 * v[d-2]
	j[d-1] = -m.B
	for i := 1; i < d; i++ {
		j[i*d+i-1] = 1
	}
}

// start draws the initial state of Generate: every coordinate uniform in
// (−0.1, 0.1), inside the basin of the attractor at the defaults.
func (m HenonGen) start(rng *rand.Rand) []float64 {
	v := make([]float64, m.D)
	for i := range v {
		v[i] = 0.2*rng.Float64() - 0.1
	}
	return v
}

// Generate returns n values of x_{Obs+1} after mapTransient iterations.
func (m HenonGen) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if m.D < 3 || math.IsNaN(m.A) || math.IsNaN(m.B) {
		return nil, fmt.Errorf("henon-gen: %w: d = %d, want d ≥ 3", ErrParamRange, m.D)
	}
	return iterateMap("henon-gen", m, m.start(rng), n, m.Obs)
}

func init() {
	registerMapFrom(&System{
		Name:  "henon-gen",
		Title: "generalised Hénon map x1' = a - x_(d-1)² - b x_d, x_i' = x_(i-1) (dimension d, observed one coordinate)",
		Doc:   "Hyperchaos (several positive exponents) at a = 1.76, b = 0.1 (Baier & Klein 1990); smaller a gives periodic orbits and quasi-periodic motion, and some (a, b, d) let orbits escape (ErrDiverged). The exponents sum to ln b (|det J| = b). Label: chaotic when λ1 of the tangent map (λ1 and λ2 computed; orbit from x_i = 0.01 i, 10^5 iterations after 10^4; per series from the drawn start after the 1000-iteration transient) exceeds 0.01 per iteration, otherwise regular.",
		Params: []Param{
			{Name: "d", Default: 3, Min: 3, Max: 10, Integer: true, Doc: "dimension d"},
			{Name: "a", Default: 1.76, Min: 1.2, Max: 1.76, Doc: "nonlinearity a (orbits escape above 1.76 at b = 0.1)"},
			{Name: "b", Default: 0.1, Min: 0.02, Max: 0.1, Doc: "contraction b (|det J| = b; orbits escape from b ≈ 0.11 at a = 1.76)"},
			{Name: "obs", Default: 0, Min: 0, Max: 2, Integer: true, Doc: "observed coordinate x_(obs+1) (every coordinate is a delayed copy of x_1, so any shows the same dynamics; at most 2 so that it exists for every d ≥ 3)"},
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: math.Log(0.1), Unit: "per iteration", Source: "analytic: ln|det J| = ln b"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) HenonGen {
		return HenonGen{D: int(p["d"]), A: p["a"], B: p["b"], Obs: int(p["obs"])}
	}, func(p map[string]float64) []float64 {
		x0 := make([]float64, int(p["d"]))
		for i := range x0 {
			x0[i] = 0.01 * float64(i)
		}
		return x0
	})
}
