package benchmarks

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"github.com/tracesift/tracesift/classifier"
)

// Figure is one PNG plot of a Result.
type Figure struct {
	// File is the file name the writers give it; Caption says what it
	// shows.
	File    string
	Caption string
	// Draw writes the PNG.
	Draw func(w io.Writer) error
}

// Figures returns the plots a Result supports, in report order; a figure
// whose data the run did not produce is left out.
func Figures(r *Result) []Figure {
	var out []Figure
	if len(r.Invariants) > 0 {
		out = append(out, Figure{"invariants.png",
			"Invariant recovery: deviation of each median estimate from its published or analytic value, in units of the check's tolerance (bars: interquartile range over seeds and lengths; the shaded band ±1 is within tolerance; deviations beyond ±3 are drawn at ±3).",
			func(w io.Writer) error { return plotInvariants(w, r.Invariants) }})
	}
	if c := r.Classification; c != nil {
		out = append(out, Figure{"accuracy_length.png",
			"Classification accuracy against series length (all SNRs pooled): overall, per true class (recall) and chaotic versus stochastic.",
			func(w io.Writer) error { return plotAccuracy(w, c, true) }})
		out = append(out, Figure{"accuracy_snr.png",
			"Classification accuracy against the observational signal-to-noise ratio (all lengths pooled).",
			func(w io.Writer) error { return plotAccuracy(w, c, false) }})
	}
	if h := r.Holdout; h != nil {
		out = append(out, Figure{"reliability.png",
			"Reliability diagram of the leave-one-family-out predictions: mean top-class probability against the accuracy it delivered, per bin (point area ∝ series in the bin); the diagonal is perfect calibration.",
			func(w io.Writer) error { return plotReliability(w, h.Validation.Calibration) }})
	}
	if d := r.Degrees; d != nil {
		out = append(out, Figure{"hvg_degrees.png",
			"HVG degree distributions on a semi-log axis with the i.i.d. law (1/3)(2/3)^(k−2), whose tail rate is ln(3/2) (Luque et al. 2009).",
			func(w io.Writer) error { return plotDegrees(w, d) }})
	}
	if p := r.Plane; p != nil && len(p.Points) > 0 {
		out = append(out, Figure{"complexity_entropy.png",
			fmt.Sprintf("Complexity–entropy plane (order %d) with every reference system at its default parameters, coloured by class, between the plane's bounds (Rosso et al. 2007).", p.Order),
			func(w io.Writer) error { return plotPlane(w, p) }})
	}
	if t := r.Throughput; t != nil && len(t.Operations) > 0 {
		out = append(out, Figure{"throughput.png",
			"Throughput (samples per second) against series length on log–log axes; p is the fitted exponent of time ~ n^p. Machine-dependent.",
			func(w io.Writer) error { return plotThroughput(w, t) }})
	}
	return out
}

var classColour = map[string]color.Color{
	"chaotic":    color.RGBA{R: 204, G: 51, B: 17, A: 255},
	"regular":    color.RGBA{R: 0, G: 119, B: 187, A: 255},
	"stochastic": color.RGBA{R: 0, G: 153, B: 136, A: 255},
}

func colourOf(class string, i int) color.Color {
	if c, ok := classColour[class]; ok {
		return c
	}
	return plotutil.Color(i)
}

func render(w io.Writer, p *plot.Plot, width, height vg.Length) error {
	wt, err := p.WriterTo(width, height, "png")
	if err != nil {
		return err
	}
	_, err = wt.WriteTo(w)
	return err
}

// renderLegendRight draws p with its legend in a column of its own on the
// right, so the legend never hides data.
func renderLegendRight(w io.Writer, p *plot.Plot, width, height, legendWidth vg.Length) error {
	img := vgimg.NewWith(vgimg.UseWH(width, height), vgimg.UseBackgroundColor(color.White))
	dc := draw.New(img)
	leg := p.Legend
	p.Legend = plot.NewLegend()
	p.Draw(draw.Crop(dc, 0, -legendWidth, 0, 0))
	leg.Top, leg.Left = true, true
	leg.YOffs = -vg.Points(24)
	leg.Draw(draw.Crop(dc, width-legendWidth+vg.Points(6), 0, 0, 0))
	_, err := vgimg.PngCanvas{Canvas: img}.WriteTo(w)
	return err
}

