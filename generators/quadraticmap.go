package generators

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strconv"
)

// QuadraticMap is the general two-dimensional quadratic map
// (Sprott, Computers & Graphics 17 (1993) 325):
//
//	x' = a1 + a2·x + a3·x² + a4·x·y + a5·y + a6·y²,
//	y' = a7 + a8·x + a9·x² + a10·x·y + a11·y + a12·y²,
//
// observed through x (Obs = 0) or y (Obs = 1). With coefficients drawn in
// [−1.2, 1.2] most maps send the orbit to infinity, many settle on a fixed
// point, and a few per cent are chaotic (Sprott 1993); DrawQuadraticMap
// draws bounded sets with a wanted label. The default set is the Hénon map
// x' = 1 − 1.4u² + v, v' = 0.3u rescaled by x = 1.2u, y = 1.2v
// (a1 = 1.2, a3 = −1.4/1.2, a5 = 1, a8 = 0.3), so its exponents are the
// Hénon ones: λ1 ≈ 0.419 (Sprott 2003; confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl) and λ1 + λ2 = ln 0.3
// (analytic: a linear change of variables keeps the exponents).
type QuadraticMap struct {
	A   [12]float64 // a1..a12
	Obs int         // observed coordinate: 0 = x, 1 = y
}

func (m QuadraticMap) dim() int { return 2 }

func (m QuadraticMap) next(dst, v []float64) {
	x, y := v[0], v[1]
	a := &m.A
	dst[0] = a[0] + a[1]*x + a[2]*x*x + a[3]*x*y + a[4]*y + a[5]*y*y
	dst[1] = a[6] + a[7]*x + a[8]*x*x + a[9]*x*y + a[10]*y + a[11]*y*y
}

func (m QuadraticMap) jacobian(j, v []float64) {
	x, y := v[0], v[1]
	a := &m.A
	j[0], j[1] = a[1]+2*a[2]*x+a[3]*y, a[3]*x+a[4]+2*a[5]*y
	j[2], j[3] = a[7]+2*a[8]*x+a[9]*y, a[9]*x+a[10]+2*a[11]*y
}

// start draws the initial state of Generate: uniform in (−0.1, 0.1)².
func (m QuadraticMap) start(rng *rand.Rand) []float64 {
	return []float64{0.2*rng.Float64() - 0.1, 0.2*rng.Float64() - 0.1}
}

// settled reports whether v is a fixed point to within 1e-9 relative:
// |G(v) − v| ≤ 1e-9·(1 + |v|) in the maximum norm. Generate and the label
// rule apply it to the state after their transient, so a series that
// would be constant is reported as ErrConstant by both.
func (m QuadraticMap) settled(v []float64) bool {
	var w [2]float64
	m.next(w[:], v)
	tol := 1e-9 * (1 + math.Max(math.Abs(v[0]), math.Abs(v[1])))
	return math.Abs(w[0]-v[0]) <= tol && math.Abs(w[1]-v[1]) <= tol
}

// advance iterates v in place for steps iterations and reports ErrDiverged
// if the orbit escapes.
func (m QuadraticMap) advance(v []float64, steps int) error {
	var w [2]float64
	for i := 0; i < steps; i++ {
		m.next(w[:], v)
		v[0], v[1] = w[0], w[1]
		if !finite(v) {
			return fmt.Errorf("quadratic-map: %w: the orbit escaped after %d iterations", ErrDiverged, i+1)
		}
	}
	return nil
}

// Generate returns n values of the observed coordinate after mapTransient
// iterations. Escaping orbits give ErrDiverged within a few iterations of
// leaving the attractor region (quadratic growth); an orbit that has
// settled on a fixed point by the end of the transient gives ErrConstant.
func (m QuadraticMap) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := checkObs("quadratic-map", m.Obs, 2); err != nil {
		return nil, err
	}
	v := m.start(rng)
	if err := m.advance(v, mapTransient); err != nil {
		return nil, err
	}
	if m.settled(v) {
		return nil, fmt.Errorf("quadratic-map: %w: the orbit settled on a fixed point", ErrConstant)
	}
	out := make([]float64, n)
	for i := range out {
		if err := m.advance(v, 1); err != nil {
			return nil, err
		}
		out[i] = v[m.Obs]
	}
	return out, nil
}

// quadSpectrum is the label rule's spectrum: the orbit from x0 after
// transient iterations must not have escaped (ErrDiverged) nor settled on
// a fixed point (ErrConstant); then the first k exponents are averaged over
// iters iterations.
func quadSpectrum(m QuadraticMap, x0 []float64, transient, iters, k int) (Spectrum, error) {
	v := []float64{x0[0], x0[1]}
	if err := m.advance(v, transient); err != nil {
		return Spectrum{}, err
	}
	if m.settled(v) {
		return Spectrum{}, fmt.Errorf("%w: the orbit settled on a fixed point", ErrConstant)
	}
	return mapSpectrum(m, v, 0, iters, k)
}

// quadSeriesSpectrum is the per-series rule's spectrum (ClassFrom): λ1
// from x0 after the generator's transient.
func quadSeriesSpectrum(m QuadraticMap, x0 []float64) (Spectrum, error) {
	return quadSpectrum(m, x0, mapTransient, mapLyapIters, 1)
}

// quadClass is the per-series label rule (ClassFrom) of the map from x0.
func quadClass(m QuadraticMap, x0 []float64) (Class, error) {
	sp, err := quadSeriesSpectrum(m, x0)
	if err != nil {
		return "", err
	}
	if sp.Exponents[0] > mapChaosThreshold {
		return Chaotic, nil
	}
	return Regular, nil
}

