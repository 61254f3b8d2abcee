package networks_test

import (
	"errors"
	"math/rand/v2"
	"testing"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/internal/testseries"
	"github.com/tracesift/tracesift/networks/visibility"
)

// bruteDiameter is the largest finite distance from a BFS at every node
// (the definition).
func bruteDiameter(g *Graph) int {
	n := g.Len()
	dist := make([]int, n)
	best := 0
	for s := 0; s < n; s++ {
		for i := range dist {
			dist[i] = -1
		}
		dist[s] = 0
		q := []int{s}
		for h := 0; h < len(q); h++ {
			u := q[h]
			for _, v := range g.Neighbors(u) {
				if dist[v] < 0 {
					dist[v] = dist[u] + 1
					best = max(best, dist[v])
					q = append(q, int(v))
				}
			}
		}
	}
	return best
}

// TestExactDiameter: iFUB gives the diameter of the definition on random
// sparse graphs (connected or not, with isolated nodes), trees (paths, the
// worst case for the fringe bound's slack) and visibility graphs of varied
// series, with far fewer searches than nodes on the large ones.
func TestExactDiameter(t *testing.T) {
	rng := rand.New(rand.NewPCG(16, 16))
	var graphs []*Graph
	for k := 0; k < 60; k++ {
		n := 2 + rng.IntN(300)
		m := rng.IntN(2 * n)
		var edges [][2]int32
		for range m {
			a, b := rng.IntN(n), rng.IntN(n)
			if a != b {
				edges = append(edges, [2]int32{int32(a), int32(b)})
			}
		}
		if k%5 == 0 { // a path: a tree of the largest diameter
			edges = edges[:0]
			for i := 1; i < n; i++ {
				edges = append(edges, [2]int32{int32(i - 1), int32(i)})
			}
		}
		g, err := FromEdges(n, edges)
		if err != nil {
			t.Fatal(err)
		}
		graphs = append(graphs, g)
	}
	_, series := testseries.Varied(rng, 40)
	for _, x := range series {
		for _, kind := range []Kind{KindNVG, KindHVG} {
			g, err := visibility.Build(x, kind, visibility.Options{})
			if err != nil {
				t.Fatal(err)
			}
			graphs = append(graphs, g)
		}
	}
	for _, kind := range []string{"gauss", "brown"} {
		g, _ := visibility.Natural(testseries.Bench(kind, 3000), visibility.Options{})
		graphs = append(graphs, g)
	}
	for k, g := range graphs {
		d, err := ExactDiameter(g)
		if err != nil {
			t.Fatal(err)
		}
		if want := bruteDiameter(g); d.Diameter != want {
			t.Fatalf("graph %d (%d nodes, %d edges): iFUB %d, definition %d", k, g.Len(), g.Edges(), d.Diameter, want)
		}
		if g.Len() == 3000 && d.BFS > 300 {
			t.Errorf("graph %d: %d searches on %d nodes", k, d.BFS, g.Len())
		}
	}
	if _, err := ExactDiameter(&Graph{}); !errors.Is(err, ErrEmpty) {
		t.Errorf("empty graph: %v", err)
	}
}

// BenchmarkExactDiameter: iFUB on visibility graphs of 10^5 samples, with
// the number of breadth-first searches it needed.
func BenchmarkExactDiameter(b *testing.B) {
	for _, c := range []struct {
		kind   Kind
		series string
	}{{KindHVG, "gauss"}, {KindNVG, "gauss"}, {KindNVG, "brown"}} {
		g, err := visibility.Build(testseries.Bench(c.series, 100_000), c.kind, visibility.Options{})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(c.kind.String()+"/"+c.series+"/n=100000", func(b *testing.B) {
			var d DiameterStats
			for b.Loop() {
				d, _ = ExactDiameter(g)
			}
			b.ReportMetric(float64(d.BFS), "bfs")
			b.ReportMetric(float64(d.Diameter), "diameter")
		})
	}
}