// plotInvariants draws each check's deviation in tolerance units.
func plotInvariants(w io.Writer, rows []InvariantRow) error {
	p := plot.New()
	p.Title.Text = "Invariant recovery (deviation / tolerance)"
	p.X.Label.Text = "(median estimate − published value) / tolerance"
	const clamp = 3.0
	var names []string
	var pts, out, bars plotter.XYs
	var errs plotter.XErrors
	k := 0
	for i := len(rows) - 1; i >= 0; i-- {
		r := rows[i]
		if r.Check != CheckValue {
			continue
		}
		scale := float64(r.Tolerance)
		if r.ToleranceKind == "relative" {
			scale *= math.Abs(float64(r.Value))
		}
		v := float64(r.Value)
		dev := func(x float64) float64 {
			d := x - v
			switch {
			case math.IsNaN(x):
				return math.NaN()
			case scale > 0:
				d /= scale
			case d == 0:
				return 0
			default:
				d = math.Copysign(math.Inf(1), d)
			}
			return math.Max(-clamp, math.Min(clamp, d))
		}
		names = append(names, r.ID)
		m := dev(float64(r.Estimate.Median))
		if math.IsNaN(m) {
			k++
			continue
		}
		lo, hi := dev(float64(r.Estimate.Q1)), dev(float64(r.Estimate.Q3))
		pt := plotter.XY{X: m, Y: float64(k)}
		bars = append(bars, pt)
		errs = append(errs, struct{ Low, High float64 }{m - math.Min(lo, m), math.Max(hi, m) - m})
		if r.Within {
			pts = append(pts, pt)
		} else {
			out = append(out, pt)
		}
		k++
	}
	if k == 0 {
		return fmt.Errorf("plot invariants: no value checks")
	}
	p.NominalY(names...)
	band, err := plotter.NewPolygon(plotter.XYs{{X: -1, Y: -0.5}, {X: 1, Y: -0.5}, {X: 1, Y: float64(k) - 0.5}, {X: -1, Y: float64(k) - 0.5}})
	if err != nil {
		return err
	}
	band.Color = color.RGBA{R: 220, G: 235, B: 220, A: 255}
	band.LineStyle.Width = 0
	p.Add(band)
	zero, err := plotter.NewLine(plotter.XYs{{X: 0, Y: -0.5}, {X: 0, Y: float64(k) - 0.5}})
	if err != nil {
		return err
	}
	zero.LineStyle.Dashes = []vg.Length{vg.Points(3), vg.Points(3)}
	p.Add(zero)
	if len(bars) > 0 {
		eb, err := plotter.NewXErrorBars(struct {
			plotter.XYs
			plotter.XErrors
		}{bars, errs})
		if err != nil {
			return err
		}
		p.Add(eb)
	}
	if len(pts) > 0 {
		sc, err := plotter.NewScatter(pts)
		if err != nil {
			return err
		}
		sc.GlyphStyle.Shape = draw.CircleGlyph{}
		sc.GlyphStyle.Color = color.RGBA{G: 100, A: 255}
		p.Add(sc)
		p.Legend.Add("within tolerance", sc)
	}
	if len(out) > 0 {
		sc, err := plotter.NewScatter(out)
		if err != nil {
			return err
		}
		sc.GlyphStyle.Shape = draw.CrossGlyph{}
		sc.GlyphStyle.Radius = vg.Points(4)
		sc.GlyphStyle.Color = color.RGBA{R: 200, A: 255}
		p.Add(sc)
		p.Legend.Add("outside tolerance", sc)
	}
	p.X.Min, p.X.Max = -clamp-0.2, clamp+0.2
	var ticks []plot.Tick
	for t := -clamp; t <= clamp; t++ {
		ticks = append(ticks, plot.Tick{Value: t, Label: strconv.FormatFloat(t, 'f', 0, 64)})
	}
	p.X.Tick.Marker = plot.ConstantTicks(ticks)
	p.Legend.Top = true
	p.Y.Tick.Label.Font.Size = vg.Points(7)
	return render(w, p, 8*vg.Inch, vg.Length(1.2+0.17*float64(k))*vg.Inch)
}

