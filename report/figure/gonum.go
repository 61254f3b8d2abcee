package figure

import (
	"image/color"
	"io"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// Superscript is a gonum text handler for one-line labels that draws the
// text after a caret as a raised exponent at 70% of the size ("2×10^−5"
// reads 2×10⁻⁵), the form Label.String writes. Text without a caret is
// drawn as text.Plain draws it. (The Liberation fonts gonum ships lack the
// Unicode superscripts ⁰, ⁹ and ⁻, so exponents are drawn, not encoded.)
type Superscript struct {
	Fonts *font.Cache
}

var _ text.Handler = Superscript{}

const (
	supScale = 0.7  // exponent size relative to the text
	supRaise = 0.42 // exponent baseline above the text's, in ems
)

func (h Superscript) plain() text.Plain { return text.Plain{Fonts: h.Fonts} }

// Cache returns the font cache.
func (h Superscript) Cache() *font.Cache { return h.Fonts }

// Extents returns the extents of fnt.
func (h Superscript) Extents(fnt font.Font) font.Extents { return h.plain().Extents(fnt) }

// Lines splits txt into lines.
func (h Superscript) Lines(txt string) []string { return h.plain().Lines(txt) }

func small(fnt font.Font) font.Font {
	s := fnt
	s.Size = fnt.Size * supScale
	return s
}

// Box returns the width, height above the baseline and depth below it of
// a one-line txt.
func (h Superscript) Box(txt string, fnt font.Font) (width, height, depth vg.Length) {
	base, exp, ok := strings.Cut(txt, "^")
	if !ok {
		return h.plain().Box(txt, fnt)
	}
	w, a, d := h.plain().Box(base, fnt)
	we, _, _ := h.plain().Box(exp, small(fnt))
	return w + we, a, d
}

// Draw draws txt with sty at pt.
func (h Superscript) Draw(c vg.Canvas, txt string, sty text.Style, pt vg.Point) {
	base, exp, ok := strings.Cut(strings.TrimRight(txt, "\n"), "^")
	if !ok || strings.Contains(txt, "\n") {
		h.plain().Draw(c, txt, sty, pt)
		return
	}
	fnt := h.Fonts.Lookup(sty.Font, sty.Font.Size)
	sf := small(sty.Font)
	sfnt := h.Fonts.Lookup(sf, sf.Size)
	c.SetColor(sty.Color)
	if sty.Rotation != 0 {
		c.Push()
		c.Rotate(sty.Rotation)
	}
	sin64, cos64 := math.Sincos(sty.Rotation)
	cos, sin := vg.Length(cos64), vg.Length(sin64)
	pt.X, pt.Y = pt.Y*sin+pt.X*cos, pt.Y*cos-pt.X*sin
	w, _, _ := h.Box(txt, sty.Font)
	pt.Y += sty.Height(txt)*vg.Length(sty.YAlign) - fnt.Extents().Ascent + sty.Font.Size
	pt.X += vg.Length(sty.XAlign) * w
	c.FillString(fnt, pt, base)
	c.FillString(sfnt, vg.Point{X: pt.X + fnt.Width(base), Y: pt.Y + supRaise*sty.Font.Size}, exp)
	if sty.Rotation != 0 {
		c.Pop()
	}
}

// LinearTicks is a gonum plot.Ticker giving Linear ticks (about N
// intervals; 0 means 5) with labels in one notation.
type LinearTicks struct{ N int }

// Ticks returns the ticks of [lo, hi].
func (t LinearTicks) Ticks(lo, hi float64) []plot.Tick {
	n := t.N
	if n <= 0 {
		n = 5
	}
	return gonumTicks(Linear(lo, hi, n))
}

// LogTicks is a gonum plot.Ticker giving Log ticks.
type LogTicks struct{}

// Ticks returns the ticks of [lo, hi].
func (LogTicks) Ticks(lo, hi float64) []plot.Tick { return gonumTicks(Log(lo, hi)) }

// ValueTicks returns constant ticks at the given values, labelled by
// FormatEach (so they share one notation) unless labels[i] is not empty.
func ValueTicks(vs []float64, labels []string) plot.ConstantTicks {
	ls := FormatEach(vs)
	out := make(plot.ConstantTicks, len(vs))
	for i, v := range vs {
		out[i] = plot.Tick{Value: v, Label: ls[i].String()}
		if i < len(labels) && labels[i] != "" {
			out[i].Label = labels[i]
		}
	}
	return out
}

func gonumTicks(ts []Tick) []plot.Tick {
	out := make([]plot.Tick, len(ts))
	for i, t := range ts {
		out[i] = plot.Tick{Value: t.Value}
		if !t.Minor {
			out[i].Label = t.Label.String()
		}
	}
	return out
}

// Plot is a gonum plot drawn with the package's conventions: tick labels
// in one notation per axis (exponents raised), an outer margin so no label
// or title reaches the image edge, and a legend set inside the data area
// where it covers no data, or below the plot when there is no such place.
// Add legend entries with AddLegend (not Plot.Legend) and mark what the
// legend must not cover with Avoid and AvoidLine.
type Plot struct {
	*plot.Plot
	// Margin is the blank border around the figure; FontSize the size of
	// tick labels, axis titles and legend text.
	Margin   vg.Length
	FontSize vg.Length
	// Overlay, when set, is called last with the canvas and the final
	// layout, to draw what needs image coordinates (placed labels).
	Overlay func(c draw.Canvas, m Mapping)
	entries []legendEntry
	points  [][2]float64
	lines   [][][2]float64
	avoidR  vg.Length
}

type legendEntry struct {
	name   string
	thumbs []plot.Thumbnailer
}

// NewPlot returns a Plot with linear axes.
func NewPlot() *Plot {
	p := &Plot{Plot: plot.New(), Margin: vg.Points(8), FontSize: vg.Points(11), avoidR: vg.Points(4)}
	for _, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Tick.Marker = LinearTicks{}
		ax.Tick.Label.Handler = Superscript{Fonts: font.DefaultCache}
	}
	return p
}

