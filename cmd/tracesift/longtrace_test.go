package main

import (
	"bytes"
	"encoding/json"
	"math"
	"strings"
	"testing"
)

// A graph past its edge budget fails with an error that names the flags a
// command-line user can set (not the library's option) and the memory the
// budget stands for; a budget that is high enough builds the graph.
func TestGraphEdgeBudgetNamesTheFlags(t *testing.T) {
	dir := t.TempDir()
	b := writeSeries(t, dir, "b.csv", "brownian", "--n", "3000", "--seed", "4")
	_, stderr, code := runCLI(t, "", "graph", "--max-edges", "2000", b)
	if code == exitOK || strings.Count(stderr, "\n") != 1 {
		t.Fatalf("exit %d, stderr %q; want one error line", code, stderr)
	}
	for _, want := range []string{b, "natural visibility of 3000 samples", "more than 2000 edges", "--max-edges", "--window", "32 kB"} {
		if !strings.Contains(stderr, want) {
			t.Errorf("error %q lacks %q", stderr, want)
		}
	}
	if strings.Contains(stderr, "Options.MaxEdges") {
		t.Errorf("error %q names the library option", stderr)
	}
	if _, stderr, code := runCLI(t, "", "graph", "--max-edges", "1000000", "--no-paths", b); code != exitOK {
		t.Errorf("budget 10^6 edges for 3000 samples: exit %d, %s", code, stderr)
	}
	for _, args := range [][]string{
		{"graph", "--max-edges", "0", b},
		{"graph", "--window", "1", b},
		{"graph", "--window", "-5", b},
		{"graph", "--window", "1000", "--edges", dir + "/e.csv", b},
	} {
		if _, stderr, code := runCLI(t, "", args...); code != exitUsage {
			t.Errorf("%v: exit %d (%s), want usage error", args, code, stderr)
		}
	}
}

// graph --window builds one graph per window and prints each metric's
// distribution: the JSON summary is computed from the per-window values it
// lists (mean, sample SD, extremes, median).
func TestGraphWindows(t *testing.T) {
	dir := t.TempDir()
	w := writeSeries(t, dir, "w.csv", "white", "--n", "3000", "--seed", "2")
	out, stderr, code := runCLI(t, "", "graph", "--kind", "hvg", "--window", "1000", "--format", "json", "--no-paths", w)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var line struct {
		Samples int    `json:"samples"`
		Kind    string `json:"kind"`
		Window  int    `json:"window"`
		Metrics map[string]struct {
			Defined                    int
			Mean, SD, Min, Median, Max *float64
		} `json:"metrics"`
		Windows []struct {
			Start, End int
			Metrics    map[string]*float64
		} `json:"windows"`
	}
	if err := json.Unmarshal([]byte(out), &line); err != nil {
		t.Fatalf("%v: %s", err, out)
	}
	if line.Samples != 3000 || line.Kind != "hvg" || line.Window != 1000 || len(line.Windows) != 3 {
		t.Fatalf("samples %d, kind %s, window %d, %d windows; want 3000, hvg, 1000, 3", line.Samples, line.Kind, line.Window, len(line.Windows))
	}
	var vals []float64
	for i, win := range line.Windows {
		if win.Start != 1000*i || win.End != 1000*(i+1) {
			t.Errorf("window %d spans %d–%d, want %d–%d", i, win.Start, win.End, 1000*i, 1000*(i+1))
		}
		vals = append(vals, *win.Metrics["mean_degree"])
	}
	mean := (vals[0] + vals[1] + vals[2]) / 3
	var ss float64
	for _, v := range vals {
		ss += (v - mean) * (v - mean)
	}
	d := line.Metrics["mean_degree"]
	if d.Defined != 3 || math.Abs(*d.Mean-mean) > 1e-12 || math.Abs(*d.SD-math.Sqrt(ss/2)) > 1e-12 ||
		*d.Min != min(vals[0], vals[1], vals[2]) || *d.Max != max(vals[0], vals[1], vals[2]) {
		t.Errorf("mean_degree summary %+v, per-window values %v", d, vals)
	}
	if p := line.Metrics["avg_path_length"]; p.Defined != 0 || p.Mean != nil {
		t.Errorf("--no-paths: avg_path_length summary %+v, want undefined", p)
	}
	table, _, code := runCLI(t, "", "graph", "--window", "1000", "--no-paths", w)
	if code != exitOK || !strings.Contains(table, "NVG of 3000 samples in 3 windows of 1000 samples") || !strings.Contains(table, "MEDIAN") {
		t.Errorf("table (exit %d):\n%s", code, table)
	}
}

