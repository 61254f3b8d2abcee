package groups

import (
	"fmt"
	"io"
	"math"
	"sort"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"github.com/tracesift/tracesift/report/figure"
)

// weightedECDF is a step CDF: F(X[i]) = F[i], X ascending, F ending at 1.
type weightedECDF struct {
	X, F []float64
}

// at returns F(x) of the step function.
func (e weightedECDF) at(x float64) float64 {
	i := sort.Search(len(e.X), func(i int) bool { return e.X[i] > x })
	if i == 0 {
		return 0
	}
	return e.F[i-1]
}

// ecdfOf returns the ECDF of the finite values of x (nil when none).
func ecdfOf(x []float64) *weightedECDF {
	d := Pool([][]float64{x}, math.MaxInt32)
	if d.Traces == 0 {
		return nil
	}
	return &weightedECDF{X: d.X, F: d.CDF}
}

// PlotDistribution writes a PNG overlaying, per group, the pooled
// distribution name (Result.Distributions: the per-trace distributions
// of the group, every trace weighted equally) as opts.Kind: ECDF,
// complementary CDF on a log scale, or histogram. ErrUnknownName if no
// group has the distribution.
func PlotDistribution(w io.Writer, r Result, name string, opts PlotOptions) error {
	var groups []string
	var ecdfs []*weightedECDF
	var labels []string
	for _, d := range r.Distributions {
		if d.Name != name {
			continue
		}
		groups = append(groups, d.Group)
		if d.Traces == 0 {
			ecdfs = append(ecdfs, nil)
			labels = append(labels, d.Group)
			continue
		}
		ecdfs = append(ecdfs, &weightedECDF{X: d.X, F: d.CDF})
		labels = append(labels, fmt.Sprintf("%s (%d traces, median %.4g)", d.Group, d.Traces, d.Median))
	}
	if len(groups) == 0 {
		return fmt.Errorf("plot distribution %q: %w", name, ErrUnknownName)
	}
	title := opts.Title
	if title == "" {
		title = fmt.Sprintf("%s pooled per group (equal weight per trace)", name)
	}
	return plotDists(w, ecdfs, labels, name, title, opts)
}

// PlotFeatureDistribution writes a PNG overlaying, per group, the
// distribution of one feature's per-trace values (Result.Samples) as
// opts.Kind. ErrUnknownName for an unknown feature.
func PlotFeatureDistribution(w io.Writer, r Result, feature string, opts PlotOptions) error {
	f := r.FeatureIndex(feature)
	if f < 0 {
		return fmt.Errorf("plot %q: %w", feature, ErrUnknownName)
	}
	var ecdfs []*weightedECDF
	var labels []string
	for _, g := range r.Groups {
		var vals []float64
		for _, s := range r.Samples {
			if s.Group == g.Name {
				vals = append(vals, s.Values[f])
			}
		}
		e := ecdfOf(vals)
		ecdfs = append(ecdfs, e)
		sum := g.Summaries[f]
		labels = append(labels, fmt.Sprintf("%s (n = %d, median %.4g)", g.Name, sum.N, sum.Median))
	}
	title := opts.Title
	if title == "" {
		title = fmt.Sprintf("%s: per-trace values by group", feature)
	}
	return plotDists(w, ecdfs, labels, feature, title, opts)
}

