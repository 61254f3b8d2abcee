package main

import (
	"encoding/csv"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/generators"
	"github.com/tracesift/tracesift/trace"
)

// TestDemoVerdictsAgreeWithLabels: the embedded default model gives every
// trace of the synthetic demo campaign the class its generator gave it
// (testdata/demo/labels.csv, true by construction: see
// testdata/demo/README.md), with a probability of at least 0.7 for it.
func TestDemoVerdictsAgreeWithLabels(t *testing.T) {
	m, err := loadModel("")
	if err != nil {
		t.Fatal(err)
	}
	dir := filepath.Join("..", "..", "testdata", "demo")
	f, err := os.Open(filepath.Join(dir, "labels.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	for _, row := range rows[1:] {
		file, want := row[0], row[1]
		tr, err := trace.ReadFile(filepath.Join(dir, file), trace.Options{})
		if err != nil {
			t.Fatal(err)
		}
		v, err := classifier.Screen(m, tr.Values, classifier.ScreenOptions{Features: features.Options{Seed: 1}})
		if err != nil {
			t.Fatalf("%s: %v", file, err)
		}
		p := v.Probabilities[slices.Index(v.Classes, want)]
		if v.Class != want || p < 0.7 {
			t.Errorf("%s: verdict %s with p(%s) = %.2f, want %s with p ≥ 0.7 (reasons %v)", file, v.Class, want, p, want, v.Reasons)
		}
	}
}

// TestQuantisedAndHeavyTailedNoiseIsStochastic: noise is stochastic
// whatever its colour or distribution (DESIGN.md's class definition), and
// recording it with a coarse converter does not change that — a quantiser
// adds a bounded error to each sample (Widrow & Kollár, Quantization Noise
// (2008)) and cannot create dynamics. i.i.d. Gaussian noise, AR(1) and 1/f
// noise quantised to 16 levels (with and without 3% of the samples clipped
// at each rail), heavy-tailed i.i.d. noise (Cauchy, Student t with ν = 2.5)
// and heavy-tailed random walks (α-stable increments, α = 1.3; Cauchy
// increments) must be called stochastic, not undetermined.
func TestQuantisedAndHeavyTailedNoiseIsStochastic(t *testing.T) {
	if testing.Short() {
		t.Skip("classifies 20 series; skipped with -short")
	}
	m, err := loadModel("")
	if err != nil {
		t.Fatal(err)
	}
	adc := []generators.Recording{{Levels: 16}, {Levels: 16, Clip: 0.03}}
	cases := []struct {
		system string
		params map[string]float64
		recs   []generators.Recording
	}{
		{"white", nil, adc},
		{"ar1", map[string]float64{"phi": 0.9}, adc},
		{"powerlaw", map[string]float64{"beta": 1}, adc},
		{"student-t", map[string]float64{"nu": 1}, []generators.Recording{{}}},
		{"student-t", map[string]float64{"nu": 2.5}, []generators.Recording{{}}},
		{"levy-walk", map[string]float64{"alpha": 1.3}, []generators.Recording{{}}},
		{"levy-walk", map[string]float64{"increments": 1, "nu": 1}, []generators.Recording{{}}},
	}
	for _, tc := range cases {
		sys, err := generators.Lookup(tc.system)
		if err != nil {
			t.Fatal(err)
		}
		for _, rec := range tc.recs {
			for _, n := range []int{2000, 5000} {
				rng := rand.New(rand.NewPCG(uint64(n), 17))
				x, err := sys.Generate(n, tc.params, rng)
				if err != nil {
					t.Fatal(err)
				}
				y, err := rec.Apply(x, rng)
				if err != nil {
					t.Fatal(err)
				}
				v, err := classifier.Screen(m, y, classifier.ScreenOptions{Features: features.Options{Seed: 1}})
				if err != nil {
					t.Fatal(err)
				}
				if v.Class != "stochastic" {
					t.Errorf("%s %v recorded %s, n=%d: verdict %s (top %s, p %v, reasons %v)", tc.system, tc.params, rec, n, v.Class, v.Top, v.Probabilities, v.Reasons)
				}
			}
		}
	}
}
