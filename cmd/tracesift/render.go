package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"

	"tracesift/internal/atomicfile"
)

// writeOutput sends the output to stdout for "-" and otherwise writes the
// file atomically, so a failure never leaves a half-written file.
func writeOutput(e *env, path string, fill func(w io.Writer) error) error {
	if path == "-" || path == "" {
		return fill(e.stdout)
	}
	return atomicfile.Write(path, fill)
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
