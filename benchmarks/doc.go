// Package benchmarks is tracesift's reference suite: it measures how well
// the project's estimators recover published invariants of reference
// systems, how accurately a classifier model sorts fresh reference series
// into chaotic, regular and stochastic, and how fast the graph
// construction, the feature extraction and the screening run; and it writes
// the outcome as Markdown, JSON and PNG plots.
//
// Run does the measuring and returns a Result; WriteAll (or WriteJSON,
// WriteMarkdown and the Plot functions) renders it. Four sections:
//
//   - Invariants: for each reference system and each estimator with a
//     published or analytic value (REFERENCES.md), the estimate over
//     several seeds and lengths (median, interquartile range, minimum and
//     maximum), its error and whether it lies within the tolerance the
//     project's own tests use. Every row carries the source of the value
//     and of the tolerance. The estimators are the project's own
//     (features/nonlinear, features/scaling, features/ordinal,
//     networks, networks/visibility); nothing is re-implemented here.
//   - Classification: accuracy, confusion matrices, the undetermined rate
//     and a per-system breakdown versus series length and observational
//     signal-to-noise ratio, on reference-plan series drawn with seeds the
//     model never saw (plan seed 1000 + Options.Seed; the reference model is
//     trained with plan seed 1).
//   - Throughput: samples per second of HVG and NVG construction, feature
//     extraction and screening against the series length, with the fitted
//     growth exponent p of time ~ n^p. Timings depend on the machine and its
//     load; they are the only part of a Result that is not reproducible.
//   - Pictures of the method: HVG degree distributions against the i.i.d.
//     law of Luque et al. (2009) and every reference system placed in the
//     complexity–entropy plane (Rosso et al. 2007).
//
// Everything except the timings is a deterministic function of the Options
// and the model: series are generated from PCG streams derived from
// Options.Seed, work is split across goroutines with results placed by
// index, and no map order reaches the output.
package benchmarks