// plotAccuracy draws accuracy against length (byLength) or SNR.
func plotAccuracy(w io.Writer, c *ClassificationResult, byLength bool) error {
	p := plot.New()
	var xs []float64
	var scores []Score
	if byLength {
		p.Title.Text = "Accuracy against series length"
		p.X.Label.Text = "series length (samples)"
		p.X.Scale = plot.LogScale{}
		p.X.Tick.Marker = plot.ConstantTicks(lengthTicks(c.Lengths))
		for _, l := range c.Lengths {
			xs = append(xs, float64(l))
		}
		scores = c.ByLength
	} else {
		p.Title.Text = "Accuracy against signal-to-noise ratio"
		p.X.Label.Text = "observational SNR (dB)"
		xs, p.X.Tick.Marker = snrAxis(c.SNRs)
		scores = c.BySNR
	}
	p.Y.Label.Text = "fraction correct"
	p.Y.Min, p.Y.Max = 0, 1.02
	type line struct {
		name   string
		colour color.Color
		dash   []vg.Length
		get    func(Score) Float
	}
	lines := []line{{"overall", color.Black, nil, func(s Score) Float { return s.Accuracy }}}
	for i, cl := range c.Classes {
		i := i
		lines = append(lines, line{cl + " (recall)", colourOf(cl, i), nil, func(s Score) Float { return s.Recall[i] }})
	}
	lines = append(lines, line{"chaotic vs stochastic", color.Gray{Y: 110}, []vg.Length{vg.Points(4), vg.Points(3)}, func(s Score) Float { return s.ChaosNoise }})
	lines = append(lines, line{"undetermined rate", color.Gray{Y: 160}, []vg.Length{vg.Points(1), vg.Points(3)}, func(s Score) Float { return s.UndeterminedRate }})
	for k, l := range lines {
		var pts plotter.XYs
		for i, s := range scores {
			if v := float64(l.get(s)); !math.IsNaN(v) {
				pts = append(pts, plotter.XY{X: xs[i], Y: v})
			}
		}
		if len(pts) == 0 {
			continue
		}
		ln, sc, err := plotter.NewLinePoints(pts)
		if err != nil {
			return err
		}
		ln.LineStyle.Color, sc.GlyphStyle.Color = l.colour, l.colour
		ln.LineStyle.Width = vg.Points(1.5)
		ln.LineStyle.Dashes = l.dash
		sc.GlyphStyle.Shape = plotutil.Shape(k)
		p.Add(ln, sc)
		p.Legend.Add(l.name, ln, sc)
	}
	p.Add(plotter.NewGrid())
	return renderLegendRight(w, p, 8.5*vg.Inch, 4.5*vg.Inch, 2*vg.Inch)
}

func lengthTicks(ls []int) []plot.Tick {
	var t []plot.Tick
	for _, l := range ls {
		t = append(t, plot.Tick{Value: float64(l), Label: strconv.Itoa(l)})
	}
	return t
}

// snrAxis places the SNRs on a linear axis, with "clean" (+Inf, or NaN
// after a JSON round trip, where null stands for it) 10 dB beyond the
// largest finite SNR.
func snrAxis(snrs []Float) ([]float64, plot.Ticker) {
	top := 0.0
	for _, s := range snrs {
		if v := float64(s); !math.IsInf(v, 0) && !math.IsNaN(v) {
			top = math.Max(top, v)
		}
	}
	var xs []float64
	var ticks []plot.Tick
	for _, s := range snrs {
		v := float64(s)
		label := strconvG(v)
		if math.IsInf(v, 1) || math.IsNaN(v) {
			v, label = top+10, "clean"
		}
		xs = append(xs, v)
		ticks = append(ticks, plot.Tick{Value: v, Label: label})
	}
	return xs, plot.ConstantTicks(ticks)
}

