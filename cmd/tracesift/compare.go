package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/groups"
	"github.com/tracesift/tracesift/internal/atomicfile"
	"github.com/tracesift/tracesift/internal/filelist"
	"github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
)

func init() { addCommand(newCompareCmd) }

type compareOptions struct {
	in         inputOptions
	include    []string
	groups     []string
	param      string
	paramLabel string
	out        string
	adjust     string
	alpha      float64
	all        bool
	seed       uint64
	format     string
}

func newCompareCmd(e *env) *cobra.Command {
	var o compareOptions
	c := &cobra.Command{
		Use:   "compare --group NAME=PATH... [--param REGEX] [-o DIR]",
		Short: "Compare groups of traces feature by feature (e.g. fresh versus stressed devices)",
		Long: `Compare groups of traces, such as fresh and stressed devices, feature by
feature. A group is NAME=PATH where PATH is a directory (every file below
it, recursively, except hidden and Markdown files, or those matching
--include), a glob pattern, a file, or @LIST (a file listing paths, one per
line); --group may be repeated. For every pair of groups
and every feature: group medians and interquartile ranges, the two-sample
Kolmogorov–Smirnov and Mann–Whitney p-values adjusted for the number of
features (Holm by default, or Benjamini–Hochberg), and effect sizes
(Cliff's delta, Hodges–Lehmann shift, median difference in pooled MADs).

--param takes a regular expression whose first capture group (or whole
match) in each file name is a control parameter, e.g. the gate bias in
"D03_stressed_Vg0.90.csv" with --param 'Vg([0-9.]+)'; each feature is then
also summarised per parameter level and group and plotted against it.

Without -o a Markdown summary goes to stdout. With -o DIR the directory gets
summary.md, comparison.csv, curves.csv, comparison.json and PNG plots: the
effect sizes, each core feature against the parameter, and the pooled
distributions of per-node HVG clustering coefficients and NVG degrees.
--format parquet adds comparison.parquet (and curves.parquet) with the same
columns and values as the CSV tables.`,
		Example: `  tracesift compare --group fresh=testdata/demo/fresh --group stressed=testdata/demo/stressed
  tracesift compare --group fresh=testdata/demo/fresh --group stressed=testdata/demo/stressed \
      --param 'Vg([0-9.]+)' --param-label 'gate bias V_G (V)' -o compare-out
  tracesift compare --group A='runs/a/*.csv' --group B='runs/b/*.csv' --adjust bh --all
  tracesift compare --group fresh=@fresh.txt --group stressed=archive/stressed --include '*.csv.gz'`,
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, _ []string) error {
			return runCompare(e, &o)
		},
	}
	f := c.Flags()
	o.in.bind(f, features.MinLength)
	f.StringArrayVar(&o.groups, "group", nil, "group as NAME=PATH (directory, glob, file or @LIST); repeat for each group")
	f.StringArrayVar(&o.include, "include", nil, "in directories, take only files whose name matches this glob (e.g. '*.csv'); repeatable")
	f.StringVar(&o.param, "param", "", "regular expression extracting a control parameter from each file name (first capture group)")
	f.StringVar(&o.paramLabel, "param-label", "", "axis label of the control parameter in plots (default: parameter)")
	f.StringVarP(&o.out, "output", "o", "", "directory for the full output (Markdown, CSV, JSON, PNG); created if missing")
	f.StringVar(&o.adjust, "adjust", "holm", "multiple-testing adjustment across features: holm or bh (Benjamini–Hochberg)")
	f.Float64Var(&o.alpha, "alpha", 0.05, "significance level for the adjusted p-values")
	f.BoolVar(&o.all, "all", false, "compare every feature, not only the core ones")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the randomised estimators")
	f.StringVar(&o.format, "format", formatCSV, "table format: csv, or parquet to write comparison.parquet (and curves.parquet) beside the CSV tables")
	return c
}

