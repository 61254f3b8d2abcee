package groups

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"sort"
)

// checkFinite returns ErrEmpty for an empty x and ErrNotFinite if x holds a
// NaN or an infinity; what names the sample in the error.
func checkFinite(what string, x []float64) error {
	if len(x) == 0 {
		return fmt.Errorf("%s: %w", what, ErrEmpty)
	}
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("%s[%d] = %v: %w", what, i, v, ErrNotFinite)
		}
	}
	return nil
}

// sortedCopy returns x sorted ascending in a new slice.
func sortedCopy(x []float64) []float64 {
	s := append([]float64(nil), x...)
	sort.Float64s(s)
	return s
}

// midRanks returns the ranks of x (1-based) with ties given the mean of the
// ranks they span ("mid-ranks", the convention of Kendall's and
// Mann–Whitney's tie treatment and of scipy.stats.rankdata's default), and
// Σ(t³ − t) over the tie groups of size t, the term of the tie-corrected
// variance of rank statistics.
func midRanks(x []float64) (ranks []float64, tieTerm float64) {
	n := len(x)
	type vi struct {
		v float64
		i int
	}
	idx := make([]vi, n)
	for i, v := range x {
		idx[i] = vi{v, i}
	}
	slices.SortFunc(idx, func(a, b vi) int {
		if c := cmp.Compare(a.v, b.v); c != 0 {
			return c
		}
		return cmp.Compare(a.i, b.i)
	})
	ranks = make([]float64, n)
	for i := 0; i < n; {
		j := i + 1
		for j < n && idx[j].v == idx[i].v {
			j++
		}
		r := float64(i+j+1) / 2 // mean of ranks i+1 … j
		for k := i; k < j; k++ {
			ranks[idx[k].i] = r
		}
		if t := float64(j - i); t > 1 {
			tieTerm += t*t*t - t
		}
		i = j
	}
	return ranks, tieTerm
}
