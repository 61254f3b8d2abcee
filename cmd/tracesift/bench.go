package main

import (
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/benchmarks"
	"github.com/tracesift/tracesift/models"
)

func init() { addCommand(newBenchCmd) }

type benchOptions struct {
	quick, full bool
	seed        uint64
	model       string
	out         string
}

func newBenchCmd(e *env) *cobra.Command {
	var o benchOptions
	c := &cobra.Command{
		Use:   "bench [--quick|--full] -o DIR",
		Short: "Run the reference benchmark: invariants, classification accuracy, throughput",
		Long: `Run tracesift's reference suite and write its report into DIR.

1. Invariant recovery: for each reference system and each estimator with a
   published or analytic value (largest Lyapunov exponent, correlation
   dimension, DFA, R/S and spectral exponents, HVG mean degree and tail
   rate, NVG degree exponent, permutation entropy, statistical complexity,
   sample entropy, lag-1 autocorrelation), the median estimate and its
   spread over several seeds and lengths, the error, and whether it is
   within the tolerance the project's tests use, with the source of every
   value beside it.
2. Classification: accuracy, confusion matrices, the undetermined rate,
   chaotic-versus-stochastic accuracy and a per-system breakdown against
   series length and observational SNR, on reference series drawn with
   seeds the model never saw (plan seed 1000 + --seed).
3. Leave-one-family-out validation: a fresh reference set (plan seed
   2000 + --seed, every family, the full recording chain) in which every
   family of reference systems is predicted by a forest trained on all the
   others: accuracy per family, length and SNR, chaos versus noise, and the
   calibration of the probabilities (Brier score, expected calibration
   error, reliability diagram). This is what to expect on dynamics the
   model has never seen; it retrains small forests and does not use
   --model.
4. Throughput: samples per second of HVG and NVG construction, feature
   extraction and screening from 10^3 samples up (10^5 with --quick, 10^6
   with --full), with the fitted exponent p of time ~ n^p. Timings depend on
   the machine and its load and are marked so in the JSON; everything else
   is identical for the same seed and model.

DIR (created if missing) receives summary.md (readable tables with sources
and the screening caution), results.json (everything, machine-readable,
missing values as null) and PNG plots: invariant recovery, accuracy against
length and SNR, the reliability diagram, HVG degree distributions, the
complexity–entropy plane and throughput. Every file is written atomically.

--quick (the default) is a short run on two cores: three seeds per
invariant, one series per reference system at lengths 1000 and 5000, clean
and at 10 dB SNR, leave-one-family-out on 120 series per class with
10-tree forests, throughput up to 10^5 samples. --full is the thorough run
behind the figures quoted in the README (eight seeds at two lengths per
invariant; three to six series per system at lengths 500–20000 and SNR
clean/40/20/10 dB; leave-one-family-out on 900 series per class with
30-tree forests; throughput up to 10^6 samples); it takes several minutes.

The verdicts measured here are a screening aid, not a device qualification
result: defer to your laboratory's qualification procedures and the
applicable reliability standards.`,
		Example: `  tracesift bench -o bench-out
  tracesift bench --full --seed 1 -o bench-full
  tracesift bench --quick --model lab.model -o bench-lab`,
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, _ []string) error {
			return runBench(e, &o)
		},
	}
	f := c.Flags()
	f.BoolVar(&o.quick, "quick", false, "quick run, under a minute on two cores (the default)")
	f.BoolVar(&o.full, "full", false, "thorough run behind the README's figures (several minutes)")
	f.Uint64Var(&o.seed, "seed", 1, "seed of every series; the classification plan uses seed 1000 + this")
	f.StringVar(&o.model, "model", "", "model `file` to measure (default: the embedded default model)")
	f.StringVarP(&o.out, "output", "o", "", "output `directory` (required; created if missing)")
	c.MarkFlagsMutuallyExclusive("quick", "full")
	return c
}

