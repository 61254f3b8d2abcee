package generators

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// TestLevyWalkIncrements: the differences of the walk are i.i.d. with the
// step law. Kolmogorov–Smirnov at the 0.1% level on 10^5 increments
// against the Cauchy CDF ½ + arctan(x)/π (α = 1, β = 0: standard result)
// and gonum's Student-t CDF (ν = 1.5 and ν = 4); the first sample is the
// first step (x_{−1} = 0).
func TestLevyWalkIncrements(t *testing.T) {
	const n = 100001
	tests := []struct {
		name string
		walk LevyWalk
		cdf  func(float64) float64
	}{
		{"cauchy steps", LevyWalk{Alpha: 1}, func(x float64) float64 { return 0.5 + math.Atan(x)/math.Pi }},
		{"t(1.5) steps", LevyWalk{Nu: 1.5}, distuv.StudentsT{Mu: 0, Sigma: 1, Nu: 1.5}.CDF},
		{"t(4) steps", LevyWalk{Nu: 4}, distuv.StudentsT{Mu: 0, Sigma: 1, Nu: 4}.CDF},
	}
	for i, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			x, err := tc.walk.Generate(n, newRand(uint64(340+i)))
			if err != nil {
				t.Fatal(err)
			}
			inc := make([]float64, n)
			inc[0] = x[0]
			for k := 1; k < n; k++ {
				inc[k] = x[k] - x[k-1]
			}
			d := ksDistance(inc, tc.cdf)
			t.Logf("%s: KS D = %.5f (0.1%% critical %.5f)", tc.name, d, ksCritical(n))
			if d > ksCritical(n) {
				t.Errorf("KS D = %.5f > %.5f", d, ksCritical(n))
			}
		})
	}
}

// TestLevyWalkSelfSimilar: for symmetric (β = 0) stable steps the walk is
// self-similar, x_{m−1} = m^{1/α} X in law with X one step (stability
// under addition; Samorodnitsky & Taqqu (1994) (memory)), so the end
// points of R = 20000 walks of m = 16 steps scaled by m^{−1/α} have the
// characteristic function exp(−|t|^α). Checked at α ∈ {0.9, 1.3, 1.8} and
// t ∈ {0.5, 1, 2}; the empirical mean of cos(t·X) has standard error
// ≤ √(½/R) = 0.005; tolerance five standard errors (sample-based).
func TestLevyWalkSelfSimilar(t *testing.T) {
	const reps, m = 20000, 16
	for _, alpha := range []float64{0.9, 1.3, 1.8} {
		rng := newRand(uint64(350 + 10*alpha))
		ends := make([]float64, reps)
		for r := range ends {
			x, err := LevyWalk{Alpha: alpha}.Generate(m, rng)
			if err != nil {
				t.Fatal(err)
			}
			ends[r] = x[m-1] / math.Pow(m, 1/alpha)
		}
		for _, tt := range []float64{0.5, 1, 2} {
			got := meanOf(ends, func(v float64) float64 { return math.Cos(tt * v) })
			se := math.Sqrt((meanOf(ends, func(v float64) float64 { return math.Cos(tt*v) * math.Cos(tt*v) }) - got*got) / reps)
			want := math.Exp(-math.Pow(tt, alpha))
			t.Logf("α = %g, t = %g: E cos(tX) = %.4f, exp(-|t|^α) = %.4f, SE %.4f", alpha, tt, got, want, se)
			if math.Abs(got-want) > 5*se {
				t.Errorf("α = %g, t = %g: %.4f, want %.4f ± %.4f", alpha, tt, got, want, 5*se)
			}
		}
	}
	if _, err := (LevyWalk{Alpha: 3}).Generate(10, newRand(1)); err == nil {
		t.Error("alpha = 3 accepted")
	}
	if _, err := (LevyWalk{Alpha: 1.5, Nu: -1}).Generate(10, newRand(1)); err == nil {
		t.Error("nu = -1 accepted")
	}
}
