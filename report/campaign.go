package report

import (
	"fmt"
	"html/template"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/tracesift/tracesift/campaign"
	"github.com/tracesift/tracesift/groups"
)

// CampaignCaution is the screening caution of the campaign report.
const CampaignCaution = "The verdicts and tests on this page are a screening aid, not a device qualification result; defer to your laboratory's qualification procedures and the applicable reliability standards."

// Section ids of the campaign report, in the order the page shows them.
const (
	campaignSummary       = "summary"
	campaignVerdicts      = "verdicts"
	campaignCurves        = "curves"
	campaignDistributions = "distributions"
	campaignTests         = "tests"
	campaignMethods       = "methods"
)

// CampaignSections returns the HTML ids of the campaign report's sections
// in order: the header with the campaign's layout and warnings, the
// verdict grid, the metrics against the control parameter, the pooled
// distributions, the tables of tests, and the methods.
func CampaignSections() []string {
	return []string{campaignSummary, campaignVerdicts, campaignCurves, campaignDistributions, campaignTests, campaignMethods}
}

// CampaignOptions control WriteCampaign. The zero value means no source
// name, the parameter's column as its label, CampaignCaution and the
// generator "tracesift".
type CampaignOptions struct {
	// Source names the campaign: its description file, or the tables it
	// was merged from.
	Source string
	// ParamLabel names the control parameter for people.
	ParamLabel string
	// Caution replaces CampaignCaution.
	Caution string
	// LeftOut lists the entries of the campaign that could not be used.
	LeftOut []string
	// Generator names the program in the footer.
	Generator string
}

// WriteCampaign writes the campaign report as one self-contained HTML
// file (inline CSS and SVG, a few lines of inline script that show a
// verdict's probabilities where hover tooltips are not available, nothing
// loaded from the network): the verdict grid (device × level per group,
// probabilities on hover), each metric against the control parameter per
// group with its surrogate bands and the adjusted rejections marked, the
// pooled degree, clustering and increment distributions with fitted tails,
// tables of adjusted p-values and effect sizes, the methods and the
// screening caution. The markup is well-formed XML. The output depends
// only on rep and o: the same campaign tables give the same bytes.
func WriteCampaign(w io.Writer, rep campaign.Report, o CampaignOptions) error {
	if err := campaignPage.Execute(w, campaignViewOf(rep, o)); err != nil {
		return fmt.Errorf("campaign report: %w", err)
	}
	return nil
}

// gridItem is one trace's verdict in a grid cell.
type gridItem struct {
	Class, Text, Title, Colour string
}

type gridRow struct {
	Device string
	Cells  [][]gridItem // per level: the device's traces there
}

type verdictGrid struct {
	Group  string
	Levels []string
	Rows   []gridRow
}

type classSwatch struct {
	Class, Colour, Letter string
	Count                 int
}

type countRow struct {
	Group, Level string
	Counts       []int
}

// pCell is a p-value or effect cell; Sig marks an adjusted rejection.
type pCell struct {
	Text string
	Sig  bool
}

type groupTable struct {
	Title      string
	A, B       string
	AdjustName string
	Rows       []groupRow
}

type groupRow struct {
	Metric, MedA, MedB, Delta, HL string
	KS, MW, SR                    pCell // raw p (adjusted p)
	Pairs, Paired, R              string
	Any                           bool
}

type trendRow struct {
	Metric, Group, N, Rho, Slope, Interval string
	P, Adj                                 pCell
	Note                                   string
}

type surrTable struct {
	Method  string
	Columns []string // group · level
	Rows    []surrRow
}

type surrRow struct {
	Metric string
	Cells  []pCell
}

type distRow struct {
	Name, Level, Groups, KS, Chi, Bins string
	KSP, KSAdj, ChiP, ChiAdj           pCell
}

type flipRow struct {
	Group, Level, N, Orig, Gauss, D string
	P, Adj                          pCell
}

type tailRow struct {
	Name, Group, Level, Traces, Nodes, Law, Exponent, KMin, Share, KS, Note string
}

type familyRow struct {
	Name, Tests, MinP, Reachable, Significant string
	Unreachable                               bool
}

