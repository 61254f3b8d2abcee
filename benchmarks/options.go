package benchmarks

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
)

// Scale selects a preset of the suite's sizes.
type Scale string

const (
	// Quick is the default: a run of under a minute on two cores (three
	// seeds per invariant at the stated lengths, one series per reference
	// system at 1000 and 5000 samples, clean and at 10 dB SNR, throughput
	// up to 10^5 samples).
	Quick Scale = "quick"
	// Full is the thorough run behind the figures quoted in the README:
	// eight seeds per invariant at the stated length and twice it,
	// classification at 500–20000 samples and four noise levels with three
	// to six series per system, throughput up to 10^6 samples. It takes
	// several minutes.
	Full Scale = "full"
)

// ErrOptions reports invalid Options.
var ErrOptions = errors.New("invalid benchmark options")

// Options configures Run. The zero value is the Quick preset with seed 0;
// any field left at its zero value takes the value of the preset named by
// Scale, so a test can shrink single counts (e.g. PerClass) and keep the
// rest.
type Options struct {
	// Scale names the preset (default Quick).
	Scale Scale
	// Seed fixes every random choice: the invariant series, the
	// classification plan (plan seed 1000 + Seed) and the feature seed.
	Seed uint64

	// Seeds is the number of independent series per invariant and length
	// (Quick 3, Full 8).
	Seeds int
	// LengthFactors multiplies each invariant's stated length (the length
	// its tolerance is stated for); the estimate pools all lengths
	// (Quick {1}, Full {1, 2}).
	LengthFactors []float64
	// Invariants restricts the invariant checks to these IDs (see
	// InvariantIDs); empty means all.
	Invariants []string

	// Lengths are the classification series lengths (Quick {1000, 5000},
	// Full {500, 1000, 2000, 5000, 20000}); each must be at least
	// features.MinLength.
	Lengths []int
	// SNRs are the observational signal-to-noise ratios in dB; +Inf means
	// no added noise (Quick {∞, 10}, Full {∞, 40, 20, 10}).
	SNRs []float64
	// PerClass is the reference plan's series count per class for each
	// length (classifier.ReferenceOptions.PerClass, split evenly over the
	// systems of a class and rounded up; Quick 9, i.e. one series per
	// system; Full 51, three per chaotic and stochastic system and six per
	// regular one). The same series are measured at every SNR.
	PerClass int
	// Systems restricts the classification to these reference systems
	// (default all of classifier.ReferenceSystems).
	Systems []string

	// HoldoutPerClass is the per-class size of the fresh reference set of
	// the leave-one-family-out section (Quick 120, Full 900) and
	// HoldoutTrees the size of each held-out forest (Quick 10, Full 30).
	// HoldoutMaxLength caps its series lengths (Quick 4096, which keeps
	// the quick run near a minute; Full 20000, as the training set; tests
	// shrink it).
	HoldoutPerClass, HoldoutTrees, HoldoutMaxLength int

	// ThroughputSizes are the series lengths timed (Quick 10^3..10^5 in
	// half decades, Full up to 10^6).
	ThroughputSizes []int
	// ThroughputRepeats is the number of timed batches per operation and
	// size, whose median is reported (default 3).
	ThroughputRepeats int
	// SlowCall is the time in seconds above which a call is timed once
	// instead of in ThroughputRepeats batches (Quick 0.15, Full 2).
	SlowCall float64

	// PlaneLength is the length of the series placed in the
	// complexity–entropy plane (Quick 2^15, Full 2^17) and PlaneOrder the
	// ordinal pattern order (default 6, as Rosso et al. 2007 use).
	PlaneLength, PlaneOrder int
	// DegreeLength is the length of the series whose HVG degree
	// distributions are drawn (default 10^5).
	DegreeLength int

	// SkipInvariants, SkipClassification, SkipHoldout, SkipPictures (HVG
	// degree distributions and the complexity–entropy plane) and
	// SkipThroughput leave a section out (its field in the Result stays
	// empty).
	SkipInvariants, SkipClassification, SkipHoldout, SkipPictures, SkipThroughput bool

	// Workers is the number of series measured at once (default
	// GOMAXPROCS); it never changes the result.
	Workers int
	// Progress, if set, is called after each unit of work of a stage with
	// the stage's name, the units done and the total. Calls for one stage
	// may come from several goroutines but never at once.
	Progress func(stage string, done, total int)
}

