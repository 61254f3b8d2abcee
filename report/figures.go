package report

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features/surrogate"
	fig "github.com/tracesift/tracesift/report/figure"
)

// Colours: one per class, and a few neutral inks. Chosen for this report;
// they stay distinguishable in greyscale print (different lightness).
var classColour = map[string]string{
	"chaotic":                    "#b3412a",
	"stochastic":                 "#2f6f8f",
	"regular":                    "#5b8a2e",
	classifier.UndeterminedLabel: "#6f6f6f",
}

const (
	inkTrace  = "#24486b"
	fillTrace = "#c9d8e6"
	inkRef    = "#7a7a7a"
	inkFit    = "#b3412a"
	inkHVG    = "#2f6f8f"
	inkNVG    = "#a3662b"
	fillHist  = "#d9e3ec"
	inkHist   = "#5d7890"
)

func colourOf(class string) string {
	if c, ok := classColour[class]; ok {
		return c
	}
	return classColour[classifier.UndeterminedLabel]
}

// Figure sizes in CSS pixels (user units). Wide figures span the screen
// column; half-width ones sit side by side on screen. In print every figure
// is scaled down to the text width of an A4 or Letter page (CSS max-width).
const (
	wideW, wideH   = 900.0, 300.0
	halfW, halfH   = 420.0, 300.0
	planeW, planeH = 760.0, 470.0
)

// probabilityFigure draws the class probabilities as horizontal bars with
// the model's confidence threshold.
func probabilityFigure(v classifier.Verdict, minProb float64) string {
	n := float64(len(v.Classes))
	c := newChart("fig-prob", 460, 40+28*n, scale{0, 1, false}, scale{0, n, false})
	c.left, c.bottom, c.top, c.right = 86, 40, 8, 46
	c.left = fitLeft(v.Classes, c.left)
	c.title = "Class probabilities"
	c.xlabel = "probability"
	c.xticks = []tick{{v: 0, label: "0"}, {v: 0.25, label: "0.25"}, {v: 0.5, label: "0.5"}, {v: 0.75, label: "0.75"}, {v: 1, label: "1"}}
	for i, cl := range v.Classes {
		y := n - float64(i) - 0.5
		c.yticks = append(c.yticks, tick{v: y, label: esc(cl)})
		p := v.Probabilities[i]
		x0, x1 := c.px(0), c.px(p)
		y0, y1 := c.py(y+0.32), c.py(y-0.32)
		fmt.Fprintf(&c.body, `<rect x="%s" y="%s" width="%s" height="%s" fill="%s" stroke="none"/>`+"\n",
			num(x0), num(y0), num(math.Max(x1-x0, 0.5)), num(y1-y0), colourOf(cl))
		c.label(p, y, 5, 4, "start", fmt.Sprintf("%.2f", p), "#222222", 11)
	}
	if minProb > 0 && minProb < 1 {
		c.vline(minProb, "#444444", 1, "4 3")
	}
	return c.svg()
}

// contributionBar draws one driver's contribution as a small bar right of
// the centre (towards the verdict) or left (against it).
func contributionBar(contrib, maxAbs float64, colour string) string {
	const w, h = 120.0, 12.0
	var b strings.Builder
	fmt.Fprintf(&b, `<svg class="bar" viewBox="0 0 %s %s" width="%s" height="%s" aria-hidden="true">`, num(w), num(h), num(w), num(h))
	fmt.Fprintf(&b, `<path d="M%s 0V%s" stroke="#999999" stroke-width="0.8"/>`, num(w/2), num(h))
	if maxAbs > 0 && finite(contrib) {
		l := contrib / maxAbs * (w/2 - 2)
		x0 := w / 2
		fill := colour
		if l < 0 {
			x0 += l
			l = -l
			fill = "#9a9a9a"
		}
		fmt.Fprintf(&b, `<rect x="%s" y="2" width="%s" height="%s" fill="%s"/>`, num(x0), num(math.Max(l, 0.5)), num(h-4), fill)
	}
	b.WriteString(`</svg>`)
	return b.String()
}

