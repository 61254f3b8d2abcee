package generators

import (
	"fmt"
	"math"
	"testing"
)

// TestCoxCountsTotalVariance: for counts N_t ~ Poisson(λ_t) with a
// log-normal OU rate of mean λ̄ and log-sd s, the laws of total
// expectation and variance give (analytic) E[N] = λ̄,
// Var[N] = λ̄ + λ̄²(e^{s²} − 1) (variance = mean + variance of the rate) and
// Cov(N_t, N_{t+k}) = Cov(λ_t, λ_{t+k}) = λ̄²(exp(s² e^{−k/τ}) − 1) for
// k ≥ 1. Checked over R = 24 series of n = 50000 at λ̄ = 4, s = 0.7, τ = 20
// (the product-method Poisson draws) and λ̄ = 500, s = 0.3, τ = 5 (PTRS),
// within four standard errors of the replicate spread; all counts are
// non-negative integers.
func TestCoxCountsTotalVariance(t *testing.T) {
	const n, reps = 50000, 24
	for ci, g := range []CoxCounts{{MeanRate: 4, LogSD: 0.7, Tau: 20}, {MeanRate: 500, LogSD: 0.3, Tau: 5}} {
		lam, s2 := g.MeanRate, g.LogSD*g.LogSD
		names := []string{"mean", "variance", "cov(1)", "cov(τ)"}
		k2 := int(g.Tau)
		want := []float64{lam, lam + lam*lam*(math.Exp(s2)-1), lam * lam * (math.Exp(s2*math.Exp(-1/g.Tau)) - 1), lam * lam * (math.Exp(s2*math.Exp(-float64(k2)/g.Tau)) - 1)}
		est := make([][]float64, len(want))
		rng := newRand(uint64(540 + ci))
		for r := 0; r < reps; r++ {
			x, err := g.Generate(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			for _, v := range x {
				if v < 0 || v != math.Trunc(v) {
					t.Fatalf("count %v", v)
				}
			}
			m := meanOf(x, func(v float64) float64 { return v })
			vals := []float64{m, meanOf(x, func(v float64) float64 { return (v - m) * (v - m) })}
			for _, k := range []int{1, k2} {
				var c float64
				for i := 0; i+k < n; i++ {
					c += (x[i] - m) * (x[i+k] - m)
				}
				vals = append(vals, c/float64(n-k))
			}
			for k, v := range vals {
				est[k] = append(est[k], v)
			}
		}
		checkReplicates(t, fmt.Sprintf("%+v", g), names, want, est)
	}
	for _, g := range []CoxCounts{{MeanRate: 0, Tau: 1}, {MeanRate: 1, LogSD: -1, Tau: 1}, {MeanRate: 1, Tau: 0}} {
		if _, err := g.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v accepted", g)
		}
	}
}
