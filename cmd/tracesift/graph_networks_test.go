package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestGraphRecurrenceOnDemo: graph --kind rn works on the demo traces (the
// six stressed devices at 1.20 V, chaotic and noisy alike): the network
// links exactly 5% of the pairs (⌊0.05·P + ½⌋ edges, the default rate), the
// embedding is reported, and the exported edge list holds every edge.
func TestGraphRecurrenceOnDemo(t *testing.T) {
	files, _ := filepath.Glob("../../testdata/demo/stressed/*_Vg1.20.csv*")
	if len(files) != 6 {
		t.Fatalf("%d demo files", len(files))
	}
	dir := t.TempDir()
	for k, f := range files {
		args := []string{"graph", "--kind", "rn", "--format", "json", "--no-paths", f}
		edges := filepath.Join(dir, "rn.csv")
		if k == 0 {
			args = append(args, "--edges", edges, "--exact-diameter")
		}
		out, stderr, code := runCLI(t, "", args...)
		if code != exitOK {
			t.Fatalf("%s: exit %d: %s", f, code, stderr)
		}
		var r struct {
			Metrics struct {
				Nodes int   `json:"nodes"`
				Edges int64 `json:"edges"`
			} `json:"metrics"`
			Recurrence struct {
				Network struct {
					Dim   int     `json:"dim"`
					Delay int     `json:"delay"`
					Pairs int64   `json:"pairs"`
					Rate  float64 `json:"rate"`
				} `json:"network"`
				Metrics struct {
					TransitivityDim *float64 `json:"transitivity_dim"`
				} `json:"metrics"`
			} `json:"recurrence"`
		}
		if err := json.Unmarshal([]byte(out), &r); err != nil {
			t.Fatal(err)
		}
		nw := r.Recurrence.Network
		if want := int64(math.Floor(0.05*float64(nw.Pairs) + 0.5)); r.Metrics.Edges != want || nw.Dim < 1 || nw.Delay < 1 || r.Recurrence.Metrics.TransitivityDim == nil {
			t.Errorf("%s: %d edges of %d pairs (want %d), m %d τ %d, D_T %v", f, r.Metrics.Edges, nw.Pairs, want, nw.Dim, nw.Delay, r.Recurrence.Metrics.TransitivityDim)
		}
		if k == 0 {
			b, _ := os.ReadFile(edges)
			lines := strings.Split(strings.TrimSpace(string(b)), "\n")
			if lines[0] != "source,target" || int64(len(lines)-1) != r.Metrics.Edges {
				t.Errorf("rn edge list: %q, %d rows for %d edges", lines[0], len(lines)-1, r.Metrics.Edges)
			}
		}
	}
}

// TestGraphOrdinalOnDemo: graph --kind opn works on every demo trace; the
// patterns seen never exceed d! = 120, the out-degrees never exceed the d = 5
// admissible successors, and the directed edge list carries the weights of
// all steps (4096 − 5 windows less one).
func TestGraphOrdinalOnDemo(t *testing.T) {
	files, _ := filepath.Glob("../../testdata/demo/*/*.csv*")
	if len(files) != 36 {
		t.Fatalf("%d demo files", len(files))
	}
	dir := t.TempDir()
	for k, f := range files {
		args := []string{"graph", "--kind", "opn", "--format", "json", f}
		edges := filepath.Join(dir, "opn.csv")
		if k == 0 {
			args = append(args, "--edges", edges, "--graphml", filepath.Join(dir, "opn.graphml"))
		}
		out, stderr, code := runCLI(t, "", args...)
		if code != exitOK {
			t.Fatalf("%s: exit %d: %s", f, code, stderr)
		}
		var r struct {
			Ordinal struct {
				Metrics struct {
					Patterns    int   `json:"patterns"`
					Possible    int   `json:"possible"`
					Transitions int64 `json:"transitions"`
					OutDegree   []struct {
						K int `json:"k"`
					} `json:"out_degree"`
				} `json:"metrics"`
			} `json:"ordinal"`
		}
		if err := json.Unmarshal([]byte(out), &r); err != nil {
			t.Fatal(err)
		}
		m := r.Ordinal.Metrics
		if m.Possible != 120 || m.Patterns < 1 || m.Patterns > 120 || m.Transitions != 4096-4-1 || m.OutDegree[len(m.OutDegree)-1].K > 5 {
			t.Errorf("%s: %d of %d patterns, %d steps, out-degrees %v", f, m.Patterns, m.Possible, m.Transitions, m.OutDegree)
		}
		if k == 0 {
			b, _ := os.ReadFile(edges)
			lines := strings.Split(strings.TrimSpace(string(b)), "\n")
			var steps int64
			for _, l := range lines[1:] {
				var w int64
				parts := strings.Split(l, ",")
				json.Unmarshal([]byte(parts[2]), &w)
				steps += w
			}
			if lines[0] != "source,target,weight,source_pattern,target_pattern" || steps != m.Transitions {
				t.Errorf("opn edge list: %q, weights sum to %d, want %d", lines[0], steps, m.Transitions)
			}
		}
	}
}

// TestGraphKindFlags: flags of one kind are refused with another, and so
// are two threshold rules at once.
func TestGraphKindFlags(t *testing.T) {
	dir := t.TempDir()
	w := writeSeries(t, dir, "w.csv", "white", "--n", "500", "--seed", "3")
	for _, args := range [][]string{
		{"graph", "--kind", "nvg", "--order", "4", w},
		{"graph", "--kind", "opn", "--dim", "3", w},
		{"graph", "--kind", "hvg", "--delay", "2", w},
		{"graph", "--kind", "rn", "--rate", "0.1", "--eps", "0.2", w},
		{"graph", "--kind", "opn", "--order", "9", w},
	} {
		if _, stderr, code := runCLI(t, "", args...); code != exitUsage {
			t.Errorf("%v: exit %d (%s), want usage error", args, code, stderr)
		}
	}
}
