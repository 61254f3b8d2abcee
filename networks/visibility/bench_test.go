package visibility

import (
	"fmt"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"
)

var benchSizes = []int{1_000, 10_000, 100_000, 1_000_000}

func BenchmarkNatural(b *testing.B) {
	for _, kind := range []string{"gauss", "brown", "trend"} {
		for _, n := range benchSizes {
			x := testseries.Bench(kind, n)
			b.Run(fmt.Sprintf("%s/n=%d", kind, n), func(b *testing.B) {
				b.ReportAllocs()
				var e int64
				for b.Loop() {
					g, err := Natural(x, Options{})
					if err != nil {
						b.Fatal(err)
					}
					e = g.Edges()
				}
				b.ReportMetric(float64(e)/float64(n), "edges/node")
			})
		}
	}
}

func BenchmarkHorizontal(b *testing.B) {
	for _, kind := range []string{"gauss", "brown"} {
		for _, n := range append(benchSizes, 10_000_000) {
			x := testseries.Bench(kind, n)
			b.Run(fmt.Sprintf("%s/n=%d", kind, n), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := Horizontal(x, Options{}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkNaturalNaive is the O(n³)-with-early-exit definition, for the
// speed-up of the divide-and-conquer builder at n = 2·10^4.
func BenchmarkNaturalNaive(b *testing.B) {
	for _, n := range []int{1_000, 20_000} {
		x := testseries.Bench("gauss", n)
		b.Run(fmt.Sprintf("gauss/n=%d", n), func(b *testing.B) {
			for b.Loop() {
				naiveNatural(x)
			}
		})
	}
}

func BenchmarkNaturalFast20k(b *testing.B) {
	x := testseries.Bench("gauss", 20_000)
	for b.Loop() {
		if _, err := Natural(x, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}
