package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/campaign"
	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/groups"
	"github.com/tracesift/tracesift/internal/filelist"
	"github.com/tracesift/tracesift/report"
	"github.com/tracesift/tracesift/trace"
)

func init() { addCommand(newSurveyCmd) }

type surveyOptions struct {
	in         inputOptions
	shard      shardOptions
	resume     bool
	out        string
	match      string
	from       []string
	roles      campaign.Roles
	paramLabel string
	metrics    []string
	methods    []string
	surrogates int
	seed       uint64
	alpha      float64
	adjust     string
	reference  string
	tablesOnly bool
	noFigures  bool
	model      string
	noVerdicts bool
	title      string
	format     string
}

// Output file names of survey.
const (
	surveyTracesCSV   = "traces.csv"
	surveyTracesJSONL = "traces.jsonl"
	surveyTestsCSV    = "tests.csv"
	surveyTestsJSONL  = "tests.jsonl"
	surveySummary     = "summary.md"
	surveyReport      = "report.html"
	surveyHistograms  = "distributions.csv"
	surveyFigures     = "figures"
	surveyJournal     = "traces.journal"
)

func newSurveyCmd(e *env) *cobra.Command {
	var o surveyOptions
	c := &cobra.Command{
		Use:   "survey (CAMPAIGN.csv | --match REGEX DIR... | --from TRACES.csv...) -o DIR",
		Short: "Analyse a measurement campaign: groups × control parameter × surrogates, in one run",
		Long: `Analyse a whole measurement campaign — many devices, in groups such as fresh
and stressed, each measured at several levels of a control parameter such as
the gate bias — in one run.

The campaign is a CSV table with a "file" column and any other columns
(paths relative to the table; a directory stands for every trace below it),
or, with --match, a regular expression whose named groups are read from the
file names below the given directories, e.g.
  (?P<device>D\d+)_(?P<group>fresh|stressed)_Vg(?P<bias_V>[0-9.]+)
The columns "group", "device" and "bias_V" are the group, the device and the
control parameter unless --group-column, --device-column and --param-column
say otherwise. Rows that cannot be used (a missing file, a row with more
fields than columns, an empty group) are reported one line each with their
line number and left out.

For every trace: the classifier's verdict (the embedded model, or --model;
--no-verdicts skips it), the metrics (visibility-graph and increment
features by default), the same metrics on --surrogates surrogates of each --methods
(shuffle: temporal correlations destroyed; gauss: values Gaussianised, rank
order kept; iaaft: linear correlations and values kept), and the degree,
clustering and increment distributions. Surrogates are seeded by --seed and
the trace's name, so results do not depend on the number of cores or on how
the campaign is split.

Tests, each question a multiple-testing family of its own (Holm and
Benjamini–Hochberg both reported):
  - each group against the reference at each level: Kolmogorov–Smirnov,
    Mann–Whitney and, for devices measured in both, Wilcoxon signed-rank;
  - each metric against the parameter per group: Spearman, Theil–Sen slope
    with its interval;
  - original against each surrogate method per group and level: Wilcoxon
    signed-rank of original minus surrogate mean, trace by trace;
  - each trace against its own surrogates (rank test);
  - pooled distributions per level between groups (traces relabelled), and
    the increments against their Gaussianised surrogates.
Families in which no test can reach the adjusted level are named, with the
number of surrogates, pairs or traces that could.

-o DIR receives report.html (one self-contained page: the verdict grid,
each metric against the parameter with its surrogate bands, the pooled
distributions with fitted tails, the tables of tests, the methods; open it
in any browser, nothing is loaded from the network), traces.csv and
traces.jsonl (one row per trace × metric × condition, plus the per-trace
distributions and verdicts), tests.csv and tests.jsonl (one row per test),
distributions.csv (the pooled distributions per group and level, binned on
the distinct values where they are discrete), summary.md, one Markdown page
per level and a PNG per metric (figures/); --format parquet adds
traces.parquet, tests.parquet and distributions.parquet with the same
columns and values as the CSV tables. --tables-only stops after the
per-trace tables: run parts of a campaign on several machines, concatenate
their traces.csv and give them to --from for the statistics and the report,
which are then exactly those of one run.

Every trace's rows are appended to DIR/traces.journal the moment the trace
is measured (a failure as its file, line and reason); --resume skips the
traces the journal holds with the same file checksum, campaign row and
options. With --tables-only, --shard K/N measures the traces whose path
(as the description writes it) hashes to shard K of N (inside a Slurm job array or a Kubernetes
indexed Job the shard comes from the scheduler; see 'tracesift features
--help'); 'tracesift collate DIR0 DIR1 ...' joins the shards' journals into
the traces.csv of one run, naming missing and duplicated traces, for
--from.

` + caution,
		Example: `  tracesift survey testdata/demo/campaign.csv -o survey-out
  tracesift survey --match '(?P<device>D\d+)_(?P<group>fresh|stressed)_Vg(?P<bias_V>[0-9.]+)' testdata/demo -o survey-out
  tracesift survey part1.csv --tables-only -o part1 && tracesift survey part2.csv --tables-only -o part2
  tracesift survey --from part1/traces.csv --from part2/traces.csv -o merged
  tracesift survey testdata/demo/campaign.csv --tables-only --shard 1/4 -o shard1   # shards 0/4 … 3/4
  tracesift collate shard0 shard1 shard2 shard3 -o traces.csv && tracesift survey --from traces.csv -o merged`,
		RunE: func(c *cobra.Command, args []string) error {
			return runSurvey(e, &o, args)
		},
	}
	f := c.Flags()
	o.in.bind(f, features.MinLength)
	f.StringVarP(&o.out, "output", "o", "", "output directory (created if missing)")
	f.StringVar(&o.match, "match", "", "regular expression with named groups read from the file names below the DIR arguments")
	f.StringArrayVar(&o.from, "from", nil, "per-trace table (traces.csv) of an earlier run; repeat to merge runs")
	f.StringVar(&o.roles.Group, "group-column", "", "column (or named group) of the group (default group)")
	f.StringVar(&o.roles.Device, "device-column", "", "column of the device, for paired tests; none to switch pairing off (default device, when present)")
	f.StringVar(&o.roles.Param, "param-column", "", "column of the numeric control parameter; none for a single level (default bias_V, when present)")
	f.StringVar(&o.paramLabel, "param-label", "", "name of the control parameter for people (default: its column)")
	f.StringSliceVar(&o.metrics, "metrics", []string{"graph", "increments"}, "features or feature families to measure (see 'tracesift features --list'), or all")
	f.StringSliceVar(&o.methods, "methods", []string{"shuffle", "gauss", "iaaft"}, "surrogate methods (shuffle, gauss, iaaft, aaft, ft), or none")
	f.IntVar(&o.surrogates, "surrogates", campaign.DefaultSurrogates, "surrogates per trace and method")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the surrogates and randomised estimators")
	f.Float64Var(&o.alpha, "alpha", 0.05, "significance level of the adjusted p-values")
	f.StringVar(&o.adjust, "adjust", "holm", "adjustment that decides significance: holm or bh (both are reported)")
	f.StringVar(&o.reference, "reference", "", "group the others are compared against (default: the first in alphabetical order)")
	f.BoolVar(&o.tablesOnly, "tables-only", false, "write the per-trace tables only (to merge with --from later)")
	f.BoolVar(&o.noFigures, "no-figures", false, "do not draw the PNG figures (report.html is written all the same)")
	f.StringVar(&o.model, "model", "", "classifier model file for the verdicts (default: the embedded model)")
	f.BoolVar(&o.noVerdicts, "no-verdicts", false, "do not classify the traces (no verdict grid)")
	f.StringVar(&o.title, "title", "", "the campaign's name in report.html (default: the campaign description, the --match pattern, or the --from tables)")
	f.StringVar(&o.format, "format", formatCSV, "table format: csv, or parquet to write a .parquet copy beside every CSV table (traces, tests, distributions)")
	o.shard.bind(f)
	f.BoolVar(&o.resume, "resume", false, "skip the traces DIR/"+surveyJournal+" already holds with the same content checksum, campaign row, options and model")
	return c
}

