package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// WebMap is Zaslavsky's stochastic web map, the kicked harmonic oscillator
// whose kick period is a rational fraction 1/q of the oscillation period,
// written as a map of the plane (Zaslavsky et al., Sov. Phys. JETP 64
// (1986) 294 (memory)):
//
//	w = u + K·sin v,
//	u' = w·cos α + v·sin α,   v' = −w·sin α + v·cos α,   α = 2π/q,
//
// a kick of strength K followed by a rotation through α, observed through
// u (Obs = 0) or v (Obs = 1), or their sines (Obs = 2, 3: bounded, and
// for q = 4 a function of the dynamics on the torus). Both steps preserve area, so det J = 1 and
// λ1 + λ2 = 0 for every orbit (analytic). For q = 3, 4 and 6 the phase
// plane is tiled by a periodic net of separatrices (square for q = 4,
// hexagonal for q = 3 and 6; q = 5 and q ≥ 7 give quasi-crystalline
// nets); the kick thickens the net into a connected chaotic layer, the
// stochastic web, along which chaotic orbits wander without bound, while
// the cells it encloses hold invariant curves (regular motion). The web
// widens with K (exponentially thin for small K, covering most of the
// plane for K of order one and more), so one (K, q) gives chaotic and
// regular series according to the start: the label is per series
// (ClassFrom). The map is odd, T(−z) = −T(z).
type WebMap struct {
	K    float64 // kick strength, > 0
	Q    int     // symmetry order: the rotation per iteration is 2π/Q, Q ≥ 3
	Obs  int     // observable: 0 = u, 1 = v, 2 = sin u, 3 = sin v
	c, s float64 // cos α, sin α (newWebMap)
}

// newWebMap returns the web map with kick k, symmetry order q and
// observable obs, its rotation precomputed.
func newWebMap(k float64, q, obs int) WebMap {
	s, c := math.Sincos(2 * math.Pi / float64(q))
	return WebMap{K: k, Q: q, Obs: obs, c: c, s: s}
}

func (m WebMap) dim() int { return 2 }

// next maps the state v = (u, v).
func (m WebMap) next(dst, v []float64) {
	w := v[0] + m.K*math.Sin(v[1])
	dst[0] = w*m.c + v[1]*m.s
	dst[1] = -w*m.s + v[1]*m.c
}

func (m WebMap) jacobian(j, v []float64) {
	kc := m.K * math.Cos(v[1])
	j[0], j[1] = m.c, kc*m.c+m.s
	j[2], j[3] = -m.s, -kc*m.s+m.c
}

// start draws the initial state of Generate: (u, v) uniform in the square
// [−2π, 2π)², which holds several cells of the web and parts of the web
// between them.
func (m WebMap) start(rng *rand.Rand) []float64 {
	return []float64{4*math.Pi*rng.Float64() - 2*math.Pi, 4*math.Pi*rng.Float64() - 2*math.Pi}
}

// Generate returns n values of u or v after mapTransient iterations from
// a random start.
func (m WebMap) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if !(m.K > 0) || math.IsInf(m.K, 0) || m.Q < 3 {
		return nil, fmt.Errorf("web-map: %w: k = %g, q = %d, want k > 0 finite and q ≥ 3", ErrParamRange, m.K, m.Q)
	}
	if m.c == 0 && m.s == 0 {
		m = newWebMap(m.K, m.Q, m.Obs)
	}
	if err := checkObs("web-map", m.Obs, 4); err != nil {
		return nil, err
	}
	if m.Obs < 2 {
		return iterateMap("web-map", m, m.start(rng), n, m.Obs)
	}
	// sin u, sin v: for q = 4 the map commutes with shifts of u and v by
	// 2π (T(u+2π, v) = T(u, v) + (0, −2π), T(u, v+2π) = T(u, v) + (2π, 0)),
	// so the orbit on the torus is the dynamics and the sine a bounded
	// observable of it, free of the unbounded drift along the web.
	out, err := iterateMap("web-map", m, m.start(rng), n, m.Obs-2)
	for i, x := range out {
		out[i] = math.Sin(x)
	}
	return out, err
}

func init() {
	registerMap(&System{
		Name:  "web-map",
		Title: "Zaslavsky's stochastic web map: u + k sin v rotated by 2π/q (observed u, v, sin u or sin v)",
		Doc: "Kicked harmonic oscillator with q kicks per oscillation: w = u + k sin v, (u', v') = rotation of (w, v) by 2π/q. Area-preserving (det J = 1); a net of separatrices with q-fold symmetry (square for q = 4, hexagonal for q = 3 and 6, quasi-crystalline otherwise) thickens into a chaotic web that widens with k, around cells of invariant curves. Starts are drawn uniformly in [−2π, 2π)², so the same (k, q) gives chaotic series (on the web, wandering along it without bound) and regular ones (inside a cell). " +
			"Label (per series): chaotic when λ1 of the tangent map (10^5 iterations from the drawn start after the 1000-iteration transient) exceeds 0.01 per iteration, otherwise regular; the parameter-only label (Class) follows the orbit from (u, v) = (3, 0.1), on the web at the defaults.",
		Params: []Param{
			{Name: "k", Default: 2.5, Min: 0.1, Max: 4, Doc: "kick strength K"},
			{Name: "q", Default: 4, Min: 3, Max: 8, Integer: true, Doc: "symmetry order q: rotation 2π/q per iteration"},
			obsParam("u", "v", "sin u", "sin v"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: 0, Unit: "per iteration", Source: "analytic: area-preserving, det J = 1"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) WebMap { return newWebMap(p["k"], int(p["q"]), int(p["obs"])) }, 3, 0.1)
}
