package groups

import (
	"math"
	"testing"
)

// TestLegendPanelHasEveryGroup: the curve grid's legend goes to the first
// panel where every group has a value, so no group is left out of the key
// when the first feature is missing for one group (as the Lyapunov
// exponent is for noise).
func TestLegendPanelHasEveryGroup(t *testing.T) {
	nan := math.NaN()
	r := Result{
		Features: []string{"a", "b"},
		Groups:   []GroupInfo{{}, {}},
		Curves: []Curve{
			{Feature: "a", Group: "g1", Levels: []Level{{Param: 1, N: 0, Median: nan}}},
			{Feature: "a", Group: "g2", Levels: []Level{{Param: 1, N: 3, Median: 2}}},
			{Feature: "b", Group: "g1", Levels: []Level{{Param: 1, N: 3, Median: 1}}},
			{Feature: "b", Group: "g2", Levels: []Level{{Param: 1, N: 3, Median: nan}, {Param: 2, N: 2, Median: 5}}},
		},
	}
	if got := groupsWithValues(r, "a"); got != 1 {
		t.Errorf("feature a: %d groups with values, want 1", got)
	}
	if got := groupsWithValues(r, "b"); got != 2 {
		t.Errorf("feature b: %d groups with values, want 2", got)
	}
	if got := groupsWithValues(r, "missing"); got != 0 {
		t.Errorf("unknown feature: %d, want 0", got)
	}
}
