package main

import (
	"bufio"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"strings"
	"sync"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/internal/jsonsafe"
	"github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/trace"
)

func init() { addCommand(newFeaturesCmd) }

// coreFeatures are the names DESIGN.md promises scripts; `features` prints
// them unless --all asks for the whole vector.
var coreFeatures = []string{
	"nl_div_rate", "nl_gp_dim", "sc_fluct_a1", "sc_range_h", "sc_psd_beta",
	"op_ent_d4", "op_jsc_d4", "nl_sent_m2", "nl_k01",
	"hv_deg_mean", "hv_tail_exprate", "hv_clust_mean",
	"nv_deg_mean", "nv_tail_powexp", "nv_clust_mean", "nv_comm_q", "nv_deg_assort",
}

type featuresOptions struct {
	in       inputOptions
	src      sourceOptions
	shard    shardOptions
	jr       journalOptions
	format   string
	out      string
	all      bool
	seed     uint64
	window   int
	maxEdges int64
}

func newFeaturesCmd(e *env) *cobra.Command {
	var o featuresOptions
	c := &cobra.Command{
		Use:   "features FILE|DIR...",
		Short: "Compute the feature vector of each trace",
		Long: `Compute the features the classifier reads: visibility-graph metrics,
nonlinear measures (Lyapunov exponent, correlation dimension, 0–1 test,
prediction skill, sample entropy), scaling exponents (DFA, R/S, spectral
slope), ordinal measures and increment statistics. The trace is standardised
first, so the units of the file do not matter.

Without --all the core features are printed; --all prints the whole vector
with each feature's family, followed by the extended families (recurrence
and ordinal partition networks: rn_*, opn_*), which are measured only on
request and are not read by the classifier. A feature that cannot be computed for a trace is
shown as missing ("—" in tables, null in JSON, empty in CSV) with the reason.
Files are processed in parallel; one bad file is reported and skipped.
Run 'tracesift features --list' for the catalogue with references.

Long traces: a trace longer than --window samples (default ` + fmt.Sprint(features.DefaultWindow) + `) is
measured in consecutive windows of equal length, at most --window samples
each, one after another, and each feature is the median over the windows
(reported when at least half of them measured it); tables add each
feature's range over the windows and JSON adds "windows", "window_length"
and "spread". Shorter traces are measured whole, so their features do not
depend on --window. Memory, measured on Brownian motion read from CSV:
0.65 GB at the peak for 2^20 samples, 1.1 GB for 10^7 samples in 10
windows. --window 0 measures any trace whole: 4.1 GB for those 10^7
samples, whose natural visibility graph then passes --max-edges (the edge
budget of each visibility graph, about ` + fmt.Sprint(networks.BytesPerEdge) + ` bytes per edge at the peak), so
its features are missing. With one input file, a progress bar on a
terminal counts feature families per window.

` + sourceHelp + `

` + journalHelp + `

` + shardHelp,
		Example: `  tracesift features testdata/demo/fresh/D01_fresh_Vg0.60.csv
  tracesift features --all --format json testdata/demo/stressed/*.csv*
  tracesift generate henon --n 5000 | tracesift features -
  tracesift features --format csv -o features.csv testdata/demo   # a directory, recursively
  tracesift features --format csv --include '*.csv.gz' -o f.csv archive/
  find archive -name '*.csv' > list.txt; tracesift features --files-from list.txt --format csv -o f.csv
  tracesift features --campaign testdata/demo/campaign.csv --format csv -o f.csv
  tracesift features --files-from list.txt --format csv --resume -o f.csv   # after a kill: only what is left
  tracesift features --files-from list.txt --format csv --shard 2/4 -o f.2.csv   # then: tracesift collate f.*.csv.journal
  tracesift features --all --format parquet -o features.parquet testdata/demo   # a binary table (needs -o)
  tracesift features --column current testdata/formats/run.npz      # one array of a NumPy archive
  tracesift features --column 'TW-W07 D03 stressed/Id' testdata/demo/D03-stressed-1.20V.tdms
  tracesift features --window 100000 long.csv   # windows of 10^5 samples`,
		RunE: func(c *cobra.Command, args []string) error {
			list, _ := c.Flags().GetBool("list")
			if list {
				return writeCatalogue(e)
			}
			return runFeatures(e, args, &o)
		},
	}
	f := c.Flags()
	o.in.bind(f, features.MinLength)
	o.src.bind(f)
	o.shard.bind(f)
	o.jr.bind(f, "OUTPUT.journal with -o OUTPUT, none on stdout")
	f.StringVar(&o.format, "format", formatTable, "output format: table, csv, json (JSON Lines, one object per file) or parquet (the CSV table's columns and values; needs -o FILE)")
	f.StringVarP(&o.out, "output", "o", "-", "output file (- for stdout)")
	f.BoolVar(&o.all, "all", false, "print the whole feature vector and the extended families (rn_*, opn_*), not only the core features")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the randomised estimators (sampled path lengths, 0–1 test frequencies)")
	f.IntVar(&o.window, "window", features.DefaultWindow, fmt.Sprintf("measure traces longer than this many samples in windows of at most this length (at least %d; 0: measure every trace whole)", 2*features.MinLength))
	f.Int64Var(&o.maxEdges, "max-edges", networks.DefaultMaxEdges, fmt.Sprintf("edge budget of each visibility graph: its features are missing past this many edges (about %d bytes each at the peak)", networks.BytesPerEdge))
	f.Bool("list", false, "list the feature catalogue (name, family, meaning, reference) and exit")
	return c
}

