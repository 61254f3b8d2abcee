package visibility

import (
	"math"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// Triangles returns, for every node, the number of triangles through it.
//
// Algorithm ("forward" triangle listing with degree ordering; Schank &
// Wagner, WEA 2005, LNCS 3503 p. 606; Latapy, Theor. Comput. Sci. 407 (2008)
// 458): rank nodes by (degree, index), keep for each node only the
// neighbours of higher rank (at most √(2E) of them), and for each arc u → v
// look up the higher-ranked neighbours of v in a stamp array of u's. Each
// triangle is found exactly once, from its lowest-ranked corner, and hubs
// cost nothing extra because their forward lists are short. O(E^{3/2}) in
// the worst case, far less on visibility graphs. Runs on GOMAXPROCS threads;
// the counts do not depend on the thread count.
func Triangles(g *Graph) []int64 {
	n := g.Len()
	t := make([]int64, n)
	if n == 0 {
		return t
	}
	deg := make([]int32, n)
	for i := range deg {
		deg[i] = int32(g.offsets[i+1] - g.offsets[i])
	}
	// higher(u, v): v ranks above u in the (degree, index) order.
	higher := func(u, v int32) bool {
		du, dv := deg[u], deg[v]
		return dv > du || (dv == du && v > u)
	}
	// Forward adjacency in CSR (subsets of sorted lists stay sorted).
	foff := make([]int64, n+1)
	for u := 0; u < n; u++ {
		c := int64(0)
		for _, v := range g.Neighbors(u) {
			if higher(int32(u), v) {
				c++
			}
		}
		foff[u+1] = foff[u] + c
	}
	fadj := make([]int32, foff[n])
	for u := 0; u < n; u++ {
		p := foff[u]
		for _, v := range g.Neighbors(u) {
			if higher(int32(u), v) {
				fadj[p] = v
				p++
			}
		}
	}
	// Workers take blocks of source nodes from a shared counter and count
	// into private arrays; integer sums do not depend on the split, so the
	// result is the same for any number of workers.
	const block = 4096
	workers := min(runtime.GOMAXPROCS(0), (n+block-1)/block)
	var next atomic.Int64
	parts := make([][]int64, workers)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			tw := t
			if w > 0 {
				tw = make([]int64, n)
			}
			parts[w] = tw
			stamp := make([]int32, n)
			for i := range stamp {
				stamp[i] = -1
			}
			for {
				lo := int(next.Add(block)) - block
				if lo >= n {
					return
				}
				for u := lo; u < min(lo+block, n); u++ {
					fu := fadj[foff[u]:foff[u+1]]
					if len(fu) < 2 {
						continue
					}
					for _, v := range fu {
						stamp[v] = int32(u)
					}
					for _, v := range fu {
						for _, w := range fadj[foff[v]:foff[v+1]] {
							if stamp[w] == int32(u) {
								tw[u]++
								tw[v]++
								tw[w]++
							}
						}
					}
				}
			}
		}(w)
	}
	wg.Wait()
	for _, p := range parts[1:] {
		for i, c := range p {
			t[i] += c
		}
	}
	return t
}

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
	n := g.Len()
	t := Triangles(g)
	c := make([]float64, n)
	st := ClusteringStats{Mean: math.NaN(), Std: math.NaN(), Transitivity: math.NaN()}
	if n == 0 {
		return c, st
	}
	var sum3, triples float64
	maxd := 0
	for i := range t {
		k := g.Degree(i)
		maxd = max(maxd, k)
		if k >= 2 {
			kf := float64(k)
			c[i] = 2 * float64(t[i]) / (kf * (kf - 1))
			triples += kf * (kf - 1) / 2
		}
		sum3 += float64(t[i])
	}
	st.Triangles = int64(math.Round(sum3 / 3))
	if triples > 0 {
		st.Transitivity = sum3 / triples // 3·triangles / triples
	}
	var s float64
	for _, v := range c {
		s += v
	}
	st.Mean = s / float64(n)
	var s2 float64
	for _, v := range c {
		d := v - st.Mean
		s2 += d * d
	}
	st.Std = math.Sqrt(s2 / float64(n))
	st.Histogram = make([]ClusteringBin, clusteringBins)
	for b := range st.Histogram {
		st.Histogram[b].Lo = float64(b) / clusteringBins
		st.Histogram[b].Hi = float64(b+1) / clusteringBins
	}
	sumK := make([]float64, maxd+1)
	cntK := make([]int64, maxd+1)
	for i, v := range c {
		b := min(int(v*clusteringBins), clusteringBins-1)
		st.Histogram[b].Count++
		k := g.Degree(i)
		sumK[k] += v
		cntK[k]++
	}
	for k := range cntK {
		if cntK[k] > 0 {
			st.ByDegree = append(st.ByDegree, ClusteringByDegree{K: k, Count: cntK[k], Mean: sumK[k] / float64(cntK[k])})
		}
	}
	st.ByDegree = slices.Clip(st.ByDegree)
	return c, st
}
