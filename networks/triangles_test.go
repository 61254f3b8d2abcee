package networks_test

import (
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// legacyTriangles is the previous Triangles: forward listing with the
// textbook degree order (Schank & Wagner 2005; Latapy 2008), every node
// ranked by (degree, index) and the forward lists copied out. Kept so that
// the time-ordered count can be checked against it, count for count, on
// graphs too large for the definition, and for the benchmark comparison.
func legacyTriangles(g *Graph) []int64 {
	n := g.Len()
	t := make([]int64, n)
	if n == 0 {
		return t
	}
	deg := make([]int32, n)
	for i := range deg {
		deg[i] = int32(g.Degree(i))
	}
	// higher(u, v): v ranks above u in the (degree, index) order.
	higher := func(u, v int32) bool {
		du, dv := deg[u], deg[v]
		return dv > du || (dv == du && v > u)
	}
	// Forward adjacency in CSR (subsets of sorted lists stay sorted).
	foff := make([]int64, n+1)
	for u := 0; u < n; u++ {
		c := int64(0)
		for _, v := range g.Neighbors(u) {
			if higher(int32(u), v) {
				c++
			}
		}
		foff[u+1] = foff[u] + c
	}
	fadj := make([]int32, foff[n])
	for u := 0; u < n; u++ {
		p := foff[u]
		for _, v := range g.Neighbors(u) {
			if higher(int32(u), v) {
				fadj[p] = v
				p++
			}
		}
	}
	// Workers take blocks of source nodes from a shared counter and count
	// into private arrays; integer sums do not depend on the split, so the
	// result is the same for any number of workers.
	const block = 4096
	workers := min(runtime.GOMAXPROCS(0), (n+block-1)/block)
	var next atomic.Int64
	parts := make([][]int64, workers)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			tw := t
			if w > 0 {
				tw = make([]int64, n)
			}
			parts[w] = tw
			stamp := make([]int32, n)
			for i := range stamp {
				stamp[i] = -1
			}
			for {
				lo := int(next.Add(block)) - block
				if lo >= n {
					return
				}
				for u := lo; u < min(lo+block, n); u++ {
					fu := fadj[foff[u]:foff[u+1]]
					if len(fu) < 2 {
						continue
					}
					for _, v := range fu {
						stamp[v] = int32(u)
					}
					for _, v := range fu {
						for _, w := range fadj[foff[v]:foff[v+1]] {
							if stamp[w] == int32(u) {
								tw[u]++
								tw[v]++
								tw[w]++
							}
						}
					}
				}
			}
		}(w)
	}
	wg.Wait()
	for _, p := range parts[1:] {
		for i, c := range p {
			t[i] += c
		}
	}
	return t
}

// legacyClustering is the previous Clustering, which stored every local
// coefficient and summed over the stored values.
func legacyClustering(g *Graph) ([]float64, ClusteringStats) {
	n := g.Len()
	t := legacyTriangles(g)
	c := make([]float64, n)
	st := ClusteringStats{Mean: math.NaN(), Std: math.NaN(), Transitivity: math.NaN()}
	if n == 0 {
		return c, st
	}
	var sum3, triples float64
	maxd := 0
	for i := range t {
		k := g.Degree(i)
		maxd = max(maxd, k)
		if k >= 2 {
			kf := float64(k)
			c[i] = 2 * float64(t[i]) / (kf * (kf - 1))
			triples += kf * (kf - 1) / 2
		}
		sum3 += float64(t[i])
	}
	st.Triangles = int64(math.Round(sum3 / 3))
	if triples > 0 {
		st.Transitivity = sum3 / triples
	}
	var s float64
	for _, v := range c {
		s += v
	}
	st.Mean = s / float64(n)
	var s2 float64
	for _, v := range c {
		d := v - st.Mean
		s2 += d * d
	}
	st.Std = math.Sqrt(s2 / float64(n))
	st.Histogram = make([]ClusteringBin, ClusteringBins)
	for b := range st.Histogram {
		st.Histogram[b].Lo = float64(b) / ClusteringBins
		st.Histogram[b].Hi = float64(b+1) / ClusteringBins
	}
	sumK := make([]float64, maxd+1)
	cntK := make([]int64, maxd+1)
	for i, v := range c {
		b := min(int(v*ClusteringBins), ClusteringBins-1)
		st.Histogram[b].Count++
		k := g.Degree(i)
		sumK[k] += v
		cntK[k]++
	}
	for k := range cntK {
		if cntK[k] > 0 {
			st.ByDegree = append(st.ByDegree, ClusteringByDegree{K: k, Count: cntK[k], Mean: sumK[k] / float64(cntK[k])})
		}
	}
	st.ByDegree = slices.Clip(st.ByDegree)
	return c, st
}

// definitionTriangles counts, for every node, the adjacent pairs among its
// neighbours: the definition of T_i (Watts & Strogatz, Nature 393 (1998)
// 440), O(Σ k²·log k).
func definitionTriangles(g *Graph) []int64 {
	t := make([]int64, g.Len())
	for i := range t {
		nb := g.Neighbors(i)
		for a := range nb {
			for b := a + 1; b < len(nb); b++ {
				if g.HasEdge(int(nb[a]), int(nb[b])) {
					t[i]++
				}
			}
		}
	}
	return t
}

// spikySeries is Gaussian noise with a few tall spikes: each spike is a hub
// seen from both sides (degree ~ the distance to the next spike), which
// the time order alone would handle in quadratic time.
func spikySeries(rng *rand.Rand, n, spikes int) []float64 {
	x := make([]float64, n)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	for k := 0; k < spikes; k++ {
		x[rng.IntN(n)] = 20 + 10*rng.Float64()
	}
	return x
}

