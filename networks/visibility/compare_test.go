package visibility

// The comparisons of the graph command with outside references at n = 2·10^4
// (BENCHMARKS.md): a plain O(n²) max-slope sweep in Go, and numpy + NetworkX
// (scripts/bench/nvg_networkx.py). The series are those of
// `tracesift generate white|brownian --n 20000 --seed 1`, rebuilt here from
// the same generator, seed and stream, so that the Go benchmarks and the
// script measure the same graphs.

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/tracesift/tracesift/networks"

	"github.com/tracesift/tracesift/generators"
)

// generated returns the series `tracesift generate NAME --n N --seed SEED`
// writes (cmd/tracesift/generate.go: the system's defaults, a PCG seeded
// with (SEED, "tracesif"), printed with every digit, so reading the file
// back gives these values).
func generated(tb testing.TB, name string, n int, seed uint64) []float64 {
	tb.Helper()
	sys, err := generators.Lookup(name)
	if err != nil {
		tb.Fatal(err)
	}
	x, err := sys.Generate(n, nil, rand.New(rand.NewPCG(seed, 0x7472616365736966)))
	if err != nil {
		tb.Fatal(err)
	}
	return x
}

// sweepNatural is the plain O(n²) construction of the natural visibility
// graph: from each sample a, sweep b = a+1, a+2, … keeping the steepest
// slope (x_c − x_a)/(c − a) met so far; b is visible from a iff its slope
// exceeds that maximum, i.e. every sample between lies strictly below the
// line from a to b (Lacasa et al., PNAS 105 (2008) 4972). Slopes are
// rounded, so exactly collinear samples may be judged differently from the
// exact predicate of Natural; on continuous-valued data the graphs agree.
// It is the reference for the speed of Natural ("a plain sweep"), beside
// the cubic definition (naiveNatural) that BenchmarkNaturalNaive times.
func sweepNatural(x []float64) *networks.Graph {
	n := len(x)
	var buf networks.EdgeBuffer
	for a := 0; a < n-1; a++ {
		xa := x[a]
		best := math.Inf(-1)
		for b := a + 1; b < n; b++ {
			if s := (x[b] - xa) / float64(b-a); s > best {
				best = s
				buf.Add(a, b)
			}
		}
	}
	return buf.Build(n, networks.KindNVG)
}

// TestSweepMatchesNatural: the plain sweep and Natural give the same CSR
// arrays on Gaussian noise and Brownian motion, so the benchmark compares
// two constructions of one graph.
func TestSweepMatchesNatural(t *testing.T) {
	for _, name := range []string{"white", "brownian"} {
		x := generated(t, name, 3000, 1)
		g, err := Natural(x, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if err := sameCSR(sweepNatural(x), g); err != nil {
			t.Errorf("%s: %v", name, err)
		}
	}
}

// TestClusteringMatchesNetworkX20k: the NVGs of the two 2·10^4-sample
// series have the edge counts and the average clustering that
// scripts/bench/nvg_networkx.py printed for them (its own numpy sweep and
// networkx.average_clustering, NetworkX 2.8.8, numpy 1.24.2, Python
// 3.11.2), to the last bit: both average the same per-node quotients in
// node order.
func TestClusteringMatchesNetworkX20k(t *testing.T) {
	for _, c := range []struct {
		name       string
		edges      int64
		clustering float64
	}{
		{"white", 59079, 0.7523087598429338},
		{"brownian", 189184, 0.6871941245342185},
	} {
		g, err := Natural(generated(t, c.name, 20_000, 1), Options{})
		if err != nil {
			t.Fatal(err)
		}
		_, st := networks.Clustering(g)
		if g.Edges() != c.edges || st.Mean != c.clustering {
			t.Errorf("%s: %d edges, average clustering %.17g; NetworkX %d, %.17g", c.name, g.Edges(), st.Mean, c.edges, c.clustering)
		}
	}
}

var compareSeries = []struct{ name, system string }{{"white", "white"}, {"brown", "brownian"}}

// BenchmarkSweepNatural20k times the plain sweep at n = 2·10^4.
func BenchmarkSweepNatural20k(b *testing.B) {
	for _, s := range compareSeries {
		x := generated(b, s.system, 20_000, 1)
		b.Run(s.name, func(b *testing.B) {
			for b.Loop() {
				sweepNatural(x)
			}
		})
	}
}

// BenchmarkNatural20k times Natural on the same series.
func BenchmarkNatural20k(b *testing.B) {
	for _, s := range compareSeries {
		x := generated(b, s.system, 20_000, 1)
		b.Run(s.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Natural(x, Options{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkGraph20k times the library side of the comparison with the
// NetworkX script: "clustering" is what the script computes (NVG and its
// average clustering), "measure" what `tracesift graph` computes (the NVG
// and every metric, 64 sampled BFS sources, seed 1).
func BenchmarkGraph20k(b *testing.B) {
	for _, s := range compareSeries {
		x := generated(b, s.system, 20_000, 1)
		for _, what := range []string{"clustering", "measure"} {
			b.Run(fmt.Sprintf("%s/%s", s.name, what), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					g, err := Natural(x, Options{})
					if err != nil {
						b.Fatal(err)
					}
					if what == "clustering" {
						networks.Clustering(g)
					} else if _, err := networks.Measure(g, networks.MeasureOptions{Seed: 1}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
