package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestBenchUsage: the full suite takes a minute, so the CLI test checks the
// argument handling; the suite itself is tested in package benchmarks.
func TestBenchUsage(t *testing.T) {
	file := filepath.Join(t.TempDir(), "file")
	if err := os.WriteFile(file, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		args []string
		code int
		msg  string
	}{
		{[]string{"bench"}, exitUsage, "-o DIR"},
		{[]string{"bench", "--quick", "--full", "-o", t.TempDir()}, exitUsage, "quick"},
		{[]string{"bench", "-o", file}, exitUsage, "not a directory"},
		{[]string{"bench", "extra", "-o", t.TempDir()}, exitUsage, "unknown command"},
		{[]string{"bench", "--model", filepath.Join(t.TempDir(), "missing.model"), "-o", t.TempDir()}, exitPartial, "missing.model"},
	}
	for _, c := range cases {
		_, stderr, code := runCLI(t, "", c.args...)
		if code != c.code || !strings.Contains(stderr, c.msg) || strings.Count(strings.TrimSpace(stderr), "\n") != 0 {
			t.Errorf("%v: exit %d, stderr %q; want exit %d and one line naming %q", c.args, code, stderr, c.code, c.msg)
		}
	}
	out, _, code := runCLI(t, "", "bench", "--help")
	if code != exitOK || !strings.Contains(out, "--quick") || !strings.Contains(out, "(the default)") || !strings.Contains(out, "Examples:") {
		t.Errorf("help: exit %d\n%s", code, out)
	}
}
