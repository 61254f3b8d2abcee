package classifier

import (
	"math/rand/v2"
	"reflect"
	"slices"
	"testing"

	"github.com/sjwhitworth/golearn/base"
)

// rawGrid builds a golearn grid of the rows of ds (raw values) with class
// indices y.
func rawGrid(t *testing.T, gb *gridBuilder, X [][]float64, y []int) *base.DenseInstances {
	t.Helper()
	rows := make([]int32, len(X))
	for i := range rows {
		rows[i] = int32(i)
	}
	g, err := gb.grid(rows, len(X[0]), func(r int32, c int) float64 { return X[r][c] }, y)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// probePoints returns the rows of X plus n uniform points in the bounding
// box of X widened by 10 % on each side.
func probePoints(X [][]float64, n int, seed uint64) [][]float64 {
	p := len(X[0])
	lo, hi := slices.Clone(X[0]), slices.Clone(X[0])
	for _, row := range X {
		for j, v := range row {
			lo[j], hi[j] = min(lo[j], v), max(hi[j], v)
		}
	}
	rng := rand.New(rand.NewPCG(seed, 3))
	out := slices.Clone(X)
	for i := 0; i < n; i++ {
		x := make([]float64, p)
		for j := range x {
			w := hi[j] - lo[j]
			x[j] = lo[j] - 0.1*w + 1.2*w*rng.Float64()
		}
		out = append(out, x)
	}
	return out
}

// TestWalkCARTMatchesGolearn checks the conversion of a fitted golearn CART
// tree into flat nodes: predictCART must give golearn's own Predict answer
// (reference: golearn trees.CARTDecisionTreeClassifier.Predict on the same
// grid) for the training rows and for random probe points.
func TestWalkCARTMatchesGolearn(t *testing.T) {
	iris := loadIris(t)
	classes, y, err := iris.validate()
	if err != nil {
		t.Fatal(err)
	}
	for _, depth := range []int64{-1, 1, 3} {
		gb := newGridBuilder(len(classes))
		fit, err := gb.fitCART(rawGrid(t, gb, iris.X, y), depth)
		if err != nil {
			t.Fatal(err)
		}
		flat, err := walkCART(fit)
		if err != nil {
			t.Fatal(err)
		}
		probes := probePoints(iris.X, 2000, 5)
		want := fit.Predict(rawGrid(t, gb, probes, make([]int, len(probes))))
		for i, x := range probes {
			if got := predictCART(flat, x); int64(got) != want[i] {
				t.Fatalf("depth %d probe %d %v: walked tree says %d, golearn %d", depth, i, x, got, want[i])
			}
		}
		if depth == -1 {
			// Informational: size and training accuracy of golearn's fully
			// grown tree, as golearn itself evaluates it.
			acc, err := fit.Evaluate(rawGrid(t, gb, iris.X, y))
			if err != nil {
				t.Fatal(err)
			}
			t.Logf("golearn full CART on Iris: %d nodes, training accuracy %.4f", len(flat), acc)
		}
	}
}

// TestGolearnDeterministic fits golearn CART twice on the same grid and
// requires identical trees: golearn's CART uses no random numbers, and its
// maps are only used for counting, so the fit is a function of the grid.
func TestGolearnDeterministic(t *testing.T) {
	ds := noisy(400, 6, 3, 2)
	classes, y, err := ds.validate()
	if err != nil {
		t.Fatal(err)
	}
	var trees [2][]cartSplit
	for r := range trees {
		gb := newGridBuilder(len(classes))
		fit, err := gb.fitCART(rawGrid(t, gb, ds.X, y), -1)
		if err != nil {
			t.Fatal(err)
		}
		if trees[r], err = walkCART(fit); err != nil {
			t.Fatal(err)
		}
	}
	if !reflect.DeepEqual(trees[0], trees[1]) {
		t.Fatal("two golearn fits on the same grid differ")
	}
	if len(trees[0]) < 10 {
		t.Fatalf("suspiciously small tree: %d nodes", len(trees[0]))
	}
}

// TestSingleTreeMatchesGolearn grows a one-tree forest with every feature
// considered at every split and compares it with golearn's own CART grown
// in one piece on the same bootstrap sample (same bins): the per-node
// golearn fits and the conversion must reproduce golearn's whole-tree
// predictions exactly (reference: golearn CARTDecisionTreeClassifier.Predict
// on the binned bootstrap grid).
func TestSingleTreeMatchesGolearn(t *testing.T) {
	for _, tc := range []struct {
		name string
		ds   Dataset
		bins int
	}{
		{"iris", loadIris(t), 64},
		{"iris-coarse-bins", loadIris(t), 8},
		{"noisy", noisy(500, 5, 3, 9), 32},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ds := tc.ds
			m, err := Train(ds, Config{Trees: 1, FeatureFraction: 1, Bins: tc.bins, Seed: 42})
			if err != nil {
				t.Fatal(err)
			}
			_, y, _ := ds.validate()
			n, p := len(ds.X), len(ds.Features)
			edges := make([][]float64, p)
			for j := range edges {
				col := make([]float64, n)
				for i := range col {
					col[i] = ds.X[i][j]
				}
				slices.Sort(col)
				edges[j] = quantileEdges(col, tc.bins)
			}
			binned := func(x []float64) []float64 {
				b := make([]float64, p)
				for j := range b {
					b[j] = float64(binOf(edges[j], x[j]))
				}
				return b
			}
			rows, _ := bootstrap(42, 0, n)
			sample := make([][]float64, n)
			sy := make([]int, n)
			for i, r := range rows {
				sample[i] = binned(ds.X[r])
				sy[i] = y[r]
			}
			gb := newGridBuilder(len(m.Classes))
			fit, err := gb.fitCART(rawGrid(t, gb, sample, sy), -1)
			if err != nil {
				t.Fatal(err)
			}
			probes := probePoints(ds.X, 3000, 8)
			bprobes := make([][]float64, len(probes))
			for i, x := range probes {
				bprobes[i] = binned(x)
			}
			want := fit.Predict(rawGrid(t, gb, bprobes, make([]int, len(bprobes))))
			tr := &m.trees[0]
			k := len(m.Classes)
			for i, x := range probes {
				l := tr.leaf(x)
				got := 0
				for c := 1; c < k; c++ {
					if tr.count[l*k+c] > tr.count[l*k+got] {
						got = c
					}
				}
				if int64(got) != want[i] {
					t.Fatalf("probe %d %v: forest tree says %d, golearn %d", i, x, got, want[i])
				}
			}
			flat, _ := walkCART(fit)
			splits := 0
			for _, nd := range tr.nodes {
				if nd.feature >= 0 {
					splits++
				}
			}
			if splits != len(flat) {
				t.Fatalf("forest tree has %d splits, golearn %d", splits, len(flat))
			}
			t.Logf("%d splits agree on %d probes", splits, len(probes))
		})
	}
}
