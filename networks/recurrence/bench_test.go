package recurrence

import (
	"fmt"
	"testing"

	"github.com/tracesift/tracesift/generators"
)

// BenchmarkBuild: recurrence networks of 10^3–10^4 delay vectors of the
// Lorenz x coordinate (m = 3, τ = 8 given, as the figure asks for
// embedded points) at the default 5% rate: tree, ε bracket, pair
// collection, selection and CSR.
func BenchmarkBuild(b *testing.B) {
	for _, n := range []int{1_000, 10_000} {
		x := gen(b, generators.Lorenz{Sigma: 10, Rho: 28, Beta: 8.0 / 3, Dt: 0.02}, n+16, 1)
		b.Run(fmt.Sprintf("lorenz/n=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			var e int64
			for b.Loop() {
				nw, err := Build(x, Options{Dim: 3, Delay: 8})
				if err != nil {
					b.Fatal(err)
				}
				e = nw.Graph.Edges()
			}
			b.ReportMetric(float64(e), "edges")
		})
	}
	x := white(10_016, 1)
	b.Run("white/n=10000", func(b *testing.B) {
		for b.Loop() {
			if _, err := Build(x, Options{Dim: 3, Delay: 8}); err != nil {
				b.Fatal(err)
			}
		}
	})
}
