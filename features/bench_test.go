package features

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// BenchmarkExtract measures the whole feature vector (all five families,
// families in parallel as Extract runs them by default).
func BenchmarkExtract(b *testing.B) {
	for _, sys := range []string{"white", "lorenz"} {
		s, _ := generators.Lookup(sys)
		for _, n := range []int{1000, 10000, 100000} {
			x, err := s.Generate(n, nil, rand.New(rand.NewPCG(1, 2)))
			if err != nil {
				b.Fatal(err)
			}
			b.Run(fmt.Sprintf("%s/n=%d", sys, n), func(b *testing.B) {
				for b.Loop() {
					if _, err := Extract(x, Options{}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkExtractSequential is BenchmarkExtract on one goroutine: the cost
// on one core. White noise and AR(1) embed in the largest dimension the
// nonlinear family tries (8), where neighbour searches cost most; Lorenz
// embeds in 3.
func BenchmarkExtractSequential(b *testing.B) {
	for _, sys := range []string{"white", "ar1", "lorenz"} {
		s, _ := generators.Lookup(sys)
		for _, n := range []int{10000, 100000} {
			x, _ := s.Generate(n, nil, rand.New(rand.NewPCG(1, 2)))
			b.Run(fmt.Sprintf("%s/n=%d", sys, n), func(b *testing.B) {
				for b.Loop() {
					if _, err := Extract(x, Options{Sequential: true}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
