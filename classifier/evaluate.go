package classifier

import (
	"fmt"
	"slices"
)

// Evaluation compares predicted and true classes.
type Evaluation struct {
	// Classes labels the rows and columns of Confusion.
	Classes []string `json:"classes"`
	// Confusion[i][j] counts rows of true class i whose top class is j
	// (Undetermined rows included, by their top class).
	Confusion [][]int `json:"confusion"`
	Rows      int     `json:"rows"`
	// Accuracy is the fraction of rows whose top class is right.
	Accuracy float64 `json:"accuracy"`
	// Precision[j] = Confusion[j][j] / Σ_i Confusion[i][j] (0 when class j
	// is never predicted); Recall[i] = Confusion[i][i] / Σ_j Confusion[i][j]
	// (0 for a class without rows); F1 is their harmonic mean (0 when both
	// are 0).
	Precision []float64 `json:"precision"`
	Recall    []float64 `json:"recall"`
	F1        []float64 `json:"f1"`
	// Undetermined counts rows the model flagged Undetermined;
	// DeterminedAccuracy is the accuracy over the other rows (0 if none).
	Undetermined       int     `json:"undetermined"`
	DeterminedAccuracy float64 `json:"determined_accuracy"`
}

// tally accumulates confusion counts and the determined-row tallies.
type tally struct {
	conf             [][]int
	und, detN, detOK int
}

func newTally(k int) *tally {
	t := &tally{conf: make([][]int, k)}
	for i := range t.conf {
		t.conf[i] = make([]int, k)
	}
	return t
}

func (t *tally) add(truth, pred int, undetermined bool) {
	t.conf[truth][pred]++
	if undetermined {
		t.und++
		return
	}
	t.detN++
	if truth == pred {
		t.detOK++
	}
}

func (t *tally) evaluation(classes []string) Evaluation {
	k := len(classes)
	e := Evaluation{Classes: slices.Clone(classes), Confusion: t.conf, Undetermined: t.und,
		Precision: make([]float64, k), Recall: make([]float64, k), F1: make([]float64, k)}
	diag := 0
	for i := 0; i < k; i++ {
		rowSum, colSum := 0, 0
		for j := 0; j < k; j++ {
			rowSum += t.conf[i][j]
			colSum += t.conf[j][i]
		}
		e.Rows += rowSum
		diag += t.conf[i][i]
		if colSum > 0 {
			e.Precision[i] = float64(t.conf[i][i]) / float64(colSum)
		}
		if rowSum > 0 {
			e.Recall[i] = float64(t.conf[i][i]) / float64(rowSum)
		}
		if s := e.Precision[i] + e.Recall[i]; s > 0 {
			e.F1[i] = 2 * e.Precision[i] * e.Recall[i] / s
		}
	}
	if e.Rows > 0 {
		e.Accuracy = float64(diag) / float64(e.Rows)
	}
	if t.detN > 0 {
		e.DeterminedAccuracy = float64(t.detOK) / float64(t.detN)
	}
	return e
}

// sameFeatures reports an error unless ds has exactly m's features in order.
func (m *Model) sameFeatures(ds Dataset) error {
	if !slices.Equal(ds.Features, m.Features) {
		return fmt.Errorf("data set features %v differ from the model's %v (use Model.Align): %w", ds.Features, m.Features, ErrDataset)
	}
	return ds.checkShape()
}

// classIndex maps ds's labels to m.Classes indices; an unknown label is an
// error.
func (m *Model) classIndex(ds Dataset) ([]int, error) {
	if len(ds.Y) != len(ds.X) {
		return nil, fmt.Errorf("%d labels for %d rows: %w", len(ds.Y), len(ds.X), ErrDataset)
	}
	y := make([]int, len(ds.Y))
	for i, lab := range ds.Y {
		c, ok := slices.BinarySearch(m.Classes, lab)
		if !ok {
			return nil, fmt.Errorf("row %d: class %q is unknown to the model (classes %v): %w", i, lab, m.Classes, ErrDataset)
		}
		y[i] = c
	}
	return y, nil
}

// Evaluate predicts every row of ds (which must have the model's features
// in the model's order and only the model's classes) and compares with
// ds.Y.
func (m *Model) Evaluate(ds Dataset) (Evaluation, error) {
	if len(m.trees) == 0 {
		return Evaluation{}, fmt.Errorf("evaluate: %w", ErrEmptyModel)
	}
	if err := m.sameFeatures(ds); err != nil {
		return Evaluation{}, fmt.Errorf("evaluate: %w", err)
	}
	y, err := m.classIndex(ds)
	if err != nil {
		return Evaluation{}, fmt.Errorf("evaluate: %w", err)
	}
	t := newTally(len(m.Classes))
	x := make([]float64, len(m.Features))
	sum := make([]float64, len(m.Classes))
	for i, row := range ds.X {
		m.impute(x, row)
		top := m.classify(x, sum)
		t.add(y[i], top, m.undetermined(row, x, sum, top))
	}
	return t.evaluation(m.Classes), nil
}

// undetermined applies Predict's Undetermined rules to the vector raw
// (NaN for missing values), imputed as x, whose per-class sums of leaf
// frequencies over the trees are sum (as classify leaves them) and whose
// top class is top.
func (m *Model) undetermined(raw, x, sum []float64, top int) bool {
	if m.Config.MinProbability >= 0 && sum[top]/float64(len(m.trees)) < m.Config.MinProbability {
		return true
	}
	for c, s := range sum {
		if c != top && s == sum[top] {
			return true
		}
	}
	if m.novelty != nil {
		nv := m.novelty.novelty(raw, m.Classes, m.Config.NoveltyK, m.Config.NoveltyLimit, nil)
		return nv.Percentile > nv.Limit
	}
	if m.Config.RangeMargin >= 0 {
		for j, v := range x {
			if lo, hi, ok := m.allowedRange(j); ok && !(v >= lo && v <= hi) {
				return true
			}
		}
	}
	return false
}
