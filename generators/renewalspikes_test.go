package generators

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// TestRenewalSpikesMoments: the sample mean and variance match the
// analytic ν τ (Campbell) and ντ/2 + ντ M(1/τ) − (ντ)² (renewal density),
// from bursty (k = 0.5) through Poisson (k = 1) to nearly regular
// (k = 20) intervals, within four standard errors of 24 replicates of
// 20000 samples (checkReplicates). The first sample matches the mean too
// (400 replicates): the equilibrium start makes the record stationary even
// when the burn-in spans few intervals (k = 20, ντ = 0.1: 40τ is four
// intervals, too few for the spike phase to forget an arbitrary start).
func TestRenewalSpikesMoments(t *testing.T) {
	for _, g := range []RenewalSpikes{
		{Rate: 0.1, Shape: 4, Tau: 3, Dt: 1},
		{Rate: 0.05, Shape: 0.5, Tau: 10, Dt: 1},
		{Rate: 0.2, Shape: 1, Tau: 2, Dt: 0.5},
		{Rate: 0.01, Shape: 20, Tau: 10, Dt: 2},
		{Rate: 1, Shape: 8, Tau: 5, Dt: 1},
	} {
		mean, variance := g.Moments()
		est := [][]float64{nil, nil}
		for rep := uint64(0); rep < 24; rep++ {
			x, err := g.Generate(20000, newRand(200+rep))
			if err != nil {
				t.Fatal(err)
			}
			m := meanOf(x, func(v float64) float64 { return v })
			est[0] = append(est[0], m)
			est[1] = append(est[1], meanOf(x, func(v float64) float64 { return (v - m) * (v - m) }))
		}
		label := fmt.Sprintf("%+v", g)
		checkReplicates(t, label, []string{"mean", "variance"}, []float64{mean, variance}, est)
		var first []float64
		for rep := uint64(0); rep < 400; rep++ {
			x, err := g.Generate(1, newRand(2000+rep))
			if err != nil {
				t.Fatal(err)
			}
			first = append(first, x[0])
		}
		checkReplicates(t, label, []string{"first sample"}, []float64{mean}, [][]float64{first})
	}
}

// TestRenewalSpikesLimits: the variance formula reduces to Campbell's
// ντ/2 for Poisson spikes (k = 1, analytic: M(s) = ν/s) and, as k → ∞, to
// the variance of a strictly periodic train of random phase,
// ντ/2 + ντ/(e^{1/(ντ)} − 1) − (ντ)² (analytic: the spikes one period
// apart add a geometric series).
func TestRenewalSpikesLimits(t *testing.T) {
	for _, nt := range []float64{0.05, 0.5, 3, 40} {
		_, v := RenewalSpikes{Rate: nt, Shape: 1, Tau: 1, Dt: 1}.Moments()
		if math.Abs(v-nt/2) > 1e-9*nt {
			t.Errorf("ντ = %g, k = 1: variance %.12g, want ντ/2 = %g", nt, v, nt/2)
		}
		_, v = RenewalSpikes{Rate: nt, Shape: 1e8, Tau: 1, Dt: 1}.Moments()
		want := nt/2 + nt/math.Expm1(1/nt) - nt*nt
		if math.Abs(v-want) > 1e-5*math.Max(want, 1e-3) {
			t.Errorf("ντ = %g, k → ∞: variance %.8g, periodic train %.8g", nt, v, want)
		}
	}
}

// TestRenewalSpikesIntervals: the spike times are recovered from the
// series (between samples the state decays by exactly e^{−Dt/τ}, so the
// innovation x_i − e^{−Dt/τ}·x_{i−1} is 0 to rounding without a spike and
// at least e^{−Dt/τ} = e^{−5} with one), and their intervals follow the
// Gamma(k, 1/(kν)) law: Kolmogorov–Smirnov distance to gonum's
// distuv.Gamma CDF below the 0.1% critical value (ksCritical) plus twice
// the most probability an interval range of one sample holds (Dt times
// the density at the mode): spike times are known to one sample, and two
// spikes in one sample merge. At k = 1, 4 and 20; for k < 1 the density
// diverges at 0 and merges are frequent (6% of intervals at k = 0.5
// here), so the bursty law is checked through the variance instead (it
// depends on the interval law through its Laplace transform at 1/τ).
func TestRenewalSpikesIntervals(t *testing.T) {
	const n = 400000
	for _, k := range []float64{1, 4, 20} {
		g := RenewalSpikes{Rate: 0.005, Shape: k, Tau: 0.2, Dt: 1}
		x, err := g.Generate(n, newRand(31))
		if err != nil {
			t.Fatal(err)
		}
		decay := math.Exp(-g.Dt / g.Tau)
		var iv []float64
		last := -1
		for i := 1; i < n; i++ {
			if x[i]-decay*x[i-1] > 1e-9 {
				if last >= 0 {
					iv = append(iv, float64(i-last))
				}
				last = i
			}
		}
		law := distuv.Gamma{Alpha: k, Beta: k * g.Rate} // gonum: shape and rate
		d := ksDistance(iv, law.CDF)
		lim := ksCritical(len(iv)) + 2*g.Dt*law.Prob((k-1)/(k*g.Rate))
		t.Logf("k = %g: %d intervals, KS distance %.4f (limit %.4f)", k, len(iv), d, lim)
		if d > lim {
			t.Errorf("k = %g: intervals KS distance %.4f from Gamma(k, 1/(kν)), limit %.4f", k, d, lim)
		}
	}
}