// traceFigure draws the trace (its min/max envelope when reduced).
func traceFigure(p *TracePanel, s Summary) string {
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := range p.Lo {
		lo, hi = math.Min(lo, p.Lo[i]), math.Max(hi, p.Hi[i])
	}
	pad := (hi - lo) * 0.05
	if pad == 0 {
		pad = 1
	}
	tf, tlabel := timeAxis(s, p.T[len(p.T)-1])
	vf, vlabel := valueAxis(s, math.Max(math.Abs(lo), math.Abs(hi)))
	ts := make([]float64, len(p.T))
	for i, t := range p.T {
		ts[i] = t * tf
	}
	lov, hiv := scaled(p.Lo, vf), scaled(p.Hi, vf)
	c := newChart("fig-trace", wideW, wideH, scale{ts[0], ts[len(ts)-1], false}, scale{(lo - pad) * vf, (hi + pad) * vf, false})
	if ts[len(ts)-1] == ts[0] {
		c.x.hi = ts[0] + 1
	}
	c.title = "The trace"
	c.xlabel, c.ylabel = tlabel, vlabel
	if p.Reduced {
		c.area(ts, lov, hiv, fillTrace, inkTrace)
	} else {
		c.polyline(ts, lov, inkTrace, 0.9, "")
	}
	return c.svg()
}

// incrementsFigure draws the density of the normalised increments on a log
// axis with the fitted Gaussian.
func incrementsFigure(p *IncrementsPanel) string {
	h := p.Hist
	ymin, ymax := math.Inf(1), 0.0
	for _, d := range h.Density {
		if d > 0 {
			ymin = math.Min(ymin, d)
			ymax = math.Max(ymax, d)
		}
	}
	for _, g := range h.Gaussian {
		ymax = math.Max(ymax, g)
	}
	if !(ymax > 0) || math.IsInf(ymin, 0) {
		ymin, ymax = 1e-4, 1
	}
	ylo := math.Pow(10, math.Floor(math.Log10(ymin/2)))
	yhi := math.Pow(10, math.Ceil(math.Log10(ymax*1.5)))
	c := newChart("fig-increments", halfW, halfH, scale{h.Edges[0], h.Edges[len(h.Edges)-1], false}, scale{ylo, yhi, true})
	c.title = "Distribution of the normalised increments"
	c.xlabel = "normalised increment z (standard deviations)"
	c.ylabel = "probability density"
	c.bars(h.Edges[:len(h.Edges)-1], h.Edges[1:], h.Density, 0, fillHist, inkHist)
	// The Gaussian of the same mean and sd, drawn finely (the histogram
	// helper evaluates it at the bin centres only).
	var gx, gy []float64
	for i := 0; i <= 400; i++ {
		z := h.Edges[0] + (h.Edges[len(h.Edges)-1]-h.Edges[0])*float64(i)/400
		gx = append(gx, z)
		d := (z - h.Mean) / h.SD
		gy = append(gy, math.Exp(-d*d/2)/(h.SD*math.Sqrt(2*math.Pi)))
	}
	c.polyline(gx, gy, inkFit, 1.6, "")
	c.legend = []legendEntry{
		{label: "increments", fill: fillHist, stroke: inkHist},
		{label: "fitted Gaussian", stroke: inkFit},
	}
	return c.svg()
}

