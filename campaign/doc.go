// Package campaign analyses a measurement campaign: many traces in groups
// (fresh and stressed devices, say), each measured at several levels of a
// control parameter (the gate bias), with the same devices in several
// groups. It is the engine behind `tracesift survey`.
//
// # Steps
//
//   - Describe: ReadCSV reads a campaign description (a "file" column and
//     any others; the group, device and parameter columns chosen by Roles),
//     FromPattern reads the same from file names with a regular expression
//     whose named groups are the columns. Unusable entries become Problems
//     with their line; the rest goes on.
//   - Measure: per trace, the metrics (features.Extract; by default the
//     visibility-graph and increment families), the same metrics on N
//     surrogates of each method (features/surrogate: shuffle, gauss, IAAFT),
//     summarised per method (mean, sd, 2.5 % and 97.5 % quantiles, the rank
//     p-value of the original), and per-trace distributions (NVG and HVG
//     degrees and local clustering, normalised increments, and the
//     increments of the Gaussianised surrogates). Surrogates are seeded by
//     SurrogateSeed(seed, trace ID, method), so a trace's record does not
//     depend on the worker, the machine or the other traces.
//   - Tabulate: Rows turns a Record into the tidy per-trace table (one row
//     per trace × metric × condition, and one per support point of a
//     distribution); WriteTableCSV, WriteTableJSONL and ReadTableCSV write
//     and read it exactly (shortest round-trip numbers), SortRows puts it in
//     the canonical order.
//   - Analyze: every test, from the table alone, so tables measured on
//     several machines and concatenated give exactly one run's Report.
//     Families (Holm and Benjamini–Hochberg within each, one per question
//     and test): groups/<test> (each group against the reference at each
//     level: KS, Mann–Whitney, and the Wilcoxon signed-rank test paired by
//     device), trend/spearman (Spearman's ρ with the Theil–Sen slope and
//     its interval), surrogate/<method> (signed-rank of original minus
//     surrogate mean over the traces of a group and level), trace/<file>
//     (each trace's rank tests), distribution/<test> (pooled distributions
//     between groups with whole traces relabelled; the increments against
//     their Gaussianised surrogates with paired flips). Warnings name the
//     families in which no test can reach the adjusted level and the
//     surrogate count, pairs or traces that could.
//   - Render: WriteTestsCSV, WriteTestsJSONL, WriteSummary, WriteLevel
//     (Markdown per level) and PlotMetric (PNG, gonum/plot).
//
// The statistics come from package groups (KS, Mann–Whitney, SignedRank,
// Spearman, TheilSen, Holm, BH, checked against SciPy) and
// features/surrogate (RankP). The permutation tests of the pooled
// distributions are in permutation.go.
package campaign
