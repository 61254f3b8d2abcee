package report

import (
	"fmt"
	"html/template"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/features/surrogate"
)

// Section ids, in the order the report shows them.
const (
	sectionSummary    = "summary"
	sectionVerdict    = "verdict"
	sectionTrace      = "trace"
	sectionDegrees    = "degrees"
	sectionClustering = "clustering"
	sectionPlane      = "plane"
	sectionSurrogates = "surrogates"
	sectionMethods    = "methods"
)

// Sections returns the HTML ids of the report's sections in order: the
// header with the trace summary, the verdict, the trace and its increments,
// the visibility-graph degree distributions, the local clustering, the
// complexity–entropy plane, the surrogate tests and the methods.
func Sections() []string {
	return []string{sectionSummary, sectionVerdict, sectionTrace, sectionDegrees,
		sectionClustering, sectionPlane, sectionSurrogates, sectionMethods}
}

// WriteHTML writes the report as one self-contained HTML file: inline CSS
// and inline SVG figures, no scripts and no external resources. The markup
// is also well-formed XML (XHTML syntax). The output depends only on the
// report, so the same trace, model and options give the same bytes.
func (r *Report) WriteHTML(w io.Writer) error {
	v := r.view()
	if err := page.Execute(w, v); err != nil {
		return fmt.Errorf("report: %w", err)
	}
	return nil
}

// fact is one labelled value of the header.
type fact struct{ Label, Value string }

type driverRow struct {
	Feature, Value, Contribution, Meaning string
	Bar                                   template.HTML
}

type surrogateRow struct {
	Stat, Observed, Surrogates, Z, P, PHolm, Verdict string
	Rejected                                         bool
}

type refRow struct {
	Label, System, Class, Entropy, Complexity string
}

type warningLimitRow struct {
	Warning, Rule, Limit string
}

type featureRow struct {
	Name, Family, Value, Meaning, Reference, Missing string
}

type figure struct {
	SVG     template.HTML
	Caption string
}

type view struct {
	Title, Source, Kicker string
	ExtraCSS              template.CSS // none: the shared style sheet serves
	Facts                 []fact
	TraceWarnings         []string
	Nav                   []fact // id, title

	Class, Top, ClassLine string
	ProbFig               figure
	Reasons               []string
	Drivers               []driverRow
	DriversNote           string
	Warnings              []string
	Caution               string

	TraceFig, IncFig  *figure
	TraceFailures     []string
	HVGFig, NVGFig    *figure
	GraphRows         []fact
	DegreesNote       string
	DegreesFailures   []string
	ClustFig, CkFig   *figure
	ClusteringNote    string
	NetworkTable      *networkTable
	PlaneFig          *figure
	PlaneNote         string
	RefRows           []refRow
	PlaneFailures     []string
	DeterminismLine   string
	DetIntro          string
	DetRows           []surrogateRow
	DetAgreement      string
	SurrogateIntro    string
	SurrogateRows     []surrogateRow
	SurrogateFig      *figure
	SurrogateNotes    []string
	SurrogateFailures []string
	SurrogatesSkipped bool

	ModelFacts    []fact
	WarningLimits []warningLimitRow
	Features      []featureRow
	Footer        string
}

