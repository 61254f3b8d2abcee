package benchmarks

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"
)

// num formats a number for people: five significant digits, "—" for a
// missing value.
func num(v float64) string {
	switch {
	case math.IsNaN(v):
		return "—"
	case math.IsInf(v, 1):
		return "∞"
	case math.IsInf(v, -1):
		return "−∞"
	case v == math.Trunc(v) && math.Abs(v) < 1e9:
		return strconv.FormatFloat(v, 'f', -1, 64)
	}
	return strconv.FormatFloat(v, 'g', 5, 64)
}

func snrList(snrs []Float) string {
	var parts []string
	for _, v := range snrs {
		if f := float64(v); math.IsInf(f, 1) || math.IsNaN(f) {
			parts = append(parts, "clean")
		} else {
			parts = append(parts, strconvG(f)+" dB")
		}
	}
	return strings.Join(parts, ", ")
}

// pct formats a fraction as a percentage with one decimal.
func pct(v Float) string {
	if math.IsNaN(float64(v)) {
		return "—"
	}
	return strconv.FormatFloat(100*float64(v), 'f', 1, 64) + "%"
}

// cell escapes text for a Markdown table cell.
func cell(s string) string {
	return strings.ReplaceAll(strings.ReplaceAll(s, "|", `\|`), "\n", " ")
}

