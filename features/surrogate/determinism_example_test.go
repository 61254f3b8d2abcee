package surrogate_test

import (
	"fmt"
	"math/rand/v2"

	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/generators"
)

// Test the Hénon map for determinism against 39 IAAFT surrogates: both
// statistics exceed every surrogate (p = 1/40), so the smallest
// Holm-adjusted p is 2/40 and the null is rejected at α = 0.05.
func ExampleDeterminism() {
	x, _ := generators.Henon{A: 1.4, B: 0.3}.Generate(2000, rand.New(rand.NewPCG(1, 2)))
	r, err := surrogate.Determinism(x, surrogate.DeterminismOptions{Seed: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range r.Stats {
		fmt.Printf("%s: p = %.3f, Holm %.3f\n", s.Name, s.P, s.PHolm)
	}
	fmt.Printf("M = %d, rejected: %v\n", r.Count, r.Rejected)
	fmt.Println(r.Agreement("chaotic").Kind)
	// Output:
	// nl_fc_rho_tau: p = 0.025, Holm 0.050
	// nl_trev_tau: p = 0.025, Holm 0.050
	// M = 39, rejected: true
	// agree
}