func (r *Report) view() view {
	s := r.Summary
	v := view{
		Title:   "tracesift report: " + s.Source,
		Source:  s.Source,
		Kicker:  "tracesift · single-trace screening report",
		Caution: r.Caution,
	}
	// Header.
	v.Facts = append(v.Facts, fact{"Samples", strconv.Itoa(s.Samples)})
	if s.Interval > 0 {
		unit := s.TimeUnit
		if unit == "" {
			unit = "time units"
		}
		v.Facts = append(v.Facts, fact{"Sample interval", h4(s.Interval) + " " + unit})
		if s.IntervalSeconds > 0 {
			v.Facts = append(v.Facts, fact{"Sampling rate", siValue(1/s.IntervalSeconds, "Hz")})
			v.Facts = append(v.Facts, fact{"Duration", siValue(s.IntervalSeconds*float64(s.Samples), "s")})
		}
		if s.Uneven {
			v.Facts = append(v.Facts, fact{"Time steps", "uneven (median step used)"})
		}
	} else {
		v.Facts = append(v.Facts, fact{"Sample interval", "unknown (no time column)"})
	}
	col := s.Column
	if col == "" {
		col = "(no header)"
	}
	unit := s.Unit
	if unit == "" {
		unit = "not given"
	}
	v.Facts = append(v.Facts, fact{"Value column", col}, fact{"Units", unit})
	big := math.Max(math.Abs(s.Min), math.Abs(s.Max))
	v.Facts = append(v.Facts, fact{"Mean ± sd", quantity(s.Mean, big, s.Unit) + " ± " + quantity(s.SD, s.SD, s.Unit)})
	v.Facts = append(v.Facts, fact{"Range", quantity(s.Min, big, s.Unit) + " … " + quantity(s.Max, big, s.Unit)})
	v.Facts = append(v.Facts, fact{"Seed", strconv.FormatUint(r.Options.Seed, 10)})
	v.Facts = append(v.Facts, fact{"Model", r.Model.Source})
	v.TraceWarnings = s.Warnings
	titles := map[string]string{
		sectionVerdict: "Verdict", sectionTrace: "Trace and increments", sectionDegrees: "Degree distributions",
		sectionClustering: "Local clustering", sectionPlane: "Complexity–entropy plane",
		sectionSurrogates: "Surrogate tests", sectionMethods: "Methods and references",
	}
	for _, id := range Sections()[1:] {
		v.Nav = append(v.Nav, fact{id, titles[id]})
	}

	r.viewVerdict(&v)
	r.viewTrace(&v)
	r.viewGraphs(&v)
	r.viewPlane(&v)
	r.viewSurrogates(&v)
	r.viewMethods(&v)
	gen := r.Options.Generator
	if gen == "" {
		gen = "tracesift"
	}
	v.Footer = fmt.Sprintf("Generated by %s with seed %d. The same trace, model, seed and options give this file byte for byte; it holds no date and loads nothing from the network.", gen, r.Options.Seed)
	return v
}

func (r *Report) viewVerdict(v *view) {
	vd := r.Verdict
	v.Class, v.Top = vd.Class, vd.Top
	top := -1
	for i, c := range vd.Classes {
		if c == vd.Top {
			top = i
		}
	}
	pTop := math.NaN()
	if top >= 0 {
		pTop = vd.Probabilities[top]
	}
	win := fmt.Sprintf("the whole trace (%d samples)", vd.WindowLength)
	if vd.Windows > 1 {
		win = fmt.Sprintf("%d windows of %d samples, probabilities averaged", vd.Windows, vd.WindowLength)
	}
	if vd.Class == classifier.UndeterminedLabel {
		v.ClassLine = fmt.Sprintf("The model is not confident: the most probable class is %s with probability %.2f. Measured on %s.", vd.Top, pTop, win)
	} else {
		v.ClassLine = fmt.Sprintf("Most probable class %s with probability %.2f. Measured on %s.", vd.Top, pTop, win)
	}
	v.ProbFig = figure{
		SVG: template.HTML(probabilityFigure(vd, r.Model.MinProbability)),
		Caption: fmt.Sprintf("Figure 1. Class probabilities of the tree ensemble (share of tree votes). Dashed line: the model's threshold %.2f; below it the verdict is undetermined.",
			r.Model.MinProbability),
	}
	v.Reasons = vd.Reasons
	maxAbs := 0.0
	for _, d := range vd.Drivers {
		maxAbs = math.Max(maxAbs, math.Abs(d.Contribution))
	}
	for _, d := range vd.Drivers {
		e, _ := features.Lookup(d.Feature)
		v.Drivers = append(v.Drivers, driverRow{
			Feature: d.Feature, Value: h4(d.Value), Contribution: signed(d.Contribution),
			Meaning: e.Description, Bar: template.HTML(contributionBar(d.Contribution, maxAbs, colourOf(vd.Top))),
		})
	}
	v.DriversNote = fmt.Sprintf("Contribution: how much the feature moved the probability of %s along the decision paths of the trees (Saabas attribution: the prior plus all contributions equals the probability). Positive values pushed towards %s, negative ones away from it.", vd.Top, vd.Top)
	v.Warnings = vd.Warnings
}

