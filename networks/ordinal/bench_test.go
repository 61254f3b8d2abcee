package ordinal

import (
	"fmt"
	"testing"
)

// BenchmarkBuild: ordinal partition networks of 10^6 samples of white noise
// and of the logistic map at orders 4–7, delay 1.
func BenchmarkBuild(b *testing.B) {
	series := map[string][]float64{"noise": noise(1_000_000, 1), "logistic": logistic(1_000_000, 0.3)}
	for _, name := range []string{"noise", "logistic"} {
		for _, d := range []int{4, 5, 6, 7} {
			x := series[name]
			b.Run(fmt.Sprintf("%s/d=%d/n=1000000", name, d), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := Build(x, Options{Order: d}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
