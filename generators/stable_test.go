package generators

import (
	"math"
	"math/cmplx"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// TestStableClosedForms compares the empirical CDF of 10^5 draws by
// Kolmogorov–Smirnov (0.1% critical value) with the three stable laws that
// have a closed-form CDF (Samorodnitsky & Taqqu, Stable Non-Gaussian
// Random Processes (1994) (memory); standard results):
//   - α = 2 is N(0, 2) for every β (σ = 1 convention: variance 2σ²), CDF
//     from gonum's distuv.Normal;
//   - α = 1, β = 0 is the standard Cauchy law, F(x) = ½ + arctan(x)/π;
//   - α = ½, β = ±1 is the Lévy law: in S1 the characteristic function
//     exp(−|t|^{1/2}(1 ∓ i sign t)) is that of Lévy(0, c = 1), F(x) =
//     erfc(√(1/(2x))) (derived from the Lévy characteristic function
//     exp(−√(−2ict))); S0 shifts it by −β tan(π/4) = ∓1. β = −1 mirrors it.
//
// The α = ½ case lies outside the registry's range (α ≥ 0.8) but inside
// the type's, and pins the sign of β and the S0 shift.
func TestStableClosedForms(t *testing.T) {
	const n = 100000
	levy := func(x float64) float64 { // S0(½, 1): Lévy(−1, 1)
		if x <= -1 {
			return 0
		}
		return math.Erfc(math.Sqrt(1 / (2 * (x + 1))))
	}
	tests := []struct {
		name        string
		alpha, beta float64
		cdf         func(float64) float64
	}{
		{"gauss", 2, 0, distuv.Normal{Mu: 0, Sigma: math.Sqrt2}.CDF},
		{"gauss beta ignored", 2, 0.7, distuv.Normal{Mu: 0, Sigma: math.Sqrt2}.CDF},
		{"cauchy", 1, 0, func(x float64) float64 { return 0.5 + math.Atan(x)/math.Pi }},
		{"levy", 0.5, 1, levy},
		{"levy mirrored", 0.5, -1, func(x float64) float64 { return 1 - levy(-x) }},
	}
	for i, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			x, err := Stable{Alpha: tc.alpha, Beta: tc.beta}.Generate(n, newRand(uint64(300+i)))
			if err != nil {
				t.Fatal(err)
			}
			d := ksDistance(x, tc.cdf)
			t.Logf("α = %g, β = %g: KS D = %.5f (0.1%% critical %.5f)", tc.alpha, tc.beta, d, ksCritical(n))
			if d > ksCritical(n) {
				t.Errorf("KS D = %.5f > %.5f", d, ksCritical(n))
			}
		})
	}
}

// stableCF is the S0 characteristic function of unit scale (Nolan, Stat.
// Probab. Lett. 38 (1998) 187 (memory); the S0 form as in docs.scipy.org scipy.stats.levy_stable).
func stableCF(alpha, beta, t float64) complex128 {
	at := math.Abs(t)
	sg := math.Copysign(1, t)
	var re, im float64
	if alpha == 1 {
		re, im = at, at*beta*2/math.Pi*sg*math.Log(at)
	} else {
		p := math.Pow(at, alpha)
		re, im = p, p*beta*math.Tan(math.Pi*alpha/2)*sg*(math.Pow(at, 1-alpha)-1)
	}
	return cmplx.Exp(complex(-re, -im))
}

// TestStableCharacteristicFunction: the empirical characteristic function
// (1/n) Σ e^{itX} of n = 2·10^5 draws equals the S0 characteristic
// function at t ∈ {0.3, 0.7, 1.5, 3} over the registry's range of α and β,
// including α within 10^−6 of 1 (cancellation of the S1 shift) and within
// 10^−10 (the α = 1 formula, by continuity of S0). Each of the real and
// imaginary parts is a mean of bounded terms; the tolerance is five of its
// standard errors (sample sd/√n).
func TestStableCharacteristicFunction(t *testing.T) {
	const n = 200000
	cases := [][2]float64{{0.8, 1}, {0.8, -0.5}, {1, 0.5}, {1 + 1e-6, 0.8}, {1 - 1e-10, -0.8}, {1.2, 0.7}, {1.5, -1}, {1.9, 0.3}, {2, 0}}
	for i, c := range cases {
		alpha, beta := c[0], c[1]
		x, err := Stable{Alpha: alpha, Beta: beta}.Generate(n, newRand(uint64(320+i)))
		if err != nil {
			t.Fatal(err)
		}
		ref := alpha
		if math.Abs(alpha-1) < 1e-9 {
			ref = 1
		}
		for _, tt := range []float64{0.3, 0.7, 1.5, 3} {
			want := stableCF(ref, beta, tt)
			var re, im, re2, im2 float64
			for _, v := range x {
				s, c := math.Sincos(tt * v)
				re += c
				im += s
				re2 += c * c
				im2 += s * s
			}
			re, im = re/n, im/n
			seRe := math.Sqrt((re2/n - re*re) / n)
			seIm := math.Sqrt((im2/n - im*im) / n)
			if math.Abs(re-real(want)) > 5*seRe || math.Abs(im-imag(want)) > 5*seIm {
				t.Errorf("α = %g, β = %g, t = %g: φ̂ = %.4f%+.4fi, want %.4f%+.4fi (SE %.4f, %.4f)", alpha, beta, tt, re, im, real(want), imag(want), seRe, seIm)
			}
			if tt == 1.5 {
				t.Logf("α = %g, β = %+g, t = 1.5: φ̂ = %.4f%+.4fi, S0 %.4f%+.4fi", alpha, beta, re, im, real(want), imag(want))
			}
		}
	}
}

// TestStableErrors: parameters outside the domain are rejected.
func TestStableErrors(t *testing.T) {
	for _, s := range []Stable{{0, 0}, {2.01, 0}, {1.5, 1.1}, {math.NaN(), 0}, {1.5, math.NaN()}} {
		if _, err := s.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v accepted", s)
		}
	}
}