// groupFiles resolves NAME=PATH specs into (group, file) pairs, each
// group's files sorted and each file once. PATH is a directory (walked
// recursively, filtered by the include globs), a file, a glob pattern, or
// @LIST, a file listing paths one per line.
func groupFiles(specs, include []string) (names []string, files [][]string, err error) {
	if err := filelist.CheckPatterns(include); err != nil {
		return nil, nil, usageError{fmt.Errorf("--include: %w", err)}
	}
	seen := map[string]bool{}
	for _, s := range specs {
		name, path, ok := strings.Cut(s, "=")
		name = strings.TrimSpace(name)
		if !ok || name == "" || path == "" {
			return nil, nil, usagef("--group %q: want NAME=PATH", s)
		}
		if seen[name] {
			return nil, nil, usagef("--group %q: group %s given twice", s, name)
		}
		seen[name] = true
		c := filelist.Collector{Include: include}
		if list, isList := strings.CutPrefix(path, "@"); isList {
			f, err := os.Open(list)
			if err != nil {
				return nil, nil, fmt.Errorf("group %s: %w", name, err)
			}
			err = c.AddList(f, list)
			f.Close()
			if err != nil {
				return nil, nil, fmt.Errorf("group %s: %w", name, err)
			}
		} else if _, err := os.Stat(path); err == nil {
			c.Add(path, "")
		} else {
			matches, err := filepath.Glob(path)
			if err != nil {
				return nil, nil, usagef("--group %q: bad pattern: %v", s, err)
			}
			for _, m := range matches {
				c.Add(m, "")
			}
		}
		var list []string
		for _, en := range c.Entries() {
			list = append(list, en.Name)
		}
		if len(list) == 0 {
			switch st, err := os.Stat(path); {
			case strings.HasPrefix(path, "@"):
				return nil, nil, fmt.Errorf("group %s: list %s names no file", name, path[1:])
			case err == nil && st.IsDir():
				return nil, nil, fmt.Errorf("group %s: directory %s holds no trace files", name, path)
			case !strings.ContainsAny(path, "*?["):
				return nil, nil, fmt.Errorf("group %s: %s: no such file or directory", name, path)
			}
			return nil, nil, fmt.Errorf("group %s: no files match %s", name, path)
		}
		names = append(names, name)
		files = append(files, list)
	}
	if len(names) < 2 {
		return nil, nil, usagef("give at least two groups (--group NAME=PATH, repeated)")
	}
	return names, files, nil
}

// compareTrace is what compare measures of each trace.
type compareTrace struct {
	vec        features.Vector
	clustering []float64 // HVG local clustering per node
	degrees    []float64 // NVG degree per node
}

func runCompare(e *env, o *compareOptions) error {
	if err := o.in.validate(); err != nil {
		return err
	}
	if err := checkFormat(o.format, formatCSV, formatParquet); err != nil {
		return err
	}
	adjust, err := groups.ParseAdjustment(o.adjust)
	if err != nil {
		return usageError{err}
	}
	if !(o.alpha > 0 && o.alpha < 1) {
		return usagef("--alpha %g: want 0 < alpha < 1", o.alpha)
	}
	var re *regexp.Regexp
	if o.param != "" {
		if re, err = regexp.Compile(o.param); err != nil {
			return usagef("--param %q: %v", o.param, err)
		}
	}
	names, files, err := groupFiles(o.groups, o.include)
	if err != nil {
		return err
	}
	var all []string
	var groupOf []string
	for g, list := range files {
		for _, f := range list {
			all = append(all, f)
			groupOf = append(groupOf, names[g])
		}
	}
	featNames := coreFeatures
	if o.all {
		featNames = features.Names()
	}
	var samples []groups.Sample
	batchErr := batch(e, "traces", all,
		func(_ int, name string) (compareTrace, error) {
			tr, err := readTrace(e, name, &o.in)
			if err != nil {
				return compareTrace{}, err
			}
			v, err := features.Extract(tr.Values, features.Options{Seed: o.seed})
			if err != nil {
				return compareTrace{}, fmt.Errorf("%s: %w", name, err)
			}
			ct := compareTrace{vec: v}
			if z, err := features.Standardise(tr.Values); err == nil {
				if g, err := visibility.Horizontal(z, visibility.Options{}); err == nil {
					ct.clustering = networks.LocalClustering(g)
				}
				if g, err := visibility.Natural(z, visibility.Options{}); err == nil {
					ct.degrees = make([]float64, g.Len())
					for i := range ct.degrees {
						ct.degrees[i] = float64(g.Degree(i))
					}
				}
			}
			return ct, nil
		},
		func(i int, name string, ct compareTrace) error {
			s := groups.Sample{File: name, Group: groupOf[i], Param: math.NaN()}
			if re != nil {
				s.Param = parseParam(re, filepath.Base(name))
			}
			for _, f := range featNames {
				v, _ := ct.vec.Get(f)
				s.Values = append(s.Values, v)
			}
			if ct.clustering != nil {
				s.AddDistribution("hvg_local_clustering", ct.clustering)
			}
			if ct.degrees != nil {
				s.AddDistribution("nvg_degree", ct.degrees)
			}
			samples = append(samples, s)
			return nil
		})
	if len(samples) == 0 {
		return fmt.Errorf("no trace could be measured (errors above)")
	}
	var failed *batchError
	errors.As(batchErr, &failed)
	if err := checkGroupsMeasured(names, files, samples); err != nil {
		return err
	}
	res, err := groups.Compare(featNames, samples, groups.Options{Alpha: o.alpha, Adjust: adjust, Groups: names})
	if err != nil {
		return err
	}
	if o.out == "" {
		if err := groups.WriteMarkdown(e.stdout, res); err != nil {
			return err
		}
		if err := writeExcluded(e.stdout, failed); err != nil {
			return err
		}
		fmt.Fprintf(e.stdout, "\n%s\n", caution)
		return batchErr
	}
	if err := writeCompareDir(o, res, failed); err != nil {
		return err
	}
	fmt.Fprintf(e.stdout, "compared %d traces in %d groups; wrote %s\n", len(samples), len(names), o.out)
	if failed != nil {
		fmt.Fprintf(e.stdout, "  %d files could not be measured and were left out (listed in summary.md)\n", len(failed.failures))
	}
	for _, p := range res.Pairs {
		var sig []string
		for _, t := range p.Tests {
			if t.Significant {
				sig = append(sig, t.Feature)
			}
		}
		if len(sig) == 0 {
			fmt.Fprintf(e.stdout, "  %s vs %s: no feature differs at α = %s after %s adjustment\n", p.A, p.B, human(o.alpha), adjust)
		} else {
			fmt.Fprintf(e.stdout, "  %s vs %s: %d features differ at α = %s after %s adjustment: %s\n", p.A, p.B, len(sig), human(o.alpha), adjust, strings.Join(sig, ", "))
		}
	}
	return batchErr
}