// quadKeys are the parameter names a1..a12.
var quadKeys = func() [12]string {
	var k [12]string
	for i := range k {
		k[i] = "a" + strconv.Itoa(i+1)
	}
	return k
}()

// quadCoefMax bounds the coefficients (Sprott 1993 drew them from
// [−1.2, 1.2] in steps of 0.1).
const quadCoefMax = 1.2

func quadFromParams(p map[string]float64) QuadraticMap {
	var m QuadraticMap
	for i, k := range quadKeys {
		m.A[i] = p[k]
	}
	m.Obs = int(p["obs"])
	return m
}

// ErrNoDraw is returned by DrawQuadraticMap when no coefficient set with
// the wanted label turned up within the allowed number of tries.
var ErrNoDraw = errors.New("no coefficient set found")

// DrawQuadraticMap draws coefficient sets a1..a12 uniformly in
// [−1.2, 1.2] until one is bounded and has the wanted label from two
// starts drawn as Generate draws them, and returns it as overrides for the
// "quadratic-map" system. want is Chaotic, or Regular: a bounded periodic
// or quasi-periodic orbit that is not a fixed point (orbits that settle on
// a fixed point give constant series and are rejected, as are escaping
// ones). The two starts make it likely, not certain, that another start
// (the one a series draws) has the same label, since such maps can be
// multistable; the label of a series is ClassFrom's. The draws depend only
// on rng, so the result is deterministic for a seed. The error wraps
// ErrNoDraw after maxTries sets and ErrParamRange for another want.
func DrawQuadraticMap(rng *rand.Rand, want Class, maxTries int) (map[string]float64, error) {
	if want != Chaotic && want != Regular {
		return nil, fmt.Errorf("quadratic-map: %w: want class %q, only chaotic or regular can be drawn", ErrParamRange, want)
	}
	for try := 0; try < maxTries; try++ {
		var m QuadraticMap
		for i := range m.A {
			m.A[i] = quadCoefMax * (2*rng.Float64() - 1)
		}
		ok := true
		for s := 0; s < 2 && ok; s++ {
			c, err := quadClass(m, m.start(rng))
			ok = err == nil && c == want
		}
		if ok {
			p := make(map[string]float64, len(quadKeys))
			for i, k := range quadKeys {
				p[k] = m.A[i]
			}
			return p, nil
		}
	}
	return nil, fmt.Errorf("quadratic-map: %w with a %s label in %d tries", ErrNoDraw, want, maxTries)
}

func init() {
	defaults := [12]float64{1.2, 0, -1.4 / 1.2, 0, 1, 0, 0, 0.3, 0, 0, 0, 0}
	params := make([]Param, 0, 13)
	for i, k := range quadKeys {
		eq, term := "x'", [...]string{"1", "x", "x²", "x y", "y", "y²"}[i%6]
		if i >= 6 {
			eq = "y'"
		}
		params = append(params, Param{Name: k, Default: defaults[i], Min: -quadCoefMax, Max: quadCoefMax, Doc: "coefficient of " + term + " in " + eq})
	}
	params = append(params, obsParam("x", "y"))
	mk := quadFromParams
	register(&System{
		Name:   "quadratic-map",
		Title:  "general 2-D quadratic map with 12 coefficients (observed x or y)",
		Doc:    "x' = a1 + a2 x + a3 x² + a4 x y + a5 y + a6 y², y' = a7 + a8 x + a9 x² + a10 x y + a11 y + a12 y² (Sprott 1993), coefficients in [-1.2, 1.2]. Most coefficient sets let the orbit escape (ErrDiverged from Generate, Class and ClassFrom within a few iterations of leaving) or settle on a fixed point (ErrConstant); DrawQuadraticMap draws bounded sets with a wanted label. The default is the rescaled Hénon map (a1 = 1.2, a3 = -1.4/1.2, a5 = 1, a8 = 0.3). Label: chaotic when λ1 of the tangent map (10^5 iterations after 10^4 from (0.05, 0.05); per series from the drawn start after the 1000-iteration transient) exceeds 0.01 per iteration, otherwise regular.",
		Params: params,
		Invariants: []Invariant{
			{Name: "nl_div_rate", Value: 0.41922, Unit: "per iteration", Source: "Hénon map rescaled: Sprott, Chaos and Time-Series Analysis (2003), appendix; confirmed: tkf/LyapunovExponents.jl src/examples/henon_map.jl"},
			{Name: "lyap_sum", Value: math.Log(0.3), Unit: "per iteration", Source: "analytic: ln|det J| = ln 0.3 for the rescaled Hénon map"},
		},
		TimeAxis:     AxisIteration,
		DefaultClass: Chaotic,
		lyap: func(p map[string]float64) (Spectrum, error) {
			return quadSpectrum(mk(p), []float64{0.05, 0.05}, mapLyapTransient, mapLyapIters, 2)
		},
		initial: func(p map[string]float64, rng *rand.Rand) []float64 {
			return mk(p).start(rng)
		},
		lyapFrom: func(p map[string]float64, x0 []float64) (Spectrum, error) {
			return quadSeriesSpectrum(mk(p), x0)
		},
		threshold: mapChaosThreshold,
		build: func(p map[string]float64) (Generator, float64, error) {
			return mk(p), 1, nil
		},
	})
}
