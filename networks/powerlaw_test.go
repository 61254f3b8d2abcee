package networks

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestHurwitzZeta checks ζ(s, q) against closed forms and direct summation:
// ζ(2, 1) = π²/6, ζ(4, 1) = π⁴/90 (Euler), ζ(s, q) − ζ(s, q+1) = q^{−s}
// (definition), and a brute-force sum with an integral tail.
func TestHurwitzZeta(t *testing.T) {
	cases := []struct{ s, q, want float64 }{
		{2, 1, math.Pi * math.Pi / 6},
		{4, 1, math.Pow(math.Pi, 4) / 90},
		{2, 2, math.Pi*math.Pi/6 - 1},
		{3, 1, 1.2020569031595942}, // Apéry's constant ζ(3)
	}
	for _, c := range cases {
		if got := hurwitzZeta(c.s, c.q); math.Abs(got-c.want) > 1e-13*c.want {
			t.Errorf("ζ(%g, %g) = %.16g, want %.16g", c.s, c.q, got, c.want)
		}
	}
	for _, s := range []float64{1.1, 1.6, 2.5, 4, 8} {
		for _, q := range []float64{1, 3, 17, 50, 1000} {
			d := hurwitzZeta(s, q) - hurwitzZeta(s, q+1)
			if want := math.Pow(q, -s); math.Abs(d-want) > 1e-10*hurwitzZeta(s, q) {
				t.Errorf("ζ(%g,%g) − ζ(%g,%g) = %g, want %g", s, q, s, q+1, d, want)
			}
			// Direct sum of 2·10^4 terms plus the first Euler–Maclaurin tail
			// terms (remainder ≈ s·a^{−s−1}/12, below 1e−10 relative here).
			var sum float64
			const N = 20_000
			for k := N - 1; k >= 0; k-- {
				sum += math.Pow(float64(k)+q, -s)
			}
			a := float64(N) + q
			sum += math.Pow(a, 1-s)/(s-1) + math.Pow(a, -s)/2
			if got := hurwitzZeta(s, q); math.Abs(got-sum) > 1e-8*sum {
				t.Errorf("ζ(%g, %g) = %.15g, direct %.15g", s, q, got, sum)
			}
		}
	}
}

// TestPowerLawRecovery: on an exact discrete power law (sampled by inverting
// the CDF with ζ), the MLE recovers γ within 4 standard errors (γ−1)/√n
// (Clauset et al. 2009, eq. 3.2), both with k_min fixed and chosen by KS.
func TestPowerLawRecovery(t *testing.T) {
	rng := rand.New(rand.NewPCG(81, 82))
	for _, gamma := range []float64{1.8, 2.2, 2.6, 3.2} {
		const n, kmin, table = 20_000, 3, 1 << 16
		// Survival function S(k) = ζ(γ, k)/ζ(γ, kmin) tabulated by the
		// recurrence ζ(γ, k+1) = ζ(γ, k) − k^{−γ}; the rare draws beyond the
		// table are found by bisection on ζ directly.
		z := hurwitzZeta(gamma, kmin)
		surv := make([]float64, table+1)
		zk := z
		for k := kmin; k <= table; k++ {
			surv[k] = zk / z
			zk -= math.Pow(float64(k), -gamma)
		}
		for k := 0; k < kmin; k++ {
			surv[k] = 1
		}
		hist := make([]int64, 0)
		for i := 0; i < n; i++ {
			u := rng.Float64()
			// The sample is the largest k with S(k) > u.
			var k int
			if surv[table] > u {
				lo, hi := table, 2*table
				for hurwitzZeta(gamma, float64(hi))/z > u {
					lo, hi = hi, 2*hi
				}
				for hi-lo > 1 {
					mid := (lo + hi) / 2
					if hurwitzZeta(gamma, float64(mid))/z > u {
						lo = mid
					} else {
						hi = mid
					}
				}
				k = lo
			} else {
				lo, hi := kmin, table // surv[lo] > u ≥ surv[hi]
				for hi-lo > 1 {
					mid := (lo + hi) / 2
					if surv[mid] > u {
						lo = mid
					} else {
						hi = mid
					}
				}
				k = lo
			}
			for len(hist) <= k {
				hist = append(hist, 0)
			}
			hist[k]++
		}
		for _, km := range []int{kmin, 0} {
			p, err := powerLawFromHist(hist, PowerLawOptions{KMin: km})
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(p.Gamma-gamma) > 4*p.StdErr {
				t.Errorf("γ = %g, kmin option %d: got %.4f ± %.4f (k_min %d)", gamma, km, p.Gamma, p.StdErr, p.KMin)
			}
		}
	}
}
