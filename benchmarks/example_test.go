package benchmarks_test

import (
	"fmt"

	"github.com/tracesift/tracesift/benchmarks"
)

// Two invariant checks alone, without a model: the HVG mean degree of white
// noise and the forbidden ordinal pattern of the logistic map (rows come in
// report order, see InvariantIDs).
func ExampleRun() {
	r, err := benchmarks.Run(nil, benchmarks.Options{
		Seed:               1,
		Seeds:              2,
		Invariants:         []string{"perm_missing_d3/logistic", "hv_deg_mean/white"},
		SkipClassification: true,
		SkipHoldout:        true,
		SkipPictures:       true,
		SkipThroughput:     true,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, row := range r.Invariants {
		fmt.Printf("%s: published %s; %d runs; within tolerance: %v\n", row.ID, row.Published, len(row.Runs), row.Within)
	}
	// Output:
	// hv_deg_mean/white: published 4; 2 runs; within tolerance: true
	// perm_missing_d3/logistic: published 1; 2 runs; within tolerance: true
}