type campaignView struct {
	Title, Source, Kicker string
	ExtraCSS              template.CSS
	Facts                 []fact
	Nav                   []fact
	Warnings, Notes       []string
	LeftOut               []string
	Caution               string

	Grids         []verdictGrid
	Classes       []classSwatch
	VerdictCounts []countRow
	Model         string

	GroupLegend      template.HTML
	Curves           []figure
	DistLegend       template.HTML
	Distributions    []figure
	Tails            []tailRow
	AdjustName       string
	GroupTables      []groupTable
	Trends           []trendRow
	SurrogateTables  []surrTable
	DistRows         []distRow
	FlipRows         []flipRow
	Families         []familyRow
	TraceFamilies    string
	ParamLabel       string
	Alpha            string
	IntervalPct      string
	Footer           string
	MethodsSurrogate string
}

func campaignViewOf(rep campaign.Report, o CampaignOptions) campaignView {
	label := o.ParamLabel
	switch {
	case label != "":
	case rep.Parameter != "":
		label = rep.Parameter
	default:
		label = "level"
	}
	caution := o.Caution
	if caution == "" {
		caution = CampaignCaution
	}
	source := o.Source
	if source == "" {
		source = "campaign"
	}
	adjName := "Holm"
	if rep.Adjust == groups.AdjustBH {
		adjName = "BH"
	}
	v := campaignView{
		Title:      "tracesift campaign report: " + source,
		Source:     source,
		Kicker:     "tracesift · campaign survey report",
		ExtraCSS:   template.CSS(campaignCSS),
		Warnings:   rep.Warnings,
		Notes:      rep.Notes,
		LeftOut:    o.LeftOut,
		Caution:    caution,
		Model:      strings.Join(rep.VerdictModels(), ", "),
		AdjustName: adjName,
		ParamLabel: label,
		Alpha:      h3(rep.Alpha),
		// Theil–Sen intervals are at 1 − α (campaign.Analyze).
		IntervalPct: h3(100*(1-rep.Alpha)) + " %",
	}
	var levels []string
	for _, lv := range rep.Levels {
		levels = append(levels, levelName(lv.Level))
	}
	v.Facts = []fact{
		{"Traces", strconv.Itoa(rep.Traces)},
		{"Groups", strings.Join(rep.Groups, ", ") + " (reference: " + rep.Reference + ")"},
		{"Levels of " + label, strings.Join(levels, ", ")},
		{"Metrics", strconv.Itoa(len(rep.Metrics))},
	}
	if len(rep.Methods) > 0 {
		var ms []string
		for i, m := range rep.Methods {
			ms = append(ms, fmt.Sprintf("%s × %d", m, rep.Counts[i]))
		}
		v.Facts = append(v.Facts, fact{"Surrogates per trace", strings.Join(ms, ", ")})
	} else {
		v.Facts = append(v.Facts, fact{"Surrogates", "none"})
	}
	v.Facts = append(v.Facts, fact{"Significance", fmt.Sprintf("%s-adjusted p ≤ %s per family", adjName, h3(rep.Alpha))}, fact{"Seed", strconv.FormatUint(rep.Seed, 10)})
	if v.Model != "" {
		v.Facts = append(v.Facts, fact{"Model of the verdicts", v.Model})
	}
	titles := map[string]string{campaignVerdicts: "Verdicts", campaignCurves: "Metrics against " + label,
		campaignDistributions: "Distributions", campaignTests: "Tests", campaignMethods: "Methods and references"}
	for _, id := range CampaignSections()[1:] {
		v.Nav = append(v.Nav, fact{id, titles[id]})
	}
	v.viewVerdicts(rep)
	ix := newSigIndex(rep)
	v.GroupLegend = groupLegend(rep, true)
	v.DistLegend = groupLegend(rep, false)
	for i, m := range rep.Metrics {
		svg := curveFigure(rep, fmt.Sprintf("curve-%d", i), m, label, ix)
		if svg == "" {
			continue
		}
		v.Curves = append(v.Curves, figure{SVG: template.HTML(svg), Caption: curveCaption(rep, m)})
	}
	v.viewDistributions(rep, label, ix)
	v.viewTests(rep)
	gen := o.Generator
	if gen == "" {
		gen = "tracesift"
	}
	v.Footer = fmt.Sprintf("Generated by %s with seed %d. The same campaign tables give this file byte for byte; it holds no date and loads nothing from the network.", gen, rep.Seed)
	return v
}

