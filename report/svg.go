package report

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	fig "github.com/tracesift/tracesift/report/figure"
)

// The figures are drawn by this small SVG writer rather than a plotting
// library: the output is plain, compact SVG (no embedded fonts, text stays
// selectable and takes the page's fonts), and every number is printed with
// a fixed rounding, so the same data always give the same bytes.

// scale maps data values on one axis to the unit interval, linearly or by
// log10.
type scale struct {
	lo, hi float64
	log    bool
}

// frac returns where v lies between lo (0) and hi (1); NaN for values a log
// axis cannot show.
func (s scale) frac(v float64) float64 {
	if s.log {
		if !(v > 0) {
			return math.NaN()
		}
		return (math.Log10(v) - math.Log10(s.lo)) / (math.Log10(s.hi) - math.Log10(s.lo))
	}
	return (v - s.lo) / (s.hi - s.lo)
}

// chart is one figure: a plot area with axes, grid, clipped content and
// labels, written as an inline <svg> element.
type chart struct {
	id                       string
	w, h                     float64
	left, right, top, bottom float64
	x, y                     scale
	xlabel, ylabel           string
	title                    string // accessible name of the figure
	// xticks/yticks override the automatic ticks when set.
	xticks, yticks []tick
	noYAxis        bool // hide the y axis (strip plots)
	body           strings.Builder
	over           strings.Builder
	legend         []legendEntry
	legendLeft     bool // place the legend at the top left instead of top right
	legendBottom   bool // place the legend at the bottom (right unless legendLeft)
	// nested charts are panels of a figure (panelRow): drawn as an inner
	// <svg> at (ox, 0) of the figure, without their own title.
	nested bool
	ox     float64
	// avoid records what the content draws (lines, markers, bars) in user
	// units, so the legend can be moved off data it would cover.
	avoid fig.Obstacles
}

type tick struct {
	v     float64
	label string // may hold <tspan> markup (already escaped)
	minor bool   // drawn as a short tick without grid line and label
}

type legendEntry struct {
	label  string
	stroke string
	fill   string
	dash   string
	marker string // "", "circle", "square", "diamond"
}

// newChart returns a chart of w×h user units (CSS pixels) with margins
// wide enough for tick labels and axis titles.
func newChart(id string, w, h float64, x, y scale) *chart {
	return &chart{id: id, w: w, h: h, left: 62, right: 14, top: 12, bottom: 44, x: x, y: y}
}

func (c *chart) plotW() float64 { return c.w - c.left - c.right }
func (c *chart) plotH() float64 { return c.h - c.top - c.bottom }

// px and py map data coordinates to user units (NaN when not drawable).
func (c *chart) px(v float64) float64 { return c.left + c.x.frac(v)*c.plotW() }
func (c *chart) py(v float64) float64 { return c.top + (1-c.y.frac(v))*c.plotH() }

// polyline draws the points (xs[i], ys[i]) joined by straight lines,
// breaking the line at points that cannot be drawn (NaN, or ≤ 0 on a log
// axis). Points far outside the plot are clamped so the path stays short.
func (c *chart) polyline(xs, ys []float64, stroke string, width float64, dash string) {
	var b strings.Builder
	var piece []fig.Point
	flush := func() {
		if b.Len() == 0 {
			return
		}
		fmt.Fprintf(&c.body, `<path d="%s" fill="none" stroke="%s" stroke-width="%s"%s stroke-linejoin="round"/>`+"\n",
			b.String(), stroke, num(width), dashAttr(dash))
		b.Reset()
		c.avoid.Lines = append(c.avoid.Lines, piece)
		piece = nil
	}
	for i := range xs {
		X, Y := c.px(xs[i]), c.py(ys[i])
		if !finite(X) || !finite(Y) {
			flush()
			continue
		}
		X, Y = c.clampX(X), c.clampY(Y)
		piece = append(piece, fig.Point{X: X, Y: Y})
		if b.Len() == 0 {
			b.WriteString("M" + num(X) + " " + num(Y))
		} else {
			b.WriteString("L" + num(X) + " " + num(Y))
		}
	}
	flush()
}

// clampX/clampY keep far-away coordinates a little outside the plot area
// (the clip path hides them) so paths do not carry huge numbers.
func (c *chart) clampX(v float64) float64 { return math.Max(-c.w, math.Min(2*c.w, v)) }
func (c *chart) clampY(v float64) float64 { return math.Max(-c.h, math.Min(2*c.h, v)) }

