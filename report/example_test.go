package report_test

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/models"
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

// Example builds the report of a demo capture with the embedded default
// model and renders it. The surrogate test of determinism (39 IAAFT
// surrogates, about 1.5 s here) is skipped with Surrogates: -1 to keep the
// example fast; the page then says it was skipped. Every section of the
// page is present, and the same trace, model and options give the same
// bytes.
func Example() {
	tr, err := trace.ReadFile(filepath.Join("..", "testdata", "demo", "stressed", "D01_stressed_Vg1.20.csv"), trace.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	m, err := classifier.Read(bytes.NewReader(models.Default()))
	if err != nil {
		fmt.Println(err)
		return
	}
	m.Source = models.DefaultName
	opts := report.Options{Seed: 1, Surrogates: -1, Generator: "my lab pipeline"}
	rep, err := report.Build(tr, m, opts)
	if err != nil {
		fmt.Println(err)
		return
	}
	var page bytes.Buffer
	if err := rep.WriteHTML(&page); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("verdict %s; determinism test skipped: %v; panels missing: %d\n",
		rep.Verdict.Class, strings.Contains(page.String(), "skipped at the caller"), len(rep.Failures))
	var missing []string
	for _, id := range report.Sections() {
		if !strings.Contains(page.String(), `id="`+id+`"`) {
			missing = append(missing, id)
		}
	}
	fmt.Printf("%d sections, missing from the page: %v\n", len(report.Sections()), missing)

	again, err := report.Build(tr, m, opts)
	if err != nil {
		fmt.Println(err)
		return
	}
	var page2 bytes.Buffer
	if err := again.WriteHTML(&page2); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("same bytes:", bytes.Equal(page.Bytes(), page2.Bytes()))
	// Output:
	// verdict chaotic; determinism test skipped: true; panels missing: 0
	// 8 sections, missing from the page: []
	// same bytes: true
}
