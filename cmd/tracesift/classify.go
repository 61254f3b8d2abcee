package main

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/internal/jsonsafe"
	"github.com/tracesift/tracesift/trace"
)

func init() { addCommand(newClassifyCmd) }

// caution is printed with every verdict.
const caution = "tracesift's verdict is a screening aid, not a device qualification result; defer to your laboratory's qualification procedures and the applicable reliability standards."

type classifyOptions struct {
	in      inputOptions
	src     sourceOptions
	shard   shardOptions
	jr      journalOptions
	model   string
	format  string
	out     string
	seed    uint64
	drivers int
	// The surrogate test of determinism (--significance).
	significance bool
	surrogates   int
	alpha        float64
}

func newClassifyCmd(e *env) *cobra.Command {
	var o classifyOptions
	c := &cobra.Command{
		Use:   "classify FILE|DIR...",
		Short: "Tell whether each trace is chaotic, stochastic or regular",
		Long: `Classify each trace as chaotic (deterministic, positive largest Lyapunov
exponent), stochastic (noise of any colour or distribution) or regular
(periodic or quasi-periodic), with the class probabilities of the tree
ensemble, the features that drove the decision, and warnings about the
recording (short, clipped, quantised, few cycles, drift, non-stationary,
mains interference when the file has a time column in seconds; see below).

The verdict is "undetermined" when the top probability is below the
model's threshold (0.5) or when the trace lies outside what the model can
place. The second is decided by one multivariate measure, the NOVELTY
column: every feature is mapped to its percentile among the training
series, and the trace's mean percentile distance to its 10 nearest training
series is ranked among the same distances of the training series measured
against the other reference families only (how far a kind of dynamics the
model has never seen typically lies from the rest). A novelty of 0.62 means
the trace is nearer to the training set than 38% of held-out families'
series are; above 0.995 the verdict is undetermined. A feature outside its
training range is noted but does not decide on its own, so a trace with one
unusual feature and an otherwise clear class keeps its class. JSON gives the
measure under "novelty" (distance, percentile, limit, k, and the reference
families nearest to the trace). Traces longer than 16384 samples are
measured in up to 8 evenly spaced windows whose probabilities are averaged.

The embedded default model is used unless --model names another (made with
'tracesift train'). Files are processed in parallel; a bad file is reported
and skipped, and the exit status is 1 if any failed.

Recording warnings, with the rule each uses and its measured detection
limit (the report repeats them):

` + classifier.RecordingWarningHelp(78, "  ") + `

--significance adds, per trace, a test of the model's vote that does not
depend on it: is the structure of the trace significant against IAAFT
surrogates, whose null hypothesis is a static monotone transform of a
stationary linear Gaussian process? The middle 4096 samples of a longer
trace are tested, trimmed to the longest sub-series (at least 90%) whose
ends match, and Gaussianised (each value replaced by the normal quantile of
its rank: the test depends only on the order of the values). Two statistics
are computed on the trace and on M surrogates, with the delay τ and
dimension d chosen once on the trace and used for every surrogate:

  nl_fc_rho_tau  correlation of simplex forecasts one delay ahead with the
                truth (one-sided: the trace is more predictable than its
                surrogates)
  nl_trev_tau      |skewness| of the increments over one delay (one-sided on
                |·|: every surrogate is time-reversible, so either sign
                of asymmetry counts)

Rank p-values p = (1 + #{surrogates ≥ observed})/(M + 1) are adjusted by
Holm's method; the null is rejected when the smallest adjusted p (the
DETERMINISM P column) is at most --alpha. The smallest adjusted p is
2/(M + 1), so the default M is ⌈2/α − 1⌉ = 39 at α = 0.05. The notes say
when the model and the test disagree; for a regular verdict the test is not
informative (periodic signals may reject the null or not). The output is
the same for a seed on any number of cores. At M = 39 the test costs 0.3
(chaotic maps) to 1.1 (noise, which embeds in high dimension) CPU-seconds
per trace.

JSON Lines keys (stable): file, class, top, probabilities, reasons,
drivers, warnings, samples, windows, window_length, caution; with
--significance also significance: {method, null_hypothesis, count, seed,
alpha, min_surrogates, start, length, end_matched, delay, dimension,
horizon, statistics: [{name, side, observed, mean, sd, p, p_holm,
significant, count, failed, error}], p, rejected, agreement: {kind, text},
warnings, error}. agreement.kind is agree, disagree, not informative,
undetermined or inconclusive; error is set (and the rest empty) when the
test could not run on the trace, which does not fail the file.

` + sourceHelp + `

` + journalHelp + ` The model is part of what a record must match
(its SHA-256).

` + shardHelp + `

` + caution,
		Example: `  tracesift classify testdata/demo/*/*
  tracesift classify --format json testdata/demo/stressed/D01_stressed_Vg1.20.csv
  tracesift generate lorenz --n 5000 --snr 20 | tracesift classify -
  tracesift classify --model lab.model --column Id captures/*.csv
  tracesift classify --significance testdata/demo/stressed/*.csv
  tracesift classify --significance --surrogates 99 --seed 7 --format json trace.csv
  tracesift classify --format json --include '*.csv' -o verdicts.jsonl archive/
  tracesift classify --files-from list.txt --resume -o verdicts.txt
  tracesift classify --campaign testdata/demo/campaign.csv --shard 0/2 -o v.0.txt   # tracesift collate v.*.txt.journal`,
		RunE: func(c *cobra.Command, args []string) error {
			for _, name := range []string{"surrogates", "alpha"} {
				if c.Flags().Changed(name) && !o.significance {
					return usagef("--%s applies to the surrogate test: add --significance", name)
				}
			}
			return runClassify(e, args, &o)
		},
	}
	f := c.Flags()
	o.in.bind(f, features.MinLength)
	o.src.bind(f)
	o.shard.bind(f)
	o.jr.bind(f, "OUTPUT.journal with -o OUTPUT, none on stdout")
	f.StringVar(&o.model, "model", "", "model file (default: the embedded default model)")
	f.StringVar(&o.format, "format", formatTable, "output format: table or json (JSON Lines, one object per file)")
	f.StringVarP(&o.out, "output", "o", "-", "output file (- for stdout)")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the randomised estimators and of the surrogates")
	f.IntVar(&o.drivers, "drivers", 3, "number of driving features to report per trace")
	f.BoolVar(&o.significance, "significance", false, "also test each trace for determinism against IAAFT surrogates (see above)")
	f.IntVar(&o.surrogates, "surrogates", 0, "number of surrogates M of --significance (0: the least that can reject at --alpha, 39 at 0.05)")
	f.Float64Var(&o.alpha, "alpha", 0.05, "significance level of --significance")
	return c
}

