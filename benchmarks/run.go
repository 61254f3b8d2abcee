package benchmarks

import (
	"errors"
	"fmt"
	"math"
	"time"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
)

// Caution is the screening caution every report carries.
const Caution = "The verdict is a screening aid, not a device qualification result: defer to your laboratory's qualification procedures and the applicable reliability standards. " +
	"The accuracies below are measured on synthetic reference systems; real traces can hold dynamics none of them covers, which the classifier reports as undetermined at best."

// Result is everything one run of the suite measured. Sections left out by
// the Options are nil (or empty).
type Result struct {
	// Suite names the benchmark and Caution is the screening caution.
	Suite    string   `json:"suite"`
	Caution  string   `json:"caution"`
	Settings Settings `json:"settings"`
	// Model describes the classifier model measured (nil without one).
	Model *ModelInfo `json:"model"`
	// Invariants and SkippedInvariants: section 1.
	Invariants        []InvariantRow     `json:"invariants"`
	SkippedInvariants []SkippedInvariant `json:"skipped_invariants"`
	// Classification: section 2, on fresh seeds of the reference systems.
	Classification *ClassificationResult `json:"classification"`
	// Holdout: section 2b, leave-one-family-out on a fresh reference set.
	Holdout *HoldoutResult `json:"holdout"`
	// Degrees and Plane picture the method on the reference systems.
	Degrees *DegreeResult `json:"hvg_degrees"`
	Plane   *PlaneResult  `json:"complexity_entropy"`
	// Throughput: section 3 (machine-dependent).
	Throughput *ThroughputResult `json:"throughput"`
	// Elapsed is the wall time of each stage (machine-dependent).
	Elapsed *Elapsed `json:"elapsed"`
}

// Settings are the resolved Options the run used.
type Settings struct {
	Scale             Scale     `json:"scale"`
	Seed              uint64    `json:"seed"`
	Seeds             int       `json:"seeds"`
	LengthFactors     []float64 `json:"length_factors"`
	Invariants        []string  `json:"invariants,omitempty"`
	Lengths           []int     `json:"lengths"`
	SNRs              []Float   `json:"snr_db"`
	PerClass          int       `json:"per_class"`
	HoldoutPerClass   int       `json:"holdout_per_class"`
	HoldoutTrees      int       `json:"holdout_trees"`
	HoldoutMaxLength  int       `json:"holdout_max_length"`
	Systems           []string  `json:"systems,omitempty"`
	ThroughputSizes   []int     `json:"throughput_sizes"`
	ThroughputRepeats int       `json:"throughput_repeats"`
	SlowCall          float64   `json:"slow_call_seconds"`
	PlaneLength       int       `json:"plane_length"`
	PlaneOrder        int       `json:"plane_order"`
	DegreeLength      int       `json:"degree_length"`
	FeatureSchema     string    `json:"feature_schema"`
	// Skipped names the sections the Options left out.
	Skipped []string `json:"skipped,omitempty"`
}

// ModelInfo identifies the classifier model measured.
type ModelInfo struct {
	Source      string `json:"source"`
	Description string `json:"description"`
	Rows        int    `json:"rows"`
	Trees       int    `json:"trees"`
	Seed        uint64 `json:"seed"`
	Schema      string `json:"schema"`
	// OOBAccuracy is the model's out-of-bag accuracy; CVAccuracy its
	// held-out accuracy when stored (leave-one-family-out for models from
	// 'train --reference'; null otherwise) and CVMethod how it was held out.
	OOBAccuracy    Float  `json:"oob_accuracy"`
	CVAccuracy     Float  `json:"cv_accuracy"`
	CVMethod       string `json:"cv_method,omitempty"`
	MinProbability Float  `json:"min_probability"`
}

// Elapsed is the wall time of each stage in seconds. It depends on the
// machine (MachineDependent is always true).
type Elapsed struct {
	MachineDependent bool  `json:"machine_dependent"`
	Invariants       Float `json:"invariants"`
	Classification   Float `json:"classification"`
	Holdout          Float `json:"holdout"`
	Pictures         Float `json:"pictures"`
	Throughput       Float `json:"throughput"`
	Total            Float `json:"total"`
}

// ErrNoModel is returned by Run when the classification or the screening
// throughput is requested without a model.
var ErrNoModel = errors.New("the classification benchmark needs a model")

