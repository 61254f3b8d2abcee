// Package networks holds what every network built from a time series
// shares: the graph in compressed sparse row form and every metric measured
// on it. The constructions live in sub-packages:
//
//   - networks/visibility: natural (NVG) and horizontal (HVG) visibility
//     graphs, one node per sample (Lacasa et al., PNAS 105 (2008) 4972;
//     Luque et al., Phys. Rev. E 80 (2009) 046103);
//   - networks/recurrence: recurrence networks, one node per delay vector,
//     linked when closer than ε (Marwan et al., Phys. Lett. A 373 (2009)
//     4246; Donner et al., New J. Phys. 12 (2010) 033025);
//   - networks/ordinal: ordinal partition (transition) networks, one node
//     per ordinal pattern, directed weighted transitions (Small, Proc. IEEE
//     ISCAS (2013) 2509; McCullough et al., Chaos 25 (2015) 053101), with
//     their undirected form as a Graph for the common metrics.
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
// Degree tails: TailModels compares a power law, an exponential and a
// log-normal fitted to the degree tail by maximum likelihood with Vuong's
// test (Clauset, Shalizi & Newman, SIAM Review 51 (2009) 661), for any
// kind; ExactDiameter gives the exact diameter of graphs up to 10^5 nodes by
// iFUB (Crescenzi et al., Theor. Comput. Sci. 514 (2013) 84) beside the
// sampled estimate of Paths.
package networks
