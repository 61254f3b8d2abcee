package main

import (
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/benchmarks"
	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
)

func init() { addCommand(newTrainCmd) }

// cvTrees is the default size of the cross-validation fold forests: the
// held-out accuracy of a forest levels off long before that (measured on
// the reference set: 20 and 50 trees per fold give leave-one-family-out
// accuracies within 0.3 points of each other), and leave-one-family-out
// grows one forest per family.
const cvTrees = 30

type trainOptions struct {
	in            inputOptions
	reference     bool
	labels        string
	withReference bool
	seed          uint64
	folds         string
	cvTrees       int
	trees         int
	perClass      int
	out           string
}

func newTrainCmd(e *env) *cobra.Command {
	var o trainOptions
	c := &cobra.Command{
		Use:   "train (--reference | --labels CSV [--with-reference]) -o MODEL",
		Short: "Train a classifier model on the reference systems or on labelled traces",
		Long: `Train the tree-ensemble classifier and write a model file.

--reference trains on the built-in reference set: every reference system
('tracesift systems') drawn with randomised parameters over ranges that
cross its regimes (a chaotic map's periodic windows included), a randomly
chosen observed coordinate, lengths from 512 to 20000 samples, and a
randomly drawn measurement chain: a quarter of the series clean, the others
through sensor transfer curves, instrument low-pass, white, AR(1), 1/f or
heavy-tailed measurement noise at 10–40 dB SNR (denser towards 10 dB), slow
drift, and converters of 8–4096 levels that use part of their range or
clip at the rails. Labels follow each system's rule along each series' own
orbit: for deterministic systems the sign of the largest Lyapunov exponent
computed from the equations from the series' own initial condition (a draw
in a periodic window is regular); deterministic draws that hold fewer than
ten cycles are left out.

--labels CSV trains on your own captures: a CSV with the header file,class
and one row per trace; paths are relative to the labels file, classes are
chaotic, regular or stochastic. --with-reference adds the reference set.

Before training the final model, held-out validation estimates its
accuracy on kinds of dynamics it has never seen. With --reference the
default is leave-one-family-out: every family of reference systems (systems
that share their equations, e.g. the Lorenz flow and its periodic preset)
is predicted by a forest trained on all the other families. With --labels
alone the default is 5-fold cross-validation grouped by file (--folds N
chooses N folds grouped by family or file for either; --folds 0 skips
validation). The command prints the pooled confusion matrix, accuracy
overall, per family, per length and per measurement SNR, how often chaos
and noise are taken for each other, the calibration of the probabilities
(Brier score, expected calibration error and the reliability table), and
the permutation importance of the features on the held-out rows; the
figures are stored in the model file. The same data and seed give a
byte-identical model file.`,
		Example: `  tracesift train --reference --seed 1 -o models/default.model
  tracesift train --labels testdata/demo/labels.csv --with-reference -o lab.model
  tracesift train --labels captures/labels.csv --folds 10 --seed 7 -o lab.model`,
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, _ []string) error {
			return runTrain(e, &o)
		},
	}
	f := c.Flags()
	o.in.bind(f, features.MinLength)
	f.BoolVar(&o.reference, "reference", false, "train on the built-in reference set")
	f.StringVar(&o.labels, "labels", "", "CSV `file` with header file,class labelling your own traces")
	f.BoolVar(&o.withReference, "with-reference", false, "with --labels: add the reference set to your traces")
	f.Uint64Var(&o.seed, "seed", 1, "random seed of the reference set, the folds and the forest")
	f.StringVar(&o.folds, "folds", "auto", "held-out validation: family (leave one family out), N (N folds grouped by family or file), 0 (none), auto (family with --reference, 5 with --labels alone)")
	f.IntVar(&o.cvTrees, "cv-trees", cvTrees, "trees in each held-out forest")
	f.IntVar(&o.trees, "trees", 200, "number of trees in the forest")
	f.IntVar(&o.perClass, "per-class", 1500, "reference series per class (chaotic entries draw 30% more; see classifier.ReferencePlan)")
	f.StringVarP(&o.out, "output", "o", "", "model file to write (required)")
	return c
}

