package networks_test

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"encoding/xml"
	"errors"
	"io"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// TestWriteEdgeList: the CSV has the header and every edge once, i < j,
// and reads back into the same graph.
func TestWriteEdgeList(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	g, _ := visibility.Natural(testseries.IID("gauss", 500, rng), visibility.Options{})
	var buf bytes.Buffer
	if err := WriteEdgeList(&buf, g); err != nil {
		t.Fatal(err)
	}
	recs, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if recs[0][0] != "source" || recs[0][1] != "target" {
		t.Fatalf("header %v", recs[0])
	}
	var edges [][2]int32
	for _, r := range recs[1:] {
		a, _ := strconv.Atoi(r[0])
		b, _ := strconv.Atoi(r[1])
		if a >= b {
			t.Fatalf("edge %v not source < target", r)
		}
		edges = append(edges, [2]int32{int32(a), int32(b)})
	}
	h, err := FromEdges(g.Len(), edges)
	if err != nil {
		t.Fatal(err)
	}
	if int64(len(edges)) != g.Edges() || h.Edges() != g.Edges() {
		t.Fatalf("%d lines, %d edges", len(edges), g.Edges())
	}
	for i := 0; i < g.Len(); i++ {
		if !slicesEqual32(h.Neighbors(i), g.Neighbors(i)) {
			t.Fatalf("node %d differs after round trip", i)
		}
	}
}

func slicesEqual32(a, b []int32) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// TestWriteGraphML: the output is well-formed XML (encoding/xml decodes it),
// undirected, with nodes n0.. and the node values.
func TestWriteGraphML(t *testing.T) {
	x := []float64{3, 1, 2, math.Inf(1), 0.5}
	x[3] = 4
	g, _ := visibility.Natural(x, visibility.Options{})
	var buf bytes.Buffer
	if err := WriteGraphML(&buf, g, x); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		XMLName xml.Name `xml:"graphml"`
		Keys    []struct {
			ID string `xml:"id,attr"`
		} `xml:"key"`
		Graph struct {
			EdgeDefault string `xml:"edgedefault,attr"`
			Nodes       []struct {
				ID   string `xml:"id,attr"`
				Data string `xml:"data"`
			} `xml:"node"`
			Edges []struct {
				Source string `xml:"source,attr"`
				Target string `xml:"target,attr"`
			} `xml:"edge"`
		} `xml:"graph"`
	}
	if err := xml.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatalf("not well-formed: %v\n%s", err, buf.String())
	}
	if doc.Graph.EdgeDefault != "undirected" || len(doc.Graph.Nodes) != 5 || int64(len(doc.Graph.Edges)) != g.Edges() {
		t.Fatalf("graphml: %+v", doc.Graph)
	}
	for i, nd := range doc.Graph.Nodes {
		v, _ := strconv.ParseFloat(nd.Data, 64)
		if nd.ID != "n"+strconv.Itoa(i) || v != x[i] {
			t.Errorf("node %d: %+v", i, nd)
		}
	}
	for _, e := range doc.Graph.Edges {
		a, _ := strconv.Atoi(strings.TrimPrefix(e.Source, "n"))
		b, _ := strconv.Atoi(strings.TrimPrefix(e.Target, "n"))
		if !g.HasEdge(a, b) {
			t.Errorf("edge %v not in graph", e)
		}
	}
	if err := WriteGraphML(io.Discard, g, x[:2]); err == nil {
		t.Error("wrong number of values accepted")
	}
	// Without values: no key, still well-formed.
	buf.Reset()
	if err := WriteGraphML(&buf, g, nil); err != nil {
		t.Fatal(err)
	}
	if err := xml.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	// Write errors surface.
	if err := WriteEdgeList(failWriter{}, g); err == nil {
		t.Error("write error swallowed")
	}
}

type failWriter struct{}

func (failWriter) Write([]byte) (int, error) { return 0, errors.New("disk full") }

// TestMetricsJSON: Measure's result encodes with the documented snake_case
// keys, NaN as null, and decodes with encoding/json.
func TestMetricsJSON(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 2))
	g, _ := visibility.Horizontal(testseries.IID("gauss", 3000, rng), visibility.Options{})
	m, err := Measure(g, MeasureOptions{NoCommunities: true})
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(m)
	if err != nil {
		t.Fatal(err)
	}
	var obj map[string]any
	if err := json.Unmarshal(b, &obj); err != nil {
		t.Fatalf("%v\n%s", err, b)
	}
	for _, k := range []string{"kind", "nodes", "edges", "mean_degree", "lambda", "gamma", "clustering_mean",
		"assortativity", "modularity", "communities", "avg_path_length", "diameter", "local_dimension",
		"irreversibility_kld", "degree", "tail", "clustering", "paths", "dimension", "irreversibility"} {
		if _, ok := obj[k]; !ok {
			t.Errorf("key %q missing", k)
		}
	}
	if obj["modularity"] != nil {
		t.Errorf("modularity with communities off = %v, want null", obj["modularity"])
	}
	if _, ok := obj["partition"]; ok {
		t.Errorf("partition present with communities off")
	}
	if obj["kind"] != "hvg" || obj["mean_degree"].(float64) != m.MeanDegree {
		t.Errorf("kind/mean_degree: %v %v", obj["kind"], obj["mean_degree"])
	}
	// Same seed ⇒ identical output.
	m2, _ := Measure(g, MeasureOptions{NoCommunities: true})
	b2, _ := json.Marshal(m2)
	if !bytes.Equal(b, b2) {
		t.Error("Measure not deterministic")
	}
}

