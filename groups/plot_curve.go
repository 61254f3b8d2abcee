package groups

import (
	"fmt"
	"io"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// PlotCurve writes a PNG of one feature against the control parameter:
// per group a line through the medians at each parameter level with
// error bars from Q1 to Q3, markers and colours per group, a legend with
// the groups and their Spearman ρ. Groups are shifted sideways by up to
// ±1.5 % of the parameter range so their error bars do not hide each
// other. The result must have a parameter (ErrNothingToPlot otherwise) and
// the feature must exist (ErrUnknownName).
func PlotCurve(w io.Writer, r Result, feature string, opts PlotOptions) error {
	p, err := curvePlot(r, feature, opts, true)
	if err != nil {
		return err
	}
	width, height := opts.size(6*vg.Inch, 4*vg.Inch)
	return writePNG(w, p, width, height, feature)
}

// PlotCurveGrid writes one PNG with a panel per feature (features nil
// means all, in order) as PlotCurve draws them, opts.Columns panels per
// row; the legend is drawn once, in the first panel where every group has
// a value (else the first panel). The image is
// opts.Width × opts.Height, by default 4 × 3 inches per panel.
func PlotCurveGrid(w io.Writer, r Result, features []string, opts PlotOptions) error {
	if features == nil {
		features = r.Features
	}
	if len(features) == 0 {
		return fmt.Errorf("plot grid: %w", ErrNothingToPlot)
	}
	cols := opts.Columns
	if cols <= 0 {
		cols = int(math.Ceil(math.Sqrt(float64(len(features)))))
	}
	rows := (len(features) + cols - 1) / cols
	grid := make([][]*plot.Plot, rows)
	for i := range grid {
		grid[i] = make([]*plot.Plot, cols)
	}
	legendAt := 0
	for k, f := range features {
		if groupsWithValues(r, f) == len(r.Groups) {
			legendAt = k
			break
		}
	}
	for k, f := range features {
		o := opts
		o.Title = f
		p, err := curvePlot(r, f, o, k == legendAt)
		if err != nil {
			return err
		}
		grid[k/cols][k%cols] = p
	}
	width, height := opts.size(vg.Length(cols)*4*vg.Inch, vg.Length(rows)*3*vg.Inch)
	img := vgimg.NewWith(vgimg.UseWH(width, height), vgimg.UseDPI(96))
	dc := draw.New(img)
	if opts.Title != "" {
		// Reserve a strip on top for the overall title.
		th := vg.Points(32)
		sty := plot.New().Title.TextStyle
		sty.Font.Size = vg.Points(14)
		sty.XAlign = draw.XCenter
		dc.FillText(sty, vg.Point{X: width / 2, Y: height - th/2}, opts.Title)
		dc.Max.Y -= th
	}
	tiles := draw.Tiles{Rows: rows, Cols: cols, PadX: vg.Points(6), PadY: vg.Points(6),
		PadTop: vg.Points(4), PadBottom: vg.Points(4), PadLeft: vg.Points(4), PadRight: vg.Points(4)}
	canvases := plot.Align(grid, tiles, dc)
	for i := range grid {
		for j, p := range grid[i] {
			if p != nil {
				p.Draw(canvases[i][j])
			}
		}
	}
	if _, err := (vgimg.PngCanvas{Canvas: img}).WriteTo(w); err != nil {
		return fmt.Errorf("plot grid: write: %w", err)
	}
	return nil
}

// groupsWithValues counts the groups with at least one finite median of
// feature at some level (0 for an unknown feature).
func groupsWithValues(r Result, feature string) int {
	f := r.FeatureIndex(feature)
	ng := len(r.Groups)
	if f < 0 || len(r.Curves) < (f+1)*ng {
		return 0
	}
	n := 0
	for _, c := range r.Curves[f*ng : (f+1)*ng] {
		for _, l := range c.Levels {
			if l.N > 0 && !math.IsNaN(l.Median) {
				n++
				break
			}
		}
	}
	return n
}

// curvePlot builds the feature-versus-parameter plot.
func curvePlot(r Result, feature string, opts PlotOptions, legend bool) (*plot.Plot, error) {
	if !r.HasParam || len(r.Curves) == 0 {
		return nil, fmt.Errorf("plot %q: no parameter values: %w", feature, ErrNothingToPlot)
	}
	f := r.FeatureIndex(feature)
	if f < 0 {
		return nil, fmt.Errorf("plot %q: %w", feature, ErrUnknownName)
	}
	ng := len(r.Groups)
	curves := r.Curves[f*ng : (f+1)*ng]
	levels := allLevels(curves)
	if len(levels) == 0 {
		return nil, fmt.Errorf("plot %q: %w", feature, ErrNothingToPlot)
	}
	span := levels[len(levels)-1] - levels[0]
	dodge := 0.0
	if ng > 1 && span > 0 {
		dodge = 0.03 * span / float64(ng-1)
	}
	p := plot.New()
	p.Title.Text = opts.Title
	xlabel := opts.ParamLabel
	if xlabel == "" {
		xlabel = "parameter"
	}
	if p.Title.Text == "" {
		p.Title.Text = fmt.Sprintf("%s versus %s (median, Q1–Q3)", feature, xlabel)
	}
	p.X.Label.Text = xlabel
	p.Y.Label.Text = feature
	oneNotation(p)
	p.Add(plotter.NewGrid())
	ylo, yhi := math.Inf(1), math.Inf(-1)
	drawn := 0
	for gi, c := range curves {
		var pts plotter.XYs
		var errs plotter.YErrors
		shift := (float64(gi) - float64(ng-1)/2) * dodge
		for _, l := range c.Levels {
			if l.N == 0 || math.IsNaN(l.Median) {
				continue
			}
			pts = append(pts, plotter.XY{X: l.Param + shift, Y: l.Median})
			errs = append(errs, struct{ Low, High float64 }{l.Median - l.Q1, l.Q3 - l.Median})
			ylo, yhi = math.Min(ylo, l.Q1), math.Max(yhi, l.Q3)
		}
		if len(pts) == 0 {
			continue
		}
		drawn++
		col := groupColor(gi)
		line, err := plotter.NewLine(pts)
		if err != nil {
			return nil, fmt.Errorf("plot %q: %w", feature, err)
		}
		line.Color = col
		line.Width = vg.Points(1.5)
		sc, err := plotter.NewScatter(pts)
		if err != nil {
			return nil, fmt.Errorf("plot %q: %w", feature, err)
		}
		sc.GlyphStyle = draw.GlyphStyle{Color: col, Radius: vg.Points(3), Shape: groupShape(gi)}
		eb, err := plotter.NewYErrorBars(struct {
			plotter.XYs
			plotter.YErrors
		}{pts, errs})
		if err != nil {
			return nil, fmt.Errorf("plot %q: %w", feature, err)
		}
		eb.Color = col
		eb.Width = vg.Points(1)
		p.Add(line, eb, sc)
		if legend {
			label := c.Group
			if !math.IsNaN(c.Spearman.Rho) {
				label = fmt.Sprintf("%s (ρ = %+.2f)", c.Group, c.Spearman.Rho)
			}
			p.Legend.Add(label, line, sc)
		}
	}
	if drawn == 0 {
		return nil, fmt.Errorf("plot %q: no finite values: %w", feature, ErrNothingToPlot)
	}
	p.X.Min, p.X.Max = padRange(levels[0], levels[len(levels)-1], 0.06)
	p.Y.Min, p.Y.Max = padRange(ylo, yhi, 0.08)
	if legend {
		// Headroom for the legend (about 13 % of the data range per entry) so
		// that it does not hide the curves.
		p.Y.Max += (p.Y.Max - p.Y.Min) * 0.13 * float64(drawn)
	}
	p.Legend.Top = true
	p.Legend.Left = false
	return p, nil
}
