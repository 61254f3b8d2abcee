package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/features/surrogate"
	"github.com/tracesift/tracesift/internal/atomicfile"
)

func init() { addCommand(newSurrogateCmd) }

type surrogateOptions struct {
	in       inputOptions
	method   string
	count    int
	stats    []string
	seed     uint64
	format   string
	plot     string
	alpha    float64
	side     string
	endMatch bool
}

func newSurrogateCmd(e *env) *cobra.Command {
	var o surrogateOptions
	c := &cobra.Command{
		Use:   "surrogate FILE",
		Short: "Test features against surrogate data that share the trace's spectrum and values",
		Long: `Compare the value of one or more features of a trace with their distribution
over surrogate series that keep what a linear-noise explanation would keep
and destroy the rest. Methods and their null hypotheses:

  shuffle  independent values: keeps the values, destroys all temporal order
  ft       linear Gaussian process: keeps the power spectrum exactly
  aaft     static monotone transform of a linear Gaussian process
  iaaft    same as aaft, matching values exactly and the spectrum closely
  gauss    keeps the rank order, replaces the values by Gaussian quantiles
           (removes fat tails, keeps temporal order)

For each statistic it reports the observed value, the surrogate mean and
standard deviation, the z-score, rank p-values p = (1 + #{surrogates at
least as extreme})/(M + 1), and the Holm-adjusted p when several statistics
are tested. FT-based surrogates of a trace whose two ends differ get
spurious high frequencies: --end-match tests the longest sub-series whose
ends match instead, and the report says what was cut.

Statistics are feature names ('tracesift features --list'), e.g. nl_trev_1,
nl_fc_rho_1, nl_fc_drop_10, op_ent_d4, hv_tail_exprate, nl_div_rate, and the
network features of the extended families: recurrence networks (rn_tdim,
rn_trans, rn_path_mean, ...; about 0.3 s per series at 4096 samples) and
ordinal partition networks (opn_tent, opn_forb_frac, opn_self, ...).`,
		Example: `  tracesift surrogate testdata/demo/stressed/D01_stressed_Vg1.20.csv --method iaaft --count 99 --stat nl_trev_1 --stat nl_fc_drop_10
  tracesift generate henon --n 2000 | tracesift surrogate - --stat nl_trev_1 --format json
  tracesift surrogate trace.csv --stat hv_tail_exprate --plot hv_tail_exprate.png --end-match
  tracesift surrogate testdata/demo/stressed/D04_stressed_Vg1.20.csv.gz --stat opn_tent --stat rn_tdim --count 39`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			return runSurrogate(e, args[0], &o)
		},
	}
	f := c.Flags()
	o.in.bind(f, features.MinLength)
	f.StringVar(&o.method, "method", string(surrogate.IAAFT), "surrogate method: "+strings.Join(methodNames(), ", "))
	f.IntVar(&o.count, "count", surrogate.DefaultCount, "number of surrogates M (39 is the least for a two-sided test at α = 0.05)")
	f.StringSliceVar(&o.stats, "stat", nil, "feature to test (repeatable or comma-separated; required)")
	f.Uint64Var(&o.seed, "seed", 1, "random seed; the same seed gives the same surrogates on any number of cores")
	f.StringVar(&o.format, "format", formatTable, "output format: table or json (one JSON object with key \"tests\")")
	f.StringVar(&o.plot, "plot", "", "write a PNG of each statistic's surrogate distribution with the observed value marked (with several statistics the name is added before the extension)")
	f.Float64Var(&o.alpha, "alpha", 0.05, "significance level")
	f.StringVar(&o.side, "side", string(surrogate.TwoSided), "alternative: two-sided, upper or lower")
	f.BoolVar(&o.endMatch, "end-match", false, "test the longest sub-series (≥ 90% of the trace) whose ends match, to avoid end-effect artefacts of FT-based surrogates")
	return c
}

func methodNames() []string {
	var out []string
	for _, m := range surrogate.Methods() {
		out = append(out, string(m))
	}
	return out
}