func (r *Report) viewTrace(v *view) {
	v.TraceFailures = r.Failures[sectionTrace]
	s := r.Summary
	if p := r.Trace; p != nil {
		cap := fmt.Sprintf("Figure 2. The trace, %d samples", s.Samples)
		if p.Reduced {
			cap += fmt.Sprintf("; drawn as the minimum–maximum envelope of %s samples per column, so every excursion stays visible", h4(p.PerColumn))
		}
		v.TraceFig = &figure{template.HTML(traceFigure(p, s)), cap + "."}
	}
	if p := r.Increments; p != nil {
		st := p.Stats
		cap := fmt.Sprintf("Figure 3. Density of the normalised increments z = (Δx − mean)/sd, Δx_t = x_{t+1} − x_t, on a logarithmic axis, with the Gaussian of the same mean and sd; fat tails show as bars above the parabola. "+
			"%d increments: skewness %s (± %s), excess kurtosis %s (± %s), Kolmogorov–Smirnov distance to the Gaussian %s (Lilliefors 5 %% critical value %s), largest |z| %s, lag-1 autocorrelation of the increments %s.",
			st.N, h3(st.Skewness), h3(st.SkewnessSE), h3(st.ExcessKurtosis), h3(st.KurtosisSE), h3(st.KS), h3(st.KSCritical), h3(st.MaxAbsZ), h3(st.Lag1))
		if p.Hist.Outside > 0 {
			cap += fmt.Sprintf(" %d increments fall outside the drawn range.", p.Hist.Outside)
		}
		v.IncFig = &figure{template.HTML(incrementsFigure(p)), cap}
	}
}

