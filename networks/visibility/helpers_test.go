package visibility

import (
	"math"

	"github.com/tracesift/tracesift/networks"
)

// meanStd returns the mean and sample standard deviation of v.
func meanStd(v []float64) (float64, float64) {
	var s float64
	for _, x := range v {
		s += x
	}
	m := s / float64(len(v))
	var s2 float64
	for _, x := range v {
		s2 += (x - m) * (x - m)
	}
	return m, math.Sqrt(s2 / float64(len(v)-1))
}

// degreeHistogram returns the number of nodes of each degree 0..max.
func degreeHistogram(g *networks.Graph) []int64 {
	var hist []int64
	for i := 0; i < g.Len(); i++ {
		for g.Degree(i) >= len(hist) {
			hist = append(hist, 0)
		}
		hist[g.Degree(i)]++
	}
	return hist
}
