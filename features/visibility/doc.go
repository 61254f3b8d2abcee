// Package visibility turns a time series into a visibility graph and measures
// the graph.
//
// Two graphs are built, both on the nodes 0..n−1 (one per sample):
//
//   - Natural builds the natural visibility graph (NVG): samples a < b are
//     linked iff every sample c between them lies strictly below the straight
//     line joining (a, x_a) and (b, x_b). Lacasa et al., PNAS 105 (2008) 4972.
//   - Horizontal builds the horizontal visibility graph (HVG): a < b are
//     linked iff every c between is strictly lower than both. Luque et al.,
//     Phys. Rev. E 80 (2009) 046103.
//
// Graphs are stored in compressed sparse row form (CSR) with int32 node
// indices and sorted neighbour lists; a 10^6-node NVG takes a few hundred
// megabytes at most. Edges can be read in time order: the edge {i, j} with
// i < j is the arc i → j of the directed visibility graph, so
// Graph.InDegree/OutDegree/Predecessors/Successors give the directed HVG of
// Lacasa et al., Eur. Phys. J. B 85 (2012) 217 without building a second graph.
//
// Metrics (each its own function, and all at once through Measure): degree
// statistics, the exponential tail rate λ of the HVG degree distribution,
// the power-law exponent γ of the NVG degree distribution (discrete maximum
// likelihood with a Kolmogorov–Smirnov k_min), local clustering by triangle
// counting, Newman's degree assortativity, Louvain communities and their
// modularity, shortest-path length and diameter (exact or sampled), local
// graph dimension and the in/out-degree Kullback–Leibler irreversibility.
// Results are structs that carry the diagnostics (fit ranges, sample sizes)
// beside the numbers; they marshal to JSON with snake_case keys, and
// undefined values (NaN) are written as null.
//
// Graphs export as CSV edge lists (WriteEdgeList) and GraphML
// (WriteGraphML), streamed to an io.Writer.
//
// Scale: every visibility criterion compares samples only with each other
// along straight lines, so the graph of a·x + b (a > 0) is the graph of x
// whenever the arithmetic a·x + b is exact (e.g. a a power of two). For other
// a the rounding of a·x + b can, in rare exactly-collinear or exactly-tied
// cases (quantised data), tip a visibility one way or the other; on
// continuous-valued data the graphs are identical in practice.
package visibility
