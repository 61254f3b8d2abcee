package ordinal

import (
	"errors"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/tracesift/tracesift/features/ordinal"
	"github.com/tracesift/tracesift/networks"
)

func noise(n int, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 0x6f706e))
	x := make([]float64, n)
	for i := range x {
		x[i] = rng.NormFloat64()
	}
	return x
}

func logistic(n int, x0 float64) []float64 {
	x := make([]float64, n)
	v := x0
	for range 1000 {
		v = 4 * v * (1 - v)
	}
	for i := range x {
		v = 4 * v * (1 - v)
		x[i] = v
	}
	return x
}

// ranks returns the ordinal pattern of w as ranks (0 = smallest; equal
// values ranked by position), computed from the definition.
func ranks(w []float64) []int {
	r := make([]int, len(w))
	for i := range w {
		for j := range w {
			if w[j] < w[i] || (w[j] == w[i] && j < i) {
				r[i]++
			}
		}
	}
	return r
}

// TestIIDTransitions: for i.i.d. noise every one of the d! patterns occurs,
// and with delay 1 every pattern has exactly d successors (the new
// sample's rank among the d − 1 it shares with the next window). The
// transition probabilities follow from the patterns of d + 1 samples: all
// (d+1)! orders of d + 1 i.i.d. values are equally likely, a transition
// π → π' is the set of those orders whose first d samples show π and last
// d show π', and exactly d + 1 orders extend π, so P(π' | π) = c/(d + 1),
// with c the number of (d+1)-orders showing both (1 or 2; counted here by
// enumeration). Checked within 5 binomial standard errors; the d + 1
// orders fall on d successors, one of which gets c = 2 (derived).
func TestIIDTransitions(t *testing.T) {
	for _, d := range []int{3, 4, 5} {
		x := noise(400_000, uint64(d))
		nw, err := Build(x, Options{Order: d})
		if err != nil {
			t.Fatal(err)
		}
		f := factorial(d)
		if nw.Len() != f {
			t.Fatalf("d %d: %d patterns of %d", d, nw.Len(), f)
		}
		// c(π, π') by enumerating the orders of d + 1 values.
		c := map[[2]int]int{}
		perm := make([]float64, d+1)
		var rec func(k int, used uint)
		rec = func(k int, used uint) {
			if k == d+1 {
				a := lehmer(ranks(perm[:d]))
				b := lehmer(ranks(perm[1:]))
				c[[2]int{a, b}]++
				return
			}
			for v := 0; v <= d; v++ {
				if used&(1<<v) == 0 {
					perm[k] = float64(v)
					rec(k+1, used|1<<v)
				}
			}
		}
		rec(0, 0)
		m := nw.Directed()
		if m.Forbidden != 0 || m.Distinct != f*d || m.Admissible != f*d {
			t.Errorf("d %d: distinct %d, admissible %d, forbidden %d; want %d, %d, 0", d, m.Distinct, m.Admissible, m.Forbidden, f*d, f*d)
		}
		for i := 0; i < nw.Len(); i++ {
			js, ws := nw.Successors(i)
			if len(js) != d {
				t.Fatalf("d %d: pattern %d has %d successors, want %d", d, nw.Patterns[i], len(js), d)
			}
			var out int64
			for _, w := range ws {
				out += w
			}
			twos := 0
			for k, j := range js {
				cc := c[[2]int{int(nw.Patterns[i]), int(nw.Patterns[j])}]
				if cc == 0 {
					t.Fatalf("d %d: transition %d → %d seen but not admissible", d, nw.Patterns[i], nw.Patterns[j])
				}
				if cc == 2 {
					twos++
				}
				p := float64(cc) / float64(d+1)
				got := float64(ws[k]) / float64(out)
				if se := math.Sqrt(p * (1 - p) / float64(out)); math.Abs(got-p) > 5*se {
					t.Errorf("d %d: P(%d → %d) = %.4f, want %d/%d = %.4f ± 5·%.4f", d, nw.Patterns[i], nw.Patterns[j], got, cc, d+1, p, se)
				}
			}
			if twos != 1 {
				t.Errorf("d %d: pattern %d has %d successors with c = 2, want 1", d, nw.Patterns[i], twos)
			}
		}
		// With every successor near its probability, the transition
		// entropy is that of (2, 1, …, 1)/(d+1).
		want := -(2.0/float64(d+1))*math.Log(2.0/float64(d+1)) - float64(d-1)/float64(d+1)*math.Log(1.0/float64(d+1))
		if math.Abs(m.TransitionEntropy-want) > 0.01 {
			t.Errorf("d %d: transition entropy %.4f, want %.4f (derived)", d, m.TransitionEntropy, want)
		}
	}
}