// hvgDegreeFigure draws the HVG degree distribution on semi-log axes with
// the i.i.d. law and the fitted exponential tail.
func hvgDegreeFigure(g *GraphPanel) string {
	var ks, ps []float64
	kmax := 2
	pmin := 1.0
	for _, d := range g.Degrees.Distribution {
		ks = append(ks, float64(d.K))
		ps = append(ps, d.P)
		kmax = max(kmax, d.K)
		pmin = math.Min(pmin, d.P)
	}
	ylo := math.Pow(10, math.Floor(math.Log10(pmin/3)))
	c := newChart("fig-hvg", halfW, halfH, scale{0, float64(kmax) + 1, false}, scale{ylo, 1, true})
	c.title = "HVG degree distribution"
	c.xlabel, c.ylabel = "degree k", "P(k)"
	c.xticks = intTicks(0, float64(kmax)+1)
	var lx, ly []float64
	for k := 2; k <= kmax+1; k++ {
		lx = append(lx, float64(k))
		ly = append(ly, iidHVG(k))
	}
	c.polyline(lx, ly, inkRef, 1.3, "5 3")
	c.legend = []legendEntry{{label: "HVG of the trace", marker: "circle", fill: inkHVG, stroke: inkHVG},
		{label: "i.i.d.: (1/3)(2/3)^(k−2)", stroke: inkRef, dash: "5 3"}}
	if t := g.Tail; t != nil {
		fx, fy := exponentialTail(t.KMin, kmax+1, float64(t.NTail)/float64(g.Nodes), t.Lambda)
		c.polyline(fx, fy, inkFit, 1.6, "")
		c.legend = append(c.legend, legendEntry{label: fmt.Sprintf("fitted tail, λ = %.3f", t.Lambda), stroke: inkFit})
	}
	c.markers(ks, ps, "circle", 2.6, inkHVG, inkHVG)
	return c.svg()
}

// nvgDegreeFigure draws the NVG degree distribution on log–log axes with
// the fitted discrete power law.
func nvgDegreeFigure(g *GraphPanel) string {
	var ks, ps []float64
	kmax := 2
	pmin := 1.0
	for _, d := range g.Degrees.Distribution {
		if d.K < 1 {
			continue
		}
		ks = append(ks, float64(d.K))
		ps = append(ps, d.P)
		kmax = max(kmax, d.K)
		pmin = math.Min(pmin, d.P)
	}
	xhi := float64(kmax) * 1.5
	ylo := math.Pow(10, math.Floor(math.Log10(pmin/3)))
	c := newChart("fig-nvg", halfW, halfH, scale{1, xhi, true}, scale{ylo, 1, true})
	c.title = "NVG degree distribution"
	c.xlabel, c.ylabel = "degree k", "P(k)"
	c.legend = []legendEntry{{label: "NVG of the trace", marker: "circle", fill: inkNVG, stroke: inkNVG}}
	if f := g.PowerLaw; f != nil {
		fx, fy := powerLawTail(f.KMin, kmax, float64(f.NTail)/float64(g.Nodes), f.Gamma)
		c.polyline(fx, fy, inkFit, 1.6, "")
		c.legend = append(c.legend, legendEntry{label: fmt.Sprintf("power law, γ = %.2f (k ≥ %d)", f.Gamma, f.KMin), stroke: inkFit})
	}
	c.markers(ks, ps, "circle", 2.2, inkNVG, inkNVG)
	return c.svg()
}

// clusteringFigure draws the histograms of the local clustering
// coefficients of both graphs (share of nodes per bin of width 0.05).
func clusteringFigure(h, n *GraphPanel) string {
	ymax := 0.0
	type hist struct {
		edges, share []float64
		ink, label   string
	}
	var hs []hist
	for _, g := range []*GraphPanel{h, n} {
		if g == nil {
			continue
		}
		hh := hist{ink: inkHVG, label: "HVG"}
		if g.Kind == "nvg" {
			hh.ink, hh.label = inkNVG, "NVG"
		}
		for i, b := range g.Clustering.Histogram {
			if i == 0 {
				hh.edges = append(hh.edges, b.Lo)
			}
			hh.edges = append(hh.edges, b.Hi)
			s := float64(b.Count) / float64(g.Nodes)
			hh.share = append(hh.share, s)
			ymax = math.Max(ymax, s)
		}
		hs = append(hs, hh)
	}
	c := newChart("fig-clustering", halfW, halfH, scale{0, 1, false}, scale{0, math.Max(ymax*1.1, 0.01), false})
	c.title = "Local clustering coefficients"
	c.xlabel, c.ylabel = "local clustering coefficient C", "share of nodes"
	for _, hh := range hs {
		c.steps(hh.edges, hh.share, hh.ink, 1.8, "")
		c.legend = append(c.legend, legendEntry{label: hh.label, stroke: hh.ink})
	}
	return c.svg()
}