func levelName(l string) string {
	if l == "" {
		return "all traces"
	}
	return l
}

// viewVerdicts builds one grid per group: a row per device, a column per
// level, a coloured cell per trace with its class and top probability,
// all probabilities in its tooltip.
func (v *campaignView) viewVerdicts(rep campaign.Report) {
	if len(rep.Verdicts) == 0 {
		return
	}
	classes := rep.VerdictClasses()
	count := map[string]int{}
	for _, t := range rep.Verdicts {
		count[t.Class]++
	}
	for _, c := range classes {
		v.Classes = append(v.Classes, classSwatch{Class: c, Colour: verdictColour(c), Letter: classLetter(c), Count: count[c]})
	}
	li := map[string]int{}
	for i, lv := range rep.Levels {
		li[lv.Level] = i
	}
	for _, g := range rep.Groups {
		grid := verdictGrid{Group: g}
		for _, lv := range rep.Levels {
			grid.Levels = append(grid.Levels, levelName(lv.Level))
		}
		rows := map[string]*gridRow{}
		var devices []string
		counts := make([][]int, len(rep.Levels))
		for i := range counts {
			counts[i] = make([]int, len(classes))
		}
		for _, t := range rep.Verdicts {
			if t.Group != g {
				continue
			}
			dev := t.Device
			if dev == "" {
				dev = t.File
			}
			r := rows[dev]
			if r == nil {
				r = &gridRow{Device: dev, Cells: make([][]gridItem, len(rep.Levels))}
				rows[dev] = r
				devices = append(devices, dev)
			}
			l := li[t.Level]
			r.Cells[l] = append(r.Cells[l], verdictItem(t, v.ParamLabel))
			for ci, c := range classes {
				if c == t.Class {
					counts[l][ci]++
				}
			}
		}
		if len(devices) == 0 {
			continue
		}
		sort.Strings(devices)
		for _, d := range devices {
			grid.Rows = append(grid.Rows, *rows[d])
		}
		v.Grids = append(v.Grids, grid)
		for l, lv := range rep.Levels {
			v.VerdictCounts = append(v.VerdictCounts, countRow{Group: g, Level: levelName(lv.Level), Counts: counts[l]})
		}
	}
}

// classLetter is the letter a grid cell shows beside its colour.
func classLetter(c string) string {
	if c == campaign.Undetermined {
		return "?"
	}
	if c == "" {
		return ""
	}
	return strings.ToUpper(c[:1])
}

func verdictItem(t campaign.TraceVerdict, label string) gridItem {
	var ps []string
	top := math.NaN()
	for i, c := range t.Classes {
		ps = append(ps, fmt.Sprintf("%s %.2f", c, t.Probabilities[i]))
		if c == t.Top {
			top = t.Probabilities[i]
		}
	}
	lv := ""
	if t.Level != "" {
		lv = fmt.Sprintf(" at %s = %s", label, t.Level)
	}
	verdict := t.Class
	if t.Class == campaign.Undetermined {
		verdict += " (most probable: " + t.Top + ")"
	}
	return gridItem{
		Class:  t.Class,
		Colour: verdictColour(t.Class),
		Text:   classLetter(t.Class) + " " + strconv.FormatFloat(top, 'f', 2, 64),
		Title:  fmt.Sprintf("%s%s: %s; probabilities %s; %s", t.File, lv, verdict, strings.Join(ps, ", "), t.Group),
	}
}

