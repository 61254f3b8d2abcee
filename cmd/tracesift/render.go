package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/tracesift/tracesift/internal/atomicfile"
)

// writeOutput sends the output to stdout for "-" and otherwise writes the
// file atomically, so a failure never leaves a half-written file.
//
// When fill reports that some inputs of a batch failed (a *batchError), the
// results of the good inputs are still written and a line on stderr says
// what was written; when every input failed the file is not written, and
// the line says so and whether an earlier file of that name was kept.
func writeOutput(e *env, path string, fill func(w io.Writer) error) error {
	if path == "-" || path == "" {
		return fill(e.stdout)
	}
	var partial *batchError
	err := atomicfile.Write(path, func(w io.Writer) error {
		err := fill(w)
		if errors.As(err, &partial) && partial.succeeded() > 0 {
			return nil // keep the good results; the failures are reported below
		}
		return err
	})
	switch {
	case err != nil && partial != nil:
		kept := ""
		if _, serr := os.Stat(path); serr == nil {
			kept = "; the existing file was left unchanged"
		}
		fmt.Fprintf(e.stderr, "tracesift: %s not written: no input could be processed%s\n", path, kept)
		return err
	case err != nil:
		return err
	case partial != nil:
		fmt.Fprintf(e.stderr, "tracesift: wrote the results of %d of %d inputs to %s; the %d that failed are listed above\n",
			partial.succeeded(), partial.total, path, len(partial.failures))
		return partial
	}
	return nil
}

// Output formats shared by the commands.
const (
	formatTable = "table"
	formatCSV   = "csv"
	formatJSON  = "json"
)

func checkFormat(f string, allowed ...string) error {
	for _, a := range allowed {
		if f == a {
			return nil
		}
	}
	return usagef("--format %q: want one of %s", f, strings.Join(allowed, ", "))
}

// table writes aligned columns for people.
type table struct {
	tw *tabwriter.Writer
}

func newTable(w io.Writer) *table {
	return &table{tw: tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)}
}

func (t *table) row(cells ...string) { fmt.Fprintln(t.tw, strings.Join(cells, "\t")) }
func (t *table) flush() error        { return t.tw.Flush() }

// human rounds a number for people: four significant digits, "—" for NaN.
func human(v float64) string {
	switch {
	case math.IsNaN(v):
		return "—"
	case math.IsInf(v, 1):
		return "inf"
	case math.IsInf(v, -1):
		return "-inf"
	case v == math.Trunc(v) && math.Abs(v) < 1e9:
		return strconv.FormatFloat(v, 'f', -1, 64)
	}
	return strconv.FormatFloat(v, 'g', 4, 64)
}

// full prints a number at full precision for machines.
func full(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// writeJSONLine writes v as one line of JSON Lines.
func writeJSONLine(w io.Writer, v any) error {
	b, err := json.Marshal(v)
	if err != nil {
		return err
	}
	b = append(b, '\n')
	_, err = w.Write(b)
	return err
}

// plural returns word with an s appended when n ≠ 1.
func plural(n int, word string) string {
	if n == 1 {
		return word
	}
	return word + "s"
}