func (r *Report) viewGraphs(v *view) {
	v.DegreesFailures = r.Failures[sectionDegrees]
	h, n := r.HVG, r.NVG
	var g0 *GraphPanel
	if h != nil {
		g0 = h
	} else if n != nil {
		g0 = n
	}
	if g0 != nil {
		if g0.Nodes < r.Summary.Samples {
			v.DegreesNote = fmt.Sprintf("Both graphs are built on the middle %d samples (from sample %d) of the %d.", g0.Nodes, g0.Offset, r.Summary.Samples)
		} else {
			v.DegreesNote = fmt.Sprintf("Both graphs are built on all %d samples, one node per sample.", g0.Nodes)
		}
	}
	if h != nil {
		cap := "Figure 4. Degree distribution of the horizontal visibility graph (HVG) on semi-logarithmic axes. Dashed: P(k) = (1/3)(2/3)^(k−2), the exact law for any i.i.d. series (Luque et al. 2009), a straight line of slope −ln(3/2) ≈ −0.405. "
		if t := h.Tail; t != nil {
			cap += fmt.Sprintf("Solid: the geometric tail fitted by maximum likelihood for k ≥ %d (%d nodes), λ = %s ± %s; λ below ln(3/2) points to chaos, above it to correlated noise (Lacasa & Toral 2010).",
				t.KMin, t.NTail, h3(t.Lambda), h3(t.StdErr))
		} else if h.FitError != "" {
			cap += "No tail fit: " + h.FitError + "."
		}
		v.HVGFig = &figure{template.HTML(hvgDegreeFigure(h)), cap}
		v.GraphRows = append(v.GraphRows,
			fact{"HVG nodes / edges", fmt.Sprintf("%d / %d", h.Nodes, h.Edges)},
			fact{"HVG mean degree ⟨k⟩", h4(h.Degrees.Mean) + " (4 for any aperiodic series; Luque et al. 2009)"})
		if t := h.Tail; t != nil {
			v.GraphRows = append(v.GraphRows, fact{"HVG tail rate λ", fmt.Sprintf("%s ± %s (k ≥ %d, KS %s; i.i.d. ln(3/2) = 0.405)", h3(t.Lambda), h3(t.StdErr), t.KMin, h3(t.KS))})
		}
	}
	if n != nil {
		cap := "Figure 5. Degree distribution of the natural visibility graph (NVG) on log–log axes. "
		if f := n.PowerLaw; f != nil {
			cap += fmt.Sprintf("Solid: the discrete power law P(k) ∝ k^(−γ) fitted by maximum likelihood for k ≥ %d (%d nodes, k_min by the Kolmogorov–Smirnov rule of Clauset et al. 2009), γ = %s ± %s. Fractional Brownian motion gives γ = 3 − 2H (Lacasa et al. 2009).",
				f.KMin, f.NTail, h3(f.Gamma), h3(f.StdErr))
		} else if n.FitError != "" {
			cap += "No power-law fit: " + n.FitError + "."
		}
		v.NVGFig = &figure{template.HTML(nvgDegreeFigure(n)), cap}
		v.GraphRows = append(v.GraphRows,
			fact{"NVG nodes / edges", fmt.Sprintf("%d / %d", n.Nodes, n.Edges)},
			fact{"NVG mean degree ⟨k⟩", h4(n.Degrees.Mean)})
		if f := n.PowerLaw; f != nil {
			v.GraphRows = append(v.GraphRows, fact{"NVG exponent γ", fmt.Sprintf("%s ± %s (k ≥ %d, KS %s)", h3(f.Gamma), h3(f.StdErr), f.KMin, h3(f.KS))})
		}
	}
	if h != nil || n != nil {
		v.ClustFig = &figure{template.HTML(clusteringFigure(h, n)),
			"Figure 6. Histogram of the local clustering coefficients C_i = 2T_i/(k_i(k_i − 1)) (T_i triangles through node i; Watts & Strogatz 1998), share of nodes in bins of width 0.05. In an HVG every node of degree k has C = 2/k, so its histogram mirrors the degree distribution."}
		v.CkFig = &figure{template.HTML(clusteringByDegreeFigure(h, n)),
			"Figure 7. Mean clustering C(k) of the nodes of degree k. Dashed: C(k) = 2/k, exact for any HVG (Luque et al. 2009); NVGs of chaotic and correlated series fall off as power laws of their own."}
		var parts []string
		if h != nil {
			parts = append(parts, fmt.Sprintf("HVG mean clustering %s (≈ 0.648 for i.i.d. series; Luque et al. 2009), transitivity %s", h4(h.Clustering.Mean), h4(h.Clustering.Transitivity)))
		}
		if n != nil {
			parts = append(parts, fmt.Sprintf("NVG mean clustering %s, transitivity %s", h4(n.Clustering.Mean), h4(n.Clustering.Transitivity)))
		}
		v.ClusteringNote = strings.Join(parts, "; ") + "."
	}
	if r.Networks != nil {
		v.NetworkTable = r.Networks.table()
	}
}

func (r *Report) viewPlane(v *view) {
	v.PlaneFailures = r.Failures[sectionPlane]
	p := r.Plane
	if p == nil {
		return
	}
	tr := p.Trace
	v.PlaneFig = &figure{template.HTML(planeFigure(p)),
		fmt.Sprintf("Figure 8. The trace (star) on the complexity–entropy plane of ordinal patterns of order %d, delay 1, among reference systems drawn at the same length (%d samples, fixed seeds) and coloured by their class. Grey curves: the smallest and largest complexity any pattern distribution can have at a given entropy (Martin, Plastino & Rosso 2006). Chaotic dynamics sit high near the upper bound at intermediate entropy; noises sit at high entropy and low complexity; regular signals at low entropy.",
			p.Order, p.ReferenceLength)}
	v.PlaneNote = fmt.Sprintf("This trace: H = %s, C = %s (bounds at this entropy %s – %s), %d windows over %d patterns (%s windows per pattern).",
		h3(tr.Entropy), h3(tr.Complexity), h3(tr.MinComplexity), h3(tr.MaxComplexity), tr.Windows, tr.Patterns, h3(tr.WindowsPerPattern))
	if tr.WindowsPerPattern < 10 {
		v.PlaneNote += " With fewer than about 10 windows per pattern the entropy is biased low and the complexity high; the references share the bias because they are drawn at the same length."
	}
	for _, ref := range p.References {
		row := refRow{Label: ref.Label, System: ref.System, Class: ref.Class, Entropy: h3(ref.Entropy), Complexity: h3(ref.Complexity)}
		if ref.Error != "" {
			row.Class, row.Entropy, row.Complexity = "—", "—", "failed: "+ref.Error
		}
		v.RefRows = append(v.RefRows, row)
	}
}

