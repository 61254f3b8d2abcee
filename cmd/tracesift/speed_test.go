package main

import (
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/generators"
)

// BenchmarkClassify10k is the cost of classifying one 10^4-sample trace
// from scratch: loading the embedded model, the feature vector and the
// forest's vote.
func BenchmarkClassify10k(b *testing.B) {
	s, _ := generators.Lookup("henon")
	x, _ := s.Generate(10000, nil, rand.New(rand.NewPCG(1, 2)))
	for b.Loop() {
		m, err := loadModel("")
		if err != nil {
			b.Fatal(err)
		}
		if _, err := classifier.Screen(m, x, classifier.ScreenOptions{Features: features.Options{Sequential: true}}); err != nil {
			b.Fatal(err)
		}
	}
}
