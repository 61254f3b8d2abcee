package surrogate

import (
	"errors"
	"fmt"
	"image/color"
	"io"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
)

// PlotOptions control Plot. The zero value means a 6 × 4 inch image and
// ⌈√M⌉ bins clamped to [5, 50].
type PlotOptions struct {
	Width, Height vg.Length // image size; 0 means 6 in × 4 in
	Bins          int       // histogram bins; 0 means ⌈√M⌉ in [5, 50]
	Title         string    // "" means "<stat>: <M> <method> surrogates, p = …"
}

// ErrNothingToPlot is returned by Plot for a result without surrogate values
// or without a finite observed value.
var ErrNothingToPlot = errors.New("nothing to plot")

// Plot writes a PNG of the surrogate distribution of r (a histogram of
// r.Values) with the observed value marked by a vertical line, axes
// labelled with the statistic's name and the number of surrogates. The
// caller owns w (write to a temporary file and rename for atomic output).
func Plot(w io.Writer, r Result, opts PlotOptions) error {
	if len(r.Values) == 0 || math.IsNaN(r.Observed) || math.IsInf(r.Observed, 0) {
		return fmt.Errorf("plot %q: %w", r.Stat, ErrNothingToPlot)
	}
	width, height := opts.Width, opts.Height
	if width <= 0 {
		width = 6 * vg.Inch
	}
	if height <= 0 {
		height = 4 * vg.Inch
	}
	bins := opts.Bins
	if bins <= 0 {
		bins = min(50, max(5, int(math.Ceil(math.Sqrt(float64(len(r.Values)))))))
	}

	lo, hi := r.Values[0], r.Values[0]
	for _, v := range r.Values {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	if hi == lo {
		d := math.Max(math.Abs(lo)*1e-3, 1e-12)
		lo, hi = lo-d, hi+d
	}
	bw := (hi - lo) / float64(bins)
	h := &plotter.Histogram{
		Bins:      make([]plotter.HistogramBin, bins),
		Width:     bw,
		FillColor: color.Gray{Y: 180},
		LineStyle: plotter.DefaultLineStyle,
	}
	for b := range h.Bins {
		h.Bins[b].Min = lo + float64(b)*bw
		h.Bins[b].Max = lo + float64(b+1)*bw
	}
	for _, v := range r.Values {
		b := min(bins-1, int((v-lo)/bw))
		h.Bins[b].Weight++
	}
	top := 0.0
	for _, b := range h.Bins {
		top = math.Max(top, b.Weight)
	}

	p := plot.New()
	p.Title.Text = opts.Title
	if p.Title.Text == "" {
		p.Title.Text = fmt.Sprintf("%s: %d %s surrogates, p = %.3g (%s)", r.Stat, len(r.Values), r.Method, r.P, r.Side)
	}
	p.X.Label.Text = r.Stat
	p.Y.Label.Text = "number of surrogates"
	p.Add(h)
	line, err := plotter.NewLine(plotter.XYs{{X: r.Observed, Y: 0}, {X: r.Observed, Y: top * 1.05}})
	if err != nil {
		return fmt.Errorf("plot %q: %w", r.Stat, err)
	}
	line.Color = color.RGBA{R: 200, A: 255}
	line.Width = vg.Points(2)
	p.Add(line)
	p.Legend.Add("surrogates", h)
	p.Legend.Add(fmt.Sprintf("observed = %.4g", r.Observed), line)
	// Axes: the bins and the observed value with a 5% margin, headroom
	// above the bars for the legend, placed on the side away from the
	// bulk of the histogram.
	xlo, xhi := math.Min(lo, r.Observed), math.Max(hi, r.Observed)
	pad := 0.05 * (xhi - xlo)
	p.X.Min, p.X.Max = xlo-pad, xhi+pad
	p.Y.Min, p.Y.Max = 0, top*1.45
	p.Y.Tick.Marker = countTicks{}
	p.Legend.Top = true
	p.Legend.Left = (lo+hi)/2 > (xlo+xhi)/2

	wt, err := p.WriterTo(width, height, "png")
	if err != nil {
		return fmt.Errorf("plot %q: %w", r.Stat, err)
	}
	if _, err := wt.WriteTo(w); err != nil {
		return fmt.Errorf("plot %q: write: %w", r.Stat, err)
	}
	return nil
}

// countTicks labels the count axis with plain integers.
type countTicks struct{}

// Ticks returns gonum's default ticks with labels written as %g.
func (countTicks) Ticks(lo, hi float64) []plot.Tick {
	ts := plot.DefaultTicks{}.Ticks(lo, hi)
	for i := range ts {
		if ts[i].Label != "" {
			ts[i].Label = strconv.FormatFloat(ts[i].Value, 'g', -1, 64)
		}
	}
	return ts
}
