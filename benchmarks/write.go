package benchmarks

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/tracesift/tracesift/internal/atomicfile"
)

// Output file names written by WriteAll besides the figures.
const (
	SummaryFile = "summary.md"
	ResultsFile = "results.json"
)

// WriteJSON writes r as one indented JSON document. Keys come from struct
// fields (declaration order) and maps (sorted), so the same Result always
// gives the same bytes; NaN and infinities are written as null.
func WriteJSON(w io.Writer, r *Result) error {
	b, err := json.MarshalIndent(r, "", "  ")
	if err != nil {
		return fmt.Errorf("encoding results: %w", err)
	}
	b = append(b, '\n')
	_, err = w.Write(b)
	return err
}

// WriteAll writes summary.md, results.json and every figure of r into dir,
// creating dir if needed. Every file is written atomically (a temporary
// file renamed into place). It returns the paths written.
func WriteAll(dir string, r *Result) ([]string, error) {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, fmt.Errorf("output directory: %w", err)
	}
	var written []string
	write := func(name string, fill func(w io.Writer) error) error {
		path := filepath.Join(dir, name)
		err := atomicfile.Write(path, func(w io.Writer) error {
			bw := bufio.NewWriter(w)
			if err := fill(bw); err != nil {
				return fmt.Errorf("%s: %w", path, err)
			}
			return bw.Flush()
		})
		if err != nil {
			return err
		}
		written = append(written, path)
		return nil
	}
	if err := write(ResultsFile, func(w io.Writer) error { return WriteJSON(w, r) }); err != nil {
		return written, err
	}
	figs := Figures(r)
	for _, f := range figs {
		if err := write(f.File, f.Draw); err != nil {
			return written, err
		}
	}
	if err := write(SummaryFile, func(w io.Writer) error { return WriteMarkdown(w, r) }); err != nil {
		return written, err
	}
	return written, nil
}
