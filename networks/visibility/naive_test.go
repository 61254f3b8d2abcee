package visibility

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/tracesift/tracesift/networks/internal/testseries"

	"github.com/tracesift/tracesift/networks"
)

// naiveBelow reports whether (c, x_c) lies strictly below the line through
// (a, x_a) and (b, x_b), a < c < b: (x_b − x_a)(c − a) − (x_c − x_a)(b − a) > 0.
// It is written independently of crossSign (anchored at a, not at the apex,
// with a crude float filter and an exact big.Rat fallback) so that the
// reference does not share the package's predicate.
func naiveBelow(x []float64, a, c, b int) bool {
	lhs := (x[b] - x[a]) * float64(c-a)
	rhs := (x[c] - x[a]) * float64(b-a)
	scale := math.Abs(lhs) + math.Abs(rhs)
	if d := lhs - rhs; math.Abs(d) > 1e-9*scale && scale > 1e-200 && !math.IsInf(scale, 0) {
		return d > 0
	}
	r := func(v float64) *big.Rat { return new(big.Rat).SetFloat64(v) }
	ri := func(v int) *big.Rat { return new(big.Rat).SetInt64(int64(v)) }
	l := new(big.Rat).Sub(r(x[b]), r(x[a]))
	l.Mul(l, ri(c-a))
	rr := new(big.Rat).Sub(r(x[c]), r(x[a]))
	rr.Mul(rr, ri(b-a))
	return l.Cmp(rr) > 0
}

// naiveNatural is the O(n³) reference: test every pair against every sample
// between (Lacasa et al., PNAS 105 (2008) 4972, the definition verbatim).
func naiveNatural(x []float64) [][]int32 {
	n := len(x)
	adj := make([][]int32, n)
	for a := 0; a < n; a++ {
		for b := a + 1; b < n; b++ {
			ok := true
			for c := a + 1; c < b; c++ {
				if !naiveBelow(x, a, c, b) {
					ok = false
					break
				}
			}
			if ok {
				adj[a] = append(adj[a], int32(b))
				adj[b] = append(adj[b], int32(a))
			}
		}
	}
	for i := range adj {
		slices.Sort(adj[i])
	}
	return adj
}

// naiveHorizontal is the O(n³) reference for the HVG definition (Luque et
// al., Phys. Rev. E 80 (2009) 046103): every sample between is strictly lower
// than both ends.
func naiveHorizontal(x []float64) [][]int32 {
	n := len(x)
	adj := make([][]int32, n)
	for a := 0; a < n; a++ {
		for b := a + 1; b < n; b++ {
			lim := math.Min(x[a], x[b])
			ok := true
			for c := a + 1; c < b; c++ {
				if !(x[c] < lim) {
					ok = false
					break
				}
			}
			if ok {
				adj[a] = append(adj[a], int32(b))
				adj[b] = append(adj[b], int32(a))
			}
		}
	}
	for i := range adj {
		slices.Sort(adj[i])
	}
	return adj
}

// sameGraph returns an error describing the first difference between g and
// the reference adjacency, including the in/out split.
func sameGraph(g *networks.Graph, ref [][]int32) error {
	if g.Len() != len(ref) {
		return fmt.Errorf("n = %d, want %d", g.Len(), len(ref))
	}
	var e int64
	for i := range ref {
		if !slices.Equal(g.Neighbors(i), ref[i]) {
			return fmt.Errorf("node %d: neighbours %v, want %v", i, g.Neighbors(i), ref[i])
		}
		in := 0
		for _, j := range ref[i] {
			if int(j) < i {
				in++
			}
		}
		if g.InDegree(i) != in || g.OutDegree(i) != len(ref[i])-in {
			return fmt.Errorf("node %d: in/out %d/%d, want %d/%d", i, g.InDegree(i), g.OutDegree(i), in, len(ref[i])-in)
		}
		e += int64(len(ref[i]))
	}
	if g.Edges() != e/2 {
		return fmt.Errorf("edges %d, want %d", g.Edges(), e/2)
	}
	return nil
}

