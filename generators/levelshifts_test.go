package generators

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// TestLevelShiftsChangePoints: a Poisson process of rate ν has an event in
// a unit interval with probability p = 1 − e^{−ν} (analytic), so the
// sampled mean changes at Binomial(n − 1, p) of the n − 1 sample
// boundaries. Over R = 400 series of n = 2000 at ν = 0.01 (≈ 20 changes
// each) the mean count is checked within four standard errors
// √(p(1 − p)(n − 1)/R), and the variance of the counts across series
// equals the binomial (n − 1)p(1 − p) within four standard errors of a
// sample variance (√(2/(R − 1)) relative, for near-Gaussian counts;
// standard statistics texts). The level at each change is a fresh
// N(0, sd²) draw (independent levels: sample variance of the levels) or
// the old level plus a N(0, sd²) step (walk: variance of the steps),
// within 5%; the noise x − mean is N(0, 1) by Kolmogorov–Smirnov (0.1%).
func TestLevelShiftsChangePoints(t *testing.T) {
	const n, reps, rate, sd = 2000, 400, 0.01, 3.0
	p := 1 - math.Exp(-rate)
	for _, walk := range []bool{false, true} {
		rng := newRand(490)
		if walk {
			rng = newRand(491)
		}
		var counts, levels, noise []float64
		for r := 0; r < reps; r++ {
			x, mean, err := LevelShifts{Rate: rate, LevelSD: sd, Walk: walk}.Path(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			var c float64
			for i := 1; i < n; i++ {
				if mean[i] != mean[i-1] {
					c++
					if walk {
						levels = append(levels, mean[i]-mean[i-1])
					} else {
						levels = append(levels, mean[i])
					}
				}
			}
			counts = append(counts, c)
			if r < 20 {
				for i := range x {
					noise = append(noise, x[i]-mean[i])
				}
			}
		}
		m, _ := meanSE(counts)
		v := variance(counts) * reps / (reps - 1)
		wantM, wantV := float64(n-1)*p, float64(n-1)*p*(1-p)
		seM := math.Sqrt(wantV / reps)
		seV := wantV * math.Sqrt(2.0/(reps-1))
		ls := meanOf(levels, func(v float64) float64 { return v * v })
		d := ksDistance(noise, distuv.UnitNormal.CDF)
		t.Logf("walk = %v: changes %.3f (binomial mean %.3f ± %.3f), variance %.3f (binomial %.3f ± %.3f), level E[l²] %.3f (sd² = %g), noise KS %.4f", walk, m, wantM, seM, v, wantV, seV, ls, sd*sd, d)
		if math.Abs(m-wantM) > 4*seM || math.Abs(v-wantV) > 4*seV {
			t.Errorf("walk = %v: change count mean %.3f, variance %.3f; want %.3f, %.3f", walk, m, v, wantM, wantV)
		}
		if math.Abs(ls/(sd*sd)-1) > 0.05 {
			t.Errorf("walk = %v: level mean square %.3f, want %g", walk, ls, sd*sd)
		}
		if d > ksCritical(len(noise)) {
			t.Errorf("walk = %v: noise KS D = %.4f > %.4f", walk, d, ksCritical(len(noise)))
		}
	}
	for _, g := range []LevelShifts{{Rate: 0, LevelSD: 1}, {Rate: 0.1, LevelSD: 0}, {Rate: math.Inf(1), LevelSD: 1}} {
		if _, err := g.Generate(10, newRand(1)); err == nil {
			t.Errorf("%+v accepted", g)
		}
	}
}
