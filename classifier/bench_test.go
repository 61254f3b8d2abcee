package classifier

import (
	"bytes"
	"sync"
	"testing"
)

// The benchmark data set mirrors the expected reference training set:
// 6000 rows, 40 features, three classes. The "noisy" generator makes
// overlapping classes (out-of-bag accuracy ≈ 0.87), which grows deep trees
// and is therefore a pessimistic case for training time and model size.
var (
	benchOnce  sync.Once
	benchModel *Model
	benchData  Dataset
	benchErr   error
)

func benchSetup(b *testing.B) (*Model, Dataset) {
	benchOnce.Do(func() {
		benchData = noisy(6000, 40, 10, 77)
		benchModel, benchErr = Train(benchData, Config{Trees: 300, Seed: 1})
	})
	if benchErr != nil {
		b.Fatal(benchErr)
	}
	return benchModel, benchData
}

// BenchmarkTrain300 trains the full 300-tree forest on 6000×40 (one op is
// one complete training; run with -benchtime=1x).
func BenchmarkTrain300(b *testing.B) {
	ds := noisy(6000, 40, 10, 77)
	for b.Loop() {
		m, err := Train(ds, Config{Trees: 300, Seed: 1})
		if err != nil {
			b.Fatal(err)
		}
		b.ReportMetric(float64(m.NumNodes())/300, "nodes/tree")
	}
}

// BenchmarkTrainTree measures one tree on 6000×40 (single worker), the unit
// cost that Train spreads over the workers.
func BenchmarkTrainTree(b *testing.B) {
	ds := noisy(6000, 40, 10, 77)
	for b.Loop() {
		if _, err := Train(ds, Config{Trees: 1, Seed: 1, Workers: 1}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPredict classifies one vector with contributions (300 trees).
func BenchmarkPredict(b *testing.B) {
	m, ds := benchSetup(b)
	x := ds.X[123]
	for b.Loop() {
		if _, err := m.Predict(x); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkClassify is the bare vote used by Evaluate and CrossValidate.
func BenchmarkClassify(b *testing.B) {
	m, ds := benchSetup(b)
	x := ds.X[123]
	sum := make([]float64, len(m.Classes))
	for b.Loop() {
		m.classify(x, sum)
	}
}

// BenchmarkWriteRead serialises and parses the 300-tree model and reports
// the file size.
func BenchmarkWriteRead(b *testing.B) {
	m, _ := benchSetup(b)
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := m.Write(&buf); err != nil {
			b.Fatal(err)
		}
		if _, err := Read(bytes.NewReader(buf.Bytes())); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(buf.Len()), "file-bytes")
}
