package campaign

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"regexp"
	"strconv"
	"strings"
)

// TestColumns is the header of the test table.
var TestColumns = []string{"family", "question", "test", "name", "level", "param", "group", "a", "b", "condition", "file",
	"n", "m", "statistic", "p", "p_holm", "p_bh", "significant", "estimate", "low", "high", "effect", "effect_kind",
	"min_p", "p_method", "note"}

// WriteTestsCSV writes one row per test, numbers at full precision,
// missing numbers empty.
func WriteTestsCSV(w io.Writer, rep Report) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(TestColumns); err != nil {
		return err
	}
	for _, t := range rep.Tests {
		if err := cw.Write([]string{t.Family, t.Question, t.Test, t.Name, t.Level, num(t.Param), t.Group, t.A, t.B, t.Condition, t.File,
			strconv.Itoa(t.N), strconv.Itoa(t.M), num(t.Statistic), num(t.P), num(t.PHolm), num(t.PBH), strconv.FormatBool(t.Significant),
			num(t.Estimate), num(t.Low), num(t.High), num(t.Effect), t.EffectKind, num(t.MinP), t.PMethod, t.Note}); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// WriteTestsJSONL writes one JSON object per test (keys of TestColumns,
// missing numbers null).
func WriteTestsJSONL(w io.Writer, rep Report) error {
	for _, t := range rep.Tests {
		obj := map[string]any{
			"family": t.Family, "question": t.Question, "test": t.Test, "name": t.Name, "level": t.Level, "param": jnum(t.Param),
			"group": t.Group, "a": t.A, "b": t.B, "condition": t.Condition, "file": t.File, "n": t.N, "m": t.M,
			"statistic": jnum(t.Statistic), "p": jnum(t.P), "p_holm": jnum(t.PHolm), "p_bh": jnum(t.PBH), "significant": t.Significant,
			"estimate": jnum(t.Estimate), "low": jnum(t.Low), "high": jnum(t.High), "effect": jnum(t.Effect), "effect_kind": t.EffectKind,
			"min_p": jnum(t.MinP), "p_method": t.PMethod, "note": t.Note,
		}
		b, err := json.Marshal(obj) // map keys are sorted: stable bytes
		if err != nil {
			return err
		}
		if _, err := w.Write(append(b, '\n')); err != nil {
			return err
		}
	}
	return nil
}

// WriteHistogramsCSV writes the pooled distributions of every group at
// every level in the bins of the group comparison (one bin per distinct
// value for discrete distributions, else bins of equal pooled
// probability): columns name, group, level, traces, discrete, upper (the
// bin holds the values above the previous row's upper and up to this
// one), p.
func WriteHistogramsCSV(w io.Writer, rep Report) error {
	cw := csv.NewWriter(w)
	if err := cw.Write([]string{"name", "group", "level", "traces", "discrete", "upper", "p"}); err != nil {
		return err
	}
	for _, h := range rep.Histograms {
		for b := range h.Upper {
			if err := cw.Write([]string{h.Name, h.Group, h.Level, strconv.Itoa(h.Traces), strconv.FormatBool(h.Discrete), num(h.Upper[b]), num(h.P[b])}); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

// MarkdownOptions control the Markdown summaries.
type MarkdownOptions struct {
	// ParamLabel names the control parameter for people; "" means the
	// parameter column's name.
	ParamLabel string
	// Caution is printed at the end of every page (the screening-aid
	// statement of the command line).
	Caution string
	// LeftOut lists traces that could not be used, one line each.
	LeftOut []string
	// Figures lists the figure files to link from the summary.
	Figures []string
}

func (o MarkdownOptions) label(rep Report) string {
	switch {
	case o.ParamLabel != "":
		return o.ParamLabel
	case rep.Parameter != "":
		return rep.Parameter
	}
	return "parameter"
}

// LevelFile returns the name of the Markdown page of a level:
// "level_<level>.md" with characters other than letters, digits, '.', '-'
// and '_' replaced by '_' ("level_all.md" without a parameter).
func LevelFile(level string) string {
	if level == "" {
		level = "all"
	}
	return "level_" + unsafeName.ReplaceAllString(level, "_") + ".md"
}

var unsafeName = regexp.MustCompile(`[^A-Za-z0-9._-]`)

// WriteSummary writes the campaign overview: layout, settings, warnings,
// trends, the families and links to the level pages.
func WriteSummary(w io.Writer, rep Report, o MarkdownOptions) error {
	p := printer{w: w}
	label := o.label(rep)
	p.f("# Campaign survey\n\n")
	p.f("%d traces in %d groups (%s) at %d %s of %s; reference group **%s** (differences are other group − %s).\n\n",
		rep.Traces, len(rep.Groups), strings.Join(rep.Groups, ", "), len(rep.Levels), plural(len(rep.Levels), "level"), label, rep.Reference, rep.Reference)
	p.f("- Metrics (%d): %s.\n", len(rep.Metrics), strings.Join(rep.Metrics, ", "))
	if len(rep.Methods) > 0 {
		var ms []string
		for i, m := range rep.Methods {
			ms = append(ms, fmt.Sprintf("%s × %d", m, rep.Counts[i]))
		}
		p.f("- Surrogates per trace: %s; seed %d.\n", strings.Join(ms, ", "), rep.Seed)
	} else {
		p.f("- No surrogates; seed %d.\n", rep.Seed)
	}
	adj := "Holm"
	if rep.Adjust == "bh" {
		adj = "Benjamini–Hochberg"
	}
	p.f("- Significant means %s-adjusted p ≤ %s within the test's family (one family per question and test; Holm and BH are both listed).\n\n", adj, short(rep.Alpha))

	if len(rep.Warnings) > 0 {
		p.f("## Warnings\n\n")
		for _, wn := range rep.Warnings {
			p.f("- %s\n", wn)
		}
		p.f("\n")
	}

	p.f("## Layout\n\n| %s | %s | paired devices | page |\n|---|", cell(label), strings.Join(cells(rep.Groups), " | "))
	p.f("%s---|---|\n", strings.Repeat("---|", len(rep.Groups)))
	for _, lv := range rep.Levels {
		var counts []string
		for _, c := range lv.Traces {
			counts = append(counts, strconv.Itoa(c))
		}
		name := lv.Level
		if name == "" {
			name = "(all)"
		}
		p.f("| %s | %s | %d | [%s](%s) |\n", cell(name), strings.Join(counts, " | "), lv.Paired, LevelFile(lv.Level), LevelFile(lv.Level))
	}
	p.f("\n")

	if len(rep.Verdicts) > 0 {
		classes := rep.VerdictClasses()
		p.f("## Verdicts\n\nThe classifier's verdicts (%s) per group and %s; each trace's verdict and class probabilities are in traces.csv (rows of kind verdict) and in report.html.\n\n", strings.Join(rep.VerdictModels(), ", "), label)
		p.f("| group | %s | %s |\n|---|---|%s\n", cell(label), strings.Join(classes, " | "), strings.Repeat("---|", len(classes)))
		for _, g := range rep.Groups {
			for _, lv := range rep.Levels {
				n := make([]string, len(classes))
				seen := false
				for ci, c := range classes {
					k := 0
					for _, v := range rep.Verdicts {
						if v.Group == g && v.Level == lv.Level && v.Class == c {
							k++
						}
					}
					n[ci] = strconv.Itoa(k)
					seen = seen || k > 0
				}
				if seen {
					p.f("| %s | %s | %s |\n", cell(g), cell(lv.Level), strings.Join(n, " | "))
				}
			}
		}
		p.f("\n")
	}

	if trend := rep.select_(QuestionTrend); len(trend) > 0 {
		p.f("## Trend with %s\n\n", label)
		p.f("Spearman's ρ of each metric with %s over a group's traces, and the Theil–Sen slope with its %s interval.\n\n", label, pct(1-rep.Alpha))
		p.f("| metric | group | n | ρ | p | p Holm | p BH | slope | interval |\n|---|---|---|---|---|---|---|---|---|\n")
		for _, t := range trend {
			p.f("| %s | %s | %d | %s | %s | %s | %s | %s | %s |\n", t.Name, cell(t.Group), t.N, fix(t.Effect, 2), pv(t.P), pvSig(t.PHolm, t.Significant && rep.Adjust != "bh"), pvSig(t.PBH, t.Significant && rep.Adjust == "bh"), human(t.Estimate), interval(t.Low, t.High))
		}
		p.f("\n")
	}

	p.f("## Families\n\nEach family is adjusted on its own. *Reachable* says whether its smallest attainable p-value can pass the adjusted level at all.\n\n")
	p.f("| family | tests | smallest attainable p | reachable | significant |\n|---|---|---|---|---|\n")
	for _, f := range rep.Families {
		if !isTraceFamily(f.Name) {
			p.f("| %s | %d | %s | %s | %d |\n", f.Name, f.Tests, minP(f.MinP), yesNo(f.Reachable), f.Significant)
		}
	}
	if tf := rep.TraceFamilies(); tf.Families > 0 {
		p.f("| trace/… (one per trace, %d) | %d | %s | %d of %d | %d |\n", tf.Families, tf.Tests, minP(tf.MinP), tf.Reachable, tf.Families, tf.Significant)
	}
	p.f("\n")
	if len(o.Figures) > 0 {
		p.f("## Figures\n\n")
		for _, f := range o.Figures {
			p.f("- [%s](%s)\n", f, f)
		}
		p.f("\n")
	}
	writeTail(&p, rep, o)
	return p.err
}

// WriteLevel writes the page of one level (index into rep.Levels): group
// comparisons, original against surrogates, per-trace rank tests and
// pooled distributions, with raw and adjusted p-values and effect sizes.
func WriteLevel(w io.Writer, rep Report, li int, o MarkdownOptions) error {
	p := printer{w: w}
	lv := rep.Levels[li]
	label := o.label(rep)
	if lv.Level == "" {
		p.f("# All traces\n\n")
	} else {
		p.f("# %s = %s\n\n", label, lv.Level)
	}
	var counts []string
	for gi, g := range rep.Groups {
		counts = append(counts, fmt.Sprintf("%s %d", g, lv.Traces[gi]))
	}
	p.f("Traces: %s; devices measured in both groups: %d. p-values: raw, then Holm and BH within the family (**bold**: significant).\n\n", strings.Join(counts, ", "), lv.Paired)
	at := func(t Test) bool { return t.Level == lv.Level }
	sig := func(t Test) (string, string) {
		return pvSig(t.PHolm, t.Significant && rep.Adjust != "bh"), pvSig(t.PBH, t.Significant && rep.Adjust == "bh")
	}

	for _, gb := range rep.Groups[1:] {
		p.f("## %s against %s\n\n", gb, rep.Reference)
		p.f("Medians per group; Cliff's δ of %s over %s; Hodges–Lehmann shift; Kolmogorov–Smirnov and Mann–Whitney on the traces; Wilcoxon signed-rank on the devices measured in both (median paired difference, rank-biserial r).\n\n", gb, rep.Reference)
		p.f("| metric | median %s | median %s | δ | HL shift | KS p | Holm | BH | MW p | Holm | BH | pairs | Δ paired | r | SR p | Holm | BH |\n", cell(rep.Reference), cell(gb))
		p.f("|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|\n")
		for _, m := range rep.Metrics {
			var ks, mw, sr *Test
			for i := range rep.Tests {
				t := &rep.Tests[i]
				if t.Question != QuestionGroups || !at(*t) || t.Name != m || t.B != gb {
					continue
				}
				switch t.Test {
				case TestKS:
					ks = t
				case TestMW:
					mw = t
				case TestSignedRank:
					sr = t
				}
			}
			if ks == nil || mw == nil {
				continue
			}
			ma, mb := rep.bandMedian(m, rep.Reference, lv.Level), rep.bandMedian(m, gb, lv.Level)
			kh, kb := sig(*ks)
			mh, mbh := sig(*mw)
			row := fmt.Sprintf("| %s | %s | %s | %s | %s | %s | %s | %s | %s | %s | %s |", m, human(ma), human(mb), fix(ks.Effect, 2), human(mw.Estimate), pv(ks.P), kh, kb, pv(mw.P), mh, mbh)
			if sr != nil {
				sh, sb := sig(*sr)
				row += fmt.Sprintf(" %d | %s | %s | %s | %s | %s |", sr.N, human(sr.Estimate), fix(sr.Effect, 2), pv(sr.P), sh, sb)
			} else {
				row += " 0 | — | — | — | — | — |"
			}
			p.f("%s\n", row)
		}
		p.f("\n")
	}

	if len(rep.Methods) > 0 {
		p.f("## Original against surrogates\n\n")
		p.f("Per group: the Wilcoxon signed-rank test of (original − mean of the trace's surrogates) over the traces, paired trace by trace; Δ is the median difference, r the rank-biserial correlation. A metric that moves under shuffling is carried by temporal correlations; one that moves under Gaussianisation, by the shape of the value distribution (e.g. fat tails).\n\n")
		for _, method := range rep.Methods {
			p.f("### %s\n\n| metric | group | n | median original | median surrogate | Δ | r | p | Holm | BH |\n|---|---|---|---|---|---|---|---|---|---|\n", method)
			for _, t := range rep.Tests {
				if t.Question != QuestionSurrogate || !at(t) || t.Condition != method {
					continue
				}
				h, b := sig(t)
				p.f("| %s | %s | %d | %s | %s | %s | %s | %s | %s | %s |\n", t.Name, cell(t.Group), t.N,
					human(rep.bandMedian(t.Name, t.Group, lv.Level)), human(rep.bandSurrogate(t.Name, t.Group, lv.Level, method)),
					human(t.Estimate), fix(t.Effect, 2), pv(t.P), h, b)
			}
			p.f("\n")
		}
		p.f("## Per-trace rank tests\n\nEach trace's metric against its own surrogates (two-sided rank test; family: the trace's metrics × methods). Traces with raw p ≤ %s, and with a significant adjusted p, per metric and method:\n\n", short(rep.Alpha))
		p.f("| metric | %s |\n|---|%s\n", strings.Join(rep.Methods, " | "), strings.Repeat("---|", len(rep.Methods)))
		for _, m := range rep.Metrics {
			var cellsOut []string
			for _, method := range rep.Methods {
				n, raw, adj := 0, 0, 0
				for _, t := range rep.Tests {
					if t.Question == QuestionTrace && at(t) && t.Name == m && t.Condition == method && !math.IsNaN(t.P) {
						n++
						if t.P <= rep.Alpha {
							raw++
						}
						if t.Significant {
							adj++
						}
					}
				}
				cellsOut = append(cellsOut, fmt.Sprintf("%d / %d (%d)", raw, n, adj))
			}
			p.f("| %s | %s |\n", m, strings.Join(cellsOut, " | "))
		}
		p.f("\n")
	}

	var dist []Test
	for _, t := range rep.Tests {
		if t.Question == QuestionDistribution && at(t) {
			dist = append(dist, t)
		}
	}
	if len(dist) > 0 {
		p.f("## Pooled distributions\n\n")
		p.f("Per-node degrees and local clustering coefficients of the natural (NVG) and horizontal (HVG) visibility graphs, and the normalised increments, pooled with equal weight per trace. Groups are compared by the KS distance of the pooled distributions and the χ² distance of their bins (one bin per distinct value for discrete distributions such as degrees and HVG clustering); p-values relabel whole traces between the groups, so the dependence within a trace does not inflate them.\n\n")
		p.f("| distribution | groups | KS distance | p | Holm | BH | χ² distance | p | Holm | BH | bins |\n|---|---|---|---|---|---|---|---|---|---|---|\n")
		for _, t := range dist {
			if t.Test != TestPermKS {
				continue
			}
			var chi Test
			for _, c := range dist {
				if c.Test == TestPermChi && c.Name == t.Name && c.B == t.B {
					chi = c
				}
			}
			h, b := sig(t)
			ch, cb := sig(chi)
			p.f("| %s | %s vs %s | %s | %s | %s | %s | %s | %s | %s | %s | %s |\n", t.Name, cell(t.B), cell(t.A), fix(t.Statistic, 3), pv(t.P), h, b, fix(chi.Statistic, 3), pv(chi.P), ch, cb, strings.TrimPrefix(chi.Note, "bins: "))
		}
		p.f("\n")
		var flips []Test
		for _, t := range dist {
			if t.Test == TestGaussFlip {
				flips = append(flips, t)
			}
		}
		if len(flips) > 0 {
			p.f("Normalised increments against those of the Gaussianised surrogates (same temporal rank order, Gaussian values): sup|F − Φ| of each, their KS distance, and the p-value of swapping original and surrogate within traces.\n\n")
			p.f("| group | traces | original vs Φ | Gaussianised vs Φ | KS distance | p | Holm | BH |\n|---|---|---|---|---|---|---|---|\n")
			for _, t := range flips {
				h, b := sig(t)
				p.f("| %s | %d | %s | %s | %s | %s | %s | %s |\n", cell(t.Group), t.N, fix(t.Estimate, 3), fix(t.Effect, 3), fix(t.Statistic, 3), pv(t.P), h, b)
			}
			p.f("\n")
		}
	}
	writeTail(&p, rep, o)
	return p.err
}

func writeTail(p *printer, rep Report, o MarkdownOptions) {
	if len(rep.Notes) > 0 {
		p.f("## Notes\n\n")
		for _, n := range rep.Notes {
			p.f("- %s\n", n)
		}
		p.f("\n")
	}
	if len(o.LeftOut) > 0 {
		p.f("## Left out\n\n%d %s of the campaign could not be used and are in no test:\n\n", len(o.LeftOut), plural(len(o.LeftOut), "entry"))
		for _, l := range o.LeftOut {
			p.f("- %s\n", l)
		}
		p.f("\n")
	}
	if o.Caution != "" {
		p.f("> %s\n", o.Caution)
	}
}

// TraceFamilySummary sums the per-trace families (one per trace: its
// rank tests against its own surrogates).
type TraceFamilySummary struct {
	Families, Tests, Significant, Reachable int
	// MinP is the smallest attainable p over them (+Inf without any).
	MinP float64
}

// TraceFamilies sums the per-trace families of the report.
func (r Report) TraceFamilies() TraceFamilySummary {
	s := TraceFamilySummary{MinP: math.Inf(1)}
	for _, f := range r.Families {
		if !isTraceFamily(f.Name) {
			continue
		}
		s.Families++
		s.Tests += f.Tests
		s.Significant += f.Significant
		if f.Reachable {
			s.Reachable++
		}
		s.MinP = math.Min(s.MinP, f.MinP)
	}
	return s
}

// isTraceFamily reports whether a family holds one trace's tests.
func isTraceFamily(name string) bool { return strings.HasPrefix(name, QuestionTrace+"/") }

// select_ returns the tests of a question.
func (r Report) select_(question string) []Test {
	var out []Test
	for _, t := range r.Tests {
		if t.Question == question {
			out = append(out, t)
		}
	}
	return out
}

func (r Report) band(metric, group, level string) *Band {
	for i := range r.Bands {
		b := &r.Bands[i]
		if b.Name == metric && b.Group == group && b.Level == level {
			return b
		}
	}
	return nil
}

func (r Report) bandMedian(metric, group, level string) float64 {
	if b := r.band(metric, group, level); b != nil {
		return b.Median
	}
	return math.NaN()
}

func (r Report) bandSurrogate(metric, group, level, method string) float64 {
	if b := r.band(metric, group, level); b != nil {
		for _, m := range b.Methods {
			if m.Method == method {
				return m.Mean
			}
		}
	}
	return math.NaN()
}

// printer writes formatted text and keeps the first error.
type printer struct {
	w   io.Writer
	err error
}

func (p *printer) f(format string, a ...any) {
	if p.err == nil {
		_, p.err = fmt.Fprintf(p.w, format, a...)
	}
}

// human rounds for people: 4 significant digits, "—" for NaN.
func human(v float64) string {
	switch {
	case math.IsNaN(v):
		return "—"
	case math.IsInf(v, 0):
		return fmt.Sprint(v)
	case v == math.Trunc(v) && math.Abs(v) < 1e6:
		return strconv.FormatFloat(v, 'f', -1, 64)
	}
	return strconv.FormatFloat(v, 'g', 4, 64)
}

func fix(v float64, d int) string {
	if math.IsNaN(v) {
		return "—"
	}
	return strconv.FormatFloat(v, 'f', d, 64)
}

// pv prints a p-value: 3 significant digits, "<1e-6" below.
func pv(p float64) string {
	switch {
	case math.IsNaN(p):
		return "—"
	case p < 1e-6:
		return "<1e-6"
	}
	return strconv.FormatFloat(p, 'g', 3, 64)
}

func pvSig(p float64, sig bool) string {
	if sig {
		return "**" + pv(p) + "**"
	}
	return pv(p)
}

func minP(p float64) string {
	if p == 0 {
		return "0 (asymptotic)"
	}
	return pv(p)
}

func interval(lo, hi float64) string {
	if math.IsNaN(lo) || math.IsNaN(hi) {
		return "—"
	}
	return "[" + human(lo) + ", " + human(hi) + "]"
}

func pct(v float64) string { return strconv.FormatFloat(100*v, 'g', 4, 64) + " %" }

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "**no**"
}

func plural(n int, word string) string {
	if n == 1 {
		return word
	}
	if strings.HasSuffix(word, "y") {
		return word[:len(word)-1] + "ies"
	}
	return word + "s"
}

// cell escapes a table cell.
func cell(s string) string { return strings.ReplaceAll(s, "|", `\|`) }

func cells(v []string) []string {
	out := make([]string, len(v))
	for i, s := range v {
		out[i] = cell(s)
	}
	return out
}
