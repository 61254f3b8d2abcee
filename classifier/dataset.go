package classifier

import (
	"fmt"
	"math"
	"slices"
)

// UndeterminedLabel is the label Prediction.Label returns when the forest is
// not confident or the input lies outside the training range. It may not be
// used as a class name in training data.
const UndeterminedLabel = "undetermined"

// Dataset is a labelled feature table: row i has feature values X[i] (in the
// order of Features) and class Y[i]. NaN marks a missing value; Train
// replaces it with the training median of its feature. Groups, if not empty,
// names the unit each row belongs to (e.g. the reference system or device
// that produced it) so that CrossValidate keeps a group's rows in one fold.
type Dataset struct {
	Features    []string
	X           [][]float64
	Y           []string
	Groups      []string
	Description string
}

// Rows returns the number of rows.
func (ds Dataset) Rows() int { return len(ds.X) }

// Subset returns the rows idx of ds (in that order), sharing the row slices.
// The caller guarantees 0 ≤ idx[i] < ds.Rows().
func (ds Dataset) Subset(idx []int) Dataset {
	out := Dataset{Features: ds.Features, Description: ds.Description,
		X: make([][]float64, len(idx)), Y: make([]string, len(idx))}
	if len(ds.Groups) > 0 {
		out.Groups = make([]string, len(idx))
	}
	for k, i := range idx {
		out.X[k] = ds.X[i]
		out.Y[k] = ds.Y[i]
		if out.Groups != nil {
			out.Groups[k] = ds.Groups[i]
		}
	}
	return out
}

// checkShape validates names and table shape and rejects ±Inf; NaN is
// allowed (missing). It does not look at labels.
func (ds Dataset) checkShape() error {
	p := len(ds.Features)
	if p == 0 {
		return fmt.Errorf("no features: %w", ErrDataset)
	}
	seen := make(map[string]int, p)
	for j, name := range ds.Features {
		if name == "" {
			return fmt.Errorf("feature %d has an empty name: %w", j, ErrDataset)
		}
		if k, ok := seen[name]; ok {
			return fmt.Errorf("feature %q appears twice (columns %d and %d): %w", name, k, j, ErrDataset)
		}
		seen[name] = j
	}
	for i, row := range ds.X {
		if len(row) != p {
			return fmt.Errorf("row %d has %d values, want %d: %w", i, len(row), p, ErrDataset)
		}
		for j, v := range row {
			if math.IsInf(v, 0) {
				return fmt.Errorf("row %d feature %q is %v: %w", i, ds.Features[j], v, ErrDataset)
			}
		}
	}
	return nil
}

// validate checks ds for training and returns its sorted class list and
// the class index of every row.
func (ds Dataset) validate() (classes []string, y []int, err error) {
	if err := ds.checkShape(); err != nil {
		return nil, nil, err
	}
	n := len(ds.X)
	if n < 2 {
		return nil, nil, fmt.Errorf("%d rows, want at least 2: %w", n, ErrDataset)
	}
	if len(ds.Y) != n {
		return nil, nil, fmt.Errorf("%d labels for %d rows: %w", len(ds.Y), n, ErrDataset)
	}
	if len(ds.Groups) != 0 && len(ds.Groups) != n {
		return nil, nil, fmt.Errorf("%d groups for %d rows: %w", len(ds.Groups), n, ErrDataset)
	}
	for i, lab := range ds.Y {
		if lab == "" {
			return nil, nil, fmt.Errorf("row %d has an empty label: %w", i, ErrDataset)
		}
		if lab == UndeterminedLabel {
			return nil, nil, fmt.Errorf("row %d: %q is reserved and cannot be a class: %w", i, lab, ErrDataset)
		}
	}
	classes = slices.Clone(ds.Y)
	slices.Sort(classes)
	classes = slices.Compact(classes)
	if len(classes) < 2 {
		return nil, nil, fmt.Errorf("only class %q present, want at least 2 classes: %w", classes[0], ErrDataset)
	}
	y = make([]int, n)
	for i, lab := range ds.Y {
		y[i], _ = slices.BinarySearch(classes, lab)
	}
	return classes, y, nil
}

// withoutEmpty returns ds without the features that are missing (NaN) in
// every row, and their names (nil, and ds itself, when there are none).
// No row can teach a forest anything about such a feature.
func (ds Dataset) withoutEmpty() (Dataset, []string) {
	p := len(ds.Features)
	empty := make([]bool, p)
	var dropped []string
	for j := 0; j < p; j++ {
		empty[j] = true
		for _, row := range ds.X {
			if !math.IsNaN(row[j]) {
				empty[j] = false
				break
			}
		}
		if empty[j] {
			dropped = append(dropped, ds.Features[j])
		}
	}
	if len(dropped) == 0 || len(dropped) == p {
		return ds, nil
	}
	out := ds
	out.Features = make([]string, 0, p-len(dropped))
	for j, name := range ds.Features {
		if !empty[j] {
			out.Features = append(out.Features, name)
		}
	}
	out.X = make([][]float64, len(ds.X))
	for i, row := range ds.X {
		r := make([]float64, 0, len(out.Features))
		for j, v := range row {
			if !empty[j] {
				r = append(r, v)
			}
		}
		out.X[i] = r
	}
	return out, dropped
}

// project returns the rows of ds reordered into the feature order names
// (a subset of ds.Features, as a model trained on ds without its empty
// features has), sharing nothing with ds.
func (ds Dataset) project(names []string) Dataset {
	if slices.Equal(names, ds.Features) {
		return ds
	}
	pos := make([]int, len(names))
	for k, n := range names {
		pos[k] = slices.Index(ds.Features, n)
	}
	out := ds
	out.Features = slices.Clone(names)
	out.X = make([][]float64, len(ds.X))
	for i, row := range ds.X {
		r := make([]float64, len(names))
		for k, j := range pos {
			r[k] = math.NaN()
			if j >= 0 {
				r[k] = row[j]
			}
		}
		out.X[i] = r
	}
	return out
}

// medians returns the median of the non-missing values of every feature:
// the middle order statistic, or the mean of the two middle ones for an even
// count. A feature with no observed value is an error.
func (ds Dataset) medians() ([]float64, error) {
	p := len(ds.Features)
	med := make([]float64, p)
	col := make([]float64, 0, len(ds.X))
	for j := 0; j < p; j++ {
		col = col[:0]
		for _, row := range ds.X {
			if !math.IsNaN(row[j]) {
				col = append(col, row[j])
			}
		}
		if len(col) == 0 {
			return nil, fmt.Errorf("feature %q is missing (NaN) in every row: %w", ds.Features[j], ErrDataset)
		}
		slices.Sort(col)
		m := len(col) / 2
		if len(col)%2 == 1 {
			med[j] = col[m]
		} else {
			med[j] = col[m-1]/2 + col[m]/2
		}
	}
	return med, nil
}
