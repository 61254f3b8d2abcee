package groups

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"sort"
	"strings"
)

// WriteMarkdown writes a readable summary of r: the groups, the settings
// in one sentence, per pair a table of the features sorted by the
// adjusted p-value of Settings.Test (untested features last) with medians,
// IQRs, effect sizes and both tests, per feature a table of the median
// [Q1, Q3] at each parameter level and group with the Spearman
// correlations, the pooled distributions, and the notes. Numbers are
// rounded for reading (4 significant digits, p-values to 2); the CSV and
// JSON outputs carry full precision.
func WriteMarkdown(w io.Writer, r Result) error {
	bw := bufio.NewWriter(w)
	p := func(format string, args ...any) { fmt.Fprintf(bw, format, args...) }
	s := r.Settings

	p("# Group comparison\n\n")
	p("| group | traces | with parameter | parameter levels |\n|---|---:|---:|---|\n")
	for _, g := range r.Groups {
		p("| %s | %d | %d | %s |\n", cell(g.Name), g.Traces, g.WithParam, levelList(g.Levels))
	}
	p("\n")
	testName := "Mann–Whitney"
	if s.Test == TestKS {
		testName = "Kolmogorov–Smirnov"
	}
	adj := map[Adjustment]string{AdjustHolm: "Holm (family-wise error rate)", AdjustBH: "Benjamini–Hochberg (false discovery rate)", AdjustNone: "no adjustment"}[s.Adjust]
	family := "across the features of each pair"
	if s.Family == FamilyAll {
		family = "across all pairs and features together"
	}
	p("Two-sided Mann–Whitney U and Kolmogorov–Smirnov tests on the finite values of each feature; p-values adjusted with %s %s; "+
		"a feature is marked ✱ when its adjusted %s p ≤ %g. Groups with fewer than %d values are not tested. "+
		"Differences are B − A: Δmed/MAD is the median difference over the pooled MAD, HL the Hodges–Lehmann shift, "+
		"δ Cliff's delta (magnitude after Romano et al. 2006).\n\n",
		adj, family, testName, s.Alpha, s.MinSamples)

	for _, pr := range r.Pairs {
		tested := 0
		for _, t := range pr.Tests {
			if t.Tested {
				tested++
			}
		}
		p("## %s (B) vs %s (A)\n\n", cell(pr.B), cell(pr.A))
		p("%d of %d tested features differ significantly.\n\n", pr.Significant, tested)
		p("| feature | n A | n B | median A [IQR] | median B [IQR] | Δmed/MAD | HL | δ | KS p | KS p adj | MW p | MW p adj | |\n")
		p("|---|---:|---:|---|---|---:|---:|---|---:|---:|---:|---:|---|\n")
		var notes []string
		for _, t := range sortedTests(pr.Tests, s.Test) {
			mark := ""
			if t.Significant {
				mark = "✱"
			}
			delta := "—"
			if !math.IsNaN(t.CliffDelta) {
				delta = fmt.Sprintf("%+.3f %s", t.CliffDelta, t.Magnitude)
			}
			p("| %s | %d | %d | %s | %s | %s | %s | %s | %s | %s | %s | %s | %s |\n",
				cell(t.Feature), t.A.N, t.B.N, medIQR(t.A), medIQR(t.B), round(t.MedianDiffMAD), round(t.HodgesLehmann), delta,
				pval(t.KS.P), pval(t.KSAdj), pval(t.MW.P), pval(t.MWAdj), mark)
			if t.Note != "" {
				notes = append(notes, fmt.Sprintf("- %s: %s", t.Feature, t.Note))
			}
		}
		p("\n")
		if len(notes) > 0 {
			p("%s\n\n", strings.Join(notes, "\n"))
		}
	}

	if r.HasParam && len(r.Curves) > 0 {
		p("## Features versus the parameter\n\n")
		p("Median [Q1, Q3] (n) per parameter level; last row: Spearman ρ of the feature with the parameter over the group's traces, with its p-value adjusted across features (%s).\n\n", s.Adjust)
		ng := len(r.Groups)
		for f, name := range r.Features {
			curves := r.Curves[f*ng : (f+1)*ng]
			p("### %s\n\n| parameter |", cell(name))
			for _, c := range curves {
				p(" %s |", cell(c.Group))
			}
			p("\n|---:|")
			for range curves {
				p("---|")
			}
			p("\n")
			for _, lv := range allLevels(curves) {
				p("| %s |", round(lv))
				for _, c := range curves {
					cellText := ""
					for _, l := range c.Levels {
						if l.Param == lv {
							cellText = fmt.Sprintf("%s [%s, %s] (%d)", round(l.Median), round(l.Q1), round(l.Q3), l.N)
						}
					}
					p(" %s |", cellText)
				}
				p("\n")
			}
			p("| Spearman ρ (p adj) |")
			for _, c := range curves {
				if math.IsNaN(c.Spearman.Rho) {
					p(" — |")
				} else {
					p(" %+.3f (%s) |", c.Spearman.Rho, pval(c.PAdj))
				}
			}
			p("\n\n")
		}
	}

	if len(r.Distributions) > 0 {
		p("## Pooled distributions\n\nEach group's per-trace distributions pooled with equal weight per trace.\n\n")
		p("| distribution | group | traces | values | median | Q1 | Q3 | mean |\n|---|---|---:|---:|---:|---:|---:|---:|\n")
		for _, d := range r.Distributions {
			p("| %s | %s | %d | %d | %s | %s | %s | %s |\n", cell(d.Name), cell(d.Group), d.Traces, d.Values,
				round(d.Median), round(d.Q1), round(d.Q3), round(d.Mean))
		}
		p("\n")
	}

	if len(r.Notes) > 0 {
		p("## Notes\n\n")
		for _, n := range r.Notes {
			p("- %s\n", n)
		}
		p("\n")
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("markdown: %w", err)
	}
	return nil
}