// featuresRecord is one trace's measured vector as the journal keeps it:
// every feature of the catalogue at full precision (jsonsafe.Exact, so it
// reads back to the same bits), with the reasons of the missing ones and
// what was read, so that every output format is written from it.
type featuresRecord struct {
	Samples      int                       `json:"samples"`
	Interval     jsonsafe.Exact            `json:"interval,omitempty"`
	TimeUnit     string                    `json:"time_unit,omitempty"`
	Column       string                    `json:"column,omitempty"`
	Unit         string                    `json:"unit,omitempty"`
	Warnings     []string                  `json:"warnings,omitempty"`
	Features     map[string]jsonsafe.Exact `json:"features"`
	Missing      map[string]string         `json:"missing,omitempty"`
	Windows      int                       `json:"windows,omitempty"`
	WindowLength int                       `json:"window_length,omitempty"`
	Spread       map[string]spreadRecord   `json:"spread,omitempty"`
}

type spreadRecord struct {
	Measured int            `json:"measured"`
	Min      jsonsafe.Exact `json:"min"`
	Max      jsonsafe.Exact `json:"max"`
}

func newFeaturesRecord(tr trace.Trace, v features.Vector) featuresRecord {
	r := featuresRecord{Samples: len(tr.Values), Interval: jsonsafe.Exact(tr.Interval), TimeUnit: tr.TimeUnit,
		Column: tr.Column, Unit: tr.Unit, Warnings: tr.Warnings, Features: map[string]jsonsafe.Exact{}}
	if v.Windows > 1 {
		r.Windows, r.WindowLength, r.Spread = v.Windows, v.WindowLength, map[string]spreadRecord{}
	}
	for i, n := range v.Names {
		r.Features[n] = jsonsafe.Exact(v.Values[i])
		if why := featureReason(v, i); why != "" {
			if r.Missing == nil {
				r.Missing = map[string]string{}
			}
			r.Missing[n] = why
		}
		if v.Windows > 1 {
			sp := v.Spread[i]
			r.Spread[n] = spreadRecord{sp.Measured, jsonsafe.Exact(sp.Min), jsonsafe.Exact(sp.Max)}
		}
	}
	return r
}

// value returns feature n (NaN when missing or unknown).
func (r *featuresRecord) value(n string) float64 {
	v, ok := r.Features[n]
	if !ok {
		return math.NaN()
	}
	return float64(v)
}

// featuresRender are the options of the output table, kept in the journal
// so that collate writes the table the runs would have.
type featuresRender struct {
	Format string `json:"format"`
	All    bool   `json:"all"`
}

func (fr *featuresRender) formats() []string {
	return []string{formatTable, formatCSV, formatJSON, formatParquet}
}
func (fr *featuresRender) setFormat(f string) { fr.Format = f }

// sink writes the records in the render's format; Parquet is the CSV
// table converted as a whole at the end.
func (fr *featuresRender) sink(w io.Writer) rawSink {
	if fr.Format == formatParquet {
		csv := *fr
		csv.Format = formatCSV
		return newParquetSink(w, featureKinds, csv.sink)
	}
	return newFeaturesSink(w, *fr)
}

func (fr featuresRender) names() []string {
	if fr.All {
		return features.AllNames()
	}
	return coreFeatures
}

// featuresSink writes feature records in one of the output formats.
type featuresSink struct {
	w      *bufio.Writer
	render featuresRender
	names  []string
	first  bool
}

func newFeaturesSink(w io.Writer, fr featuresRender) *featuresSink {
	return &featuresSink{w: bufio.NewWriter(w), render: fr, names: fr.names(), first: true}
}

func (s *featuresSink) item(name string, raw json.RawMessage) error {
	var r featuresRecord
	if err := json.Unmarshal(raw, &r); err != nil {
		return fmt.Errorf("%s: damaged record: %w", name, err)
	}
	defer func() { s.first = false }()
	switch s.render.Format {
	case formatJSON:
		return writeJSONLine(s.w, featuresJSON(name, &r, s.names))
	case formatCSV:
		return writeFeaturesCSV(s.w, name, &r, s.names, s.first)
	}
	if !s.first {
		fmt.Fprintln(s.w)
	}
	return writeFeaturesTable(s.w, name, &r, s.names, s.render.All)
}

