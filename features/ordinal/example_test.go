package ordinal_test

import (
	"fmt"

	"github.com/tracesift/tracesift/features/ordinal"
)

// The logistic map at r = 4 never produces three decreasing values in a
// row, and its statistical complexity lies close to the upper boundary of
// the complexity–entropy plane.
func Example() {
	x := make([]float64, 20000)
	v := 0.3
	for i := range x {
		v = 4 * v * (1 - v)
		x[i] = v
	}
	m, err := ordinal.Missing(x, ordinal.Options{Order: 3})
	if err != nil {
		fmt.Println(err)
		return
	}
	p, _ := ordinal.Pattern(m.Codes[0], 3)
	fmt.Println("missing pattern (ranks):", p)

	c, err := ordinal.Complexity(x, ordinal.Options{Order: 6})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("H = %.2f, C = %.2f, C/C_max = %.2f\n", c.Entropy, c.Complexity, c.Complexity/c.MaxComplexity)
	// Output:
	// missing pattern (ranks): [2 1 0]
	// H = 0.63, C = 0.48, C/C_max = 0.98
}
