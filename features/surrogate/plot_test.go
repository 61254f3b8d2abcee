package surrogate

import (
	"bytes"
	"errors"
	"image/png"
	"os"
	"testing"
)

// TestPlot renders the surrogate distribution of a real test and checks
// the output is a PNG of the requested size; degenerate and empty inputs
// are handled. Set SURROGATE_PLOT=path to keep the image for a look.
func TestPlot(t *testing.T) {
	x := series(t, "henon", 1000, 21)
	rep, err := Test(x, []Statistic{TimeAsymmetryStat, maxStat}, TestOptions{Options: Options{Count: 99, Seed: 3}})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := Plot(&buf, rep.Tests[0], PlotOptions{}); err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(buf.Bytes()))
	if err != nil {
		t.Fatal(err)
	}
	// gonum/plot renders PNG at 96 dpi: 6 in × 4 in = 576 × 384 pixels.
	if b := img.Bounds(); b.Dx() != 576 || b.Dy() != 384 {
		t.Fatalf("image %v, want 576×384", b)
	}
	if path := os.Getenv("SURROGATE_PLOT"); path != "" {
		if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	// All surrogate values equal (max under shuffles): still a plot.
	buf.Reset()
	if err := Plot(&buf, rep.Tests[1], PlotOptions{Bins: 7}); err != nil {
		t.Fatalf("degenerate distribution: %v", err)
	}
	if err := Plot(&buf, Result{Stat: "empty", Observed: 1}, PlotOptions{}); !errors.Is(err, ErrNothingToPlot) {
		t.Fatalf("empty: %v", err)
	}
}