type classifyResult struct {
	tr trace.Trace
	v  classifier.Verdict
	// sig is the surrogate test (nil without --significance or when it
	// failed: sigErr says why).
	sig    *surrogate.DeterminismResult
	sigErr error
}

func runClassify(e *env, args []string, o *classifyOptions) error {
	if err := checkFormat(o.format, formatTable, formatJSON); err != nil {
		return err
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	if o.drivers < 1 {
		return usagef("--drivers %d: want at least 1", o.drivers)
	}
	if o.surrogates < 0 {
		return usagef("--surrogates %d: want 0 (automatic) or a positive count", o.surrogates)
	}
	if !(o.alpha > 0 && o.alpha < 1) {
		return usagef("--alpha %g: want 0 < alpha < 1", o.alpha)
	}
	m, modelSum, err := loadModelSum(o.model)
	if err != nil {
		return err
	}
	run, err := newTraceRun(e, "classify", args, &o.src, &o.shard, &o.jr, o.out)
	if err != nil {
		return err
	}
	options := struct {
		Input        trace.Options `json:"input"`
		Model        string        `json:"model_sha256"`
		Seed         uint64        `json:"seed"`
		Drivers      int           `json:"drivers"`
		Significance bool          `json:"significance"`
		Surrogates   int           `json:"surrogates"`
		Alpha        float64       `json:"alpha"`
		Schema       string        `json:"schema"`
	}{o.in.traceOptions(), modelSum, o.seed, o.drivers, o.significance, o.surrogates, o.alpha, features.SchemaHash()}
	render := &classifyRender{Format: o.format, Model: m.Source, Classes: m.Classes,
		Significance: o.significance, Surrogates: o.surrogates, Alpha: o.alpha, Seed: o.seed}
	run.key, run.options, run.render = batchKey("classify", options), options, render
	return run.run(e, o.out,
		func(e *env, i int) (any, error) {
			name := run.inputs[i].name
			tr, err := readTrace(e, run.inputs[i].path, &o.in)
			if err != nil {
				return nil, err
			}
			v, err := classifier.Screen(m, tr.Values, classifier.ScreenOptions{
				Interval: intervalSeconds(tr),
				Drivers:  o.drivers,
				Features: features.Options{Seed: o.seed},
			})
			if err != nil {
				return nil, fmt.Errorf("%s: %w", tr.Source, err)
			}
			v.Warnings = append(append([]string{}, tr.Warnings...), v.Warnings...)
			r := classifyResult{tr: tr, v: v}
			if o.significance {
				r.sig, r.sigErr = surrogate.Determinism(tr.Values, surrogate.DeterminismOptions{
					Count: o.surrogates, Seed: o.seed, Alpha: o.alpha})
			}
			return classifyJSON(name, r), nil
		},
		render.sink)
}

// classifyRender are the options of the output table, kept in the journal
// so that collate writes the table the runs would have.
type classifyRender struct {
	Format       string   `json:"format"`
	Model        string   `json:"model"`
	Classes      []string `json:"classes"`
	Significance bool     `json:"significance"`
	Surrogates   int      `json:"surrogates"`
	Alpha        float64  `json:"alpha"`
	Seed         uint64   `json:"seed"`
}

func (cr *classifyRender) formats() []string        { return []string{formatTable, formatJSON} }
func (cr *classifyRender) setFormat(f string)       { cr.Format = f }
func (cr *classifyRender) sink(w io.Writer) rawSink { return newClassifySink(w, *cr) }

// classifySink writes verdicts: JSON Lines as they come, or the table
// (which aligns its columns over every row) at the end. The journal keeps
// each verdict as its JSON line.
type classifySink struct {
	w      *bufio.Writer
	render classifyRender
	rows   []classifyLine
}

func newClassifySink(w io.Writer, cr classifyRender) *classifySink {
	return &classifySink{w: bufio.NewWriter(w), render: cr}
}

func (s *classifySink) item(name string, raw json.RawMessage) error {
	if s.render.Format == formatJSON {
		if _, err := s.w.Write(raw); err != nil {
			return err
		}
		return s.w.WriteByte('\n')
	}
	var l classifyLine
	if err := json.Unmarshal(raw, &l); err != nil {
		return fmt.Errorf("%s: damaged record: %w", name, err)
	}
	s.rows = append(s.rows, l)
	return nil
}

func (s *classifySink) finish() error {
	if s.render.Format == formatTable && len(s.rows) > 0 {
		if err := writeClassifyTable(s.w, s.rows, s.render); err != nil {
			return err
		}
	}
	return s.w.Flush()
}

// intervalSeconds converts the trace's sample interval to seconds when its
// time unit is known (an empty unit is taken as seconds); 0 otherwise.
func intervalSeconds(tr trace.Trace) float64 {
	if tr.Interval <= 0 {
		return 0
	}
	scale := map[string]float64{"": 1, "s": 1, "sec": 1, "ms": 1e-3, "us": 1e-6, "µs": 1e-6, "μs": 1e-6, "ns": 1e-9, "min": 60}
	if f, ok := scale[strings.ToLower(strings.TrimSpace(tr.TimeUnit))]; ok {
		return tr.Interval * f
	}
	return 0
}

type classifyLine struct {
	File          string                    `json:"file"`
	Class         string                    `json:"class"`
	Top           string                    `json:"top"`
	Probabilities map[string]jsonsafe.Float `json:"probabilities"`
	Reasons       []string                  `json:"reasons"`
	Drivers       []driverJSON              `json:"drivers"`
	Warnings      []string                  `json:"warnings"`
	Samples       int                       `json:"samples"`
	Windows       int                       `json:"windows"`
	WindowLength  int                       `json:"window_length"`
	Caution       string                    `json:"caution"`
	// Novelty is the multivariate distance from the training set that
	// decides whether the trace lies outside what the model can place
	// (absent for models without a novelty index).
	Novelty *classifier.Novelty `json:"novelty,omitempty"`
	// Significance is the surrogate test (--significance only).
	Significance *significanceJSON `json:"significance,omitempty"`
}

type driverJSON struct {
	Feature      string         `json:"feature"`
	Value        jsonsafe.Float `json:"value"`
	Contribution jsonsafe.Float `json:"contribution"`
}

func classifyJSON(name string, r classifyResult) classifyLine {
	l := classifyLine{File: name, Class: r.v.Class, Top: r.v.Top, Probabilities: map[string]jsonsafe.Float{},
		Reasons: nonNil(r.v.Reasons), Warnings: nonNil(r.v.Warnings), Samples: len(r.tr.Values),
		Windows: r.v.Windows, WindowLength: r.v.WindowLength, Caution: caution, Drivers: []driverJSON{}}
	for i, c := range r.v.Classes {
		l.Probabilities[c] = jsonsafe.Float(r.v.Probabilities[i])
	}
	for _, d := range r.v.Drivers {
		l.Drivers = append(l.Drivers, driverJSON{d.Feature, jsonsafe.Float(d.Value), jsonsafe.Float(d.Contribution)})
	}
	if nv := r.v.Novelty; nv != nil && !math.IsNaN(nv.Distance) {
		l.Novelty = nv
	}
	if r.sig != nil || r.sigErr != nil {
		l.Significance = newSignificanceJSON(r.sig, r.sigErr, r.v.Class)
	}
	return l
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

func writeClassifyTable(w io.Writer, rows []classifyLine, cr classifyRender) error {
	classes := cr.Classes
	t := newTable(w)
	head := []string{"FILE", "VERDICT"}
	for _, c := range classes {
		head = append(head, "P("+c+")")
	}
	novelty := rows[0].Novelty != nil
	if novelty {
		head = append(head, "NOVELTY")
	}
	if cr.Significance {
		head = append(head, "DETERMINISM P", "SURROGATE TEST")
	}
	head = append(head, "DRIVEN BY")
	t.row(head...)
	for _, l := range rows {
		cells := []string{l.File, l.Class}
		for _, c := range classes {
			cells = append(cells, fmt.Sprintf("%.2f", float64(l.Probabilities[c])))
		}
		if novelty {
			cell := "—"
			if l.Novelty != nil {
				cell = fmt.Sprintf("%.2f", l.Novelty.Percentile)
			}
			cells = append(cells, cell)
		}
		if cr.Significance {
			cells = append(cells, significanceCells(l.Significance)...)
		}
		var ds []string
		for _, d := range l.Drivers {
			ds = append(ds, fmt.Sprintf("%s=%s", d.Feature, human(float64(d.Value))))
		}
		cells = append(cells, strings.Join(ds, ", "))
		t.row(cells...)
	}
	if err := t.flush(); err != nil {
		return err
	}
	var notes []string
	for _, l := range rows {
		for _, r := range l.Reasons {
			notes = append(notes, fmt.Sprintf("  %s: undetermined (most likely %s): %s", l.File, l.Top, r))
		}
		for _, wn := range l.Warnings {
			notes = append(notes, fmt.Sprintf("  %s: %s", l.File, wn))
		}
		notes = append(notes, significanceNotes(&l)...)
	}
	if len(notes) > 0 {
		fmt.Fprintln(w, "\nnotes:")
		for _, n := range notes {
			fmt.Fprintln(w, n)
		}
	}
	fmt.Fprintf(w, "\nmodel: %s\n", cr.Model)
	if cr.Significance {
		fmt.Fprintln(w, significanceFooter(cr))
	}
	fmt.Fprintln(w, caution)
	return nil
}

// significanceJSON is the surrogate test of one trace in the JSON Lines
// output; the keys are listed in the command's help.
type significanceJSON struct {
	Method         string            `json:"method"`
	NullHypothesis string            `json:"null_hypothesis"`
	Count          int               `json:"count"`
	Seed           uint64            `json:"seed"`
	Alpha          jsonsafe.Float    `json:"alpha"`
	MinSurrogates  int               `json:"min_surrogates"`
	Start          int               `json:"start"`
	Length         int               `json:"length"`
	EndMatched     bool              `json:"end_matched"`
	Delay          int               `json:"delay"`
	Dimension      int               `json:"dimension"`
	Horizon        int               `json:"horizon"`
	Statistics     []sigStatJSON     `json:"statistics"`
	P              jsonsafe.Float    `json:"p"`
	Rejected       bool              `json:"rejected"`
	Agreement      *sigAgreementJSON `json:"agreement"`
	Warnings       []string          `json:"warnings"`
	Error          string            `json:"error,omitempty"`
}

type sigStatJSON struct {
	Name        string         `json:"name"`
	Side        string         `json:"side"`
	Observed    jsonsafe.Float `json:"observed"`
	Mean        jsonsafe.Float `json:"mean"`
	SD          jsonsafe.Float `json:"sd"`
	P           jsonsafe.Float `json:"p"`
	PHolm       jsonsafe.Float `json:"p_holm"`
	Significant bool           `json:"significant"`
	Count       int            `json:"count"`
	Failed      int            `json:"failed"`
	Error       string         `json:"error,omitempty"`
}

type sigAgreementJSON struct {
	Kind string `json:"kind"`
	Text string `json:"text"`
}

// newSignificanceJSON renders the test of a trace whose verdict is class;
// a test that could not run gives an object with only error (and the
// empty arrays) set.
func newSignificanceJSON(r *surrogate.DeterminismResult, err error, class string) *significanceJSON {
	if err != nil {
		return &significanceJSON{Alpha: jsonsafe.Float(math.NaN()), P: jsonsafe.Float(math.NaN()),
			Statistics: []sigStatJSON{}, Warnings: []string{}, Error: oneLine(err.Error())}
	}
	a := r.Agreement(class)
	j := &significanceJSON{
		Method: string(r.Method), NullHypothesis: r.NullHypothesis, Count: r.Count, Seed: r.Seed,
		Alpha: jsonsafe.Float(r.Alpha), MinSurrogates: r.MinSurrogates, Start: r.Start, Length: r.Len,
		EndMatched: r.EndMatched, Delay: r.Delay, Dimension: r.Dim, Horizon: r.Horizon,
		Statistics: []sigStatJSON{}, P: jsonsafe.Float(r.P()), Rejected: r.Rejected,
		Agreement: &sigAgreementJSON{a.Kind, a.Text}, Warnings: nonNil(r.Warnings),
	}
	for _, s := range r.Stats {
		j.Statistics = append(j.Statistics, sigStatJSON{
			Name: s.Name, Side: string(s.Side), Observed: jsonsafe.Float(s.Observed), Mean: jsonsafe.Float(s.Mean),
			SD: jsonsafe.Float(s.SD), P: jsonsafe.Float(s.P), PHolm: jsonsafe.Float(s.PHolm),
			Significant: s.Significant, Count: s.Count, Failed: s.Failed, Error: s.Error,
		})
	}
	return j
}

// significanceCells are the table cells DETERMINISM P and SURROGATE TEST.
func significanceCells(s *significanceJSON) []string {
	switch {
	case s == nil || s.Error != "":
		return []string{"—", "failed"}
	case s.Rejected:
		return []string{human(float64(s.P)), "significant"}
	}
	return []string{human(float64(s.P)), "not significant"}
}

// significanceNotes are the table notes of a trace's surrogate test: why it
// failed, its warnings, and the model/test comparison unless they agree.
func significanceNotes(l *classifyLine) []string {
	s := l.Significance
	if s == nil {
		return nil
	}
	if s.Error != "" {
		return []string{fmt.Sprintf("  %s: surrogate test failed: %s", l.File, s.Error)}
	}
	var notes []string
	if a := s.Agreement; a != nil && a.Kind != string(surrogate.Agree) {
		notes = append(notes, fmt.Sprintf("  %s: %s verdict, surrogate test: %s", l.File, l.Class, a.Text))
	}
	for _, w := range s.Warnings {
		notes = append(notes, fmt.Sprintf("  %s: surrogate test: %s", l.File, w))
	}
	return notes
}

// significanceFooter states how the surrogate test was run.
func significanceFooter(cr classifyRender) string {
	m := cr.Surrogates
	if m == 0 {
		m = surrogate.DeterminismSurrogates(cr.Alpha)
	}
	return fmt.Sprintf("surrogate test: %d IAAFT surrogates per trace, seed %d, α = %s; %s one-sided rank tests, Holm-adjusted; null: %s; middle %d samples of longer traces, end matched",
		m, cr.Seed, human(cr.Alpha), strings.Join(surrogate.DeterminismStatNames(), " and "), surrogate.IAAFT.NullHypothesis(), surrogate.DefaultDeterminismLength)
}
