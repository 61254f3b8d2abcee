package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"runtime"
	"slices"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features/surrogate"
)

// sigTraces writes the traces the --significance tests share into a
// temporary directory: a Hénon map (n = 2000), an AR(1) process
// (n = 1500) and a sine with harmonics (n = 1000).
func sigTraces(t *testing.T) (henon, ar1, sine string) {
	t.Helper()
	dir := t.TempDir()
	return writeSeries(t, dir, "henon.csv", "henon", "--n", "2000", "--seed", "4"),
		writeSeries(t, dir, "ar1.csv", "ar1", "--n", "1500", "--seed", "4"),
		writeSeries(t, dir, "sine.csv", "sine", "--n", "1000", "--seed", "4")
}

// TestClassifySignificanceJSON checks the documented keys of the
// significance object and the test's outcome on the Hénon map: the forecast
// gain and the time-reversal asymmetry both exceed all 39 surrogates, so
// p = 1/40 each and the smallest Holm-adjusted p is 2/40 = 0.05 (rank test,
// Theiler et al., Physica D 58 (1992) 77; Holm 1979); the AR(1) process
// satisfies the null.
func TestClassifySignificanceJSON(t *testing.T) {
	henon, ar1, _ := sigTraces(t)
	mp := reportModel(t)
	out, stderr, code := runCLI(t, "", "classify", "--model", mp, "--significance", "--format", "json", henon, ar1)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if len(lines) != 2 {
		t.Fatalf("%d lines, want 2", len(lines))
	}
	wantKeys := []string{"agreement", "alpha", "count", "delay", "dimension", "end_matched", "horizon", "length", "method",
		"min_surrogates", "null_hypothesis", "p", "rejected", "seed", "start", "statistics", "warnings"}
	wantStatKeys := []string{"count", "failed", "mean", "name", "observed", "p", "p_holm", "sd", "side", "significant"}
	for i, l := range lines {
		var raw map[string]json.RawMessage
		if err := json.Unmarshal([]byte(l), &raw); err != nil {
			t.Fatal(err)
		}
		var sig map[string]json.RawMessage
		if err := json.Unmarshal(raw["significance"], &sig); err != nil {
			t.Fatalf("line %d: significance: %v", i, err)
		}
		if got := sortedKeys(sig); !slices.Equal(got, wantKeys) {
			t.Errorf("significance keys %v, want %v", got, wantKeys)
		}
		var stats []map[string]json.RawMessage
		json.Unmarshal(sig["statistics"], &stats)
		if len(stats) != 2 {
			t.Fatalf("%d statistics", len(stats))
		}
		for _, s := range stats {
			if got := sortedKeys(s); !slices.Equal(got, wantStatKeys) {
				t.Errorf("statistic keys %v, want %v", got, wantStatKeys)
			}
		}
		var agr map[string]string
		json.Unmarshal(sig["agreement"], &agr)
		if agr["kind"] == "" || agr["text"] == "" {
			t.Errorf("agreement %v", agr)
		}
	}
	// The batch is sorted by path: ar1.csv before henon.csv.
	var h, a classifyLine
	json.Unmarshal([]byte(lines[1]), &h)
	json.Unmarshal([]byte(lines[0]), &a)
	if h.File != henon || a.File != ar1 {
		t.Fatalf("lines for %s and %s, want %s then %s", a.File, h.File, ar1, henon)
	}
	s := h.Significance
	if s == nil || !s.Rejected || float64(s.P) != 0.05 || s.Count != 39 || s.MinSurrogates != 39 || s.Seed != 1 || s.Method != "iaaft" {
		t.Fatalf("Hénon significance %+v", s)
	}
	names := []string{s.Statistics[0].Name, s.Statistics[1].Name}
	if !slices.Equal(names, surrogate.DeterminismStatNames()) {
		t.Errorf("statistics %v", names)
	}
	for _, st := range s.Statistics {
		if float64(st.P) != 1.0/40 || float64(st.PHolm) != 2.0/40 || !st.Significant || st.Side != "upper" || st.Count != 39 {
			t.Errorf("Hénon %s: %+v", st.Name, st)
		}
	}
	if a.Significance == nil || a.Significance.Rejected || !(float64(a.Significance.P) > 0.05) {
		t.Errorf("AR(1) significance %+v", a.Significance)
	}
}

