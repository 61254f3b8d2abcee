package main

import (
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
)

// reportForest is a small model trained once per test binary (the
// embedded default model may not be trained yet in a checkout);
// reportModel saves it into the test's temporary directory.
var reportForest = sync.OnceValues(func() (*classifier.Model, error) {
	ds, _, err := classifier.BuildReference(classifier.ReferenceOptions{PerClass: 20, MaxLength: 2000, Seed: 5}, features.Options{})
	if err != nil {
		return nil, err
	}
	return classifier.Train(ds, classifier.Config{Trees: 20, Seed: 5, Schema: currentSchema()})
})

func reportModel(t *testing.T) string {
	t.Helper()
	m, err := reportForest()
	if err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(t.TempDir(), "small.model")
	if err := m.Save(p); err != nil {
		t.Fatal(err)
	}
	return p
}

const demoTrace = "../../testdata/demo/stressed/D01_stressed_Vg1.20.csv"

func TestReportWritesHTML(t *testing.T) {
	mp := reportModel(t)
	out := filepath.Join(t.TempDir(), "r.html")
	// One cheap statistic and 39 surrogates (enough for one two-sided test
	// at α = 0.05) keep the test fast.
	stdout, stderr, code := runCLI(t, "", "report", demoTrace, "--model", mp, "--stat", "nl_trev_1", "--surrogates", "39", "-o", out)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.HasPrefix(stdout, demoTrace+": ") || !strings.Contains(stdout, "→ "+out) {
		t.Errorf("stdout %q", stdout)
	}
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	html := string(b)
	for _, id := range []string{"summary", "verdict", "trace", "degrees", "clustering", "plane", "surrogates", "methods"} {
		if !strings.Contains(html, `id="`+id+`"`) {
			t.Errorf("section %s missing", id)
		}
	}
	for _, want := range []string{"4096", "Id", "0.0001 s", "nl_trev_1", "not a device qualification result", "tracesift " + version} {
		if !strings.Contains(html, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	// Same file, model and seed: same bytes.
	out2 := filepath.Join(t.TempDir(), "r2.html")
	if _, stderr, code := runCLI(t, "", "report", demoTrace, "--model", mp, "--stat", "nl_trev_1", "--surrogates", "39", "-o", out2); code != exitOK {
		t.Fatalf("second run: exit %d: %s", code, stderr)
	}
	if b2, _ := os.ReadFile(out2); string(b2) != html {
		t.Error("two runs with the same seed wrote different reports")
	}
}

func TestReportUsageErrors(t *testing.T) {
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"report", demoTrace}, "no output"},
		{[]string{"report", demoTrace, "-o", "x.html", "--order", "9"}, "order 9"},
		{[]string{"report", demoTrace, "-o", "x.html", "--stat", "nosuch"}, "unknown feature"},
		{[]string{"report", demoTrace, "-o", "x.html", "--surrogates", "-4"}, "--surrogates -4"},
		{[]string{"report", "-o", "x.html"}, "accepts 1 arg"},
	}
	for _, c := range cases {
		out, stderr, code := runCLI(t, "", c.args...)
		if code != exitUsage {
			t.Errorf("%v: exit %d, want %d", c.args, code, exitUsage)
		}
		if !strings.Contains(stderr, c.want) || strings.Count(strings.TrimSpace(stderr), "\n") != 0 {
			t.Errorf("%v: stderr %q, want one line containing %q", c.args, stderr, c.want)
		}
		if out != "" {
			t.Errorf("%v: wrote %q to stdout", c.args, out)
		}
	}
}

func TestReportBadInputLeavesNoFile(t *testing.T) {
	mp := reportModel(t)
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.csv")
	if err := os.WriteFile(bad, []byte("t,value\n0,1\n1,abc\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "r.html")
	_, stderr, code := runCLI(t, "", "report", bad, "--model", mp, "-o", out)
	if code == exitOK || !strings.Contains(stderr, "bad.csv") {
		t.Errorf("exit %d, stderr %q: want a failure naming the file", code, stderr)
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Errorf("a report was written for a bad input (stat: %v)", err)
	}
}
