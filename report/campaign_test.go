package report

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"math/rand/v2"
	"regexp"
	"slices"
	"strings"
	"sync"
	"testing"

	"github.com/tracesift/tracesift/campaign"
	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/generators"
)

// campaignFixture is a small campaign measured for real: three devices,
// fresh (AR(1) noise) and stressed (the same noise at the low level, the
// logistic map at the high one), at two levels of a bias, 1024 samples
// each, 5 surrogates per method, classified by the test model. The
// stressed device D3 has no trace at the high level, so its grid has an
// empty cell.
type campaignFixture struct {
	rows []campaign.Row
	rep  campaign.Report
	html []byte
}

var campaignOnce = sync.OnceValues(func() (*campaignFixture, error) {
	m, err := testModel()
	if err != nil {
		return nil, err
	}
	var rows []campaign.Row
	mo := campaign.MeasureOptions{Surrogates: 5, Seed: 3}
	for d := 1; d <= 3; d++ {
		for _, g := range []string{"fresh", "stressed"} {
			for _, lv := range []string{"0.5", "1.0"} {
				if g == "stressed" && d == 3 && lv == "1.0" {
					continue
				}
				name := "ar1"
				if g == "stressed" && lv == "1.0" {
					name = "logistic"
				}
				s, err := generators.Lookup(name)
				if err != nil {
					return nil, err
				}
				x, err := s.Generate(1024, nil, rand.New(rand.NewPCG(uint64(d), uint64(len(rows)))))
				if err != nil {
					return nil, err
				}
				tr := campaign.Trace{ID: fmt.Sprintf("%s/D%d_%s.csv", g, d, lv), Group: g, Device: fmt.Sprintf("D%d", d), Level: lv}
				rec, err := campaign.Measure(x, tr, mo)
				if err != nil {
					return nil, err
				}
				v, err := classifier.Screen(m, x, classifier.ScreenOptions{Features: features.Options{Seed: 3}})
				if err != nil {
					return nil, err
				}
				rec.Verdict = &campaign.Verdict{Class: v.Class, Classes: v.Classes, Probabilities: v.Probabilities, Model: m.Source}
				rows = append(rows, campaign.Rows(rec, "bias_V")...)
			}
		}
	}
	campaign.SortRows(rows)
	rep, err := campaign.Analyze(rows, campaign.AnalyzeOptions{})
	if err != nil {
		return nil, err
	}
	var b bytes.Buffer
	if err := WriteCampaign(&b, rep, CampaignOptions{Source: "fixture.csv", ParamLabel: "V_G (V)",
		LeftOut: []string{"stressed/D3_1.0.csv: not measured"}, Generator: "tracesift test"}); err != nil {
		return nil, err
	}
	return &campaignFixture{rows: rows, rep: rep, html: b.Bytes()}, nil
})

func campaignHTML(t *testing.T) *campaignFixture {
	t.Helper()
	f, err := campaignOnce()
	if err != nil {
		t.Fatalf("campaign fixture: %v", err)
	}
	return f
}

