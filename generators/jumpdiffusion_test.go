package generators

import (
	"fmt"
	"math"
	"testing"
)

// TestJumpDiffusionCumulants: x is a unit OU plus jumps N(μ_J, σ_J²) at
// rate ν filtered by e^{−t/τ}, so by Campbell's theorem (analytic; the
// cumulants of filtered Poisson noise are κ_m = ν E[J^m] ∫ h^m) and
// Merton's Gaussian jump sizes (J. Financ. Econ. 3 (1976) 125)
//
//	mean ν μ_J τ,   variance 1 + ν (μ_J² + σ_J²) τ/2,
//	κ4 = ν (μ_J⁴ + 6μ_J²σ_J² + 3σ_J⁴) τ/4,   ρ(k) = e^{−k/τ}.
//
// R = 24 series of n = 50000 at τ = 10, ν = 0.05, μ_J = 1, σ_J = 4 (≈ 2500
// jumps each) and at τ = 200, ν = 0.002, μ_J = −3, σ_J = 2 (slow
// relaxation, exercising the stationary start): per-replicate sample
// mean, variance, fourth cumulant m4 − 3m2² and lag autocorrelations,
// compared within four standard errors of the replicate spread (the
// per-replicate moment estimators have O(1/n) bias, far below that).
func TestJumpDiffusionCumulants(t *testing.T) {
	const n, reps = 50000, 24
	for ci, g := range []JumpDiffusion{{Tau: 10, Rate: 0.05, JumpMean: 1, JumpSD: 4}, {Tau: 200, Rate: 0.002, JumpMean: -3, JumpSD: 2}} {
		mu, sd, nu, tau := g.JumpMean, g.JumpSD, g.Rate, g.Tau
		ej2 := mu*mu + sd*sd
		ej4 := mu*mu*mu*mu + 6*mu*mu*sd*sd + 3*sd*sd*sd*sd
		lags := []int{1, int(tau)}
		names := []string{"mean", "variance", "κ4", "ρ(1)", "ρ(τ)"}
		want := []float64{nu * mu * tau, 1 + nu*ej2*tau/2, nu * ej4 * tau / 4, math.Exp(-1 / tau), math.Exp(-1)}
		est := make([][]float64, len(want))
		rng := newRand(uint64(470 + ci))
		for r := 0; r < reps; r++ {
			x, err := g.Generate(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			m := meanOf(x, func(v float64) float64 { return v })
			m2 := meanOf(x, func(v float64) float64 { return (v - m) * (v - m) })
			m4 := meanOf(x, func(v float64) float64 { return math.Pow(v-m, 4) })
			vals := []float64{m, m2, m4 - 3*m2*m2}
			for _, k := range lags {
				var c float64
				for i := 0; i+k < n; i++ {
					c += (x[i] - m) * (x[i+k] - m)
				}
				vals = append(vals, c/float64(n)/m2)
			}
			for k, v := range vals {
				est[k] = append(est[k], v)
			}
		}
		checkReplicates(t, fmt.Sprintf("%+v", g), names, want, est)
	}
	for _, g := range []JumpDiffusion{{Tau: 0, Rate: 1, JumpSD: 1}, {Tau: 1, Rate: 0, JumpSD: 1}, {Tau: 1, Rate: 1, JumpSD: -1}, {Tau: 1, Rate: 1, JumpMean: math.NaN()}} {
		if _, err := g.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v accepted", g)
		}
	}
}
