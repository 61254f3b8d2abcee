// Package nonlinear holds the classical nonlinear-dynamics measures of a
// scalar series, each with automatic delay embedding and the diagnostics a
// scientist needs to trust the number: delay and dimension selection (average
// mutual information, Cao's method, false nearest neighbours, Theiler
// window), the largest Lyapunov exponent (Rosenstein), the correlation
// dimension (Grassberger–Procaccia), the 0–1 test for chaos (Gottwald–
// Melbourne), nonlinear prediction skill (Sugihara–May), time-reversal
// asymmetry and sample entropy (Richman–Moorman).
//
// Every estimator takes a []float64 and an options struct whose zero value
// means the documented defaults, and returns a result struct that carries
// the value together with its fit range, goodness of fit, number of points
// used and the embedding chosen. Inputs are standardised internally (mean 0,
// standard deviation 1), so every value is unchanged, up to floating-point
// error, when the series is replaced by a·x + b with a > 0; measures that are
// symmetric in the sign of x are also unchanged for a < 0 (the asymmetry
// statistic flips sign, its magnitude does not).
//
// Neighbour searches use a k-d tree (kdtree.go) with exact bounding boxes,
// or, where it is cheaper, a search by sorted projection (projection.go)
// or one search tree shared by every dimension of Cao's method; whichever
// answers, the result is the k-d tree's, ties included (a search that finds
// several neighbours at exactly the nearest distance hands the query to
// the tree). Reconstruct prepares a series once — standardised samples,
// embedding, these structures — for Lyapunov, CorrelationDimension and
// Prediction on it, with exactly the results of the package functions.
// Long series are handled by documented, deterministic subsampling of
// reference points (evenly spaced), never by a random draw, except for the
// 0–1 test, whose frequencies c come from a seeded generator. Nothing runs
// in parallel; the same input gives bit-identical output.
//
// Defaults that bound the cost (all measures on 10^5 samples take about
// 0.7 s of CPU for a low-dimensional flow and 1.7 s for white noise, where
// the embedding dimension is high):
//
//	Embed                 AMI lags ≤ min(200, n/20), ≤ 50000 pairs per lag;
//	                      Cao/FNN on the first 20000 samples, 1000 references
//	Lyapunov              2000 reference vectors; curve length clamp(50τ, 50, M/4)
//	CorrelationDimension  10^7 distances (references × partners)
//	ZeroOne               first 10000 samples, 100 frequencies c
//	Prediction            1000 test vectors, library ≤ 50000 vectors
//	SampleEntropy         exact, all templates (dual-tree pair count; a
//	                      sweep with a Fenwick tree for m = 2 templates)
//	Asymmetry             one pass
//
// Values that can be missing, and why: Lyapunov.Lambda is NaN when the
// divergence curve has no credible linear region (noise, regular motion,
// or chaos hidden by strong noise; Reason says which test failed);
// CorrelationDimension.D2 is NaN when fewer than half a decade of radii has
// enough pairs (very short or exactly repeating series); SampleEntropy is
// undefined (NaN) when no template pair matches at length m+1.
package nonlinear
