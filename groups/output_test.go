package groups

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"strconv"
	"strings"
	"testing"
)

func demoResult(t testing.TB) Result {
	t.Helper()
	r, err := Compare(demoFeatures, demoSamples(1, 6, []float64{-1, -0.5, 0, 0.5, 1}, 1.5), Options{})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// TestWriteCSV parses the CSV back: one row per pair × feature with the
// documented header, numbers that round-trip exactly to the Result's
// float64 values, NaN as an empty field.
func TestWriteCSV(t *testing.T) {
	r := demoResult(t)
	// Make one feature untested to exercise empty fields.
	r.Pairs[0].Tests[1].MW.P = math.NaN()
	var b bytes.Buffer
	if err := WriteCSV(&b, r); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 1+len(r.Features) || strings.Join(rows[0], ",") != strings.Join(pairCSVHeader, ",") {
		t.Fatalf("%d rows, header %v", len(rows), rows[0])
	}
	col := map[string]int{}
	for i, h := range rows[0] {
		col[h] = i
	}
	for f, row := range rows[1:] {
		ft := r.Pairs[0].Tests[f]
		if row[col["feature"]] != ft.Feature || row[col["group_b"]] != "stressed" {
			t.Errorf("row %d: %v", f, row)
		}
		for name, want := range map[string]float64{"mw_p": ft.MW.P, "ks_p_adj": ft.KSAdj, "cliff_delta": ft.CliffDelta, "median_a": ft.A.Median, "hodges_lehmann": ft.HodgesLehmann} {
			s := row[col[name]]
			if math.IsNaN(want) {
				if s != "" {
					t.Errorf("row %d %s: %q for NaN", f, name, s)
				}
				continue
			}
			got, err := strconv.ParseFloat(s, 64)
			if err != nil || got != want {
				t.Errorf("row %d %s: %q, want %v exactly", f, name, s, want)
			}
		}
	}
	b.Reset()
	if err := WriteCurvesCSV(&b, r); err != nil {
		t.Fatal(err)
	}
	rows, err = csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if want := 1 + len(r.Features)*2*5; len(rows) != want {
		t.Errorf("curves CSV: %d rows, want %d", len(rows), want)
	}
}

// TestWriteJSON checks that the JSON is valid, holds every pair test and
// writes NaN as null, and that numbers round-trip.
func TestWriteJSON(t *testing.T) {
	r := demoResult(t)
	r.Pairs[0].Tests[0].MedianDiffMAD = math.NaN()
	var b bytes.Buffer
	if err := WriteJSON(&b, r); err != nil {
		t.Fatal(err)
	}
	if !json.Valid(b.Bytes()) {
		t.Fatal("invalid JSON")
	}
	var doc struct {
		Features []string
		Pairs    []struct {
			A, B  string
			Tests []struct {
				Feature       string
				MW            struct{ P float64 }
				CliffDelta    *float64 `json:"cliff_delta"`
				MedianDiffMAD *float64 `json:"median_diff_mad"`
			}
		}
		Samples []struct {
			File   string
			Values []float64
		}
		Settings struct{ Adjust string }
	}
	if err := json.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Pairs) != 1 || len(doc.Pairs[0].Tests) != len(r.Features) || doc.Settings.Adjust != "holm" || len(doc.Samples) != 60 {
		t.Fatalf("decoded %+v", doc)
	}
	ft := doc.Pairs[0].Tests[0]
	if ft.MedianDiffMAD != nil || ft.CliffDelta == nil || *ft.CliffDelta != r.Pairs[0].Tests[0].CliffDelta || ft.MW.P != r.Pairs[0].Tests[0].MW.P {
		t.Errorf("test 0: %+v", ft)
	}
}

// TestWriteMarkdown checks the tables: a section per pair with the
// features sorted by adjusted p (the two shifted features first), a
// section per feature for the parameter curves, the distributions.
func TestWriteMarkdown(t *testing.T) {
	r := demoResult(t)
	var b bytes.Buffer
	if err := WriteMarkdown(&b, r); err != nil {
		t.Fatal(err)
	}
	md := b.String()
	for _, want := range []string{"# Group comparison", "## stressed (B) vs fresh (A)", "| feature | n A |",
		"## Features versus the parameter", "### hv_tail_exprate", "Spearman ρ", "## Pooled distributions", "| hvg_degree | fresh |"} {
		if !strings.Contains(md, want) {
			t.Errorf("missing %q", want)
		}
	}
	// Sorted by adjusted MW p: sc_fluct_a1 (shift 1.5 SD) precedes
	// op_ent_d4 (no shift) in the pair table.
	sec := md[strings.Index(md, "## stressed"):strings.Index(md, "## Features versus")]
	if strings.Index(sec, "| sc_fluct_a1 |") > strings.Index(sec, "| op_ent_d4 |") {
		t.Error("pair table not sorted by adjusted p")
	}
}
