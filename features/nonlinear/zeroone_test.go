package nonlinear

import (
	"math"
	"math/rand/v2"
	"testing"
)

// 0–1 test (Gottwald & Melbourne, Proc. R. Soc. A 460 (2004) 603; SIAM J.
// Appl. Dyn. Syst. 8 (2009) 129): K ≈ 1 for chaos, ≈ 0 for regular motion,
// and ≈ 1 for noise as well.
func TestZeroOne(t *testing.T) {
	cases := []struct {
		name   string
		x      []float64
		lo, hi float64
	}{
		{"logistic r=4 (chaotic)", series(t, logistic4, 5000, 1), 0.9, 1.01},
		{"logistic r=3.5 (period 4)", series(t, logistic35, 5000, 1), -1, 0.1},
		{"white noise", series(t, white, 5000, 1), 0.9, 1.01},
	}
	for _, c := range cases {
		res, err := ZeroOne(c.x, ZeroOneOptions{})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("%s: K = %.4f (10–90%%: %.3f–%.3f)", c.name, res.K, res.KLow, res.KHigh)
		if res.K < c.lo || res.K > c.hi {
			t.Errorf("%s: K = %.4f, want in [%g, %g]", c.name, res.K, c.lo, c.hi)
		}
	}
}

// Oversampling caveat (Gottwald & Melbourne 2009): the Lorenz flow sampled
// every 0.01 time units looks regular to the test (K ≈ 0); decimating to
// about one sample per AMI delay (0.18 time units) restores K near 1.
func TestZeroOneOversampledFlow(t *testing.T) {
	x := series(t, lorenz, 60000, 1)
	fine, err := ZeroOne(x, ZeroOneOptions{})
	if err != nil {
		t.Fatal(err)
	}
	coarse, err := ZeroOne(x, ZeroOneOptions{Decimate: 18})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("lorenz dt=0.01: K = %.3f; decimated ×18: K = %.3f (N = %d)", fine.K, coarse.K, coarse.N)
	if fine.K > 0.5 || coarse.K < 0.8 {
		t.Errorf("K fine %.3f (want < 0.5), decimated %.3f (want > 0.8)", fine.K, coarse.K)
	}
}

// The FFT route to M_c(n) must equal the direct definition (reference: the
// O(N·n_cut) double sum).
func TestZeroOneDisplacementMatchesDirect(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	N, ncut := 300, 30
	phiS := make([]float64, N)
	for i := range phiS {
		phiS[i] = rng.NormFloat64()
	}
	w := newMSDWork(N, ncut)
	for _, c := range []float64{0.7, 1.3, 2.2} {
		got := w.displacement(phiS, c)
		p, q := make([]float64, N), make([]float64, N)
		var sp, sq float64
		for j := 0; j < N; j++ {
			sp += phiS[j] * math.Cos(float64(j+1)*c)
			sq += phiS[j] * math.Sin(float64(j+1)*c)
			p[j], q[j] = sp, sq
		}
		for n := 1; n <= ncut; n++ {
			var s float64
			for j := 0; j+n < N; j++ {
				s += (p[j+n]-p[j])*(p[j+n]-p[j]) + (q[j+n]-q[j])*(q[j+n]-q[j])
			}
			want := s / float64(N-n)
			if math.Abs(got[n-1]-want) > 1e-9*want {
				t.Fatalf("c=%g n=%d: FFT %.12g, direct %.12g", c, n, got[n-1], want)
			}
		}
	}
}

// Same seed ⇒ bit-identical K; the seed only moves the frequencies c.
func TestZeroOneDeterministic(t *testing.T) {
	x := series(t, henon, 3000, 1)
	a, _ := ZeroOne(x, ZeroOneOptions{Seed: 42})
	b, _ := ZeroOne(x, ZeroOneOptions{Seed: 42})
	c, _ := ZeroOne(x, ZeroOneOptions{Seed: 43})
	if a.K != b.K || a.C[0] != b.C[0] {
		t.Errorf("same seed: K %v vs %v", a.K, b.K)
	}
	if a.C[0] == c.C[0] {
		t.Errorf("different seeds drew the same c")
	}
}