// TestCampaignReportStructure parses the campaign report as strict XML
// (no browser needed) and checks: every section; one figure per metric
// (a panel per surrogate method) and per distribution (a panel per
// level), each drawing in its plot areas; one verdict grid per group with
// devices × levels cells and one coloured entry per verdict carrying every
// class probability in its title; nothing that would load from outside
// the file (inline script only, no src/href/url() leaving the document,
// no http:// or https:// anywhere); the screening caution; tick labels in
// one notation (no "1e-05" style numbers).
func TestCampaignReportStructure(t *testing.T) {
	f := campaignHTML(t)
	html, rep := f.html, f.rep
	var gridCells []int
	var scripts int
	var titles []string
	ids, found := scanPage(t, html, true, func(e xml.StartElement, in []string) {
		switch {
		case e.Name.Local == "script":
			scripts++
		case e.Name.Local == "table" && hasClass(e, "grid"):
			gridCells = append(gridCells, 0)
		case e.Name.Local == "td" && hasClass(e, "cell") && len(gridCells) > 0:
			gridCells[len(gridCells)-1]++
		case e.Name.Local == "span" && hasClass(e, "v"):
			titles = append(titles, attr(e, "title"))
		}
	})
	figs := map[string]int{} // figure id → nested panels
	for _, f := range found {
		figs[f.id] = f.panels
	}
	for _, id := range CampaignSections() {
		if !ids[id] {
			t.Errorf("section %q missing", id)
		}
	}
	// Figures: one per metric with a finite band, one per distribution.
	methods := len(rep.Methods)
	for i, m := range rep.Metrics {
		if _, _, ok := metricRange(rep, m); !ok {
			continue
		}
		id := fmt.Sprintf("curve-%d", i)
		if n, ok := figs[id]; !ok || n != methods {
			t.Errorf("figure of %s: present %v, %d panels, want %d (one per surrogate method)", m, ok, n, methods)
		}
		delete(figs, id)
	}
	for i, name := range rep.Distributions {
		id := fmt.Sprintf("dist-%d", i)
		if n, ok := figs[id]; !ok || n != len(rep.Levels) {
			t.Errorf("figure of %s: present %v, %d panels, want %d (one per level)", name, ok, n, len(rep.Levels))
		}
		delete(figs, id)
	}
	if len(figs) != 0 {
		t.Errorf("unexpected figures %v", figs)
	}
	if len(rep.Metrics) < 10 || len(rep.Distributions) != 5 || methods != 3 {
		t.Errorf("fixture: %d metrics, %d distributions, %d methods", len(rep.Metrics), len(rep.Distributions), methods)
	}
	// Grids: devices × levels cells per group; one entry per verdict.
	if len(gridCells) != len(rep.Groups) {
		t.Fatalf("%d grids, want %d (one per group)", len(gridCells), len(rep.Groups))
	}
	for gi, g := range rep.Groups {
		devs := map[string]bool{}
		for _, v := range rep.Verdicts {
			if v.Group == g {
				devs[v.Device] = true
			}
		}
		if want := len(devs) * len(rep.Levels); gridCells[gi] != want {
			t.Errorf("grid %s: %d cells, want %d devices × %d levels", g, gridCells[gi], len(devs), len(rep.Levels))
		}
	}
	if len(titles) != len(rep.Verdicts) || len(rep.Verdicts) != 11 {
		t.Errorf("%d grid entries, %d verdicts, want 11", len(titles), len(rep.Verdicts))
	}
	for i, v := range rep.Verdicts {
		if i >= len(titles) {
			break
		}
		for k, c := range v.Classes {
			if want := fmt.Sprintf("%s %.2f", c, v.Probabilities[k]); !strings.Contains(titles[i], want) {
				t.Errorf("entry %d (%s) title %q lacks %q", i, v.File, titles[i], want)
			}
		}
	}
	if scripts != 1 {
		t.Errorf("%d script elements, want the one inline script", scripts)
	}
	for _, want := range []string{CampaignCaution, "Okabe", verdictColour("stochastic"), "stressed/D3_1.0.csv: not measured", "Fitted tails", "tracesift test", "test model (40 trees)"} {
		if !bytes.Contains(html, []byte(esc(want))) {
			t.Errorf("report lacks %q", want)
		}
	}
	for _, p := range []string{"http://", "https://", "<link", "src="} {
		if bytes.Contains(html, []byte(p)) {
			t.Errorf("report contains %q", p)
		}
	}
	if m := regexp.MustCompile(`[0-9]e[-+][0-9]`).Find(html); m != nil {
		t.Errorf("a number in e-notation: %q (labels use one notation with raised exponents)", m)
	}
}

// TestCampaignReportDeterministic: the same tables give the same bytes,
// also after a round trip through the CSV table with the rows in another
// order (tables merged from several machines give one run's report).
func TestCampaignReportDeterministic(t *testing.T) {
	f := campaignHTML(t)
	var csvb bytes.Buffer
	if err := campaign.WriteTableCSV(&csvb, f.rows); err != nil {
		t.Fatal(err)
	}
	back, err := campaign.ReadTableCSV(&csvb, "t.csv")
	if err != nil {
		t.Fatal(err)
	}
	slices.Reverse(back)
	rep, err := campaign.Analyze(back, campaign.AnalyzeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := WriteCampaign(&b, rep, CampaignOptions{Source: "fixture.csv", ParamLabel: "V_G (V)",
		LeftOut: []string{"stressed/D3_1.0.csv: not measured"}, Generator: "tracesift test"}); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(b.Bytes(), f.html) {
		t.Error("the report from the CSV table, rows reversed, differs from the report of the rows")
	}
}

// TestCampaignReportWithoutVerdicts: tables without verdicts (measured
// with --no-verdicts) still give a complete page that says so.
func TestCampaignReportWithoutVerdicts(t *testing.T) {
	f := campaignHTML(t)
	var rows []campaign.Row
	for _, r := range f.rows {
		if r.Kind != campaign.KindVerdict {
			rows = append(rows, r)
		}
	}
	rep, err := campaign.Analyze(rows, campaign.AnalyzeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := WriteCampaign(&b, rep, CampaignOptions{}); err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(b.Bytes(), []byte("No verdicts")) || bytes.Contains(b.Bytes(), []byte(`class="grid"`)) {
		t.Error("a page without verdicts should say so and draw no grid")
	}
	d := xml.NewDecoder(bytes.NewReader(b.Bytes()))
	d.Strict = true
	for {
		_, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed XML: %v", err)
		}
	}
}