func (r *Report) viewSurrogates(v *view) {
	v.SurrogateFailures = r.Failures[sectionSurrogates]
	if r.Options.Surrogates < 0 {
		v.SurrogatesSkipped = true
		v.DeterminismLine = "skipped at the caller's request."
		return
	}
	var figRows []surrogate.Result
	if d := r.Determinism; d != nil {
		figRows = append(figRows, r.viewDeterminism(v, d)...)
	} else {
		v.DeterminismLine = "not computed (see section 6)."
	}
	if rep := r.Surrogates; rep != nil {
		r.viewFeatureTests(v, rep)
		figRows = append(figRows, rep.Tests...)
	}
	if svg := surrogateFigure(figRows); svg != "" {
		v.SurrogateFig = &figure{template.HTML(svg),
			"Figure 9. Each statistic's surrogate values (ticks) and observed value (diamond, red when the null hypothesis is rejected after Holm's adjustment), in surrogate standard deviations from the surrogate mean; dotted lines at ±1.96. The determinism statistics are one-sided: only a diamond far to the right (more predictable, more time-asymmetric than every surrogate) counts against the null. A diamond far outside the ticks means the trace has structure the null hypothesis cannot produce."}
	}
}

// stretchText describes the samples a surrogate test used.
func (r *Report) stretchText(start, used int) string {
	switch {
	case used >= r.Summary.Samples:
		return fmt.Sprintf("all %d samples", used)
	case start >= 0:
		return fmt.Sprintf("samples %d–%d of the %d", start, start+used-1, r.Summary.Samples)
	}
	return fmt.Sprintf("the middle %d of the %d samples", used, r.Summary.Samples)
}

// viewDeterminism fills the determinism-test part of section 6 and the
// verdict's test line, and returns the statistics for the figure.
func (r *Report) viewDeterminism(v *view, d *surrogate.DeterminismResult) []surrogate.Result {
	a := d.Agreement(r.Verdict.Class)
	v.DeterminismLine = capitalise(a.Text) + "."
	v.DetAgreement = v.DeterminismLine
	trim := ""
	if d.EndMatched {
		trim = ", trimmed so that its two ends match"
	}
	v.DetIntro = fmt.Sprintf("Is the structure of the trace significant against %d IAAFT surrogates (seed %d), which keep its values exactly and its power spectrum closely? Null hypothesis: %s. Tested on %s%s, Gaussianised (each value replaced by the normal quantile of its rank, so that only the order of the values matters). The delay τ = %d and dimension d = %d are chosen once on the trace and used for every surrogate. "+
		"%s: correlation of simplex forecasts %d samples ahead with the truth; "+
		"%s: |skewness| of the increments x(t+τ) − x(t), zero in expectation for every time-reversible process, surrogates included. "+
		"Both are one-sided (larger than the surrogates), p = (1 + #{surrogates ≥ observed})/(M + 1), Holm-adjusted over the two; the null is rejected when an adjusted p is at most α = %s, which needs at least %d surrogates.",
		d.Count, d.Seed, strings.TrimSuffix(d.NullHypothesis, "."), r.stretchText(d.Start, d.Len), trim, d.Delay, d.Dim,
		surrogate.StatPredSkill, d.Horizon, surrogate.StatReversal, h4(d.Alpha), d.MinSurrogates)
	var rows []surrogate.Result
	for _, s := range d.Stats {
		z := math.NaN()
		if s.SD > 0 {
			z = (s.Observed - s.Mean) / s.SD
		}
		row := surrogateRow{Stat: s.Name, Observed: h4(s.Observed), Surrogates: h4(s.Mean) + " ± " + h4(s.SD),
			Z: fixedOrDash(z, 2), P: h3(s.P), PHolm: h3(s.PHolm), Rejected: s.Significant, Verdict: testVerdict(s.Error, s.Significant, false, s.Failed)}
		v.DetRows = append(v.DetRows, row)
		rows = append(rows, surrogate.Result{Stat: s.Name, Observed: s.Observed, Mean: s.Mean, SD: s.SD, Z: z,
			Significant: s.Significant, Values: s.Values, Error: s.Error})
		for _, w := range s.Warnings {
			v.SurrogateNotes = append(v.SurrogateNotes, s.Name+": "+w)
		}
	}
	if s := d.IAAFT; s != nil {
		v.SurrogateNotes = append(v.SurrogateNotes, iaaftNote("Determinism test", s))
	}
	v.SurrogateNotes = append(v.SurrogateNotes, d.Warnings...)
	return rows
}

