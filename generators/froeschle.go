package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Froeschle is a four-dimensional symplectic map of two coupled standard
// maps, after Froeschlé (Astron. Astrophys. 16 (1972) 172 (memory)), who
// used such maps to study how invariant tori and chaotic layers of a
// system with two degrees of freedom fill its phase space. Here the
// coupling is written through a potential,
//
//	p1' = p1 + K1·sin x1 + B·sin(x1 + x2),
//	p2' = p2 + K2·sin x2 + B·sin(x1 + x2),
//	x1' = x1 + p1',  x2' = x2 + p2'   (all mod 2π),
//
// a kick by −∇V, V = −K1 cos x1 − K2 cos x2 − B cos(x1 + x2), followed by
// a free drift (the coupling term of Froeschlé's own paper may differ;
// this form is ours and symplectic by construction). The state is (x1, x2,
// p1, p2), observed through sin x1, sin x2, sin p1 or sin p2 (Obs = 0..3).
// The Jacobian is [[I + H, I], [H, I]] with H the symmetric Hessian of −V,
// so det J = 1 and the map is symplectic: its exponents come in pairs
// λ1 = −λ4, λ2 = −λ3 and sum to 0 (analytic). For B = 0 it falls apart
// into two standard maps (Chirikov, Phys. Rep. 52 (1979) 263); with
// coupling, chaotic layers and invariant tori coexist for moderate kicks,
// so the label is per series (ClassFrom).
type Froeschle struct {
	K1, K2 float64 // kick strengths, > 0
	B      float64 // coupling, ≥ 0
	Obs    int     // observable: 0 = sin x1, 1 = sin x2, 2 = sin p1, 3 = sin p2
}

func (m Froeschle) dim() int { return 4 }

// next maps the state v = (x1, x2, p1, p2).
func (m Froeschle) next(dst, v []float64) {
	c := m.B * math.Sin(v[0]+v[1])
	p1 := v[2] + m.K1*math.Sin(v[0]) + c
	p2 := v[3] + m.K2*math.Sin(v[1]) + c
	dst[0] = wrapTwoPi(v[0] + p1)
	dst[1] = wrapTwoPi(v[1] + p2)
	dst[2] = wrapTwoPi(p1)
	dst[3] = wrapTwoPi(p2)
}

func (m Froeschle) jacobian(j, v []float64) {
	c := m.B * math.Cos(v[0]+v[1])
	h11 := m.K1*math.Cos(v[0]) + c
	h22 := m.K2*math.Cos(v[1]) + c
	j[0], j[1], j[2], j[3] = 1+h11, c, 1, 0
	j[4], j[5], j[6], j[7] = c, 1+h22, 0, 1
	j[8], j[9], j[10], j[11] = h11, c, 1, 0
	j[12], j[13], j[14], j[15] = c, h22, 0, 1
}

// start draws the initial state of Generate: uniform on the 4-torus
// [0, 2π)⁴, which meets both the chaotic layers and the tori.
func (m Froeschle) start(rng *rand.Rand) []float64 {
	v := make([]float64, 4)
	for i := range v {
		v[i] = 2 * math.Pi * rng.Float64()
	}
	return v
}

// Generate returns n values of the observed sine after mapTransient
// iterations from a random point of the torus.
func (m Froeschle) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(m.K1 > 0 && m.K2 > 0 && m.B >= 0) || math.IsInf(m.K1+m.K2+m.B, 0) {
		return nil, fmt.Errorf("froeschle: %w: k1 = %g, k2 = %g, b = %g, want k1, k2 > 0 and b ≥ 0, finite", ErrParamRange, m.K1, m.K2, m.B)
	}
	if err := checkObs("froeschle", m.Obs, 4); err != nil {
		return nil, err
	}
	v, w := m.start(rng), make([]float64, 4)
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
		Name:  "froeschle",
		Title: "Froeschlé's coupled standard maps: p_i' = p_i + k_i sin x_i + b sin(x1 + x2), x_i' = x_i + p_i' mod 2π",
		Doc: "Four-dimensional symplectic map (two standard maps coupled through the potential term b cos(x1 + x2)), observed through the sine of one coordinate. Chaotic layers and invariant tori coexist; the chaotic part grows with the kicks and the coupling. Starts are drawn uniformly on the 4-torus, so the same parameters give chaotic and regular series. " +
			"Label (per series): chaotic when λ1 of the tangent map (10^5 iterations from the drawn start after the 1000-iteration transient) exceeds 0.01 per iteration, otherwise regular; the parameter-only label (Class) follows the orbit from (0.1, 0.1, 0.1, 0.1) near the hyperbolic fixed point at the origin.",
		Params: []Param{
			{Name: "k1", Default: 1.2, Min: 0.1, Max: 5, Doc: "kick strength K1 of the first map"},
			{Name: "k2", Default: 0.8, Min: 0.1, Max: 5, Doc: "kick strength K2 of the second map"},
			{Name: "b", Default: 0.3, Min: 0, Max: 2, Doc: "coupling B"},
			obsParam("sin x1", "sin x2", "sin p1", "sin p2"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: 0, Unit: "per iteration", Source: "analytic: symplectic, det J = 1"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) Froeschle {
		return Froeschle{K1: p["k1"], K2: p["k2"], B: p["b"], Obs: int(p["obs"])}
	}, 0.1, 0.1, 0.1, 0.1)
}
