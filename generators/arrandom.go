package generators

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
)

// RandomAR is a Gaussian autoregression x_t = Σ_{k=1}^{p} a_k x_{t−k} + ε_t,
// ε ~ N(0, 1), whose characteristic roots (poles) z_i are drawn at random
// inside the disc of radius RMax < 1: a random rational spectrum
//
//	S(ω) = 1 / |A(e^{−iω})|²,   A(z) = 1 − Σ a_k z^k = Π_i (1 − z_i z),
//
// with resonant peaks at the angles of complex pole pairs (sharper as their
// modulus nears 1), low-pass shape from positive real poles and high-pass
// shape from negative ones (Box & Jenkins, Time Series Analysis (1970),
// standard result). Every pole has modulus ≤ RMax < 1, so the process is
// stationary for every seed.
//
// Pole draw, from a generator seeded by PoleSeed and the order alone (so the plan can fix
// a spectrum and vary the noise): the number of complex-conjugate pairs c
// is uniform on 0..⌊p/2⌋, the other p − 2c poles are real. The dominant pole
// (a pair if c > 0 and, when real poles exist too, a fair coin says so) has
// modulus exactly RMax; every other pole is uniform over the disc of radius
// RMax (modulus RMax·√U). Pair angles are uniform on (0, π); real poles
// are positive or negative with probability ½.
//
// The series starts from zeros and discards ⌈40/(−ln RMax)⌉ samples (at
// least 100), after which the start is forgotten to about e^{−40} (times a
// polynomial factor for repeated poles).
type RandomAR struct {
	Order    int     // p, 1..8
	RMax     float64 // largest pole modulus, 0 ≤ RMax ≤ 0.98
	PoleSeed uint64  // selects the pole set
}

// randomARMaxOrder and randomARMaxModulus bound the documented ranges.
const (
	randomARMaxOrder   = 8
	randomARMaxModulus = 0.98
)

func (g RandomAR) check() error {
	if g.Order < 1 || g.Order > randomARMaxOrder || !(g.RMax >= 0 && g.RMax <= randomARMaxModulus) {
		return fmt.Errorf("ar-random: order = %d, rmax = %g, want 1 ≤ order ≤ %d and 0 ≤ rmax ≤ %g", g.Order, g.RMax, randomARMaxOrder, randomARMaxModulus)
	}
	return nil
}

// Poles returns the p characteristic roots, conjugate pairs adjacent.
func (g RandomAR) Poles() ([]complex128, error) {
	if err := g.check(); err != nil {
		return nil, err
	}
	r := rand.New(rand.NewPCG(g.PoleSeed, 0x5eed_a11_9013+uint64(g.Order)))
	pairs := r.IntN(g.Order/2 + 1)
	reals := g.Order - 2*pairs
	pairFirst := pairs > 0 && (reals == 0 || r.IntN(2) == 0)
	poles := make([]complex128, 0, g.Order)
	for i := 0; i < pairs; i++ {
		mod := g.RMax
		if !(pairFirst && i == 0) {
			mod = g.RMax * math.Sqrt(r.Float64())
		}
		z := cmplx.Rect(mod, math.Pi*r.Float64())
		poles = append(poles, z, cmplx.Conj(z))
	}
	for i := 0; i < reals; i++ {
		mod := g.RMax
		if pairFirst || i > 0 {
			mod = g.RMax * math.Sqrt(r.Float64())
		}
		if r.IntN(2) == 0 {
			mod = -mod
		}
		poles = append(poles, complex(mod, 0))
	}
	return poles, nil
}

// Coefficients returns a_1..a_p, expanded from the poles in real
// arithmetic: each pair contributes the factor 1 − 2r cos θ z + r² z², each
// real pole 1 − r z.
func (g RandomAR) Coefficients() ([]float64, error) {
	poles, err := g.Poles()
	if err != nil {
		return nil, err
	}
	poly := []float64{1} // coefficients of A(z) in increasing powers
	mul := func(f []float64) {
		next := make([]float64, len(poly)+len(f)-1)
		for i, a := range poly {
			for j, b := range f {
				next[i+j] += a * b
			}
		}
		poly = next
	}
	for i := 0; i < len(poles); i++ {
		z := poles[i]
		if imag(z) != 0 {
			mul([]float64{1, -2 * real(z), real(z)*real(z) + imag(z)*imag(z)})
			i++ // skip the conjugate
			continue
		}
		mul([]float64{1, -real(z)})
	}
	a := make([]float64, g.Order)
	for k := range a {
		a[k] = -poly[k+1]
	}
	return a, nil
}

// Generate returns n samples of the stationary process. Time O(p·n).
func (g RandomAR) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	a, err := g.Coefficients()
	if err != nil {
		return nil, err
	}
	burn := 100
	if g.RMax > 0 {
		burn = int(math.Max(100, math.Ceil(40/-math.Log(g.RMax))))
	}
	p := len(a)
	buf := make([]float64, p+burn+n) // p leading zeros as the start
	for t := p; t < len(buf); t++ {
		x := rng.NormFloat64()
		for k, ak := range a {
			x += ak * buf[t-1-k]
		}
		buf[t] = x
	}
	return buf[p+burn:], nil
}

func init() {
	registerNoise(&System{
		Name:  "ar-random",
		Title: "AR(p) with random poles (random rational spectrum)",
		Doc:   "Gaussian AR(p), p ≤ 8, whose poles are drawn from pole_seed inside the disc of radius rmax (dominant pole at rmax; complex pairs give resonant peaks, real poles low- or high-pass shape); always stationary. Label: stochastic.",
		Params: []Param{
			{Name: "order", Default: 4, Min: 1, Max: randomARMaxOrder, Integer: true, Doc: "autoregressive order p"},
			{Name: "rmax", Default: 0.9, Min: 0, Max: randomARMaxModulus, Doc: "modulus of the dominant pole (all poles lie within it)"},
			{Name: "pole_seed", Default: 1, Min: 0, Max: math.MaxUint32, Integer: true, Doc: "seed of the pole draw (fixes the spectrum)"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return RandomAR{Order: int(p["order"]), RMax: p["rmax"], PoleSeed: uint64(p["pole_seed"])}, nil
	})
}
