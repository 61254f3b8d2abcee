package campaign

import (
	"errors"
	"fmt"
	"image/color"
	"io"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"github.com/tracesift/tracesift/report/figure"
)

// ErrNothingToPlot: the metric has no finite value at a parameter level.
var ErrNothingToPlot = errors.New("nothing to plot")

// Colours: originals in black; the surrogate methods in the
// colour-blind-safe set of Okabe & Ito (2008, "Color universal design",
// checked: search.r-project.org/CRAN/refmans/see/html/palette_okabeito.html), as package groups uses.
var methodColours = []color.RGBA{
	{0x00, 0x72, 0xB2, 0xFF}, // blue
	{0xD5, 0x5E, 0x00, 0xFF}, // vermillion
	{0x00, 0x9E, 0x73, 0xFF}, // bluish green
	{0xCC, 0x79, 0xA7, 0xFF}, // reddish purple
	{0xE6, 0x9F, 0x00, 0xFF}, // orange
}

// PlotMetric writes a PNG of one metric against the control parameter,
// one panel per group: the originals' median with Q1–Q3 bars (black), and
// per surrogate method a band from the median 2.5 % to the median 97.5 %
// quantile of the traces' surrogate values, with the median surrogate
// mean as a dashed line. All panels share the y range. paramLabel labels
// the x axis. ErrNothingToPlot without parameter levels or values.
func PlotMetric(w io.Writer, rep Report, metric, paramLabel string) error {
	var levels []float64
	for _, lv := range rep.Levels {
		if !math.IsNaN(lv.Param) {
			levels = append(levels, lv.Param)
		}
	}
	if len(levels) == 0 {
		return fmt.Errorf("plot %s: no parameter levels: %w", metric, ErrNothingToPlot)
	}
	if paramLabel == "" {
		paramLabel = rep.Parameter
	}
	ylo, yhi := math.Inf(1), math.Inf(-1)
	extend := func(v ...float64) {
		for _, x := range v {
			if finite(x) {
				ylo, yhi = math.Min(ylo, x), math.Max(yhi, x)
			}
		}
	}
	for _, b := range rep.Bands {
		if b.Name == metric {
			extend(b.Median, b.Q1, b.Q3)
			for _, m := range b.Methods {
				extend(m.Lo, m.Hi, m.Mean)
			}
		}
	}
	if math.IsInf(ylo, 1) {
		return fmt.Errorf("plot %s: no finite values: %w", metric, ErrNothingToPlot)
	}
	if ylo == yhi {
		ylo, yhi = ylo-0.5*math.Max(1e-9, math.Abs(ylo)*0.05), yhi+0.5*math.Max(1e-9, math.Abs(yhi)*0.05)
	}
	pad := 0.08 * (yhi - ylo)
	xspan := levels[len(levels)-1] - levels[0]
	if xspan == 0 {
		xspan = math.Max(math.Abs(levels[0]), 1)
	}
	panels := make([][]*plot.Plot, 1)
	for gi, g := range rep.Groups {
		p := plot.New()
		p.Title.Text = fmt.Sprintf("%s: %s", metric, g)
		p.X.Label.Text = paramLabel
		if gi == 0 {
			p.Y.Label.Text = metric
		}
		for _, ax := range []*plot.Axis{&p.X, &p.Y} {
			ax.Tick.Marker = figure.LinearTicks{}
			ax.Tick.Label.Handler = figure.Superscript{Fonts: font.DefaultCache}
		}
		p.Add(plotter.NewGrid())
		for mi, method := range rep.Methods {
			col := methodColours[mi%len(methodColours)]
			var lo, hi, mid plotter.XYs
			for _, b := range rep.Bands {
				if b.Name != metric || b.Group != g || math.IsNaN(b.Param) {
					continue
				}
				for _, m := range b.Methods {
					if m.Method == method && finite(m.Lo) && finite(m.Hi) {
						lo = append(lo, plotter.XY{X: b.Param, Y: m.Lo})
						hi = append(hi, plotter.XY{X: b.Param, Y: m.Hi})
						mid = append(mid, plotter.XY{X: b.Param, Y: m.Mean})
					}
				}
			}
			if len(lo) == 0 {
				continue
			}
			poly := append(plotter.XYs{}, lo...)
			for i := len(hi) - 1; i >= 0; i-- {
				poly = append(poly, hi[i])
			}
			if len(lo) == 1 { // a single level: a thin box
				d := 0.02 * xspan
				poly = plotter.XYs{{X: lo[0].X - d, Y: lo[0].Y}, {X: lo[0].X + d, Y: lo[0].Y}, {X: hi[0].X + d, Y: hi[0].Y}, {X: hi[0].X - d, Y: hi[0].Y}}
			}
			pg, err := plotter.NewPolygon(poly)
			if err != nil {
				return fmt.Errorf("plot %s: %w", metric, err)
			}
			// A translucent fill: non-premultiplied (color.RGBA with a low
			// alpha but full RGB is not a valid premultiplied colour).
			pg.Color = color.NRGBA{R: col.R, G: col.G, B: col.B, A: 0x50}
			pg.LineStyle.Width = 0
			line, err := plotter.NewLine(mid)
			if err != nil {
				return fmt.Errorf("plot %s: %w", metric, err)
			}
			line.Color = col
			line.Width = vg.Points(1.2)
			line.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
			p.Add(pg, line)
			p.Legend.Add(method+" surrogates (mean, 2.5–97.5 % band)", line)
		}
		var pts plotter.XYs
		var errs plotter.YErrors
		for _, b := range rep.Bands {
			if b.Name == metric && b.Group == g && !math.IsNaN(b.Param) && finite(b.Median) {
				pts = append(pts, plotter.XY{X: b.Param, Y: b.Median})
				errs = append(errs, struct{ Low, High float64 }{b.Median - b.Q1, b.Q3 - b.Median})
			}
		}
		if len(pts) > 0 {
			line, err := plotter.NewLine(pts)
			if err != nil {
				return fmt.Errorf("plot %s: %w", metric, err)
			}
			line.Width = vg.Points(1.8)
			sc, err := plotter.NewScatter(pts)
			if err != nil {
				return fmt.Errorf("plot %s: %w", metric, err)
			}
			sc.GlyphStyle = draw.GlyphStyle{Color: color.Black, Radius: vg.Points(3), Shape: draw.CircleGlyph{}}
			eb, err := plotter.NewYErrorBars(struct {
				plotter.XYs
				plotter.YErrors
			}{pts, errs})
			if err != nil {
				return fmt.Errorf("plot %s: %w", metric, err)
			}
			p.Add(line, eb, sc)
			p.Legend.Add("original (median, Q1–Q3)", line, sc)
		}
		p.X.Min, p.X.Max = levels[0]-0.06*xspan, levels[len(levels)-1]+0.06*xspan
		p.Y.Min, p.Y.Max = ylo-pad, yhi+pad+0.35*(yhi-ylo) // headroom for the legend
		p.Legend.Top = true
		p.Legend.TextStyle.Font.Size = vg.Points(8)
		panels[0] = append(panels[0], p)
	}
	cols := len(panels[0])
	width, height := vg.Length(cols)*4*vg.Inch, 3.2*vg.Inch
	img := vgimg.NewWith(vgimg.UseWH(width, height), vgimg.UseDPI(96))
	dc := draw.New(img)
	tiles := draw.Tiles{Rows: 1, Cols: cols, PadX: vg.Points(8), PadTop: vg.Points(4), PadBottom: vg.Points(4), PadLeft: vg.Points(4), PadRight: vg.Points(6)}
	canvases := plot.Align(panels, tiles, dc)
	for j, p := range panels[0] {
		p.Draw(canvases[0][j])
	}
	if _, err := (vgimg.PngCanvas{Canvas: img}).WriteTo(w); err != nil {
		return fmt.Errorf("plot %s: write: %w", metric, err)
	}
	return nil
}
