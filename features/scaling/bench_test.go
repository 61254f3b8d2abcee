package scaling

import (
	"fmt"
	"testing"
)

func benchSizes(b *testing.B, f func(x []float64) error) {
	for _, n := range []int{10000, 100000} {
		x := cumsum(white(n, newRNG(1)))
		for i := range x {
			x[i] = 0.1*x[i] + float64(i%7) // mixed series, no special structure
		}
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if err := f(x); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkDFA1(b *testing.B) {
	benchSizes(b, func(x []float64) error { _, err := DFA(x, DFAOptions{}); return err })
}

func BenchmarkDFA2(b *testing.B) {
	benchSizes(b, func(x []float64) error { _, err := DFA(x, DFAOptions{Order: 2}); return err })
}

func BenchmarkRescaledRange(b *testing.B) {
	benchSizes(b, func(x []float64) error { _, err := RescaledRange(x, RSOptions{}); return err })
}

func BenchmarkSpectralSlope(b *testing.B) {
	benchSizes(b, func(x []float64) error { _, err := SpectralSlope(x, SlopeOptions{}); return err })
}

func BenchmarkACF(b *testing.B) {
	benchSizes(b, func(x []float64) error { _, err := ACF(x, ACFOptions{}); return err })
}

func BenchmarkDecayTime(b *testing.B) {
	benchSizes(b, func(x []float64) error { _, err := DecayTime(x, DecayOptions{}); return err })
}

func BenchmarkLines(b *testing.B) {
	benchSizes(b, func(x []float64) error { _, err := Lines(x, LinesOptions{}); return err })
}