// LogAxis turns ax (p.X or p.Y) into a log axis with Log ticks.
func LogAxis(ax *plot.Axis) {
	ax.Scale = plot.LogScale{}
	ax.Tick.Marker = LogTicks{}
}

// AddLegend adds a legend entry.
func (p *Plot) AddLegend(name string, thumbs ...plot.Thumbnailer) {
	p.entries = append(p.entries, legendEntry{name, thumbs})
}

// Avoid marks data points (markers of radius up to r) that the legend
// must not cover.
func (p *Plot) Avoid(r vg.Length, xs, ys []float64) {
	p.avoidR = max(p.avoidR, r)
	for i := range xs {
		p.points = append(p.points, [2]float64{xs[i], ys[i]})
	}
}

// AvoidLine marks a polyline in data coordinates that the legend must not
// cross.
func (p *Plot) AvoidLine(xs, ys []float64) {
	l := make([][2]float64, len(xs))
	for i := range xs {
		l[i] = [2]float64{xs[i], ys[i]}
	}
	p.lines = append(p.lines, l)
}

// legendPad is the space between the legend's frame and its entries.
const legendPad = 4

// newLegend returns a gonum legend holding entries[from:to].
func (p *Plot) newLegend(from, to int) plot.Legend {
	l := plot.NewLegend()
	l.TextStyle.Font.Size = p.FontSize
	l.Top, l.Left = true, true
	for _, e := range p.entries[from:to] {
		l.Add(e.name, e.thumbs...)
	}
	return l
}

// legendSize returns the width and height of a one-column legend of the
// given entries without frame.
func (p *Plot) legendSize(from, to int) (vg.Length, vg.Length) {
	l := p.newLegend(from, to)
	sty := l.TextStyle
	var w, eh vg.Length
	for _, e := range p.entries[from:to] {
		w = max(w, l.ThumbnailWidth+sty.Rectangle(" "+e.name).Max.X)
		eh = max(eh, sty.Rectangle(e.name).Max.Y)
	}
	return w, eh * vg.Length(to-from)
}

func (p *Plot) styleText() {
	for _, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Label.TextStyle.Font.Size = p.FontSize
		ax.Tick.Label.Font.Size = p.FontSize * 0.9
	}
	p.Title.TextStyle.Font.Size = p.FontSize * 1.15
	p.Title.Padding = vg.Points(6)
}

// DataArea returns the data area of the plot when drawn into an image of
// width × height with its legend inside the data area: it lies at least
// Margin inside the image, right of the y axis with its tick labels and
// title.
func (p *Plot) DataArea(width, height vg.Length) vg.Rectangle {
	p.styleText()
	c := draw.New(vgimg.NewWith(vgimg.UseWH(width, height)))
	area, titles := p.logTitles(p.inner(c))
	defer titles(false)
	return p.DataCanvas(area).Rectangle
}

func (p *Plot) inner(c draw.Canvas) draw.Canvas {
	m := p.Margin
	return draw.Crop(c, m, -m, m, -m)
}

