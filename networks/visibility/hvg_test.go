package visibility

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	"github.com/tracesift/tracesift/networks"

	"github.com/tracesift/tracesift/generators"
)

// TestHVGIID checks the exact results for the HVG of any continuous i.i.d.
// series (Luque et al., Phys. Rev. E 80 (2009) 046103) on four laws,
// including heavy-tailed ones: the HVG depends on ranks only.
func TestHVGIID(t *testing.T) {
	const n = 200_000
	ln32 := math.Log(1.5)
	for li, law := range []string{"uniform", "gauss", "student3", "pareto"} {
		t.Run(law, func(t *testing.T) {
			rng := rand.New(rand.NewPCG(100+uint64(li), 1))
			x := testseries.IID(law, n, rng)
			g, err := Horizontal(x, Options{})
			if err != nil {
				t.Fatal(err)
			}
			ds := networks.Degrees(g)
			pk := make(map[int]float64)
			for _, d := range ds.Distribution {
				pk[d.K] = d.P
			}
			// P(k) = (1/3)(2/3)^{k−2} (Luque et al. 2009). Tolerance 5
			// binomial standard errors √(p(1−p)/n) (≈0.005 at k = 2): nearby
			// degrees are weakly dependent, which changes the variance by a
			// factor of order one only.
			for k := 2; k <= 8; k++ {
				p := math.Pow(2.0/3, float64(k-2)) / 3
				se := math.Sqrt(p * (1 - p) / n)
				if d := pk[k] - p; math.Abs(d) > 5*se {
					t.Errorf("P(%d) = %.5f, want %.5f ± %.5f (5 SE)", k, pk[k], p, 5*se)
				}
			}
			// ⟨k⟩ = 4 − 4H_n/n exactly in expectation (derived: the gap-g
			// pair is linked iff its ends are the top two of g+1 values,
			// probability 2/(g(g+1)); summing (n−g)·2/(g(g+1)) gives
			// E = 2n − 2H_n). The sd of ⟨k⟩ over replicates is ≈ 0.08/√n
			// (measured in TestHVGMeanDegreeReplicates); tolerance 0.5/√n.
			want := 4 - 4*harmonic(n)/n
			if d := ds.Mean - want; math.Abs(d) > 0.5/math.Sqrt(n) {
				t.Errorf("mean degree %.5f, want %.5f", ds.Mean, want)
			}
			// Local clustering C = 2/k exactly for every node that has a
			// higher sample on both sides (Luque et al. 2009; the node's
			// left and right visible chains plus one bridging edge).
			local, cs := networks.Clustering(g)
			hasHigherLeft := make([]bool, n)
			run := math.Inf(-1)
			for i := 0; i < n; i++ {
				hasHigherLeft[i] = run > x[i]
				run = math.Max(run, x[i])
			}
			run = math.Inf(-1)
			checked := 0
			for i := n - 1; i >= 0; i-- {
				if hasHigherLeft[i] && run > x[i] {
					k := float64(g.Degree(i))
					if math.Abs(local[i]-2/k) > 1e-15 {
						t.Fatalf("node %d: C = %v, want 2/k = %v", i, local[i], 2/k)
					}
					checked++
				}
				run = math.Max(run, x[i])
			}
			if checked < n-100 {
				t.Errorf("only %d interior nodes checked", checked)
			}
			// Mean clustering → Σ P(k)·2/k = (2/3)(9/4)(ln 3 − 2/3) = 0.64792
			// (derived, REFERENCES.md). Per-node sd ≈ 0.18, SE ≈ 4e-4 at
			// n = 2·10^5; tolerance 0.003 (≈7 SE, allowing for dependence).
			cWant := (2.0 / 3) * (9.0 / 4) * (math.Log(3) - 2.0/3)
			t.Logf("%s: <k> = %.5f (exact %.5f), C = %.5f (%.5f), P(2..4) = %.4f %.4f %.4f", law, ds.Mean, want, cs.Mean, cWant, pk[2], pk[3], pk[4])
			if math.Abs(cs.Mean-cWant) > 0.003 {
				t.Errorf("mean clustering %.5f, want %.5f", cs.Mean, cWant)
			}
			// λ = ln(3/2) (Luque et al. 2009): within 4 standard errors of
			// the geometric MLE, both with k_min chosen by KS and fixed at 3.
			for _, km := range []int{0, 3} {
				tf, err := networks.ExponentialTail(g, networks.TailOptions{KMin: km})
				if err != nil {
					t.Fatal(err)
				}
				t.Logf("%s kmin=%d: λ = %.4f ± %.4f (k_min %d)", law, km, tf.Lambda, tf.StdErr, tf.KMin)
				if math.Abs(tf.Lambda-ln32) > 4*tf.StdErr {
					t.Errorf("kmin %d: λ = %.4f ± %.4f, want ln(3/2) = %.4f (k_min %d)", km, tf.Lambda, tf.StdErr, ln32, tf.KMin)
				}
			}
		})
	}
}

