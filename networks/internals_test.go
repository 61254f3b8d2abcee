package networks

import "math/rand/v2"

// Internals for the tests of package networks_test, which build their
// graphs with networks/visibility and so cannot be inside the package
// (visibility imports networks).

func CountTrianglesHubDeg(g *Graph, t []int64, hubDeg int64)  { countTrianglesHubDeg(g, t, hubDeg) }
func CountTriangles32(g *Graph, t []int32)                    { countTriangles(g, t) }
func ClusteringStatsOf(g *Graph, c []float64) ClusteringStats { return clusteringStats(g, c) }
func LouvainLevels64(g *Graph, res float64, rng *rand.Rand) ([]int32, int) {
	return louvainLevels[float64](g, res, rng)
}

var (
	Renumber          = renumber
	PathsAndDimension = pathsAndDimension
	MultiBFS          = multiBFS
	PickSources       = pickSources
	DegreeHistogram   = degreeHistogram
	WeightedLine      = weightedLine
)

// SetMeasureConcurrentNodes sets measureConcurrentNodes and returns its
// previous value.
func SetMeasureConcurrentNodes(c int) int {
	old := measureConcurrentNodes
	measureConcurrentNodes = c
	return old
}

// ClusteringBins is clusteringBins.
const ClusteringBins = clusteringBins

// SetTriangleParallelWork sets triangleParallelWork and returns its
// previous value.
func SetTriangleParallelWork(w float64) float64 {
	old := triangleParallelWork
	triangleParallelWork = w
	return old
}
