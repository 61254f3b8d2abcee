package networks

import (
	"math"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// DegreeCount is one bin of a degree distribution: Count nodes have degree K,
// a fraction P of all nodes.
type DegreeCount struct {
	K     int     `json:"k"`
	Count int64   `json:"count"`
	P     float64 `json:"p"`
}

// DegreeStats summarises the degree sequence of a graph.
type DegreeStats struct {
	Nodes int     `json:"nodes"`
	Mean  float64 `json:"mean"` // ⟨k⟩ = 2E/n
	Std   float64 `json:"std"`  // population standard deviation √(⟨k²⟩ − ⟨k⟩²)
	Min   int     `json:"min"`
	Max   int     `json:"max"`
	// Entropy is the Shannon entropy −Σ P(k) ln P(k) of the degree
	// distribution, in nats (Shannon, Bell Syst. Tech. J. 27 (1948) 379).
	Entropy float64 `json:"entropy"`
	// Distribution lists the degrees that occur, ascending, with counts and
	// frequencies P(k).
	Distribution []DegreeCount `json:"distribution"`
}

// MarshalJSON writes the stats with NaN as null.
func (s DegreeStats) MarshalJSON() ([]byte, error) { return jsonsafe.Marshal(s, jsonsafe.Options{}) }

// Degrees returns the degree statistics of g: mean, standard deviation,
// extremes, the Shannon entropy of P(k) in nats and P(k) itself. For an HVG
// of an i.i.d. series P(k) = (1/3)(2/3)^{k−2} and ⟨k⟩ → 4 (Luque et al.,
// Phys. Rev. E 80 (2009) 046103). An empty graph gives NaN moments.
func Degrees(g *Graph) DegreeStats {
	n := g.Len()
	st := DegreeStats{Nodes: n, Mean: math.NaN(), Std: math.NaN(), Entropy: math.NaN()}
	if n == 0 {
		return st
	}
	hist := degreeHistogram(g)
	var s, s2 float64
	st.Min = -1
	for k, c := range hist {
		if c == 0 {
			continue
		}
		if st.Min < 0 {
			st.Min = k
		}
		st.Max = k
		fk := float64(k)
		s += fk * float64(c)
		st.Distribution = append(st.Distribution, DegreeCount{K: k, Count: c, P: float64(c) / float64(n)})
	}
	st.Mean = s / float64(n)
	var h float64
	for _, d := range st.Distribution {
		dk := float64(d.K) - st.Mean
		s2 += dk * dk * float64(d.Count)
		h -= d.P * math.Log(d.P)
	}
	st.Std = math.Sqrt(s2 / float64(n))
	st.Entropy = h
	return st
}

// degreeHistogram returns counts[k] = number of nodes of degree k.
func degreeHistogram(g *Graph) []int64 {
	maxd := 0
	for i := 0; i < g.Len(); i++ {
		maxd = max(maxd, g.Degree(i))
	}
	hist := make([]int64, maxd+1)
	for i := 0; i < g.Len(); i++ {
		hist[g.Degree(i)]++
	}
	return hist
}