// TestHVGMeanDegreeReplicates averages ⟨k⟩ over 40 independent series of
// 10^4 points: the mean must match the exact expectation 4 − 4H_n/n (derived
// above) within 4 standard errors of the replicate mean. This also measures
// the 1.3/√n spread used as the tolerance in TestHVGIID.
func TestHVGMeanDegreeReplicates(t *testing.T) {
	const n, reps = 10_000, 40
	rng := rand.New(rand.NewPCG(42, 43))
	var ks []float64
	for r := 0; r < reps; r++ {
		g, err := Horizontal(testseries.IID("gauss", n, rng), Options{})
		if err != nil {
			t.Fatal(err)
		}
		ks = append(ks, networks.Degrees(g).Mean)
	}
	m, sd := meanStd(ks)
	want := 4 - 4*harmonic(n)/n
	se := sd / math.Sqrt(reps)
	t.Logf("replicate mean %.5f ± %.5f (exact %.5f), sd·√n = %.2f", m, se, want, sd*math.Sqrt(n))
	if math.Abs(m-want) > 4*se {
		t.Errorf("replicate mean ⟨k⟩ = %.5f ± %.5f, want %.5f", m, se, want)
	}
	if sd*math.Sqrt(n) > 0.2 {
		t.Errorf("sd of ⟨k⟩ = %.2f/√n, expected ≈ 0.08/√n", sd*math.Sqrt(n))
	}
}

func harmonic(n int) float64 {
	h := 0.0
	for k := n; k >= 1; k-- {
		h += 1 / float64(k)
	}
	return h
}

// TestHVGPeriodic: the HVG of a period-T series without ties inside a period
// has mean degree 4(1 − 1/(2T)) (Núñez et al., visibility algorithms review
// (2012) (memory)). With n = 4000·T the boundary changes the edge count by
// O(T) edges, i.e. ⟨k⟩ by O(1/4000); tolerance 2·10^−3.
func TestHVGPeriodic(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for _, T := range []int{1, 2, 3, 5, 8, 13, 40} {
		pat := rng.Perm(T)
		n := 4000 * T
		x := make([]float64, n)
		for i := range x {
			x[i] = float64(pat[i%T]) + 0.5
		}
		g, err := Horizontal(x, Options{})
		if err != nil {
			t.Fatal(err)
		}
		got := networks.Degrees(g).Mean
		want := 4 * (1 - 1/(2*float64(T)))
		t.Logf("T = %d: <k> = %.5f, want %.5f", T, got, want)
		if math.Abs(got-want) > 2e-3 {
			t.Errorf("T = %d: mean degree %.5f, want %.5f", T, got, want)
		}
	}
}

// TestHVGLambdaOrdering: chaotic series give λ < ln(3/2) and correlated
// stochastic series λ > ln(3/2) (Luque et al. 2009; Lacasa & Toral, Phys.
// Rev. E 82 (2010) 036120). Margins of 4 standard errors of the MLE.
// Measured at n = 2^17: logistic 0.270, Hénon 0.361, AR(1) φ = 0.9 0.708.
func TestHVGLambdaOrdering(t *testing.T) {
	const n = 1 << 17
	ln32 := math.Log(1.5)
	rng := rand.New(rand.NewPCG(21, 22))
	cases := []struct {
		name  string
		gen   generators.Generator
		below bool
	}{
		{"logistic r=4", generators.Logistic{R: 4}, true},
		{"henon", generators.Henon{A: 1.4, B: 0.3}, true},
		{"ar1 phi=0.9", generators.AR1{Phi: 0.9}, false},
	}
	for _, c := range cases {
		x, err := c.gen.Generate(n, rng)
		if err != nil {
			t.Fatal(err)
		}
		g, err := Horizontal(x, Options{})
		if err != nil {
			t.Fatal(err)
		}
		tf, err := networks.ExponentialTail(g, networks.TailOptions{})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("%s: λ = %.4f ± %.4f, k_min %d, LS %.4f, R² %.4f", c.name, tf.Lambda, tf.StdErr, tf.KMin, tf.LambdaLS, tf.R2)
		if c.below && !(tf.Lambda+4*tf.StdErr < ln32) {
			t.Errorf("%s: λ = %.4f ± %.4f, want below ln(3/2) = %.4f", c.name, tf.Lambda, tf.StdErr, ln32)
		}
		if !c.below && !(tf.Lambda-4*tf.StdErr > ln32) {
			t.Errorf("%s: λ = %.4f ± %.4f, want above ln(3/2) = %.4f", c.name, tf.Lambda, tf.StdErr, ln32)
		}
		if tf.R2 < 0.95 {
			t.Errorf("%s: tail fit R² = %.3f over k = %d..%d", c.name, tf.R2, tf.KMin, tf.KMaxLS)
		}
	}
}

