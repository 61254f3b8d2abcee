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

// ExampleSystem_ClassFrom labels single series of the Chirikov standard map
// at K = 1.5, where a chaotic sea surrounds regular islands (the registry's
// label rule: λ1 of the tangent map along the series' own orbit against
// 0.01 per iteration). Class labels the parameters from a fixed start;
// ClassFrom labels the series that Generate draws from a generator in the
// same state, so a start on an island gives a regular series.
func ExampleSystem_ClassFrom() {
	s, err := generators.Lookup("standard-map")
	if err != nil {
		fmt.Println(err)
		return
	}
	class, _ := s.Class(nil)
	fmt.Println("K = 1.5:", class)
	for seed := uint64(6); seed <= 8; seed++ {
		label, err := s.ClassFrom(nil, rand.New(rand.NewPCG(seed, 2)))
		if err != nil {
			fmt.Println(err)
			return
		}
		// The series this label belongs to:
		x, err := s.Generate(1000, nil, rand.New(rand.NewPCG(seed, 2)))
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("seed %d: %d samples, %s\n", seed, len(x), label)
	}
	// Output:
	// K = 1.5: chaotic
	// seed 6: 1000 samples, chaotic
	// seed 7: 1000 samples, regular
	// seed 8: 1000 samples, chaotic
}