// viewFeatureTests fills the part of section 6 on the tests of
// Options.Stats.
func (r *Report) viewFeatureTests(v *view, rep *surrogate.Report) {
	null := strings.TrimSpace(rep.NullHypothesis)
	if !strings.HasSuffix(null, ".") {
		null += "."
	}
	v.SurrogateIntro = fmt.Sprintf("Each statistic is computed on the trace (%s) and on %d %s surrogates (seed %d). Null hypothesis: %s %s rank test at α = %s with Holm's adjustment over the %d statistics; p = (1 + #{surrogates at least as extreme})/(M + 1), doubled for two sides, so the smallest p reachable is %s.",
		r.stretchText(-1, rep.Used), rep.Count, strings.ToUpper(string(rep.Method)), rep.Seed, null, capitalise(string(rep.Side)), h4(rep.Alpha), len(rep.Tests), h3(2/float64(rep.Count+1)))
	need := HolmSurrogates(len(rep.Tests), rep.Alpha)
	tooFew := rep.Count < need
	if tooFew {
		v.SurrogateNotes = append(v.SurrogateNotes, fmt.Sprintf("With %d surrogates and %d statistics the smallest Holm-adjusted p is %d × 2/%d = %s, above α = %s: no statistic can be declared significant. At least %d surrogates are needed.",
			rep.Count, len(rep.Tests), len(rep.Tests), rep.Count+1, h3(float64(2*len(rep.Tests))/float64(rep.Count+1)), h4(rep.Alpha), need))
	}
	for _, t := range rep.Tests {
		extreme := tooFew && t.P <= 2/float64(t.Count+1)
		v.SurrogateRows = append(v.SurrogateRows, surrogateRow{Stat: t.Stat, Observed: h4(t.Observed), Surrogates: h4(t.Mean) + " ± " + h4(t.SD),
			Z: fixedOrDash(t.Z, 2), P: h3(t.P), PHolm: h3(t.PHolm), Rejected: t.Significant, Verdict: testVerdict(t.Error, t.Significant, extreme, t.Failed)})
	}
	if s := rep.IAAFT; s != nil {
		v.SurrogateNotes = append(v.SurrogateNotes, iaaftNote("Feature tests", s))
	}
	v.SurrogateNotes = append(v.SurrogateNotes, rep.Warnings...)
	for _, t := range rep.Tests {
		for _, w := range t.Warnings {
			v.SurrogateNotes = append(v.SurrogateNotes, t.Stat+": "+w)
		}
	}
}

// testVerdict is the verdict column of a surrogate-test row.
func testVerdict(errText string, significant, extremeButTooFew bool, failed int) string {
	var s string
	switch {
	case errText != "":
		s = "not computable: " + errText
	case significant:
		s = "null rejected"
	case extremeButTooFew:
		s = "most extreme possible, but too few surrogates for significance"
	default:
		s = "consistent with the null"
	}
	if failed > 0 {
		s += fmt.Sprintf(" (failed on %d surrogates)", failed)
	}
	return s
}

func iaaftNote(who string, s *surrogate.IAAFTSummary) string {
	return fmt.Sprintf("%s, IAAFT: %s iterations on average (at most %d, %d stopped by the cap); spectral error %s on average, at most %s.",
		who, h3(s.MeanIterations), s.MaxIterations, s.NotConverged, h3(s.MeanSpectralError), h3(s.MaxSpectralError))
}