// lehmer returns the Lehmer code of a rank vector, as features/ordinal
// encodes windows (c_j = #{k > j : r_k < r_j}).
func lehmer(r []int) int {
	code := 0
	for j := 0; j < len(r)-1; j++ {
		c := 0
		for k := j + 1; k < len(r); k++ {
			if r[k] < r[j] {
				c++
			}
		}
		code = code*(len(r)-j) + c
	}
	return code
}

// TestTransitionsArePatternsOfOneMore: for any series and delay 1, the
// steps π → π' are the windows of d + 1 samples, so the weight of each
// transition is the count of the (d+1)-patterns whose first d samples
// show π and last d show π' (features/ordinal.Patterns at order d + 1,
// mapped by the definition). Checked on chaos, noise and a tied series.
func TestTransitionsArePatternsOfOneMore(t *testing.T) {
	series := map[string][]float64{"logistic": logistic(20000, 0.3), "noise": noise(20000, 9)}
	q := noise(20000, 10)
	for i := range q {
		q[i] = math.Round(q[i] * 2)
	}
	series["quantised"] = q
	for name, x := range series {
		for d := 3; d <= 6; d++ {
			nw, err := Build(x, Options{Order: d})
			if err != nil {
				t.Fatal(err)
			}
			dist, err := ordinal.Patterns(x, ordinal.Options{Order: d + 1})
			if err != nil {
				t.Fatal(err)
			}
			want := map[[2]int32]int64{}
			for code, k := range dist.Counts {
				if k == 0 {
					continue
				}
				r, _ := ordinal.Pattern(code, d+1)
				w := make([]float64, d+1)
				for i, v := range r {
					w[i] = float64(v)
				}
				want[[2]int32{int32(lehmer(ranks(w[:d]))), int32(lehmer(ranks(w[1:])))}] += int64(k)
			}
			got := map[[2]int32]int64{}
			for i := 0; i < nw.Len(); i++ {
				js, ws := nw.Successors(i)
				for k, j := range js {
					got[[2]int32{nw.Patterns[i], nw.Patterns[j]}] = ws[k]
				}
			}
			if len(got) != len(want) {
				t.Fatalf("%s d %d: %d transitions, (d+1)-patterns give %d", name, d, len(got), len(want))
			}
			for k, w := range want {
				if got[k] != w {
					t.Fatalf("%s d %d: transition %v weight %d, (d+1)-pattern count %d", name, d, k, got[k], w)
				}
			}
		}
	}
}

