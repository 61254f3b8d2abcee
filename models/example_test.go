package models_test

import (
	"bytes"
	"fmt"
	"path/filepath"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/models"
	"github.com/tracesift/tracesift/networks"
	"github.com/tracesift/tracesift/networks/visibility"
	"github.com/tracesift/tracesift/trace"
)

// Example is what a lab script does with the library: read a capture, look
// at its horizontal visibility graph, extract the feature vector, and
// classify the trace with the embedded default model after checking that
// the model was trained on this feature catalogue. The capture is device
// D01 of the synthetic demo campaign after stress at 1.20 V, labelled
// chaotic in testdata/demo/labels.csv; 'tracesift classify' gives it the
// same verdict (README).
func Example() {
	tr, err := trace.ReadFile(filepath.Join("..", "testdata", "demo", "stressed", "D01_stressed_Vg1.20.csv"), trace.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: %d samples of %s [%s] every %.4g %s\n",
		filepath.Base(tr.Source), len(tr.Values), tr.Column, tr.Unit, tr.Interval, tr.TimeUnit)

	// The HVG degree tail: λ = ln(3/2) ≈ 0.405 for an i.i.d. series, below
	// it for chaotic series and above it for correlated noise (Luque et
	// al., Phys. Rev. E 80 (2009) 046103; Lacasa & Toral, Phys. Rev. E 82
	// (2010) 036120). Here the oscillation is seen through 1/f read-out
	// noise and λ alone reads correlated noise: one graph statistic is not
	// a verdict, the model weighs them all.
	g, err := visibility.Horizontal(tr.Values, visibility.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	tail, err := networks.ExponentialTail(g, networks.TailOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("HVG: %d edges, tail rate λ = %.2f\n", g.Edges(), tail.Lambda)

	// The whole feature vector; features that cannot be measured are
	// missing with a reason, never zero.
	v, err := features.Extract(tr.Values, features.Options{Seed: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	credible, _ := v.Get("nl_div_ok")
	lyap, _ := v.Get("nl_div_rate")
	fmt.Printf("nl_div_ok = %g, nl_div_rate = %.4f per sample, %d features missing\n", credible, lyap, len(v.Missing()))

	// The embedded model, refused if its feature schema is not the
	// running catalogue's (as 'tracesift classify' does).
	m, err := classifier.Read(bytes.NewReader(models.Default()))
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := m.CheckSchema(classifier.Schema{Version: features.SchemaVersion, Hash: features.SchemaHash()}); err != nil {
		fmt.Println(err)
		return
	}
	verdict, err := classifier.Screen(m, tr.Values, classifier.ScreenOptions{
		Interval: tr.Interval, // seconds: enables the mains-interference check
		Features: features.Options{Seed: 1},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	top := verdict.Probabilities[0]
	for i, c := range verdict.Classes {
		if c == verdict.Top {
			top = verdict.Probabilities[i]
		}
	}
	// The demo's verdict test asks for at least 0.7 on the true class
	// (cmd/tracesift/verdicts_test.go).
	fmt.Printf("verdict: %s (P ≥ 0.7: %v), novelty below the limit: %v, warnings: %d\n",
		verdict.Class, top >= 0.7, verdict.Novelty.Percentile < verdict.Novelty.Limit, len(verdict.Warnings))
	// Output:
	// D01_stressed_Vg1.20.csv: 4096 samples of Id [A] every 0.0001 s
	// HVG: 8154 edges, tail rate λ = 0.65
	// nl_div_ok = 1, nl_div_rate = 0.0045 per sample, 0 features missing
	// verdict: chaotic (P ≥ 0.7: true), novelty below the limit: true, warnings: 0
}