// TestTrianglesMatchDefinition: per-node triangle counts equal the
// definition on the varied corpus of naive_test.go (ties, plateaus,
// convex runs: cliques), on spiky series (hubs) and on edge-list graphs
// (stars, cliques, random graphs, where degree ties among hubs occur), with
// the hub threshold left alone and with every node a hub.
func TestTrianglesMatchDefinition(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	names, series := testseries.Varied(rng, 600)
	var graphs []*Graph
	for _, x := range series {
		for _, kind := range []Kind{KindNVG, KindHVG} {
			g, err := visibility.Build(x, kind, visibility.Options{})
			if err != nil {
				t.Fatal(err)
			}
			graphs = append(graphs, g)
		}
	}
	for k := 0; k < 20; k++ {
		g, err := visibility.Natural(spikySeries(rng, 500+rng.IntN(1500), 1+rng.IntN(6)), visibility.Options{})
		if err != nil {
			t.Fatal(err)
		}
		names = append(names, fmt.Sprintf("spiky%d", k))
		graphs = append(graphs, g)
	}
	for k := 0; k < 40; k++ {
		n := 2 + rng.IntN(60)
		var edges [][2]int32
		p := rng.Float64()
		for a := 0; a < n; a++ {
			for b := a + 1; b < n; b++ {
				if rng.Float64() < p || k%4 == 0 && a == n/2 {
					edges = append(edges, [2]int32{int32(a), int32(b)})
				}
			}
		}
		g, err := FromEdges(n, edges)
		if err != nil {
			t.Fatal(err)
		}
		names = append(names, fmt.Sprintf("edges%d", k))
		graphs = append(graphs, g)
	}
	for _, hubs := range []bool{false, true} {
		for k, g := range graphs {
			want := definitionTriangles(g)
			var got []int64
			if hubs {
				got = make([]int64, g.Len())
				CountTrianglesHubDeg(g, got, 0)
			} else {
				got = Triangles(g)
			}
			if !slices.Equal(got, want) {
				name := fmt.Sprint(k)
				if k < len(names) {
					name = names[k]
				}
				t.Fatalf("graph %s (all hubs %v): triangles %v, definition %v", name, hubs, got, want)
			}
		}
	}
}

// TestTrianglesMatchDegreeOrder: on long series of every regime (noise,
// Brownian motion: dense; a noisy sine: many triangles; spikes: hubs) the
// time-ordered count equals the previous degree-ordered one node for node,
// on one thread and on several, with int32 and int64 counts, and Clustering
// gives bit-identical coefficients and statistics. Reference: the previous
// implementation (legacyTriangles, legacyClustering), checked against
// gonum and NetworkX in reference_test.go.
func TestTrianglesMatchDegreeOrder(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 24))
	const n = 100_000
	sine := make([]float64, n)
	for i := range sine {
		sine[i] = math.Sin(0.05*float64(i)) + 0.01*rng.NormFloat64()
	}
	series := map[string][]float64{
		"gauss": testseries.Bench("gauss", n),
		"brown": testseries.Bench("brown", n),
		"sine":  sine,
		"spiky": spikySeries(rng, n, 30),
	}
	defer SetTriangleParallelWork(SetTriangleParallelWork(64))
	for name, x := range series {
		for _, kind := range []Kind{KindNVG, KindHVG} {
			g, err := visibility.Build(x, kind, visibility.Options{})
			if err != nil {
				t.Fatal(err)
			}
			want := legacyTriangles(g)
			for _, par := range []float64{0, math.Inf(1)} {
				SetTriangleParallelWork(par)
				if got := Triangles(g); !slices.Equal(got, want) {
					t.Fatalf("%s %v (parallel from %v): triangle counts differ", name, kind, par)
				}
				t32 := make([]int32, g.Len())
				CountTriangles32(g, t32)
				for i := range t32 {
					if int64(t32[i]) != want[i] {
						t.Fatalf("%s %v (parallel from %v): int32 count at node %d is %d, want %d", name, kind, par, i, t32[i], want[i])
					}
				}
			}
			c, st := Clustering(g)
			wc, wst := legacyClustering(g)
			if !slices.Equal(c, wc) || !reflect.DeepEqual(st, wst) {
				t.Errorf("%s %v: clustering differs: %+v, want %+v", name, kind, st, wst)
			}
			if s := ClusteringStatsOf(g, nil); !reflect.DeepEqual(s, wst) {
				t.Errorf("%s %v: clustering summary without coefficients differs", name, kind)
			}
		}
	}
	if runtime.GOMAXPROCS(0) < 2 {
		t.Log("one CPU: the parallel path ran with one worker")
	}
}

// BenchmarkClusteringDegreeOrder times the previous Clustering (degree-
// ordered triangle count, stored coefficients) on the graphs of
// BenchmarkClustering, for the before/after comparison in BENCHMARKS.md.
func BenchmarkClusteringDegreeOrder(b *testing.B) {
	for _, series := range []string{"gauss", "brown"} {
		for _, n := range benchSizes {
			b.Run(fmt.Sprintf("nvg/%s/n=%d", series, n), func(b *testing.B) {
				g := benchGraph(b, KindNVG, series, n)
				b.ReportAllocs()
				for b.Loop() {
					legacyClustering(g)
				}
			})
		}
	}
}
