package generators

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// ARFIMA is the Gaussian ARFIMA(1, d, 0) process (1 − φB)(1 − B)^d x_t = ε_t,
// ε ~ N(0, 1), B the backshift (Granger & Joyeux, J. Time Ser. Anal. 1
// (1980) 15; Hosking, Biometrika 68 (1981) 165): long memory for
// 0 < d < ½ (autocorrelation ~ k^{2d−1}, spectrum ~ ω^{−2d} at low
// frequency), anti-persistence for −½ < d < 0, short-range AR(1) colour
// through φ. Phi = 0 is fractionally integrated noise, ARFIMA(0, d, 0), with
// autocovariance (Hosking 1981)
//
//	γ(0) = Γ(1 − 2d)/Γ(1 − d)²,   γ(k) = γ(k−1)·(k − 1 + d)/(k − d),
//
// so ρ(1) = d/(1 − d). Its spectral density is
// S(ω) = |2 sin(ω/2)|^{−2d} / |1 − φe^{−iω}|² (per unit innovation
// variance, ∫_{−π}^{π} S dω/2π = γ(0)).
//
// Synthesis: ARFIMA(0, d, 0) is drawn exactly by circulant embedding of
// γ (Davies & Harte, Biometrika 74 (1987) 95; circulantGaussian), then, for
// φ ≠ 0, filtered by the AR(1) recursion y_t = φ y_{t−1} + u_t from y = 0
// over a burn-in of ⌈40/(−ln|φ|)⌉ extra samples (at least 100), after which
// the start is forgotten to e^{−40}. Time O(n log n).
type ARFIMA struct {
	D   float64 // fractional difference, −0.5 < D < 0.5
	Phi float64 // AR(1) coefficient, |Phi| < 1
}

// arfimaAcovFill writes the unit-innovation ARFIMA(0, d, 0) autocovariance
// into c.
func arfimaAcovFill(d float64) func(c []float64) {
	return func(c []float64) {
		if len(c) == 0 {
			return
		}
		lg12, _ := math.Lgamma(1 - 2*d)
		lg1, _ := math.Lgamma(1 - d)
		c[0] = math.Exp(lg12 - 2*lg1)
		for k := 1; k < len(c); k++ {
			kf := float64(k)
			c[k] = c[k-1] * (kf - 1 + d) / (kf - d)
		}
	}
}

// Generate returns n samples of the stationary process.
func (a ARFIMA) Generate(n int, rng *rand.Rand) ([]float64, error) {
	if err := checkN(n); err != nil {
		return nil, err
	}
	if !(a.D > -0.5 && a.D < 0.5 && math.Abs(a.Phi) < 1) {
		return nil, fmt.Errorf("arfima: d = %g, phi = %g, want −0.5 < d < 0.5 and |phi| < 1", a.D, a.Phi)
	}
	burn := 0
	if a.Phi != 0 {
		burn = int(math.Max(100, math.Ceil(40/-math.Log(math.Abs(a.Phi)))))
	}
	u, err := circulantGaussian(arfimaAcovFill(a.D), n+burn, rng)
	if err != nil {
		return nil, fmt.Errorf("arfima: %w", err)
	}
	if burn == 0 {
		return u, nil
	}
	for i := 1; i < len(u); i++ {
		u[i] += a.Phi * u[i-1]
	}
	out := make([]float64, n)
	copy(out, u[burn:])
	return out, nil
}

func init() {
	registerNoise(&System{
		Name:  "arfima",
		Title: "ARFIMA(1, d, 0) long-memory Gaussian noise",
		Doc:   "(1 - phi B)(1 - B)^d x = e: fractionally integrated noise drawn exactly by circulant embedding of Hosking's autocovariance, then AR(1)-filtered with a burn-in. d > 0 long memory, d < 0 anti-persistent. Label: stochastic.",
		Params: []Param{
			{Name: "d", Default: 0.3, Min: -0.45, Max: 0.45, Doc: "fractional difference d (Hurst H = d + ½)"},
			{Name: "phi", Default: 0, Min: -0.95, Max: 0.95, Doc: "AR(1) coefficient φ"},
		},
		Invariants: []Invariant{
			{Name: "lag1_autocorrelation", Value: 0.3 / 0.7, Unit: "", Source: "Hosking, Biometrika 68 (1981) 165: ρ(1) = d/(1 - d) for ARFIMA(0, d, 0)"},
			{Name: "sc_fluct_a1", Value: 0.8, Unit: "", Source: "Peng et al., Phys. Rev. E 49 (1994) 1685 with H = d + ½ (standard result)"},
			{Name: "sc_psd_beta", Value: 0.6, Unit: "", Source: "Hosking (1981): S(ω) ~ ω^-2d at low frequency"},
		},
	}, func(p map[string]float64) (Generator, error) {
		return ARFIMA{D: p["d"], Phi: p["phi"]}, nil
	})
}
