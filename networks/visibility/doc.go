// Package visibility turns a time series into a visibility graph, one node
// per sample, stored as a networks.Graph and measured by package networks.
//
//   - Natural builds the natural visibility graph (NVG): samples a < b are
//     linked iff every sample c between them lies strictly below the straight
//     line joining (a, x_a) and (b, x_b). Lacasa et al., PNAS 105 (2008) 4972.
//   - Horizontal builds the horizontal visibility graph (HVG): a < b are
//     linked iff every c between is strictly lower than both. Luque et al.,
//     Phys. Rev. E 80 (2009) 046103.
//
// Edges read forward in time are the arcs of the directed visibility graph
// (networks.Graph.InDegree, OutDegree, Predecessors, Successors).
//
// Scale: every visibility criterion compares samples only with each other
// along straight lines, so the graph of a·x + b (a > 0) is the graph of x
// whenever the arithmetic a·x + b is exact (e.g. a a power of two). For other
// a the rounding of a·x + b can, in rare exactly-collinear or exactly-tied
// cases (quantised data), tip a visibility one way or the other; on
// continuous-valued data the graphs are identical in practice.
package visibility
