package classifier

import (
	"cmp"
	"fmt"
	"runtime"
	"slices"
)

// CVSummary is the part of a cross-validation result worth storing in a
// model file.
type CVSummary struct {
	Folds   int  `json:"folds"`
	Grouped bool `json:"grouped"`
	// Config is the resolved configuration of the fold forests (each fold
	// derives its own seed from Config.Seed).
	Config Config `json:"config"`
	// Evaluation pools the out-of-fold predictions of all folds.
	Evaluation
	// FoldAccuracy is each fold's accuracy on its held-out rows.
	FoldAccuracy []float64 `json:"fold_accuracy"`
}

// CVResult is the outcome of CrossValidate.
type CVResult struct {
	CVSummary
	// Fold[i] is the fold that held row i out; Predicted[i] is the index
	// (into Classes) of row i's out-of-fold top class, Probabilities[i]
	// its out-of-fold class probabilities (in the order of Classes, 0 for
	// a class its fold forest never saw) and Undetermined[i] whether the
	// fold forest's rules called it undetermined.
	Fold          []int       `json:"-"`
	Predicted     []int       `json:"-"`
	Probabilities [][]float64 `json:"-"`
	Undetermined  []bool      `json:"-"`
}

// LeaveOneGroupOut, given as the fold count k with a grouped dataset, makes
// every group its own fold: each group is predicted by a forest trained on
// all the others (leave-one-family-out validation on the reference set).
const LeaveOneGroupOut = -1

// stream numbers separating the random streams derived from Config.Seed.
const (
	streamFolds   = 1 << 40
	streamFoldCfg = 1<<40 + 1
)

// CrossValidate estimates the accuracy of Train(ds, cfg) by stratified
// k-fold cross-validation: the rows are dealt into k folds with every
// class spread as evenly as possible, a forest is trained on k−1 folds and
// predicts the remaining one, for each fold in turn. If ds.Groups is set,
// all rows of a group go to the same fold (grouped cross-validation, so a
// system or device seen in training is never used to test), groups being
// balanced per majority class. Fold assignment and the fold forests' seeds
// derive from cfg.Seed, so the result is reproducible. k must be at least 2
// and at most the number of rows (groups when grouped).
func CrossValidate(ds Dataset, k int, cfg Config) (CVResult, error) {
	return CrossValidateEach(ds, k, cfg, nil)
}

// CrossValidateEach is CrossValidate that also hands each fold's forest and
// held-out rows to each (when not nil), e.g. to measure permutation
// importance on data the forest has not seen. Folds are visited in order;
// an error from each stops the run.
func CrossValidateEach(ds Dataset, k int, cfg Config, each func(fold int, m *Model, test Dataset) error) (CVResult, error) {
	classes, y, err := ds.validate()
	if err != nil {
		return CVResult{}, fmt.Errorf("cross-validate: %w", err)
	}
	resolved, err := cfg.resolve(len(ds.Features))
	if err != nil {
		return CVResult{}, fmt.Errorf("cross-validate: %w", err)
	}
	resolved.Workers = 0
	fold, err := assignFolds(ds, y, len(classes), k, cfg.Seed)
	if err != nil {
		return CVResult{}, fmt.Errorf("cross-validate: %w", err)
	}
	if k == LeaveOneGroupOut {
		k = slices.Max(fold) + 1
	}
	n := len(ds.X)
	res := CVResult{Fold: fold, Predicted: make([]int, n), Probabilities: make([][]float64, n), Undetermined: make([]bool, n)}
	res.Folds, res.Grouped, res.Config = k, len(ds.Groups) > 0, resolved
	res.FoldAccuracy = make([]float64, k)
	all := newTally(len(classes))
	// The novelty rule of the fold forests: one index over the whole set,
	// each held-out row compared only with the rows outside its fold —
	// exactly the fold's training rows; the reference distances are those
	// of the whole set, which differ from a fold's by the rows of one fold.
	// This saves building an index per fold (quadratic in the rows).
	var nov *noveltyIndex
	if resolved.NoveltyLimit >= 0 {
		nov = buildNovelty(ds.X, y, ds.Groups, resolved.NoveltyK, runtime.GOMAXPROCS(0))
	}
	for f := 0; f < k; f++ {
		var trainIdx, testIdx []int
		for i, fi := range fold {
			if fi == f {
				testIdx = append(testIdx, i)
			} else {
				trainIdx = append(trainIdx, i)
			}
		}
		fc := cfg
		fc.Seed = splitmix64(cfg.Seed ^ splitmix64(streamFoldCfg+uint64(f)))
		if nov != nil {
			// The fold forest decides by its vote; the shared index above
			// applies the novelty rule (and replaces the range check).
			fc.NoveltyLimit, fc.RangeMargin = -1, -1
		}
		m, err := Train(ds.Subset(trainIdx), fc)
		if err != nil {
			return CVResult{}, fmt.Errorf("cross-validate: fold %d: %w", f, err)
		}
		// Map the fold model's classes (a subset) to the global list.
		toGlobal := make([]int, len(m.Classes))
		for c, name := range m.Classes {
			toGlobal[c], _ = slices.BinarySearch(classes, name)
		}
		// A fold forest leaves out features missing in all its training
		// rows; its held-out rows are projected onto its features.
		test := ds.Subset(testIdx).project(m.Features)
		x := make([]float64, len(m.Features))
		sum := make([]float64, len(m.Classes))
		good := 0
		for ti, i := range testIdx {
			m.impute(x, test.X[ti])
			top := m.classify(x, sum)
			pred := toGlobal[top]
			res.Predicted[i] = pred
			res.Probabilities[i] = make([]float64, len(classes))
			for c, v := range sum {
				res.Probabilities[i][toGlobal[c]] = v / float64(len(m.trees))
			}
			und := m.undetermined(test.X[ti], x, sum, top)
			if nov != nil {
				nv := nov.novelty(ds.X[i], classes, resolved.NoveltyK, resolved.NoveltyLimit, func(r int) bool { return fold[r] == f })
				und = und || nv.Percentile > nv.Limit
			}
			res.Undetermined[i] = und
			all.add(y[i], pred, und)
			if pred == y[i] {
				good++
			}
		}
		res.FoldAccuracy[f] = float64(good) / float64(len(testIdx))
		if each != nil {
			// A fold forest knows only the classes of its training rows
			// (a class with one group is absent when that group is held
			// out); each gets the held-out rows of known classes.
			if known := test.knownClasses(m.Classes); len(known.X) > 0 {
				if err := each(f, m, known); err != nil {
					return CVResult{}, fmt.Errorf("cross-validate: fold %d: %w", f, err)
				}
			}
		}
	}
	res.Evaluation = all.evaluation(classes)
	return res, nil
}

