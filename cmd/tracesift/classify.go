package main

import (
	"bufio"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"tracesift/classifier"
	"tracesift/features"
	"tracesift/internal/jsonsafe"
	"tracesift/trace"
)

func init() { addCommand(newClassifyCmd) }

// caution is printed with every verdict.
const caution = "tracesift's verdict is a screening aid, not a device qualification result; defer to your laboratory's qualification procedures and the applicable reliability standards."

type classifyOptions struct {
	in      inputOptions
	model   string
	format  string
	out     string
	seed    uint64
	drivers int
}

func newClassifyCmd(e *env) *cobra.Command {
	var o classifyOptions
	c := &cobra.Command{
		Use:   "classify FILE...",
		Short: "Tell whether each trace is chaotic, stochastic or regular",
		Long: `Classify each trace as chaotic (deterministic, positive largest Lyapunov
exponent), stochastic (noise of any colour or distribution) or regular
(periodic or quasi-periodic), with the class probabilities of the tree
ensemble, the features that drove the decision, and warnings about the
recording (short, clipped, quantised, drifting, mains interference when the
file has a time column in seconds).

The verdict is "undetermined" when the top probability is below the
model's threshold or the trace's features lie outside what the model was
trained on; the reasons are printed. Traces longer than 16384 samples are
measured in up to 8 evenly spaced windows whose probabilities are averaged.

The embedded default model is used unless --model names another (made with
'tracesift train'). Files are processed in parallel; a bad file is reported
and skipped, and the exit status is 1 if any failed.

` + caution,
		Example: `  tracesift classify testdata/demo/*/*
  tracesift classify --format json testdata/demo/stressed/D01_stressed_Vg1.20.csv
  tracesift generate lorenz --n 5000 --snr 20 | tracesift classify -
  tracesift classify --model lab.model --column Id captures/*.csv`,
		RunE: func(c *cobra.Command, args []string) error {
			if len(args) == 0 {
				return usagef("no input files (see 'tracesift classify --help')")
			}
			return runClassify(e, args, &o)
		},
	}
	f := c.Flags()
	o.in.bind(f)
	f.StringVar(&o.model, "model", "", "model file (default: the embedded default model)")
	f.StringVar(&o.format, "format", formatTable, "output format: table or json (JSON Lines, one object per file)")
	f.StringVarP(&o.out, "output", "o", "-", "output file (- for stdout)")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the randomised estimators")
	f.IntVar(&o.drivers, "drivers", 3, "number of driving features to report per trace")
	return c
}

type classifyResult struct {
	tr trace.Trace
	v  classifier.Verdict
}

func runClassify(e *env, files []string, o *classifyOptions) error {
	if err := checkFormat(o.format, formatTable, formatJSON); err != nil {
		return err
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	if o.drivers < 1 {
		return usagef("--drivers %d: want at least 1", o.drivers)
	}
	m, err := loadModel(o.model)
	if err != nil {
		return err
	}
	return writeOutput(e, o.out, func(w io.Writer) error {
		bw := bufio.NewWriter(w)
		defer bw.Flush()
		var rows []classifyRow
		err := batch(e, files,
			func(_ int, name string) (classifyResult, error) {
				tr, err := readTrace(e, name, &o.in)
				if err != nil {
					return classifyResult{}, err
				}
				v, err := classifier.Screen(m, tr.Values, classifier.ScreenOptions{
					Interval: intervalSeconds(tr),
					Drivers:  o.drivers,
					Features: features.Options{Seed: o.seed},
				})
				if err != nil {
					return classifyResult{}, fmt.Errorf("%s: %w", tr.Source, err)
				}
				v.Warnings = append(append([]string{}, tr.Warnings...), v.Warnings...)
				return classifyResult{tr, v}, nil
			},
			func(_ int, name string, r classifyResult) error {
				if o.format == formatJSON {
					return writeJSONLine(bw, classifyJSON(name, r))
				}
				rows = append(rows, classifyRow{name, r})
				return nil
			})
		if o.format == formatTable && len(rows) > 0 {
			if werr := writeClassifyTable(bw, rows, m.Source); werr != nil {
				return werr
			}
		}
		return err
	})
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
	return l
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

type classifyRow struct {
	name string
	r    classifyResult
}

func writeClassifyTable(w io.Writer, rows []classifyRow, model string) error {
	classes := rows[0].r.v.Classes
	t := newTable(w)
	head := []string{"FILE", "VERDICT"}
	for _, c := range classes {
		head = append(head, "P("+c+")")
	}
	head = append(head, "DRIVEN BY")
	t.row(head...)
	for _, row := range rows {
		v := row.r.v
		cells := []string{row.name, v.Class}
		for i := range classes {
			cells = append(cells, fmt.Sprintf("%.2f", v.Probabilities[i]))
		}
		var ds []string
		for _, d := range v.Drivers {
			ds = append(ds, fmt.Sprintf("%s=%s", d.Feature, human(d.Value)))
		}
		cells = append(cells, strings.Join(ds, ", "))
		t.row(cells...)
	}
	if err := t.flush(); err != nil {
		return err
	}
	var notes []string
	for _, row := range rows {
		v := row.r.v
		for _, r := range v.Reasons {
			notes = append(notes, fmt.Sprintf("  %s: undetermined (most likely %s): %s", row.name, v.Top, r))
		}
		for _, wn := range v.Warnings {
			notes = append(notes, fmt.Sprintf("  %s: %s", row.name, wn))
		}
	}
	if len(notes) > 0 {
		fmt.Fprintln(w, "\nnotes:")
		for _, n := range notes {
			fmt.Fprintln(w, n)
		}
	}
	fmt.Fprintf(w, "\nmodel: %s\n%s\n", model, caution)
	return nil
}
