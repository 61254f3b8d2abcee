package classifier

import (
	"bytes"
	"errors"
	"math"
	"slices"
	"strings"
	"testing"
)

func modelBytes(t *testing.T, m *Model) []byte {
	t.Helper()
	var b bytes.Buffer
	if err := m.Write(&b); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// TestReproducible: same data and seed ⇒ byte-identical model file, for
// any number of workers; another seed ⇒ another model (project rule:
// bit-identical outputs for the same inputs and seed).
func TestReproducible(t *testing.T) {
	ds := noisy(300, 8, 4, 1)
	cfg := Config{Trees: 40, Seed: 7}
	var files [][]byte
	for _, w := range []int{1, 4, 3} {
		c := cfg
		c.Workers = w
		m, err := Train(ds, c)
		if err != nil {
			t.Fatal(err)
		}
		files = append(files, modelBytes(t, m))
	}
	for i := 1; i < len(files); i++ {
		if !bytes.Equal(files[0], files[i]) {
			t.Fatalf("model %d differs from model 0 (workers 1 vs %d)", i, []int{1, 4, 3}[i])
		}
	}
	cfg.Seed = 8
	m, err := Train(ds, cfg)
	if err != nil {
		t.Fatal(err)
	}
	if bytes.Equal(files[0], modelBytes(t, m)) {
		t.Fatal("seeds 7 and 8 gave the same model")
	}
}

// TestLeafCountsMatchThresholds routes each tree's bootstrap rows through
// the stored real-valued thresholds and recounts the leaves: the counts must
// equal the stored ones, proving that the conversion of golearn's bin-code
// thresholds to bin edges sends every row where golearn sent it.
func TestLeafCountsMatchThresholds(t *testing.T) {
	ds := noisy(400, 6, 3, 3)
	cfg := Config{Trees: 12, Seed: 5, Bins: 16}
	m, err := Train(ds, cfg)
	if err != nil {
		t.Fatal(err)
	}
	_, y, _ := ds.validate()
	k := len(m.Classes)
	for ti := range m.trees {
		tr := &m.trees[ti]
		rows, _ := bootstrap(cfg.Seed, ti, len(ds.X))
		got := make([]uint32, len(tr.count))
		for _, r := range rows {
			i := 0
			got[y[r]]++ // root
			for tr.nodes[i].feature >= 0 {
				nd := tr.nodes[i]
				if ds.X[r][nd.feature] < nd.threshold {
					i++
				} else {
					i = int(nd.right)
				}
				got[i*k+y[r]]++
			}
		}
		if !slices.Equal(got, tr.count) {
			t.Fatalf("tree %d: recounted node counts differ from stored", ti)
		}
	}
}

// TestSeparable: a class boundary on one feature with a gap (x0 < 1 vs
// x0 ≥ 2) must be learnt perfectly — every bootstrap tree finds a split in
// the gap, so out-of-bag and held-out accuracy are 1 (analytic: the classes
// are separable by a single threshold).
func TestSeparable(t *testing.T) {
	train := separable(400, 6, 1)
	test := separable(400, 6, 2)
	m, err := Train(train, Config{Trees: 50, Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	if m.OOB.Accuracy != 1 {
		t.Errorf("OOB accuracy %v, want 1", m.OOB.Accuracy)
	}
	ev, err := m.Evaluate(test)
	if err != nil {
		t.Fatal(err)
	}
	if ev.Accuracy != 1 {
		t.Errorf("held-out accuracy %v, want 1 (confusion %v)", ev.Accuracy, ev.Confusion)
	}
}

// TestSaabasIdentity: Bias + Σ contributions = predicted probability. This
// is an exact telescoping identity along each path (root frequency plus the
// changes at each split equals the leaf frequency), averaged over trees;
// only floating-point rounding separates the two sides.
func TestSaabasIdentity(t *testing.T) {
	for _, tc := range []struct {
		name string
		ds   Dataset
	}{{"iris", loadIris(t)}, {"noisy", noisy(300, 8, 4, 4)}} {
		m, err := Train(tc.ds, Config{Trees: 60, Seed: 1})
		if err != nil {
			t.Fatal(err)
		}
		probes := probePoints(tc.ds.X, 200, 2)
		for i, x := range probes {
			pr, err := m.Predict(x)
			if err != nil {
				t.Fatal(err)
			}
			s := pr.Bias
			for _, c := range pr.Contributions {
				s += c
			}
			// 60 trees × depth ≲ 20 additions of numbers ≤ 1: rounding
			// error well below 1e-12.
			if d := math.Abs(s - pr.Probabilities[pr.Index]); d > 1e-12 {
				t.Fatalf("%s probe %d: bias+contributions %v, probability %v", tc.name, i, s, pr.Probabilities[pr.Index])
			}
			var total float64
			for _, q := range pr.Probabilities {
				total += q
			}
			if math.Abs(total-1) > 1e-12 {
				t.Fatalf("%s probe %d: probabilities sum to %v", tc.name, i, total)
			}
		}
	}
}

// TestDriversSeparable: on the separable data the deciding feature must be
// the top driver of every confident prediction.
func TestDriversSeparable(t *testing.T) {
	ds := separable(300, 5, 6)
	m, err := Train(ds, Config{Trees: 40, Seed: 2})
	if err != nil {
		t.Fatal(err)
	}
	for _, x := range ds.X[:50] {
		pr, err := m.Predict(x)
		if err != nil {
			t.Fatal(err)
		}
		if d := pr.Drivers(2); d[0].Feature != "f0" {
			t.Fatalf("top driver %v, want f0 (prediction %+v)", d, pr)
		}
	}
}

// TestMissingValues: NaN in training is replaced by the feature's median
// (hand-computed here), and NaN at prediction gives exactly the prediction
// of the median-filled vector.
func TestMissingValues(t *testing.T) {
	ds := noisy(200, 4, 2, 5)
	ds.X[3][1] = math.NaN()
	ds.X[10][1] = math.NaN()
	m, err := Train(ds, Config{Trees: 20, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	var col []float64
	for i, row := range ds.X {
		if i != 3 && i != 10 {
			col = append(col, row[1])
		}
	}
	slices.Sort(col) // 198 values: median = mean of ranks 99 and 100
	if want := col[98]/2 + col[99]/2; m.Medians[1] != want {
		t.Fatalf("median %v, want %v", m.Medians[1], want)
	}
	if m.Training.Imputed != 2 {
		t.Fatalf("imputed %d, want 2", m.Training.Imputed)
	}
	x := slices.Clone(ds.X[0])
	x[2] = math.NaN()
	got, err := m.Predict(x)
	if err != nil {
		t.Fatal(err)
	}
	x[2] = m.Medians[2]
	want, _ := m.Predict(x)
	if !slices.Equal(got.Imputed, []string{"x02"}) {
		t.Fatalf("imputed %v", got.Imputed)
	}
	if !slices.Equal(got.Probabilities, want.Probabilities) || !slices.Equal(got.Values, want.Values) {
		t.Fatalf("NaN prediction %v differs from median-filled %v", got.Probabilities, want.Probabilities)
	}
	// A feature missing in every row teaches nothing: the model leaves it
	// out, records it, and predicts from the others without asking for it.
	all := noisy(10, 4, 2, 5)
	for i := range all.X {
		all.X[i][3] = math.NaN()
	}
	dm, err := Train(all, Config{Trees: 5, Seed: 1})
	if err != nil {
		t.Fatalf("all-missing column: %v", err)
	}
	if slices.Contains(dm.Features, "x03") || !slices.Equal(dm.Training.Dropped, []string{"x03"}) || len(dm.Features) != len(all.Features)-1 {
		t.Fatalf("features %v, dropped %v", dm.Features, dm.Training.Dropped)
	}
	xs, missing, err := dm.Align(all.Features, all.X[0])
	if err != nil || len(missing) != 0 {
		t.Fatalf("align: %v, missing %v", err, missing)
	}
	if _, err := dm.Predict(xs); err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := dm.Write(&buf); err != nil {
		t.Fatal(err)
	}
	back, err := Read(&buf)
	if err != nil || !slices.Equal(back.Training.Dropped, []string{"x03"}) {
		t.Fatalf("round trip: %v, dropped %v", err, back.Training.Dropped)
	}
	// Every feature missing is still an error.
	for i := range all.X {
		for j := range all.X[i] {
			all.X[i][j] = math.NaN()
		}
	}
	if _, err := Train(all, Config{}); !errors.Is(err, ErrDataset) {
		t.Fatalf("all features missing: err %v", err)
	}
}

// TestOutOfRange: without a novelty index (as in models of format version
// 1), a value beyond the training range widened by the margin makes the
// prediction Undetermined and names the feature; a value inside the margin
// does not; a negative margin disables the check.
func TestOutOfRange(t *testing.T) {
	ds := loadIris(t)
	m, err := Train(ds, Config{Trees: 30, Seed: 1, NoveltyLimit: -1})
	if err != nil {
		t.Fatal(err)
	}
	j := 2 // petal_length, training range [1.0, 6.9] cm
	span := m.Max[j] - m.Min[j]
	x := slices.Clone(ds.X[0])
	x[j] = m.Max[j] + 0.04*span // inside the 5 % margin
	if pr, _ := m.Predict(x); len(pr.OutOfRange) != 0 {
		t.Fatalf("inside margin flagged: %v", pr.Reasons)
	}
	x[j] = m.Max[j] + 0.06*span
	pr, _ := m.Predict(x)
	if !pr.Undetermined || !slices.Equal(pr.OutOfRange, []string{"petal_length"}) || pr.Label() != UndeterminedLabel {
		t.Fatalf("out of range not flagged: %+v", pr)
	}
	if !strings.Contains(strings.Join(pr.Reasons, ";"), "petal_length") {
		t.Fatalf("reason does not name the feature: %v", pr.Reasons)
	}
	x[j] = math.Inf(1)
	if pr, _ := m.Predict(x); !slices.Equal(pr.OutOfRange, []string{"petal_length"}) {
		t.Fatalf("+Inf not flagged: %v", pr.OutOfRange)
	}
	m.Config.RangeMargin = -1
	x[j] = m.Max[j] + 0.06*span
	if pr, _ := m.Predict(x); len(pr.OutOfRange) != 0 {
		t.Fatalf("disabled range check still flags: %v", pr.Reasons)
	}
}

// TestUndeterminedProbability: with MinProbability = 1 exactly the
// predictions whose top probability is below 1 are Undetermined.
func TestUndeterminedProbability(t *testing.T) {
	ds := noisy(300, 5, 3, 6)
	m, err := Train(ds, Config{Trees: 30, Seed: 1, MinProbability: 1})
	if err != nil {
		t.Fatal(err)
	}
	und, det := 0, 0
	for _, x := range probePoints(ds.X, 0, 0) {
		pr, _ := m.Predict(x)
		if pr.Undetermined != (pr.Probabilities[pr.Index] < 1) {
			t.Fatalf("undetermined %v with top probability %v", pr.Undetermined, pr.Probabilities[pr.Index])
		}
		if pr.Undetermined {
			und++
		} else {
			det++
		}
	}
	if und == 0 || det == 0 {
		t.Fatalf("degenerate check: %d undetermined, %d determined", und, det)
	}
	ev, _ := m.Evaluate(ds)
	if ev.Undetermined != und {
		t.Fatalf("Evaluate counts %d undetermined, Predict %d", ev.Undetermined, und)
	}
}

func TestPredictDimension(t *testing.T) {
	m, err := Train(separable(40, 3, 1), Config{Trees: 3, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := m.Predict([]float64{1, 2}); !errors.Is(err, ErrDimension) {
		t.Fatalf("err %v, want ErrDimension", err)
	}
	var empty Model
	if _, err := empty.Predict(nil); !errors.Is(err, ErrEmptyModel) {
		t.Fatalf("zero Model: err %v, want ErrEmptyModel", err)
	}
	if err := empty.Write(new(bytes.Buffer)); !errors.Is(err, ErrEmptyModel) {
		t.Fatalf("zero Model write: err %v, want ErrEmptyModel", err)
	}
}

func TestAlign(t *testing.T) {
	m, err := Train(separable(40, 3, 1), Config{Trees: 3, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	x, missing, err := m.Align([]string{"f2", "extra", "f0"}, []float64{2, 9, 0.5})
	if err != nil {
		t.Fatal(err)
	}
	if x[0] != 0.5 || !math.IsNaN(x[1]) || x[2] != 2 || !slices.Equal(missing, []string{"f1"}) {
		t.Fatalf("aligned %v missing %v", x, missing)
	}
	if _, _, err := m.Align([]string{"f0", "f0"}, []float64{1, 2}); !errors.Is(err, ErrDataset) {
		t.Fatalf("duplicate names: err %v", err)
	}
}

func TestTrainValidation(t *testing.T) {
	good := separable(20, 2, 1)
	mod := func(f func(*Dataset)) Dataset {
		d := good.Subset([]int{0, 1, 2, 3, 4, 5})
		d.Features = slices.Clone(good.Features)
		for i := range d.X {
			d.X[i] = slices.Clone(d.X[i])
		}
		f(&d)
		return d
	}
	tests := []struct {
		name string
		ds   Dataset
		cfg  Config
		want error
		msg  string
	}{
		{"no features", mod(func(d *Dataset) { d.Features = nil }), Config{}, ErrDataset, "no features"},
		{"duplicate name", mod(func(d *Dataset) { d.Features[1] = "f0" }), Config{}, ErrDataset, `"f0"`},
		{"short row", mod(func(d *Dataset) { d.X[2] = d.X[2][:1] }), Config{}, ErrDataset, "row 2"},
		{"inf", mod(func(d *Dataset) { d.X[1][1] = math.Inf(-1) }), Config{}, ErrDataset, "row 1"},
		{"one class", mod(func(d *Dataset) {
			for i := range d.Y {
				d.Y[i] = "a"
			}
		}), Config{}, ErrDataset, "2 classes"},
		{"reserved label", mod(func(d *Dataset) { d.Y[0] = UndeterminedLabel }), Config{}, ErrDataset, "reserved"},
		{"label count", mod(func(d *Dataset) { d.Y = d.Y[:3] }), Config{}, ErrDataset, "labels"},
		{"groups count", mod(func(d *Dataset) { d.Groups = []string{"x"} }), Config{}, ErrDataset, "groups"},
		{"negative trees", good, Config{Trees: -1}, ErrConfig, "Trees"},
		{"fraction", good, Config{FeatureFraction: 1.5}, ErrConfig, "FeatureFraction"},
		{"bins", good, Config{Bins: 1}, ErrConfig, "Bins"},
		{"min leaf", good, Config{MinLeaf: -2}, ErrConfig, "MinLeaf"},
		{"depth", good, Config{MaxDepth: -1}, ErrConfig, "MaxDepth"},
		{"probability", good, Config{MinProbability: 1.5}, ErrConfig, "MinProbability"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Train(tc.ds, tc.cfg)
			if !errors.Is(err, tc.want) || !strings.Contains(err.Error(), tc.msg) {
				t.Fatalf("err %v, want %v mentioning %q", err, tc.want, tc.msg)
			}
		})
	}
}

// TestDepthAndLeafLimits: MaxDepth bounds every path and MinLeaf every
// leaf's bootstrap row count.
func TestDepthAndLeafLimits(t *testing.T) {
	ds := noisy(300, 5, 3, 7)
	m, err := Train(ds, Config{Trees: 10, Seed: 1, MaxDepth: 3, MinLeaf: 7})
	if err != nil {
		t.Fatal(err)
	}
	k := len(m.Classes)
	for _, tr := range m.trees {
		var depth func(i, d int) int
		depth = func(i, d int) int {
			nd := tr.nodes[i]
			if nd.feature < 0 {
				var s uint32
				for c := 0; c < k; c++ {
					s += tr.count[i*k+c]
				}
				if s < 7 {
					t.Fatalf("leaf with %d rows < MinLeaf 7", s)
				}
				return d
			}
			return max(depth(i+1, d+1), depth(int(nd.right), d+1))
		}
		if d := depth(0, 0); d > 3 {
			t.Fatalf("depth %d > MaxDepth 3", d)
		}
	}
}
