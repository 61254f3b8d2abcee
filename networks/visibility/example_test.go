package visibility_test

import (
	"fmt"

	"github.com/tracesift/tracesift/networks/visibility"
)

// Build both graphs of a short series and read degrees and time-directed
// degrees.
func ExampleHorizontal() {
	x := []float64{3, 1, 2, 5, 1, 4}
	g, err := visibility.Horizontal(x, visibility.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for i := 0; i < g.Len(); i++ {
		fmt.Println(i, g.Neighbors(i), "in", g.InDegree(i), "out", g.OutDegree(i))
	}
	// Output:
	// 0 [1 2 3] in 0 out 3
	// 1 [0 2] in 1 out 1
	// 2 [0 1 3] in 2 out 1
	// 3 [0 2 4 5] in 2 out 2
	// 4 [3 5] in 1 out 1
	// 5 [3 4] in 2 out 0
}

func ExampleNatural() {
	x := []float64{3, 1, 2, 5, 1, 4}
	g, _ := visibility.Natural(x, visibility.Options{})
	fmt.Println(g.Edges(), "edges; node 3 sees", g.Neighbors(3))
	// Output: 9 edges; node 3 sees [0 1 2 4 5]
}