// plotDists draws the distributions given as step CDFs.
func plotDists(w io.Writer, ecdfs []*weightedECDF, labels []string, xlabel, title string, opts PlotOptions) error {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, e := range ecdfs {
		if e != nil {
			lo, hi = math.Min(lo, e.X[0]), math.Max(hi, e.X[len(e.X)-1])
		}
	}
	if math.IsInf(lo, 1) {
		return fmt.Errorf("plot %q: %w", xlabel, ErrNothingToPlot)
	}
	kind := opts.Kind
	if kind == "" {
		kind = KindECDF
	}
	p := plot.New()
	p.Title.Text = title
	p.X.Label.Text = xlabel
	oneNotation(p)
	p.Add(plotter.NewGrid())
	xlo, xhi := padRange(lo, hi, 0.03)
	var edges []float64
	if kind == KindHistogram {
		edges = binEdges(ecdfs, lo, hi, opts.Bins)
		xlo, xhi = edges[0], edges[len(edges)-1]
	}
	ymin, ymax := math.Inf(1), 0.0
	for gi, e := range ecdfs {
		if e == nil {
			continue
		}
		var pts plotter.XYs
		switch kind {
		case KindECDF:
			pts = append(pts, plotter.XY{X: xlo, Y: 0})
			for i := range e.X {
				pts = append(pts, plotter.XY{X: e.X[i], Y: e.F[i]})
			}
			pts = append(pts, plotter.XY{X: xhi, Y: 1})
		case KindCCDF:
			// 1 − F(x) just before each jump, i.e. P(X ≥ x): positive at
			// every observed value, so it fits a log axis.
			prev := 0.0
			for i := range e.X {
				y := 1 - prev
				if y <= 1e-12 {
					break // rounding residue of the cumulative sums
				}
				pts = append(pts, plotter.XY{X: e.X[i], Y: math.Log10(y)})
				ymin = math.Min(ymin, y)
				prev = e.F[i]
			}
		case KindHistogram:
			for k := 0; k+1 < len(edges); k++ {
				// Mass in (edges[k], edges[k+1]]; the first bin also
				// holds the lowest value.
				a := e.at(edges[k])
				if k == 0 {
					a = 0
				}
				m := e.at(edges[k+1]) - a
				pts = append(pts, plotter.XY{X: edges[k], Y: m})
			}
			for _, q := range pts {
				ymax = math.Max(ymax, q.Y)
			}
			last := pts[len(pts)-1].Y
			pts = append(pts, plotter.XY{X: edges[len(edges)-1], Y: last})
		default:
			return fmt.Errorf("plot %q: unknown kind %q", xlabel, kind)
		}
		line, err := plotter.NewLine(pts)
		if err != nil {
			return fmt.Errorf("plot %q: %w", xlabel, err)
		}
		line.StepStyle = plotter.PostStep
		if kind == KindCCDF {
			line.StepStyle = plotter.PreStep
		}
		line.Color = groupColor(gi)
		line.Width = vg.Points(1.6)
		line.Dashes = dashes(gi)
		p.Add(line)
		p.Legend.Add(labels[gi], line)
	}
	p.X.Min, p.X.Max = xlo, xhi
	switch kind {
	case KindECDF:
		p.Y.Label.Text = "cumulative fraction F(x)"
		p.Y.Min, p.Y.Max = 0, 1.02
		p.Legend.Top, p.Legend.Left = false, false
		p.Legend.YOffs = vg.Points(10)
	case KindCCDF:
		p.Y.Label.Text = "P(X ≥ x) (log scale)"
		// log10 of the probability on a linear axis labelled in
		// decades (gonum's LogScale mis-places a long axis label).
		p.Y.Tick.Marker = decadeTicks{}
		p.Y.Min, p.Y.Max = math.Log10(ymin/2), math.Log10(1.1)
		p.Legend.Top, p.Legend.Left = false, true
		p.Legend.YOffs = vg.Points(10)
	case KindHistogram:
		p.Y.Label.Text = "fraction per bin"
		// Headroom for the legend, about 9 % of the height per entry.
		p.Y.Min, p.Y.Max = 0, ymax*(1.05+0.09*float64(len(ecdfs)))
		p.Legend.Top = true
	}
	width, height := opts.size(6*vg.Inch, 4*vg.Inch)
	return writePNG(w, p, width, height, xlabel)
}

// dashes returns no dashes for the first colour cycle and distinct dash
// patterns after it, so that groups sharing a colour stay apart.
func dashes(i int) []vg.Length {
	switch (i / len(palette)) % 3 {
	case 1:
		return []vg.Length{vg.Points(6), vg.Points(3)}
	case 2:
		return []vg.Length{vg.Points(2), vg.Points(2)}
	}
	return nil
}

// binEdges returns histogram bin edges over [lo, hi]: one unit bin per
// integer (centred on it) when every value is an integer and the span is
// at most 200, otherwise bins equal bins (0: ⌈√n⌉ in [10, 60], n the
// largest number of points of a group).
func binEdges(ecdfs []*weightedECDF, lo, hi float64, bins int) []float64 {
	integer := true
	n := 0
	for _, e := range ecdfs {
		if e == nil {
			continue
		}
		n = max(n, len(e.X))
		for _, x := range e.X {
			if x != math.Trunc(x) {
				integer = false
			}
		}
	}
	if bins <= 0 && integer && hi-lo <= 200 {
		var edges []float64
		for x := lo - 0.5; x <= hi+0.5; x++ {
			edges = append(edges, x)
		}
		return edges
	}
	if bins <= 0 {
		bins = min(60, max(10, int(math.Ceil(math.Sqrt(float64(n))))))
	}
	if hi == lo {
		lo, hi = padRange(lo, hi, 0)
	}
	edges := make([]float64, bins+1)
	for k := range edges {
		edges[k] = lo + (hi-lo)*float64(k)/float64(bins)
	}
	edges[bins] = hi
	return edges
}

// decadeTicks labels an axis holding log10 values with the powers of ten
// they stand for, all in one notation (figure.FormatEach: "0.01", "0.1",
// "1", or 10⁻⁵ … 10⁰ as powers), and puts unlabelled minor ticks at 2…9
// times each power.
type decadeTicks struct{}

// Ticks returns the decade ticks between lo and hi (log10 units).
func (decadeTicks) Ticks(lo, hi float64) []plot.Tick {
	var ts []plot.Tick
	var decades []float64
	var at []int
	for k := math.Floor(lo); k <= math.Ceil(hi); k++ {
		if k >= lo && k <= hi {
			at = append(at, len(ts))
			decades = append(decades, math.Pow(10, k))
			ts = append(ts, plot.Tick{Value: k})
		}
		for m := 2.0; m <= 9; m++ {
			v := k + math.Log10(m)
			if v >= lo && v <= hi {
				ts = append(ts, plot.Tick{Value: v})
			}
		}
	}
	for i, l := range figure.FormatEach(decades) {
		ts[at[i]].Label = l.String()
	}
	return ts
}