// parseParam extracts the control parameter from a file name: the first
// capture group of re, or its whole match; NaN when it does not match.
func parseParam(re *regexp.Regexp, name string) float64 {
	m := re.FindStringSubmatch(name)
	if m == nil {
		return math.NaN()
	}
	s := m[0]
	if len(m) > 1 {
		s = m[1]
	}
	s = strings.TrimRight(strings.ReplaceAll(s, ",", "."), ".")
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return math.NaN()
	}
	return v
}

func writeCompareDir(o *compareOptions, res groups.Result, failed *batchError) error {
	if err := os.MkdirAll(o.out, 0o755); err != nil {
		return err
	}
	label := o.paramLabel
	if label == "" {
		label = "parameter"
	}
	type output = tableOutput
	outs := []output{
		{"summary.md", func(w io.Writer) error {
			if err := groups.WriteMarkdown(w, res); err != nil {
				return err
			}
			if err := writeExcluded(w, failed); err != nil {
				return err
			}
			_, err := fmt.Fprintf(w, "\n> %s\n", caution)
			return err
		}},
		{"comparison.csv", func(w io.Writer) error { return groups.WriteCSV(w, res) }},
		{"comparison.json", func(w io.Writer) error { return groups.WriteJSON(w, res) }},
		{"effects.png", func(w io.Writer) error { return groups.PlotEffects(w, res, groups.PlotOptions{}) }},
		{"hvg_local_clustering.png", func(w io.Writer) error {
			return groups.PlotDistribution(w, res, "hvg_local_clustering", groups.PlotOptions{Kind: groups.KindHistogram, Title: "HVG local clustering coefficients, pooled per group"})
		}},
		{"nvg_degree.png", func(w io.Writer) error {
			return groups.PlotDistribution(w, res, "nvg_degree", groups.PlotOptions{Kind: groups.KindCCDF, Title: "NVG degree distribution (complementary CDF), pooled per group"})
		}},
	}
	if res.HasParam {
		outs = append(outs,
			output{"curves.csv", func(w io.Writer) error { return groups.WriteCurvesCSV(w, res) }},
			output{"curves.png", func(w io.Writer) error {
				return groups.PlotCurveGrid(w, res, plottable(res), groups.PlotOptions{ParamLabel: label})
			}},
		)
	}
	for _, out := range parquetTwins(o.format == formatParquet, outs) {
		if err := atomicfile.Write(filepath.Join(o.out, out.name), out.fill); err != nil {
			return fmt.Errorf("%s: %w", out.name, err)
		}
	}
	return nil
}

// plottable returns the features with at least one finite value: a feature
// missing for every trace (no credible exponent anywhere) has no curve.
func plottable(res groups.Result) []string {
	var out []string
	for j, f := range res.Features {
		for _, s := range res.Samples {
			if !math.IsNaN(s.Values[j]) && !math.IsNaN(s.Param) {
				out = append(out, f)
				break
			}
		}
	}
	return out
}

// checkGroupsMeasured refuses a comparison in which a group lost every
// file, naming the group and how many files it had.
func checkGroupsMeasured(names []string, files [][]string, samples []groups.Sample) error {
	count := map[string]int{}
	for _, s := range samples {
		count[s.Group]++
	}
	for g, name := range names {
		if count[name] == 0 {
			return fmt.Errorf("group %s: none of its %d %s could be measured (errors above)", name, len(files[g]), plural(len(files[g]), "file"))
		}
	}
	return nil
}

// writeExcluded lists, in Markdown, the files a comparison left out and
// why; nothing when none was.
func writeExcluded(w io.Writer, failed *batchError) error {
	if failed == nil {
		return nil
	}
	fmt.Fprintf(w, "\n## Files left out\n\n%d of %d files could not be measured and are not in the tests above:\n\n", len(failed.failures), failed.total)
	for _, f := range failed.failures {
		fmt.Fprintf(w, "- `%s`: %s\n", f.Name, strings.TrimLeft(strings.TrimPrefix(f.Reason, f.Name), ":, "))
	}
	return nil
}
