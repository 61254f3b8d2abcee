package classifier

import (
	"cmp"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"sync"
)

// Importance is one feature's permutation importance.
type Importance struct {
	Feature string
	Index   int
	// Drop is the accuracy on the data set minus the mean accuracy after
	// randomly permuting this feature's column; Std is the sample standard
	// deviation of that drop over the repeats (0 for one repeat).
	Drop float64
	Std  float64
}

// PermutationImportance measures how much m's accuracy on ds falls when
// each feature column is shuffled, breaking its link with the class
// (Breiman, Machine Learning 45 (2001) 5, section 10). ds should be data
// the model was not trained on (a held-out set or a cross-validation fold);
// on training data the figures overstate reliance on noise features.
// Each feature is shuffled repeats times (repeats ≤ 0 means 5). The
// permutations come from seeds drawn from rng in feature-then-repeat order,
// so the result depends only on rng's state, not on scheduling. The result
// is sorted by Drop, largest first (ties by feature order).
func PermutationImportance(m *Model, ds Dataset, repeats int, rng *rand.Rand) ([]Importance, error) {
	if m == nil || len(m.trees) == 0 {
		return nil, fmt.Errorf("permutation importance: %w", ErrEmptyModel)
	}
	if err := m.sameFeatures(ds); err != nil {
		return nil, fmt.Errorf("permutation importance: %w", err)
	}
	y, err := m.classIndex(ds)
	if err != nil {
		return nil, fmt.Errorf("permutation importance: %w", err)
	}
	n, p := len(ds.X), len(m.Features)
	if n == 0 {
		return nil, fmt.Errorf("permutation importance: empty data set: %w", ErrDataset)
	}
	if rng == nil {
		return nil, fmt.Errorf("permutation importance: nil random generator: %w", ErrConfig)
	}
	if repeats <= 0 {
		repeats = 5
	}
	xs := make([][]float64, n)
	for i, row := range ds.X {
		xs[i] = make([]float64, p)
		m.impute(xs[i], row)
	}
	seeds := make([]uint64, p*repeats)
	for i := range seeds {
		seeds[i] = rng.Uint64()
	}
	sum := make([]float64, len(m.Classes))
	good := 0
	for i, x := range xs {
		if m.classify(x, sum) == y[i] {
			good++
		}
	}
	baseline := float64(good) / float64(n)

	out := make([]Importance, p)
	workers := min(runtime.GOMAXPROCS(0), p)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			x := make([]float64, p)
			sum := make([]float64, len(m.Classes))
			drops := make([]float64, repeats)
			for j := w; j < p; j += workers {
				for r := 0; r < repeats; r++ {
					perm := rand.New(rand.NewPCG(seeds[j*repeats+r], 0x5eed)).Perm(n)
					good := 0
					for i, row := range xs {
						copy(x, row)
						x[j] = xs[perm[i]][j]
						if m.classify(x, sum) == y[i] {
							good++
						}
					}
					drops[r] = baseline - float64(good)/float64(n)
				}
				mean, sd := meanStd(drops)
				out[j] = Importance{Feature: m.Features[j], Index: j, Drop: mean, Std: sd}
			}
		}(w)
	}
	wg.Wait()
	slices.SortStableFunc(out, func(a, b Importance) int { return cmp.Compare(b.Drop, a.Drop) })
	return out, nil
}

// meanStd returns the mean and the sample standard deviation (n−1).
func meanStd(v []float64) (mean, sd float64) {
	for _, x := range v {
		mean += x
	}
	mean /= float64(len(v))
	if len(v) < 2 {
		return mean, 0
	}
	var ss float64
	for _, x := range v {
		ss += (x - mean) * (x - mean)
	}
	return mean, math.Sqrt(ss / float64(len(v)-1))
}
