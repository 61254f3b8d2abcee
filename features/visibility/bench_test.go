package visibility

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/graph/community"
)

// benchSeries returns Gaussian white noise ("gauss"), its cumulative sum
// (Brownian motion, "brown") or a linear trend 0.3·i plus unit noise
// ("trend", the deep-Cartesian-tree case) of length n from a fixed seed.
func benchSeries(kind string, n int) []float64 {
	rng := rand.New(rand.NewPCG(uint64(n), 99))
	x := make([]float64, n)
	v := 0.0
	for i := range x {
		e := rng.NormFloat64()
		switch kind {
		case "brown":
			v += e
			x[i] = v
		case "trend":
			x[i] = 0.3*float64(i) + e
		default:
			x[i] = e
		}
	}
	return x
}

var benchSizes = []int{1_000, 10_000, 100_000, 1_000_000}

func BenchmarkNatural(b *testing.B) {
	for _, kind := range []string{"gauss", "brown", "trend"} {
		for _, n := range benchSizes {
			x := benchSeries(kind, n)
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
			x := benchSeries(kind, n)
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
		x := benchSeries("gauss", n)
		b.Run(fmt.Sprintf("gauss/n=%d", n), func(b *testing.B) {
			for b.Loop() {
				naiveNatural(x)
			}
		})
	}
}

func BenchmarkNaturalFast20k(b *testing.B) {
	x := benchSeries("gauss", 20_000)
	for b.Loop() {
		if _, err := Natural(x, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}

// benchGraph caches graphs across benchmarks.
var benchGraphs = map[string]*Graph{}

func benchGraph(b *testing.B, kind Kind, series string, n int) *Graph {
	key := fmt.Sprintf("%v/%s/%d", kind, series, n)
	if g, ok := benchGraphs[key]; ok {
		return g
	}
	g, err := Build(benchSeries(series, n), kind, Options{})
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
