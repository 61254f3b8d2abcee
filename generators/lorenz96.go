package generators

import (
	"fmt"
	"math/rand/v2"
)

// Lorenz96 is the Lorenz-96 model on a ring of N sites,
// dx_i/dt = (x_{i+1} − x_{i−2})·x_{i−1} − x_i + F (Lorenz, Proc. Seminar on
// Predictability, ECMWF (1996)), integrated by RK4 with internal step ≤ 0.01
// and observed through x_Obs (x_0 by default; every site is statistically
// the same by the ring's symmetry). The divergence of the field is −N, so the
// Lyapunov exponents sum to −N (analytic). At F = 8 it is chaotic with
// several positive exponents for N of ten or more: a high-dimensional chaos
// that looks noisy to low-dimensional methods.
type Lorenz96 struct {
	N   int
	F   float64
	Dt  float64 // sample interval in time units, > 0
	Obs int     // observed site, 0 ≤ Obs < N
}

const (
	lorenz96Step      = 0.01
	lorenz96Transient = 100.0
)

func (m Lorenz96) dim() int { return m.N }

func (m Lorenz96) eval(dst, v []float64) {
	n := m.N
	// Ring edges with explicit wrap-around; the interior without modulo.
	for _, i := range [...]int{0, 1, n - 1} {
		ip1, im1, im2 := (i+1)%n, (i+n-1)%n, (i+n-2)%n
		dst[i] = (v[ip1]-v[im2])*v[im1] - v[i] + m.F
	}
	for i := 2; i < n-1; i++ {
		dst[i] = (v[i+1]-v[i-2])*v[i-1] - v[i] + m.F
	}
}

func (m Lorenz96) jacobian(j, v []float64) {
	n := m.N
	for k := range j[:n*n] {
		j[k] = 0
	}
	for i := 0; i < n; i++ {
		ip1, im1, im2 := (i+1)%n, (i+n-1)%n, (i+n-2)%n
		row := j[i*n : (i+1)*n]
		row[ip1] += v[im1]
		row[im2] -= v[im1]
		row[im1] += v[ip1] - v[im2]
		row[i] -= 1
	}
}

// tangent stores J(v)·w in dst in O(N): row i of the Jacobian has the
// entries x_{i−1} at i+1, −x_{i−1} at i−2, x_{i+1} − x_{i−2} at i−1 and
// −1 at i.
func (m Lorenz96) tangent(dst, v, w []float64) {
	n := m.N
	for _, i := range [...]int{0, 1, n - 1} {
		ip1, im1, im2 := (i+1)%n, (i+n-1)%n, (i+n-2)%n
		dst[i] = v[im1]*(w[ip1]-w[im2]) + (v[ip1]-v[im2])*w[im1] - w[i]
	}
	for i := 2; i < n-1; i++ {
		dst[i] = v[i-1]*(w[i+1]-w[i-2]) + (v[i+1]-v[i-2])*w[i-1] - w[i]
	}
}

// start draws the initial state of Generate: x_i = F plus a uniform
// perturbation in [0, 0.1).
func (m Lorenz96) start(rng *rand.Rand) []float64 {
	v := make([]float64, m.N)
	for i := range v {
		v[i] = m.F + 0.1*rng.Float64()
	}
	return v
}

// Generate returns n samples of x_Obs after a transient of 100 time units,
// started from x_i = F plus a uniform perturbation in [0, 0.1).
func (m Lorenz96) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if m.N < 4 {
		return nil, fmt.Errorf("lorenz96: N = %d, want N ≥ 4", m.N)
	}
	return sampleFlow("lorenz96", m, m.start(rng), n, m.Dt, lorenz96Step, lorenz96Transient, m.Obs)
}

// lorenz96Exponents is the number of exponents the label rule computes.
const lorenz96Exponents = 4

func init() {
	registerFlow(&System{
		Name:  "lorenz96",
		Title: "Lorenz-96 ring model (observed x_0), RK4",
		Doc:   "High-dimensional chaos at N = 10, F = 8. Internal RK4 step ≤ 0.01; transient 100 time units. Label: chaotic when λ1 of the variational equations (orbit from x_i = F + 0.01 i, 500 time units after 100, the 4 leading exponents) exceeds 0.05 per time unit, otherwise regular.",
		Params: []Param{
			{Name: "n", Default: 10, Min: 4, Max: 40, Integer: true, Doc: "number of sites N"},
			{Name: "f", Default: 8, Min: 4, Max: 20, Doc: "forcing F"},
			{Name: "dt", Default: 0.05, Min: 1e-3, Max: 1, Doc: "sample interval (time units)"},
			{Name: "obs", Default: 0, Min: 0, Max: 3, Integer: true, Doc: "observed site x_obs (every site is statistically the same by the ring's symmetry; at most 3 so that it exists for every N ≥ 4)"},
		},
		DefaultClass: Chaotic,
		threshold:    0.05,
	}, func(p map[string]float64) Lorenz96 {
		return Lorenz96{N: int(p["n"]), F: p["f"], Dt: p["dt"], Obs: int(p["obs"])}
	}, func(p map[string]float64) []float64 {
		x0 := make([]float64, int(p["n"]))
		for i := range x0 {
			x0[i] = p["f"] + 0.01*float64(i)
		}
		return x0
	}, flowRule{h: lorenz96Step, transient: lorenz96Transient, span: 500, renorm: 0.5, k: lorenz96Exponents})
}
