package classifier

import (
	"math"
	"slices"
	"testing"
)

func TestQuantileEdges(t *testing.T) {
	tests := []struct {
		name string
		s    []float64
		bins int
		want []float64 // nil: check properties only
	}{
		// Few distinct values: one cut midway between each neighbour pair.
		{"lossless", []float64{1, 1, 2, 4, 4, 4}, 8, []float64{1.5, 3}},
		{"constant", []float64{5, 5, 5}, 4, []float64{}},
		{"single", []float64{5}, 4, []float64{}},
		// 8 distinct values into 4 bins: cuts at ranks 2, 4, 6 (k·n/bins).
		{"quantiles", []float64{0, 1, 2, 3, 4, 5, 6, 7}, 4, []float64{1.5, 3.5, 5.5}},
		// A tie run spanning a quantile position moves the cut past it.
		{"ties", []float64{0, 1, 1, 1, 1, 1, 2, 3, 4}, 3, nil},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			e := quantileEdges(tc.s, tc.bins)
			if tc.want != nil && !slices.Equal(e, tc.want) && !(len(e) == 0 && len(tc.want) == 0) {
				t.Fatalf("edges %v, want %v", e, tc.want)
			}
			checkEdges(t, tc.s, e, tc.bins)
		})
	}
}

// checkEdges verifies the documented properties: strictly increasing, at
// most bins−1 cuts, each cut c between neighbouring distinct sample values
// a < c ≤ b, and tied values in the same bin.
func checkEdges(t *testing.T, s, e []float64, bins int) {
	t.Helper()
	if len(e) > bins-1 {
		t.Fatalf("%d cuts for %d bins", len(e), bins)
	}
	for k := 1; k < len(e); k++ {
		if !(e[k] > e[k-1]) {
			t.Fatalf("cuts not increasing: %v", e)
		}
	}
	for _, c := range e {
		i, _ := slices.BinarySearch(s, c) // first value ≥ c
		if i == 0 || i == len(s) {
			t.Fatalf("cut %v outside the sample", c)
		}
		if !(s[i-1] < c && c <= s[i]) {
			t.Fatalf("cut %v not between neighbours %v and %v", c, s[i-1], s[i])
		}
	}
	for i := 1; i < len(s); i++ {
		if s[i] == s[i-1] && binOf(e, s[i]) != binOf(e, s[i-1]) {
			t.Fatalf("tied values %v in different bins", s[i])
		}
	}
}

func TestCutBetweenAdjacentFloats(t *testing.T) {
	// For adjacent floats the midpoint rounds to one of them; the cut must
	// still satisfy a < c ≤ b so that "x < c" separates a from b.
	a := 1.0
	b := math.Nextafter(a, 2)
	c := cutBetween(a, b)
	if !(a < c && c <= b) {
		t.Fatalf("cut %v not in (%v, %v]", c, a, b)
	}
	big := cutBetween(-math.MaxFloat64, math.MaxFloat64) // b−a overflows
	if !(big > -math.MaxFloat64 && big <= math.MaxFloat64) {
		t.Fatalf("overflow cut %v", big)
	}
}
