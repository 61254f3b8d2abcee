package benchmarks

import (
	"bytes"
	"encoding/json"
	"image"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestWriteAll(t *testing.T) {
	r := tiny(t)
	dir := filepath.Join(t.TempDir(), "new", "out") // does not exist yet
	written, err := WriteAll(dir, r)
	if err != nil {
		t.Fatal(err)
	}
	want := []string{SummaryFile, ResultsFile}
	for _, f := range Figures(r) {
		want = append(want, f.File)
	}
	if len(written) != len(want) {
		t.Errorf("wrote %v, want %v", written, want)
	}
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	if len(entries) != len(want) {
		var names []string
		for _, e := range entries {
			names = append(names, e.Name())
		}
		t.Errorf("directory holds %v, want exactly %v (no temporary files)", names, want)
	}

	js, err := os.ReadFile(filepath.Join(dir, ResultsFile))
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteJSON(&buf, r); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(js, buf.Bytes()) || !json.Valid(js) {
		t.Error("results.json is not WriteJSON's valid output")
	}
	var back Result
	if err := json.Unmarshal(js, &back); err != nil {
		t.Fatalf("results.json does not read back: %v", err)
	}
	if len(back.Invariants) != len(r.Invariants) || back.Classification.Overall.Series != r.Classification.Overall.Series {
		t.Error("results.json lost rows")
	}

	md, err := os.ReadFile(filepath.Join(dir, SummaryFile))
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []string{
		"Screening caution", "## 1. Invariant recovery", "## 2. Classification", "## 5. Throughput (machine-dependent)",
		"Grassberger & Procaccia", "nl_div_rate/lorenz", "chaotic vs stochastic", "Tolerances:", "(Luque et al. 2009)",
	} {
		if !strings.Contains(string(md), s) {
			t.Errorf("summary.md lacks %q", s)
		}
	}
	for _, f := range Figures(r) {
		if !strings.Contains(string(md), "]("+f.File+")") {
			t.Errorf("summary.md does not show %s", f.File)
		}
	}

	for _, f := range want[2:] {
		b, err := os.ReadFile(filepath.Join(dir, f))
		if err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(bytes.NewReader(b))
		if err != nil {
			t.Errorf("%s: not a PNG: %v", f, err)
			continue
		}
		bounds := img.Bounds()
		if bounds.Dx() < 200 || bounds.Dy() < 200 {
			t.Errorf("%s: %v image", f, bounds)
		}
		if uniform(img) {
			t.Errorf("%s: blank image", f)
		}
	}
}

// uniform reports whether every pixel of a coarse grid has the same colour.
func uniform(img image.Image) bool {
	b := img.Bounds()
	r0, g0, b0, a0 := img.At(b.Min.X, b.Min.Y).RGBA()
	for y := b.Min.Y; y < b.Max.Y; y += 3 {
		for x := b.Min.X; x < b.Max.X; x += 3 {
			if r, g, bl, a := img.At(x, y).RGBA(); r != r0 || g != g0 || bl != b0 || a != a0 {
				return false
			}
		}
	}
	return true
}

func TestWriteAllRefusesAFile(t *testing.T) {
	f := filepath.Join(t.TempDir(), "plain")
	if err := os.WriteFile(f, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := WriteAll(f, &Result{}); err == nil {
		t.Error("WriteAll into a regular file succeeded")
	}
}
