// Package report writes the HTML reports of tracesift: the single-trace
// report (below) and the campaign report (WriteCampaign, from a
// campaign.Report: the verdict grid per group, metrics against the
// control parameter with surrogate bands and adjusted rejections, pooled
// distributions with fitted tails, tables of tests, methods). Each is one
// self-contained file (inline CSS and SVG, nothing fetched from the
// network; the campaign page has a few lines of inline script for its
// grid) that a device engineer can read on screen or print. Both pages
// share their head, style sheet and figure parts (page.go) and the SVG
// writer (svg.go).
//
// Build analyses a trace with a classifier model and gathers everything the
// report shows; (*Report).WriteHTML renders it. The sections, by HTML id
// (see Sections):
//
//   - summary: file, samples, sample interval and units, moments, seed and
//     model (no date, so the output is reproducible);
//   - verdict: the class with its probabilities (bar chart), the features
//     that drove it (Saabas contributions), warnings and the screening
//     caution;
//   - trace: the trace (a min/max envelope per pixel column when long) and
//     the density of its normalised increments on a log axis beside the
//     fitted Gaussian;
//   - degrees: the HVG degree distribution on semi-log axes with the i.i.d.
//     law P(k) = (1/3)(2/3)^{k−2} and the fitted exponential tail, and the
//     NVG degree distribution on log–log axes with the fitted power law;
//   - clustering: histograms of the local clustering coefficients of both
//     graphs, and C(k) against the HVG law 2/k;
//   - plane: the trace on the complexity–entropy plane (ordinal order 6 by
//     default, with its bounds) among reference systems drawn from the
//     generators at fixed seeds and at the trace's length;
//   - surrogates: the determinism test of 'classify --significance'
//     (surrogate.Determinism: forecast skill and time-reversal asymmetry
//     at the embedding delay against IAAFT surrogates, one-sided,
//     Holm-adjusted) with what it says about the verdict (also stated in
//     the verdict section), optional two-sided rank tests of features
//     (Options.Stats), and a strip plot of all of them;
//   - methods: how each part was computed, the model, references and the
//     feature catalogue with the trace's values.
//
// Determinism: every random step takes its seed from Options.Seed (the
// reference systems use fixed seeds of their own), parallel work is placed
// by index, and the figures are drawn by a small SVG writer that rounds
// every coordinate to 0.1 px, so the same trace, model and options give the
// same bytes. Axis ticks (one notation per axis), the placement of point
// labels and of legends (off the drawn data) come from report/figure,
// which the bench suite's PNG figures share.
package report
