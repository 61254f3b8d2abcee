package networks_test

import (
	"fmt"
	"os"

	"github.com/tracesift/tracesift/networks"

	"github.com/tracesift/tracesift/networks/visibility"
)

// Measure everything and write the edge list.
func ExampleMeasure() {
	x := []float64{0.1, 0.9, 0.3, 0.7, 0.2, 0.8, 0.4, 0.6, 0.5, 0.35}
	g, _ := visibility.Horizontal(x, visibility.Options{})
	m, err := networks.Measure(g, networks.MeasureOptions{Seed: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: n=%d E=%d <k>=%.2f C=%.3f diameter=%d\n", m.Kind, m.Nodes, m.Edges, m.MeanDegree, m.ClusteringMean, m.Diameter)
	networks.WriteEdgeList(os.Stdout, g)
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
