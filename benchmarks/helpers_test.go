package benchmarks

import (
	"sync"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
)

// testModel trains a small forest once per test binary: about one
// reference series per system (PerClass 12) of 512–1000 samples (plan seed
// 5, never a seed the benchmark draws from) and 30 trees. It is far weaker than the shipped
// model; the tests check the suite's plumbing, not the model's accuracy.
var testModel = sync.OnceValues(func() (*classifier.Model, error) {
	ds, _, err := classifier.BuildReference(classifier.ReferenceOptions{PerClass: 12, MaxLength: 1000, Seed: 5}, features.Options{Seed: 5})
	if err != nil {
		return nil, err
	}
	return classifier.Train(ds, classifier.Config{Trees: 30, Seed: 5,
		Schema: classifier.Schema{Version: features.SchemaVersion, Hash: features.SchemaHash()}})
})

func model(t testing.TB) *classifier.Model {
	t.Helper()
	m, err := testModel()
	if err != nil {
		t.Fatalf("training the test model: %v", err)
	}
	return m
}