// Run measures the suite with model m (which may be nil only when
// SkipClassification is set; the screening throughput is then left out).
// The result depends only on the options and the model, except Throughput
// and Elapsed.
func Run(m *classifier.Model, opts Options) (*Result, error) {
	o, err := opts.Resolved()
	if err != nil {
		return nil, err
	}
	if m == nil && !o.SkipClassification {
		return nil, ErrNoModel
	}
	start := time.Now()
	res := &Result{
		Suite:   "tracesift reference benchmark",
		Caution: Caution,
		Settings: Settings{
			Scale: o.Scale, Seed: o.Seed, Seeds: o.Seeds, LengthFactors: o.LengthFactors, Invariants: o.Invariants,
			Lengths: o.Lengths, PerClass: o.PerClass, HoldoutPerClass: o.HoldoutPerClass, HoldoutTrees: o.HoldoutTrees, HoldoutMaxLength: o.HoldoutMaxLength, Systems: o.Systems,
			ThroughputSizes: o.ThroughputSizes, ThroughputRepeats: o.ThroughputRepeats, SlowCall: o.SlowCall,
			PlaneLength: o.PlaneLength, PlaneOrder: o.PlaneOrder, DegreeLength: o.DegreeLength,
			FeatureSchema: fmt.Sprintf("v%d %s", features.SchemaVersion, features.SchemaHash()),
		},
		Elapsed: &Elapsed{MachineDependent: true},
	}
	for _, s := range o.SNRs {
		res.Settings.SNRs = append(res.Settings.SNRs, Float(s))
	}
	for _, sk := range []struct {
		skip bool
		name string
	}{{o.SkipInvariants, "invariants"}, {o.SkipClassification, "classification"}, {o.SkipHoldout, "holdout"}, {o.SkipPictures, "pictures"}, {o.SkipThroughput, "throughput"}} {
		if sk.skip {
			res.Settings.Skipped = append(res.Settings.Skipped, sk.name)
		}
	}
	if m != nil {
		res.Model = modelInfo(m)
	}
	stage := time.Now()
	if !o.SkipInvariants {
		if res.Invariants, res.SkippedInvariants, err = runInvariants(o); err != nil {
			return nil, fmt.Errorf("invariants: %w", err)
		}
	}
	res.Elapsed.Invariants = Float(time.Since(stage).Seconds())

	stage = time.Now()
	if !o.SkipClassification {
		if res.Classification, err = runClassification(m, o); err != nil {
			return nil, fmt.Errorf("classification: %w", err)
		}
	}
	res.Elapsed.Classification = Float(time.Since(stage).Seconds())

	stage = time.Now()
	if !o.SkipHoldout {
		if res.Holdout, err = runHoldout(o); err != nil {
			return nil, fmt.Errorf("leave-one-family-out: %w", err)
		}
	}
	res.Elapsed.Holdout = Float(time.Since(stage).Seconds())

	stage = time.Now()
	if !o.SkipPictures {
		if res.Degrees, err = runDegrees(o); err != nil {
			return nil, err
		}
		if res.Plane, err = runPlane(o); err != nil {
			return nil, fmt.Errorf("complexity–entropy plane: %w", err)
		}
	}
	res.Elapsed.Pictures = Float(time.Since(stage).Seconds())

	stage = time.Now()
	if !o.SkipThroughput {
		res.Throughput = runThroughput(m, o)
	}
	res.Elapsed.Throughput = Float(time.Since(stage).Seconds())
	res.Elapsed.Total = Float(time.Since(start).Seconds())
	return res, nil
}

func modelInfo(m *classifier.Model) *ModelInfo {
	mi := &ModelInfo{
		Source: m.Source, Description: m.Training.Description, Rows: m.Training.Rows, Trees: m.NumTrees(),
		Seed: m.Config.Seed, Schema: fmt.Sprintf("v%d %s", m.Config.Schema.Version, m.Config.Schema.Hash),
		OOBAccuracy: Float(m.OOB.Accuracy), CVAccuracy: Float(math.NaN()), MinProbability: Float(m.Config.MinProbability),
	}
	if mi.Source == "" {
		mi.Source = "(in memory)"
	}
	if m.CV != nil {
		mi.CVAccuracy, mi.CVMethod = Float(m.CV.Accuracy), fmt.Sprintf("%d-fold grouped cross-validation", m.CV.Folds)
	}
	if v := m.Validation; v != nil {
		mi.CVAccuracy, mi.CVMethod = Float(v.Overall.Accuracy), v.Method
	}
	return mi
}