func runSurvey(e *env, o *surveyOptions, args []string) error {
	if o.out == "" {
		return usagef("give the output directory with -o DIR")
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	if !(o.alpha > 0 && o.alpha < 1) {
		return usagef("--alpha %g: want 0 < alpha < 1", o.alpha)
	}
	if err := checkFormat(o.format, formatCSV, formatParquet); err != nil {
		return err
	}
	adjust, err := groups.ParseAdjustment(o.adjust)
	if err != nil || adjust == groups.AdjustNone {
		return usagef("--adjust %q: want holm or bh", o.adjust)
	}
	mo, err := o.measureOptions()
	if err != nil {
		return err
	}
	switch {
	case len(o.from) > 0 && (len(args) > 0 || o.match != ""):
		return usagef("--from takes per-trace tables; give no campaign or --match with it")
	case len(o.from) > 0 && o.tablesOnly:
		return usagef("--tables-only measures traces; --from reads tables already measured")
	case o.match != "" && len(args) == 0:
		return usagef("--match needs the directories to walk")
	case len(o.from) == 0 && o.match == "" && len(args) != 1:
		return usagef("give one campaign description (CSV), or --match REGEX DIR..., or --from TABLE...")
	}
	if err := os.MkdirAll(o.out, 0o755); err != nil {
		return err
	}

	var rows []campaign.Row
	var leftOut, leftOutHTML []string
	var failed error
	source := strings.Join(o.from, ", ")
	if len(o.from) > 0 {
		for _, name := range o.from {
			f, err := os.Open(name)
			if err != nil {
				return err
			}
			r, err := campaign.ReadTableCSV(f, name)
			f.Close()
			if err != nil {
				return err
			}
			rows = append(rows, r...)
		}
	} else {
		plan, err := o.plan(args)
		if err != nil {
			return err
		}
		for _, n := range plan.Notes {
			fmt.Fprintf(e.stderr, "tracesift: note: %s\n", n)
		}
		source = o.match + " in " + strings.Join(args, ", ")
		if o.match == "" {
			source = args[0]
		}
		var model *classifier.Model
		modelSum := ""
		if !o.noVerdicts {
			if model, modelSum, err = loadModelSum(o.model); err != nil {
				return err
			}
		}
		if len(plan.Traces) == 0 {
			for _, p := range plan.Problems {
				fmt.Fprintf(e.stderr, "tracesift: %s\n", p)
			}
			return fmt.Errorf("no usable trace in the campaign (problems above)")
		}
		run, traceOf, err := o.measureRun(e, plan, mo, modelSum)
		if err != nil {
			return err
		}
		if err := run.compute(e, func(e *env, i int) (any, error) {
			t := plan.Traces[traceOf[i]]
			tr, err := readTrace(e, t.Path, &o.in)
			if err != nil {
				return nil, err
			}
			rec, err := campaign.Measure(tr.Values, t, mo)
			if err != nil {
				return nil, fmt.Errorf("%s: %w", t.Path, err)
			}
			if model != nil {
				v, err := classifier.Screen(model, tr.Values, classifier.ScreenOptions{
					Interval: intervalSeconds(tr), Features: features.Options{Seed: o.seed}})
				if err != nil {
					return nil, fmt.Errorf("%s: verdict: %w", t.Path, err)
				}
				rec.Verdict = &campaign.Verdict{Class: v.Class, Classes: v.Classes, Probabilities: v.Probabilities, Model: model.Source}
			}
			var b strings.Builder
			if err := campaign.WriteTableCSV(&b, campaign.Rows(rec, plan.ParamName)); err != nil {
				return nil, err
			}
			return surveyRecord{Rows: b.String()}, nil
		}); err != nil {
			return err
		}
		sink := &surveyRows{}
		batchErr := run.assemble(e, sink)
		rows = sink.rows
		var be *batchError
		if errors.As(batchErr, &be) {
			for _, f := range be.failures {
				leftOut = append(leftOut, "`"+f.Reason+"`")
				leftOutHTML = append(leftOutHTML, f.Reason)
			}
		} else if batchErr != nil {
			return batchErr
		}
		if len(rows) == 0 && len(run.inputs) > 0 {
			return fmt.Errorf("no trace could be measured (errors above)")
		}
		failed = batchErr
	}
	if o.title != "" {
		source = o.title
	}
	campaign.SortRows(rows)
	for _, out := range parquetTwins(o.format == formatParquet, []tableOutput{
		{surveyTracesCSV, func(w io.Writer) error { return campaign.WriteTableCSV(w, rows) }},
		{surveyTracesJSONL, func(w io.Writer) error { return campaign.WriteTableJSONL(w, rows) }},
	}) {
		if err := writeOutput(e, filepath.Join(o.out, out.name), out.fill); err != nil {
			return err
		}
	}
	if o.tablesOnly {
		fmt.Fprintf(e.stdout, "measured %d rows; wrote %s and %s in %s\n", len(rows), surveyTracesCSV, surveyTracesJSONL, o.out)
		return failed
	}

	rep, err := campaign.Analyze(rows, campaign.AnalyzeOptions{Alpha: o.alpha, Adjust: adjust, Reference: o.reference})
	if err != nil {
		return err
	}
	md := campaign.MarkdownOptions{ParamLabel: o.paramLabel, Caution: caution, LeftOut: leftOut}
	var figures []string
	if !o.noFigures {
		if err := os.MkdirAll(filepath.Join(o.out, surveyFigures), 0o755); err != nil {
			return err
		}
		for _, m := range rep.Metrics {
			name := filepath.ToSlash(filepath.Join(surveyFigures, m+".png"))
			err := writeOutput(e, filepath.Join(o.out, name), func(w io.Writer) error {
				return campaign.PlotMetric(w, rep, m, o.paramLabel)
			})
			if errors.Is(err, campaign.ErrNothingToPlot) {
				continue
			}
			if err != nil {
				return err
			}
			figures = append(figures, name)
		}
	}
	md.Figures = figures
	outs := []struct {
		name string
		fill func(io.Writer) error
	}{
		{surveyTestsCSV, func(w io.Writer) error { return campaign.WriteTestsCSV(w, rep) }},
		{surveyTestsJSONL, func(w io.Writer) error { return campaign.WriteTestsJSONL(w, rep) }},
		{surveyHistograms, func(w io.Writer) error { return campaign.WriteHistogramsCSV(w, rep) }},
		{surveySummary, func(w io.Writer) error { return campaign.WriteSummary(w, rep, md) }},
		{surveyReport, func(w io.Writer) error {
			return report.WriteCampaign(w, rep, report.CampaignOptions{Source: source, ParamLabel: o.paramLabel, LeftOut: leftOutHTML})
		}},
	}
	for li, lv := range rep.Levels {
		outs = append(outs, struct {
			name string
			fill func(io.Writer) error
		}{campaign.LevelFile(lv.Level), func(w io.Writer) error { return campaign.WriteLevel(w, rep, li, md) }})
	}
	for _, out := range parquetTwins(o.format == formatParquet, outs) {
		if err := writeOutput(e, filepath.Join(o.out, out.name), out.fill); err != nil {
			return err
		}
	}
	for _, w := range rep.Warnings {
		fmt.Fprintf(e.stderr, "tracesift: warning: %s\n", w)
	}
	sig := 0
	for _, f := range rep.Families {
		if !strings.HasPrefix(f.Name, campaign.QuestionTrace+"/") {
			sig += f.Significant
		}
	}
	perTrace := ""
	if len(rep.Methods) > 0 {
		perTrace = fmt.Sprintf(" (per-trace tests in %s)", surveyTestsCSV)
	}
	fmt.Fprintf(e.stdout, "surveyed %d traces in %d groups at %d %s; %d campaign-level %s significant%s; wrote %s and %s\n",
		rep.Traces, len(rep.Groups), len(rep.Levels), plural(len(rep.Levels), "level"), sig, plural(sig, "test"), perTrace,
		filepath.Join(o.out, surveyReport), filepath.Join(o.out, surveySummary))
	return failed
}

// measureOptions checks the metric and method flags.
func (o *surveyOptions) measureOptions() (campaign.MeasureOptions, error) {
	metrics, err := campaign.ResolveMetrics(o.metrics)
	if err != nil {
		return campaign.MeasureOptions{}, usagef("--metrics: %v", err)
	}
	mo := campaign.MeasureOptions{Metrics: metrics, Surrogates: o.surrogates, Seed: o.seed}
	if len(o.methods) == 1 && o.methods[0] == "none" {
		mo.NoSurrogates = true
		return mo, nil
	}
	if o.surrogates < 1 {
		return mo, usagef("--surrogates %d: want at least 1 (or --methods none)", o.surrogates)
	}
	seen := map[surrogate.Method]bool{}
	for _, s := range o.methods {
		m, err := surrogate.ParseMethod(s)
		if err != nil || s == "" {
			return mo, usagef("--methods %q: want shuffle, gauss, iaaft, aaft, ft or none", s)
		}
		if !seen[m] {
			seen[m] = true
			mo.Methods = append(mo.Methods, m)
		}
	}
	return mo, nil
}

// plan reads the campaign description or walks the directories.
func (o *surveyOptions) plan(args []string) (campaign.Plan, error) {
	if o.match != "" {
		re, err := regexp.Compile(o.match)
		if err != nil {
			return campaign.Plan{}, usagef("--match %q: %v", o.match, err)
		}
		plan, err := campaign.FromPattern(args, re, o.roles)
		if errors.Is(err, campaign.ErrUnknownColumn) {
			return plan, usageError{err}
		}
		return plan, err
	}
	f, err := os.Open(args[0])
	if err != nil {
		return campaign.Plan{}, err
	}
	defer f.Close()
	plan, err := campaign.ReadCSV(f, args[0], filepath.Dir(args[0]), o.roles)
	if errors.Is(err, campaign.ErrUnknownColumn) {
		return plan, usageError{err}
	}
	return plan, err
}

// surveyRecord is one trace's rows of the per-trace table as the journal
// keeps them: the CSV that WriteTableCSV writes (full precision, read back
// exactly by ReadTableCSV).
type surveyRecord struct {
	Rows string `json:"rows_csv"`
}

// surveyRows collects the rows of survey records.
type surveyRows struct {
	rows []campaign.Row
}

func (s *surveyRows) item(name string, raw json.RawMessage) error {
	var r surveyRecord
	if err := json.Unmarshal(raw, &r); err != nil {
		return fmt.Errorf("%s: damaged record: %w", name, err)
	}
	rows, err := campaign.ReadTableCSV(strings.NewReader(r.Rows), name)
	if err != nil {
		return err
	}
	s.rows = append(s.rows, rows...)
	return nil
}

func (s *surveyRows) finish() error { return nil }

// surveyTableSink writes collected survey rows as the per-trace table
// (collate): sorted as one run sorts them, CSV or JSON Lines.
type surveyTableSink struct {
	surveyRows
	w      io.Writer
	format string
}

func (s *surveyTableSink) finish() error {
	campaign.SortRows(s.rows)
	if s.format == formatJSON {
		return campaign.WriteTableJSONL(s.w, s.rows)
	}
	return campaign.WriteTableCSV(s.w, s.rows)
}

// measureRun sets up the journalled measurement (and verdicts, keyed by
// the model's checksum modelSum) of a campaign's traces:
// one input per trace (named by its ID, described by its campaign row) and
// one per unusable row (a failure known in advance), the shard's part of
// them, with the journal in the output directory. traceOf maps an input
// to its trace in plan.Traces.
func (o *surveyOptions) measureRun(e *env, plan campaign.Plan, mo campaign.MeasureOptions, modelSum string) (*batchRun, []int, error) {
	sh, err := o.shard.resolve(e)
	if err != nil {
		return nil, nil, err
	}
	if sh.on() && !o.tablesOnly {
		return nil, nil, usagef("shard %s (%s): a shard measures part of the campaign, so add --tables-only, then collate the shards' %s and run the statistics with --from", sh, sh.from, surveyJournal)
	}
	type input struct {
		in batchInput
		t  int
	}
	var all []input
	for i, t := range plan.Traces {
		desc, _ := json.Marshal([]string{t.ID, t.Group, t.Device, t.Level, plan.ParamName})
		all = append(all, input{batchInput{name: t.ID, path: t.Path, desc: digest(string(desc))}, i})
	}
	for _, p := range plan.Problems {
		name := p.Source + ": " + p.File
		if p.Line > 0 {
			name = fmt.Sprintf("%s:%d", p.Source, p.Line)
		}
		all = append(all, input{batchInput{name: name, err: errors.New(p.String()), line: p.Line}, -1})
	}
	slices.SortStableFunc(all, func(a, b input) int { return strings.Compare(a.in.name, b.in.name) })
	run := &batchRun{command: "survey", shard: sh, journal: filepath.Join(o.out, surveyJournal), resume: o.resume}
	var traceOf []int
	for _, a := range all {
		if !sh.on() || filelist.Shard(a.in.name, sh.N) == sh.K {
			run.inputs = append(run.inputs, a.in)
			traceOf = append(traceOf, a.t)
		}
	}
	run.announce(e, len(all))
	methods := make([]string, len(mo.Methods))
	for i, m := range mo.Methods {
		methods[i] = string(m)
	}
	options := struct {
		Input        trace.Options `json:"input"`
		Metrics      []string      `json:"metrics"`
		Methods      []string      `json:"methods"`
		NoSurrogates bool          `json:"no_surrogates"`
		Surrogates   int           `json:"surrogates"`
		Seed         uint64        `json:"seed"`
		Model        string        `json:"model_sha256"` // "" with --no-verdicts
		Schema       string        `json:"schema"`
	}{o.in.traceOptions(), mo.Metrics, methods, mo.NoSurrogates, mo.Surrogates, mo.Seed, modelSum, features.SchemaHash()}
	run.key, run.options, run.render = batchKey("survey", options), options, surveyRender{Format: formatCSV}
	return run, traceOf, nil
}

// surveyRender is the output of a collated survey journal: the per-trace
// table.
type surveyRender struct {
	Format string `json:"format"`
}

func (sr *surveyRender) formats() []string  { return []string{formatCSV, formatJSON} }
func (sr *surveyRender) setFormat(f string) { sr.Format = f }
func (sr *surveyRender) sink(w io.Writer) rawSink {
	return &surveyTableSink{w: w, format: sr.Format}
}
