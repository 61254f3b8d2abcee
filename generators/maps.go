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

// Label rules of the maps average the tangent-map exponent over
// mapLyapIters iterations after mapLyapTransient, from a fixed start, and
// call the orbit chaotic above mapChaosThreshold per iteration. The
// threshold sits well above the O(1/iters) bias of a periodic orbit's
// exponent and well below the exponents of the chaotic defaults (≥ 0.18).
const (
	mapLyapTransient  = 10000
	mapLyapIters      = 100000
	mapChaosThreshold = 0.01
)

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
	x := m.start(rng)[0]
	out := make([]float64, n)
	for i := -mapTransient; i < n; i++ {
		x = m.R * x * (1 - x)
		// In floating point an orbit at r = 4 can land exactly on the
		// repelling fixed point 0 (via x = 0.5 → 1 → 0) and stay there;
		// nudge it back onto the attractor with a fresh draw. For r ≤ 1
		// the fixed point 0 is the attractor and is kept.
		if m.R > 1 && (x <= 0 || x >= 1) {
			x = m.start(rng)[0]
		}
		if i >= 0 {
			out[i] = x
		}
	}
	return out, nil
}

// start draws the initial state of Generate: x0 uniform in (0.05, 0.95).
func (m Logistic) start(rng *rand.Rand) []float64 {
	return []float64{0.05 + 0.9*rng.Float64()}
}

// LogisticLyapunov returns the largest Lyapunov exponent of the logistic map
// at r, the orbit average of ln|r(1−2x)|, from a fixed start and iters
// iterations after a transient. It is the labelling rule of the registry:
// above 0.01 per iteration the map is chaotic, otherwise the orbit is
// periodic (regular).
func LogisticLyapunov(r float64, iters int) float64 {
	return logisticExponent(r, 0.3141592653589793, mapLyapTransient, iters)
}

