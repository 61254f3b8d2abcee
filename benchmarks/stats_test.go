package benchmarks

import (
	"encoding/json"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/stat"
)

// TestSpreadMatchesGonum checks the quartiles against gonum's
// stat.Quantile with linear interpolation between order statistics, the
// convention spreadOf documents (reference library on the same input).
func TestSpreadMatchesGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1, 2, 3, 7, 10, 101} {
		x := make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64()
		}
		s := spreadOf(append(slices.Clone(x), math.NaN()))
		sorted := slices.Clone(x)
		slices.Sort(sorted)
		// Ours places quantile p at position h = p·(n−1) between order
		// statistics (Hyndman & Fan type 7); the two order statistics
		// around h are taken from gonum's Empirical quantile (x_(j) is
		// its quantile at j/n), and the median is checked against it
		// directly for odd n.
		for _, q := range []struct {
			p   float64
			got Float
		}{{0.25, s.Q1}, {0.5, s.Median}, {0.75, s.Q3}} {
			h := q.p * float64(n-1)
			lo := stat.Quantile(math.Floor(h)/float64(n)+1e-12, stat.Empirical, sorted, nil)
			hi := stat.Quantile(math.Min(1, (math.Floor(h)+1)/float64(n)+1e-12), stat.Empirical, sorted, nil)
			if n == 1 {
				lo, hi = sorted[0], sorted[0]
			}
			want := lo + (h-math.Floor(h))*(hi-lo)
			if math.Abs(float64(q.got)-want) > 1e-12 {
				t.Errorf("n=%d p=%.2f: %v, want %v", n, q.p, q.got, want)
			}
		}
		if n%2 == 1 {
			if m := stat.Quantile(0.5, stat.Empirical, sorted, nil); float64(s.Median) != m {
				t.Errorf("n=%d: median %v, gonum %v", n, s.Median, m)
			}
		}
		if s.N != n || s.Missing != 1 || float64(s.Min) != sorted[0] || float64(s.Max) != sorted[n-1] {
			t.Errorf("n=%d: %+v", n, s)
		}
	}
	empty := spreadOf([]float64{math.NaN(), math.NaN()})
	if !math.IsNaN(float64(empty.Median)) || empty.Missing != 2 {
		t.Errorf("all missing: %+v", empty)
	}
}

// TestLogLogFit: an exact power law t = 3·n^1.5 gives p = 1.5, r² = 1
// (analytic).
func TestLogLogFit(t *testing.T) {
	ns := []float64{1e3, 1e4, 1e5, 1e6}
	ts := make([]float64, len(ns))
	for i, n := range ns {
		ts[i] = 3 * math.Pow(n, 1.5)
	}
	p, r2 := logLogFit(ns, ts)
	if math.Abs(p-1.5) > 1e-12 || math.Abs(r2-1) > 1e-12 {
		t.Errorf("p = %v, r² = %v, want 1.5, 1", p, r2)
	}
	if p, _ := logLogFit(ns[:1], ts[:1]); !math.IsNaN(p) {
		t.Errorf("one point: p = %v, want NaN", p)
	}
}

func TestFloatJSON(t *testing.T) {
	b, err := json.Marshal([]Float{1.5, Float(math.NaN()), Float(math.Inf(1)), -0.25})
	if err != nil {
		t.Fatal(err)
	}
	if string(b) != "[1.5,null,null,-0.25]" {
		t.Errorf("got %s", b)
	}
	var back []Float
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if back[0] != 1.5 || !math.IsNaN(float64(back[1])) || back[3] != -0.25 {
		t.Errorf("read back %v", back)
	}
}

// TestTallyScore checks the scores on a hand-made confusion matrix
// (classes chaotic, regular, stochastic).
func TestTallyScore(t *testing.T) {
	tl := newTally(3)
	add := func(truth, top, n int, undet bool) {
		for i := 0; i < n; i++ {
			tl.add(truth, top, undet)
		}
	}
	add(0, 0, 8, false) // chaotic right
	add(0, 2, 2, false) // chaotic taken for stochastic
	add(1, 1, 5, false) // regular right
	add(1, 0, 1, true)  // regular taken for chaotic, undetermined
	add(2, 2, 9, false) // stochastic right
	add(2, 0, 1, false) // stochastic taken for chaotic
	s := tl.score()
	if s.Series != 26 || s.Correct != 22 || float64(s.Accuracy) != 22.0/26 {
		t.Errorf("series %d correct %d accuracy %v", s.Series, s.Correct, s.Accuracy)
	}
	// 20 chaotic or stochastic series, 3 confused between the two.
	if s.ChaosNoiseSeries != 20 || float64(s.ChaosNoise) != 17.0/20 {
		t.Errorf("chaos–noise %v of %d, want 17/20", s.ChaosNoise, s.ChaosNoiseSeries)
	}
	if s.Undetermined != 1 || float64(s.DeterminedAccuracy) != 22.0/25 {
		t.Errorf("undetermined %d, determined accuracy %v", s.Undetermined, s.DeterminedAccuracy)
	}
	if float64(s.Recall[0]) != 0.8 || float64(s.Precision[0]) != 0.8 {
		t.Errorf("chaotic recall %v precision %v, want 0.8, 0.8", s.Recall[0], s.Precision[0])
	}
}

func TestSeedForDistinct(t *testing.T) {
	seen := map[uint64]bool{}
	for a := uint64(0); a < 20; a++ {
		for b := uint64(0); b < 20; b++ {
			s := seedFor(1, a, b)
			if seen[s] {
				t.Fatalf("seed collision at %d,%d", a, b)
			}
			seen[s] = true
		}
	}
	if seedFor(1, 2, 3) != seedFor(1, 2, 3) || seedFor(1, 2, 3) == seedFor(2, 2, 3) {
		t.Error("seedFor is not a function of its inputs")
	}
}
