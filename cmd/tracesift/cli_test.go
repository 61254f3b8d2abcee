package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// runCLI runs the command line against buffers and returns stdout, stderr and
// the exit status. The command sees no environment, so a test run inside a
// scheduler's job array is not sharded by it.
func runCLI(t *testing.T, stdin string, args ...string) (string, string, int) {
	t.Helper()
	return runCLIEnv(t, nil, stdin, args...)
}

// runCLIEnv is runCLI with the environment variables vars.
func runCLIEnv(t *testing.T, vars map[string]string, stdin string, args ...string) (string, string, int) {
	t.Helper()
	var out, errb bytes.Buffer
	e := &env{stdin: strings.NewReader(stdin), stdout: &out, stderr: &errb, getenv: func(k string) string { return vars[k] }}
	code := runEnv(e, args)
	return out.String(), errb.String(), code
}

func TestGenerateHenonIsDeterministic(t *testing.T) {
	a, _, code := runCLI(t, "", "generate", "henon", "--n", "1000", "--seed", "7")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	lines := strings.Split(strings.TrimSuffix(a, "\n"), "\n")
	if len(lines) != 1001 || lines[0] != "t,value" {
		t.Fatalf("got %d lines starting %q, want header t,value + 1000 rows", len(lines), lines[0])
	}
	b, _, _ := runCLI(t, "", "generate", "henon", "--n", "1000", "--seed", "7")
	if a != b {
		t.Fatal("two runs with the same seed differ")
	}
	c, _, _ := runCLI(t, "", "generate", "henon", "--n", "1000", "--seed", "8")
	if a == c {
		t.Fatal("different seeds gave the same series")
	}
}

func TestGenerateFlowTimeColumnAndNoise(t *testing.T) {
	out, _, code := runCLI(t, "", "generate", "lorenz", "--n", "4", "--set", "dt=0.02", "--snr", "20")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	sc := bufio.NewScanner(strings.NewReader(out))
	sc.Scan()
	for k := 0; sc.Scan(); k++ {
		tcol, _, _ := strings.Cut(sc.Text(), ",")
		got, err := strconv.ParseFloat(tcol, 64)
		if err != nil || abs(got-0.02*float64(k)) > 1e-12 {
			t.Fatalf("row %d: t = %q, want %g", k, tcol, 0.02*float64(k))
		}
	}
}

func TestGenerateWritesFileAtomically(t *testing.T) {
	p := filepath.Join(t.TempDir(), "h.csv")
	if _, stderr, code := runCLI(t, "", "generate", "henon", "--n", "10", "-o", p); code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	b, err := os.ReadFile(p)
	if err != nil || !strings.HasPrefix(string(b), "t,value\n") {
		t.Fatalf("file %q, err %v", b, err)
	}
}

func TestGenerateUsageErrors(t *testing.T) {
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"generate", "nosuch"}, "valid systems: "},
		{[]string{"generate", "logistic", "--set", "q=1"}, "valid parameters: r"},
		{[]string{"generate", "logistic", "--set", "r=9"}, "out of range"},
		{[]string{"generate", "logistic", "--set", "r"}, "want name=value"},
		{[]string{"generate", "logistic", "--set", "r=abc"}, "not a finite number"},
		{[]string{"generate", "logistic", "--n", "0"}, "positive number"},
		{[]string{"generate"}, "accepts 1 arg"},
		{[]string{"generate", "henon", "--bogus"}, "unknown flag"},
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
			t.Errorf("%v: wrote %q to stdout on error", c.args, out)
		}
	}
}

func TestSystemsJSONHasEveryRegisteredSystem(t *testing.T) {
	out, _, code := runCLI(t, "", "systems", "--format", "json")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	seen := map[string]bool{}
	for _, line := range strings.Split(strings.TrimSpace(out), "\n") {
		var s systemJSON
		if err := json.Unmarshal([]byte(line), &s); err != nil {
			t.Fatalf("line %q: %v", line, err)
		}
		if s.Class != "chaotic" && s.Class != "stochastic" && s.Class != "regular" {
			t.Errorf("%s: class %q", s.Name, s.Class)
		}
		seen[s.Name] = true
	}
	for _, n := range []string{"logistic", "henon", "lorenz", "white", "ar1", "ou"} {
		if !seen[n] {
			t.Errorf("system %s missing from systems --format json", n)
		}
	}
}

func TestVersionAndHelp(t *testing.T) {
	out, _, code := runCLI(t, "", "--version")
	if code != exitOK || !strings.Contains(out, version) {
		t.Fatalf("--version: exit %d, %q", code, out)
	}
	out, _, _ = runCLI(t, "", "--help")
	for _, c := range []string{"generate", "systems", "completion"} {
		if !strings.Contains(out, c) {
			t.Errorf("--help does not list %s", c)
		}
	}
}

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}
