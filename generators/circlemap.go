package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// CircleMap is Arnold's sine circle map
//
//	θ' = θ + Ω − (K/2π)·sin(2πθ)  (mod 1),
//
// observed through sin(2πθ) (Obs 0) or cos(2πθ) (Obs 1) (Arnold, Amer.
// Math. Soc. Transl. 46 (1965) 213 (memory); Jensen, Bak & Bohr, Phys.
// Rev. A 30 (1984) 1960). For 0 ≤ K < 1 it is a diffeomorphism of the
// circle (K = 1 a homeomorphism with a critical point): the rotation number
// ρ = lim (θ_N − θ_0)/N of the lift is rational on the Arnold tongues
// (mode-locked periodic orbits, λ < 0) and irrational between them
// (quasi-periodic, λ = 0), so the motion is regular; at K = 0 it is the
// rigid rotation, ρ = Ω. Above K = 1 the map is no longer invertible and
// chaotic orbits appear between overlapping tongues. The 0/1 tongue is
// |Ω − round(Ω)| ≤ K/2π, where the fixed points sin(2πθ*) = 2πΩ/K exist
// (analytic); where one of them is stable the observed series is
// constant.
type CircleMap struct {
	Omega float64 // bare rotation Ω
	K     float64 // nonlinearity K ≥ 0
	Obs   int     // observable: 0 sin(2πθ), 1 cos(2πθ)
}

func (m CircleMap) dim() int { return 1 }

// step returns the lift θ + Ω − (K/2π)·sin(2πθ) of θ ∈ [0, 1), split into
// its integer part and its fraction in [0, 1).
func (m CircleMap) step(theta float64) (wraps, frac float64) {
	u := theta + m.Omega - m.K/(2*math.Pi)*math.Sin(2*math.Pi*theta)
	wraps = math.Floor(u)
	frac = u - wraps
	if frac >= 1 { // u just below an integer can round up
		frac, wraps = 0, wraps+1
	}
	return wraps, frac
}

func (m CircleMap) next(dst, v []float64) { _, dst[0] = m.step(v[0]) }

func (m CircleMap) jacobian(j, v []float64) { j[0] = 1 - m.K*math.Cos(2*math.Pi*v[0]) }

// start draws θ0 uniform in [0, 1).
func (m CircleMap) start(rng *rand.Rand) []float64 { return []float64{rng.Float64()} }

func (m CircleMap) check() error {
	if !(m.K >= 0) || math.IsInf(m.K, 0) || math.IsNaN(m.Omega) || math.IsInf(m.Omega, 0) {
		return fmt.Errorf("circle-map: %w: omega = %g, k = %g, want finite omega and k ≥ 0", ErrParamRange, m.Omega, m.K)
	}
	return checkObs("circle-map", m.Obs, 2)
}

// Generate returns n values of the observable after mapTransient
// iterations from a random θ0. The error wraps ErrConstant when the
// observed series is constant: the orbit has settled on a stable fixed
// point (inside the 0/1 tongue), or, seen through sin(2πθ), on the
// period-2 orbit {0, ½} at the centre of the 1/2 tongue.
func (m CircleMap) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := m.check(); err != nil {
		return nil, err
	}
	theta := m.start(rng)[0]
	out := make([]float64, n)
	for i := -mapTransient; i < n; i++ {
		_, theta = m.step(theta)
		if i >= 0 {
			if m.Obs == 0 {
				out[i] = math.Sin(2 * math.Pi * theta)
			} else {
				out[i] = math.Cos(2 * math.Pi * theta)
			}
		}
	}
	lo, hi := out[0], out[0]
	for _, x := range out {
		lo, hi = min(lo, x), max(hi, x)
	}
	if hi-lo < 1e-9 {
		return nil, fmt.Errorf("circle-map: omega = %g, k = %g: the observed orbit is constant (a fixed point): %w", m.Omega, m.K, ErrConstant)
	}
	return out, nil
}

// RotationNumber returns (θ_N − θ_0)/N along the lift of the orbit from
// theta0 over iters iterations after transient iterations: the mean
// advance per iteration, counted in turns. The integer part of the lift is
// carried separately, so the fraction keeps full precision however long
// the orbit.
func (m CircleMap) RotationNumber(theta0 float64, transient, iters int) float64 {
	theta := theta0 - math.Floor(theta0)
	for i := 0; i < transient; i++ {
		_, theta = m.step(theta)
	}
	first := theta
	var turns float64
	for i := 0; i < iters; i++ {
		w, f := m.step(theta)
		turns += w
		theta = f
	}
	return (turns + theta - first) / float64(iters)
}

// circleGoldenOmega is the bare rotation at which the critical (K = 1)
// circle map has the golden-mean rotation number (√5 − 1)/2 (Shenker,
// Physica D 5 (1982) 405 (memory); Ω ≈ 0.60665 confirmed: cmp.caltech.edu/~mcc/Chaos_Course/Lesson19/Demo3.html).
const circleGoldenOmega = 0.606661063470

func init() {
	registerMap(&System{
		Name:  "circle-map",
		Title: "Arnold sine circle map theta' = theta + omega - (k/2π) sin(2π theta) mod 1 (observed sin or cos of 2π theta)",
		Doc:   "Quasi-periodic (irrational rotation number) or mode-locked (Arnold tongues) for k ≤ 1; k > 1 adds chaotic orbits between overlapping tongues. The default is the critical golden-mean orbit: k = 1, omega = 0.606661063470, rotation number (√5 - 1)/2. Inside the 0/1 tongue (|omega - round(omega)| ≤ k/2π, which omega in [0.18, 0.84] avoids for every k ≤ 1) a stable fixed point makes the series constant, as does the period-2 orbit {0, ½} seen through sin at omega = ½; Generate reports both as ErrConstant. k stops at 2.4 because from k = 2.47 on the default omega lies in the 0/1 tongue with a stable fixed point. Label: chaotic when λ1 from the tangent map 1 - k cos(2π theta) (orbit from 0.1, 10^5 iterations after 10^4) exceeds 0.01 per iteration; for k ≤ 1 the map is a circle homeomorphism, λ ≤ 0, and the label is regular.",
		Invariants: []Invariant{
			{Name: "rotation_number", Value: (math.Sqrt(5) - 1) / 2, Unit: "turns per iteration", Source: "Shenker, Physica D 5 (1982) 405 (memory): omega = 0.606661063470 at k = 1 gives the golden-mean rotation number"},
		},
		Params: []Param{
			{Name: "omega", Default: circleGoldenOmega, Min: 0.18, Max: 0.84, Doc: "bare rotation Ω (turns per iteration)"},
			{Name: "k", Default: 1, Min: 0, Max: 2.4, Doc: "nonlinearity K (k ≤ 1: invertible, regular)"},
			obsParam("sin(2π theta)", "cos(2π theta)"),
		},
		DefaultClass: Regular,
	}, func(p map[string]float64) CircleMap {
		return CircleMap{Omega: p["omega"], K: p["k"], Obs: int(p["obs"])}
	}, 0.1)
}
