package report

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/tracesift/tracesift/campaign"
	fig "github.com/tracesift/tracesift/report/figure"
)

// The campaign page's colours are those of Okabe & Ito (2008, "Color
// universal design"; checked: search.r-project.org/CRAN/refmans/see/html/palette_okabeito.html,
// hex values as in EmilHvitfeldt.github.io/r-color-palettes/discrete/khroma/okabeito;
// the variant with grey is named by rdrr.io/cran/Rbearcat/man/palette_OkabeIto.html,
// its hex value #999999 is (memory)), which stay distinct under the
// common colour-vision deficiencies. Classes and groups take different
// colours of the set, so a colour means one thing on the page.
const (
	oiBlack      = "#000000"
	oiOrange     = "#E69F00"
	oiSkyBlue    = "#56B4E9"
	oiGreen      = "#009E73"
	oiBlue       = "#0072B2"
	oiVermillion = "#D55E00"
	oiPurple     = "#CC79A7"
	oiGrey       = "#999999"
)

// verdictColours colour the verdict grid: one Okabe–Ito colour per class.
var verdictColours = map[string]string{
	"chaotic":             oiVermillion,
	"stochastic":          oiSkyBlue,
	"regular":             oiGreen,
	campaign.Undetermined: oiGrey,
}

// verdictColour returns the colour of a class (grey for a class the
// palette does not name).
func verdictColour(class string) string {
	if c, ok := verdictColours[class]; ok {
		return c
	}
	return oiGrey
}

// groupInks and groupShapes mark the groups in every campaign figure: the
// reference group black with circles, then orange squares, blue diamonds,
// purple stars; shapes keep the groups apart in greyscale print.
var (
	groupInks   = []string{oiBlack, oiOrange, oiBlue, oiPurple}
	groupShapes = []string{"circle", "square", "diamond", "star"}
)

func groupInk(i int) string   { return groupInks[i%len(groupInks)] }
func groupShape(i int) string { return groupShapes[i%len(groupShapes)] }

// Panel sizes of the campaign figures (CSS pixels).
const (
	curveW, curveH = 300.0, 250.0
	distW, distH   = 300.0, 250.0
)

// levelAxis returns the x positions of the levels and their ticks: the
// parameter values when every level has one and there are at least two
// (labelled in one notation by fig.FormatEach), else the level indices
// labelled by the levels as written.
func levelAxis(rep campaign.Report) (xs []float64, sc scale, ts []tick) {
	numeric := len(rep.Levels) > 1
	for _, lv := range rep.Levels {
		numeric = numeric && finite(lv.Param)
	}
	var labels []string
	for i, lv := range rep.Levels {
		if numeric {
			xs = append(xs, lv.Param)
		} else {
			xs = append(xs, float64(i))
			l := lv.Level
			if l == "" {
				l = "all traces"
			}
			labels = append(labels, esc(l))
		}
	}
	if numeric {
		for _, l := range fig.FormatEach(xs) {
			labels = append(labels, labelSVG(l))
		}
	}
	for i, x := range xs {
		ts = append(ts, tick{v: x, label: labels[i]})
	}
	lo, hi := xs[0], xs[len(xs)-1]
	pad := 0.12 * (hi - lo)
	if pad == 0 {
		pad = 0.6
	}
	return xs, scale{lo - pad, hi + pad, false}, ts
}

// sigIndex says which tests reject after adjustment: groups differ for a
// metric at a level (any test, any group against the reference), a
// group's originals differ from a method's surrogates at a level, and a
// pooled distribution differs between groups at a level.
type sigIndex struct {
	groups   map[[2]string]bool    // metric, level
	surr     map[[4]string]bool    // metric, group, level, method
	dists    map[[2]string]bool    // distribution, level
	distTest map[[3]string]float64 // distribution, level, B → adjusted p of the KS permutation test
}

func newSigIndex(rep campaign.Report) sigIndex {
	ix := sigIndex{groups: map[[2]string]bool{}, surr: map[[4]string]bool{}, dists: map[[2]string]bool{}, distTest: map[[3]string]float64{}}
	for _, t := range rep.Tests {
		switch t.Question {
		case campaign.QuestionGroups:
			ix.groups[[2]string{t.Name, t.Level}] = ix.groups[[2]string{t.Name, t.Level}] || t.Significant
		case campaign.QuestionSurrogate:
			ix.surr[[4]string{t.Name, t.Group, t.Level, t.Condition}] = t.Significant
		case campaign.QuestionDistribution:
			if t.B != "" {
				ix.dists[[2]string{t.Name, t.Level}] = ix.dists[[2]string{t.Name, t.Level}] || t.Significant
			}
		}
	}
	return ix
}