func (s *featuresSink) finish() error { return s.w.Flush() }

func runFeatures(e *env, args []string, o *featuresOptions) error {
	if err := checkFormat(o.format, formatTable, formatCSV, formatJSON, formatParquet); err != nil {
		return err
	}
	if o.format == formatParquet && (o.out == "-" || o.out == "") {
		return usagef("--format parquet writes a binary file: give it with -o FILE")
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	window := o.window
	switch {
	case window == 0:
		window = -1 // features.Options: the whole trace
	case window < 2*features.MinLength:
		return usagef("--window %d: want 0 (measure whole) or at least %d samples", o.window, 2*features.MinLength)
	}
	if o.maxEdges < 1 {
		return usagef("--max-edges %d: want at least 1", o.maxEdges)
	}
	run, err := newTraceRun(e, "features", args, &o.src, &o.shard, &o.jr, o.out)
	if err != nil {
		return err
	}
	fopts := features.Options{Seed: o.seed, Window: window, MaxEdges: o.maxEdges, Extended: o.all}
	if len(run.inputs) == 1 {
		// Within one trace, a bar counting feature families per window
		// (a batch of files has its own bar, per file).
		var once sync.Once
		var bar func(done, total int)
		fopts.Progress = func(done, total int) {
			once.Do(func() { bar = newProgress(e, total, "measuring") })
			if bar != nil {
				bar(done, total)
			}
		}
	}
	options := struct {
		Input    trace.Options `json:"input"`
		Seed     uint64        `json:"seed"`
		Window   int           `json:"window"`
		MaxEdges int64         `json:"max_edges"`
		Extended bool          `json:"extended"`
		Schema   string        `json:"schema"`
	}{o.in.traceOptions(), o.seed, window, o.maxEdges, o.all, features.SchemaHash()}
	render := &featuresRender{Format: o.format, All: o.all}
	run.key, run.options, run.render = batchKey("features", options), options, render
	return run.run(e, o.out,
		func(e *env, i int) (any, error) {
			tr, err := readTrace(e, run.inputs[i].path, &o.in)
			if err != nil {
				return nil, err
			}
			v, err := features.Extract(tr.Values, fopts)
			if err != nil {
				return nil, fmt.Errorf("%s: %w", tr.Source, err)
			}
			return newFeaturesRecord(tr, v), nil
		},
		render.sink)
}

// newTraceRun gathers the inputs of a batch command over trace files,
// takes its shard and resolves its journal.
func newTraceRun(e *env, command string, args []string, src *sourceOptions, so *shardOptions, jo *journalOptions, out string) (*batchRun, error) {
	if len(args)+len(src.filesFrom)+len(src.campaign) == 0 {
		return nil, usagef("no input files (see 'tracesift %s --help')", command)
	}
	sh, err := so.resolve(e)
	if err != nil {
		return nil, err
	}
	jpath, err := jo.resolve(out)
	if err != nil {
		return nil, err
	}
	list, err := src.collect(e, args)
	if err != nil {
		return nil, err
	}
	run := &batchRun{command: command, inputs: entriesToInputs(sh.take(list)), shard: sh, journal: jpath, resume: jo.resume}
	run.announce(e, len(list))
	return run, nil
}

type featuresLine struct {
	File     string                    `json:"file"`
	Samples  int                       `json:"samples"`
	Interval jsonsafe.Float            `json:"interval,omitempty"`
	Column   string                    `json:"column,omitempty"`
	Unit     string                    `json:"unit,omitempty"`
	Features map[string]jsonsafe.Float `json:"features"`
	Missing  map[string]string         `json:"missing,omitempty"`
	Warnings []string                  `json:"warnings,omitempty"`
	// For a trace measured in windows: their number and longest length,
	// and each feature's range over them.
	Windows      int                   `json:"windows,omitempty"`
	WindowLength int                   `json:"window_length,omitempty"`
	Spread       map[string]spreadJSON `json:"spread,omitempty"`
}

type spreadJSON struct {
	Measured int            `json:"measured"`
	Min      jsonsafe.Float `json:"min"`
	Max      jsonsafe.Float `json:"max"`
}

func featuresJSON(name string, r *featuresRecord, names []string) featuresLine {
	l := featuresLine{File: name, Samples: r.Samples, Interval: jsonsafe.Float(r.Interval),
		Column: r.Column, Unit: r.Unit, Features: map[string]jsonsafe.Float{}, Warnings: r.Warnings}
	windowed := r.Windows > 1
	if windowed {
		l.Windows, l.WindowLength, l.Spread = r.Windows, r.WindowLength, map[string]spreadJSON{}
	}
	for _, n := range names {
		l.Features[n] = jsonsafe.Float(r.value(n))
		if why := r.Missing[n]; why != "" {
			if l.Missing == nil {
				l.Missing = map[string]string{}
			}
			l.Missing[n] = why
		}
		if windowed {
			sp := r.Spread[n]
			l.Spread[n] = spreadJSON{sp.Measured, jsonsafe.Float(sp.Min), jsonsafe.Float(sp.Max)}
		}
	}
	return l
}

// featureReason is why feature i of v is missing ("" when present), with a
// visibility graph past its edge budget explained in terms of the flags.
func featureReason(v features.Vector, i int) string {
	var eb *networks.EdgeBudgetError
	if v.Reasons[i] == "" || !errors.As(v.Causes[i], &eb) {
		return v.Reasons[i]
	}
	where := ""
	if v.Windows > 1 {
		where = fmt.Sprintf(" in %d of %d windows", v.Windows-v.Spread[i].Measured, v.Windows)
	}
	return fmt.Sprintf("%s of %d samples%s: more than %d edges, the budget set by --max-edges (about %s at the peak); raise --max-edges or lower --window",
		eb.Graph, eb.Nodes, where, eb.Budget, memory(eb.Budget))
}

func writeFeaturesCSV(w io.Writer, name string, r *featuresRecord, names []string, header bool) error {
	if header {
		fmt.Fprintf(w, "file,samples,%s\n", strings.Join(names, ","))
	}
	cells := []string{csvField(name), fmt.Sprint(r.Samples)}
	for _, n := range names {
		v := r.value(n)
		if math.IsNaN(v) {
			cells = append(cells, "")
			continue
		}
		cells = append(cells, full(v))
	}
	_, err := fmt.Fprintln(w, strings.Join(cells, ","))
	return err
}

// csvField quotes a CSV field when it needs it.
func csvField(s string) string {
	if strings.ContainsAny(s, ",\"\n\r") {
		return `"` + strings.ReplaceAll(s, `"`, `""`) + `"`
	}
	return s
}

func writeFeaturesTable(w io.Writer, name string, r *featuresRecord, names []string, all bool) error {
	fmt.Fprintf(w, "%s: %s\n", name, describeTrace(r))
	windowed := r.Windows > 1
	if windowed {
		fmt.Fprintf(w, "  measured in %d windows of at most %d samples: medians over the windows, with their range\n", r.Windows, r.WindowLength)
	}
	for _, warn := range r.Warnings {
		fmt.Fprintf(w, "  warning: %s\n", warn)
	}
	t := newTable(w)
	head := []string{"FEATURE", "VALUE"}
	if all {
		head = []string{"FEATURE", "FAMILY", "VALUE"}
	}
	if windowed {
		head = append(head, "RANGE OVER WINDOWS")
	}
	t.row(append(head, "NOTE")...)
	for _, n := range names {
		v := r.value(n)
		cells := []string{n, human(v)}
		if all {
			e, _ := features.Lookup(n)
			cells = []string{n, string(e.Family), human(v)}
		}
		if windowed {
			sp := r.Spread[n]
			rng := "—"
			if sp.Measured > 0 {
				rng = fmt.Sprintf("%s … %s (%d/%d)", human(float64(sp.Min)), human(float64(sp.Max)), sp.Measured, r.Windows)
			}
			cells = append(cells, rng)
		}
		t.row(append(cells, r.Missing[n])...)
	}
	return t.flush()
}

// describeTrace summarises what was read: length, interval and column.
func describeTrace(r *featuresRecord) string {
	parts := []string{fmt.Sprintf("%d samples", r.Samples)}
	if r.Interval > 0 {
		unit := r.TimeUnit
		if unit == "" {
			unit = "time units"
		}
		parts = append(parts, fmt.Sprintf("interval %s %s", human(float64(r.Interval)), unit))
	}
	if r.Column != "" {
		col := r.Column
		if r.Unit != "" {
			col += " [" + r.Unit + "]"
		}
		parts = append(parts, "column "+col)
	}
	return strings.Join(parts, ", ")
}

func writeCatalogue(e *env) error {
	t := newTable(e.stdout)
	t.row("FEATURE", "FAMILY", "MEANING", "REFERENCE")
	for _, en := range features.Catalogue() {
		t.row(en.Name, string(en.Family), en.Description, en.Reference)
	}
	for _, en := range features.Extended() {
		t.row(en.Name, string(en.Family)+" (extended)", en.Description, en.Reference)
	}
	if err := t.flush(); err != nil {
		return err
	}
	fmt.Fprintf(e.stdout, "\nschema v%d, hash %s, %d features; %d more in extended families (measured with --all or by name, not read by the classifier)\n",
		features.SchemaVersion, features.SchemaHash(), len(features.Catalogue()), len(features.Extended()))
	return nil
}
