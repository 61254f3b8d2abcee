package groups_test

import (
	"fmt"
	"math"
	"os"

	"github.com/tracesift/tracesift/groups"
)

// The worked example of scipy.stats.mannwhitneyu's documentation: U = 17,
// exact two-sided p = 14/126.
func ExampleMannWhitney() {
	males := []float64{19, 22, 16, 29, 24}
	females := []float64{20, 11, 17, 12}
	r, err := groups.MannWhitney(males, females, groups.MWOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("U = %g, p = %.4f (%s)\n", r.U, r.P, r.Method)
	// Output: U = 17, p = 0.1111 (exact)
}

// Complete separation of 5 versus 5 values: only 2 of the C(10, 5) = 252
// orderings reach D = 1.
func ExampleKS() {
	a := []float64{1, 2, 3, 4, 5}
	b := []float64{6, 7, 8, 9, 10}
	r, _ := groups.KS(a, b, groups.KSOptions{})
	fmt.Printf("D = %g, p = %.6f = 2/252\n", r.D, r.P)
	// Output: D = 1, p = 0.007937 = 2/252
}

// Holm and Benjamini–Hochberg adjusted p-values of four tests.
func ExampleAdjust() {
	p := []float64{0.01, 0.04, 0.03, 0.005}
	holm, _ := groups.Adjust(p, groups.AdjustHolm)
	bh, _ := groups.Adjust(p, groups.AdjustBH)
	fmt.Println(holm)
	fmt.Println(bh)
	// Output:
	// [0.03 0.06 0.06 0.02]
	// [0.02 0.04 0.04 0.02]
}

// Compare two small groups on two features and print the CSV.
func ExampleCompare() {
	nan := math.NaN()
	samples := []groups.Sample{
		{File: "f1.csv", Group: "fresh", Param: nan, Values: []float64{0.51, 1.02}},
		{File: "f2.csv", Group: "fresh", Param: nan, Values: []float64{0.49, 0.97}},
		{File: "f3.csv", Group: "fresh", Param: nan, Values: []float64{0.50, 1.01}},
		{File: "f4.csv", Group: "fresh", Param: nan, Values: []float64{0.52, nan}},
		{File: "s1.csv", Group: "stressed", Param: nan, Values: []float64{0.71, 0.99}},
		{File: "s2.csv", Group: "stressed", Param: nan, Values: []float64{0.69, 1.03}},
		{File: "s3.csv", Group: "stressed", Param: nan, Values: []float64{0.74, 0.98}},
		{File: "s4.csv", Group: "stressed", Param: nan, Values: []float64{0.70, 1.00}},
	}
	r, err := groups.Compare([]string{"sc_fluct_a1", "hv_tail_exprate"}, samples, groups.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, t := range r.Pairs[0].Tests {
		fmt.Printf("%s: n %d/%d, δ = %+.2f (%s), MW p = %.4f, Holm p = %.4f, significant %v\n",
			t.Feature, t.A.N, t.B.N, t.CliffDelta, t.Magnitude, t.MW.P, t.MWAdj, t.Significant)
	}
	_ = groups.WriteCSV(os.Stdout, groups.Result{}) // header only
	// Output:
	// sc_fluct_a1: n 4/4, δ = +1.00 (large), MW p = 0.0286, Holm p = 0.0571, significant false
	// hv_tail_exprate: n 3/4, δ = +0.00 (negligible), MW p = 1.0000, Holm p = 1.0000, significant false
	// group_a,group_b,feature,tested,n_a,n_b,missing_a,missing_b,median_a,median_b,q1_a,q3_a,q1_b,q3_b,iqr_a,iqr_b,mad_a,mad_b,median_diff,median_diff_mad,hodges_lehmann,cliff_delta,magnitude,ks_d,ks_p,ks_method,ks_p_adj,mw_u,mw_z,mw_p,mw_method,mw_p_adj,adjust,family,test,alpha,significant,note
}