// features measures a trace longer than --window in windows and says so;
// --window 0 measures it whole; the reason of a graph feature past the
// edge budget names the flags.
func TestFeaturesWindowsAndEdgeBudget(t *testing.T) {
	dir := t.TempDir()
	b := writeSeries(t, dir, "b.csv", "brownian", "--n", "3000", "--seed", "6")
	type line struct {
		Features     map[string]*float64 `json:"features"`
		Missing      map[string]string   `json:"missing"`
		Windows      int                 `json:"windows"`
		WindowLength int                 `json:"window_length"`
		Spread       map[string]struct {
			Measured int
			Min, Max *float64
		} `json:"spread"`
	}
	parse := func(args ...string) line {
		t.Helper()
		out, stderr, code := runCLI(t, "", append([]string{"features", "--format", "json"}, args...)...)
		if code != exitOK {
			t.Fatalf("%v: exit %d: %s", args, code, stderr)
		}
		var l line
		if err := json.Unmarshal([]byte(out), &l); err != nil {
			t.Fatalf("%v: %s", err, out)
		}
		return l
	}
	l := parse("--window", "1024", b)
	if l.Windows != 3 || l.WindowLength != 1000 || len(l.Spread) != len(coreFeatures) {
		t.Fatalf("--window 1024 on 3000 samples: %d windows of %d, %d spreads; want 3 of 1000 and one spread per feature", l.Windows, l.WindowLength, len(l.Spread))
	}
	if s := l.Spread["hv_deg_mean"]; s.Measured != 3 || *s.Min > *l.Features["hv_deg_mean"] || *s.Max < *l.Features["hv_deg_mean"] {
		t.Errorf("hv_deg_mean %v outside its range over windows %+v", *l.Features["hv_deg_mean"], s)
	}
	if l := parse("--window", "0", b); l.Windows != 0 || l.Spread != nil {
		t.Errorf("--window 0: %d windows, spread %v; want the whole trace", l.Windows, l.Spread)
	}
	l = parse("--max-edges", "5000", b)
	why := l.Missing["nv_deg_mean"]
	if l.Features["nv_deg_mean"] != nil || !strings.Contains(why, "--max-edges") || !strings.Contains(why, "--window") || strings.Contains(why, "Options.MaxEdges") {
		t.Errorf("nv_deg_mean past a 5000-edge budget: reason %q, want one naming --max-edges and --window", why)
	}
	for _, w := range []string{"100", "-1"} {
		if _, stderr, code := runCLI(t, "", "features", "--window", w, b); code != exitUsage || !strings.Contains(stderr, "--window") {
			t.Errorf("--window %s: exit %d, %q; want a usage error", w, code, stderr)
		}
	}
}

// With one input on a terminal (a buffer standing in for one), features
// draws a bar counting feature families per window; without a terminal it
// draws nothing.
func TestFeaturesProgressWithinOneTrace(t *testing.T) {
	dir := t.TempDir()
	a := writeSeries(t, dir, "a.csv", "ar1", "--n", "3000", "--seed", "1")
	var out, errb bytes.Buffer
	code := runEnv(&env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb, terminal: true}, []string{"features", "--window", "1024", a})
	if code != exitOK || !strings.Contains(errb.String(), "measuring") || !strings.Contains(errb.String(), "/15, ") {
		t.Errorf("on a terminal: exit %d, stderr %q; want a bar over 3 windows × 5 families", code, errb.String())
	}
	if _, stderr, _ := runCLI(t, "", "features", "--window", "1024", a); stderr != "" {
		t.Errorf("without a terminal: stderr %q", stderr)
	}
}
