package benchmarks

import (
	"fmt"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
)

// HoldoutSeedOffset is added to Options.Seed to seed the reference set of
// the leave-one-family-out section (distinct from the training seed of the
// default model and from the classification plan).
const HoldoutSeedOffset = 2000

// HoldoutResult is the leave-one-family-out validation: a reference set is
// drawn afresh (every family, the full recording chain), and every family
// is predicted by a forest trained on the others only. It measures what
// to expect on kinds of dynamics the model has never seen, per family,
// length and SNR, and how well the probabilities are calibrated.
type HoldoutResult struct {
	Design     string                `json:"design"`
	PlanSeed   uint64                `json:"plan_seed"`
	PerClass   int                   `json:"per_class"`
	Dropped    int                   `json:"dropped"`
	Validation classifier.Validation `json:"validation"`
}

// runHoldout builds the reference set of the section and validates it.
func runHoldout(o Options) (*HoldoutResult, error) {
	seed := HoldoutSeedOffset + o.Seed
	ropts := classifier.ReferenceOptions{PerClass: o.HoldoutPerClass, MaxLength: o.HoldoutMaxLength, Seed: seed, Systems: o.Systems, Workers: o.Workers}
	if o.Progress != nil {
		ropts.Progress = func(done, total int) { o.Progress("holdout series", done, total) }
	}
	plan, err := classifier.ReferencePlan(ropts)
	if err != nil {
		return nil, err
	}
	ds, kept, err := classifier.BuildReference(ropts, features.Options{Seed: o.Seed})
	if err != nil {
		return nil, err
	}
	cfg := classifier.Config{Trees: o.HoldoutTrees, Seed: o.Seed, Workers: o.Workers}
	cv, err := classifier.CrossValidate(ds, classifier.LeaveOneGroupOut, cfg)
	if err != nil {
		return nil, err
	}
	lengths := make([]string, len(kept))
	snrs := make([]string, len(kept))
	for i, s := range kept {
		lengths[i] = LengthRange(s.N)
		snrs[i] = SNRRange(s.SNR())
	}
	v, err := classifier.Validate(cv, ds, "leave-one-family-out",
		classifier.Stratification{Name: "family", Labels: ds.Groups},
		classifier.Stratification{Name: "length", Labels: lengths, Order: LengthRangeOrder},
		classifier.Stratification{Name: "snr", Labels: snrs, Order: SNRRangeOrder})
	if err != nil {
		return nil, err
	}
	return &HoldoutResult{
		Design: fmt.Sprintf("classifier.BuildReference with seed %d and PerClass %d (every reference family, lengths 512–%d log-uniform, the full recording chain); "+
			"each family predicted by a %d-tree forest trained on all the other families (classifier.CrossValidate with LeaveOneGroupOut); feature seed %d",
			seed, o.HoldoutPerClass, o.HoldoutMaxLength, o.HoldoutTrees, o.Seed),
		PlanSeed: seed, PerClass: o.HoldoutPerClass, Dropped: len(plan) - len(kept), Validation: v,
	}, nil
}

// Length and SNR ranges of the validation breakdowns, shared with the train
// command so that its summary and the suite's read alike.
var (
	LengthRangeOrder = []string{"< 1000", "1000–1999", "2000–4999", "5000–9999", "≥ 10000"}
	SNRRangeOrder    = []string{"clean", "≥ 30 dB", "20–30 dB", "15–20 dB", "10–15 dB", "lab trace"}
)

// LengthRange names the length range of a series of n samples.
func LengthRange(n int) string {
	switch {
	case n < 1000:
		return LengthRangeOrder[0]
	case n < 2000:
		return LengthRangeOrder[1]
	case n < 5000:
		return LengthRangeOrder[2]
	case n < 10000:
		return LengthRangeOrder[3]
	}
	return LengthRangeOrder[4]
}

// SNRRange names the measurement-SNR range of a series (+Inf: clean).
func SNRRange(db float64) string {
	switch {
	case db > 1e300:
		return SNRRangeOrder[0]
	case db >= 30:
		return SNRRangeOrder[1]
	case db >= 20:
		return SNRRangeOrder[2]
	case db >= 15:
		return SNRRangeOrder[3]
	}
	return SNRRangeOrder[4]
}
