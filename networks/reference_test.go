package networks_test

import (
	"bufio"
	"encoding/json"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"

	"gonum.org/v1/gonum/graph"
	"gonum.org/v1/gonum/graph/community"
	"gonum.org/v1/gonum/graph/path"
	"gonum.org/v1/gonum/graph/simple"
	"gonum.org/v1/gonum/stat"
)

// toGonum copies g into a gonum simple.UndirectedGraph (node IDs = indices).
func toGonum(g *Graph) *simple.UndirectedGraph {
	u := simple.NewUndirectedGraph()
	for i := 0; i < g.Len(); i++ {
		u.AddNode(simple.Node(i))
	}
	for i := 0; i < g.Len(); i++ {
		for _, j := range g.Successors(i) {
			u.SetEdge(simple.Edge{F: simple.Node(i), T: simple.Node(j)})
		}
	}
	return u
}

// gonumCommunities converts a label vector into gonum's [][]graph.Node.
func gonumCommunities(labels []int32) [][]graph.Node {
	var out [][]graph.Node
	for i, c := range labels {
		for int(c) >= len(out) {
			out = append(out, nil)
		}
		out[c] = append(out[c], simple.Node(i))
	}
	return out
}

// referenceGraphs returns a few NVGs and HVGs of different character.
func referenceGraphs(t *testing.T) map[string]*Graph {
	rng := rand.New(rand.NewPCG(91, 92))
	out := map[string]*Graph{}
	gauss := testseries.IID("gauss", 400, rng)
	walk := testseries.Cumsum(testseries.IID("gauss", 400, rng))
	ints := make([]float64, 300)
	for i := range ints {
		ints[i] = float64(rng.IntN(5))
	}
	for name, x := range map[string][]float64{"gauss": gauss, "walk": walk, "ints": ints} {
		for _, kind := range []Kind{KindNVG, KindHVG} {
			g, err := visibility.Build(x, kind, visibility.Options{})
			if err != nil {
				t.Fatal(err)
			}
			out[name+"/"+kind.String()] = g
		}
	}
	return out
}

// TestAgainstGonum checks every metric against gonum's graph packages on the
// same graphs: degrees (graph.Undirected.From), local clustering from
// triangles counted with HasEdgeBetween, path lengths and diameter from
// path.DijkstraFrom on every source, modularity with community.Q, and the
// assortativity as the Pearson correlation (gonum stat.Correlation) of the
// degrees at both ends of every edge in both directions (Newman 2002).
func TestAgainstGonum(t *testing.T) {
	for name, g := range referenceGraphs(t) {
		t.Run(name, func(t *testing.T) {
			u := toGonum(g)
			n := g.Len()
			// Degrees.
			for i := 0; i < n; i++ {
				if d := u.From(int64(i)).Len(); d != g.Degree(i) {
					t.Fatalf("node %d: degree %d, gonum %d", i, g.Degree(i), d)
				}
			}
			// Local clustering by brute force on the gonum graph.
			local := LocalClustering(g)
			for i := 0; i < n; i++ {
				nb := graph.NodesOf(u.From(int64(i)))
				links := 0
				for a := range nb {
					for b := a + 1; b < len(nb); b++ {
						if u.HasEdgeBetween(nb[a].ID(), nb[b].ID()) {
							links++
						}
					}
				}
				want := 0.0
				if k := len(nb); k >= 2 {
					want = 2 * float64(links) / float64(k*(k-1))
				}
				if math.Abs(local[i]-want) > 1e-12 {
					t.Fatalf("node %d: clustering %v, gonum-counted %v", i, local[i], want)
				}
			}
			// Shortest paths: exact (n ≤ 2000).
			ps, err := Paths(g, PathOptions{})
			if err != nil {
				t.Fatal(err)
			}
			var sum float64
			diam := 0.0
			for s := 0; s < n; s++ {
				sp := path.DijkstraFrom(simple.Node(s), u)
				for v := 0; v < n; v++ {
					if v != s {
						d := sp.WeightTo(int64(v))
						sum += d
						diam = math.Max(diam, d)
					}
				}
			}
			if want := sum / float64(n*(n-1)); !ps.Exact || math.Abs(ps.AvgPathLength-want) > 1e-12*want {
				t.Errorf("avg path %v (exact %v), gonum %v", ps.AvgPathLength, ps.Exact, want)
			}
			if ps.Diameter != int(diam) {
				t.Errorf("diameter %d, gonum %v", ps.Diameter, diam)
			}
			// Assortativity.
			var da, db []float64
			for i := 0; i < n; i++ {
				for _, j := range g.Neighbors(i) {
					da = append(da, float64(g.Degree(i)))
					db = append(db, float64(g.Degree(int(j))))
				}
			}
			r, err := Assortativity(g)
			if err != nil {
				t.Fatal(err)
			}
			if want := stat.Correlation(da, db, nil); math.Abs(r-want) > 1e-12 {
				t.Errorf("assortativity %v, gonum Pearson %v", r, want)
			}
			// Modularity of our Louvain partition and of time blocks.
			p, err := Louvain(g, LouvainOptions{})
			if err != nil {
				t.Fatal(err)
			}
			blocks := make([]int32, n)
			for i := range blocks {
				blocks[i] = int32(i / 25)
			}
			for _, lab := range [][]int32{p.Community, blocks} {
				q, err := Modularity(g, lab, 1)
				if err != nil {
					t.Fatal(err)
				}
				if want := community.Q(u, gonumCommunities(lab), 1); math.Abs(q-want) > 1e-12 {
					t.Errorf("modularity %v, gonum community.Q %v", q, want)
				}
			}
			if math.Abs(p.Modularity-community.Q(u, gonumCommunities(p.Community), 1)) > 1e-12 {
				t.Errorf("Louvain reports Q = %v, gonum Q of its partition differs", p.Modularity)
			}
			// Partition quality against gonum's Louvain (best of 5 seeds):
			// ours must be within 0.01 (Louvain is a heuristic; both are
			// local optima of the same objective).
			best := math.Inf(-1)
			for s := uint64(1); s <= 5; s++ {
				red := community.Modularize(u, 1, rand.NewPCG(s, s))
				best = math.Max(best, community.Q(u, red.Communities(), 1))
			}
			t.Logf("%s: Louvain Q = %.4f (%d communities), gonum best of 5 = %.4f", name, p.Modularity, p.Communities, best)
			if p.Modularity < best-0.01 {
				t.Errorf("Louvain Q = %.4f, gonum reaches %.4f", p.Modularity, best)
			}
		})
	}
}