func presetOf(s Scale) (Options, error) {
	switch s {
	case "", Quick:
		return Options{
			Scale:             Quick,
			Seeds:             3,
			LengthFactors:     []float64{1},
			Lengths:           []int{1000, 5000},
			SNRs:              []float64{math.Inf(1), 10},
			PerClass:          9,
			HoldoutPerClass:   120,
			HoldoutTrees:      10,
			HoldoutMaxLength:  4096,
			ThroughputSizes:   []int{1000, 3000, 10000, 30000, 100000},
			ThroughputRepeats: 3,
			SlowCall:          0.15,
			PlaneLength:       1 << 15,
			PlaneOrder:        6,
			DegreeLength:      100000,
		}, nil
	case Full:
		return Options{
			Scale:             Full,
			Seeds:             8,
			LengthFactors:     []float64{1, 2},
			Lengths:           []int{500, 1000, 2000, 5000, 20000},
			SNRs:              []float64{math.Inf(1), 40, 20, 10},
			PerClass:          51,
			HoldoutPerClass:   900,
			HoldoutTrees:      30,
			HoldoutMaxLength:  20000,
			ThroughputSizes:   []int{1000, 3000, 10000, 30000, 100000, 300000, 1000000},
			ThroughputRepeats: 3,
			SlowCall:          2,
			PlaneLength:       1 << 17,
			PlaneOrder:        6,
			DegreeLength:      100000,
		}, nil
	}
	return Options{}, fmt.Errorf("%w: scale %q: want %q or %q", ErrOptions, s, Quick, Full)
}

// Resolved returns o with every zero field replaced by its preset's value,
// or an error naming the first invalid field.
func (o Options) Resolved() (Options, error) {
	p, err := presetOf(o.Scale)
	if err != nil {
		return Options{}, err
	}
	o.Scale = p.Scale
	if o.Seeds <= 0 {
		o.Seeds = p.Seeds
	}
	if len(o.LengthFactors) == 0 {
		o.LengthFactors = p.LengthFactors
	}
	if len(o.Lengths) == 0 {
		o.Lengths = p.Lengths
	}
	if len(o.SNRs) == 0 {
		o.SNRs = p.SNRs
	}
	if o.PerClass <= 0 {
		o.PerClass = p.PerClass
	}
	if o.HoldoutPerClass <= 0 {
		o.HoldoutPerClass = p.HoldoutPerClass
	}
	if o.HoldoutTrees <= 0 {
		o.HoldoutTrees = p.HoldoutTrees
	}
	if o.HoldoutMaxLength <= 0 {
		o.HoldoutMaxLength = p.HoldoutMaxLength
	}
	if o.HoldoutMaxLength < 512 {
		return Options{}, fmt.Errorf("%w: holdout length cap %d: want at least 512", ErrOptions, o.HoldoutMaxLength)
	}
	if len(o.ThroughputSizes) == 0 {
		o.ThroughputSizes = p.ThroughputSizes
	}
	if o.ThroughputRepeats <= 0 {
		o.ThroughputRepeats = p.ThroughputRepeats
	}
	if o.SlowCall <= 0 {
		o.SlowCall = p.SlowCall
	}
	if o.PlaneLength <= 0 {
		o.PlaneLength = p.PlaneLength
	}
	if o.PlaneOrder <= 0 {
		o.PlaneOrder = p.PlaneOrder
	}
	if o.DegreeLength <= 0 {
		o.DegreeLength = p.DegreeLength
	}
	if o.Workers <= 0 {
		o.Workers = runtime.GOMAXPROCS(0)
	}
	for _, f := range o.LengthFactors {
		if !(f >= 0.1 && f <= 100) {
			return Options{}, fmt.Errorf("%w: length factor %g: want 0.1..100", ErrOptions, f)
		}
	}
	for _, l := range o.Lengths {
		if l < features.MinLength || l > 1<<24 {
			return Options{}, fmt.Errorf("%w: classification length %d: want %d..%d", ErrOptions, l, features.MinLength, 1<<24)
		}
	}
	for _, s := range o.SNRs {
		if math.IsNaN(s) || math.IsInf(s, -1) || s < -20 {
			return Options{}, fmt.Errorf("%w: SNR %g dB: want a value ≥ −20 dB or +Inf", ErrOptions, s)
		}
	}
	for _, n := range o.ThroughputSizes {
		if n < features.MinLength || n > 1<<24 {
			return Options{}, fmt.Errorf("%w: throughput size %d: want %d..%d", ErrOptions, n, features.MinLength, 1<<24)
		}
	}
	if o.PlaneLength < 1000 || o.DegreeLength < 1000 {
		return Options{}, fmt.Errorf("%w: plane length %d, degree length %d: want at least 1000", ErrOptions, o.PlaneLength, o.DegreeLength)
	}
	known := classifier.ReferenceSystems()
	for _, s := range o.Systems {
		if !slices.Contains(known, s) {
			return Options{}, fmt.Errorf("%w: %q is not a reference system", ErrOptions, s)
		}
	}
	ids := InvariantIDs()
	for _, id := range o.Invariants {
		if !slices.Contains(ids, id) {
			return Options{}, fmt.Errorf("%w: %q is not an invariant check (see InvariantIDs)", ErrOptions, id)
		}
	}
	return o, nil
}