// clusteringByDegreeFigure draws C(k), the mean clustering of the nodes of
// degree k, for both graphs on log–log axes, with C(k) = 2/k, the exact
// HVG relation (Luque et al. 2009).
func clusteringByDegreeFigure(h, n *GraphPanel) string {
	kmax, cmin := 4.0, 1.0
	for _, g := range []*GraphPanel{h, n} {
		if g == nil {
			continue
		}
		for _, b := range g.Clustering.ByDegree {
			if b.Mean > 0 {
				kmax = math.Max(kmax, float64(b.K))
				cmin = math.Min(cmin, b.Mean)
			}
		}
	}
	xhi := kmax * 1.5
	ylo := math.Pow(10, math.Floor(math.Log10(cmin/2)))
	c := newChart("fig-ck", halfW, halfH, scale{1, xhi, true}, scale{ylo, 1.5, true})
	c.title = "Clustering against degree"
	c.xlabel, c.ylabel = "degree k", "mean clustering C(k)"
	c.legendLeft, c.legendBottom = true, true
	var rx, ry []float64
	for i := 0; i <= 40; i++ {
		k := 2 * math.Pow(xhi/2, float64(i)/40)
		rx = append(rx, k)
		ry = append(ry, 2/k)
	}
	c.polyline(rx, ry, inkRef, 1.3, "5 3")
	c.legend = append(c.legend, legendEntry{label: "C(k) = 2/k (HVG law)", stroke: inkRef, dash: "5 3"})
	for _, g := range []*GraphPanel{h, n} {
		if g == nil {
			continue
		}
		var xs, ys []float64
		for _, b := range g.Clustering.ByDegree {
			xs = append(xs, float64(b.K))
			ys = append(ys, b.Mean)
		}
		ink, shape, label := inkHVG, "circle", "HVG"
		if g.Kind == "nvg" {
			ink, shape, label = inkNVG, "square", "NVG"
		}
		c.markers(xs, ys, shape, 2.2, ink, ink)
		c.legend = append(c.legend, legendEntry{label: label, marker: shape, fill: ink, stroke: ink})
	}
	return c.svg()
}

