package ordinal

import (
	"fmt"
	"testing"
)

func BenchmarkComplexity(b *testing.B) {
	for _, n := range []int{10000, 100000} {
		x := white(n, newRNG(1))
		for _, d := range []int{5, 7} {
			b.Run(fmt.Sprintf("n=%d/d=%d", n, d), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					dist, err := Patterns(x, Options{Order: d})
					if err != nil {
						b.Fatal(err)
					}
					_ = dist.Entropy()
					_ = dist.Complexity()
					_ = dist.Missing()
				}
			})
		}
	}
}