// WritePNG renders the plot as a width × height PNG with a white
// background.
func (p *Plot) WritePNG(w io.Writer, width, height vg.Length) error {
	img := vgimg.NewWith(vgimg.UseWH(width, height), vgimg.UseBackgroundColor(color.White))
	p.Draw(draw.New(img))
	_, err := vgimg.PngCanvas{Canvas: img}.WriteTo(w)
	return err
}

// Draw draws the plot and its legend on c.
func (p *Plot) Draw(c draw.Canvas) {
	p.styleText()
	p.Plot.Legend = plot.NewLegend()
	inner := p.inner(c)
	if len(p.entries) == 0 {
		area, titles := p.logTitles(inner)
		p.Plot.Draw(area)
		titles(true)
		p.overlay(c, area, vg.Rectangle{}, false)
		return
	}
	lw, lh := p.legendSize(0, len(p.entries))
	pad := vg.Points(legendPad)
	area, titles := p.logTitles(inner)
	if r, ok := p.placeInside(area, lw+2*pad, lh+2*pad); ok {
		p.Plot.Draw(area)
		titles(true)
		p.drawLegend(c, r, 0, len(p.entries), true)
		p.overlay(c, area, r, true)
		return
	}
	// Below the plot, in as many columns as fit under the data area.
	da := p.DataCanvas(area).Rectangle
	titles(false)
	n := len(p.entries)
	cols := 1
	for cols < n {
		next := cols + 1
		rows := (n + next - 1) / next
		total := vg.Length(0)
		for k := 0; k < n; k += rows {
			cw, _ := p.legendSize(k, min(n, k+rows))
			total += cw + 3*pad
		}
		if total > da.Max.X-da.Min.X {
			break
		}
		cols = next
	}
	rows := (n + cols - 1) / cols
	_, rh := p.legendSize(0, rows)
	strip := rh + 2*pad + vg.Points(4)
	area, titles = p.logTitles(draw.Crop(inner, 0, 0, strip, 0))
	p.Plot.Draw(area)
	titles(true)
	x := p.DataCanvas(area).Min.X
	for k := 0; k < n; k += rows {
		cw, ch := p.legendSize(k, min(n, k+rows))
		r := vg.Rectangle{Min: vg.Point{X: x, Y: inner.Min.Y}, Max: vg.Point{X: x + cw + 2*pad, Y: inner.Min.Y + ch + 2*pad}}
		p.drawLegend(c, r, k, min(n, k+rows), false)
		x += cw + 3*pad
	}
	p.overlay(c, area, vg.Rectangle{}, false)
}

// logTitles takes the titles of log axes out of the plot and reserves
// their room on c. gonum reserves room for an axis title around the data
// midpoint (Min+Max)/2, which on a log axis lies near the top or right end,
// so a long title shrinks the plot; these titles are drawn centred on the
// data area instead. The returned function draws them (when asked to)
// once the plot is drawn on the returned canvas, and puts them back.
func (p *Plot) logTitles(c draw.Canvas) (draw.Canvas, func(draw bool)) {
	_, xlog := p.X.Scale.(plot.LogScale)
	_, ylog := p.Y.Scale.(plot.LogScale)
	xt, yt := "", ""
	if xlog {
		xt, p.X.Label.Text = p.X.Label.Text, ""
	}
	if ylog {
		yt, p.Y.Label.Text = p.Y.Label.Text, ""
	}
	full := c
	if xt != "" {
		c = draw.Crop(c, 0, 0, p.X.Label.TextStyle.Height(xt)+p.X.Label.Padding, 0)
	}
	if yt != "" {
		sty := p.Y.Label.TextStyle
		c = draw.Crop(c, sty.Height(yt)+sty.FontExtents().Descent+p.Y.Label.Padding, 0, 0, 0)
	}
	area := c
	return area, func(drawn bool) {
		var da draw.Canvas
		if drawn {
			da = p.DataCanvas(area)
		}
		if xt != "" {
			if drawn {
				sty := p.X.Label.TextStyle
				full.FillText(sty, vg.Point{X: da.Center().X, Y: full.Min.Y + sty.FontExtents().Descent}, xt)
			}
			p.X.Label.Text = xt
		}
		if yt != "" {
			if drawn {
				sty := p.Y.Label.TextStyle
				sty.Rotation += math.Pi / 2
				x := full.Min.X + p.Y.Label.TextStyle.Height(yt) - sty.FontExtents().Descent
				full.FillText(sty, vg.Point{X: x, Y: da.Center().Y}, yt)
			}
			p.Y.Label.Text = yt
		}
	}
}