// groupLegend is the HTML legend of the campaign figures.
func groupLegend(rep campaign.Report, curves bool) template.HTML {
	var b strings.Builder
	b.WriteString(`<p class="legend">`)
	for gi, g := range rep.Groups {
		dash := ""
		if !curves {
			dash = dashFor(gi)
		}
		fmt.Fprintf(&b, `<span>%s %s</span> `, legendSwatch(groupShape(gi), groupInk(gi), groupInk(gi), dash), esc(g))
	}
	if curves {
		if len(rep.Methods) > 0 {
			fmt.Fprintf(&b, `<span>%s surrogate band: median over traces of the 2.5–97.5 %% range, dashed: of the mean</span> `, bandSwatch(oiBlack))
			fmt.Fprintf(&b, `<span>%s original differs from the surrogates (adjusted)</span> `, legendSwatch("circle", oiBlack, oiBlack, "none"))
			fmt.Fprintf(&b, `<span>%s does not</span> `, legendSwatch("circle", oiBlack, "#ffffff", "none"))
		}
		b.WriteString(`<span>✱ groups differ at this level (adjusted)</span>`)
	} else {
		fmt.Fprintf(&b, `<span>%s reference law (i.i.d. HVG; standard Gaussian)</span> `, legendSwatch("", oiGrey, "", "5 3"))
		b.WriteString(`<span>lines through the degree distributions: fitted tails</span> <span>✱ groups differ at this level (adjusted)</span>`)
	}
	b.WriteString(`</p>`)
	return template.HTML(b.String())
}

// curveCaption states the trends of a metric.
func curveCaption(rep campaign.Report, metric string) string {
	var parts []string
	for _, t := range rep.Tests {
		if t.Question != campaign.QuestionTrend || t.Name != metric {
			continue
		}
		if math.IsNaN(t.P) {
			parts = append(parts, fmt.Sprintf("%s: not tested (%s)", t.Group, t.Note))
			continue
		}
		s := fmt.Sprintf("%s: Spearman ρ = %s, adjusted p = %s, Theil–Sen slope %s", t.Group, fixedOrDash(t.Effect, 2), h3(adjusted(rep, t)), h3(t.Estimate))
		if t.Significant {
			s += " (trend significant)"
		}
		parts = append(parts, s)
	}
	out := metric + ": median over the traces of each group at each level with the quartiles; bands from the surrogates of each method."
	if len(parts) > 0 {
		out += " Trend with the parameter — " + strings.Join(parts, "; ") + "."
	}
	return out
}

// adjusted returns the adjusted p-value that decides significance.
func adjusted(rep campaign.Report, t campaign.Test) float64 {
	if rep.Adjust == groups.AdjustBH {
		return t.PBH
	}
	return t.PHolm
}

func pc(p float64, sig bool) pCell { return pCell{Text: h3(p), Sig: sig} }

// viewDistributions draws the distribution figures and the tail table.
func (v *campaignView) viewDistributions(rep campaign.Report, label string, ix sigIndex) {
	captions := map[string]string{
		campaign.DistHVGDegree:     "Horizontal visibility graph: pooled degree distribution P(k) of each group (every node of the group's traces at the level) on semi-log axes, the fitted exponential tail P(k) ∝ exp(−λk) from k_min on (lines), and the law of any i.i.d. series, (1/3)(2/3)^(k−2) (grey, dashed).",
		campaign.DistNVGDegree:     "Natural visibility graph: pooled degree distribution on log–log axes (averaged over bins growing by a factor 1.3) with the fitted power law P(k) ∝ k^(−γ) from k_min on (lines).",
		campaign.DistHVGClustering: "Local clustering coefficients of the HVG nodes, pooled with equal weight per trace: the probability of each value as a stem (they take few discrete values: a bin per value, no empty bins between them).",
		campaign.DistNVGClustering: "Local clustering coefficients of the NVG nodes, pooled with equal weight per trace: density over 25 bins.",
		campaign.DistIncrements:    "Normalised increments (mean 0, sd 1 per trace), pooled with equal weight per trace: density over 32 bins on a log axis against the standard Gaussian (grey, dashed); fat tails lie above it.",
	}
	for i, name := range rep.Distributions {
		id := fmt.Sprintf("dist-%d", i)
		var svg string
		switch name {
		case campaign.DistHVGDegree, campaign.DistNVGDegree:
			svg = degreeFigure(rep, id, name, label, ix)
		default:
			svg = histogramFigure(rep, id, name, label, ix)
		}
		if svg == "" {
			continue
		}
		c := captions[name]
		if c == "" {
			c = name + ", pooled per group and level."
		}
		if name == campaign.DistNVGDegree {
			for _, t := range rep.Tails {
				if t.Name == name && t.Sketched {
					c += fmt.Sprintf(" Traces with more than %d distinct degrees are stored as %d quantiles and pooled from them.", campaign.SketchPoints, campaign.SketchPoints)
					break
				}
			}
		}
		v.Distributions = append(v.Distributions, figure{SVG: template.HTML(svg), Caption: c})
	}
	for _, t := range rep.Tails {
		sym := "λ"
		if t.Law == campaign.LawPowerLaw {
			sym = "γ"
		}
		row := tailRow{Name: t.Name, Group: t.Group, Level: levelName(t.Level), Traces: strconv.Itoa(t.Traces),
			Nodes: strconv.FormatInt(t.Nodes, 10), Law: t.Law, Exponent: "—", KMin: "—", Share: "—", KS: "—", Note: t.Note}
		if finite(t.Exponent) {
			row.Exponent = fmt.Sprintf("%s = %s ± %s", sym, fixedOrDash(t.Exponent, 3), fixedOrDash(t.StdErr, 3))
			row.KMin, row.Share, row.KS = strconv.Itoa(t.KMin), fixedOrDash(t.Share, 3), fixedOrDash(t.KS, 3)
		}
		v.Tails = append(v.Tails, row)
	}
}

