package groups

import (
	"fmt"
	"image/color"
	"io"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/tracesift/tracesift/report/figure"
)

// DistKind selects how PlotDistribution and PlotFeatureDistribution draw
// each group's distribution.
type DistKind string

// The distribution plot kinds.
const (
	KindECDF      DistKind = "ecdf"      // empirical CDF, F(x) (the default)
	KindCCDF      DistKind = "ccdf"      // complementary CDF 1 − F(x) on a log axis (tails, degree distributions)
	KindHistogram DistKind = "histogram" // probability per bin, as outlined steps
)

// PlotOptions control the plot functions. The zero value means a
// 6 × 4 inch image (per panel 4 × 3 inches for PlotCurveGrid; for
// PlotEffects the height grows with the number of features), a title
// made from the content, the x label "parameter", and an ECDF.
type PlotOptions struct {
	Width, Height vg.Length
	Title         string
	// ParamLabel labels the control parameter axis, e.g. "V_G (V)".
	ParamLabel string
	// Kind selects the distribution plot; "" means KindECDF.
	Kind DistKind
	// Bins is the number of histogram bins; 0 means ⌈√n⌉ in [10, 60]
	// for continuous data and one bin per integer for integer data
	// spanning at most 200 values.
	Bins int
	// Columns is the number of panels per row of PlotCurveGrid;
	// 0 means ⌈√(number of features)⌉.
	Columns int
}

// palette holds the group colours: the colour-blind-safe set of Okabe &
// Ito (2008, "Color universal design"; checked: search.r-project.org/CRAN/refmans/see/html/palette_okabeito.html, hex values as in EmilHvitfeldt.github.io/r-color-palettes/discrete/colorblindr/OkabeIto), most distinct first,
// without the yellow that vanishes on white.
var palette = []color.Color{
	color.RGBA{0x00, 0x72, 0xB2, 0xFF}, // blue
	color.RGBA{0xD5, 0x5E, 0x00, 0xFF}, // vermillion
	color.RGBA{0x00, 0x9E, 0x73, 0xFF}, // bluish green
	color.RGBA{0xE6, 0x9F, 0x00, 0xFF}, // orange
	color.RGBA{0xCC, 0x79, 0xA7, 0xFF}, // reddish purple
	color.RGBA{0x56, 0xB4, 0xE9, 0xFF}, // sky blue
	color.RGBA{0x00, 0x00, 0x00, 0xFF}, // black
}

// groupColor returns the colour of the i-th group or pair.
func groupColor(i int) color.Color { return palette[i%len(palette)] }

// groupShape returns the marker of the i-th group (shape varies with the
// colour cycle so that more than 7 groups stay distinguishable).
func groupShape(i int) draw.GlyphDrawer {
	shapes := []draw.GlyphDrawer{draw.CircleGlyph{}, draw.SquareGlyph{}, draw.TriangleGlyph{}, draw.PyramidGlyph{}, draw.CrossGlyph{}, draw.PlusGlyph{}}
	return shapes[(i/len(palette)+i)%len(shapes)]
}

// size returns the image size with defaults w0 × h0.
func (o PlotOptions) size(w0, h0 vg.Length) (vg.Length, vg.Length) {
	w, h := o.Width, o.Height
	if w <= 0 {
		w = w0
	}
	if h <= 0 {
		h = h0
	}
	return w, h
}

// writePNG renders p as PNG of the given size to w.
func writePNG(w io.Writer, p *plot.Plot, width, height vg.Length, what string) error {
	wt, err := p.WriterTo(width, height, "png")
	if err != nil {
		return fmt.Errorf("plot %s: %w", what, err)
	}
	if _, err := wt.WriteTo(w); err != nil {
		return fmt.Errorf("plot %s: write: %w", what, err)
	}
	return nil
}

// oneNotation sets both axes of p to ticks whose labels share one
// notation, fixed or scientific with raised exponents (report/figure),
// never "1e-05" beside "0.0001".
func oneNotation(p *plot.Plot) {
	for _, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Tick.Marker = figure.LinearTicks{}
		ax.Tick.Label.Handler = figure.Superscript{Fonts: font.DefaultCache}
	}
}

// padRange returns lo, hi widened by frac of the span on both sides (and
// around a single value by a small amount).
func padRange(lo, hi, frac float64) (float64, float64) {
	if hi == lo {
		d := math.Max(math.Abs(lo)*0.05, 1e-9)
		return lo - d, hi + d
	}
	d := (hi - lo) * frac
	return lo - d, hi + d
}
