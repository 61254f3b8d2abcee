package generators

import (
	"fmt"
	"math"
	"testing"
)

// TestStochVolMoments: for the log-normal stochastic volatility model with
// stationary Gaussian h ~ N(μ, σ_h²) of lag-k correlation φ^k (Taylor,
// Modelling Financial Time Series (1986) (memory)), the log-normal
// moment E e^{aY} = e^{aμ + a²σ²/2} gives (derived)
//
//	E[x²] = exp(μ + σ_h²/2),   E[x⁴] = 3 exp(2μ + 2σ_h²),
//	E[x_t² x_{t+k}²] = exp(2μ + σ_h²(1 + φ^k)),   E[x_t x_{t+1}] = 0.
//
// Each is estimated by the plain sample mean (unbiased) in R = 24 series
// of n = 50000 at μ = −0.5, φ = 0.9, σ_h = 0.6 and at μ = 1, φ = −0.5,
// σ_h = 1.2, and compared within four standard errors of the replicate
// spread.
func TestStochVolMoments(t *testing.T) {
	const n, reps = 50000, 24
	for ci, g := range []StochVol{{Mu: -0.5, Phi: 0.9, SigmaH: 0.6}, {Mu: 1, Phi: -0.5, SigmaH: 1.2}} {
		rng := newRand(uint64(420 + ci))
		s2 := g.SigmaH * g.SigmaH
		names := []string{"E x²", "E x⁴", "E x²x²(lag 1)", "E x²x²(lag 5)", "E x x(lag 1)"}
		want := []float64{
			math.Exp(g.Mu + s2/2),
			3 * math.Exp(2*g.Mu+2*s2),
			math.Exp(2*g.Mu + s2*(1+g.Phi)),
			math.Exp(2*g.Mu + s2*(1+math.Pow(g.Phi, 5))),
			0,
		}
		est := make([][]float64, len(want))
		for r := 0; r < reps; r++ {
			x, err := g.Generate(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			var m2, m4, c1, c5, l1 float64
			for i, v := range x {
				m2 += v * v
				m4 += v * v * v * v
				if i+1 < n {
					c1 += v * v * x[i+1] * x[i+1]
					l1 += v * x[i+1]
				}
				if i+5 < n {
					c5 += v * v * x[i+5] * x[i+5]
				}
			}
			for k, v := range []float64{m2 / n, m4 / n, c1 / (n - 1), c5 / (n - 5), l1 / (n - 1)} {
				est[k] = append(est[k], v)
			}
		}
		checkReplicates(t, fmt.Sprintf("%+v", g), names, want, est)
	}
	if _, err := (StochVol{Phi: 1, SigmaH: 1}).Generate(10, newRand(1)); err == nil {
		t.Error("phi = 1 accepted")
	}
	if _, err := (StochVol{Phi: 0.5, SigmaH: -1}).Generate(10, newRand(1)); err == nil {
		t.Error("sigma_h < 0 accepted")
	}
}
