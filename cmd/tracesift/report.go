package main

import (
	"errors"
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/report"
)

func init() { addCommand(newReportCmd) }

type reportOptions struct {
	in         inputOptions
	out        string
	model      string
	seed       uint64
	surrogates int
	stats      []string
	order      int
}

func newReportCmd(e *env) *cobra.Command {
	var o reportOptions
	c := &cobra.Command{
		Use:   "report FILE -o report.html",
		Short: "Write a self-contained HTML report of one trace",
		Long: `Analyse one trace and write a single self-contained HTML file (inline
figures and styles, nothing loaded from the network) that reads well on
screen and on paper:

  - the trace: file, samples, sample interval and units;
  - the verdict with its class probabilities, the features that drove it,
    warnings, and the screening caution;
  - the trace itself and the density of its increments against the fitted
    Gaussian on a log scale (fat tails show);
  - horizontal and natural visibility-graph degree distributions, with the
    i.i.d. law and the fitted exponential tail (HVG) and power law (NVG);
  - the local clustering of both graphs;
  - the trace on the complexity–entropy plane among reference systems;
  - the surrogate test of determinism of 'classify --significance'
    (nonlinear forecast gain and time-reversal asymmetry at the embedding
    delay against IAAFT surrogates, one-sided, Holm-adjusted), with what
    it says about the verdict, and optional rank tests of any feature
    (--stat) against surrogates;
  - methods, references and the whole feature vector.

The surrogate tests run on the middle 4096 samples of longer traces. By
default the determinism test uses the least number of surrogates with which
it can reject at α = 0.05 after Holm's adjustment over its two one-sided
statistics (39); feature tests given with --stat use the least with which
one of them can (⌈2m/α − 1⌉ for m two-sided tests: 159 for four).
--surrogates M sets both. The same file, model and seed give the same
bytes: the report holds no date.

The verdict is a screening aid, not a device qualification result.`,
		Example: `  tracesift report testdata/demo/stressed/D01_stressed_Vg1.20.csv -o D01.html
  tracesift report trace.csv --model lab.model --seed 7 -o trace.html
  tracesift report trace.csv --surrogates -1 -o quick.html
  tracesift report trace.csv --stat op_ent_d4 --stat hv_tail_exprate -o trace.html`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			return runReport(e, args[0], &o)
		},
	}
	f := c.Flags()
	o.in.bind(f, features.MinLength)
	f.StringVarP(&o.out, "output", "o", "", "HTML file to write (required; - for stdout)")
	f.StringVar(&o.model, "model", "", "model file (default: the embedded model)")
	f.Uint64Var(&o.seed, "seed", 1, "seed of the feature estimators and the surrogates")
	f.IntVar(&o.surrogates, "surrogates", 0, "number of IAAFT surrogates of every test (0: the least that allows significance after Holm's adjustment; -1 skips the tests)")
	f.StringSliceVar(&o.stats, "stat", nil, "feature also tested against surrogates (repeatable; default none)")
	f.IntVar(&o.order, "order", report.DefaultOrder, "ordinal-pattern order of the complexity–entropy plane (3–7)")
	return c
}

func runReport(e *env, file string, o *reportOptions) error {
	if o.out == "" {
		return usagef("no output: give -o report.html")
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	if o.surrogates < -1 {
		return usagef("--surrogates %d: want -1 (skip), 0 (automatic) or a positive count", o.surrogates)
	}
	for i, s := range o.stats {
		o.stats[i] = strings.TrimSpace(s)
	}
	opts := report.Options{
		Seed:       o.seed,
		Surrogates: o.surrogates,
		Stats:      o.stats,
		Order:      o.order,
		Generator:  "tracesift " + versionString(),
	}
	if o.surrogates > 0 {
		opts.StatSurrogates = o.surrogates
	}
	resolved, err := opts.Resolved()
	if errors.Is(err, features.ErrUnknownFeature) {
		return usageError{fmt.Errorf("%w; valid: %s", err, strings.Join(features.Names(), ", "))}
	}
	if err != nil {
		return usageError{err}
	}
	m, err := loadModel(o.model)
	if err != nil {
		return err
	}
	tr, err := readTrace(e, file, &o.in)
	if err != nil {
		return err
	}
	if resolved.Surrogates > 0 {
		total := resolved.Surrogates
		if len(resolved.Stats) > 0 {
			total += resolved.StatSurrogates
		}
		opts.Progress = newProgress(e, total, "surrogates")
	}
	rep, err := report.Build(tr, m, opts)
	if errors.Is(err, report.ErrOption) {
		return usageError{err}
	}
	if err != nil {
		return err
	}
	if err := writeOutput(e, o.out, rep.WriteHTML); err != nil {
		return err
	}
	if o.out != "-" {
		v := rep.Verdict
		fmt.Fprintf(e.stdout, "%s: %s → %s\n", file, verdictLine(v.Class, v.Top, v.Classes, v.Probabilities), o.out)
	}
	return nil
}

// verdictLine summarises a verdict for the terminal, e.g.
// "chaotic (p = 0.93)" or "undetermined (top: stochastic, p = 0.41)".
func verdictLine(class, top string, classes []string, probs []float64) string {
	p := 0.0
	for i, c := range classes {
		if c == top {
			p = probs[i]
		}
	}
	if class != top {
		return fmt.Sprintf("%s (top: %s, p = %.2f)", class, top, p)
	}
	return fmt.Sprintf("%s (p = %.2f)", class, p)
}
