package benchmarks

import (
	"cmp"
	"fmt"
	"image/color"
	"io"
	"math"
	"slices"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/report/figure"
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
			fmt.Sprintf("Complexity–entropy plane (order %d) with every reference system at its default parameters, coloured by class, between the plane's bounds (Rosso et al. 2007). Systems whose points coincide share one label; a label set away from its point has a leader line.", p.Order),
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

// xys splits points into their coordinates (for figure.Plot's Avoid).
func xys(pts plotter.XYs) (xs, ys []float64) {
	for _, p := range pts {
		xs = append(xs, p.X)
		ys = append(ys, p.Y)
	}
	return xs, ys
}

// avoidLinePoints marks a line with markers at its points as something
// the legend must not cover.
func avoidLinePoints(p *figure.Plot, pts plotter.XYs, r vg.Length) {
	xs, ys := xys(pts)
	p.AvoidLine(xs, ys)
	p.Avoid(r, xs, ys)
}

// plotInvariants draws each check's deviation in tolerance units.
func plotInvariants(w io.Writer, rows []InvariantRow) error {
	p := figure.NewPlot()
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
		p.AvoidLine([]float64{math.Min(lo, m), math.Max(hi, m)}, []float64{float64(k), float64(k)})
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
	p.AvoidLine([]float64{0, 0}, []float64{-0.5, float64(k) - 0.5})
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
		p.AddLegend("within tolerance", sc)
		p.Avoid(vg.Points(4), xysX(pts), xysY(pts))
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
		p.AddLegend("outside tolerance", sc)
		p.Avoid(vg.Points(5), xysX(out), xysY(out))
	}
	p.X.Min, p.X.Max = -clamp-0.2, clamp+0.2
	var tv []float64
	for t := -clamp; t <= clamp; t++ {
		tv = append(tv, t)
	}
	p.X.Tick.Marker = figure.ValueTicks(tv, nil)
	return p.WritePNG(w, 8*vg.Inch, vg.Length(1.3+0.19*float64(k))*vg.Inch)
}

func xysX(pts plotter.XYs) []float64 { xs, _ := xys(pts); return xs }
func xysY(pts plotter.XYs) []float64 { _, ys := xys(pts); return ys }

// plotAccuracy draws accuracy against length (byLength) or SNR.
func plotAccuracy(w io.Writer, c *ClassificationResult, byLength bool) error {
	p := figure.NewPlot()
	var xs []float64
	var scores []Score
	if byLength {
		p.Title.Text = "Accuracy against series length"
		p.X.Label.Text = "series length (samples)"
		p.X.Scale = plot.LogScale{}
		for _, l := range c.Lengths {
			xs = append(xs, float64(l))
		}
		p.X.Tick.Marker = figure.ValueTicks(xs, nil)
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
		p.AddLegend(l.name, ln, sc)
		avoidLinePoints(p, pts, sc.GlyphStyle.Radius)
	}
	p.Add(plotter.NewGrid())
	return p.WritePNG(w, 7*vg.Inch, 4.5*vg.Inch)
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
	var labels []string
	for _, s := range snrs {
		v, label := float64(s), ""
		if math.IsInf(v, 1) || math.IsNaN(v) {
			v, label = top+10, "clean"
		}
		xs = append(xs, v)
		labels = append(labels, label)
	}
	return xs, figure.ValueTicks(xs, labels)
}

// plotDegrees draws P(k) on a log y axis with the i.i.d. law.
func plotDegrees(w io.Writer, d *DegreeResult) error {
	p := figure.NewPlot()
	p.Title.Text = fmt.Sprintf("HVG degree distributions (n = %d)", d.Length)
	p.X.Label.Text = "degree k"
	p.Y.Label.Text = "P(k)"
	figure.LogAxis(&p.Y)
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
		p.AddLegend(fmt.Sprintf("%s: λ = %.3f ± %.3f", s.Label, float64(s.Lambda), float64(s.LambdaErr)), ln, sc)
		avoidLinePoints(p, pts, sc.GlyphStyle.Radius)
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
		p.AddLegend("i.i.d.: (1/3)(2/3)^(k−2), λ = ln(3/2)", ln)
		xs, ys := xys(ref)
		p.AvoidLine(xs, ys)
	}
	p.Add(plotter.NewGrid())
	return p.WritePNG(w, 8*vg.Inch, 5*vg.Inch)
}

