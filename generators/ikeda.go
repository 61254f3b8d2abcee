package generators

import (
	"math"
	"math/rand/v2"
)

// Ikeda is the Ikeda map of a ring laser cavity, z' = 1 + u·z·e^{iθ} with
// θ = 0.4 − 6/(1 + |z|²), written for z = x + iy and observed through the
// real part x (Obs = 0) or the imaginary part y (Obs = 1) (Ikeda, Opt.
// Commun. 30 (1979) 257). Its Jacobian determinant
// is u², so λ1 + λ2 = 2 ln u (analytic).
type Ikeda struct {
	U   float64 // dissipation, 0 < U < 1
	Obs int     // observed coordinate: 0 = Re z, 1 = Im z
}

func (m Ikeda) dim() int { return 2 }

func (m Ikeda) next(dst, v []float64) {
	x, y := v[0], v[1]
	t := 0.4 - 6/(1+x*x+y*y)
	s, c := math.Sincos(t)
	dst[0] = 1 + m.U*(x*c-y*s)
	dst[1] = m.U * (x*s + y*c)
}

func (m Ikeda) jacobian(j, v []float64) {
	x, y := v[0], v[1]
	r := 1 + x*x + y*y
	t := 0.4 - 6/r
	s, c := math.Sincos(t)
	tx, ty := 12*x/(r*r), 12*y/(r*r) // ∂θ/∂x, ∂θ/∂y
	// x' = 1 + u(x cos θ − y sin θ), y' = u(x sin θ + y cos θ)
	a := -x*s - y*c // ∂(x cos θ − y sin θ)/∂θ
	b := x*c - y*s  // ∂(x sin θ + y cos θ)/∂θ
	j[0] = m.U * (c + a*tx)
	j[1] = m.U * (-s + a*ty)
	j[2] = m.U * (s + b*tx)
	j[3] = m.U * (c + b*ty)
}

// start draws the initial state of Generate: uniform in (−0.5, 0.5)².
func (m Ikeda) start(rng *rand.Rand) []float64 {
	return []float64{rng.Float64() - 0.5, rng.Float64() - 0.5}
}

// Generate returns n values of the observed part after the transient,
// started at a random point of (−0.5, 0.5)².
func (m Ikeda) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return iterateMap("ikeda", m, m.start(rng), n, m.Obs)
}

func init() {
	registerMap(&System{
		Name:  "ikeda",
		Title: "Ikeda map z' = 1 + u z exp(i(0.4 - 6/(1+|z|²))) (observed Re z)",
		Doc:   "Chaotic at u = 0.9; above it orbits from the random start can settle on a stable fixed point, so u stops at 0.9. Label: chaotic when λ1 from the tangent map (orbit from (0, 0), 10^5 iterations after 10^4) exceeds 0.01 per iteration.",
		Params: []Param{
			{Name: "u", Default: 0.9, Min: 0.5, Max: 0.9, Doc: "dissipation parameter"},
			obsParam("Re z", "Im z"),
		},
		Invariants: []Invariant{
			{Name: "lyap_sum", Value: 2 * math.Log(0.9), Unit: "per iteration", Source: "analytic: ln|det J| = 2 ln u"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) Ikeda { return Ikeda{U: p["u"], Obs: int(p["obs"])} }, 0, 0)
}