func sortedKeys(m map[string]json.RawMessage) []string {
	var k []string
	for key := range m {
		k = append(k, key)
	}
	slices.Sort(k)
	return k
}

// TestClassifySignificanceTable checks the extra columns, the footer, the
// note for a regular verdict, and that a bad file in the batch is reported
// while the others are classified and tested.
func TestClassifySignificanceTable(t *testing.T) {
	henon, _, sine := sigTraces(t)
	mp := reportModel(t)
	bad := filepath.Join(t.TempDir(), "bad.csv")
	os.WriteFile(bad, []byte("t,value\n0,1\n1,abc\n"), 0o644)
	out, stderr, code := runCLI(t, "", "classify", "--model", mp, "--significance", henon, bad, sine)
	if code != exitPartial || !strings.Contains(stderr, "bad.csv") || strings.Contains(out, "bad.csv") {
		t.Fatalf("exit %d, stderr %q: want the bad file reported on stderr and skipped", code, stderr)
	}
	lines := strings.Split(out, "\n")
	if !strings.Contains(lines[0], "DETERMINISM P") || !strings.Contains(lines[0], "SURROGATE TEST") {
		t.Fatalf("header %q", lines[0])
	}
	var henonRow, sineRow string
	for _, l := range lines {
		switch {
		case strings.HasPrefix(l, henon):
			henonRow = l
		case strings.HasPrefix(l, sine):
			sineRow = l
		}
	}
	if !strings.Contains(henonRow, " 0.05 ") || !strings.Contains(henonRow, " significant ") {
		t.Errorf("Hénon row %q", henonRow)
	}
	if sineRow == "" {
		t.Fatal("no row for the sine")
	}
	if !strings.Contains(out, "surrogate test: 39 IAAFT surrogates per trace, seed 1, α = 0.05") {
		t.Errorf("no footer on the surrogate test:\n%s", out)
	}
	// Whatever the model says about the sine, a note explains the test
	// unless model and test agree.
	if strings.Contains(sineRow, " regular ") && !strings.Contains(out, sine+": regular verdict, surrogate test: ") {
		t.Errorf("no note on the regular verdict:\n%s", out)
	}
}

// TestClassifySignificanceNotes renders the notes of each model/test
// combination from hand-made results.
func TestClassifySignificanceNotes(t *testing.T) {
	mk := func(class string, rejected bool) classifyResult {
		p := 0.4
		if rejected {
			p = 0.05
		}
		return classifyResult{v: classifier.Verdict{Class: class}, sig: &surrogate.DeterminismResult{
			Count: 39, MinSurrogates: 39, Alpha: 0.05, Rejected: rejected,
			Stats: []surrogate.DeterminismStat{{PHolm: p}, {PHolm: 1}}}}
	}
	cases := []struct {
		class    string
		rejected bool
		want     string // "" means no note
	}{
		{"chaotic", true, ""},
		{"chaotic", false, "treat the chaotic verdict with caution"},
		{"stochastic", true, "nonlinear noise"},
		{"stochastic", false, ""},
		{"regular", true, "confirms structure, not chaos"},
		{"regular", false, "says nothing against the regular verdict"},
		{"undetermined", true, "model is undetermined"},
	}
	for _, c := range cases {
		l := classifyJSON("x.csv", mk(c.class, c.rejected))
		notes := significanceNotes(&l)
		switch {
		case c.want == "" && len(notes) != 0:
			t.Errorf("%s, rejected %v: unexpected notes %q", c.class, c.rejected, notes)
		case c.want != "" && (len(notes) != 1 || !strings.Contains(notes[0], c.want) || !strings.HasPrefix(notes[0], "  x.csv: "+c.class+" verdict, surrogate test: ")):
			t.Errorf("%s, rejected %v: notes %q, want one containing %q", c.class, c.rejected, notes, c.want)
		}
	}
	failed := classifyResult{v: classifier.Verdict{Class: "chaotic"}, sigErr: surrogate.ErrTooShort}
	fl := classifyJSON("x.csv", failed)
	if n := significanceNotes(&fl); len(n) != 1 || !strings.Contains(n[0], "surrogate test failed") {
		t.Errorf("failed test: %q", n)
	}
	if c := significanceCells(nil); c[1] != "failed" {
		t.Errorf("cells of a failed test %v", c)
	}
	j := newSignificanceJSON(nil, surrogate.ErrTooShort, "chaotic")
	if b, _ := json.Marshal(j); !strings.Contains(string(b), `"error":"series too short"`) || !strings.Contains(string(b), `"p":null`) {
		t.Errorf("JSON of a failed test: %s", b)
	}
}

