package main

import (
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/spf13/cobra"

	"tracesift/classifier"
	"tracesift/features"
)

func init() { addCommand(newTrainCmd) }

// cvTrees is the size of the cross-validation fold forests.
const cvTrees = 100

type trainOptions struct {
	in            inputOptions
	reference     bool
	labels        string
	withReference bool
	seed          uint64
	folds         int
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
('tracesift systems') drawn with randomised parameters inside its regime,
lengths from 512 to 20000 samples and, for 60% of the series, Gaussian
observational noise at 10–40 dB SNR (denser towards 10 dB); labels follow
each system's rule (for
deterministic systems, the sign of the largest Lyapunov exponent computed
from the equations).

--labels CSV trains on your own captures: a CSV with the header file,class
and one row per trace; paths are relative to the labels file, classes are
chaotic, regular or stochastic. --with-reference adds the reference set.

Before training the final model, k-fold cross-validation (fold forests of
100 trees) estimates its
accuracy. Folds are grouped: all series of one reference system (or one
labelled file) stay in the same fold, so the figures say how the model does
on systems it has never seen. The command prints the pooled confusion
matrix, per-class precision and recall, accuracy per system, and the
permutation importance of the features on the held-out folds. The same
data and seed give a byte-identical model file.`,
		Example: `  tracesift train --reference --seed 1 -o models/default.model
  tracesift train --labels testdata/demo/labels.csv --with-reference -o lab.model
  tracesift train --labels captures/labels.csv --folds 10 --seed 7 -o lab.model`,
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, _ []string) error {
			return runTrain(e, &o)
		},
	}
	f := c.Flags()
	o.in.bind(f)
	f.BoolVar(&o.reference, "reference", false, "train on the built-in reference set")
	f.StringVar(&o.labels, "labels", "", "CSV `file` with header file,class labelling your own traces")
	f.BoolVar(&o.withReference, "with-reference", false, "with --labels: add the reference set to your traces")
	f.Uint64Var(&o.seed, "seed", 1, "random seed of the reference set, the folds and the forest")
	f.IntVar(&o.folds, "folds", 5, "cross-validation folds (0 skips cross-validation)")
	f.IntVar(&o.trees, "trees", 200, "number of trees in the forest")
	f.IntVar(&o.perClass, "per-class", 1000, "reference series per class")
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
	case o.folds == 1 || o.folds < 0:
		return usagef("--folds %d: want 0 (no cross-validation) or at least 2", o.folds)
	case o.trees < 1:
		return usagef("--trees %d: want at least 1", o.trees)
	case o.perClass < 10:
		return usagef("--per-class %d: want at least 10", o.perClass)
	}
	if err := o.in.validate(); err != nil {
		return err
	}
	if dir := filepath.Dir(o.out); dir != "" {
		if st, err := os.Stat(dir); err != nil || !st.IsDir() {
			return fmt.Errorf("%s: the output directory %s does not exist", o.out, dir)
		}
	}

	var ds classifier.Dataset
	var descr []string
	if o.labels != "" {
		lab, err := labelledDataset(e, o)
		if err != nil {
			return err
		}
		ds = lab
		descr = append(descr, lab.Description)
	}
	if o.reference || o.withReference {
		fmt.Fprintf(e.stderr, "building the reference set (seed %d)...\n", o.seed)
		ropts := classifier.ReferenceOptions{Seed: o.seed, PerClass: o.perClass}
		plan, err := classifier.ReferencePlan(ropts)
		if err != nil {
			return err
		}
		ropts.Progress = newProgress(e, len(plan), "reference series")
		ref, _, err := classifier.BuildReference(ropts, features.Options{Seed: o.seed})
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
	}
	ds.Description = strings.Join(descr, "; plus ")

	cfg := classifier.Config{Trees: o.trees, Seed: o.seed, Schema: currentSchema()}
	// The fold forests only estimate accuracy; cvTrees trees do that as
	// well as the full forest (the out-of-fold accuracy of a forest levels
	// off long before 100 trees; common practice) at half the cost.
	cvCfg := cfg
	cvCfg.Trees = min(o.trees, cvTrees)
	var cv *classifier.CVResult
	var imp []classifier.Importance
	if o.folds >= 2 {
		fmt.Fprintf(e.stderr, "cross-validating (%d folds grouped by system/file)...\n", o.folds)
		rng := rand.New(rand.NewPCG(o.seed, seedStream))
		sum := map[string]float64{}
		r, err := classifier.CrossValidateEach(ds, o.folds, cvCfg, func(_ int, m *classifier.Model, test classifier.Dataset) error {
			fi, err := classifier.PermutationImportance(m, test, 2, rng)
			for _, x := range fi {
				sum[x.Feature] += x.Drop * float64(test.Rows())
			}
			return err
		})
		if err != nil {
			return fmt.Errorf("cross-validation: %w", err)
		}
		cv = &r
		for _, name := range ds.Features {
			imp = append(imp, classifier.Importance{Feature: name, Drop: sum[name] / float64(ds.Rows())})
		}
		sort.SliceStable(imp, func(i, j int) bool { return imp[i].Drop > imp[j].Drop })
	}
	fmt.Fprintf(e.stderr, "training the final forest on %d series...\n", ds.Rows())
	m, err := classifier.Train(ds, cfg)
	if err != nil {
		return err
	}
	if cv != nil {
		m.CV = &cv.CVSummary
	}
	if err := m.Save(o.out); err != nil {
		return err
	}
	return writeTrainReport(e.stdout, o.out, ds, m, cv, imp)
}

// labelledDataset reads the labels file and measures every trace it names.
func labelledDataset(e *env, o *trainOptions) (classifier.Dataset, error) {
	f, err := os.Open(o.labels)
	if err != nil {
		return classifier.Dataset{}, fmt.Errorf("%s: %w", o.labels, err)
	}
	defer f.Close()
	labels, err := classifier.ReadLabels(f, o.labels)
	if err != nil {
		return classifier.Dataset{}, err
	}
	base := filepath.Dir(o.labels)
	paths := make([]string, len(labels))
	for i, l := range labels {
		p := l.Path
		if !filepath.IsAbs(p) {
			p = filepath.Join(base, p)
		}
		if _, err := os.Stat(p); err != nil {
			return classifier.Dataset{}, fmt.Errorf("%s line %d: %s: no such file (paths are relative to the labels file)", o.labels, l.Line, l.Path)
		}
		paths[i] = p
	}
	ds := classifier.Dataset{Features: features.Names()}
	err = batch(e, paths,
		func(_ int, p string) (features.Vector, error) {
			tr, err := readTrace(e, p, &o.in)
			if err != nil {
				return features.Vector{}, err
			}
			v, err := features.Extract(tr.Values, features.Options{Seed: o.seed})
			if err != nil {
				return features.Vector{}, fmt.Errorf("%s: %w", p, err)
			}
			return v, nil
		},
		func(i int, p string, v features.Vector) error {
			ds.X = append(ds.X, v.Values)
			ds.Y = append(ds.Y, labels[i].Class)
			ds.Groups = append(ds.Groups, p)
			return nil
		})
	if err != nil {
		return classifier.Dataset{}, fmt.Errorf("%s: some labelled traces could not be read; fix or remove them (errors above)", o.labels)
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
	return ds, nil
}

func writeTrainReport(w io.Writer, out string, ds classifier.Dataset, m *classifier.Model, cv *classifier.CVResult, imp []classifier.Importance) error {
	fmt.Fprintf(w, "model written to %s\n", out)
	fmt.Fprintf(w, "training set: %s\n", ds.Description)
	fmt.Fprintf(w, "forest: %d trees, %d nodes, seed %d, feature schema v%d %s\n", m.NumTrees(), m.NumNodes(), m.Config.Seed, m.Config.Schema.Version, m.Config.Schema.Hash)
	fmt.Fprintf(w, "out-of-bag accuracy: %s\n", human(m.OOB.Accuracy))
	if cv == nil {
		return nil
	}
	ev := cv.Evaluation
	fmt.Fprintf(w, "\n%d-fold cross-validation, grouped (no system or file in both training and test folds):\n", cv.Folds)
	fmt.Fprintf(w, "accuracy %.4f over %d series; %d flagged undetermined (accuracy on the rest %.4f)\n\n", ev.Accuracy, ev.Rows, ev.Undetermined, ev.DeterminedAccuracy)
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
	if len(ds.Groups) > 0 {
		type acc struct{ good, n int }
		by := map[string]*acc{}
		var names []string
		for i, g := range ds.Groups {
			if by[g] == nil {
				by[g] = &acc{}
				names = append(names, g)
			}
			by[g].n++
			if ev.Classes[cv.Predicted[i]] == ds.Y[i] {
				by[g].good++
			}
		}
		if len(names) <= 60 {
			sort.Strings(names)
			fmt.Fprintf(w, "\naccuracy per system or file when it was held out:\n")
			t = newTable(w)
			t.row("GROUP", "SERIES", "ACCURACY")
			for _, g := range names {
				t.row(g, fmt.Sprint(by[g].n), fmt.Sprintf("%.3f", float64(by[g].good)/float64(by[g].n)))
			}
			if err := t.flush(); err != nil {
				return err
			}
		}
	}
	if len(imp) > 0 {
		fmt.Fprintf(w, "\npermutation importance on the held-out folds (drop in accuracy when the feature is shuffled):\n")
		t = newTable(w)
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
