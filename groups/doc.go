// Package groups compares groups of traces (for example fresh versus
// electrically stressed devices) feature by feature, optionally against a
// control parameter such as the gate bias, and renders the comparison as
// Markdown, CSV, JSON and PNG plots. It is the engine behind
// `tracesift compare`; it takes feature vectors that were already computed
// (one Sample per trace) and never reads files.
//
// # Statistics
//
// Each statistic has its own file and doc comment with its source:
//
//   - KS: two-sample Kolmogorov–Smirnov test, exact p-value by the lattice
//     path recursion for n·m ≤ 10⁶, otherwise the Kolmogorov distribution
//     at N = round(nm/(n+m)) (KolmogorovSF: Marsaglia–Tsang–Wang matrix,
//     Birnbaum–Tingey tail, Stephens-corrected Smirnov limit);
//   - MannWhitney: Mann–Whitney U, exact null distribution without ties for
//     n·m ≤ 2500, otherwise the normal approximation with continuity and
//     tie correction;
//   - Holm and BH (Adjust): multiple-testing adjustments;
//   - CliffDelta with CliffMagnitude, HodgesLehmann, and Describe (median,
//     quartiles, IQR, normal-consistent MAD, missing count);
//   - Spearman: rank correlation with its t-based p-value.
//
// The p-values were checked against SciPy 1.10.1 and statsmodels 0.13.5
// (testdata/groups/make_golden.py writes golden.json, which the tests
// read).
//
// # Comparison
//
// Compare takes the ordered feature names and the samples and returns a
// Result: per group the summaries; per pair of groups (B against A) and
// feature both tests, their adjusted p-values, the effect sizes and a
// Significant flag; with a parameter, per feature and group the median and
// quartiles at each parameter level and the Spearman correlation; and the
// named per-trace distributions pooled per group. Missing values (NaN) are
// dropped per feature and counted; groups with fewer than three values of a
// feature get a note instead of a p-value.
//
// # Outputs
//
// WriteMarkdown, WriteCSV, WriteCurvesCSV and WriteJSON write to an
// io.Writer; PlotCurve, PlotCurveGrid, PlotDistribution,
// PlotFeatureDistribution and PlotEffects write PNG images with gonum/plot.
// The same Result always gives the same bytes. Callers that write files
// should write to a temporary file and rename it (internal/atomicfile).
package groups