// assignFolds deals rows (or whole groups) into k folds, stratified by
// class; see CrossValidate.
func assignFolds(ds Dataset, y []int, nClass, k int, seed uint64) ([]int, error) {
	n := len(y)
	rng := streamRand(seed, streamFolds)
	fold := make([]int, n)
	if len(ds.Groups) == 0 {
		if k == LeaveOneGroupOut {
			return nil, fmt.Errorf("leave-one-group-out needs a grouped dataset: %w", ErrConfig)
		}
		if k < 2 || k > n {
			return nil, fmt.Errorf("%d folds for %d rows, want 2 ≤ k ≤ rows: %w", k, n, ErrConfig)
		}
		next := 0
		for c := 0; c < nClass; c++ {
			var idx []int
			for i, yi := range y {
				if yi == c {
					idx = append(idx, i)
				}
			}
			rng.Shuffle(len(idx), func(a, b int) { idx[a], idx[b] = idx[b], idx[a] })
			for _, i := range idx {
				fold[i] = next
				next = (next + 1) % k
			}
		}
		return fold, nil
	}

	// Grouped: one unit per distinct group name.
	names := slices.Clone(ds.Groups)
	slices.Sort(names)
	names = slices.Compact(names)
	if k == LeaveOneGroupOut {
		if len(names) < 2 {
			return nil, fmt.Errorf("leave-one-group-out needs at least 2 groups, have %d: %w", len(names), ErrConfig)
		}
		for i, g := range ds.Groups {
			fold[i], _ = slices.BinarySearch(names, g)
		}
		return fold, nil
	}
	if k < 2 || k > len(names) {
		return nil, fmt.Errorf("%d folds for %d groups, want 2 ≤ k ≤ groups: %w", k, len(names), ErrConfig)
	}
	type group struct {
		rows  []int
		class int
	}
	groups := make([]group, len(names))
	for i, g := range ds.Groups {
		gi, _ := slices.BinarySearch(names, g)
		groups[gi].rows = append(groups[gi].rows, i)
	}
	for gi := range groups {
		cnt := make([]int, nClass)
		for _, i := range groups[gi].rows {
			cnt[y[i]]++
		}
		best := 0
		for c := range cnt {
			if cnt[c] > cnt[best] {
				best = c
			}
		}
		groups[gi].class = best
	}
	perClass := make([][]int, k) // rows of each class already in each fold
	for f := range perClass {
		perClass[f] = make([]int, nClass)
	}
	total := make([]int, k)
	for c := 0; c < nClass; c++ {
		var members []int
		for gi := range groups {
			if groups[gi].class == c {
				members = append(members, gi)
			}
		}
		rng.Shuffle(len(members), func(a, b int) { members[a], members[b] = members[b], members[a] })
		slices.SortStableFunc(members, func(a, b int) int {
			return cmp.Compare(len(groups[b].rows), len(groups[a].rows))
		})
		for _, gi := range members {
			best := 0
			for f := 1; f < k; f++ {
				if perClass[f][c] < perClass[best][c] ||
					(perClass[f][c] == perClass[best][c] && total[f] < total[best]) {
					best = f
				}
			}
			for _, i := range groups[gi].rows {
				fold[i] = best
			}
			perClass[best][c] += len(groups[gi].rows)
			total[best] += len(groups[gi].rows)
		}
	}
	for f := 0; f < k; f++ {
		if total[f] == 0 {
			return nil, fmt.Errorf("fold %d received no group: %w", f, ErrConfig)
		}
	}
	return fold, nil
}

// knownClasses returns the rows of ds whose label is one of classes
// (sorted).
func (ds Dataset) knownClasses(classes []string) Dataset {
	var idx []int
	for i, lab := range ds.Y {
		if _, ok := slices.BinarySearch(classes, lab); ok {
			idx = append(idx, i)
		}
	}
	if len(idx) == len(ds.Y) {
		return ds
	}
	return ds.Subset(idx)
}