// metricRange returns the y range of a metric's figure: every median,
// quartile and surrogate band of every group and level.
func metricRange(rep campaign.Report, metric string) (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	add := func(vs ...float64) {
		for _, v := range vs {
			if finite(v) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
	}
	for _, b := range rep.Bands {
		if b.Name != metric {
			continue
		}
		add(b.Median, b.Q1, b.Q3)
		for _, m := range b.Methods {
			add(m.Lo, m.Hi, m.Mean)
		}
	}
	if math.IsInf(lo, 1) {
		return 0, 0, false
	}
	if lo == hi {
		d := math.Max(math.Abs(lo)*0.05, 1e-9)
		lo, hi = lo-d, hi+d
	}
	return lo, hi, true
}

// curveFigure draws one metric against the levels: a panel per surrogate
// method (one panel of the originals without surrogates). In each, every
// group's median over its traces with the quartiles as a bar, the band
// from the median 2.5 % to the median 97.5 % quantile of the traces'
// surrogate values with the median surrogate mean dashed, filled markers
// where the original differs from the method's surrogates after
// adjustment, and ✱ above the levels where the groups differ. It returns
// "" when the metric has no finite value.
func curveFigure(rep campaign.Report, id, metric, xlabel string, ix sigIndex) string {
	ylo, yhi, ok := metricRange(rep, metric)
	if !ok {
		return ""
	}
	xs, xsc, xt := levelAxis(rep)
	pad := 0.08 * (yhi - ylo)
	ysc := scale{ylo - pad, yhi + pad + 0.12*(yhi-ylo), false}
	methods := rep.Methods
	if len(methods) == 0 {
		methods = []string{""}
	}
	band := func(g, level string) *campaign.Band {
		for i := range rep.Bands {
			if b := &rep.Bands[i]; b.Name == metric && b.Group == g && b.Level == level {
				return b
			}
		}
		return nil
	}
	var panels []*chart
	xspan := xsc.hi - xsc.lo
	for mi, method := range methods {
		c := newChart(fmt.Sprintf("%s-%d", id, mi), curveW, curveH, xsc, ysc)
		c.top, c.left, c.right = 24, 58, 8
		c.xticks = xt
		c.xlabel = xlabel
		if mi == 0 {
			c.ylabel = metric
		}
		title := "originals"
		if method != "" {
			title = "against " + method + " surrogates"
		}
		c.labelAt(c.left+c.plotW()/2, 15, "middle", title, "#222222", 11.5)
		for gi, g := range rep.Groups {
			ink := groupInk(gi)
			var bx, lo, hi, mu, ox, med []float64
			var q1, q3 []float64
			var sig []bool
			dodge := 0.015 * xspan * (float64(gi) - float64(len(rep.Groups)-1)/2)
			for li, lv := range rep.Levels {
				b := band(g, lv.Level)
				if b == nil {
					continue
				}
				if method != "" {
					for _, m := range b.Methods {
						if m.Method == method && finite(m.Lo) && finite(m.Hi) {
							bx, lo, hi, mu = append(bx, xs[li]), append(lo, m.Lo), append(hi, m.Hi), append(mu, m.Mean)
						}
					}
				}
				if finite(b.Median) {
					ox, med = append(ox, xs[li]+dodge), append(med, b.Median)
					q1, q3 = append(q1, b.Q1), append(q3, b.Q3)
					sig = append(sig, method != "" && ix.surr[[4]string{metric, g, lv.Level, method}])
				}
			}
			if len(bx) == 1 { // one level: a narrow box
				d := 0.03 * xspan
				bx, lo, hi, mu = []float64{bx[0] - d, bx[0] + d}, []float64{lo[0], lo[0]}, []float64{hi[0], hi[0]}, []float64{mu[0], mu[0]}
			}
			c.band(bx, lo, hi, ink, "", 0.16)
			c.polyline(bx, mu, ink, 1.1, "4 3")
			c.polyline(ox, med, ink, 1.7, "")
			for i := range ox {
				c.polyline([]float64{ox[i], ox[i]}, []float64{q1[i], q3[i]}, ink, 1.2, "")
				fill := "#ffffff"
				if sig[i] {
					fill = ink
				}
				c.markers(ox[i:i+1], med[i:i+1], groupShape(gi), 3.6, fill, ink)
			}
		}
		for li, lv := range rep.Levels {
			if ix.groups[[2]string{metric, lv.Level}] {
				c.labelAt(c.px(xs[li]), c.top+14, "middle", "✱", "#000000", 14)
			}
		}
		panels = append(panels, c)
	}
	return panelRow(id, metric+" against "+xlabel, panels)
}

// tailOf returns the pooled degree distribution of a group at a level.
func tailOf(rep campaign.Report, name, group, level string) *campaign.Tail {
	for i := range rep.Tails {
		if t := &rep.Tails[i]; t.Name == name && t.Group == group && t.Level == level {
			return t
		}
	}
	return nil
}

// histogramOf returns the pooled distribution of a group at a level.
func histogramOf(rep campaign.Report, name, group, level string) *campaign.Histogram {
	for i := range rep.Histograms {
		if h := &rep.Histograms[i]; h.Name == name && h.Group == group && h.Level == level {
			return h
		}
	}
	return nil
}

// levelTitle is a panel title: the level, with ✱ when the groups'
// pooled distributions differ there after adjustment.
func levelTitle(rep campaign.Report, paramLabel, name, level string, ix sigIndex) string {
	t := "all traces"
	if level != "" {
		t = paramLabel + " = " + level
	}
	if ix.dists[[2]string{name, level}] {
		t += " ✱"
	}
	return t
}

// logBins returns the pooled P(k) of a degree distribution averaged over
// bins of degrees growing by a factor of about 1.3 (the bins of a log–log
// plot; every integer degree of a bin counts), at the geometric centre of
// each bin's degrees.
func logBins(ks []int, ps []float64) (xs, ys []float64) {
	if len(ks) == 0 {
		return nil, nil
	}
	kmax := ks[len(ks)-1]
	a := max(1, ks[0])
	for i := 0; a <= kmax; {
		b := max(a+1, int(math.Ceil(float64(a)*1.3)))
		mass := 0.0
		for ; i < len(ks) && ks[i] < b; i++ {
			if ks[i] >= a {
				mass += ps[i]
			}
		}
		if mass > 0 {
			xs = append(xs, math.Sqrt(float64(a)*float64(b-1)))
			ys = append(ys, mass/float64(b-a))
		}
		a = b
	}
	return xs, ys
}

// degreeFigure draws the pooled degree distributions of every group at
// each level (one panel per level): the HVG on semi-log axes with the
// fitted exponential tails and the i.i.d. law, the NVG on log–log axes
// (log-binned) with the fitted power laws. "" without data.
func degreeFigure(rep campaign.Report, id, name, paramLabel string, ix sigIndex) string {
	hvg := name == campaign.DistHVGDegree
	kmax, pmin := 4, 1.0
	found := false
	for _, t := range rep.Tails {
		if t.Name != name {
			continue
		}
		xs, ys := []float64{}, []float64{}
		if hvg {
			for i, k := range t.K {
				xs, ys = append(xs, float64(k)), append(ys, t.P[i])
			}
		} else {
			xs, ys = logBins(t.K, t.P)
		}
		for i := range xs {
			if ys[i] > 0 {
				found = true
				kmax = max(kmax, int(math.Ceil(xs[i])))
				pmin = math.Min(pmin, ys[i])
			}
		}
	}
	if !found {
		return ""
	}
	ylo := math.Pow(10, math.Floor(math.Log10(pmin/3)))
	xsc := scale{0, float64(kmax) + 1, false}
	if !hvg {
		xsc = scale{1, float64(kmax) * 1.5, true}
	}
	var panels []*chart
	for li, lv := range rep.Levels {
		c := newChart(fmt.Sprintf("%s-%d", id, li), distW, distH, xsc, scale{ylo, 1, true})
		c.top, c.left, c.right = 24, 58, 8
		c.xlabel = "degree k"
		if li == 0 {
			c.ylabel = "P(k)"
		}
		if hvg {
			c.xticks = intTicks(0, float64(kmax)+1)
			var lx, ly []float64
			for k := 2; k <= kmax+1; k++ {
				lx, ly = append(lx, float64(k)), append(ly, iidHVG(k))
			}
			c.polyline(lx, ly, oiGrey, 1.2, "5 3")
		}
		c.labelAt(c.left+c.plotW()/2, 15, "middle", levelTitle(rep, paramLabel, name, lv.Level, ix), "#222222", 11.5)
		for gi, g := range rep.Groups {
			t := tailOf(rep, name, g, lv.Level)
			if t == nil {
				continue
			}
			ink := groupInk(gi)
			if finite(t.Exponent) && t.KMin > 0 {
				var fx, fy []float64
				if hvg {
					fx, fy = exponentialTail(t.KMin, kmax+1, t.Share, t.Exponent)
				} else {
					fx, fy = powerLawTail(t.KMin, kmax, t.Share, t.Exponent)
				}
				c.polyline(fx, fy, ink, 1.4, "")
			}
			var xs, ys []float64
			if hvg {
				for i, k := range t.K {
					xs, ys = append(xs, float64(k)), append(ys, t.P[i])
				}
			} else {
				xs, ys = logBins(t.K, t.P)
			}
			c.markers(xs, ys, groupShape(gi), 2.4, ink, ink)
		}
		panels = append(panels, c)
	}
	what := "NVG degree distributions (log–log) with fitted power laws"
	if hvg {
		what = "HVG degree distributions (semi-log) with fitted exponential tails"
	}
	return panelRow(id, what, panels)
}

// cdfAt returns the step CDF F(x) of (X, F): F at the largest X ≤ x.
func cdfAt(X, F []float64, x float64) float64 {
	i := sort.SearchFloat64s(X, x)
	if i < len(X) && X[i] == x {
		return F[i]
	}
	if i == 0 {
		return 0
	}
	return F[i-1]
}

// densitySteps returns the pooled density of h over n equal bins of
// [lo, hi]: the CDF's rise over each bin divided by its width.
func densitySteps(h *campaign.Histogram, lo, hi float64, n int) (edges, dens []float64) {
	w := (hi - lo) / float64(n)
	for b := 0; b <= n; b++ {
		edges = append(edges, lo+w*float64(b))
	}
	for b := 0; b < n; b++ {
		a := cdfAt(h.X, h.F, edges[b])
		if b == 0 {
			a = 0 // the first bin takes everything below it
		}
		z := cdfAt(h.X, h.F, edges[b+1])
		if b == n-1 {
			z = 1
		}
		dens = append(dens, (z-a)/w)
	}
	return edges, dens
}

// pointMasses returns the probability of every support value of h (a
// discrete distribution).
func pointMasses(h *campaign.Histogram) (xs, ps []float64) {
	prev := 0.0
	for i, x := range h.X {
		if p := h.F[i] - prev; p > 1e-15 {
			xs, ps = append(xs, x), append(ps, p)
		}
		prev = h.F[i]
	}
	return xs, ps
}

// histogramFigure draws a pooled distribution of every group at each
// level: local clustering on linear axes (the probability of each value as
// a stem when the values are discrete, as HVG clustering is; the density over 25
// bins otherwise), or the normalised increments as a density on a log
// axis over the standard Gaussian they are normalised to. "" without data.
func histogramFigure(rep campaign.Report, id, name, paramLabel string, ix sigIndex) string {
	incr := name == campaign.DistIncrements
	type series struct {
		xs, ys   []float64
		discrete bool
	}
	data := map[[2]string]series{}
	zmax := 4.0
	for _, h := range rep.Histograms {
		if h.Name == name && len(h.X) > 0 {
			zmax = math.Max(zmax, math.Max(math.Abs(h.X[0]), math.Abs(h.X[len(h.X)-1])))
		}
	}
	zmax = math.Min(8, math.Ceil(zmax))
	ymax, ymin := 0.0, math.Inf(1)
	for _, g := range rep.Groups {
		for _, lv := range rep.Levels {
			h := histogramOf(rep, name, g, lv.Level)
			if h == nil || len(h.X) == 0 {
				continue
			}
			var s series
			switch {
			case incr:
				edges, d := densitySteps(h, -zmax, zmax, 32)
				s.xs, s.ys = edges, d
			case h.Discrete:
				s.xs, s.ys = pointMasses(h)
				s.discrete = true
			default:
				edges, d := densitySteps(h, 0, 1, 25)
				s.xs, s.ys = edges, d
			}
			for _, y := range s.ys {
				ymax = math.Max(ymax, y)
				if y > 0 {
					ymin = math.Min(ymin, y)
				}
			}
			data[[2]string{g, lv.Level}] = s
		}
	}
	if len(data) == 0 || !(ymax > 0) {
		return ""
	}
	xsc := scale{0, 1, false}
	ysc := scale{0, ymax * 1.12, false}
	if incr {
		xsc = scale{-zmax, zmax, false}
		ysc = scale{math.Pow(10, math.Floor(math.Log10(ymin/2))), math.Pow(10, math.Ceil(math.Log10(ymax*1.5))), true}
	}
	var panels []*chart
	for li, lv := range rep.Levels {
		c := newChart(fmt.Sprintf("%s-%d", id, li), distW, distH, xsc, ysc)
		c.top, c.left, c.right = 24, 58, 8
		c.labelAt(c.left+c.plotW()/2, 15, "middle", levelTitle(rep, paramLabel, name, lv.Level, ix), "#222222", 11.5)
		switch {
		case incr:
			c.xlabel = "normalised increment z"
			var gx, gy []float64
			for i := 0; i <= 200; i++ {
				z := -zmax + 2*zmax*float64(i)/200
				gx, gy = append(gx, z), append(gy, math.Exp(-z*z/2)/math.Sqrt(2*math.Pi))
			}
			c.polyline(gx, gy, oiGrey, 1.3, "5 3")
		default:
			c.xlabel = "local clustering C"
		}
		if li == 0 {
			c.ylabel = "probability density"
			if !incr {
				c.ylabel = "probability (density)"
			}
		}
		for gi, g := range rep.Groups {
			s, ok := data[[2]string{g, lv.Level}]
			if !ok {
				continue
			}
			ink := groupInk(gi)
			if s.discrete {
				// Stems at the values, groups set side by side.
				dx := 0.006 * (float64(gi) - float64(len(rep.Groups)-1)/2)
				for i := range s.xs {
					c.polyline([]float64{s.xs[i] + dx, s.xs[i] + dx}, []float64{0, s.ys[i]}, ink, 1, "")
				}
				c.markers(shifted(s.xs, dx), s.ys, groupShape(gi), 2.3, ink, ink)
				continue
			}
			c.steps(s.xs, s.ys, ink, 1.6, dashFor(gi))
		}
		panels = append(panels, c)
	}
	what := "pooled " + strings.ReplaceAll(name, "_", " ") + " per group"
	return panelRow(id, what, panels)
}

// shifted returns xs + d.
func shifted(xs []float64, d float64) []float64 {
	out := make([]float64, len(xs))
	for i, x := range xs {
		out[i] = x + d
	}
	return out
}

// dashFor is the dash pattern of the i-th group's steps, so overlapping
// outlines stay apart.
func dashFor(i int) string {
	return []string{"", "6 3", "2 2", "8 2 2 2"}[i%4]
}

// legendSwatch is a small inline SVG of a group's marker and line for the
// HTML legends above the figures (aria-hidden: the text says it).
func legendSwatch(shape, ink, fill, dash string) string {
	var b strings.Builder
	b.WriteString(`<svg class="sw" viewBox="0 0 26 12" width="26" height="12" aria-hidden="true">`)
	if dash != "none" {
		fmt.Fprintf(&b, `<path d="M1 6h24" stroke="%s" stroke-width="1.6"%s/>`, ink, dashAttr(dash))
	}
	if shape != "" {
		b.WriteString(strings.TrimSuffix(marker(shape, 13, 6, 3.4, fill, ink), "\n"))
	}
	b.WriteString(`</svg>`)
	return b.String()
}

// bandSwatch is a legend swatch of a surrogate band.
func bandSwatch(ink string) string {
	return fmt.Sprintf(`<svg class="sw" viewBox="0 0 26 12" width="26" height="12" aria-hidden="true"><rect x="1" y="1" width="24" height="10" fill="%s" fill-opacity="0.16"/><path d="M1 6h24" stroke="%s" stroke-width="1.1" stroke-dasharray="4 3"/></svg>`, ink, ink)
}
