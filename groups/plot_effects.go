package groups

import (
	"fmt"
	"image/color"
	"io"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// PlotEffects writes a PNG summarising the effect sizes: one row per
// feature (in list order, top to bottom), Cliff's δ of every pair on the
// x axis (−1…1), one colour per pair, a filled marker when the feature
// is significant for that pair (adjusted p ≤ α) and an open one
// otherwise, with dashed guides at the magnitude thresholds ±0.147,
// ±0.33 and ±0.474 (Romano et al. 2006). The default height grows with
// the number of features (0.28 inch per feature and legend row plus 1.6
// inches).
func PlotEffects(w io.Writer, r Result, opts PlotOptions) error {
	nf := len(r.Features)
	if nf == 0 || len(r.Pairs) == 0 {
		return fmt.Errorf("plot effects: %w", ErrNothingToPlot)
	}
	p := plot.New()
	p.Title.Text = opts.Title
	if p.Title.Text == "" {
		p.Title.Text = fmt.Sprintf("Effect sizes (filled: adjusted p ≤ %g, %s)", r.Settings.Alpha, r.Settings.Adjust)
	}
	p.X.Label.Text = "Cliff's δ (B over A)"
	p.X.Min, p.X.Max = -1.05, 1.05
	// Headroom above the first feature for the legend (about 0.65 row
	// per entry), so it never hides a marker.
	head := 0.65*float64(len(r.Pairs)) + 0.2
	p.Y.Min, p.Y.Max = -0.7, float64(nf)-0.3+head
	p.X.Tick.Marker = plot.ConstantTicks{
		{Value: -1, Label: "−1"}, {Value: -0.474}, {Value: -0.33}, {Value: -0.147},
		{Value: -0.5, Label: "−0.5"}, {Value: 0, Label: "0"}, {Value: 0.5, Label: "0.5"},
		{Value: 0.147}, {Value: 0.33}, {Value: 0.474}, {Value: 1, Label: "1"},
	}
	ticks := make([]plot.Tick, nf)
	for f, name := range r.Features {
		ticks[f] = plot.Tick{Value: rowY(f, nf), Label: name}
	}
	p.Y.Tick.Marker = plot.ConstantTicks(ticks)
	p.Y.Tick.Label.Font.Size = vg.Points(9)

	guide := func(x float64, dashed bool) error {
		l, err := plotter.NewLine(plotter.XYs{{X: x, Y: p.Y.Min}, {X: x, Y: float64(nf) - 0.3}})
		if err != nil {
			return err
		}
		l.Color = color.Gray{Y: 150}
		l.Width = vg.Points(0.8)
		if dashed {
			l.Color = color.Gray{Y: 190}
			l.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
		}
		p.Add(l)
		return nil
	}
	if err := guide(0, false); err != nil {
		return fmt.Errorf("plot effects: %w", err)
	}
	for _, x := range []float64{-0.474, -0.33, -0.147, 0.147, 0.33, 0.474} {
		if err := guide(x, true); err != nil {
			return fmt.Errorf("plot effects: %w", err)
		}
	}
	np := len(r.Pairs)
	step := 0.0
	if np > 1 {
		step = math.Min(0.6/float64(np-1), 0.2)
	}
	drawn := 0
	for pi, pr := range r.Pairs {
		var filled, open plotter.XYs
		off := (float64(np-1)/2 - float64(pi)) * step
		for f, t := range pr.Tests {
			if math.IsNaN(t.CliffDelta) {
				continue
			}
			pt := plotter.XY{X: t.CliffDelta, Y: rowY(f, nf) + off}
			if t.Significant {
				filled = append(filled, pt)
			} else {
				open = append(open, pt)
			}
		}
		col := groupColor(pi)
		label := fmt.Sprintf("%s vs %s", pr.B, pr.A)
		var thumb plot.Thumbnailer
		if len(filled) > 0 {
			s, err := plotter.NewScatter(filled)
			if err != nil {
				return fmt.Errorf("plot effects: %w", err)
			}
			s.GlyphStyle = draw.GlyphStyle{Color: col, Radius: vg.Points(3.5), Shape: draw.CircleGlyph{}}
			p.Add(s)
			thumb = s
			drawn++
		}
		if len(open) > 0 {
			s, err := plotter.NewScatter(open)
			if err != nil {
				return fmt.Errorf("plot effects: %w", err)
			}
			s.GlyphStyle = draw.GlyphStyle{Color: col, Radius: vg.Points(3.5), Shape: draw.RingGlyph{}}
			p.Add(s)
			if thumb == nil {
				thumb = s
			}
			drawn++
		}
		if thumb != nil {
			p.Legend.Add(label, thumb)
		}
	}
	if drawn == 0 {
		return fmt.Errorf("plot effects: no finite effect size: %w", ErrNothingToPlot)
	}
	p.Legend.Top = true
	p.Legend.Left = false
	width, height := opts.size(7*vg.Inch, vg.Length((float64(nf)+head)*0.28+1.6)*vg.Inch)
	return writePNG(w, p, width, height, "effects")
}

// rowY puts feature f of nf on row nf−1−f, so the first feature is on top.
func rowY(f, nf int) float64 { return float64(nf - 1 - f) }
