package scaling_test

import (
	"fmt"
	"math/rand/v2"

	"github.com/tracesift/tracesift/features/scaling"
)

// A random walk has DFA exponent 1.5 and spectral slope 2.
func Example() {
	rng := rand.New(rand.NewPCG(1, 2))
	x := make([]float64, 1<<16)
	var s float64
	for i := range x {
		s += rng.NormFloat64()
		x[i] = s
	}
	d, err := scaling.DFA(x, scaling.DFAOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	b, err := scaling.SpectralSlope(x, scaling.SlopeOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("DFA-1 α = %.2f over windows %d…%d (%d scales)\n", d.Alpha, d.MinWindow, d.MaxWindow, d.Points)
	fmt.Printf("β = %.2f over %.5f…%.2f cycles/sample\n", b.Beta, b.FMin, b.FMax)
	// Output:
	// DFA-1 α = 1.49 over windows 10…16384 (20 scales)
	// β = 2.00 over 0.00024…0.25 cycles/sample
}

// The decay time of an AR(1) process with φ = e^{−1/10} is 10 samples.
func ExampleDecayTime() {
	rng := rand.New(rand.NewPCG(3, 4))
	x := make([]float64, 1<<16)
	var v float64
	for i := range x {
		v = 0.904837418*v + rng.NormFloat64()
		x[i] = v
	}
	r, err := scaling.DecayTime(x, scaling.DecayOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("1/e decay after about %.0f samples\n", r.Time)
	// Output:
	// 1/e decay after about 10 samples
}