func runTrain(e *env, o *trainOptions) error {
	switch {
	case o.out == "":
		return usagef("no output: give -o MODEL")
	case o.reference && o.labels != "":
		return usagef("--reference and --labels exclude each other (use --labels with --with-reference for both)")
	case !o.reference && o.labels == "":
		return usagef("nothing to train on: give --reference or --labels CSV")
	case o.withReference && o.labels == "":
		return usagef("--with-reference goes with --labels")
	case o.cvTrees < 1:
		return usagef("--cv-trees %d: want at least 1", o.cvTrees)
	case o.trees < 1:
		return usagef("--trees %d: want at least 1", o.trees)
	case o.perClass < 10:
		return usagef("--per-class %d: want at least 10", o.perClass)
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	folds, err := o.foldCount()
	if err != nil {
		return err
	}
	if dir := filepath.Dir(o.out); dir != "" {
		if st, err := os.Stat(dir); err != nil || !st.IsDir() {
			return fmt.Errorf("%s: the output directory %s does not exist", o.out, dir)
		}
	}

	var ds classifier.Dataset
	var descr []string
	var lengths []int      // samples of each row's series
	var snrLabels []string // measurement SNR range of each row
	if o.labels != "" {
		lab, n, err := labelledDataset(e, o)
		if err != nil {
			return err
		}
		ds = lab
		descr = append(descr, lab.Description)
		lengths = append(lengths, n...)
		for range n {
			snrLabels = append(snrLabels, benchmarks.SNRRangeOrder[len(benchmarks.SNRRangeOrder)-1])
		}
	}
	if o.reference || o.withReference {
		fmt.Fprintf(e.stderr, "building the reference set (seed %d)...\n", o.seed)
		ropts := classifier.ReferenceOptions{Seed: o.seed, PerClass: o.perClass}
		plan, err := classifier.ReferencePlan(ropts)
		if err != nil {
			return err
		}
		ropts.Progress = newProgress(e, len(plan), "reference series")
		ref, kept, err := classifier.BuildReference(ropts, features.Options{Seed: o.seed})
		if err != nil {
			return err
		}
		descr = append(descr, ref.Description)
		if ds.Rows() == 0 {
			ds = ref
		} else {
			ds.X = append(ds.X, ref.X...)
			ds.Y = append(ds.Y, ref.Y...)
			ds.Groups = append(ds.Groups, ref.Groups...)
		}
		for _, s := range kept {
			lengths = append(lengths, s.N)
			snrLabels = append(snrLabels, benchmarks.SNRRange(s.SNR()))
		}
	}
	ds.Description = strings.Join(descr, "; plus ")

	cfg := classifier.Config{Trees: o.trees, Seed: o.seed, Schema: currentSchema()}
	cvCfg := cfg
	cvCfg.Trees = min(o.trees, o.cvTrees)
	var val *classifier.Validation
	var imp []classifier.Importance
	if folds != 0 {
		what := fmt.Sprintf("%d folds grouped by family or file", folds)
		method := fmt.Sprintf("%d-fold cross-validation grouped by family or file", folds)
		if folds == classifier.LeaveOneGroupOut {
			what, method = "leaving one family out at a time", "leave-one-family-out"
		}
		fmt.Fprintf(e.stderr, "validating (%s, %d-tree forests)...\n", what, cvCfg.Trees)
		rng := rand.New(rand.NewPCG(o.seed, seedStream))
		sum := map[string]float64{}
		r, err := classifier.CrossValidateEach(ds, folds, cvCfg, func(_ int, m *classifier.Model, test classifier.Dataset) error {
			fi, err := classifier.PermutationImportance(m, test, 2, rng)
			for _, x := range fi {
				sum[x.Feature] += x.Drop * float64(test.Rows())
			}
			return err
		})
		if err != nil {
			return fmt.Errorf("validation: %w", err)
		}
		for _, name := range ds.Features {
			imp = append(imp, classifier.Importance{Feature: name, Drop: sum[name] / float64(ds.Rows())})
		}
		sort.SliceStable(imp, func(i, j int) bool { return imp[i].Drop > imp[j].Drop })
		strata := []classifier.Stratification{
			{Name: "length", Labels: lengthRanges(lengths), Order: benchmarks.LengthRangeOrder},
			{Name: "snr", Labels: snrLabels, Order: benchmarks.SNRRangeOrder},
		}
		if groups := distinct(ds.Groups); groups <= maxReportedGroups {
			strata = append([]classifier.Stratification{{Name: "family", Labels: ds.Groups}}, strata...)
		}
		v, err := classifier.Validate(r, ds, method, strata...)
		if err != nil {
			return fmt.Errorf("validation: %w", err)
		}
		val = &v
	}
	fmt.Fprintf(e.stderr, "training the final forest on %d series...\n", ds.Rows())
	m, err := classifier.Train(ds, cfg)
	if err != nil {
		return err
	}
	m.Validation = val
	if err := m.Save(o.out); err != nil {
		return err
	}
	return writeTrainReport(e.stdout, o.out, ds, m, imp)
}

// maxReportedGroups is the most families or files the per-group breakdown
// lists (beyond that it would drown the summary).
const maxReportedGroups = 200

// foldCount resolves --folds to a fold count for CrossValidateEach
// (classifier.LeaveOneGroupOut for family), or 0 for none.
func (o *trainOptions) foldCount() (int, error) {
	switch strings.ToLower(strings.TrimSpace(o.folds)) {
	case "auto", "":
		if o.reference || o.withReference {
			return classifier.LeaveOneGroupOut, nil
		}
		return 5, nil
	case "family", "families":
		return classifier.LeaveOneGroupOut, nil
	}
	k, err := strconv.Atoi(o.folds)
	if err != nil || k == 1 || k < 0 {
		return 0, usagef("--folds %q: want family, auto, 0 (no validation) or a fold count of at least 2", o.folds)
	}
	return k, nil
}

func lengthRanges(n []int) []string {
	out := make([]string, len(n))
	for i, v := range n {
		out[i] = benchmarks.LengthRange(v)
	}
	return out
}

func distinct(s []string) int {
	seen := map[string]bool{}
	for _, v := range s {
		seen[v] = true
	}
	return len(seen)
}

// labelledDataset reads the labels file and measures every trace it names.
func labelledDataset(e *env, o *trainOptions) (classifier.Dataset, []int, error) {
	f, err := os.Open(o.labels)
	if err != nil {
		return classifier.Dataset{}, nil, fmt.Errorf("%s: %w", o.labels, err)
	}
	defer f.Close()
	labels, err := classifier.ReadLabels(f, o.labels)
	if err != nil {
		return classifier.Dataset{}, nil, err
	}
	base := filepath.Dir(o.labels)
	paths := make([]string, len(labels))
	for i, l := range labels {
		p := l.Path
		if !filepath.IsAbs(p) {
			p = filepath.Join(base, p)
		}
		if _, err := os.Stat(p); err != nil {
			return classifier.Dataset{}, nil, fmt.Errorf("%s line %d: %s: no such file (paths are relative to the labels file)", o.labels, l.Line, l.Path)
		}
		paths[i] = p
	}
	ds := classifier.Dataset{Features: features.Names()}
	var lengths []int
	err = batch(e, "traces", paths,
		func(i int, p string) (features.Vector, error) {
			// Failures name the labels file's line as well as the trace.
			at := fmt.Sprintf("%s line %d", o.labels, labels[i].Line)
			tr, err := readTrace(e, p, &o.in)
			if err != nil {
				return features.Vector{}, fmt.Errorf("%s: %w", at, err)
			}
			v, err := features.Extract(tr.Values, features.Options{Seed: o.seed})
			if err != nil {
				return features.Vector{}, fmt.Errorf("%s: %s: %w", at, p, err)
			}
			return v, nil
		},
		func(i int, p string, v features.Vector) error {
			ds.X = append(ds.X, v.Values)
			ds.Y = append(ds.Y, labels[i].Class)
			ds.Groups = append(ds.Groups, p)
			lengths = append(lengths, v.N)
			return nil
		})
	if err != nil {
		return classifier.Dataset{}, nil, fmt.Errorf("%s: some labelled traces could not be read; fix or remove them (errors above)", o.labels)
	}
	count := map[string]int{}
	for _, y := range ds.Y {
		count[y]++
	}
	var parts []string
	for _, c := range classifier.Classes {
		if count[c] > 0 {
			parts = append(parts, fmt.Sprintf("%d %s", count[c], c))
		}
	}
	ds.Description = fmt.Sprintf("%d labelled traces from %s (%s)", ds.Rows(), o.labels, strings.Join(parts, ", "))
	return ds, lengths, nil
}

func writeTrainReport(w io.Writer, out string, ds classifier.Dataset, m *classifier.Model, imp []classifier.Importance) error {
	fmt.Fprintf(w, "model written to %s\n", out)
	fmt.Fprintf(w, "training set: %s\n", ds.Description)
	fmt.Fprintf(w, "forest: %d trees, %d nodes, seed %d, feature schema v%d %s\n", m.NumTrees(), m.NumNodes(), m.Config.Seed, m.Config.Schema.Version, m.Config.Schema.Hash)
	if d := m.Training.Dropped; len(d) > 0 {
		fmt.Fprintf(w, "left out of the model (missing in every training series, so classify never asks for them): %s\n", strings.Join(d, ", "))
	}
	fmt.Fprintf(w, "out-of-bag accuracy: %s (series of the families seen in training; the held-out figures below are the ones to expect on new kinds of dynamics)\n", human(m.OOB.Accuracy))
	v := m.Validation
	if v == nil {
		return nil
	}
	if err := writeValidation(w, v); err != nil {
		return err
	}
	if len(imp) > 0 {
		fmt.Fprintf(w, "\npermutation importance on the held-out rows (drop in accuracy when the feature is shuffled):\n")
		t := newTable(w)
		t.row("FEATURE", "DROP")
		for i, x := range imp {
			if i >= 15 {
				break
			}
			t.row(x.Feature, fmt.Sprintf("%.4f", x.Drop))
		}
		if err := t.flush(); err != nil {
			return err
		}
	}
	return nil
}

// writeValidation prints a held-out validation: headline, confusion matrix,
// breakdowns and calibration.
func writeValidation(w io.Writer, v *classifier.Validation) error {
	ev, o := v.Matrix, v.Overall
	fmt.Fprintf(w, "\n%s (%d-tree forests; no series of a held-out family or file is in its forest's training set):\n", v.Method, v.Trees)
	fmt.Fprintf(w, "accuracy %.4f over %d series; chaos vs noise %.4f (%d chaotic or stochastic series not taken for the other); %d undetermined (accuracy on the rest %.4f)\n",
		o.Accuracy, o.Rows, o.ChaosNoise, o.ChaosNoiseRows, o.Undetermined, o.DeterminedAccuracy)
	fmt.Fprintf(w, "calibration: Brier score %.4f, expected calibration error %.4f\n\n", v.Calibration.Brier, v.Calibration.ECE)
	t := newTable(w)
	head := []string{"TRUE \\ PREDICTED"}
	head = append(head, ev.Classes...)
	head = append(head, "RECALL")
	t.row(head...)
	for i, c := range ev.Classes {
		cells := []string{c}
		for j := range ev.Classes {
			cells = append(cells, fmt.Sprint(ev.Confusion[i][j]))
		}
		cells = append(cells, fmt.Sprintf("%.3f", ev.Recall[i]))
		t.row(cells...)
	}
	prec := []string{"PRECISION"}
	for j := range ev.Classes {
		prec = append(prec, fmt.Sprintf("%.3f", ev.Precision[j]))
	}
	t.row(prec...)
	if err := t.flush(); err != nil {
		return err
	}
	for _, st := range v.Strata {
		fmt.Fprintf(w, "\nby %s:\n", st.Name)
		t = newTable(w)
		t.row(strings.ToUpper(st.Name), "CLASSES", "SERIES", "ACCURACY", "CHAOS VS NOISE", "UNDETERMINED")
		for _, sc := range st.Scores {
			cn := "—"
			if sc.ChaosNoiseRows > 0 {
				cn = fmt.Sprintf("%.3f", sc.ChaosNoise)
			}
			t.row(sc.Label, strings.Join(sc.Classes, "+"), fmt.Sprint(sc.Rows), fmt.Sprintf("%.3f", sc.Accuracy), cn, fmt.Sprint(sc.Undetermined))
		}
		if err := t.flush(); err != nil {
			return err
		}
	}
	fmt.Fprintf(w, "\nreliability (top-class probability against the accuracy it delivers):\n")
	t = newTable(w)
	t.row("PROBABILITY", "SERIES", "MEAN PROBABILITY", "ACCURACY")
	for _, b := range v.Calibration.Bins {
		if b.Rows == 0 {
			continue
		}
		t.row(fmt.Sprintf("%.1f–%.1f", b.Lo, b.Hi), fmt.Sprint(b.Rows), fmt.Sprintf("%.3f", b.Confidence), fmt.Sprintf("%.3f", b.Accuracy))
	}
	return t.flush()
}