// plotDegrees draws P(k) on a log y axis with the i.i.d. law.
func plotDegrees(w io.Writer, d *DegreeResult) error {
	p := plot.New()
	p.Title.Text = fmt.Sprintf("HVG degree distributions (n = %d)", d.Length)
	p.X.Label.Text = "degree k"
	p.Y.Label.Text = "P(k)"
	p.Y.Scale = plot.LogScale{}
	p.Y.Tick.Marker = plot.LogTicks{Prec: -1}
	kmax := 2
	pmin := 1.0
	for i, s := range d.Series {
		var pts plotter.XYs
		for j, k := range s.K {
			if pv := float64(s.P[j]); pv > 0 {
				pts = append(pts, plotter.XY{X: float64(k), Y: pv})
				kmax = max(kmax, k)
				pmin = math.Min(pmin, pv)
			}
		}
		if len(pts) == 0 {
			continue
		}
		ln, sc, err := plotter.NewLinePoints(pts)
		if err != nil {
			return err
		}
		c := plotutil.Color(i)
		ln.LineStyle.Color, sc.GlyphStyle.Color = c, c
		sc.GlyphStyle.Shape = plotutil.Shape(i)
		p.Add(ln, sc)
		p.Legend.Add(fmt.Sprintf("%s: λ = %.3f ± %.3f", s.Label, float64(s.Lambda), float64(s.LambdaErr)), ln, sc)
	}
	var ref plotter.XYs
	for k := 2; k <= kmax; k++ {
		pv := math.Pow(2.0/3, float64(k-2)) / 3
		if pv < pmin/10 {
			break
		}
		ref = append(ref, plotter.XY{X: float64(k), Y: pv})
	}
	if len(ref) > 1 {
		ln, err := plotter.NewLine(ref)
		if err != nil {
			return err
		}
		ln.LineStyle.Width = vg.Points(1.5)
		ln.LineStyle.Dashes = []vg.Length{vg.Points(5), vg.Points(3)}
		p.Add(ln)
		p.Legend.Add("i.i.d.: (1/3)(2/3)^(k−2), λ = ln(3/2)", ln)
	}
	p.Add(plotter.NewGrid())
	return renderLegendRight(w, p, 10.5*vg.Inch, 5*vg.Inch, 3.8*vg.Inch)
}

// plotPlane draws the complexity–entropy plane.
func plotPlane(w io.Writer, pl *PlaneResult) error {
	p := plot.New()
	p.Title.Text = fmt.Sprintf("Complexity–entropy plane (order %d, n = %d)", pl.Order, pl.Length)
	p.X.Label.Text = "normalised permutation entropy H"
	p.Y.Label.Text = "statistical complexity C"
	for _, b := range [][][2]Float{pl.Lower, pl.Upper} {
		var pts plotter.XYs
		for _, q := range b {
			pts = append(pts, plotter.XY{X: float64(q[0]), Y: float64(q[1])})
		}
		ln, err := plotter.NewLine(pts)
		if err != nil {
			return err
		}
		ln.LineStyle.Color = color.Gray{Y: 120}
		p.Add(ln)
	}
	classes := []string{"chaotic", "regular", "stochastic"}
	var all plotter.XYs
	var labels []string
	for i, cl := range classes {
		var pts plotter.XYs
		for _, q := range pl.Points {
			if q.Class == cl {
				pts = append(pts, plotter.XY{X: float64(q.Entropy), Y: float64(q.Complexity)})
			}
		}
		if len(pts) == 0 {
			continue
		}
		sc, err := plotter.NewScatter(pts)
		if err != nil {
			return err
		}
		sc.GlyphStyle.Color = colourOf(cl, i)
		sc.GlyphStyle.Shape = plotutil.Shape(i)
		sc.GlyphStyle.Radius = vg.Points(3)
		p.Add(sc)
		p.Legend.Add(cl, sc)
	}
	for _, q := range pl.Points {
		all = append(all, plotter.XY{X: float64(q.Entropy), Y: float64(q.Complexity)})
		labels = append(labels, q.System)
	}
	lb, err := plotter.NewLabels(plotter.XYLabels{XYs: all, Labels: labels})
	if err != nil {
		return err
	}
	for i := range lb.TextStyle {
		lb.TextStyle[i].Font.Size = vg.Points(6)
		lb.TextStyle[i].Color = color.Gray{Y: 60}
	}
	lb.Offset = vg.Point{X: vg.Points(3), Y: vg.Points(2)}
	p.Add(lb)
	p.X.Min, p.X.Max = 0, 1.05
	p.Y.Min = 0
	p.Legend.Left = true
	p.Legend.Top = true
	return render(w, p, 8*vg.Inch, 6*vg.Inch)
}