// planeFigure draws the complexity–entropy plane with its bounds, the
// reference systems coloured by class and the trace.
func planeFigure(p *PlanePanel) string {
	cmax := 0.0
	for _, q := range p.Upper {
		cmax = math.Max(cmax, q.Complexity)
	}
	cmax = math.Max(cmax, p.Trace.Complexity)
	c := newChart("fig-plane", planeW, planeH, scale{0, 1, false}, scale{0, math.Ceil(cmax*1.08*20) / 20, false})
	c.title = "Complexity–entropy plane"
	c.xlabel = fmt.Sprintf("normalised permutation entropy H (order %d)", p.Order)
	c.ylabel = "statistical complexity C"
	var bx, by []float64
	for _, q := range p.Lower {
		bx = append(bx, q.Entropy)
		by = append(by, q.Complexity)
	}
	c.polyline(bx, by, "#8c8c8c", 1.1, "")
	bx, by = nil, nil
	for _, q := range p.Upper {
		bx = append(bx, q.Entropy)
		by = append(by, q.Complexity)
	}
	c.polyline(bx, by, "#8c8c8c", 1.1, "")

	// Labels are placed greedily beside their points (fig.PlaceLabels),
	// the trace's first, each in the first of a few positions that does
	// not overlap a label or point already placed; a label set further
	// off gets a leader line to the nearest point of its box. A point with
	// no free place stays unlabelled here (the table below the figure
	// lists every reference with its coordinates).
	type pt struct {
		label string
		ink   string
		size  float64
		bold  bool
	}
	var obstacles []fig.Rect
	var boxes []fig.TextBox
	var pts []pt
	tx, ty := c.px(p.Trace.Entropy), c.py(p.Trace.Complexity)
	boxes = append(boxes, fig.TextBox{Anchor: fig.Point{X: tx, Y: ty}, Width: textWidth("this trace", 11.5) * 1.1, Ascent: 11.5, Descent: 2})
	pts = append(pts, pt{"this trace", "#111111", 11.5, true})
	for _, r := range p.References {
		if r.Error != "" {
			continue
		}
		at := fig.Point{X: c.px(r.Entropy), Y: c.py(r.Complexity)}
		obstacles = append(obstacles, fig.Around(at, 4))
		boxes = append(boxes, fig.TextBox{Anchor: at, Width: textWidth(r.Label, 10), Ascent: 10, Descent: 2})
		pts = append(pts, pt{r.Label, colourOf(r.Class), 10, false})
	}
	obstacles = append(obstacles, fig.Around(fig.Point{X: tx, Y: ty}, 7))
	placed := fig.PlaceLabels(boxes, fig.LabelOptions{
		Bounds:    fig.Rect{X0: c.left, Y0: c.top, X1: c.left + c.plotW(), Y1: c.top + c.plotH()},
		Obstacles: obstacles,
	})
	for i, at := range placed {
		if !at.Placed {
			continue
		}
		if at.Leader {
			fmt.Fprintf(&c.over, `<path d="M%s %sL%s %s" stroke="#9a9a9a" stroke-width="0.6"/>`+"\n",
				num(boxes[i].Anchor.X), num(boxes[i].Anchor.Y), num(at.LeaderEnd.X), num(at.LeaderEnd.Y))
		}
		weight := ""
		if pts[i].bold {
			weight = ` font-weight="bold"`
		}
		fmt.Fprintf(&c.over, `<text x="%s" y="%s" font-size="%s" fill="%s"%s>%s</text>`+"\n",
			num(at.Origin.X), num(at.Origin.Y), num(pts[i].size), pts[i].ink, weight, esc(pts[i].label))
	}
	for _, r := range p.References {
		if r.Error != "" {
			continue
		}
		c.markers([]float64{r.Entropy}, []float64{r.Complexity}, "circle", 3.6, colourOf(r.Class), "#ffffff")
	}
	c.markers([]float64{p.Trace.Entropy}, []float64{p.Trace.Complexity}, "star", 4.2, "#111111", "#ffffff")
	c.legendLeft = true
	c.legend = []legendEntry{
		{label: "this trace", marker: "star", fill: "#111111", stroke: "#111111"},
		{label: "chaotic reference", marker: "circle", fill: colourOf("chaotic"), stroke: "#ffffff"},
		{label: "stochastic reference", marker: "circle", fill: colourOf("stochastic"), stroke: "#ffffff"},
		{label: "regular reference", marker: "circle", fill: colourOf("regular"), stroke: "#ffffff"},
		{label: "bounds of the plane", stroke: "#8c8c8c"},
	}
	return c.svg()
}

// surrogateFigure draws, for each statistic, the surrogate values and the
// observed value in units of the surrogate standard deviation around the
// surrogate mean, so statistics of different scales share one axis.
func surrogateFigure(results []surrogate.Result) string {
	var rows []surrogate.Result
	for _, r := range results {
		if r.Error == "" && len(r.Values) > 0 && r.SD > 0 {
			rows = append(rows, r)
		}
	}
	if len(rows) == 0 {
		return ""
	}
	const zcap = 30.0
	zmax := 4.0
	for _, r := range rows {
		zmax = math.Max(zmax, math.Min(math.Abs(r.Z)*1.12, zcap))
		for _, v := range r.Values {
			zmax = math.Max(zmax, math.Min(math.Abs((v-r.Mean)/r.SD)*1.05, zcap))
		}
	}
	n := float64(len(rows))
	c := newChart("fig-surrogates", wideW, 56+34*n, scale{-zmax, zmax, false}, scale{0, n, false})
	c.left, c.right, c.top = 104, 20, 8
	var stats []string
	for _, r := range rows {
		stats = append(stats, r.Stat)
	}
	c.left = fitLeft(stats, c.left)
	c.title = "Observed statistics against their surrogate distributions"
	c.xlabel = "(value − surrogate mean) / surrogate sd"
	c.vline(0, "#bbbbbb", 1, "")
	for _, z := range []float64{-1.96, 1.96} {
		c.vline(z, "#bbbbbb", 1, "3 3")
	}
	for i, r := range rows {
		y := n - float64(i) - 0.5
		c.yticks = append(c.yticks, tick{v: y, label: esc(r.Stat)})
		var zs, ys []float64
		for _, v := range r.Values {
			zs = append(zs, math.Max(-zmax, math.Min(zmax, (v-r.Mean)/r.SD)))
			ys = append(ys, y)
		}
		for _, z := range zs {
			X := c.px(z)
			fmt.Fprintf(&c.body, `<path d="M%s %sv%s" stroke="%s" stroke-width="1.2"/>`+"\n", num(X), num(c.py(y)-7), num(14), inkHist)
		}
		zo := math.Max(-zmax, math.Min(zmax, r.Z))
		ink := "#111111"
		if r.Significant {
			ink = inkFit
		}
		c.body.WriteString(marker("diamond", c.px(zo), c.py(y), 4.5, ink, "#ffffff"))
		if math.Abs(r.Z) > zmax {
			anchor, dx := "end", -9.0
			if r.Z < 0 {
				anchor, dx = "start", 9
			}
			c.label(zo, y, dx, -7, anchor, "z = "+strconv.FormatFloat(r.Z, 'f', 1, 64), ink, 10)
		}
	}
	return c.svg()
}