// golden is testdata/networks/golden.json, written by make_golden.py with
// NetworkX.
type golden struct {
	NetworkxVersion string `json:"networkx_version"`
	Graphs          []struct {
		Series          string    `json:"series"`
		Kind            string    `json:"kind"`
		N               int       `json:"n"`
		Edges           [][2]int  `json:"edges"`
		DegreeHistogram []int64   `json:"degree_histogram"`
		AvgClustering   float64   `json:"average_clustering"`
		Transitivity    float64   `json:"transitivity"`
		Assortativity   float64   `json:"degree_assortativity"`
		AvgPath         float64   `json:"average_shortest_path_length"`
		Diameter        int       `json:"diameter"`
		BlockSize       int       `json:"block_size"`
		BlockQ          float64   `json:"block_modularity"`
		LouvainQ        float64   `json:"louvain_modularity_networkx"`
		LouvainC        int       `json:"louvain_communities_networkx"`
		_               [0]func() // not comparable
	} `json:"graphs"`
}

const goldenDir = "../testdata/networks"

// readSeries reads a one-column CSV with a header line.
func readSeries(t *testing.T, name string) []float64 {
	f, err := os.Open(filepath.Join(goldenDir, name))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var x []float64
	sc := bufio.NewScanner(f)
	for line := 0; sc.Scan(); line++ {
		s := strings.TrimSpace(sc.Text())
		if line == 0 || s == "" {
			continue
		}
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatalf("%s line %d: %v", name, line+1, err)
		}
		x = append(x, v)
	}
	return x
}

