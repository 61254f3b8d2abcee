// Package figure holds the figure machinery shared by the HTML report's SVG
// figures (package report) and the benchmark suite's PNG plots (package
// benchmarks, drawn with gonum.org/v1/plot):
//
//   - axis ticks whose labels use one notation per axis, fixed ("0.25",
//     "20000") or scientific ("2.5×10⁻⁵", "10⁻⁵"), never both, with the same
//     number of decimals or significant digits on every label (Linear, Log,
//     FormatStep, FormatEach);
//   - label placement beside points that avoids every other label and
//     marker, with leader lines for labels set further off (PlaceLabels);
//   - legend placement inside the data area where it covers no data, or
//     below the plot when no such place exists (PlaceLegend);
//   - left margins that hold the longest tick label (LeftMargin);
//   - for gonum plots: tickers built on the above, a text handler that
//     draws the raised exponents of scientific labels, and Plot, which
//     renders a PNG with outer margins and a placed legend.
//
// Everything is deterministic: the same inputs give the same positions and
// the same bytes. Geometry is in image coordinates with y growing
// downwards (SVG user units, or points of a gonum canvas flipped by the
// caller).
package figure
