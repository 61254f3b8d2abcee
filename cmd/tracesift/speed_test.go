package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/generators"
	"github.com/tracesift/tracesift/internal/journal"
	"github.com/tracesift/tracesift/trace"
)

// BenchmarkClassify10k is the cost of classifying one 10^4-sample trace
// from scratch: loading the embedded model, the feature vector and the
// forest's vote.
func BenchmarkClassify10k(b *testing.B) {
	s, _ := generators.Lookup("henon")
	x, _ := s.Generate(10000, nil, rand.New(rand.NewPCG(1, 2)))
	for b.Loop() {
		m, err := loadModel("")
		if err != nil {
			b.Fatal(err)
		}
		if _, err := classifier.Screen(m, x, classifier.ScreenOptions{Features: features.Options{Sequential: true}}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkJournalPerTrace is what the journal adds to one trace of
// `features -o FILE`, beside measuring it: the SHA-256 of its file (a
// 10^4-sample CSV of about 200 kB), encoding its record (the whole vector)
// and appending it, then, at the end of the batch, indexing the journal,
// reading the record back, decoding it and writing its CSV row. Compare
// with the cost of the features themselves (BenchmarkFeatures10k).
func BenchmarkJournalPerTrace(b *testing.B) {
	dir := b.TempDir()
	s, _ := generators.Lookup("ar1")
	x, _ := s.Generate(10000, nil, rand.New(rand.NewPCG(1, 2)))
	var csv strings.Builder
	csv.WriteString("t,value\n")
	for i, v := range x {
		fmt.Fprintf(&csv, "%d,%.17g\n", i, v)
	}
	path := filepath.Join(dir, "t.csv")
	if err := os.WriteFile(path, []byte(csv.String()), 0o644); err != nil {
		b.Fatal(err)
	}
	tr, err := trace.ReadFile(path, trace.Options{})
	if err != nil {
		b.Fatal(err)
	}
	v, err := features.Extract(tr.Values, features.Options{})
	if err != nil {
		b.Fatal(err)
	}
	rec := newFeaturesRecord(tr, v)
	jpath := filepath.Join(dir, "j")
	render := &featuresRender{Format: formatCSV, All: true}
	b.ResetTimer()
	w, err := journal.Create(jpath)
	if err != nil {
		b.Fatal(err)
	}
	w.Write(journal.Header{Journal: journal.Version, Command: "features", Key: "k"})
	names := make([]string, b.N)
	for i := range b.N {
		names[i] = fmt.Sprintf("t%08d.csv", i)
		raw, err := json.Marshal(rec)
		if err != nil {
			b.Fatal(err)
		}
		if err := w.Write(journal.Record{File: names[i], Sum: fileSum(path), Key: "k", Result: raw}); err != nil {
			b.Fatal(err)
		}
	}
	w.Close()
	ix, err := journal.Open(jpath)
	if err != nil {
		b.Fatal(err)
	}
	sink := render.sink(io.Discard)
	for _, n := range names {
		en, _ := ix.Lookup(n)
		raw, err := ix.Result(en)
		if err != nil {
			b.Fatal(err)
		}
		if err := sink.item(n, raw); err != nil {
			b.Fatal(err)
		}
	}
	sink.finish()
	ix.Close()
}

// BenchmarkFeatures10k is the cost of the whole feature vector of one
// 10^4-sample AR(1) trace on one core, the work a batch trace costs
// besides the journal.
func BenchmarkFeatures10k(b *testing.B) {
	s, _ := generators.Lookup("ar1")
	x, _ := s.Generate(10000, nil, rand.New(rand.NewPCG(1, 2)))
	for b.Loop() {
		if _, err := features.Extract(x, features.Options{Sequential: true}); err != nil {
			b.Fatal(err)
		}
	}
}
