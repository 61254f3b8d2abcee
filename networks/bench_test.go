package networks_test

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"

	"gonum.org/v1/gonum/graph/community"
)

var benchSizes = []int{1_000, 10_000, 100_000, 1_000_000}

// benchGraph caches graphs across benchmarks.
var benchGraphs = map[string]*Graph{}

func benchGraph(b *testing.B, kind Kind, series string, n int) *Graph {
	key := fmt.Sprintf("%v/%s/%d", kind, series, n)
	if g, ok := benchGraphs[key]; ok {
		return g
	}
	g, err := visibility.Build(testseries.Bench(series, n), kind, visibility.Options{})
	if err != nil {
		b.Fatal(err)
	}
	benchGraphs[key] = g
	return g
}

func BenchmarkClustering(b *testing.B) {
	for _, series := range []string{"gauss", "brown"} {
		for _, n := range benchSizes {
			b.Run(fmt.Sprintf("nvg/%s/n=%d", series, n), func(b *testing.B) {
				g := benchGraph(b, KindNVG, series, n)
				b.ReportAllocs()
				for b.Loop() {
					Clustering(g)
				}
			})
		}
	}
}

func BenchmarkLouvain(b *testing.B) {
	for _, kind := range []Kind{KindNVG, KindHVG} {
		for _, series := range []string{"gauss", "brown"} {
			for _, n := range benchSizes {
				b.Run(fmt.Sprintf("%v/%s/n=%d", kind, series, n), func(b *testing.B) {
					g := benchGraph(b, kind, series, n)
					b.ReportAllocs()
					var p Partition
					for b.Loop() {
						p, _ = Louvain(g, LouvainOptions{})
					}
					b.ReportMetric(p.Modularity, "Q")
				})
			}
		}
	}
}

// BenchmarkGonumLouvain times gonum's community.Modularize on the same
// graphs (conversion to simple.UndirectedGraph excluded), to decide whether
// it could serve instead of Louvain.
func BenchmarkGonumLouvain(b *testing.B) {
	for _, n := range []int{10_000, 100_000} {
		b.Run(fmt.Sprintf("nvg/gauss/n=%d", n), func(b *testing.B) {
			u := toGonum(benchGraph(b, KindNVG, "gauss", n))
			b.ReportAllocs()
			for b.Loop() {
				community.Modularize(u, 1, rand.NewPCG(1, 1))
			}
		})
	}
}

func BenchmarkMeasure(b *testing.B) {
	for _, kind := range []Kind{KindNVG, KindHVG} {
		for _, n := range []int{10_000, 1_000_000} {
			b.Run(fmt.Sprintf("%v/brown/n=%d", kind, n), func(b *testing.B) {
				g := benchGraph(b, kind, "brown", n)
				b.ReportAllocs()
				for b.Loop() {
					if _, err := Measure(g, MeasureOptions{}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

func BenchmarkPaths(b *testing.B) {
	for _, series := range []string{"gauss", "brown"} {
		for _, n := range []int{100_000, 1_000_000} {
			b.Run(fmt.Sprintf("nvg/%s/n=%d", series, n), func(b *testing.B) {
				g := benchGraph(b, KindNVG, series, n)
				for b.Loop() {
					Paths(g, PathOptions{})
				}
			})
		}
	}
}
