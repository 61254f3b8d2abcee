package generators

import (
	"math"
	"testing"
)

// regimeRuns returns the lengths of the complete runs of regime r in s
// (the first and last runs are cut by the record and dropped).
func regimeRuns(s []uint8, r uint8) []float64 {
	var runs []float64
	for i := 0; i < len(s); {
		j := i
		for j < len(s) && s[j] == s[i] {
			j++
		}
		if i > 0 && j < len(s) && s[i] == r {
			runs = append(runs, float64(j-i))
		}
		i = j
	}
	return runs
}

// TestRegimeARDwell: in Hamilton's Markov-switching model (Econometrica
// 57 (1989) 357) the dwell time in regime i is geometric,
// P(D > k) = q_i^k with q_i = 1 − 1/dwell_i, mean dwell_i (analytic for a
// two-state Markov chain). Over n = 4·10^5 samples with dwell = (40, 15)
// (≈ 7000 runs each) the mean run length is checked within four standard
// errors √(q)/(1 − q)/√runs (geometric variance q/(1 − q)²), and the
// empirical survival at k = dwell/2, dwell and 2·dwell within four
// binomial standard errors. The AR(1) recursion inside each regime is
// checked by least squares of x_t − μ on x_{t−1} − μ over consecutive
// samples in the same regime: slope φ_i within five standard errors
// √((1 − φ²)/N) (standard regression result).
func TestRegimeARDwell(t *testing.T) {
	const n = 400000
	g := RegimeAR{Mu: [2]float64{0, 4}, Phi: [2]float64{0.3, -0.6}, Sigma: [2]float64{1, 2}, Dwell: [2]float64{40, 15}}
	x, s, err := g.Path(n, newRand(400))
	if err != nil {
		t.Fatal(err)
	}
	for r := uint8(0); r < 2; r++ {
		runs := regimeRuns(s, r)
		q := 1 - 1/g.Dwell[r]
		m, _ := meanSE(runs)
		se := math.Sqrt(q) / (1 - q) / math.Sqrt(float64(len(runs)))
		t.Logf("regime %d: %d runs, mean dwell %.3f (geometric mean %g ± %.3f)", r, len(runs), m, g.Dwell[r], se)
		if math.Abs(m-g.Dwell[r]) > 4*se {
			t.Errorf("regime %d: mean dwell %.3f, want %g ± %.3f", r, m, g.Dwell[r], 4*se)
		}
		for _, k := range []float64{g.Dwell[r] / 2, g.Dwell[r], 2 * g.Dwell[r]} {
			var above float64
			for _, d := range runs {
				if d > k {
					above++
				}
			}
			got := above / float64(len(runs))
			want := math.Pow(q, math.Floor(k))
			se := math.Sqrt(want * (1 - want) / float64(len(runs)))
			if math.Abs(got-want) > 4*se {
				t.Errorf("regime %d: P(D > %g) = %.4f, want %.4f ± %.4f", r, k, got, want, 4*se)
			}
		}
		var sxy, sxx, cnt float64
		for i := 1; i < n; i++ {
			if s[i] == r && s[i-1] == r {
				y0, y1 := x[i-1]-g.Mu[r], x[i]-g.Mu[r]
				sxy += y0 * y1
				sxx += y0 * y0
				cnt++
			}
		}
		slope := sxy / sxx
		se = math.Sqrt((1 - g.Phi[r]*g.Phi[r]) / cnt)
		t.Logf("regime %d: within-regime AR slope %.4f (φ = %g ± %.4f)", r, slope, g.Phi[r], se)
		if math.Abs(slope-g.Phi[r]) > 5*se {
			t.Errorf("regime %d: slope %.4f, want %g", r, slope, g.Phi[r])
		}
	}
}

// TestBursts: the fraction of time in the burst regime is
// dwell_b/(dwell_q + dwell_b) (stationary law of the two-state chain,
// analytic), estimated over R = 20 independent series of n = 20000 with
// the replicate spread as standard error (four of them); for white
// bursts (φ = 0) the variance of the burst samples is ratio² and of the
// quiet samples 1, within 3% (relative standard error of a Gaussian
// variance √(2/N) ≤ 0.5% here). With φ = 0.8 the lag-one autocorrelation
// of the quiet samples is φ within 0.02 (four standard errors for ≈ 3·10^5
// pairs).
func TestBursts(t *testing.T) {
	const n, reps = 20000, 20
	for _, phi := range []float64{0, 0.8} {
		g := Bursts(6, 150, 30, phi)
		rng := newRand(uint64(410 + 10*phi))
		var frac []float64
		var vb, vq, nb, nq, c01, c00 float64
		for r := 0; r < reps; r++ {
			x, s, err := g.Path(n, rng)
			if err != nil {
				t.Fatal(err)
			}
			var b float64
			for i, v := range x {
				if s[i] == 1 {
					b++
					vb += v * v
					nb++
				} else {
					vq += v * v
					nq++
					if i > 0 && s[i-1] == 0 {
						c01 += x[i-1] * v
						c00 += x[i-1] * x[i-1]
					}
				}
			}
			frac = append(frac, b/n)
		}
		m, se := meanSE(frac)
		want := 30.0 / 180
		t.Logf("φ = %g: burst fraction %.4f ± %.4f (want %.4f); burst variance %.3f, quiet %.4f, quiet lag-1 slope %.4f", phi, m, se, want, vb/nb, vq/nq, c01/c00)
		if math.Abs(m-want) > 4*se {
			t.Errorf("φ = %g: burst fraction %.4f, want %.4f ± %.4f", phi, m, want, 4*se)
		}
		if phi == 0 && (math.Abs(vb/nb/36-1) > 0.03 || math.Abs(vq/nq-1) > 0.03) {
			t.Errorf("burst variance %.3f (want 36), quiet %.4f (want 1)", vb/nb, vq/nq)
		}
		if phi == 0.8 && math.Abs(c01/c00-phi) > 0.02 {
			t.Errorf("quiet lag-1 slope %.4f, want %g", c01/c00, phi)
		}
	}
	if _, err := (RegimeAR{Phi: [2]float64{1, 0}, Sigma: [2]float64{1, 1}, Dwell: [2]float64{5, 5}}).Generate(10, newRand(1)); err == nil {
		t.Error("phi = 1 accepted")
	}
	if _, err := (RegimeAR{Sigma: [2]float64{1, 1}, Dwell: [2]float64{0.5, 5}}).Generate(10, newRand(1)); err == nil {
		t.Error("dwell < 1 accepted")
	}
}