func runSurrogate(e *env, file string, o *surrogateOptions) error {
	if err := checkFormat(o.format, formatTable, formatJSON); err != nil {
		return err
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	method, err := surrogate.ParseMethod(o.method)
	if err != nil {
		return usageError{err}
	}
	if o.count < 1 {
		return usagef("--count %d: want at least 1 surrogate", o.count)
	}
	if !(o.alpha > 0 && o.alpha < 1) {
		return usagef("--alpha %g: want 0 < alpha < 1", o.alpha)
	}
	if len(o.stats) == 0 {
		return usagef("no statistic: give --stat NAME (e.g. --stat nl_trev_1); 'tracesift features --list' shows the names")
	}
	var stats []surrogate.Statistic
	seen := map[string]bool{}
	for _, name := range o.stats {
		name = strings.TrimSpace(name)
		if _, ok := features.Lookup(name); !ok {
			return usagef("--stat %q: unknown feature; valid: %s", name, strings.Join(features.AllNames(), ", "))
		}
		if seen[name] {
			continue
		}
		seen[name] = true
		stats = append(stats, surrogate.Statistic{Name: name, Func: func(x []float64) (float64, error) {
			return features.Value(name, x, features.Options{Seed: o.seed})
		}})
	}
	tr, err := readTrace(e, file, &o.in)
	if err != nil {
		return err
	}
	opts := surrogate.TestOptions{
		Options: surrogate.Options{Method: method, Count: o.count, Seed: o.seed, EndMatch: o.endMatch},
		Alpha:   o.alpha,
		Side:    surrogate.Side(o.side),
	}
	opts.Progress = newProgress(e, o.count, "surrogates")
	rep, err := surrogate.Test(tr.Values, stats, opts)
	if err != nil {
		return fmt.Errorf("%s: %w", tr.Source, err)
	}
	// The results go out first, so a plot that cannot be written does not
	// lose them.
	if o.format == formatJSON {
		err = writeJSONLine(e.stdout, struct {
			File string `json:"file"`
			*surrogate.Report
		}{file, rep})
	} else {
		err = writeSurrogateTable(e.stdout, file, rep)
	}
	if err != nil {
		return err
	}
	if o.plot != "" {
		return writeSurrogatePlots(o.plot, rep)
	}
	return nil
}

func writeSurrogatePlots(path string, rep *surrogate.Report) error {
	for _, r := range rep.Tests {
		p := path
		if len(rep.Tests) > 1 {
			ext := filepath.Ext(path)
			p = strings.TrimSuffix(path, ext) + "-" + r.Stat + ext
		}
		if err := atomicfile.Write(p, func(w io.Writer) error {
			return surrogate.Plot(w, r, surrogate.PlotOptions{})
		}); err != nil {
			return fmt.Errorf("plot: %w (the results above were computed)", err)
		}
	}
	return nil
}

func writeSurrogateTable(w io.Writer, file string, rep *surrogate.Report) error {
	fmt.Fprintf(w, "%s: %d samples tested", file, rep.Used)
	if rep.Truncation != nil && rep.Used < rep.N {
		fmt.Fprintf(w, " of %d (end matching)", rep.N)
	}
	fmt.Fprintf(w, "\nnull hypothesis (%s): %s\n", rep.Method, rep.NullHypothesis)
	fmt.Fprintf(w, "%d surrogates, seed %d, %s test at α = %s (needs at least %d surrogates)\n\n",
		rep.Count, rep.Seed, rep.Side, human(rep.Alpha), rep.MinSurrogates)
	t := newTable(w)
	t.row("STATISTIC", "OBSERVED", "SURROGATES (MEAN ± SD)", "Z", "P", "P (HOLM)", "VERDICT")
	for _, r := range rep.Tests {
		verdict := "consistent with the null"
		switch {
		case r.Error != "":
			verdict = "failed on the data: " + r.Error
		case r.Significant:
			verdict = "null rejected"
		}
		t.row(r.Stat, human(r.Observed), human(r.Mean)+" ± "+human(r.SD), human(r.Z), human(r.P), human(r.PHolm), verdict)
	}
	if err := t.flush(); err != nil {
		return err
	}
	for _, warn := range rep.Warnings {
		fmt.Fprintf(w, "warning: %s\n", warn)
	}
	for _, r := range rep.Tests {
		for _, warn := range r.Warnings {
			fmt.Fprintf(w, "warning (%s): %s\n", r.Stat, warn)
		}
	}
	return nil
}