func (r *Report) viewMethods(v *view) {
	for _, l := range classifier.RecordingWarningLimits() {
		v.WarningLimits = append(v.WarningLimits, warningLimitRow{Warning: l.Warning, Rule: l.Rule, Limit: l.Limit})
	}
	m := r.Model
	v.ModelFacts = []fact{
		{"Model", m.Source},
		{"Forest", fmt.Sprintf("%d trees, feature schema v%d (%s)", m.Trees, m.Schema.Version, m.Schema.Hash)},
		{"Training set", fmt.Sprintf("%s (%d series)", m.Training, m.Rows)},
		{"Out-of-bag accuracy", h3(m.OOBAccuracy)},
	}
	if !math.IsNaN(m.CVAccuracy) {
		v.ModelFacts = append(v.ModelFacts, fact{"Cross-validated accuracy", fmt.Sprintf("%s (%d folds, grouped)", h3(m.CVAccuracy), m.CVFolds)})
	}
	vec := r.Verdict.Vector
	for _, e := range features.Catalogue() {
		row := featureRow{Name: e.Name, Family: string(e.Family), Meaning: e.Description, Reference: e.Reference, Value: "—"}
		for i, n := range vec.Names {
			if n == e.Name {
				row.Value = h4(vec.Values[i])
				if vec.Reasons[i] != "" {
					row.Value, row.Missing = "—", vec.Reasons[i]
				}
			}
		}
		v.Features = append(v.Features, row)
	}
}

// h4 and h3 round a number for people (4 or 3 significant digits), "—"
// for NaN.
func h4(x float64) string { return human(x, 4) }
func h3(x float64) string { return human(x, 3) }

func human(x float64, digits int) string {
	switch {
	case math.IsNaN(x):
		return "—"
	case math.IsInf(x, 1):
		return "∞"
	case math.IsInf(x, -1):
		return "−∞"
	case x == math.Trunc(x) && math.Abs(x) < 1e6:
		return minus(strconv.FormatFloat(x, 'f', -1, 64))
	}
	s := strconv.FormatFloat(x, 'g', digits, 64)
	if strings.Contains(s, "e") {
		mant, exp, _ := strings.Cut(s, "e")
		e, _ := strconv.Atoi(exp)
		return minus(mant) + " × 10" + superscript(e)
	}
	return minus(s)
}

// superscript writes an integer in Unicode superscript digits, e.g. ⁻⁶.
func superscript(e int) string {
	const digits = "⁰¹²³⁴⁵⁶⁷⁸⁹"
	sup := []rune(digits)
	var b strings.Builder
	for _, r := range strconv.Itoa(e) {
		if r == '-' {
			b.WriteRune('⁻')
			continue
		}
		b.WriteRune(sup[r-'0'])
	}
	return b.String()
}

// quantity prints a value in a unit with a metric prefix chosen for the
// scale (e.g. 9.007 µA); without a unit it falls back to h4.
func quantity(x, scale float64, unit string) string {
	if unit == "" || !finite(x) {
		return h4(x)
	}
	e := engineering(scale)
	for _, p := range siPrefixes {
		if p.exp == e {
			return h4(x*math.Pow(10, float64(-e))) + " " + p.prefix + unit
		}
	}
	return h4(x) + " " + unit
}

// signed prints a contribution with an explicit sign.
func signed(x float64) string { return signedDigits(x, 3) }

// signedDigits prints x with d decimals and an explicit sign, "—" for NaN.
func signedDigits(x float64, d int) string {
	if math.IsNaN(x) {
		return "—"
	}
	if x >= 0 {
		return "+" + strconv.FormatFloat(x, 'f', d, 64)
	}
	return minus(strconv.FormatFloat(x, 'f', d, 64))
}

func fixedOrDash(x float64, d int) string {
	if !finite(x) {
		return "—"
	}
	return minus(strconv.FormatFloat(x, 'f', d, 64))
}

// siValue prints a positive value with a metric prefix, e.g. 10 kHz.
func siValue(x float64, unit string) string {
	e := engineering(x)
	for _, p := range siPrefixes {
		if p.exp == e {
			return h4(x*math.Pow(10, float64(-e))) + " " + p.prefix + unit
		}
	}
	return h4(x) + " " + unit
}

func capitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// page is the single-trace report template with the shared parts.
var page = parsePage("report", pageTemplate)
