package networks_test

import (
	"errors"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	. "github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

// Windows covers 0..n−1 with consecutive windows of lengths that differ by
// at most one, never exceed the length asked for and hold at least half of
// it when there is more than one (the rule in its doc comment).
func TestWindows(t *testing.T) {
	for n := 1; n <= 300; n++ {
		for _, length := range []int{-1, 0, 1, 2, 3, 7, 10, 64, 299, 300, 301} {
			ws := Windows(n, length)
			if length <= 0 || n <= length {
				if len(ws) != 1 || ws[0] != (Window{0, n}) {
					t.Fatalf("n=%d length=%d: %v, want one window of the whole", n, length, ws)
				}
				continue
			}
			if want := (n + length - 1) / length; len(ws) != want {
				t.Fatalf("n=%d length=%d: %d windows, want ⌈n/length⌉ = %d", n, length, len(ws), want)
			}
			lo, hi := n, 0
			for i, w := range ws {
				if i == 0 && w.Start != 0 || i > 0 && w.Start != ws[i-1].End {
					t.Fatalf("n=%d length=%d: windows %v are not consecutive from 0", n, length, ws)
				}
				lo, hi = min(lo, w.Len()), max(hi, w.Len())
			}
			if ws[len(ws)-1].End != n || hi-lo > 1 || hi > length || 2*lo < length {
				t.Fatalf("n=%d length=%d: windows %v (lengths %d–%d)", n, length, ws, lo, hi)
			}
		}
	}
	if ws := Windows(0, 10); ws != nil {
		t.Errorf("n = 0: %v, want none", ws)
	}
}

func iid(n int, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 1))
	x := make([]float64, n)
	for i := range x {
		x[i] = rng.Float64()
	}
	return x
}

// With one window, MeasureWindows is Build + Measure with the same seed.
func TestMeasureWindowsOneWindowIsTheWholeGraph(t *testing.T) {
	x := iid(3000, 2)
	mo := MeasureOptions{Sources: 16, Seed: 5}
	g, err := visibility.Natural(x, visibility.Options{})
	if err != nil {
		t.Fatal(err)
	}
	want, _ := Measure(g, mo)
	w, err := MeasureWindows(x, WindowOptions{Kind: KindNVG, Build: visibility.Builder(KindNVG, visibility.Options{}), Length: 3000, Measure: mo})
	if err != nil {
		t.Fatal(err)
	}
	if len(w.Windows) != 1 {
		t.Fatalf("%d windows, want 1", len(w.Windows))
	}
	got := w.Windows[0].Metrics.Headline()
	for i, v := range want.Headline() {
		if math.Float64bits(v) != math.Float64bits(got[i]) {
			t.Errorf("%s: %v, whole graph %v", SummaryMetrics()[i], got[i], v)
		}
	}
	for _, d := range w.Summary {
		if d.Defined == 1 && !math.IsNaN(d.SD) {
			t.Errorf("%s: SD %v over one window, want NaN", d.Metric, d.SD)
		}
	}
}

// Each window's graph is the graph of its stretch, and the summary is the
// distribution of the per-window values. On i.i.d. data each window's HVG
// has mean degree 4(1 − H_n/n) on average, H_n the n-th harmonic number:
// two samples d apart see each other iff they are the two largest of the
// d + 1 samples from one to the other, with probability 2/(d(d+1)) by
// exchangeability, and Σ_d (n − d)·2/(d(d+1)) = 2(n − H_n) edges (analytic;
// the limit 4 is Luque et al., Phys. Rev. E 80 (2009) 046103). At n = 5000
// that is 3.99272; windows scatter about it by 7·10^-4 (measured), so each
// must lie within 0.003 of it.
func TestMeasureWindowsPerWindow(t *testing.T) {
	x := iid(20000, 3)
	var calls []int
	w, err := MeasureWindows(x, WindowOptions{Kind: KindHVG, Build: visibility.Builder(KindHVG, visibility.Options{}), Length: 5000, Measure: MeasureOptions{NoPaths: true},
		Progress: func(done, total int) {
			if total != 4 {
				t.Errorf("progress total %d, want 4", total)
			}
			calls = append(calls, done)
		}})
	if err != nil {
		t.Fatal(err)
	}
	if len(w.Windows) != 4 || !slices.Equal(calls, []int{1, 2, 3, 4}) {
		t.Fatalf("%d windows, progress %v; want 4 windows reported in order", len(w.Windows), calls)
	}
	var degs []float64
	for _, wm := range w.Windows {
		g, err := visibility.Horizontal(x[wm.Start:wm.End], visibility.Options{})
		if err != nil {
			t.Fatal(err)
		}
		if wm.Metrics.Edges != g.Edges() || wm.Metrics.Nodes != 5000 {
			t.Errorf("window %v: %d nodes, %d edges; its own HVG has 5000, %d", wm.Window, wm.Metrics.Nodes, wm.Metrics.Edges, g.Edges())
		}
		degs = append(degs, wm.Metrics.MeanDegree)
	}
	d, ok := w.Metric("mean_degree")
	if !ok {
		t.Fatal("no mean_degree in the summary")
	}
	mean := (degs[0] + degs[1] + degs[2] + degs[3]) / 4
	var ss float64
	for _, v := range degs {
		ss += (v - mean) * (v - mean)
	}
	slices.Sort(degs)
	if d.Defined != 4 || math.Abs(d.Mean-mean) > 1e-12 || math.Abs(d.SD-math.Sqrt(ss/3)) > 1e-12 ||
		d.Min != degs[0] || d.Max != degs[3] || d.Median != (degs[1]+degs[2])/2 {
		t.Errorf("mean_degree summary %+v, per-window values %v", d, degs)
	}
	var harmonic float64
	for k := 1; k <= 5000; k++ {
		harmonic += 1 / float64(k)
	}
	want := 4 * (1 - harmonic/5000)
	if d.Min < want-0.003 || d.Max > want+0.003 {
		t.Errorf("i.i.d. HVG mean degrees %v…%v over windows, want %v ± 0.003", d.Min, d.Max, want)
	}
}

// A window past the edge budget stops the work with an error that names
// the window and carries the budget.
func TestMeasureWindowsEdgeBudget(t *testing.T) {
	x := make([]float64, 3000)
	for i := range x {
		// Convex: every pair of samples sees each other, n(n−1)/2 edges
		// (Lacasa et al., PNAS 105 (2008) 4972).
		x[i] = float64(i) * float64(i)
	}
	_, err := MeasureWindows(x, WindowOptions{Kind: KindNVG, Build: visibility.Builder(KindNVG, visibility.Options{MaxEdges: 10000}), Length: 1000})
	var eb *EdgeBudgetError
	if !errors.As(err, &eb) || !errors.Is(err, ErrTooManyEdges) || eb.Nodes != 1000 || eb.Budget != 10000 || !strings.Contains(err.Error(), "window 1 of 3") {
		t.Fatalf("err %v, want the budget error of window 1 of 3 (1000 nodes, budget 10000)", err)
	}
	if !strings.Contains(err.Error(), "Options.MaxEdges") {
		t.Errorf("err %q does not name Options.MaxEdges", err)
	}
	if _, err := MeasureWindows(x, WindowOptions{Kind: KindNVG, Build: visibility.Builder(KindNVG, visibility.Options{MaxEdges: 499500}), Length: 1000, Measure: MeasureOptions{NoPaths: true, NoCommunities: true}}); err != nil {
		t.Errorf("budget n(n−1)/2 = 499500 for windows of 1000: %v", err)
	}
}
