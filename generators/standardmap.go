package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// StandardMap is the Chirikov standard map on the torus (Chirikov, Phys.
// Rep. 52 (1979) 263):
//
//	p' = p + K·sin θ,  θ' = θ + p'  (both mod 2π),
//
// observed through sin θ (Obs = 0) or sin p (Obs = 1). It is conservative
// (area-preserving: det J = 1, so λ1 + λ2 = 0, analytic) with a mixed
// phase space: for K below about 0.97 invariant (KAM) curves span the
// torus, above it a chaotic sea surrounds islands of regular motion, and
// for large K the chaotic orbits have λ1 ≈ ln(K/2) (Chirikov 1979
// (memory)). Whether a series is chaotic depends on its initial
// condition, so the label is per series (ClassFrom).
type StandardMap struct {
	K   float64 // kick strength, > 0
	Obs int     // observable: 0 = sin θ, 1 = sin p
}

// wrapTwoPi reduces x to [0, 2π).
func wrapTwoPi(x float64) float64 {
	if x >= 0 && x < 2*math.Pi {
		return x
	}
	x -= 2 * math.Pi * math.Floor(x/(2*math.Pi))
	if x >= 2*math.Pi { // x just below 0 rounds up
		x = 0
	}
	return x
}

func (m StandardMap) dim() int { return 2 }

// next maps the state v = (θ, p).
func (m StandardMap) next(dst, v []float64) {
	p := v[1] + m.K*math.Sin(v[0])
	dst[0] = wrapTwoPi(v[0] + p)
	dst[1] = wrapTwoPi(p)
}

func (m StandardMap) jacobian(j, v []float64) {
	c := m.K * math.Cos(v[0])
	j[0], j[1] = 1+c, 1
	j[2], j[3] = c, 1
}

// start draws the initial state of Generate: (θ, p) uniform on the torus
// [0, 2π)², which meets both the chaotic sea and the islands.
func (m StandardMap) start(rng *rand.Rand) []float64 {
	return []float64{2 * math.Pi * rng.Float64(), 2 * math.Pi * rng.Float64()}
}

// Generate returns n values of sin θ or sin p after mapTransient
// iterations from a random point of the torus.
func (m StandardMap) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(m.K > 0) || math.IsInf(m.K, 0) {
		return nil, fmt.Errorf("standard-map: %w: k = %g, want k > 0", ErrParamRange, m.K)
	}
	if err := checkObs("standard-map", m.Obs, 2); err != nil {
		return nil, err
	}
	v, w := m.start(rng), make([]float64, 2)
	out := make([]float64, n)
	for i := -mapTransient; i < n; i++ {
		m.next(w, v)
		v, w = w, v
		if i >= 0 {
			out[i] = math.Sin(v[m.Obs])
		}
	}
	return out, nil
}

func init() {
	registerMap(&System{
		Name:  "standard-map",
		Title: "Chirikov standard map p' = p + k sin θ, θ' = θ + p' mod 2π (observed sin θ or sin p)",
		Doc:   "Conservative (area-preserving) map with a mixed phase space: for k below ≈ 0.97 invariant curves span the torus, above it a chaotic sea surrounds regular islands, which shrink as k grows; λ1 ≈ ln(k/2) in the sea for large k. Initial conditions are drawn uniformly on the torus, so the same k gives chaotic and regular series. Label (per series): chaotic when λ1 of the tangent map (10^5 iterations from the drawn start after the 1000-iteration transient) exceeds 0.01 per iteration, otherwise regular; the parameter-only label (Class) follows the orbit from (θ, p) = (0.1, 0.1) near the hyperbolic fixed point, inside the sea for k ≥ 1.",
		Params: []Param{
			{Name: "k", Default: 1.5, Min: 0.5, Max: 6, Doc: "kick strength K"},
			obsParam("sin θ", "sin p"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: 0, Unit: "per iteration", Source: "analytic: area-preserving, det J = 1"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) StandardMap { return StandardMap{K: p["k"], Obs: int(p["obs"])} }, 0.1, 0.1)
}
