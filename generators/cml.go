package generators

import (
	"fmt"
	"math/rand/v2"
)

// CML is a diffusively coupled logistic-map lattice on a ring of N sites
// (Kaneko, Prog. Theor. Phys. 72 (1984) 480):
//
//	x_i' = (1 − ε)·f(x_i) + (ε/2)·(f(x_{i−1}) + f(x_{i+1})),  f(x) = r·x·(1 − x),
//
// indices modulo N (periodic boundary), observed at site Obs. Every x_i' is
// a convex combination of values of f, so [0, 1]^N is invariant for
// 0 ≤ ε ≤ 1 and r ≤ 4: orbits never escape. Depending on r and ε the
// lattice shows frozen random patterns, travelling or periodic patterns
// (regular) and spatio-temporal chaos with many positive exponents.
//
// The tangent map is J = C·diag(f'(x)), with C the circulant coupling
// matrix (1 − ε on the diagonal, ε/2 beside it). On a synchronised orbit
// (all x_i equal) the Fourier modes decouple and the exponents are
// λ_k = λ_logistic + ln|1 − ε + ε·cos(2πk/N)| (derived: C has these
// eigenvalues and commutes with the scalar f'(x_t)); at ε = 0 every site
// is a logistic map and all N exponents equal λ_logistic, ln 2 at r = 4
// (analytic).
type CML struct {
	N      int     // sites, ≥ 3
	Eps, R float64 // coupling ε in [0, 1], growth r in (0, 4]
	Obs    int     // observed site, 0 ≤ Obs < N
}

func (m CML) dim() int { return m.N }

// leading: the label rule needs λ1 only, and the lattice has up to 64
// dimensions.
func (m CML) leading() int { return 1 }

// couple replaces g by C·g in place: g_i ← (1 − ε)·g_i + (ε/2)(g_{i−1} +
// g_{i+1}), indices modulo N, in one pass that remembers the overwritten
// neighbour.
func (m CML) couple(g []float64) {
	n := m.N
	c0, c1 := 1-m.Eps, m.Eps/2
	first, prev := g[0], g[n-1]
	for i := 0; i < n-1; i++ {
		cur := g[i]
		g[i] = c0*cur + c1*(prev+g[i+1])
		prev = cur
	}
	g[n-1] = c0*g[n-1] + c1*(prev+first)
}

func (m CML) next(dst, v []float64) {
	for i, x := range v[:m.N] {
		dst[i] = m.R * x * (1 - x)
	}
	m.couple(dst)
}

// tangent stores J(v)·w = C·(f'(v) ∘ w) in dst in O(N).
func (m CML) tangent(dst, v, w []float64) {
	for i, x := range v[:m.N] {
		dst[i] = m.R * (1 - 2*x) * w[i]
	}
	m.couple(dst)
}

func (m CML) jacobian(j, v []float64) {
	n := m.N
	clear(j[:n*n])
	for i := 0; i < n; i++ {
		row := j[i*n : (i+1)*n]
		for _, c := range [...]struct {
			k int
			w float64
		}{{i, 1 - m.Eps}, {(i + n - 1) % n, m.Eps / 2}, {(i + 1) % n, m.Eps / 2}} {
			row[c.k] += c.w * m.R * (1 - 2*v[c.k])
		}
	}
}

// start draws the initial state of Generate: every x_i uniform in
// (0.05, 0.95), independently.
func (m CML) start(rng *rand.Rand) []float64 {
	v := make([]float64, m.N)
	for i := range v {
		v[i] = 0.05 + 0.9*rng.Float64()
	}
	return v
}

func (m CML) check() error {
	if m.N < 3 || !(m.Eps >= 0 && m.Eps <= 1) || !(m.R > 0 && m.R <= 4) {
		return fmt.Errorf("cml: %w: n = %d, eps = %g, r = %g, want n ≥ 3, 0 ≤ eps ≤ 1, 0 < r ≤ 4", ErrParamRange, m.N, m.Eps, m.R)
	}
	return nil
}

// Generate returns n values of site Obs after mapTransient iterations from
// a random lattice.
func (m CML) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := m.check(); err != nil {
		return nil, err
	}
	return iterateMap("cml", m, m.start(rng), n, m.Obs)
}

func init() {
	registerMapFrom(&System{
		Name:  "cml",
		Title: "coupled logistic-map lattice x_i' = (1-eps) f(x_i) + (eps/2)(f(x_i-1) + f(x_i+1)), ring of n sites (observed one site)",
		Doc:   "Spatially extended chaos (Kaneko 1984): f(x) = r x (1 - x) on every site, diffusive coupling eps, periodic boundary. Spatio-temporal chaos at r = 4, eps = 0.2; frozen or periodic patterns in the logistic map's periodic windows with weak coupling (r = 3.5) and in windows of the coupling (r = 4, eps = 0.15). Label: chaotic when λ1 of the n-dimensional tangent map (sparse, orbit from x_i = 0.3 + 0.4 i/n, 10^5 iterations after 10^4; per series from the drawn lattice after the 1000-iteration transient) exceeds 0.01 per iteration, otherwise regular.",
		Params: []Param{
			{Name: "n", Default: 16, Min: 4, Max: 64, Integer: true, Doc: "number of sites N"},
			{Name: "eps", Default: 0.2, Min: 0, Max: 0.6, Doc: "diffusive coupling ε"},
			{Name: "r", Default: 4, Min: 3.4, Max: 4, Doc: "growth parameter of the local logistic map"},
			{Name: "obs", Default: 0, Min: 0, Max: 3, Integer: true, Doc: "observed site x_obs (every site is statistically the same by the ring's symmetry; at most 3 so that it exists for every N ≥ 4)"},
		},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0.6931471805599453, Unit: "per iteration", Source: "analytic at eps = 0: uncoupled logistic maps at r = 4, λ = ln 2"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) CML {
		return CML{N: int(p["n"]), Eps: p["eps"], R: p["r"], Obs: int(p["obs"])}
	}, func(p map[string]float64) []float64 {
		n := int(p["n"])
		x0 := make([]float64, n)
		for i := range x0 {
			x0[i] = 0.3 + 0.4*float64(i)/float64(n)
		}
		return x0
	})
}
