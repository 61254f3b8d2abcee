package visibility_test

import (
	"fmt"
	"os"

	"github.com/tracesift/tracesift/features/visibility"
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

// Measure everything and write the edge list.
func ExampleMeasure() {
	x := []float64{0.1, 0.9, 0.3, 0.7, 0.2, 0.8, 0.4, 0.6, 0.5, 0.35}
	g, _ := visibility.Horizontal(x, visibility.Options{})
	m, err := visibility.Measure(g, visibility.MeasureOptions{Seed: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: n=%d E=%d <k>=%.2f C=%.3f diameter=%d\n", m.Kind, m.Nodes, m.Edges, m.MeanDegree, m.ClusteringMean, m.Diameter)
	visibility.WriteEdgeList(os.Stdout, g)
	// Output:
	// hvg: n=10 E=13 <k>=2.60 C=0.447 diameter=5
	// source,target
	// 0,1
	// 1,2
	// 1,3
	// 1,5
	// 2,3
	// 3,4
	// 3,5
	// 4,5
	// 5,6
	// 5,7
	// 6,7
	// 7,8
	// 8,9
}