// TestLogisticForbiddenPatterns: the fully chaotic logistic map x' = 4x(1−x)
// has forbidden ordinal patterns (Amigó, Zambrano & Sanjuán, EPL 79 (2007)
// 50001). The first one is at d = 3, the strictly decreasing triple: x1 < x0
// needs x0 > 3/4, and then x1 = 4x0(1 − x0) < 3/4, so x2 > x1 (derived). The
// allowed patterns of each order are also found independently, by scanning
// 2·10^6 starting points on a grid of (0, 1) and taking the pattern of the
// next d − 1 iterates: the network of 10^6 samples sees exactly those.
func TestLogisticForbiddenPatterns(t *testing.T) {
	x := logistic(1_000_000, 0.2345)
	for d := 3; d <= 7; d++ {
		nw, err := Build(x, Options{Order: d})
		if err != nil {
			t.Fatal(err)
		}
		allowed := map[int32]bool{}
		w := make([]float64, d)
		const grid = 2_000_000
		for g := 1; g < grid; g++ {
			v := float64(g) / grid
			for k := range w {
				w[k] = v
				v = 4 * v * (1 - v)
			}
			allowed[int32(lehmer(ranks(w)))] = true
		}
		var want []int32
		for c := range allowed {
			want = append(want, c)
		}
		slices.Sort(want)
		m := nw.Directed()
		t.Logf("d %d: %d of %d patterns seen (%d forbidden); grid scan allows %d", d, m.Patterns, m.Possible, m.Possible-m.Patterns, len(want))
		if !slices.Equal(nw.Patterns, want) {
			t.Errorf("d %d: the network sees %d patterns, the grid scan allows %d", d, len(nw.Patterns), len(want))
		}
		if d == 3 && (m.Patterns != 5 || slices.Contains(nw.Patterns, 5)) {
			t.Errorf("d 3: patterns %v, want all but the strictly decreasing one (code 5)", nw.Patterns)
		}
		if m.Patterns == m.Possible {
			t.Errorf("d %d: no forbidden pattern", d)
		}
	}
}

// TestSelfLoopsAndDegrees: a monotone series has one pattern repeating
// (self-loop fraction 1, one node, an empty undirected graph); the
// out-degree distribution covers every node; the undirected graph links
// exactly the pairs with a transition either way.
func TestSelfLoopsAndDegrees(t *testing.T) {
	up := make([]float64, 100)
	for i := range up {
		up[i] = float64(i)
	}
	nw, err := Build(up, Options{Order: 4})
	if err != nil {
		t.Fatal(err)
	}
	m := nw.Directed()
	if nw.Len() != 1 || m.SelfLoopFraction != 1 || nw.Graph.Edges() != 0 || m.Transitions != 96 {
		t.Errorf("monotone: %d nodes, self-loop fraction %g, %d edges, %d transitions", nw.Len(), m.SelfLoopFraction, nw.Graph.Edges(), m.Transitions)
	}
	x := make([]float64, 5000)
	for i := range x {
		x[i] = math.Sin(float64(i) * 0.05)
	}
	nw, err = Build(x, Options{Order: 5, Delay: 3})
	if err != nil {
		t.Fatal(err)
	}
	if err := nw.Graph.Check(); err != nil {
		t.Fatal(err)
	}
	m = nw.Directed()
	var nodes int64
	for _, dc := range m.OutDegree {
		nodes += dc.Count
	}
	if nodes != int64(nw.Len()) || m.SelfLoopFraction < 0.8 {
		t.Errorf("slow sine: out-degree histogram covers %d of %d nodes; self-loop fraction %.3f, want > 0.8", nodes, nw.Len(), m.SelfLoopFraction)
	}
	for i := 0; i < nw.Len(); i++ {
		for j := 0; j < nw.Len(); j++ {
			a, _ := nw.Successors(i)
			b, _ := nw.Successors(j)
			want := i != j && (slices.Contains(a, int32(j)) || slices.Contains(b, int32(i)))
			if nw.Graph.HasEdge(i, j) != want {
				t.Fatalf("undirected edge %d–%d: %v, want %v", i, j, nw.Graph.HasEdge(i, j), want)
			}
		}
	}
}

func TestBuildErrors(t *testing.T) {
	if _, err := Build(noise(100, 1), Options{Order: 9}); !errors.Is(err, ErrBadOption) {
		t.Errorf("order 9: %v", err)
	}
	if _, err := Build([]float64{1, 2, 3}, Options{Order: 3}); !errors.Is(err, networks.ErrEmpty) {
		t.Errorf("one window: %v", err)
	}
	if _, err := Build([]float64{1, math.Inf(1), 2, 3, 4}, Options{Order: 3}); !errors.Is(err, networks.ErrNonFinite) {
		t.Errorf("Inf: %v", err)
	}
}