// area fills the band between lower and upper over xs (min/max envelopes).
func (c *chart) area(xs, lower, upper []float64, fill, stroke string) {
	c.band(xs, lower, upper, fill, stroke, 1)
}

// band is area with a fill opacity below 1 (bands of several groups seen
// through each other); the stroke is left out when it is "".
func (c *chart) band(xs, lower, upper []float64, fill, stroke string, opacity float64) {
	var b strings.Builder
	var outline []fig.Point
	defer func() { c.avoid.Lines = append(c.avoid.Lines, outline) }()
	for i := range xs {
		X, Y := c.px(xs[i]), c.py(upper[i])
		if !finite(X) || !finite(Y) {
			continue
		}
		outline = append(outline, fig.Point{X: c.clampX(X), Y: c.clampY(Y)})
		if b.Len() == 0 {
			b.WriteString("M")
		} else {
			b.WriteString("L")
		}
		b.WriteString(num(c.clampX(X)) + " " + num(c.clampY(Y)))
	}
	for i := len(xs) - 1; i >= 0; i-- {
		X, Y := c.px(xs[i]), c.py(lower[i])
		if !finite(X) || !finite(Y) {
			continue
		}
		outline = append(outline, fig.Point{X: c.clampX(X), Y: c.clampY(Y)})
		b.WriteString("L" + num(c.clampX(X)) + " " + num(c.clampY(Y)))
	}
	if b.Len() == 0 {
		return
	}
	if opacity < 1 {
		fmt.Fprintf(&c.body, `<path d="%sZ" fill="%s" fill-opacity="%s" stroke="none"/>`+"\n", b.String(), fill, num(opacity))
		return
	}
	fmt.Fprintf(&c.body, `<path d="%sZ" fill="%s" stroke="%s" stroke-width="0.6" stroke-linejoin="round"/>`+"\n", b.String(), fill, stroke)
}

// markers draws a marker of the given shape and radius at each point.
func (c *chart) markers(xs, ys []float64, shape string, r float64, fill, stroke string) {
	for i := range xs {
		X, Y := c.px(xs[i]), c.py(ys[i])
		if !finite(X) || !finite(Y) {
			continue
		}
		c.body.WriteString(marker(shape, X, Y, r, fill, stroke))
		c.avoid.Points = append(c.avoid.Points, fig.Point{X: X, Y: Y})
		c.avoid.Radius = math.Max(c.avoid.Radius, r)
	}
}

func marker(shape string, X, Y, r float64, fill, stroke string) string {
	switch shape {
	case "square":
		return fmt.Sprintf(`<rect x="%s" y="%s" width="%s" height="%s" fill="%s" stroke="%s" stroke-width="0.8"/>`+"\n",
			num(X-r), num(Y-r), num(2*r), num(2*r), fill, stroke)
	case "diamond":
		s := r * 1.35
		return fmt.Sprintf(`<path d="M%s %sL%s %sL%s %sL%s %sZ" fill="%s" stroke="%s" stroke-width="0.8"/>`+"\n",
			num(X), num(Y-s), num(X+s), num(Y), num(X), num(Y+s), num(X-s), num(Y), fill, stroke)
	case "star":
		var b strings.Builder
		for k := 0; k < 10; k++ {
			rad := r * 1.7
			if k%2 == 1 {
				rad = r * 0.75
			}
			a := -math.Pi/2 + float64(k)*math.Pi/5
			if k == 0 {
				b.WriteString("M")
			} else {
				b.WriteString("L")
			}
			b.WriteString(num(X+rad*math.Cos(a)) + " " + num(Y+rad*math.Sin(a)))
		}
		return fmt.Sprintf(`<path d="%sZ" fill="%s" stroke="%s" stroke-width="0.9" stroke-linejoin="round"/>`+"\n", b.String(), fill, stroke)
	}
	return fmt.Sprintf(`<circle cx="%s" cy="%s" r="%s" fill="%s" stroke="%s" stroke-width="0.8"/>`+"\n",
		num(X), num(Y), num(r), fill, stroke)
}

