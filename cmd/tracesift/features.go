package main

import (
	"bufio"
	"errors"
	"fmt"
	"io"
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
		Use:   "features FILE...",
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
terminal counts feature families per window.`,
		Example: `  tracesift features testdata/demo/fresh/D01_fresh_Vg0.60.csv
  tracesift features --all --format json testdata/demo/stressed/*.csv*
  tracesift generate henon --n 5000 | tracesift features -
  tracesift features --format csv -o features.csv testdata/demo/*/*
  tracesift features --all --format parquet -o features.parquet testdata/demo/*/*
  tracesift features --column current testdata/formats/run.npz      # one array of a NumPy archive
  tracesift features --column 'TW-W07 D03 stressed/Id' testdata/demo/D03-stressed-1.20V.tdms
  tracesift features --window 100000 long.csv   # windows of 10^5 samples`,
		RunE: func(c *cobra.Command, args []string) error {
			list, _ := c.Flags().GetBool("list")
			if list {
				return writeCatalogue(e)
			}
			if len(args) == 0 {
				return usagef("no input files (see 'tracesift features --help')")
			}
			return runFeatures(e, args, &o)
		},
	}
	f := c.Flags()
	o.in.bind(f, features.MinLength)
	f.StringVar(&o.format, "format", formatTable, "output format: table, csv, json (JSON Lines, one object per file) or parquet (the CSV table's columns and values; needs -o FILE)")
	f.StringVarP(&o.out, "output", "o", "-", "output file (- for stdout)")
	f.BoolVar(&o.all, "all", false, "print the whole feature vector and the extended families (rn_*, opn_*), not only the core features")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the randomised estimators (sampled path lengths, 0–1 test frequencies)")
	f.IntVar(&o.window, "window", features.DefaultWindow, fmt.Sprintf("measure traces longer than this many samples in windows of at most this length (at least %d; 0: measure every trace whole)", 2*features.MinLength))
	f.Int64Var(&o.maxEdges, "max-edges", networks.DefaultMaxEdges, fmt.Sprintf("edge budget of each visibility graph: its features are missing past this many edges (about %d bytes each at the peak)", networks.BytesPerEdge))
	f.Bool("list", false, "list the feature catalogue (name, family, meaning, reference) and exit")
	return c
}

// featureResult is one file's measured vector.
type featureResult struct {
	tr  trace.Trace
	vec features.Vector
}

func runFeatures(e *env, files []string, o *featuresOptions) error {
	if err := checkFormat(o.format, formatTable, formatCSV, formatJSON, formatParquet); err != nil {
		return err
	}
	format, parquet := o.format, o.format == formatParquet
	if parquet && (o.out == "-" || o.out == "") {
		return usagef("--format parquet writes a binary file: give it with -o FILE")
	}
	if parquet {
		format = formatCSV // the CSV table, converted as a whole
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
	fopts := features.Options{Seed: o.seed, Window: window, MaxEdges: o.maxEdges, Extended: o.all}
	if len(files) == 1 {
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
	names := coreFeatures
	if o.all {
		names = features.AllNames()
	}
	fill := func(w io.Writer) error {
		bw := bufio.NewWriter(w)
		defer bw.Flush()
		first := true
		return batch(e, "traces", files,
			func(_ int, name string) (featureResult, error) {
				tr, err := readTrace(e, name, &o.in)
				if err != nil {
					return featureResult{}, err
				}
				v, err := features.Extract(tr.Values, fopts)
				if err != nil {
					return featureResult{}, fmt.Errorf("%s: %w", tr.Source, err)
				}
				return featureResult{tr, v}, nil
			},
			func(_ int, name string, r featureResult) error {
				defer func() { first = false }()
				switch format {
				case formatJSON:
					return writeJSONLine(bw, featuresJSON(name, r, names))
				case formatCSV:
					return writeFeaturesCSV(bw, name, r, names, first)
				}
				if !first {
					fmt.Fprintln(bw)
				}
				return writeFeaturesTable(bw, name, r, names, o.all)
			})
	}
	if parquet {
		fill = asParquet(featureKinds, fill)
	}
	return writeOutput(e, o.out, fill)
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

func featuresJSON(name string, r featureResult, names []string) featuresLine {
	l := featuresLine{File: name, Samples: len(r.tr.Values), Interval: jsonsafe.Float(r.tr.Interval),
		Column: r.tr.Column, Unit: r.tr.Unit, Features: map[string]jsonsafe.Float{}, Warnings: r.tr.Warnings}
	windowed := r.vec.Windows > 1
	if windowed {
		l.Windows, l.WindowLength, l.Spread = r.vec.Windows, r.vec.WindowLength, map[string]spreadJSON{}
	}
	for _, n := range names {
		i := index(r.vec, n)
		l.Features[n] = jsonsafe.Float(r.vec.Values[i])
		if why := featureReason(r.vec, i); why != "" {
			if l.Missing == nil {
				l.Missing = map[string]string{}
			}
			l.Missing[n] = why
		}
		if windowed {
			sp := r.vec.Spread[i]
			l.Spread[n] = spreadJSON{sp.Measured, jsonsafe.Float(sp.Min), jsonsafe.Float(sp.Max)}
		}
	}
	return l
}

// index returns the position of a catalogue feature in v.
func index(v features.Vector, name string) int {
	for i, n := range v.Names {
		if n == name {
			return i
		}
	}
	panic("features: no feature " + name) // names come from the catalogue
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

func writeFeaturesCSV(w io.Writer, name string, r featureResult, names []string, header bool) error {
	if header {
		fmt.Fprintf(w, "file,samples,%s\n", strings.Join(names, ","))
	}
	cells := []string{csvField(name), fmt.Sprint(len(r.tr.Values))}
	for _, n := range names {
		v, ok := r.vec.Get(n)
		if !ok {
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

func writeFeaturesTable(w io.Writer, name string, r featureResult, names []string, all bool) error {
	fmt.Fprintf(w, "%s: %s\n", name, describeTrace(r.tr))
	windowed := r.vec.Windows > 1
	if windowed {
		fmt.Fprintf(w, "  measured in %d windows of at most %d samples: medians over the windows, with their range\n", r.vec.Windows, r.vec.WindowLength)
	}
	for _, warn := range r.tr.Warnings {
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
		i := index(r.vec, n)
		cells := []string{n, human(r.vec.Values[i])}
		if all {
			e, _ := features.Lookup(n)
			cells = []string{n, string(e.Family), human(r.vec.Values[i])}
		}
		if windowed {
			sp := r.vec.Spread[i]
			rng := "—"
			if sp.Measured > 0 {
				rng = fmt.Sprintf("%s … %s (%d/%d)", human(sp.Min), human(sp.Max), sp.Measured, r.vec.Windows)
			}
			cells = append(cells, rng)
		}
		t.row(append(cells, featureReason(r.vec, i))...)
	}
	return t.flush()
}

// describeTrace summarises what was read: length, interval and column.
func describeTrace(tr trace.Trace) string {
	parts := []string{fmt.Sprintf("%d samples", len(tr.Values))}
	if tr.Interval > 0 {
		unit := tr.TimeUnit
		if unit == "" {
			unit = "time units"
		}
		parts = append(parts, fmt.Sprintf("interval %s %s", human(tr.Interval), unit))
	}
	if tr.Column != "" {
		col := tr.Column
		if tr.Unit != "" {
			col += " [" + tr.Unit + "]"
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
