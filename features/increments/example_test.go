package increments_test

import (
	"fmt"
	"math/rand/v2"

	"github.com/tracesift/tracesift/features/increments"
)

// Telegraph-like switching shows as fat-tailed increments.
func Example() {
	rng := rand.New(rand.NewPCG(1, 2))
	x := make([]float64, 1<<15)
	state := 1.0
	for i := range x {
		if rng.Float64() < 0.01 {
			state = -state
		}
		x[i] = 1e-6 * (state + 0.05*rng.NormFloat64()) // amperes
	}
	r, err := increments.Analyze(x, increments.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("excess kurtosis > 20: %v; KS above the 5%% critical value: %v\n",
		r.ExcessKurtosis > 20, r.KS > r.KSCritical)
	// Output:
	// excess kurtosis > 20: true; KS above the 5% critical value: true
}