// bars draws one rectangle per bin [lo[i], hi[i]] from the bottom of the
// plot (or from base on a linear axis) up to v[i]; bins with nothing to
// draw are skipped.
func (c *chart) bars(lo, hi, v []float64, base float64, fill, stroke string) {
	for i := range v {
		x0, x1 := c.px(lo[i]), c.px(hi[i])
		y1 := c.py(v[i])
		y0 := c.top + c.plotH()
		if !c.y.log {
			y0 = c.py(base)
		}
		if !finite(x0) || !finite(x1) || !finite(y1) {
			continue
		}
		y1 = c.clampY(y1)
		top, height := math.Min(y0, y1), math.Abs(y0-y1)
		if height < 0.05 {
			continue
		}
		fmt.Fprintf(&c.body, `<rect x="%s" y="%s" width="%s" height="%s" fill="%s" stroke="%s" stroke-width="0.5"/>`+"\n",
			num(x0), num(top), num(math.Max(x1-x0, 0.1)), num(height), fill, stroke)
		c.avoid.Boxes = append(c.avoid.Boxes, fig.Rect{X0: x0, Y0: top, X1: x0 + math.Max(x1-x0, 0.1), Y1: top + height})
	}
}

// steps draws a histogram outline over the bins [edges[i], edges[i+1]].
func (c *chart) steps(edges, v []float64, stroke string, width float64, dash string) {
	var xs, ys []float64
	for i := range v {
		xs = append(xs, edges[i], edges[i+1])
		ys = append(ys, v[i], v[i])
	}
	c.polyline(xs, ys, stroke, width, dash)
}

// vline and hline draw lines across the whole plot at a data value.
func (c *chart) vline(v float64, stroke string, width float64, dash string) {
	X := c.px(v)
	if !finite(X) {
		return
	}
	fmt.Fprintf(&c.body, `<path d="M%s %sV%s" stroke="%s" stroke-width="%s"%s/>`+"\n",
		num(X), num(c.top), num(c.top+c.plotH()), stroke, num(width), dashAttr(dash))
}

func (c *chart) hline(v float64, stroke string, width float64, dash string) {
	Y := c.py(v)
	if !finite(Y) {
		return
	}
	fmt.Fprintf(&c.body, `<path d="M%s %sH%s" stroke="%s" stroke-width="%s"%s/>`+"\n",
		num(c.left), num(Y), num(c.left+c.plotW()), stroke, num(width), dashAttr(dash))
}

// label writes text at a data point, offset by (dx, dy) user units; anchor
// is start, middle or end. Labels are not clipped.
func (c *chart) label(x, y, dx, dy float64, anchor, text, fill string, size float64) {
	X, Y := c.px(x), c.py(y)
	if !finite(X) || !finite(Y) {
		return
	}
	c.labelAt(X+dx, Y+dy, anchor, text, fill, size)
}

// labelAt writes text at user coordinates.
func (c *chart) labelAt(X, Y float64, anchor, text, fill string, size float64) {
	fmt.Fprintf(&c.over, `<text x="%s" y="%s" text-anchor="%s" font-size="%s" fill="%s">%s</text>`+"\n",
		num(X), num(Y), anchor, num(size), fill, esc(text))
}

