package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// Stable is i.i.d. α-stable noise of unit scale and zero location in
// Nolan's S0 parameterisation, whose characteristic function is
//
//	E e^{itX} = exp(−|t|^α [1 + iβ tan(πα/2) sign(t) (|t|^{1−α} − 1)])   (α ≠ 1)
//	E e^{itX} = exp(−|t| [1 + iβ (2/π) sign(t) ln|t|])                   (α = 1)
//
// (Nolan, Stat. Probab. Lett. 38 (1998) 187 (memory); S0 form as in docs.scipy.org scipy.stats.levy_stable). α = 2 is the
// Gaussian N(0, 2) (the σ = 1 convention of the stable family means
// variance 2σ²), α = 1 with β = 0 the standard Cauchy law; α < 2 has tails
// P(|X| > x) ~ x^{−α}, so no variance, and no mean for α ≤ 1. S0 is
// continuous in (α, β), unlike the S1 form, whose location runs off to
// infinity as α → 1 with β ≠ 0; S0 = S1 − β tan(πα/2).
//
// Draws use the Chambers–Mallows–Stuck transformation (Chambers, Mallows &
// Stuck, J. Am. Stat. Assoc. 71 (1976) 340) in the form of Weron (Stat.
// Probab. Lett. 28 (1996) 165; confirmed: search.r-project.org/CRAN/refmans/alphastable/html/urstab.html): with V uniform on (−π/2, π/2) and
// W ~ Exp(1), B = arctan(β tan(πα/2))/α and S = (1 + β² tan²(πα/2))^{1/(2α)},
//
//	X1 = S · sin(α(V + B)) / (cos V)^{1/α} · (cos(V − α(V + B))/W)^{(1−α)/α}   (α ≠ 1)
//	X1 = (2/π) [(π/2 + βV) tan V − β ln((π/2) W cos V / (π/2 + βV))]          (α = 1)
//
// and X = X1 − β tan(πα/2) for α ≠ 1, X = X1 for α = 1 (S0 and S1 agree
// there). For |α − 1| < 1e−9 the α = 1 formula is used:
// the subtraction would lose digits there, and the S0 law differs from its
// α = 1 limit by O(|α − 1| ln) (continuity of S0), far below sampling error.
// V never reaches ±π/2 (the uniform is drawn on the open interval) and
// values are not clipped.
type Stable struct {
	Alpha float64 // stability index, 0 < Alpha ≤ 2
	Beta  float64 // skewness, −1 ≤ Beta ≤ 1
}

func (s Stable) check(name string) error {
	if !(s.Alpha > 0 && s.Alpha <= 2 && s.Beta >= -1 && s.Beta <= 1) {
		return fmt.Errorf("%s: alpha = %g, beta = %g, want 0 < alpha ≤ 2 and −1 ≤ beta ≤ 1", name, s.Alpha, s.Beta)
	}
	return nil
}

// Generate returns n independent draws.
func (s Stable) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if err := s.check("stable"); err != nil {
		return nil, err
	}
	out := make([]float64, n)
	d := newStableDraw(s.Alpha, s.Beta)
	for i := range out {
		out[i] = d.draw(rng)
	}
	return out, nil
}

// stableDraw holds the constants of the Chambers–Mallows–Stuck
// transformation for one (α, β).
type stableDraw struct {
	alpha, beta float64
	one         bool    // use the α = 1 formula
	b, s, shift float64 // B, S and β tan(πα/2)
	inv, expo   float64 // 1/α and (1 − α)/α
}

func newStableDraw(alpha, beta float64) stableDraw {
	d := stableDraw{alpha: alpha, beta: beta}
	if math.Abs(alpha-1) < 1e-9 {
		d.one = true
		return d
	}
	t := beta * math.Tan(math.Pi*alpha/2)
	d.b = math.Atan(t) / alpha
	d.s = math.Pow(1+t*t, 1/(2*alpha))
	d.shift = t
	d.inv = 1 / alpha
	d.expo = (1 - alpha) / alpha
	return d
}

// draw returns one S0 variate. A draw that rounding makes non-finite
// (possible only when V lies within about 1e−15 of ±π/2, where a cosine
// that is positive in exact arithmetic can round to zero or below) is
// redrawn; this changes the law by less than 1e−15.
func (d stableDraw) draw(rng *rand.Rand) float64 {
	for {
		u := rng.Float64()
		if u == 0 {
			continue
		}
		v := math.Pi * (u - 0.5)
		w := rng.ExpFloat64()
		var x float64
		if d.one {
			h := math.Pi/2 + d.beta*v
			x = 2 / math.Pi * (h*math.Tan(v) - d.beta*math.Log(math.Pi/2*w*math.Cos(v)/h))
		} else {
			a := d.alpha * (v + d.b)
			// (cos V)^{−1/α}·(cos(V − a)/W)^{(1−α)/α} with one exponential.
			x = d.s*math.Sin(a)*math.Exp(d.expo*math.Log(math.Cos(v-a)/w)-d.inv*math.Log(math.Cos(v))) - d.shift
		}
		if !math.IsNaN(x) && !math.IsInf(x, 0) {
			return x
		}
	}
}

func init() {
	registerNoise(&System{
		Name:  "stable",
		Title: "i.i.d. α-stable noise (Chambers–Mallows–Stuck, S0 parameterisation)",
		Doc:   "Independent α-stable draws of unit scale in Nolan's S0 form (continuous in alpha and beta): alpha = 2 is N(0, 2), alpha = 1 with beta = 0 the Cauchy law, tails ~ x^-alpha below 2. Label: stochastic.",
		Params: []Param{
			{Name: "alpha", Default: 1.5, Min: 0.8, Max: 2, Doc: "stability index α"},
			{Name: "beta", Default: 0, Min: -1, Max: 1, Doc: "skewness β"},
		},
		Invariants: []Invariant{
			{Name: "hv_deg_mean", Value: 4, Unit: "", Source: "Luque et al., Phys. Rev. E 80 (2009) 046103: any continuous i.i.d. series"},
			{Name: "op_ent_d4", Value: 1, Unit: "normalised", Source: "Bandt & Pompe, Phys. Rev. Lett. 88 (2002) 174102: i.i.d."},
			{Name: "tail_exponent", Value: 1.5, Unit: "", Source: "standard result for stable laws: P(|X| > x) ~ x^-α"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return Stable{Alpha: p["alpha"], Beta: p["beta"]}, nil
	})
}
