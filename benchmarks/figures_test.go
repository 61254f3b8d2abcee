package benchmarks

import (
	"bytes"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/report/figure"
)

// TestRedrawFromJSON: results.json read back gives the same JSON and the
// same figure bytes as the run itself (null SNRs, the clean recording,
// come back as NaN and are drawn where +Inf was), so figures redrawn from
// a stored run are the run's figures.
func TestRedrawFromJSON(t *testing.T) {
	r := tiny(t)
	var js bytes.Buffer
	if err := WriteJSON(&js, r); err != nil {
		t.Fatal(err)
	}
	back, err := ReadJSON(bytes.NewReader(js.Bytes()))
	if err != nil {
		t.Fatal(err)
	}
	var again bytes.Buffer
	if err := WriteJSON(&again, back); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(js.Bytes(), again.Bytes()) {
		t.Fatal("results.json does not round-trip")
	}
	orig, redrawn := Figures(r), Figures(back)
	if len(orig) != len(redrawn) {
		t.Fatalf("%d figures from the run, %d from its JSON", len(orig), len(redrawn))
	}
	for i, f := range orig {
		var a, b bytes.Buffer
		if err := f.Draw(&a); err != nil {
			t.Fatalf("%s: %v", f.File, err)
		}
		if err := redrawn[i].Draw(&b); err != nil {
			t.Fatalf("%s from JSON: %v", f.File, err)
		}
		if !bytes.Equal(a.Bytes(), b.Bytes()) {
			t.Errorf("%s differs when drawn from results.json", f.File)
		}
	}

	dir := t.TempDir()
	in := filepath.Join(dir, ResultsFile)
	if err := os.WriteFile(in, js.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "docs")
	written, err := RedrawFigures(in, out, []string{"reliability.png", "accuracy_snr.png"},
		map[string]string{"reliability.png": "bench-reliability.png"})
	if err != nil {
		t.Fatal(err)
	}
	want := []string{filepath.Join(out, "accuracy_snr.png"), filepath.Join(out, "bench-reliability.png")}
	if !reflect.DeepEqual(written, want) {
		t.Errorf("wrote %v, want %v", written, want)
	}
	entries, err := os.ReadDir(out)
	if err != nil {
		t.Fatal(err)
	}
	if len(entries) != 2 {
		t.Errorf("%d files in the output directory, want 2", len(entries))
	}
	if _, err := RedrawFigures(in, out, []string{"nonesuch.png", "also-missing.png"}, nil); err == nil ||
		!strings.Contains(err.Error(), "also-missing.png, nonesuch.png") {
		t.Errorf("unknown figures: error %v", err)
	}
}

// TestCloseGroups: points closer than d join one group (single linkage:
// a chain of close points is one group), in order of first member.
func TestCloseGroups(t *testing.T) {
	pts := []figure.Point{{X: 0, Y: 0}, {X: 100, Y: 0}, {X: 5, Y: 0}, {X: 10, Y: 0}, {X: 100, Y: 5}, {X: 50, Y: 50}}
	got := closeGroups(pts, 6)
	want := [][]int{{0, 2, 3}, {1, 4}, {5}}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("groups %v, want %v", got, want)
	}
}