// logisticExponent is the orbit average of ln|r(1−2x)| over iters
// iterations from x after transient iterations.
func logisticExponent(r, x float64, transient, iters int) float64 {
	for i := 0; i < transient; i++ {
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

// Henon is the Hénon map x' = 1 − a·x² + y, y' = b·x, observed through x
// (Obs = 0) or y (Obs = 1). At a = 1.4, b = 0.3 its Lyapunov exponents are
// λ1 ≈ 0.419 per iteration and λ1 + λ2 = ln b (Sprott 2003).
type Henon struct {
	A, B float64
	Obs  int // observed coordinate: 0 = x, 1 = y
}

func (m Henon) dim() int { return 2 }

func (m Henon) next(dst, v []float64) {
	dst[0] = 1 - m.A*v[0]*v[0] + v[1]
	dst[1] = m.B * v[0]
}

func (m Henon) jacobian(j, v []float64) {
	j[0], j[1] = -2*m.A*v[0], 1
	j[2], j[3] = m.B, 0
}

// start draws the initial state of Generate: uniform in (−0.1, 0.1)².
func (m Henon) start(rng *rand.Rand) []float64 {
	return []float64{0.2*rng.Float64() - 0.1, 0.2*rng.Float64() - 0.1}
}

// Generate returns n values of the observed coordinate after the
// transient, started near the attractor at a random point of (−0.1, 0.1)².
func (m Henon) Generate(n int, rng *rand.Rand) ([]float64, error) {
	return iterateMap("henon", m, m.start(rng), n, m.Obs)
}

// iterateMap iterates m from v (modified), discards mapTransient
// iterations and records coordinate obs of the next n states.
func iterateMap(name string, m mapping, v []float64, n int, obs int) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := checkObs(name, obs, len(v)); err != nil {
		return nil, err
	}
	w := make([]float64, len(v))
	out := make([]float64, n)
	for i := -mapTransient; i < n; i++ {
		m.next(w, v)
		v, w = w, v
		if !finite(v) {
			return nil, fmt.Errorf("%s: %w: the orbit escaped to infinity", name, ErrDiverged)
		}
		if i >= 0 {
			out[i] = v[obs]
		}
	}
	return out, nil
}

// mapLyap returns the label-rule spectrum of m from x0 (Class).
func mapLyap(m mapping, x0 ...float64) (Spectrum, error) {
	return mapSpectrum(m, x0, mapLyapTransient, mapLyapIters, labelExponents(m, m.dim()))
}

// mapLyapFrom returns λ1 of the per-series label rule of m from the
// generator's start x0 (ClassFrom): the generator's transient
// (mapTransient) is discarded, then mapLyapIters iterations are averaged.
// Only the leading tangent vector is followed: Gram–Schmidt normalises it
// alone, so λ1 is the one the full computation gives, at a fraction of the
// cost.
func mapLyapFrom(m mapping, x0 []float64) (Spectrum, error) {
	return mapSpectrum(m, x0, mapTransient, mapLyapIters, 1)
}

// mapModel is an iterated map the registry generates and labels per
// series: start draws the initial state exactly as Generate does.
type mapModel interface {
	Generator
	mapping
	start(rng *rand.Rand) []float64
}

// registerMap registers s as an iterated map with the label rule of the
// maps: samples on the iteration axis, the generator mk(p) with sample
// interval 1, and the label chaotic when λ1 of the tangent map of mk(p)
// exceeds mapChaosThreshold, otherwise regular. Class follows the orbit
// from the fixed start x0 (mapLyap), ClassFrom the orbit from the start
// Generate draws (mapLyapFrom). s supplies the rest (name, docs,
// parameters, invariants, default class).
func registerMap[M mapModel](s *System, mk func(p map[string]float64) M, x0 ...float64) {
	registerMapFrom(s, mk, fixedStart(x0...))
}

// registerMapFrom is registerMap for a fixed start of Class that depends on
// the parameters (e.g. on the dimension).
func registerMapFrom[M mapModel](s *System, mk func(p map[string]float64) M, x0 func(p map[string]float64) []float64) {
	s.TimeAxis = AxisIteration
	s.lyap = func(p map[string]float64) (Spectrum, error) {
		return mapLyap(mk(p), x0(p)...)
	}
	s.initial = func(p map[string]float64, rng *rand.Rand) []float64 {
		return mk(p).start(rng)
	}
	s.lyapFrom = func(p map[string]float64, x0 []float64) (Spectrum, error) {
		return mapLyapFrom(mk(p), x0)
	}
	s.threshold = mapChaosThreshold
	s.build = func(p map[string]float64) (Generator, float64, error) {
		return mk(p), 1, nil
	}
	register(s)
}

// logisticRule is the label text shared by the logistic entries.
const logisticRule = " Label: chaotic when the map's Lyapunov exponent at r, the average of ln|r(1−2x)| over 10^5 iterations from x0 = 0.314159 after 10^4 of transient, exceeds 0.01 per iteration; otherwise regular. Below r = 3 the orbit settles on a fixed point (a constant series), so r starts at 3."

func init() {
	logisticLyap := func(p map[string]float64) (Spectrum, error) {
		return Spectrum{Exponents: []float64{LogisticLyapunov(p["r"], mapLyapIters)}, Unit: "per iteration", Span: mapLyapIters}, nil
	}
	initial := func(p map[string]float64, rng *rand.Rand) []float64 {
		return Logistic{R: p["r"]}.start(rng)
	}
	// The per-series rule: the same average along the orbit from the
	// generator's start, after the generator's transient.
	logisticFrom := func(p map[string]float64, x0 []float64) (Spectrum, error) {
		l := logisticExponent(p["r"], x0[0], mapTransient, mapLyapIters)
		return Spectrum{Exponents: []float64{l}, Unit: "per iteration", Span: mapLyapIters}, nil
	}
	build := func(p map[string]float64) (Generator, float64, error) {
		return Logistic{R: p["r"]}, 1, nil
	}
	register(&System{
		Name:   "logistic",
		Title:  "logistic map x' = r x (1 - x)",
		Doc:    "Chaotic at r = 4; periodic windows at r = 3.5 (period 4) and r = 3.83 (period 3)." + logisticRule,
		Params: []Param{{Name: "r", Default: 4, Min: 3, Max: 4, Doc: "growth parameter"}},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: math.Ln2, Unit: "per iteration", Source: "analytic (conjugacy to the tent map), r = 4"},
			{Name: "invariant_density", Value: math.NaN(), Unit: "1/(π√(x(1−x)))", Source: "Ulam & von Neumann (1947), analytic, r = 4"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Chaotic,
		lyap:         logisticLyap,
		initial:      initial,
		lyapFrom:     logisticFrom,
		threshold:    mapChaosThreshold,
		build:        build,
	})
	register(&System{
		Name:         "logistic-periodic",
		Title:        "logistic map in its period-3 window (r = 3.83)",
		Doc:          "The logistic entry preset to r = 3.83, inside the period-3 window; r = 3.5 gives period 4. Same equation and label rule as \"logistic\", so r = 4 here is chaotic." + logisticRule,
		Params:       []Param{{Name: "r", Default: 3.83, Min: 3, Max: 4, Doc: "growth parameter"}},
		TimeAxis:     AxisIteration,
		DefaultClass: Regular,
		lyap:         logisticLyap,
		initial:      initial,
		lyapFrom:     logisticFrom,
		threshold:    mapChaosThreshold,
		build:        build,
	})
	registerMap(&System{
		Name:  "henon",
		Title: "Hénon map x' = 1 - a x² + y, y' = b x (observed x)",
		Doc:   "Chaotic at the classical a = 1.4, b = 0.3. Below a ≈ 0.37 (b = 0.3) the orbit settles on a fixed point, so a starts at 0.4; some (a, b) let the orbit escape, which Generate and Class report as ErrDiverged. Label: chaotic when λ1 from the tangent map (orbit from (0, 0), 10^5 iterations after 10^4) exceeds 0.01 per iteration.",
		Params: []Param{
			{Name: "a", Default: 1.4, Min: 0.4, Max: 1.42, Doc: "nonlinearity"},
			{Name: "b", Default: 0.3, Min: 0.05, Max: 0.31, Doc: "contraction (Jacobian determinant is -b)"},
			obsParam("x", "y"),
		},
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0.41922, Unit: "per iteration", Source: "Sprott, Chaos and Time-Series Analysis (2003), appendix; confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl"},
			{Name: "lyap_sum", Value: math.Log(0.3), Unit: "per iteration", Source: "analytic: ln|det J| = ln b"},
			{Name: "nl_gp_dim", Value: 1.21, Unit: "", Source: "Grassberger & Procaccia, Physica D 9 (1983) 189; 1.21 ± 0.01 confirmed: sprott.physics.wisc.edu/chaos/henongp.htm"},
		},
		DefaultClass: Chaotic,
	}, func(p map[string]float64) Henon { return Henon{A: p["a"], B: p["b"], Obs: int(p["obs"])} }, 0, 0)
}
