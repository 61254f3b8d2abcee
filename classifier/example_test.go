package classifier_test

import (
	"bytes"
	"fmt"
	"math"
	"math/rand/v2"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/generators"
	"github.com/tracesift/tracesift/models"
)

// Example trains a small forest on two features where only "gap" decides
// the class, classifies a new vector, names the feature that drove the
// decision, and round-trips the model through its file format.
func Example() {
	rng := rand.New(rand.NewPCG(1, 2))
	ds := classifier.Dataset{Features: []string{"gap", "noise"}, Description: "toy data"}
	for i := 0; i < 200; i++ {
		gap, label := rng.Float64(), "regular"
		if i%2 == 1 {
			gap, label = gap+2, "chaotic"
		}
		ds.X = append(ds.X, []float64{gap, rng.NormFloat64()})
		ds.Y = append(ds.Y, label)
	}
	m, err := classifier.Train(ds, classifier.Config{Trees: 25, Seed: 7})
	if err != nil {
		fmt.Println(err)
		return
	}
	pr, err := m.Predict([]float64{2.5, 0.1})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s p=%.2f driven by %s\n", pr.Label(), pr.Probabilities[pr.Index], pr.Drivers(1)[0].Feature)

	// Far beyond the training range of gap, but otherwise a clear case: the
	// verdict stands and the feature is noted (the novelty measure, not one
	// feature, decides what the model cannot place).
	out, _ := m.Predict([]float64{9, 0.1})
	fmt.Println(out.Label(), out.OutOfRange, out.Novelty.Percentile < out.Novelty.Limit)

	var file bytes.Buffer
	if err := m.Write(&file); err != nil {
		fmt.Println(err)
		return
	}
	back, err := classifier.Read(&file)
	if err != nil {
		fmt.Println(err)
		return
	}
	again, _ := back.Predict([]float64{2.5, 0.1})
	fmt.Println(again.Probabilities[again.Index] == pr.Probabilities[pr.Index])
	// Output:
	// chaotic p=1.00 driven by gap
	// chaotic [gap] true
	// true
}

// ExampleCrossValidate estimates accuracy by stratified 5-fold
// cross-validation.
func ExampleCrossValidate() {
	rng := rand.New(rand.NewPCG(3, 4))
	ds := classifier.Dataset{Features: []string{"a", "b"}}
	for i := 0; i < 100; i++ {
		a, label := rng.Float64(), "stochastic"
		if i%2 == 1 {
			a, label = a+1.5, "chaotic"
		}
		ds.X = append(ds.X, []float64{a, rng.Float64()})
		ds.Y = append(ds.Y, label)
	}
	cv, err := classifier.CrossValidate(ds, 5, classifier.Config{Trees: 20, Seed: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(cv.Classes, cv.Confusion, cv.Accuracy)
	// Output:
	// [chaotic stochastic] [[50 0] [0 50]] 1
}

// ExampleScreen classifies two generated traces with the embedded default
// model: the Lorenz flow seen through white measurement noise at 20 dB
// (chaotic: λ1 ≈ 0.906 per time unit, Sprott (2003), confirmed: sprott.physics.wisc.edu/chaos/lorenzle.htm, the
// registry's invariant) and an AR(1) process (stochastic). Screen
// measures the features, votes, names the drivers and applies the
// undetermined rule; the caller checks the model's feature schema first.
func ExampleScreen() {
	m, err := classifier.Read(bytes.NewReader(models.Default()))
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := m.CheckSchema(classifier.Schema{Version: features.SchemaVersion, Hash: features.SchemaHash()}); err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range []struct {
		system string
		snrDB  float64
	}{{"lorenz", 20}, {"ar1", math.Inf(1)}} {
		sys, err := generators.Lookup(c.system)
		if err != nil {
			fmt.Println(err)
			return
		}
		x, err := sys.GenerateNoisy(4096, nil, c.snrDB, rand.New(rand.NewPCG(5, 6)))
		if err != nil {
			fmt.Println(err)
			return
		}
		v, err := classifier.Screen(m, x, classifier.ScreenOptions{Features: features.Options{Seed: 1}})
		if err != nil {
			fmt.Println(err)
			return
		}
		var top float64
		for i, class := range v.Classes {
			if class == v.Top {
				top = v.Probabilities[i]
			}
		}
		// At least 0.7 on the true class, the bar of the demo verdict test
		// (cmd/tracesift/verdicts_test.go).
		fmt.Printf("%s: %s (P ≥ 0.7: %v), novelty below the limit: %v\n",
			c.system, v.Class, top >= 0.7, v.Novelty.Percentile < v.Novelty.Limit)
	}
	// Output:
	// lorenz: chaotic (P ≥ 0.7: true), novelty below the limit: true
	// ar1: stochastic (P ≥ 0.7: true), novelty below the limit: true
}