// TestNaturalMatchesNaive: the divide-and-conquer NVG equals the O(n³)
// definition on 3000 varied series (Lacasa et al. 2008 definition; Lan et al.
// 2015 algorithm).
func TestNaturalMatchesNaive(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	names, series := testseries.Varied(rng, 3000)
	for k, x := range series {
		g, err := Natural(x, Options{})
		if err != nil {
			t.Fatalf("%s: %v", names[k], err)
		}
		if err := sameGraph(g, naiveNatural(x)); err != nil {
			t.Fatalf("%s: %v\nseries %v", names[k], err, x)
		}
	}
}

// TestNaturalRayShootingMatchesNaive forces each path of the sweep in turn:
// hull ray shooting from the first fruitless step on, a hull probe after
// every fruitless step with the walk going on, and the plain walk only, so
// that all three are checked against the definition on the whole corpus,
// plus longer monotone and trending series.
func TestNaturalRayShootingMatchesNaive(t *testing.T) {
	defer func(b, p, g int) { switchBase, switchPer, switchGap = b, p, g }(switchBase, switchPer, switchGap)
	rng := rand.New(rand.NewPCG(7, 8))
	names, series := testseries.Varied(rng, 1200)
	for _, tr := range []struct{ a, b float64 }{{0.3, 1}, {-0.05, 1}, {1, 0}} {
		x := make([]float64, 600)
		for i := range x {
			x[i] = tr.a*float64(i) + tr.b*rng.NormFloat64() + math.Sqrt(float64(i))*tr.b
		}
		names = append(names, fmt.Sprintf("trend%.2f", tr.a))
		series = append(series, x)
	}
	for _, mode := range []struct{ base, per, gap int }{{0, 0, 0}, {1 << 30, 0, 0}, {1 << 30, 0, 1 << 30}} {
		switchBase, switchPer, switchGap = mode.base, mode.per, mode.gap
		for k, x := range series {
			g, err := Natural(x, Options{})
			if err != nil {
				t.Fatalf("%s: %v", names[k], err)
			}
			if err := sameGraph(g, naiveNatural(x)); err != nil {
				t.Fatalf("switch %v, %s: %v\nseries %v", mode, names[k], err, x)
			}
		}
	}
}

// TestHorizontalMatchesNaive: the stack HVG equals the O(n³) definition
// (Luque et al. 2009) on the same 3000 series.
func TestHorizontalMatchesNaive(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	names, series := testseries.Varied(rng, 3000)
	for k, x := range series {
		g, err := Horizontal(x, Options{})
		if err != nil {
			t.Fatalf("%s: %v", names[k], err)
		}
		if err := sameGraph(g, naiveHorizontal(x)); err != nil {
			t.Fatalf("%s: %v\nseries %v", names[k], err, x)
		}
	}
}

// FuzzNatural checks both builders against the definitions on arbitrary
// byte-derived series (small integers give ties and collinear points).
func FuzzNatural(f *testing.F) {
	f.Add([]byte{1, 2, 3, 2, 1})
	f.Add([]byte{0, 0, 0, 5, 0, 0})
	f.Add([]byte{9, 1, 9, 1, 9, 3, 3, 3})
	f.Fuzz(func(t *testing.T, b []byte) {
		if len(b) == 0 || len(b) > 200 {
			return
		}
		x := make([]float64, len(b))
		for i, v := range b {
			x[i] = float64(v%32) - 7.5
		}
		g, err := Natural(x, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if err := sameGraph(g, naiveNatural(x)); err != nil {
			t.Fatalf("nvg %v: %v", x, err)
		}
		h, err := Horizontal(x, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if err := sameGraph(h, naiveHorizontal(x)); err != nil {
			t.Fatalf("hvg %v: %v", x, err)
		}
	})
}