func runBench(e *env, o *benchOptions) error {
	if o.out == "" {
		return usagef("no output directory: give -o DIR")
	}
	if st, err := os.Stat(o.out); err == nil && !st.IsDir() {
		return usagef("-o %s: exists and is not a directory", o.out)
	}
	m, err := loadModel(o.model)
	if err != nil {
		if o.model == "" {
			return fmt.Errorf("%w (give --model FILE, or build the default with: %s)", err, models.DefaultCommand)
		}
		return err
	}
	scale := benchmarks.Quick
	if o.full {
		scale = benchmarks.Full
	}
	opts := benchmarks.Options{Scale: scale, Seed: o.seed}
	var (
		stage string
		bar   func(done, total int)
	)
	opts.Progress = func(s string, done, total int) {
		if s != stage {
			stage = s
			bar = newProgress(e, total, s)
		}
		if bar != nil {
			bar(done, total)
		}
	}
	fmt.Fprintf(e.stderr, "running the %s benchmark (seed %d, model %s)...\n", scale, o.seed, m.Source)
	r, err := benchmarks.Run(m, opts)
	if err != nil {
		return err
	}
	written, err := benchmarks.WriteAll(o.out, r)
	if err != nil {
		return err
	}
	return writeBenchSummary(e.stdout, o.out, written, r)
}

// writeBenchSummary prints the headline figures for people.
func writeBenchSummary(w io.Writer, dir string, written []string, r *benchmarks.Result) error {
	names := make([]string, len(written))
	for i, p := range written {
		names[i] = filepath.Base(p)
	}
	fmt.Fprintf(w, "wrote %s: %s\n", dir, strings.Join(names, ", "))
	if len(r.Invariants) > 0 {
		pass := 0
		var missed []string
		for _, row := range r.Invariants {
			if row.Within {
				pass++
			} else {
				missed = append(missed, row.ID)
			}
		}
		fmt.Fprintf(w, "invariants: %d of %d within tolerance", pass, len(r.Invariants))
		if len(missed) > 0 {
			fmt.Fprintf(w, " (outside: %s)", strings.Join(missed, ", "))
		}
		fmt.Fprintln(w)
	}
	if c := r.Classification; c != nil {
		s := c.Overall
		fmt.Fprintf(w, "classification: %d series, accuracy %s, undetermined %s, chaotic vs stochastic %s\n",
			s.Series, percent(float64(s.Accuracy)), percent(float64(s.UndeterminedRate)), percent(float64(s.ChaosNoise)))
		t := newTable(w)
		head := []string{"  LENGTH"}
		head = append(head, c.SNRLabels...)
		t.row(head...)
		for li, l := range c.Lengths {
			cells := []string{fmt.Sprintf("  %d", l)}
			for si := range c.SNRs {
				cells = append(cells, percent(float64(c.Cells[li*len(c.SNRs)+si].Accuracy)))
			}
			t.row(cells...)
		}
		if err := t.flush(); err != nil {
			return err
		}
	}
	if t := r.Throughput; t != nil && len(t.Sizes) > 0 {
		n := t.Sizes[len(t.Sizes)-1]
		var parts []string
		for _, op := range t.Operations {
			for _, p := range op.Points {
				if p.N == n {
					parts = append(parts, fmt.Sprintf("%s %s samples/s (p = %.2f)", op.Name, rate(float64(p.SamplesPerSecond)), float64(op.Exponent)))
				}
			}
		}
		fmt.Fprintf(w, "throughput at n = %d (machine-dependent): %s\n", n, strings.Join(parts, ", "))
	}
	if el := r.Elapsed; el != nil {
		fmt.Fprintf(w, "wall time %s s\n", human(float64(el.Total)))
	}
	return nil
}

// rate formats a throughput for people: three significant digits with a
// k or M suffix.
func rate(v float64) string {
	switch {
	case math.IsNaN(v):
		return "—"
	case v >= 1e6:
		return fmt.Sprintf("%.3g M", v/1e6)
	case v >= 1e3:
		return fmt.Sprintf("%.3g k", v/1e3)
	}
	return fmt.Sprintf("%.3g", v)
}

// percent formats a fraction as a percentage for people.
func percent(v float64) string {
	if math.IsNaN(v) {
		return "—"
	}
	return fmt.Sprintf("%.1f%%", 100*v)
}
