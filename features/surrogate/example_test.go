package surrogate_test

import (
	"fmt"
	"math/rand/v2"

	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/generators"
)

// Test the Hénon map for time-reversal asymmetry against 99 IAAFT
// surrogates: the observed value lies below every surrogate, so the
// two-sided p is 2/(99+1).
func ExampleTest() {
	x, _ := generators.Henon{A: 1.4, B: 0.3}.Generate(2000, rand.New(rand.NewPCG(1, 2)))
	rep, err := surrogate.Test(x, []surrogate.Statistic{surrogate.TimeAsymmetryStat},
		surrogate.TestOptions{Options: surrogate.Options{Method: surrogate.IAAFT, Count: 99, Seed: 7}})
	if err != nil {
		fmt.Println(err)
		return
	}
	r := rep.Tests[0]
	fmt.Printf("%s: p = %.2f (upper %.2f, lower %.2f), M = %d\n", r.Stat, r.P, r.PUpper, r.PLower, r.Count)
	// Output:
	// time_asymmetry: p = 0.02 (upper 1.00, lower 0.01), M = 99
}

// The rank p-values of an observed value above all 19 surrogates.
func ExampleRankP() {
	vals := make([]float64, 19)
	for i := range vals {
		vals[i] = float64(i)
	}
	up, low, two := surrogate.RankP(25, vals)
	fmt.Printf("upper %.2f lower %.2f two-sided %.2f\n", up, low, two)
	// Output:
	// upper 0.05 lower 1.00 two-sided 0.10
}

// The least numbers of surrogates for α = 0.05.
func ExampleMinSurrogates() {
	one, _ := surrogate.MinSurrogates(0.05, surrogate.Upper)
	two, _ := surrogate.MinSurrogates(0.05, surrogate.TwoSided)
	fmt.Println(one, two)
	// Output:
	// 19 39
}

// Holm's adjustment of four p-values (Holm 1979).
func ExampleHolm() {
	fmt.Println(surrogate.Holm([]float64{0.01, 0.04, 0.03, 0.005}))
	// Output:
	// [0.03 0.06 0.06 0.02]
}

// Generate FT surrogates of an end-matched series.
func ExampleGenerate() {
	x, _ := generators.AR1{Phi: 0.9}.Generate(1000, rand.New(rand.NewPCG(3, 4)))
	set, err := surrogate.Generate(x, surrogate.Options{Method: surrogate.FT, Count: 4, Seed: 1, EndMatch: true})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(len(set.Surrogates), len(set.Surrogates[0]) == set.Truncation.Len, set.Truncation.Len >= 900)
	// Output:
	// 4 true true
}
