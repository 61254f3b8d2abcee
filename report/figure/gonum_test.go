package figure

import (
	"bytes"
	"image"
	"image/png"
	"testing"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// longLabelPlot is a plot with nominal y labels as long as the invariant
// identifiers of the bench suite, and a legend.
func longLabelPlot(t *testing.T) (*Plot, []string) {
	t.Helper()
	names := []string{"nl_div_rate/logistic", "sc_psd_beta/telegraph-sum", "lag1_autocorrelation/telegraph", "x"}
	p := NewPlot()
	p.Title.Text = "Long labels"
	p.X.Label.Text = "deviation"
	var pts plotter.XYs
	for i := range names {
		pts = append(pts, plotter.XY{X: float64(i) - 1.5, Y: float64(i)})
	}
	sc, err := plotter.NewScatter(pts)
	if err != nil {
		t.Fatal(err)
	}
	p.Add(sc)
	p.AddLegend("points", sc)
	xs, ys := xys(pts)
	p.Avoid(sc.GlyphStyle.Radius, xs, ys)
	p.NominalY(names...)
	return p, names
}

func xys(pts plotter.XYs) (xs, ys []float64) {
	for _, q := range pts {
		xs = append(xs, q.X)
		ys = append(ys, q.Y)
	}
	return xs, ys
}

// TestLeftPaddingHoldsLongestLabel: the data area starts right of the
// widest y tick label, measured in its own font, plus the margin; and in
// the rendered PNG nothing is drawn in the margin on any side (the defect
// of invariants.png, whose labels reached the left edge).
func TestLeftPaddingHoldsLongestLabel(t *testing.T) {
	p, names := longLabelPlot(t)
	const w, h = 5 * vg.Inch, 2.5 * vg.Inch
	da := p.DataArea(w, h)
	widest := vg.Length(0)
	for _, n := range names {
		widest = max(widest, p.Y.Tick.Label.Width(n))
	}
	if da.Min.X < p.Margin+widest {
		t.Errorf("data area starts at %v, left of margin %v + widest label %v", da.Min.X, p.Margin, widest)
	}
	var buf bytes.Buffer
	if err := p.WritePNG(&buf, w, h); err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(&buf)
	if err != nil {
		t.Fatal(err)
	}
	// The margin in pixels at the PNG's 96 dpi, less one pixel for
	// anti-aliasing.
	m := int(float64(p.Margin)/72*vgimg.DefaultDPI) - 1
	b := img.Bounds()
	if x, y, ok := inked(img, image.Rect(b.Min.X, b.Min.Y, b.Min.X+m, b.Max.Y)); ok {
		t.Errorf("pixel (%d, %d) in the left margin is not white", x, y)
	}
	if x, y, ok := inked(img, image.Rect(b.Max.X-m, b.Min.Y, b.Max.X, b.Max.Y)); ok {
		t.Errorf("pixel (%d, %d) in the right margin is not white", x, y)
	}
	if x, y, ok := inked(img, image.Rect(b.Min.X, b.Min.Y, b.Max.X, b.Min.Y+m)); ok {
		t.Errorf("pixel (%d, %d) in the top margin is not white", x, y)
	}
	if x, y, ok := inked(img, image.Rect(b.Min.X, b.Max.Y-m, b.Max.X, b.Max.Y)); ok {
		t.Errorf("pixel (%d, %d) in the bottom margin is not white", x, y)
	}
	// The labels are drawn: the strip left of the data area is inked.
	dpi := float64(vgimg.DefaultDPI) / 72
	if _, _, ok := inked(img, image.Rect(m+1, 0, int(float64(da.Min.X)*dpi)-2, b.Max.Y)); !ok {
		t.Error("no tick labels drawn left of the data area")
	}
}

// inked returns the first pixel of r that is not white.
func inked(img image.Image, r image.Rectangle) (int, int, bool) {
	for y := r.Min.Y; y < r.Max.Y; y++ {
		for x := r.Min.X; x < r.Max.X; x++ {
			if cr, cg, cb, _ := img.At(x, y).RGBA(); cr < 0xf000 || cg < 0xf000 || cb < 0xf000 {
				return x, y, true
			}
		}
	}
	return 0, 0, false
}

// TestLegendAvoidsData: with points across the top of the data area, the
// legend of a Plot is set where it covers none of them.
func TestLegendAvoidsData(t *testing.T) {
	p := NewPlot()
	var pts plotter.XYs
	for i := 0; i <= 20; i++ {
		pts = append(pts, plotter.XY{X: float64(i), Y: 10})
		pts = append(pts, plotter.XY{X: float64(i), Y: 9.5})
	}
	pts = append(pts, plotter.XY{X: 0, Y: 0})
	sc, err := plotter.NewScatter(pts)
	if err != nil {
		t.Fatal(err)
	}
	p.Add(sc)
	p.AddLegend("a long legend entry", sc)
	p.AddLegend("another entry", sc)
	xs, ys := xys(pts)
	p.Avoid(sc.GlyphStyle.Radius, xs, ys)
	p.styleText()
	c := draw.New(vgimg.NewWith(vgimg.UseWH(5*vg.Inch, 4*vg.Inch)))
	inner := p.inner(c)
	lw, lh := p.legendSize(0, 2)
	r, ok := p.placeInside(inner, lw, lh)
	if !ok {
		t.Fatal("no place for the legend")
	}
	dc := p.DataCanvas(inner)
	fx, fy := p.Transforms(&dc)
	for _, q := range pts {
		x, y := fx(q.X), fy(q.Y)
		if x >= r.Min.X-sc.GlyphStyle.Radius && x <= r.Max.X+sc.GlyphStyle.Radius && y >= r.Min.Y-sc.GlyphStyle.Radius && y <= r.Max.Y+sc.GlyphStyle.Radius {
			t.Errorf("legend %v covers the point %v", r, q)
		}
	}
	if r.Min.Y > dc.Center().Y {
		t.Errorf("legend %v in the top half, where the points are", r)
	}
}

// TestSuperscriptBox: a caret's text is measured at 70% size after the
// base.
func TestSuperscriptBox(t *testing.T) {
	h := Superscript{Fonts: font.DefaultCache}
	p := NewPlot()
	fnt := p.X.Tick.Label.Font
	w, _, _ := h.Box("2×10^−5", fnt)
	wb, _, _ := h.Box("2×10", fnt)
	fe := fnt
	fe.Size *= supScale
	we, _, _ := h.Box("−5", fe)
	if d := w - wb - we; d*d > 1e-12 {
		t.Errorf("width %v, want %v + %v", w, wb, we)
	}
	if wp, _, _ := h.Box("2×10−5", fnt); !(w < wp) {
		t.Errorf("raised exponent (%v) not narrower than inline text (%v)", w, wp)
	}
}