func params(p map[string]float64) string {
	keys := make([]string, 0, len(p))
	for k := range p {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	var parts []string
	for _, k := range keys {
		parts = append(parts, k+"="+strconvG(p[k]))
	}
	return strings.Join(parts, ", ")
}

// footnotes numbers distinct strings in order of first use.
type footnotes struct {
	prefix string
	list   []string
}

func (f *footnotes) ref(s string) string {
	i := slices.Index(f.list, s)
	if i < 0 {
		f.list = append(f.list, s)
		i = len(f.list) - 1
	}
	return fmt.Sprintf("%s%d", f.prefix, i+1)
}

func (f *footnotes) write(w io.Writer, title string) {
	if len(f.list) == 0 {
		return
	}
	fmt.Fprintf(w, "\n%s\n\n", title)
	for i, s := range f.list {
		fmt.Fprintf(w, "- %s%d: %s\n", f.prefix, i+1, s)
	}
}

// WriteMarkdown writes the human summary of r: settings, the screening
// caution, the invariant table with sources beside the values, the
// classification tables, the HVG and complexity–entropy pictures, the
// throughput table and the figure list.
func WriteMarkdown(w io.Writer, r *Result) error {
	bw := bufio.NewWriter(w)
	s := r.Settings
	fmt.Fprintf(bw, "# %s\n\n", r.Suite)
	fmt.Fprintf(bw, "Scale **%s**, seed %d, feature schema %s; %d seed(s) per invariant at length factors %v; classification at lengths %v, SNRs %s, plan count %d per class.",
		s.Scale, s.Seed, s.FeatureSchema, s.Seeds, s.LengthFactors, s.Lengths, snrList(s.SNRs), s.PerClass)
	if len(s.Skipped) > 0 {
		fmt.Fprintf(bw, " Sections left out: %s.", strings.Join(s.Skipped, ", "))
	}
	if m := r.Model; m != nil {
		fmt.Fprintf(bw, " Model: %s (%d trees, seed %d, schema %s; out-of-bag accuracy %s", m.Source, m.Trees, m.Seed, m.Schema, pct(m.OOBAccuracy))
		if !math.IsNaN(float64(m.CVAccuracy)) {
			fmt.Fprintf(bw, ", %s %s", m.CVMethod, pct(m.CVAccuracy))
		}
		fmt.Fprintf(bw, "); trained on: %s.", m.Description)
	}
	fmt.Fprintf(bw, "\n\n> **Screening caution.** %s\n", r.Caution)

	if len(r.Invariants) > 0 {
		writeInvariants(bw, r)
	}
	if c := r.Classification; c != nil {
		writeClassification(bw, c)
	}
	if h := r.Holdout; h != nil {
		writeHoldout(bw, h)
	}
	if d := r.Degrees; d != nil {
		writeDegrees(bw, d)
	}
	if p := r.Plane; p != nil {
		writePlane(bw, p)
	}
	if t := r.Throughput; t != nil {
		writeThroughput(bw, t)
	}
	if figs := Figures(r); len(figs) > 0 {
		fmt.Fprintf(bw, "\n## Figures\n\n")
		for _, f := range figs {
			fmt.Fprintf(bw, "### %s\n\n%s\n\n![%s](%s)\n\n", f.File, f.Caption, f.File, f.File)
		}
	}
	if e := r.Elapsed; e != nil {
		fmt.Fprintf(bw, "\nWall time (machine-dependent): invariants %ss, classification %ss, leave-one-family-out %ss, pictures %ss, throughput %ss, total %ss.\n",
			num(float64(e.Invariants)), num(float64(e.Classification)), num(float64(e.Holdout)), num(float64(e.Pictures)), num(float64(e.Throughput)), num(float64(e.Total)))
	}
	return bw.Flush()
}

func writeInvariants(w io.Writer, r *Result) {
	pass := 0
	for _, row := range r.Invariants {
		if row.Within {
			pass++
		}
	}
	fmt.Fprintf(w, "\n## 1. Invariant recovery\n\n")
	fmt.Fprintf(w, "%d of %d checks within tolerance. Each estimate is the median over %d seed(s) per length (interquartile range in brackets, then the extremes); "+
		"the tolerance is the one the project's own tests state for the first length listed, and its source is given under the table.\n\n",
		pass, len(r.Invariants), r.Settings.Seeds)
	est := &footnotes{prefix: "E"}
	tol := &footnotes{prefix: "T"}
	fmt.Fprintf(w, "| check | parameters | published value | source | estimate: median [Q1, Q3] | min – max | n × seeds | error | tolerance | within | estimator |\n")
	fmt.Fprintf(w, "|---|---|---|---|---|---|---|---|---|---|---|\n")
	var notes []string
	for _, row := range r.Invariants {
		e := row.Estimate
		value := row.Published
		if row.Unit == "per sample" {
			value += " = " + num(float64(row.Value)) + " per sample"
		}
		var lens []string
		for _, n := range row.Lengths {
			lens = append(lens, strconv.Itoa(n))
		}
		errText, tolText := "—", "—"
		switch {
		case row.Check == CheckAbsent:
			tolText = "no credible value"
		case row.ToleranceKind == "relative":
			errText = pct(row.RelError)
			tolText = "± " + pct(row.Tolerance)
		default:
			errText = num(float64(row.Error))
			tolText = "± " + num(float64(row.Tolerance))
		}
		estimate := fmt.Sprintf("%s [%s, %s]", num(float64(e.Median)), num(float64(e.Q1)), num(float64(e.Q3)))
		if row.Check == CheckAbsent {
			estimate = fmt.Sprintf("none credible in %d of %d runs", e.Missing-len(row.Failures), e.N+e.Missing)
		} else if e.Missing > 0 {
			estimate += fmt.Sprintf(" (%d missing)", e.Missing)
		}
		within := "yes"
		if !row.Within {
			within = "**no**"
		}
		id := row.ID
		if row.Note != "" {
			notes = append(notes, fmt.Sprintf("%s: %s.", row.ID, row.Note))
			id += " (note)"
		}
		fmt.Fprintf(w, "| %s | %s | %s | %s | %s | %s – %s | %s × %d | %s | %s [%s] | %s | [%s] |\n",
			cell(id), cell(params(row.Params)), cell(value), cell(row.Source), estimate, num(float64(e.Min)), num(float64(e.Max)),
			strings.Join(lens, ", "), row.Seeds, errText, tolText, tol.ref(row.ToleranceSource), within, est.ref(row.Estimator))
		for _, f := range row.Failures {
			notes = append(notes, fmt.Sprintf("%s failed: %s", row.ID, f))
		}
	}
	est.write(w, "Estimators:")
	tol.write(w, "Tolerances:")
	if len(notes) > 0 {
		fmt.Fprintf(w, "\nNotes:\n\n")
		for _, n := range notes {
			fmt.Fprintf(w, "- %s\n", cell(n))
		}
	}
	if len(r.SkippedInvariants) > 0 {
		fmt.Fprintf(w, "\nRegistry invariants not measured here:\n\n| system | invariant | value | source | why |\n|---|---|---|---|---|\n")
		for _, sk := range r.SkippedInvariants {
			fmt.Fprintf(w, "| %s | %s | %s | %s | %s |\n", sk.System, sk.Invariant, num(float64(sk.Value)), cell(sk.Source), cell(sk.Reason))
		}
	}
}

func writeScoreHeader(w io.Writer, first string, classes []string) {
	fmt.Fprintf(w, "| %s | series | accuracy | undetermined | accuracy when determined | chaotic vs stochastic |", first)
	for _, c := range classes {
		fmt.Fprintf(w, " %s recall |", c)
	}
	fmt.Fprintf(w, "\n|---|---|---|---|---|---|%s\n", strings.Repeat("---|", len(classes)))
}

func writeScoreRow(w io.Writer, first string, s Score) {
	fmt.Fprintf(w, "| %s | %d | %s | %s | %s | %s |", first, s.Series, pct(s.Accuracy), pct(s.UndeterminedRate), pct(s.DeterminedAccuracy), pct(s.ChaosNoise))
	for _, r := range s.Recall {
		fmt.Fprintf(w, " %s |", pct(r))
	}
	fmt.Fprintln(w)
}

func writeClassification(w io.Writer, c *ClassificationResult) {
	o := c.Overall
	fmt.Fprintf(w, "\n## 2. Classification\n\n")
	fmt.Fprintf(w, "Fresh series (plan seed %d; the reference model is trained with plan seed 1): %s.\n\n", c.PlanSeed, c.Design)
	fmt.Fprintf(w, "Over all %d series: accuracy **%s** (most probable class), undetermined **%s**, accuracy when determined %s, "+
		"chaotic-versus-stochastic accuracy **%s** (of %d series whose true class is chaotic or stochastic, the fraction not mistaken for the other of the two).\n\n",
		o.Series, pct(o.Accuracy), pct(o.UndeterminedRate), pct(o.DeterminedAccuracy), pct(o.ChaosNoise), o.ChaosNoiseSeries)

	fmt.Fprintf(w, "Accuracy (undetermined rate) by length and SNR:\n\n| length |")
	for _, l := range c.SNRLabels {
		fmt.Fprintf(w, " %s |", l)
	}
	fmt.Fprintf(w, " all |\n|---|%s---|\n", strings.Repeat("---|", len(c.SNRLabels)))
	for li, l := range c.Lengths {
		fmt.Fprintf(w, "| %d |", l)
		for si := range c.SNRs {
			s := c.Cells[li*len(c.SNRs)+si].Score
			fmt.Fprintf(w, " %s (%s) |", pct(s.Accuracy), pct(s.UndeterminedRate))
		}
		fmt.Fprintf(w, " %s (%s) |\n", pct(c.ByLength[li].Accuracy), pct(c.ByLength[li].UndeterminedRate))
	}
	fmt.Fprintf(w, "| all |")
	for _, s := range c.BySNR {
		fmt.Fprintf(w, " %s (%s) |", pct(s.Accuracy), pct(s.UndeterminedRate))
	}
	fmt.Fprintf(w, " %s (%s) |\n", pct(o.Accuracy), pct(o.UndeterminedRate))

	fmt.Fprintf(w, "\nBy length (all SNRs):\n\n")
	writeScoreHeader(w, "length", c.Classes)
	for li, l := range c.Lengths {
		writeScoreRow(w, strconv.Itoa(l), c.ByLength[li])
	}
	fmt.Fprintf(w, "\nBy SNR (all lengths):\n\n")
	writeScoreHeader(w, "SNR", c.Classes)
	for si, l := range c.SNRLabels {
		writeScoreRow(w, l, c.BySNR[si])
	}

	fmt.Fprintf(w, "\nConfusion matrix over all series (rows: true class; columns: most probable class; last column: how many of the row were flagged undetermined):\n\n| true \\ predicted |")
	for _, cl := range c.Classes {
		fmt.Fprintf(w, " %s |", cl)
	}
	fmt.Fprintf(w, " undetermined |\n|---|%s---|\n", strings.Repeat("---|", len(c.Classes)))
	for i, cl := range c.Classes {
		fmt.Fprintf(w, "| %s |", cl)
		for j := range c.Classes {
			fmt.Fprintf(w, " %d |", o.Confusion[i][j])
		}
		fmt.Fprintf(w, " %d |\n", o.UndeterminedByClass[i])
	}
	fmt.Fprintf(w, "| precision |")
	for _, p := range o.Precision {
		fmt.Fprintf(w, " %s |", pct(p))
	}
	fmt.Fprintf(w, " |\n")

	fmt.Fprintf(w, "\nPer system (all lengths and SNRs; predicted counts are of the most probable class):\n\n| system | true class | series | accuracy | undetermined |")
	for _, cl := range c.Classes {
		fmt.Fprintf(w, " → %s |", cl)
	}
	for _, l := range c.Lengths {
		fmt.Fprintf(w, " n=%d |", l)
	}
	for _, l := range c.SNRLabels {
		fmt.Fprintf(w, " %s |", l)
	}
	fmt.Fprintf(w, "\n|---|---|---|---|---|%s\n", strings.Repeat("---|", len(c.Classes)+len(c.Lengths)+len(c.SNRs)))
	for _, s := range c.Systems {
		fmt.Fprintf(w, "| %s | %s | %d | %s | %d |", s.System, strings.Join(s.Labels, ", "), s.Series, pct(s.Accuracy), s.Undetermined)
		for _, p := range s.Predicted {
			fmt.Fprintf(w, " %d |", p)
		}
		for _, a := range s.ByLength {
			fmt.Fprintf(w, " %s |", pct(a))
		}
		for _, a := range s.BySNR {
			fmt.Fprintf(w, " %s |", pct(a))
		}
		fmt.Fprintln(w)
	}
	if c.Dropped > 0 {
		fmt.Fprintf(w, "\n%d planned series were dropped (orbit escaped or constant, or a deterministic record with too few cycles), as classifier.BuildReference drops them.\n", c.Dropped)
	}
	if len(c.Failures) > 0 {
		fmt.Fprintf(w, "\n%d series failed:\n\n", len(c.Failures))
		for _, f := range c.Failures {
			fmt.Fprintf(w, "- %s\n", cell(f))
		}
	}
}

func writeDegrees(w io.Writer, d *DegreeResult) {
	fmt.Fprintf(w, "\n## 3. HVG degree distributions\n\n")
	fmt.Fprintf(w, "n = %d. Reference: %s (%s). Chaotic series are expected below ln(3/2), correlated stochastic series above, by more than 4 standard errors.\n\n", d.Length, d.Reference, d.Source)
	fmt.Fprintf(w, "| series | class | mean degree | λ ± SE | k_min | expected vs ln(3/2) = %s | consistent |\n|---|---|---|---|---|---|---|\n", num(float64(d.LambdaIID)))
	for _, s := range d.Series {
		ok := "yes"
		if !s.Consistent {
			ok = "**no**"
		}
		fmt.Fprintf(w, "| %s | %s | %s | %s ± %s | %d | %s | %s |\n", s.Label, s.Class, num(float64(s.MeanDegree)), num(float64(s.Lambda)), num(float64(s.LambdaErr)), s.KMin, s.Expect, ok)
	}
}

func writePlane(w io.Writer, p *PlaneResult) {
	fmt.Fprintf(w, "\n## 4. Complexity–entropy plane\n\n")
	fmt.Fprintf(w, "Order %d, delay 1, n = %d, every reference system at its default parameters (%s). "+
		"The last column places the complexity between the lowest (0) and highest (1) possible at that entropy.\n\n", p.Order, p.Length, p.Source)
	fmt.Fprintf(w, "| system | class | entropy H | complexity C | position between bounds |\n|---|---|---|---|---|\n")
	for _, q := range p.Points {
		pos := math.NaN()
		if span := float64(q.MaxComplexity - q.MinComplexity); span > 1e-12 {
			pos = float64(q.Complexity-q.MinComplexity) / span
		}
		fmt.Fprintf(w, "| %s | %s | %s | %s | %s |\n", q.System, q.Class, num(float64(q.Entropy)), num(float64(q.Complexity)), num(pos))
	}
	for _, f := range p.Failures {
		fmt.Fprintf(w, "\n- not placed: %s\n", cell(f))
	}
}

func writeThroughput(w io.Writer, t *ThroughputResult) {
	fmt.Fprintf(w, "\n## 5. Throughput (machine-dependent)\n\n")
	m := t.Machine
	fmt.Fprintf(w, "Machine: %s/%s, %d CPUs, GOMAXPROCS %d, %s. Input: %s. Method: %s. These figures depend on the machine and its load; the rest of this report does not.\n\n",
		m.GOOS, m.GOARCH, m.CPUs, m.GOMAXPROCS, m.GoVersion, t.Input, t.Method)
	fmt.Fprintf(w, "Samples per second (time per call in brackets):\n\n| operation | call |")
	for _, n := range t.Sizes {
		fmt.Fprintf(w, " n=%d |", n)
	}
	fmt.Fprintf(w, " p (time ~ n^p) |\n|---|---|%s---|\n", strings.Repeat("---|", len(t.Sizes)))
	for _, op := range t.Operations {
		fmt.Fprintf(w, "| %s | %s |", op.Name, cell(op.Call))
		for _, n := range t.Sizes {
			i := slices.IndexFunc(op.Points, func(p TimingPoint) bool { return p.N == n })
			if i < 0 {
				fmt.Fprintf(w, " — |")
				continue
			}
			p := op.Points[i]
			fmt.Fprintf(w, " %s (%s) |", num(float64(p.SamplesPerSecond)), duration(float64(p.Seconds)))
		}
		fmt.Fprintf(w, " %s |\n", num(float64(op.Exponent)))
		for _, f := range op.Failures {
			fmt.Fprintf(w, "\n- %s failed at %s\n", op.Name, cell(f))
		}
	}
}

// duration formats seconds with a unit that keeps three digits.
func duration(s float64) string {
	switch {
	case math.IsNaN(s):
		return "—"
	case s < 1e-3:
		return strconv.FormatFloat(s*1e6, 'f', 0, 64) + " µs"
	case s < 1:
		return strconv.FormatFloat(s*1e3, 'g', 3, 64) + " ms"
	}
	return strconv.FormatFloat(s, 'g', 3, 64) + " s"
}

// writeHoldout writes the leave-one-family-out section: headline, the
// breakdowns and the reliability table.
func writeHoldout(w io.Writer, h *HoldoutResult) {
	v := h.Validation
	o := v.Overall
	fmt.Fprintf(w, "\n## Leave-one-family-out validation\n\n")
	fmt.Fprintf(w, "What to expect on kinds of dynamics the model has never seen: %s.", h.Design)
	if h.Dropped > 0 {
		fmt.Fprintf(w, " %d planned series were dropped (orbit escaped or constant, or a deterministic record with too few cycles).", h.Dropped)
	}
	fmt.Fprintf(w, "\n\nAccuracy **%s** over %d series; chaotic versus stochastic (neither taken for the other) **%s** of %d; %d undetermined (accuracy on the rest %s). Calibration of the top-class probability: Brier score %s, expected calibration error **%s** (%d equal-width bins).\n",
		pct(Float(o.Accuracy)), o.Rows, pct(Float(o.ChaosNoise)), o.ChaosNoiseRows, o.Undetermined, pct(Float(o.DeterminedAccuracy)),
		num(v.Calibration.Brier), num(v.Calibration.ECE), len(v.Calibration.Bins))
	for _, st := range v.Strata {
		fmt.Fprintf(w, "\n| %s | classes | series | accuracy | chaos vs noise | undetermined |\n|---|---|---|---|---|---|\n", st.Name)
		for _, sc := range st.Scores {
			cn := "—"
			if sc.ChaosNoiseRows > 0 {
				cn = pct(Float(sc.ChaosNoise))
			}
			fmt.Fprintf(w, "| %s | %s | %d | %s | %s | %d |\n", cell(sc.Label), strings.Join(sc.Classes, ", "), sc.Rows, pct(Float(sc.Accuracy)), cn, sc.Undetermined)
		}
	}
	fmt.Fprintf(w, "\nReliability (rows whose top probability falls in each bin, their mean top probability and the accuracy it delivered):\n\n| top probability | series | mean probability | accuracy |\n|---|---|---|---|\n")
	for _, b := range v.Calibration.Bins {
		if b.Rows == 0 {
			continue
		}
		fmt.Fprintf(w, "| %s–%s | %d | %s | %s |\n", num(b.Lo), num(b.Hi), b.Rows, num(b.Confidence), pct(Float(b.Accuracy)))
	}
}
