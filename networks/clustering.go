package networks

import (
	"math"
	"slices"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// LocalClustering returns the local clustering coefficient of every node,
// C_i = 2·T_i/(k_i(k_i − 1)) with T_i the triangles through i (Watts &
// Strogatz, Nature 393 (1998) 440); C_i = 0 when k_i < 2 (the NetworkX
// convention).
func LocalClustering(g *Graph) []float64 {
	t := Triangles(g)
	c := make([]float64, len(t))
	for i := range t {
		k := float64(g.Degree(i))
		if k >= 2 {
			c[i] = 2 * float64(t[i]) / (k * (k - 1))
		}
	}
	return c
}

// ClusteringBin is one bin [Lo, Hi) of the histogram of local clustering
// values (the last bin includes 1).
type ClusteringBin struct {
	Lo    float64 `json:"lo"`
	Hi    float64 `json:"hi"`
	Count int64   `json:"count"`
}

// ClusteringByDegree is the mean local clustering C(k) of the Count nodes of
// degree K.
type ClusteringByDegree struct {
	K     int     `json:"k"`
	Count int64   `json:"count"`
	Mean  float64 `json:"mean"`
}

// ClusteringStats summarises local clustering over all nodes.
type ClusteringStats struct {
	// Mean is the average local clustering over all n nodes, nodes of degree
	// < 2 counting as 0 (NetworkX average_clustering). For an i.i.d. HVG it
	// tends to Σ_k P(k)·2/k = (2/3)(9/4)(ln 3 − 2/3) ≈ 0.6479.
	Mean float64 `json:"mean"`
	Std  float64 `json:"std"` // population standard deviation over nodes
	// Transitivity is the global clustering 3·triangles/connected triples.
	Transitivity float64 `json:"transitivity"`
	Triangles    int64   `json:"triangles"`
	// Histogram has 20 equal bins on [0, 1].
	Histogram []ClusteringBin `json:"histogram"`
	// ByDegree is C(k); C(k) = 2/k for an HVG (Luque et al. 2009).
	ByDegree []ClusteringByDegree `json:"by_degree"`
}

// MarshalJSON writes the stats with NaN as null.
func (s ClusteringStats) MarshalJSON() ([]byte, error) {
	return jsonsafe.Marshal(s, jsonsafe.Options{})
}

// clusteringBins is the number of histogram bins of ClusteringStats.
const clusteringBins = 20

// Clustering returns the local clustering coefficients of g (see
// LocalClustering) and their summary.
func Clustering(g *Graph) ([]float64, ClusteringStats) {
	c := make([]float64, g.Len())
	return c, clusteringStats(g, c)
}

// clusteringStats returns the summary of Clustering, and fills c with the
// local coefficients unless c is nil (Measure needs only the summary, and
// at 10^7 nodes the coefficients would take 80 MB). The triangle counts
// are int32 when every degree allows it (half the memory of int64).
func clusteringStats(g *Graph, c []float64) ClusteringStats {
	if maxDegree(g) <= 1<<16 {
		t := make([]int32, g.Len())
		countTriangles(g, t)
		return summariseClustering(g, t, c)
	}
	t := make([]int64, g.Len())
	countTriangles(g, t)
	return summariseClustering(g, t, c)
}

// summariseClustering computes the statistics of ClusteringStats from the
// per-node triangle counts t, recomputing each local coefficient where it
// is needed instead of storing them all (and storing them in c if non-nil).
// Every sum runs over the nodes in index order, as with stored values.
func summariseClustering[T triCount](g *Graph, t []T, c []float64) ClusteringStats {
	n := g.Len()
	st := ClusteringStats{Mean: math.NaN(), Std: math.NaN(), Transitivity: math.NaN()}
	if n == 0 {
		return st
	}
	local := func(i int) float64 {
		if k := g.Degree(i); k >= 2 {
			kf := float64(k)
			return 2 * float64(t[i]) / (kf * (kf - 1))
		}
		return 0
	}
	var sum3, triples, s float64
	maxd := 0
	for i := range t {
		k := g.Degree(i)
		maxd = max(maxd, k)
		v := local(i)
		if k >= 2 {
			kf := float64(k)
			triples += kf * (kf - 1) / 2
		}
		sum3 += float64(t[i])
		s += v
		if c != nil {
			c[i] = v
		}
	}
	st.Triangles = int64(math.Round(sum3 / 3))
	if triples > 0 {
		st.Transitivity = sum3 / triples // 3·triangles / triples
	}
	st.Mean = s / float64(n)
	st.Histogram = make([]ClusteringBin, clusteringBins)
	for b := range st.Histogram {
		st.Histogram[b].Lo = float64(b) / clusteringBins
		st.Histogram[b].Hi = float64(b+1) / clusteringBins
	}
	sumK := make([]float64, maxd+1)
	cntK := make([]int64, maxd+1)
	var s2 float64
	for i := range t {
		v := local(i)
		d := v - st.Mean
		s2 += d * d
		b := min(int(v*clusteringBins), clusteringBins-1)
		st.Histogram[b].Count++
		k := g.Degree(i)
		sumK[k] += v
		cntK[k]++
	}
	st.Std = math.Sqrt(s2 / float64(n))
	for k := range cntK {
		if cntK[k] > 0 {
			st.ByDegree = append(st.ByDegree, ClusteringByDegree{K: k, Count: cntK[k], Mean: sumK[k] / float64(cntK[k])})
		}
	}
	st.ByDegree = slices.Clip(st.ByDegree)
	return st
}