// TestIrreversibility: the in/out-degree KLD of the directed HVG is ≈ 0 for
// a reversible linear Gaussian process and clearly positive for dissipative
// chaos (Lacasa et al., Eur. Phys. J. B 85 (2012) 217). For a reversible
// series the plug-in KLD has a positive bias ≈ (B − 1)/(2n) for B bins
// (≈5·10^−5 here; measured 4·10^−5); the bound 10·(B − 1)/(2n) leaves room
// for its fluctuation. The Hénon value (measured 0.18) is 3 orders above.
func TestIrreversibility(t *testing.T) {
	const n = 1 << 17
	rng := rand.New(rand.NewPCG(31, 32))
	ar, _ := generators.AR1{Phi: 0.5}.Generate(n, rng)
	he, _ := generators.Henon{A: 1.4, B: 0.3}.Generate(n, rng)
	ga, _ := Horizontal(ar, Options{})
	gh, _ := Horizontal(he, Options{})
	ra, err := networks.Irreversibility(ga)
	if err != nil {
		t.Fatal(err)
	}
	rh, err := networks.Irreversibility(gh)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("KLD: AR(1) %.2e (%d bins), Hénon %.4f (%d bins)", ra.KLD, ra.Bins, rh.KLD, rh.Bins)
	if bias := float64(ra.Bins-1) / (2 * n); math.Abs(ra.KLD) > 10*bias {
		t.Errorf("AR(1): KLD = %.2e over %d bins, want |KLD| < %.2e", ra.KLD, ra.Bins, 10*bias)
	}
	if rh.KLD < 0.1 {
		t.Errorf("Hénon: KLD = %.4f, want clearly positive (> 0.1)", rh.KLD)
	}
	// The directed degrees are a split of the undirected ones.
	for i := 0; i < 1000; i++ {
		if gh.InDegree(i)+gh.OutDegree(i) != gh.Degree(i) {
			t.Fatalf("node %d: in %d + out %d != degree %d", i, gh.InDegree(i), gh.OutDegree(i), gh.Degree(i))
		}
	}
	// For i.i.d. data P_out(k) = P_in(k) = 2^{−k} (Lacasa et al. 2012 (memory)).
	gi, _ := Horizontal(testseries.IID("gauss", n, rng), Options{})
	out := make([]float64, 8)
	for i := 0; i < n; i++ {
		if k := gi.OutDegree(i); k < len(out) {
			out[k]++
		}
	}
	for k := 1; k <= 5; k++ {
		p := math.Pow(2, -float64(k))
		if se := math.Sqrt(p * (1 - p) / n); math.Abs(out[k]/n-p) > 5*se {
			t.Errorf("i.i.d. P_out(%d) = %.4f, want %.4f", k, out[k]/n, p)
		}
	}
}

// TestScaleInvariance: the graphs, hence every metric, are unchanged by
// a·x + b with a > 0 (amperes vs microamperes). Checked bit for bit on
// continuous data (DESIGN.md quality bar). Negation is not a symmetry
// (peaks become valleys), so it is not tested as one.
func TestScaleInvariance(t *testing.T) {
	rng := rand.New(rand.NewPCG(51, 52))
	x := testseries.IID("gauss", 5000, rng)
	base := map[networks.Kind]string{}
	for _, tr := range []struct{ a, b float64 }{{1, 0}, {1e-6, 0}, {1e6, -5}, {1024, 3}} {
		y := make([]float64, len(x))
		for i, v := range x {
			y[i] = tr.a*v + tr.b
		}
		for _, kind := range []networks.Kind{networks.KindNVG, networks.KindHVG} {
			g, err := Build(y, kind, Options{})
			if err != nil {
				t.Fatal(err)
			}
			m, err := networks.Measure(g, networks.MeasureOptions{Seed: 1})
			if err != nil {
				t.Fatal(err)
			}
			js, err := m.MarshalJSON()
			if err != nil {
				t.Fatal(err)
			}
			if tr.a == 1 && tr.b == 0 {
				base[kind] = string(js)
				continue
			}
			if string(js) != base[kind] {
				t.Errorf("a=%g b=%g %v: metrics differ from the unscaled series", tr.a, tr.b, kind)
			}
		}
	}
}