// plotPlane draws the complexity–entropy plane with every system's name
// beside its point (figure.PlaceLabels: no two names overlap; names set
// away from their points get leader lines).
func plotPlane(w io.Writer, pl *PlaneResult) error {
	p := figure.NewPlot()
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
		xs, ys := xys(pts)
		p.AvoidLine(xs, ys)
	}
	const radius = 3
	classes := []string{"chaotic", "regular", "stochastic"}
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
		sc.GlyphStyle.Radius = vg.Points(radius)
		p.Add(sc)
		p.AddLegend(cl, sc)
		xs, ys := xys(pts)
		p.Avoid(vg.Points(radius), xs, ys)
	}
	p.X.Min, p.X.Max = 0, 1.05
	p.Y.Min = 0
	p.Overlay = func(c draw.Canvas, m figure.Mapping) { planeLabels(c, m, pl, radius) }
	return p.WritePNG(w, 10*vg.Inch, 7.5*vg.Inch)
}

// planeLabels writes the system names beside their points on the plane.
// Points whose markers overlap (closer than a marker's diameter) share
// one label listing their names, a few to a line, since no placement can
// tell them apart.
func planeLabels(c draw.Canvas, m figure.Mapping, pl *PlaneResult, radius float64) {
	sty := plot.New().Legend.TextStyle
	sty.Font.Size = vg.Points(7)
	sty.Color = color.Gray{Y: 50}
	ext := sty.FontExtents()
	lineH := float64(sty.Font.Size) * 1.15
	var at []figure.Point
	var names []string
	var obstacles []figure.Rect
	var curves [][]figure.Point
	for _, b := range [][][2]Float{pl.Lower, pl.Upper} {
		var l []figure.Point
		for _, q := range b {
			if pt, ok := m.Point(float64(q[0]), float64(q[1])); ok {
				l = append(l, pt)
			}
		}
		curves = append(curves, l)
	}
	for _, q := range pl.Points {
		pt, ok := m.Point(float64(q.Entropy), float64(q.Complexity))
		if !ok {
			continue
		}
		at = append(at, pt)
		names = append(names, q.System)
		obstacles = append(obstacles, figure.Around(pt, radius+0.5))
	}
	if m.HasLegend {
		obstacles = append(obstacles, m.Legend)
	}
	groups := closeGroups(at, 2*radius)
	type group struct {
		lines []string
		box   figure.TextBox
		crowd int
	}
	gs := make([]group, len(groups))
	for k, members := range groups {
		var cx, cy float64
		var line string
		var g group
		for i, j := range members {
			cx += at[j].X / float64(len(members))
			cy += at[j].Y / float64(len(members))
			switch {
			case i == 0:
				line = names[j]
			case i%3 == 0:
				g.lines = append(g.lines, line+",")
				line = names[j]
			default:
				line += ", " + names[j]
			}
		}
		g.lines = append(g.lines, line)
		w := 0.0
		for _, l := range g.lines {
			w = math.Max(w, float64(sty.Width(l)))
		}
		g.box = figure.TextBox{Anchor: figure.Point{X: cx, Y: cy}, Width: w,
			Ascent: float64(ext.Ascent) + float64(len(g.lines)-1)*lineH, Descent: float64(ext.Descent)}
		gs[k] = g
	}
	// Labels in crowded places are placed first, while the space around
	// them is free; isolated points find room beside themselves later.
	for i := range gs {
		for j := range gs {
			if dx, dy := gs[i].box.Anchor.X-gs[j].box.Anchor.X, gs[i].box.Anchor.Y-gs[j].box.Anchor.Y; j != i && dx*dx+dy*dy < 20*20 {
				gs[i].crowd++
			}
		}
	}
	slices.SortStableFunc(gs, func(a, b group) int { return cmp.Compare(b.crowd, a.crowd) })
	boxes := make([]figure.TextBox, len(gs))
	for k, g := range gs {
		boxes[k] = g.box
	}
	placed := figure.PlaceLabels(boxes, figure.LabelOptions{Bounds: m.Data, Obstacles: obstacles,
		Rings: 30, RingStep: 9, LeadersBlock: true, Lines: curves})
	leader := draw.LineStyle{Color: color.Gray{Y: 120}, Width: vg.Points(0.6)}
	for k, at := range placed {
		if at.Placed && at.Leader {
			a, e := m.Canvas(boxes[k].Anchor), m.Canvas(at.LeaderEnd)
			c.StrokeLine2(leader, a.X, a.Y, e.X, e.Y)
		}
	}
	for k, at := range placed {
		if !at.Placed {
			continue
		}
		// text.Plain puts the baseline of one line (size s, ascent a)
		// s − a above the point it is given; lines run upwards from the
		// origin's baseline.
		n := len(gs[k].lines)
		for i, l := range gs[k].lines {
			o := m.Canvas(figure.Point{X: at.Origin.X, Y: at.Origin.Y - float64(n-1-i)*lineH})
			o.Y -= sty.Font.Size - ext.Ascent
			c.FillText(sty, o, l)
		}
	}
}