// svg renders the chart.
func (c *chart) svg() string {
	var b strings.Builder
	if c.nested {
		fmt.Fprintf(&b, `<svg x="%s" y="0" viewBox="0 0 %s %s" width="%s" height="%s">`+"\n",
			num(c.ox), num(c.w), num(c.h), num(c.w), num(c.h))
	} else {
		openFigure(&b, c.w, c.h, c.id, c.title)
	}
	fmt.Fprintf(&b, `<defs><clipPath id="%s-clip"><rect x="%s" y="%s" width="%s" height="%s"/></clipPath></defs>`+"\n",
		c.id, num(c.left), num(c.top), num(c.plotW()), num(c.plotH()))
	fmt.Fprintf(&b, `<rect x="%s" y="%s" width="%s" height="%s" fill="#ffffff" stroke="none"/>`+"\n",
		num(c.left), num(c.top), num(c.plotW()), num(c.plotH()))

	xt := c.xticks
	if xt == nil {
		xt = ticks(c.x)
	}
	yt := c.yticks
	if yt == nil && !c.noYAxis {
		yt = ticks(c.y)
	}
	bottom := c.top + c.plotH()
	right := c.left + c.plotW()
	// Grid.
	b.WriteString(`<g stroke="#e3e3e3" stroke-width="0.7">` + "\n")
	for _, t := range xt {
		if X := c.px(t.v); !t.minor && finite(X) {
			fmt.Fprintf(&b, `<path d="M%s %sV%s"/>`+"\n", num(X), num(c.top), num(bottom))
		}
	}
	for _, t := range yt {
		if Y := c.py(t.v); !t.minor && finite(Y) {
			fmt.Fprintf(&b, `<path d="M%s %sH%s"/>`+"\n", num(c.left), num(Y), num(right))
		}
	}
	b.WriteString("</g>\n")
	// Content.
	fmt.Fprintf(&b, `<g clip-path="url(#%s-clip)">`+"\n", c.id)
	b.WriteString(c.body.String())
	b.WriteString("</g>\n")
	// Frame, ticks and tick labels.
	fmt.Fprintf(&b, `<rect x="%s" y="%s" width="%s" height="%s" fill="none" stroke="#555555" stroke-width="0.8"/>`+"\n",
		num(c.left), num(c.top), num(c.plotW()), num(c.plotH()))
	b.WriteString(`<g stroke="#555555" stroke-width="0.8">` + "\n")
	for _, t := range xt {
		if X := c.px(t.v); finite(X) {
			l := 4.0
			if t.minor {
				l = 2.5
			}
			fmt.Fprintf(&b, `<path d="M%s %sv%s"/>`+"\n", num(X), num(bottom), num(l))
		}
	}
	for _, t := range yt {
		if Y := c.py(t.v); finite(Y) {
			l := 4.0
			if t.minor {
				l = 2.5
			}
			fmt.Fprintf(&b, `<path d="M%s %sh%s"/>`+"\n", num(c.left), num(Y), num(-l))
		}
	}
	b.WriteString("</g>\n")
	b.WriteString(`<g fill="#333333">` + "\n")
	for _, t := range xt {
		if X := c.px(t.v); !t.minor && t.label != "" && finite(X) {
			fmt.Fprintf(&b, `<text x="%s" y="%s" text-anchor="middle">%s</text>`+"\n", num(X), num(bottom+16), t.label)
		}
	}
	for _, t := range yt {
		if Y := c.py(t.v); !t.minor && t.label != "" && finite(Y) {
			fmt.Fprintf(&b, `<text x="%s" y="%s" text-anchor="end">%s</text>`+"\n", num(c.left-6), num(Y+4), t.label)
		}
	}
	if c.xlabel != "" {
		fmt.Fprintf(&b, `<text x="%s" y="%s" text-anchor="middle" font-size="12">%s</text>`+"\n",
			num(c.left+c.plotW()/2), num(c.h-8), esc(c.xlabel))
	}
	if c.ylabel != "" {
		fmt.Fprintf(&b, `<text transform="translate(%s %s) rotate(-90)" text-anchor="middle" font-size="12">%s</text>`+"\n",
			num(15), num(c.top+c.plotH()/2), esc(c.ylabel))
	}
	b.WriteString("</g>\n")
	b.WriteString(c.over.String())
	b.WriteString(c.legendSVG())
	b.WriteString("</svg>")
	return b.String()
}

// openFigure writes the opening tag of a figure's <svg> (w × h user units)
// and its accessible title.
func openFigure(b *strings.Builder, w, h float64, id, title string) {
	fmt.Fprintf(b, `<svg class="fig" viewBox="0 0 %s %s" width="%s" height="%s" role="img" aria-labelledby="%s-t" font-family="DejaVu Sans, Helvetica, Arial, sans-serif" font-size="11">`+"\n",
		num(w), num(h), num(w), num(h), id)
	fmt.Fprintf(b, `<title id="%s-t">%s</title>`+"\n", id, esc(title))
}

// panelRow draws charts side by side as one figure (an outer <svg> of
// class fig holding each chart as a nested <svg>), titled title.
func panelRow(id, title string, panels []*chart) string {
	var b strings.Builder
	w, h := 0.0, 0.0
	for _, p := range panels {
		w += p.w
		h = math.Max(h, p.h)
	}
	openFigure(&b, w, h, id, title)
	x := 0.0
	for _, p := range panels {
		p.nested, p.ox = true, x
		b.WriteString(p.svg())
		b.WriteString("\n")
		x += p.w
	}
	b.WriteString("</svg>")
	return b.String()
}