// viewTests fills the tables of tests.
func (v *campaignView) viewTests(rep campaign.Report) {
	adj := func(t campaign.Test) pCell { return pc(adjusted(rep, t), t.Significant) }
	raw := func(t campaign.Test) pCell { return pc(t.P, false) }
	both := func(t campaign.Test) pCell {
		return pCell{Text: h3(t.P) + " (" + h3(adjusted(rep, t)) + ")", Sig: t.Significant}
	}
	for _, lv := range rep.Levels {
		for _, gb := range rep.Groups[1:] {
			tbl := groupTable{Title: fmt.Sprintf("%s against %s", gb, rep.Reference), A: rep.Reference, B: gb, AdjustName: v.AdjustName}
			if lv.Level != "" {
				tbl.Title += fmt.Sprintf(" at %s = %s", v.ParamLabel, lv.Level)
			}
			for _, m := range rep.Metrics {
				var ks, mw, sr *campaign.Test
				for i := range rep.Tests {
					t := &rep.Tests[i]
					if t.Question != campaign.QuestionGroups || t.Level != lv.Level || t.Name != m || t.B != gb {
						continue
					}
					switch t.Test {
					case campaign.TestKS:
						ks = t
					case campaign.TestMW:
						mw = t
					case campaign.TestSignedRank:
						sr = t
					}
				}
				if ks == nil || mw == nil {
					continue
				}
				r := groupRow{Metric: m, MedA: h4(bandMedian(rep, m, rep.Reference, lv.Level)), MedB: h4(bandMedian(rep, m, gb, lv.Level)),
					Delta: fixedOrDash(ks.Effect, 2), HL: h3(mw.Estimate), KS: both(*ks), MW: both(*mw),
					Pairs: "0", Paired: "—", R: "—", SR: pCell{Text: "—"}}
				r.Any = ks.Significant || mw.Significant
				if sr != nil {
					r.Pairs, r.Paired, r.R, r.SR = strconv.Itoa(sr.N), h3(sr.Estimate), fixedOrDash(sr.Effect, 2), both(*sr)
					r.Any = r.Any || sr.Significant
				}
				tbl.Rows = append(tbl.Rows, r)
			}
			if len(tbl.Rows) > 0 {
				v.GroupTables = append(v.GroupTables, tbl)
			}
		}
	}
	for _, t := range rep.Tests {
		if t.Question != campaign.QuestionTrend {
			continue
		}
		v.Trends = append(v.Trends, trendRow{Metric: t.Name, Group: t.Group, N: strconv.Itoa(t.N), Rho: fixedOrDash(t.Effect, 2),
			Slope: h3(t.Estimate), Interval: intervalText(t.Low, t.High), P: raw(t), Adj: adj(t), Note: t.Note})
	}
	for _, method := range rep.Methods {
		st := surrTable{Method: method}
		type col struct{ g, l string }
		var cols []col
		for _, g := range rep.Groups {
			for _, lv := range rep.Levels {
				cols = append(cols, col{g, lv.Level})
				name := g
				if lv.Level != "" {
					name += " · " + lv.Level
				}
				st.Columns = append(st.Columns, name)
			}
		}
		cells := map[[3]string]campaign.Test{}
		for _, t := range rep.Tests {
			if t.Question == campaign.QuestionSurrogate && t.Condition == method {
				cells[[3]string{t.Name, t.Group, t.Level}] = t
			}
		}
		for _, m := range rep.Metrics {
			row := surrRow{Metric: m}
			for _, c := range cols {
				t, ok := cells[[3]string{m, c.g, c.l}]
				if !ok || math.IsNaN(t.P) {
					row.Cells = append(row.Cells, pCell{Text: "—"})
					continue
				}
				row.Cells = append(row.Cells, pCell{Text: fmt.Sprintf("r %s · p %s", signedDigits(t.Effect, 2), h3(adjusted(rep, t))), Sig: t.Significant})
			}
			st.Rows = append(st.Rows, row)
		}
		v.SurrogateTables = append(v.SurrogateTables, st)
	}
	for _, t := range rep.Tests {
		if t.Question != campaign.QuestionDistribution {
			continue
		}
		switch t.Test {
		case campaign.TestPermKS:
			var chi campaign.Test
			for _, c := range rep.Tests {
				if c.Question == campaign.QuestionDistribution && c.Test == campaign.TestPermChi && c.Name == t.Name && c.Level == t.Level && c.B == t.B {
					chi = c
				}
			}
			v.DistRows = append(v.DistRows, distRow{Name: t.Name, Level: levelName(t.Level), Groups: t.B + " vs " + t.A,
				KS: fixedOrDash(t.Statistic, 3), KSP: raw(t), KSAdj: adj(t), Chi: fixedOrDash(chi.Statistic, 3), ChiP: raw(chi), ChiAdj: adj(chi),
				Bins: strings.TrimPrefix(chi.Note, "bins: ")})
		case campaign.TestGaussFlip:
			v.FlipRows = append(v.FlipRows, flipRow{Group: t.Group, Level: levelName(t.Level), N: strconv.Itoa(t.N),
				Orig: fixedOrDash(t.Estimate, 3), Gauss: fixedOrDash(t.Effect, 3), D: fixedOrDash(t.Statistic, 3), P: raw(t), Adj: adj(t)})
		}
	}
	for _, f := range rep.Families {
		if strings.HasPrefix(f.Name, campaign.QuestionTrace+"/") {
			continue
		}
		v.Families = append(v.Families, familyRow{Name: f.Name, Tests: strconv.Itoa(f.Tests), MinP: minPText(f.MinP),
			Reachable: yesNo(f.Reachable), Significant: strconv.Itoa(f.Significant), Unreachable: !f.Reachable && f.Tests > 0})
	}
	if tf := rep.TraceFamilies(); tf.Families > 0 {
		v.TraceFamilies = fmt.Sprintf("Each trace is also tested against its own surrogates (rank test, one family per trace: %d families, %d tests, smallest attainable p %s, %d of %d families reachable, %d significant); they are listed in tests.csv.",
			tf.Families, tf.Tests, minPText(tf.MinP), tf.Reachable, tf.Families, tf.Significant)
	}
}

func bandMedian(rep campaign.Report, metric, group, level string) float64 {
	for _, b := range rep.Bands {
		if b.Name == metric && b.Group == group && b.Level == level {
			return b.Median
		}
	}
	return math.NaN()
}

func intervalText(lo, hi float64) string {
	if !finite(lo) || !finite(hi) {
		return "—"
	}
	return "[" + h3(lo) + ", " + h3(hi) + "]"
}

func minPText(p float64) string {
	if p == 0 {
		return "0 (asymptotic)"
	}
	return h3(p)
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

// campaignPage is the campaign report template with the shared parts.
var campaignPage = parsePage("campaign", campaignTemplate)