// placeInside finds a place for a legend box of w × h in the data area
// drawn on inner; the rectangle is in canvas coordinates.
func (p *Plot) placeInside(inner draw.Canvas, w, h vg.Length) (vg.Rectangle, bool) {
	dc := p.DataCanvas(inner)
	fx, fy := p.Transforms(&dc)
	top := float64(dc.Max.Y)
	conv := func(x, y float64) (Point, bool) {
		if !drawable(&p.X, x) || !drawable(&p.Y, y) {
			return Point{}, false
		}
		return Point{float64(fx(x)), top - float64(fy(y))}, true
	}
	var ob Obstacles
	ob.Radius = float64(p.avoidR)
	for _, q := range p.points {
		if pt, ok := conv(q[0], q[1]); ok {
			ob.Points = append(ob.Points, pt)
		}
	}
	for _, l := range p.lines {
		var pl []Point
		for _, q := range l {
			if pt, ok := conv(q[0], q[1]); ok {
				pl = append(pl, pt)
			} else if len(pl) > 0 {
				ob.Lines = append(ob.Lines, pl)
				pl = nil
			}
		}
		if len(pl) > 0 {
			ob.Lines = append(ob.Lines, pl)
		}
	}
	area := Rect{float64(dc.Min.X), 0, float64(dc.Max.X), top - float64(dc.Min.Y)}
	r, ok := PlaceLegend(area, float64(w), float64(h), 6, ob)
	if !ok {
		return vg.Rectangle{}, false
	}
	return vg.Rectangle{Min: vg.Point{X: vg.Length(r.X0), Y: vg.Length(top - r.Y1)}, Max: vg.Point{X: vg.Length(r.X1), Y: vg.Length(top - r.Y0)}}, true
}

// drawLegend draws entries[from:to] in r, with a white, framed background
// when framed.
func (p *Plot) drawLegend(c draw.Canvas, r vg.Rectangle, from, to int, framed bool) {
	if framed {
		c.SetColor(color.NRGBA{R: 255, G: 255, B: 255, A: 235})
		c.Fill(r.Path())
		c.StrokeLines(draw.LineStyle{Color: color.Gray{Y: 185}, Width: vg.Points(0.6)},
			[]vg.Point{r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}, r.Min})
	}
	pad := vg.Points(legendPad)
	l := p.newLegend(from, to)
	inner := draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{
		Min: vg.Point{X: r.Min.X + pad, Y: r.Min.Y + pad},
		Max: vg.Point{X: r.Max.X - pad, Y: r.Max.Y - pad + l.TextStyle.FontExtents().Descent},
	}}
	l.Draw(inner)
}

// Mapping is the layout of a drawn Plot in image coordinates of its
// canvas (y downwards from the canvas top).
type Mapping struct {
	// Data is the data area; Legend the legend's box when it lies inside
	// the data area (HasLegend).
	Data      Rect
	Legend    Rect
	HasLegend bool
	p         *Plot
	dc        draw.Canvas
	top       float64
}

// Point maps data coordinates to image coordinates; ok is false for
// values the axes cannot show.
func (m Mapping) Point(x, y float64) (pt Point, ok bool) {
	if !drawable(&m.p.X, x) || !drawable(&m.p.Y, y) {
		return Point{}, false
	}
	fx, fy := m.p.Transforms(&m.dc)
	return Point{float64(fx(x)), m.top - float64(fy(y))}, true
}

// Canvas maps image coordinates back to the canvas.
func (m Mapping) Canvas(pt Point) vg.Point {
	return vg.Point{X: vg.Length(pt.X), Y: vg.Length(m.top - pt.Y)}
}

func (p *Plot) overlay(c, area draw.Canvas, legend vg.Rectangle, has bool) {
	if p.Overlay == nil {
		return
	}
	dc := p.DataCanvas(area)
	top := float64(c.Max.Y)
	m := Mapping{p: p, dc: dc, top: top, HasLegend: has,
		Data: Rect{float64(dc.Min.X), top - float64(dc.Max.Y), float64(dc.Max.X), top - float64(dc.Min.Y)}}
	if has {
		m.Legend = Rect{float64(legend.Min.X), top - float64(legend.Max.Y), float64(legend.Max.X), top - float64(legend.Min.Y)}
	}
	p.Overlay(c, m)
}

// drawable reports whether an axis can show v.
func drawable(ax *plot.Axis, v float64) bool {
	if _, log := ax.Scale.(plot.LogScale); log && !(v > 0) {
		return false // a log scale panics on v ≤ 0
	}
	return finiteF(v) && finiteF(ax.Norm(v))
}