// closeGroups joins points closer than d (single linkage) and returns the
// groups as index lists in order of their first member, members in order.
func closeGroups(pts []figure.Point, d float64) [][]int {
	parent := make([]int, len(pts))
	for i := range parent {
		parent[i] = i
	}
	var find func(int) int
	find = func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	for i := range pts {
		for j := i + 1; j < len(pts); j++ {
			if math.Hypot(pts[i].X-pts[j].X, pts[i].Y-pts[j].Y) < d {
				if a, b := find(i), find(j); a != b {
					parent[max(a, b)] = min(a, b)
				}
			}
		}
	}
	index := map[int]int{}
	var out [][]int
	for i := range pts {
		r := find(i)
		k, ok := index[r]
		if !ok {
			k = len(out)
			index[r] = k
			out = append(out, nil)
		}
		out[k] = append(out[k], i)
	}
	return out
}

// plotThroughput draws samples per second against n on log–log axes.
func plotThroughput(w io.Writer, t *ThroughputResult) error {
	p := figure.NewPlot()
	p.Title.Text = fmt.Sprintf("Throughput (%s/%s, GOMAXPROCS %d; machine-dependent)", t.Machine.GOOS, t.Machine.GOARCH, t.Machine.GOMAXPROCS)
	p.X.Label.Text = "series length n (samples)"
	p.Y.Label.Text = "samples per second"
	figure.LogAxis(&p.X)
	figure.LogAxis(&p.Y)
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
		p.AddLegend(fmt.Sprintf("%s (p = %.2f)", op.Name, float64(op.Exponent)), ln, sc)
		avoidLinePoints(p, pts, sc.GlyphStyle.Radius)
	}
	p.Add(plotter.NewGrid())
	return p.WritePNG(w, 7*vg.Inch, 4.5*vg.Inch)
}

// plotReliability draws the reliability diagram of a calibration.
func plotReliability(w io.Writer, c classifier.Calibration) error {
	p := figure.NewPlot()
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
	p.AddLegend("perfect calibration", diag)
	p.AvoidLine([]float64{0, 1}, []float64{0, 1})
	var pts plotter.XYs
	total := 0
	for _, b := range c.Bins {
		total += b.Rows
		if b.Rows > 0 {
			pts = append(pts, plotter.XY{X: b.Confidence, Y: b.Accuracy})
		}
	}
	const size = 5 * vg.Inch
	if len(pts) == 0 {
		return p.WritePNG(w, size, size)
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
		p.Avoid(sc.GlyphStyle.Radius, []float64{pts[k].X}, []float64{pts[k].Y})
		k++
	}
	p.AddLegend("held-out predictions", ln)
	xs, ys := xys(pts)
	p.AvoidLine(xs, ys)
	p.Add(plotter.NewGrid())
	return p.WritePNG(w, size, size)
}
