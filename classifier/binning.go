package classifier

import (
	"math"
	"sort"
)

// quantileEdges returns strictly increasing cut points e_0 < … < e_{m−1},
// m ≤ bins−1, for the sorted sample s; a value x falls in bin
// #{k : e_k ≤ x}. If s has at most bins distinct values every gap between
// neighbouring distinct values gets a cut (lossless); otherwise the cuts sit
// near the k/bins quantiles, k = 1 … bins−1, moved forward past runs of tied
// values so that ties share a bin. Every cut c lies between two neighbouring
// distinct sample values a < b with a < c ≤ b, so "x < c" and "x ≤ a" agree
// on the sample. The caller guarantees that s is sorted and finite.
func quantileEdges(s []float64, bins int) []float64 {
	n := len(s)
	if n == 0 {
		return nil
	}
	distinct := 1
	for i := 1; i < n; i++ {
		if s[i] != s[i-1] {
			distinct++
		}
	}
	var edges []float64
	if distinct <= bins {
		edges = make([]float64, 0, distinct-1)
		for i := 1; i < n; i++ {
			if s[i] != s[i-1] {
				edges = append(edges, cutBetween(s[i-1], s[i]))
			}
		}
		return edges
	}
	edges = make([]float64, 0, bins-1)
	for k := 1; k < bins; k++ {
		pos := k * n / bins
		if pos < 1 {
			pos = 1
		}
		for pos < n && s[pos] == s[pos-1] {
			pos++
		}
		if pos >= n {
			break
		}
		c := cutBetween(s[pos-1], s[pos])
		if len(edges) > 0 && c <= edges[len(edges)-1] {
			continue
		}
		edges = append(edges, c)
	}
	return edges
}

// cutBetween returns a cut point c with a < c ≤ b for finite a < b: the
// midpoint, or b when the midpoint rounds down to a (adjacent floats).
func cutBetween(a, b float64) float64 {
	c := a/2 + b/2
	if !math.IsInf(b-a, 0) {
		c = a + (b-a)/2
	}
	if !(c > a) || c > b {
		c = b
	}
	return c
}

// binOf returns the bin of x for the cut points edges: the number of cuts
// that are ≤ x.
func binOf(edges []float64, x float64) int {
	return sort.Search(len(edges), func(k int) bool { return edges[k] > x })
}