// TestPathsSampled: on a graph above ExactMax the sampled estimate is close
// to the exact value (computed with ExactMax raised) within 5 of its
// standard errors, and the sampled diameter is a lower bound.
func TestPathsSampled(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 3))
	g, _ := visibility.Natural(testseries.Cumsum(testseries.IID("gauss", 4000, rng)), visibility.Options{})
	exact, err := Paths(g, PathOptions{ExactMax: 5000})
	if err != nil {
		t.Fatal(err)
	}
	est, err := Paths(g, PathOptions{Rand: rand.New(rand.NewPCG(4, 4))})
	if err != nil {
		t.Fatal(err)
	}
	if est.Exact || est.Sources != DefaultSources || !exact.Exact {
		t.Fatalf("exact flags: %+v %+v", est, exact)
	}
	if math.Abs(est.AvgPathLength-exact.AvgPathLength) > 5*est.StdErr {
		t.Errorf("sampled %.4f ± %.4f, exact %.4f", est.AvgPathLength, est.StdErr, exact.AvgPathLength)
	}
	if est.Diameter > exact.Diameter {
		t.Errorf("sampled diameter %d exceeds exact %d", est.Diameter, exact.Diameter)
	}
	t.Logf("avg path exact %.4f, sampled %.4f ± %.4f; diameter %d, sampled bound %d",
		exact.AvgPathLength, est.AvgPathLength, est.StdErr, exact.Diameter, est.Diameter)
}

// TestLocalDimension: analytic cases where every node has the same ball
// sizes. A ring of n nodes has N(r) = 2r + 1, a 40×40 torus (4-neighbour)
// N(r) = 2r² + 2r + 1 for r ≤ 19; the expected value is the least-squares
// slope of ln N(r) on ln r over r = 1..R with R the largest r with
// N(r) ≤ n/2 (the documented range), computed here from the formula. They
// tend to 1 and 2 as R grows. The NVG of a concave sequence is a path
// (checked), whose interior nodes grow like the ring.
func TestLocalDimension(t *testing.T) {
	want := func(nr func(r int) float64, n int) float64 {
		var xs, ys, ws []float64
		for r := 1; nr(r) <= float64(n)/2; r++ {
			xs = append(xs, math.Log(float64(r)))
			ys = append(ys, math.Log(nr(r)))
			ws = append(ws, 1)
		}
		s, _, _ := WeightedLine(xs, ys, ws)
		return s
	}
	const nRing = 1001
	var edges [][2]int32
	for i := 0; i < nRing; i++ {
		edges = append(edges, [2]int32{int32(i), int32((i + 1) % nRing)})
	}
	ring, _ := FromEdges(nRing, edges)
	d, err := LocalDimension(ring, PathOptions{})
	if err != nil {
		t.Fatal(err)
	}
	wr := want(func(r int) float64 { return float64(2*r + 1) }, nRing)
	if math.Abs(d.Mean-wr) > 1e-12 || d.Nodes != nRing {
		t.Errorf("ring: dimension %.6f over %d nodes, want %.6f", d.Mean, d.Nodes, wr)
	}
	const L = 40
	edges = edges[:0]
	for i := 0; i < L; i++ {
		for j := 0; j < L; j++ {
			edges = append(edges, [2]int32{int32(i*L + j), int32(((i+1)%L)*L + j)})
			edges = append(edges, [2]int32{int32(i*L + j), int32(i*L + (j+1)%L)})
		}
	}
	torus, _ := FromEdges(L*L, edges)
	dt, err := LocalDimension(torus, PathOptions{})
	if err != nil {
		t.Fatal(err)
	}
	wt := want(func(r int) float64 { return float64(2*r*r + 2*r + 1) }, L*L)
	if math.Abs(dt.Mean-wt) > 1e-12 {
		t.Errorf("torus: dimension %.6f, want %.6f", dt.Mean, wt)
	}
	t.Logf("local dimension: ring %.4f (R %.0f), torus %.4f (R %.0f)", d.Mean, d.MeanRMax, dt.Mean, dt.MeanRMax)
	x := make([]float64, 1001)
	for i := range x {
		x[i] = math.Sqrt(float64(i))
	}
	path, _ := visibility.Natural(x, visibility.Options{})
	if path.Edges() != 1000 {
		t.Fatalf("NVG of a concave sequence should be a path, %d edges", path.Edges())
	}
}
