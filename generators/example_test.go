package generators_test

import (
	"fmt"
	"math/rand/v2"
	"sort"

	"github.com/tracesift/tracesift/generators"
)

// Example looks a system up by name, labels it at a chosen parameter and
// generates a series with its time column.
func Example() {
	s, err := generators.Lookup("logistic")
	if err != nil {
		fmt.Println(err)
		return
	}
	set := map[string]float64{"r": 3.5}
	class, err := s.Class(set)
	if err != nil {
		fmt.Println(err)
		return
	}
	x, err := s.Generate(400, set, rand.New(rand.NewPCG(1, 2)))
	if err != nil {
		fmt.Println(err)
		return
	}
	dt, _ := s.SampleInterval(set)
	t := generators.Times(len(x), dt)
	cycle := append([]float64(nil), x[:4]...)
	sort.Float64s(cycle)
	fmt.Println(s.Name, class, s.TimeAxis, t[0], t[len(t)-1])
	fmt.Printf("period-4 cycle: %.6f %.6f %.6f %.6f\n", cycle[0], cycle[1], cycle[2], cycle[3])
	// Output:
	// logistic regular iteration 0 399
	// period-4 cycle: 0.382820 0.500884 0.826941 0.874997
}

// ExampleSystem_GenerateNoisy draws the Lorenz flow seen through
// measurement noise at 20 dB; the label stays the system's.
func ExampleSystem_GenerateNoisy() {
	s, _ := generators.Lookup("lorenz")
	x, err := s.GenerateNoisy(1000, nil, 20, rand.New(rand.NewPCG(3, 4)))
	if err != nil {
		fmt.Println(err)
		return
	}
	class, _ := s.Class(nil)
	dt, _ := s.SampleInterval(nil)
	fmt.Println(len(x), class, s.TimeAxis, dt)
	// Output: 1000 chaotic time 0.01
}
