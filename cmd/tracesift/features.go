package main

import (
	"bufio"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"tracesift/features"
	"tracesift/internal/jsonsafe"
	"tracesift/trace"
)

func init() { addCommand(newFeaturesCmd) }

// coreFeatures are the names DESIGN.md promises scripts; `features` prints
// them unless --all asks for the whole vector.
var coreFeatures = []string{
	"lyap_max", "corr_dim", "dfa_alpha", "hurst_rs", "spectral_beta",
	"perm_entropy", "stat_complexity", "sample_entropy", "zero_one_k",
	"hvg_mean_degree", "hvg_lambda", "hvg_clustering_mean",
	"nvg_mean_degree", "nvg_gamma", "nvg_clustering_mean", "nvg_modularity", "nvg_assortativity",
}

type featuresOptions struct {
	in     inputOptions
	format string
	out    string
	all    bool
	seed   uint64
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
with each feature's family. A feature that cannot be computed for a trace is
shown as missing ("—" in tables, null in JSON, empty in CSV) with the reason.
Files are processed in parallel; one bad file is reported and skipped.
Run 'tracesift features --list' for the catalogue with references.`,
		Example: `  tracesift features testdata/demo/fresh/D01_fresh_Vg0.60.csv
  tracesift features --all --format json testdata/demo/stressed/*.csv*
  tracesift generate henon --n 5000 | tracesift features -
  tracesift features --format csv -o features.csv testdata/demo/*/*`,
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
	o.in.bind(f)
	f.StringVar(&o.format, "format", formatTable, "output format: table, csv or json (JSON Lines, one object per file)")
	f.StringVarP(&o.out, "output", "o", "-", "output file (- for stdout)")
	f.BoolVar(&o.all, "all", false, "print the whole feature vector, not only the core features")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the randomised estimators (sampled path lengths, 0–1 test frequencies)")
	f.Bool("list", false, "list the feature catalogue (name, family, meaning, reference) and exit")
	return c
}

// featureResult is one file's measured vector.
type featureResult struct {
	tr  trace.Trace
	vec features.Vector
}

func runFeatures(e *env, files []string, o *featuresOptions) error {
	if err := checkFormat(o.format, formatTable, formatCSV, formatJSON); err != nil {
		return err
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	names := coreFeatures
	if o.all {
		names = features.Names()
	}
	return writeOutput(e, o.out, func(w io.Writer) error {
		bw := bufio.NewWriter(w)
		defer bw.Flush()
		first := true
		return batch(e, files,
			func(_ int, name string) (featureResult, error) {
				tr, err := readTrace(e, name, &o.in)
				if err != nil {
					return featureResult{}, err
				}
				v, err := features.Extract(tr.Values, features.Options{Seed: o.seed})
				if err != nil {
					return featureResult{}, fmt.Errorf("%s: %w", tr.Source, err)
				}
				return featureResult{tr, v}, nil
			},
			func(_ int, name string, r featureResult) error {
				defer func() { first = false }()
				switch o.format {
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
	})
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
}

func featuresJSON(name string, r featureResult, names []string) featuresLine {
	l := featuresLine{File: name, Samples: len(r.tr.Values), Interval: jsonsafe.Float(r.tr.Interval),
		Column: r.tr.Column, Unit: r.tr.Unit, Features: map[string]jsonsafe.Float{}, Warnings: r.tr.Warnings}
	missing := r.vec.Missing()
	for _, n := range names {
		v, _ := r.vec.Get(n)
		l.Features[n] = jsonsafe.Float(v)
		if why, ok := missing[n]; ok {
			if l.Missing == nil {
				l.Missing = map[string]string{}
			}
			l.Missing[n] = why
		}
	}
	return l
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
	for _, warn := range r.tr.Warnings {
		fmt.Fprintf(w, "  warning: %s\n", warn)
	}
	t := newTable(w)
	if all {
		t.row("FEATURE", "FAMILY", "VALUE", "NOTE")
	} else {
		t.row("FEATURE", "VALUE", "NOTE")
	}
	missing := r.vec.Missing()
	for _, n := range names {
		v, _ := r.vec.Get(n)
		note := missing[n]
		if all {
			e, _ := features.Lookup(n)
			t.row(n, string(e.Family), human(v), note)
		} else {
			t.row(n, human(v), note)
		}
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
	if err := t.flush(); err != nil {
		return err
	}
	fmt.Fprintf(e.stdout, "\nschema v%d, hash %s, %d features\n", features.SchemaVersion, features.SchemaHash(), len(features.Catalogue()))
	return nil
}
