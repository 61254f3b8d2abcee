package groups

import (
	"fmt"
)

// Test names the test whose adjusted p-value sets FeatureTest.Significant.
type Test string

// The tests.
const (
	TestMW Test = "mann-whitney" // location shift (the default)
	TestKS Test = "ks"           // any difference of distribution
)

// Family names the set of p-values adjusted together.
type Family string

// The families.
const (
	// FamilyPair adjusts across the features within each pair of groups
	// (the default): each pair answers its own question, "which features
	// differ between these two groups".
	FamilyPair Family = "pair"
	// FamilyAll adjusts across all pairs and features together: stricter,
	// for a single claim over the whole comparison.
	FamilyAll Family = "all"
)

// Options control Compare. The zero value means the documented defaults.
type Options struct {
	// Alpha is the significance level applied to adjusted p-values;
	// 0 means 0.05. A test is significant when its adjusted p ≤ Alpha.
	Alpha float64
	// Adjust is the multiple-testing adjustment; "" means AdjustHolm.
	Adjust Adjustment
	// Family is the set adjusted together; "" means FamilyPair.
	Family Family
	// Test selects the test behind Significant; "" means TestMW.
	Test Test
	// Reference, when set, compares every other group against it
	// (A = Reference, B = the other group) instead of all pairs.
	Reference string
	// AllPairs forces all pairs also with more than four groups (by
	// default more than four groups are compared against the first one).
	AllPairs bool
	// Groups, when set, selects and orders the groups; otherwise groups
	// appear in the order of their first sample.
	Groups []string
	// MinSamples is the smallest number of finite values per group for
	// which a feature is tested; 0 means 3. Smaller groups get a note
	// instead of a p-value (effect sizes are still given when n ≥ 1).
	MinSamples int
	// KS and MW control the two tests' p-value methods.
	KS KSOptions
	MW MWOptions
	// DistributionPoints bounds the points kept per pooled distribution
	// in the result (for the ECDF plots and JSON); 0 means 256.
	DistributionPoints int
	// Workers bounds the goroutines used; 0 means runtime.GOMAXPROCS.
	// The result does not depend on it.
	Workers int
}

// Settings records the options a Result was computed with, defaults
// resolved.
type Settings struct {
	Alpha      float64    `json:"alpha"`
	Adjust     Adjustment `json:"adjust"`
	Family     Family     `json:"family"`
	Test       Test       `json:"test"`
	Reference  string     `json:"reference,omitempty"`
	AllPairs   bool       `json:"all_pairs"`
	MinSamples int        `json:"min_samples"`
	KSMethod   Method     `json:"ks_method"`
	KSExactMax int        `json:"ks_exact_max"`
	MWMethod   Method     `json:"mw_method"`
	MWExactMax int        `json:"mw_exact_max"`
}

// resolve fills the defaults and checks the enumerations.
func (o Options) resolve() (Options, error) {
	if o.Alpha == 0 {
		o.Alpha = 0.05
	}
	if !(o.Alpha > 0 && o.Alpha < 1) {
		return o, fmt.Errorf("alpha %v outside (0, 1)", o.Alpha)
	}
	switch o.Adjust {
	case "":
		o.Adjust = AdjustHolm
	case AdjustHolm, AdjustBH, AdjustNone:
	default:
		return o, fmt.Errorf("unknown p-value adjustment %q", o.Adjust)
	}
	switch o.Family {
	case "":
		o.Family = FamilyPair
	case FamilyPair, FamilyAll:
	default:
		return o, fmt.Errorf("unknown adjustment family %q", o.Family)
	}
	switch o.Test {
	case "":
		o.Test = TestMW
	case TestMW, TestKS:
	default:
		return o, fmt.Errorf("unknown test %q", o.Test)
	}
	if o.MinSamples <= 0 {
		o.MinSamples = 3
	}
	if o.KS.ExactMax <= 0 {
		o.KS.ExactMax = DefaultKSExactMax
	}
	if o.MW.ExactMax <= 0 {
		o.MW.ExactMax = DefaultMWExactMax
	}
	for _, m := range []Method{o.KS.Method, o.MW.Method} {
		switch m {
		case MethodAuto, MethodExact, MethodAsymptotic:
		default:
			return o, fmt.Errorf("unknown p-value method %q", m)
		}
	}
	if o.DistributionPoints <= 0 {
		o.DistributionPoints = 256
	}
	return o, nil
}