// TestClassifySignificanceGOMAXPROCS: the same files and seed give the
// same bytes on one and on two threads (files and surrogates are placed by
// index).
func TestClassifySignificanceGOMAXPROCS(t *testing.T) {
	henon, ar1, _ := sigTraces(t)
	mp := reportModel(t)
	args := []string{"classify", "--model", mp, "--significance", "--surrogates", "19", "--alpha", "0.1", "--seed", "9", "--format", "json", henon, ar1}
	prev := runtime.GOMAXPROCS(1)
	one, _, code1 := runCLI(t, "", args...)
	runtime.GOMAXPROCS(2)
	two, _, code2 := runCLI(t, "", args...)
	runtime.GOMAXPROCS(prev)
	if code1 != exitOK || code2 != exitOK {
		t.Fatalf("exit %d, %d", code1, code2)
	}
	if one != two {
		t.Fatalf("1 and 2 threads differ:\n%s\n%s", one, two)
	}
	if !strings.Contains(one, `"count":19`) || !strings.Contains(one, `"seed":9`) || !strings.Contains(one, `"alpha":0.1`) {
		t.Errorf("flags not applied: %s", one)
	}
}

// TestClassifyWithoutSignificance: without the flag the output has neither
// the columns nor the JSON object (the output of earlier versions).
func TestClassifyWithoutSignificance(t *testing.T) {
	henon, _, _ := sigTraces(t)
	mp := reportModel(t)
	table, _, _ := runCLI(t, "", "classify", "--model", mp, henon)
	js, _, _ := runCLI(t, "", "classify", "--model", mp, "--format", "json", henon)
	if strings.Contains(table, "DETERMINISM") || strings.Contains(table, "surrogate test") || strings.Contains(js, "significance") {
		t.Errorf("surrogate test output without --significance:\n%s\n%s", table, js)
	}
	if !strings.HasSuffix(table, "\nmodel: "+mp+"\n"+caution+"\n") {
		t.Errorf("table does not end with the model and the caution:\n%s", table)
	}
}

func TestClassifySignificanceUsageErrors(t *testing.T) {
	henon, _, _ := sigTraces(t)
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"classify", "--surrogates", "99", henon}, "add --significance"},
		{[]string{"classify", "--alpha", "0.01", henon}, "add --significance"},
		{[]string{"classify", "--significance", "--surrogates", "-1", henon}, "--surrogates -1"},
		{[]string{"classify", "--significance", "--alpha", "2", henon}, "--alpha 2"},
	}
	for _, c := range cases {
		out, stderr, code := runCLI(t, "", c.args...)
		if code != exitUsage || !strings.Contains(stderr, c.want) || out != "" {
			t.Errorf("%v: exit %d, stderr %q, stdout %q; want a usage error containing %q", c.args, code, stderr, out, c.want)
		}
	}
}