// legendSVG draws the legend box in the corner of the plot area the chart
// asks for, or, when it would cover drawn data there, where
// fig.PlaceLegend finds a free place.
func (c *chart) legendSVG() string {
	if len(c.legend) == 0 {
		return ""
	}
	width := 0.0
	for _, e := range c.legend {
		width = math.Max(width, textWidth(e.label, 10.5))
	}
	width += 34
	height := float64(len(c.legend))*15 + 6
	x0 := c.left + c.plotW() - width - 6
	if c.legendLeft {
		x0 = c.left + 6
	}
	y0 := c.top + 6
	if c.legendBottom {
		y0 = c.top + c.plotH() - height - 6
	}
	if c.avoid.Clearance(fig.Rect{X0: x0, Y0: y0, X1: x0 + width, Y1: y0 + height}, 1) <= 0 {
		plot := fig.Rect{X0: c.left, Y0: c.top, X1: c.left + c.plotW(), Y1: c.top + c.plotH()}
		if r, ok := fig.PlaceLegend(plot, width, height, 6, c.avoid); ok {
			x0, y0 = r.X0, r.Y0
		}
	}
	var b strings.Builder
	fmt.Fprintf(&b, `<g font-size="10.5"><rect x="%s" y="%s" width="%s" height="%s" fill="#ffffff" fill-opacity="0.9" stroke="#bbbbbb" stroke-width="0.6"/>`+"\n",
		num(x0), num(y0), num(width), num(height))
	for i, e := range c.legend {
		y := y0 + 12 + float64(i)*15
		switch {
		case e.marker != "":
			b.WriteString(marker(e.marker, x0+14, y-3.5, 3.2, e.fill, e.stroke))
		case e.fill != "":
			fmt.Fprintf(&b, `<rect x="%s" y="%s" width="16" height="8" fill="%s" stroke="%s" stroke-width="0.6"/>`+"\n",
				num(x0+6), num(y-8), e.fill, e.stroke)
		default:
			fmt.Fprintf(&b, `<path d="M%s %sh18" stroke="%s" stroke-width="1.6"%s/>`+"\n", num(x0+5), num(y-3.5), e.stroke, dashAttr(e.dash))
		}
		fmt.Fprintf(&b, `<text x="%s" y="%s" fill="#222222">%s</text>`+"\n", num(x0+28), num(y), esc(e.label))
	}
	b.WriteString("</g>\n")
	return b.String()
}

// ticks returns the major ticks of a scale (fig.Linear with about five
// steps, or fig.Log), labelled in one notation per axis.
func ticks(s scale) []tick {
	if !(s.hi > s.lo) {
		return nil
	}
	var ft []fig.Tick
	if s.log {
		ft = fig.Log(s.lo, s.hi)
	} else {
		ft = fig.Linear(s.lo, s.hi, 5)
	}
	out := make([]tick, len(ft))
	for i, t := range ft {
		out[i] = tick{v: t.Value, minor: t.Minor}
		if !t.Minor {
			out[i].label = labelSVG(t.Label)
		}
	}
	return out
}

// labelSVG writes a tick label as SVG text content, the exponent of a
// scientific label raised in a smaller size.
func labelSVG(l fig.Label) string {
	if !l.Sci || l.Mant == "0" {
		return esc(l.Mant)
	}
	p := `10<tspan dy="-5" font-size="8">` + minus(strconv.Itoa(l.Exp)) + `</tspan>`
	if l.Mant == "" {
		return p
	}
	return esc(l.Mant) + "×" + p
}

// intTicks returns ticks at the integers of [lo, hi] with the given step.
func intTicks(lo, hi float64) []tick {
	step := math.Max(1, fig.NiceStep((hi-lo)/6))
	var out []tick
	for v := math.Ceil(lo/step) * step; v <= hi+1e-9; v += step {
		out = append(out, tick{v: v, label: strconv.Itoa(int(v))})
	}
	return out
}

// num prints a coordinate rounded to 0.1 user unit (CSS pixel), without a
// negative zero, so output bytes depend only on the rounded geometry.
func num(v float64) string {
	r := math.Round(v*10) / 10
	if r == 0 {
		return "0"
	}
	return strconv.FormatFloat(r, 'f', -1, 64)
}

func dashAttr(d string) string {
	if d == "" {
		return ""
	}
	return ` stroke-dasharray="` + d + `"`
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// minus replaces the ASCII hyphen of a negative number by a minus sign.
func minus(s string) string { return strings.Replace(s, "-", "−", 1) }

// esc escapes text for XML/HTML content and attribute values.
func esc(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch r {
		case '&':
			b.WriteString("&amp;")
		case '<':
			b.WriteString("&lt;")
		case '>':
			b.WriteString("&gt;")
		case '"':
			b.WriteString("&#34;")
		case '\'':
			b.WriteString("&#39;")
		default:
			if r < 0x20 && r != '\t' && r != '\n' {
				continue // not allowed in XML 1.0
			}
			b.WriteRune(r)
		}
	}
	return b.String()
}

// textWidth estimates the rendered width of s at the given font size (an
// average glyph is about 0.56 em wide in common sans-serif fonts), for
// legend boxes and label placement.
func textWidth(s string, size float64) float64 {
	return float64(len([]rune(s))) * size * 0.56
}
