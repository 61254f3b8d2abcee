package networks_test

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"sync"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// levelCounts runs a BFS from src and returns cnt[r] = nodes at distance r.
// dist and queue are scratch buffers of length n; dist must be all −1 on
// entry and is restored on return. It is the one-source search that
// multiBFS replaced, kept as the reference multiBFS is checked against.
func levelCounts(g *Graph, src int32, dist, queue []int32) []int64 {
	cnt := make([]int64, 1, 32)
	dist[src] = 0
	queue[0] = src
	head, tail := 0, 1
	cnt[0] = 1
	for head < tail {
		u := queue[head]
		head++
		du := dist[u] + 1
		for _, v := range g.Neighbors(int(u)) {
			if dist[v] < 0 {
				dist[v] = du
				queue[tail] = v
				tail++
				if int(du) >= len(cnt) {
					cnt = append(cnt, 0)
				}
				cnt[du]++
			}
		}
	}
	for _, v := range queue[:tail] {
		dist[v] = -1
	}
	return cnt
}

// TestMultiBFSMatchesSingle: the level counts of the 64-at-once search
// equal those of one plain BFS per source (the textbook search, levelCounts)
// on NVGs and HVGs of noise, Brownian motion and the varied corpus of
// naive_test.go, and on edge-list graphs that are disconnected (sources
// that cannot reach every node), for batches of 1 to 64 sources.
func TestMultiBFSMatchesSingle(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	var graphs []*Graph
	for _, kind := range []Kind{KindNVG, KindHVG} {
		for _, s := range []string{"gauss", "brown"} {
			g, err := visibility.Build(testseries.Bench(s, 20_000), kind, visibility.Options{})
			if err != nil {
				t.Fatal(err)
			}
			graphs = append(graphs, g)
		}
		_, series := testseries.Varied(rng, 40)
		for _, x := range series {
			g, err := visibility.Build(x, kind, visibility.Options{})
			if err != nil {
				t.Fatal(err)
			}
			graphs = append(graphs, g)
		}
	}
	for k := 0; k < 10; k++ {
		n := 50 + rng.IntN(200)
		var edges [][2]int32
		for e := 0; e < n; e++ {
			a, b := rng.IntN(n), rng.IntN(n)
			if a != b {
				edges = append(edges, [2]int32{int32(a), int32(b)})
			}
		}
		g, err := FromEdges(n, edges)
		if err != nil {
			t.Fatal(err)
		}
		graphs = append(graphs, g)
	}
	for gi, g := range graphs {
		n := g.Len()
		dist := make([]int32, n)
		for i := range dist {
			dist[i] = -1
		}
		queue := make([]int32, n)
		seen, visit, next := make([]uint64, n), make([]uint64, n), make([]uint64, n)
		for _, k := range []int{1, 7, 64} {
			k = min(k, n)
			src := make([]int32, k)
			for s, v := range rng.Perm(n)[:k] {
				src[s] = int32(v)
			}
			got := MultiBFS(g, src, seen, visit, next)
			for s, v := range src {
				if want := levelCounts(g, v, dist, queue); !slices.Equal(got[s], want) {
					t.Fatalf("graph %d, %d sources, source %d: counts %v, want %v", gi, k, v, got[s], want)
				}
			}
			for i := range seen {
				if seen[i]|visit[i]|next[i] != 0 {
					t.Fatalf("graph %d: scratch not cleared at node %d", gi, i)
				}
			}
		}
	}
}

// TestPathsExactMatchesPlainBFS: in exact mode (1500 nodes: 24 batches of
// sources, spread over the worker threads) the mean path and the diameter
// equal those from one plain BFS per node (the definition: mean over
// ordered pairs of distinct nodes of the hop distance).
func TestPathsExactMatchesPlainBFS(t *testing.T) {
	g, err := visibility.Natural(testseries.Bench("brown", 1500), visibility.Options{})
	if err != nil {
		t.Fatal(err)
	}
	a, da, err := PathsAndDimension(g, PathOptions{}, true, true)
	if err != nil {
		t.Fatal(err)
	}
	// The reference: one plain BFS per source, aggregated the same way.
	var tot, pairs float64
	diam := 0
	dist := make([]int32, g.Len())
	for i := range dist {
		dist[i] = -1
	}
	queue := make([]int32, g.Len())
	for s := 0; s < g.Len(); s++ {
		cnt := levelCounts(g, int32(s), dist, queue)
		var reach int64
		for r, c := range cnt {
			tot += float64(r) * float64(c)
			reach += c
		}
		pairs += float64(reach - 1)
		diam = max(diam, len(cnt)-1)
	}
	if !a.Exact || a.AvgPathLength != tot/pairs || a.Diameter != diam {
		t.Errorf("exact paths %+v, want mean %v diameter %d", a, tot/pairs, diam)
	}
	if math.IsNaN(da.Mean) {
		t.Errorf("local dimension undefined: %+v", da)
	}
	t.Logf("exact mean path %.6f, diameter %d, dimension %.4f", a.AvgPathLength, a.Diameter, da.Mean)
}

// onePerSource is the previous pathsAndDimension's search: one plain BFS
// per source, the sources spread over GOMAXPROCS workers (each with an
// n-sized distance array and queue).
func onePerSource(g *Graph, src []int32) [][]int64 {
	n := g.Len()
	counts := make([][]int64, len(src))
	workers := min(runtime.GOMAXPROCS(0), len(src))
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Go(func() {
			dist := make([]int32, n)
			for i := range dist {
				dist[i] = -1
			}
			queue := make([]int32, n)
			for s := w; s < len(src); s += workers {
				counts[s] = levelCounts(g, src[s], dist, queue)
			}
		})
	}
	wg.Wait()
	return counts
}

// BenchmarkPathsOneSourceAtATime times the previous search (one BFS per
// source) from the 64 sources BenchmarkPaths uses, for the before/after
// comparison in BENCHMARKS.md.
func BenchmarkPathsOneSourceAtATime(b *testing.B) {
	for _, series := range []string{"gauss", "brown"} {
		for _, n := range []int{100_000, 1_000_000} {
			b.Run(fmt.Sprintf("nvg/%s/n=%d", series, n), func(b *testing.B) {
				g := benchGraph(b, KindNVG, series, n)
				src, _ := PickSources(n, PathOptions{})
				for b.Loop() {
					onePerSource(g, src)
				}
			})
		}
	}
}
