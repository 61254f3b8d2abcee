package groups

import (
	"bytes"
	"errors"
	"image/png"
	"os"
	"path/filepath"
	"testing"

	"gonum.org/v1/plot/vg"
)

// TestPlots renders every plot twice and checks that the output is a
// valid PNG of the expected size (gonum/plot renders at 96 dpi) and
// identical byte for byte. Set GROUPS_PLOT_DIR to keep the images.
func TestPlots(t *testing.T) {
	r := demoResult(t)
	keep := os.Getenv("GROUPS_PLOT_DIR")
	cases := []struct {
		name string
		w, h int
		fn   func(*bytes.Buffer) error
	}{
		{"curve", 576, 384, func(b *bytes.Buffer) error {
			return PlotCurve(b, r, "hv_tail_exprate", PlotOptions{ParamLabel: "V_G (V)"})
		}},
		{"grid", 3 * 384, 2 * 288, func(b *bytes.Buffer) error {
			return PlotCurveGrid(b, r, nil, PlotOptions{ParamLabel: "V_G (V)", Title: "features versus bias"})
		}},
		{"grid_sized", 800, 600, func(b *bytes.Buffer) error {
			return PlotCurveGrid(b, r, []string{"sc_fluct_a1", "hv_tail_exprate"}, PlotOptions{Width: 800 * vg.Inch / 96, Height: 600 * vg.Inch / 96, Columns: 1})
		}},
		{"effects", 672, -1, func(b *bytes.Buffer) error { return PlotEffects(b, r, PlotOptions{}) }},
		{"dist_ecdf", 576, 384, func(b *bytes.Buffer) error { return PlotDistribution(b, r, "hvg_degree", PlotOptions{}) }},
		{"dist_ccdf", 576, 384, func(b *bytes.Buffer) error {
			return PlotDistribution(b, r, "hvg_degree", PlotOptions{Kind: KindCCDF})
		}},
		{"dist_hist", 576, 384, func(b *bytes.Buffer) error {
			return PlotDistribution(b, r, "hvg_degree", PlotOptions{Kind: KindHistogram})
		}},
		{"feature_ecdf", 576, 384, func(b *bytes.Buffer) error {
			return PlotFeatureDistribution(b, r, "sc_fluct_a1", PlotOptions{})
		}},
		{"feature_hist", 576, 384, func(b *bytes.Buffer) error {
			return PlotFeatureDistribution(b, r, "nl_sent_m2", PlotOptions{Kind: KindHistogram, Bins: 12})
		}},
	}
	for _, c := range cases {
		var b1, b2 bytes.Buffer
		if err := c.fn(&b1); err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if err := c.fn(&b2); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(b1.Bytes(), b2.Bytes()) {
			t.Errorf("%s: output differs between two renderings", c.name)
		}
		img, err := png.Decode(bytes.NewReader(b1.Bytes()))
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		bd := img.Bounds()
		if bd.Dx() != c.w || (c.h > 0 && bd.Dy() != c.h) || bd.Dy() < 200 {
			t.Errorf("%s: image %v, want %d×%d", c.name, bd, c.w, c.h)
		}
		if keep != "" {
			if err := os.WriteFile(filepath.Join(keep, c.name+".png"), b1.Bytes(), 0o644); err != nil {
				t.Fatal(err)
			}
		}
	}
}

// TestPlotErrors checks the sentinel errors of the plot functions.
func TestPlotErrors(t *testing.T) {
	r := demoResult(t)
	var b bytes.Buffer
	if err := PlotCurve(&b, r, "nope", PlotOptions{}); !errors.Is(err, ErrUnknownName) {
		t.Errorf("unknown feature: %v", err)
	}
	if err := PlotDistribution(&b, r, "nope", PlotOptions{}); !errors.Is(err, ErrUnknownName) {
		t.Errorf("unknown distribution: %v", err)
	}
	if err := PlotFeatureDistribution(&b, r, "nope", PlotOptions{}); !errors.Is(err, ErrUnknownName) {
		t.Errorf("unknown feature: %v", err)
	}
	noParam := r
	noParam.HasParam, noParam.Curves = false, nil
	if err := PlotCurve(&b, noParam, "sc_fluct_a1", PlotOptions{}); !errors.Is(err, ErrNothingToPlot) {
		t.Errorf("no parameter: %v", err)
	}
	if err := PlotEffects(&b, Result{}, PlotOptions{}); !errors.Is(err, ErrNothingToPlot) {
		t.Errorf("empty result: %v", err)
	}
}
