package trace_test

import (
	"fmt"
	"path/filepath"
	"strings"

	"github.com/tracesift/tracesift/trace"
)

// Example reads an instrument export with a preamble, a header with
// units and a time column, without being told anything about its layout.
func Example() {
	const export = `Instrument: bench analyser
Date,2026-01-01
Time (s),Id (A)
0.000,1.02e-6
0.001,1.07e-6
0.002,0.98e-6
0.003,1.01e-6
0.004,1.05e-6
0.005,0.99e-6
`
	tr, err := trace.Read(strings.NewReader(export), trace.Options{Name: "demo.csv", MinLength: 4})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d samples of %s [%s] every %g %s, from line %d\n",
		len(tr.Values), tr.Column, tr.Unit, tr.Interval, tr.TimeUnit, tr.FirstLine)
	fmt.Println(tr.Values[:3])

	// Errors name the file, line and column.
	_, err = trace.Read(strings.NewReader("t,Id\n0,1\n1,2\n2,x\n3,4\n"), trace.Options{Name: "bad.csv", MinLength: 2})
	fmt.Println(err)
	// Output:
	// 6 samples of Id [A] every 0.001 s, from line 4
	// [1.02e-06 1.07e-06 9.8e-07]
	// bad.csv line 4, column 2 ("Id"): not a number: "x"
}

// ExampleReadFile reads a gzip-compressed capture of the demo campaign:
// compression is recognised by its magic bytes, the comment lines are
// skipped and the time column gives the sample interval.
func ExampleReadFile() {
	tr, err := trace.ReadFile(filepath.Join("..", "testdata", "demo", "stressed", "D02_stressed_Vg1.20.csv.gz"), trace.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d samples of %s [%s] every %.4g %s, time in column %d, first data row on line %d, %d warnings\n",
		len(tr.Values), tr.Column, tr.Unit, tr.Interval, tr.TimeUnit, tr.TimeColumn, tr.FirstLine, len(tr.Warnings))
	// Output:
	// 4096 samples of Id [A] every 0.0001 s, time in column 1, first data row on line 4, 0 warnings
}