// sortedTests returns the tests ordered by the adjusted p of test
// (ascending, untested last, ties in list order).
func sortedTests(tests []FeatureTest, test Test) []FeatureTest {
	out := append([]FeatureTest(nil), tests...)
	key := func(t FeatureTest) float64 {
		p := t.MWAdj
		if test == TestKS {
			p = t.KSAdj
		}
		if !t.Tested || math.IsNaN(p) {
			return math.Inf(1)
		}
		return p
	}
	sort.SliceStable(out, func(i, j int) bool { return key(out[i]) < key(out[j]) })
	return out
}

func allLevels(curves []Curve) []float64 {
	m := map[float64]bool{}
	for _, c := range curves {
		for _, l := range c.Levels {
			m[l.Param] = true
		}
	}
	return sortedKeys(m)
}

func levelList(levels []float64) string {
	if len(levels) == 0 {
		return "—"
	}
	parts := make([]string, len(levels))
	for i, l := range levels {
		parts[i] = round(l)
	}
	if len(parts) > 12 {
		parts = append(parts[:5], "…", parts[len(parts)-1])
	}
	return strings.Join(parts, ", ")
}

func medIQR(s Summary) string {
	if s.N == 0 {
		return "—"
	}
	return fmt.Sprintf("%s [%s]", round(s.Median), round(s.IQR))
}

// round formats v with 4 significant digits for reading; NaN is "—".
func round(v float64) string {
	if math.IsNaN(v) {
		return "—"
	}
	if math.IsInf(v, 0) {
		return fmt.Sprint(v)
	}
	return fmt.Sprintf("%.4g", v)
}

// pval formats a p-value for reading: 3 decimals above 0.001, two
// significant digits in e-notation below; NaN is "—".
func pval(p float64) string {
	switch {
	case math.IsNaN(p):
		return "—"
	case p >= 0.001:
		return fmt.Sprintf("%.3f", p)
	case p == 0:
		return "0"
	}
	return fmt.Sprintf("%.1e", p)
}

// cell escapes the characters that would break a Markdown table cell.
func cell(s string) string {
	s = strings.ReplaceAll(s, "|", `\|`)
	return strings.ReplaceAll(s, "\n", " ")
}
