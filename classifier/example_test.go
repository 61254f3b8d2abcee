package classifier_test

import (
	"bytes"
	"fmt"
	"math/rand/v2"

	"github.com/tracesift/tracesift/classifier"
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
