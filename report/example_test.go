package report_test

import (
	"fmt"
	"os"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/report"
	"github.com/tracesift/tracesift/trace"
)

// Build a report of one capture with a lab model and write it as HTML.
// (Not run: it needs a trained model file.)
func ExampleBuild() {
	tr, err := trace.ReadFile("testdata/demo/stressed/D01_stressed_Vg1.20.csv", trace.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	m, err := classifier.Load("lab.model")
	if err != nil {
		fmt.Println(err)
		return
	}
	rep, err := report.Build(tr, m, report.Options{Seed: 1, Generator: "my lab pipeline"})
	if err != nil {
		fmt.Println(err)
		return
	}
	f, err := os.Create("D01_stressed_Vg1.20.html")
	if err != nil {
		fmt.Println(err)
		return
	}
	defer f.Close()
	if err := rep.WriteHTML(f); err != nil {
		fmt.Println(err)
	}
	fmt.Println(rep.Verdict.Class)
}
