package benchmarks

import (
	"encoding/json"
	"fmt"
	"io"
	"maps"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"github.com/tracesift/tracesift/internal/atomicfile"
)

// ReadJSON reads a Result written by WriteJSON (results.json of a bench
// run). Values written as null (NaN, ±Inf) come back as NaN; the figures
// treat a NaN SNR as the clean recording, as +Inf was.
func ReadJSON(r io.Reader) (*Result, error) {
	var res Result
	dec := json.NewDecoder(r)
	if err := dec.Decode(&res); err != nil {
		return nil, fmt.Errorf("reading results: %w", err)
	}
	return &res, nil
}

// WriteFigures redraws figures of r into dir: those named in names (file
// names as Figures gives them, e.g. "reliability.png"), or all when names
// is empty, each written atomically under the name rename maps it to (its
// own name when rename has none). It returns the paths written, and an
// error naming any requested figure r cannot draw. Redrawing from a bench
// run's results.json gives the figures that run would draw with the
// current plotting code, without running the suite again.
func WriteFigures(dir string, r *Result, names []string, rename map[string]string) ([]string, error) {
	want := map[string]bool{}
	for _, n := range names {
		want[n] = true
	}
	var written []string
	missing := maps.Clone(want)
	for _, f := range Figures(r) {
		if len(names) > 0 && !want[f.File] {
			continue
		}
		delete(missing, f.File)
		name := f.File
		if to, ok := rename[name]; ok {
			name = to
		}
		path := filepath.Join(dir, name)
		if err := atomicfile.Write(path, f.Draw); err != nil {
			return written, fmt.Errorf("%s: %w", path, err)
		}
		written = append(written, path)
	}
	if len(missing) > 0 {
		return written, fmt.Errorf("figures not in these results: %s", strings.Join(slices.Sorted(maps.Keys(missing)), ", "))
	}
	return written, nil
}

// RedrawFigures reads results (a results.json) and writes its figures
// into dir as WriteFigures does.
func RedrawFigures(results, dir string, names []string, rename map[string]string) ([]string, error) {
	f, err := os.Open(results)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	r, err := ReadJSON(f)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", results, err)
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, err
	}
	return WriteFigures(dir, r, names, rename)
}