// plotThroughput draws samples per second against n on log–log axes.
func plotThroughput(w io.Writer, t *ThroughputResult) error {
	p := plot.New()
	p.Title.Text = fmt.Sprintf("Throughput (%s/%s, GOMAXPROCS %d; machine-dependent)", t.Machine.GOOS, t.Machine.GOARCH, t.Machine.GOMAXPROCS)
	p.X.Label.Text = "series length n (samples)"
	p.Y.Label.Text = "samples per second"
	p.X.Scale, p.Y.Scale = plot.LogScale{}, plot.LogScale{}
	p.X.Tick.Marker, p.Y.Tick.Marker = plot.LogTicks{Prec: -1}, plot.LogTicks{Prec: -1}
	for i, op := range t.Operations {
		var pts plotter.XYs
		for _, pt := range op.Points {
			if v := float64(pt.SamplesPerSecond); v > 0 && !math.IsInf(v, 0) {
				pts = append(pts, plotter.XY{X: float64(pt.N), Y: v})
			}
		}
		if len(pts) == 0 {
			continue
		}
		ln, sc, err := plotter.NewLinePoints(pts)
		if err != nil {
			return err
		}
		c := plotutil.Color(i)
		ln.LineStyle.Color, sc.GlyphStyle.Color = c, c
		ln.LineStyle.Width = vg.Points(1.5)
		sc.GlyphStyle.Shape = plotutil.Shape(i)
		p.Add(ln, sc)
		p.Legend.Add(fmt.Sprintf("%s (p = %.2f)", op.Name, float64(op.Exponent)), ln, sc)
	}
	p.Add(plotter.NewGrid())
	return renderLegendRight(w, p, 8.5*vg.Inch, 4.5*vg.Inch, 1.8*vg.Inch)
}

// plotReliability draws the reliability diagram of a calibration.
func plotReliability(w io.Writer, c classifier.Calibration) error {
	p := plot.New()
	p.Title.Text = fmt.Sprintf("Reliability (ECE %.3f, Brier %.3f)", c.ECE, c.Brier)
	p.X.Label.Text = "mean top-class probability"
	p.Y.Label.Text = "accuracy"
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = 0, 1, 0, 1
	diag, err := plotter.NewLine(plotter.XYs{{X: 0, Y: 0}, {X: 1, Y: 1}})
	if err != nil {
		return err
	}
	diag.LineStyle.Color = color.Gray{Y: 140}
	diag.LineStyle.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
	p.Add(diag)
	p.Legend.Add("perfect calibration", diag)
	var pts plotter.XYs
	total := 0
	for _, b := range c.Bins {
		total += b.Rows
		if b.Rows > 0 {
			pts = append(pts, plotter.XY{X: b.Confidence, Y: b.Accuracy})
		}
	}
	if len(pts) == 0 {
		return render(w, p, 5*vg.Inch, 5*vg.Inch)
	}
	ln, err := plotter.NewLine(pts)
	if err != nil {
		return err
	}
	ln.LineStyle.Width = vg.Points(1.5)
	p.Add(ln)
	k := 0
	for _, b := range c.Bins {
		if b.Rows == 0 {
			continue
		}
		sc, err := plotter.NewScatter(plotter.XYs{pts[k]})
		if err != nil {
			return err
		}
		sc.GlyphStyle.Shape = draw.CircleGlyph{}
		sc.GlyphStyle.Radius = vg.Points(2 + 10*math.Sqrt(float64(b.Rows)/float64(total)))
		sc.GlyphStyle.Color = color.Black
		p.Add(sc)
		k++
	}
	p.Legend.Add("held-out predictions", ln)
	p.Legend.Top, p.Legend.Left = false, false // bottom right, clear of the curve
	p.Add(plotter.NewGrid())
	return render(w, p, 5*vg.Inch, 5*vg.Inch)
}
