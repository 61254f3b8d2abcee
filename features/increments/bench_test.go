package increments

import (
	"fmt"
	"testing"
)

func BenchmarkAnalyze(b *testing.B) {
	for _, n := range []int{10000, 100000} {
		x := studentWalk(b, n, newRNG(1))
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Analyze(x, Options{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkHistogram(b *testing.B) {
	for _, n := range []int{10000, 100000} {
		z, err := Normalized(studentWalk(b, n, newRNG(1)), Options{})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Histogram(z, HistogramOptions{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