// fitLeft returns the left margin of a chart whose y tick labels are
// labels: room for the widest (at the chart's 11-unit font, set 6 units
// left of the axis) and 4 units to the figure's edge, and never less than
// floor.
func fitLeft(labels []string, floor float64) float64 {
	var ws []float64
	for _, l := range labels {
		ws = append(ws, textWidth(l, 11))
	}
	return fig.LeftMargin(ws, 6, 0, 4, floor)
}

// scaled returns xs multiplied by f.
func scaled(xs []float64, f float64) []float64 {
	out := make([]float64, len(xs))
	for i, v := range xs {
		out[i] = v * f
	}
	return out
}

// siPrefixes are the metric prefixes used to bring axis numbers to 1–1000.
var siPrefixes = []struct {
	exp    int
	prefix string
}{{-15, "f"}, {-12, "p"}, {-9, "n"}, {-6, "µ"}, {-3, "m"}, {0, ""}, {3, "k"}, {6, "M"}, {9, "G"}}

// engineering returns the power of ten (a multiple of 3) that brings
// maxAbs into [1, 1000).
func engineering(maxAbs float64) int {
	if !(maxAbs > 0) || math.IsInf(maxAbs, 0) {
		return 0
	}
	e := int(math.Floor(math.Log10(maxAbs)/3)) * 3
	return max(-15, min(9, e))
}

// valueAxis returns the factor that scales trace values for the axis and
// the axis title with the prefixed unit (or a power of ten without one).
func valueAxis(s Summary, maxAbs float64) (float64, string) {
	name := s.Column
	if name == "" {
		name = "value"
	}
	e := engineering(maxAbs)
	if s.Unit != "" {
		for _, p := range siPrefixes {
			if p.exp == e {
				return math.Pow(10, float64(-e)), fmt.Sprintf("%s (%s%s)", name, p.prefix, s.Unit)
			}
		}
	}
	if e == 0 {
		return 1, name
	}
	return math.Pow(10, float64(-e)), fmt.Sprintf("%s (×10^%d)", name, e)
}

// timeAxis returns the factor and axis title for times in the trace's time
// unit (or sample indices without a time column).
func timeAxis(s Summary, tmax float64) (float64, string) {
	if s.Interval <= 0 {
		return 1, "sample"
	}
	sec, ok := secondsPer(s.TimeUnit)
	if !ok {
		if s.TimeUnit != "" {
			return 1, "time (" + s.TimeUnit + ")"
		}
		return 1, "time"
	}
	e := engineering(tmax * sec)
	if e > 0 {
		e = 0 // no kiloseconds: keep seconds
	}
	for _, p := range siPrefixes {
		if p.exp == e {
			return sec * math.Pow(10, float64(-e)), "time (" + p.prefix + "s)"
		}
	}
	return sec, "time (s)"
}