// TestGoldenNetworkX compares with NetworkX on the committed series: the
// edge sets of its independent naive construction (exact rationals) and its
// degree_histogram, average_clustering, transitivity,
// degree_assortativity_coefficient, average_shortest_path_length, diameter
// and community.modularity (values in golden.json, version recorded there).
func TestGoldenNetworkX(t *testing.T) {
	b, err := os.ReadFile(filepath.Join(goldenDir, "golden.json"))
	if err != nil {
		t.Fatal(err)
	}
	var gd golden
	if err := json.Unmarshal(b, &gd); err != nil {
		t.Fatal(err)
	}
	if gd.NetworkxVersion == "" || len(gd.Graphs) < 8 {
		t.Fatalf("golden file incomplete: version %q, %d graphs", gd.NetworkxVersion, len(gd.Graphs))
	}
	const tol = 1e-12
	for _, rec := range gd.Graphs {
		kind, err := ParseKind(rec.Kind)
		if err != nil {
			t.Fatal(err)
		}
		x := readSeries(t, rec.Series)
		g, err := visibility.Build(x, kind, visibility.Options{})
		if err != nil {
			t.Fatal(err)
		}
		id := rec.Series + "/" + rec.Kind
		if g.Len() != rec.N || g.Edges() != int64(len(rec.Edges)) {
			t.Fatalf("%s: n %d edges %d, NetworkX %d %d", id, g.Len(), g.Edges(), rec.N, len(rec.Edges))
		}
		for _, e := range rec.Edges {
			if !g.HasEdge(e[0], e[1]) {
				t.Fatalf("%s: edge %v missing", id, e)
			}
		}
		hist := DegreeHistogram(g)
		if !slices.Equal(hist, rec.DegreeHistogram) {
			t.Errorf("%s: degree histogram %v, NetworkX %v", id, hist, rec.DegreeHistogram)
		}
		_, cs := Clustering(g)
		check := func(what string, got, want float64) {
			if math.Abs(got-want) > tol*math.Max(1, math.Abs(want)) {
				t.Errorf("%s: %s %.15g, NetworkX %.15g", id, what, got, want)
			}
		}
		check("average clustering", cs.Mean, rec.AvgClustering)
		check("transitivity", cs.Transitivity, rec.Transitivity)
		r, err := Assortativity(g)
		if err != nil {
			t.Fatal(err)
		}
		check("assortativity", r, rec.Assortativity)
		ps, err := Paths(g, PathOptions{})
		if err != nil {
			t.Fatal(err)
		}
		check("average shortest path", ps.AvgPathLength, rec.AvgPath)
		if ps.Diameter != rec.Diameter {
			t.Errorf("%s: diameter %d, NetworkX %d", id, ps.Diameter, rec.Diameter)
		}
		blocks := make([]int32, g.Len())
		for i := range blocks {
			blocks[i] = int32(i / rec.BlockSize)
		}
		q, err := Modularity(g, blocks, 1)
		if err != nil {
			t.Fatal(err)
		}
		check("block modularity", q, rec.BlockQ)
		// Louvain quality: within 0.01 of NetworkX's louvain_communities.
		p, err := Louvain(g, LouvainOptions{})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("%s: Louvain Q %.4f (%d), NetworkX %.4f (%d)", id, p.Modularity, p.Communities, rec.LouvainQ, rec.LouvainC)
		if p.Modularity < rec.LouvainQ-0.01 {
			t.Errorf("%s: Louvain Q %.4f, NetworkX louvain %.4f", id, p.Modularity, rec.LouvainQ)
		}
	}
}

// TestLouvainDeterministic: same graph and seed ⇒ same partition; and a
// graph of disjoint cliques joined in a ring is split into its cliques
// (the textbook case, Newman & Girvan 2004).
func TestLouvainDeterministic(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 5))
	g, _ := visibility.Natural(testseries.Cumsum(testseries.IID("gauss", 3000, rng)), visibility.Options{})
	a, _ := Louvain(g, LouvainOptions{Rand: rand.New(rand.NewPCG(1, 2))})
	b, _ := Louvain(g, LouvainOptions{Rand: rand.New(rand.NewPCG(1, 2))})
	if !slices.Equal(a.Community, b.Community) || a.Modularity != b.Modularity {
		t.Errorf("Louvain not deterministic for a seed")
	}
	// Ring of 10 cliques of 6 nodes, neighbouring cliques joined by one edge.
	var edges [][2]int32
	const K, S = 10, 6
	for c := 0; c < K; c++ {
		for i := 0; i < S; i++ {
			for j := i + 1; j < S; j++ {
				edges = append(edges, [2]int32{int32(c*S + i), int32(c*S + j)})
			}
		}
		edges = append(edges, [2]int32{int32(c*S + S - 1), int32(((c + 1) % K) * S)})
	}
	rc, err := FromEdges(K*S, edges)
	if err != nil {
		t.Fatal(err)
	}
	p, err := Louvain(rc, LouvainOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if p.Communities != K {
		t.Errorf("ring of cliques: %d communities, want %d", p.Communities, K)
	}
	for c := 0; c < K; c++ {
		for i := 1; i < S; i++ {
			if p.Community[c*S+i] != p.Community[c*S] {
				t.Fatalf("clique %d split", c)
			}
		}
	}
	// Q of the clique partition: per clique L_c = 15, d_c = 32, E = 160:
	// Q = 10·(15/160 − (32/320)²) = 0.8375 (Newman & Girvan 2004 formula).
	if math.Abs(p.Modularity-0.8375) > 1e-12 {
		t.Errorf("ring of cliques Q = %v, want 0.8375", p.Modularity)
	}
}
