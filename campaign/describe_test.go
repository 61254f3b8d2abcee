package campaign

import (
	"errors"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// demoDir is the committed demo campaign.
var demoDir = filepath.Join("..", "testdata", "demo")

// TestReadDemoCampaign reads testdata/demo/campaign.csv: 36 traces, two
// groups, three biases, six devices each in both groups (the demo's
// construction, internal/demo).
func TestReadDemoCampaign(t *testing.T) {
	f, err := os.Open(filepath.Join(demoDir, "campaign.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	plan, err := ReadCSV(f, "campaign.csv", demoDir, Roles{})
	if err != nil {
		t.Fatal(err)
	}
	if len(plan.Traces) != 36 || len(plan.Problems) != 0 || plan.ParamName != "bias_V" || plan.DeviceName != "device" {
		t.Fatalf("%d traces, problems %v, parameter %q, device %q", len(plan.Traces), plan.Problems, plan.ParamName, plan.DeviceName)
	}
	count := map[string]int{}
	for _, tr := range plan.Traces {
		count[tr.Group+"@"+tr.Level]++
		if _, err := os.Stat(tr.Path); err != nil {
			t.Errorf("%s: %v", tr.ID, err)
		}
		if tr.Line < 2 {
			t.Errorf("%s: line %d", tr.ID, tr.Line)
		}
	}
	for _, k := range []string{"fresh@0.60", "fresh@0.90", "fresh@1.20", "stressed@0.60", "stressed@0.90", "stressed@1.20"} {
		if count[k] != 6 {
			t.Errorf("%s: %d traces, want 6", k, count[k])
		}
	}
}

// TestReadCSVProblems: each unusable row is one problem with its line;
// the good rows go on.
func TestReadCSVProblems(t *testing.T) {
	dir := t.TempDir()
	for _, name := range []string{"a.csv", "b.csv", "sub/c.csv", "sub/deeper/d.csv", "sub/notes.md"} {
		p := filepath.Join(dir, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte("1\n2\n"), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	desc := strings.Join([]string{
		"file,group,device,bias_V",
		"a.csv,fresh,D1,0.6",       // line 2: fine
		"missing.csv,fresh,D2,0.6", // line 3: no such file
		"b.csv,fresh,D3,0.6,extra", // line 4: a field in no column
		"b.csv,,D3,0.6",            // line 5: empty group
		"b.csv,stressed,D3,high",   // line 6: not a number
		"a.csv,stressed,D1,0.9",    // line 7: listed twice
		"sub,stressed,D4,0.9",      // line 8: a directory, walked
		"",
	}, "\n")
	plan, err := ReadCSV(strings.NewReader(desc), "plan.csv", dir, Roles{})
	if err != nil {
		t.Fatal(err)
	}
	var ids []string
	for _, tr := range plan.Traces {
		ids = append(ids, tr.ID)
	}
	if got := strings.Join(ids, " "); got != "a.csv sub/c.csv sub/deeper/d.csv" {
		t.Errorf("traces %q, want a.csv and the two files below sub (Markdown skipped)", got)
	}
	want := []string{
		"plan.csv:3: missing.csv: no such file",
		"plan.csv:4: 5 fields: field 5 is in no column",
		"plan.csv:5: b.csv: empty group",
		`plan.csv:6: b.csv: bias_V "high" is not a number`,
		"plan.csv:7: a.csv: listed twice (first on line 2)",
	}
	if len(plan.Problems) != len(want) {
		t.Fatalf("problems %q, want %d", plan.Problems, len(want))
	}
	for i, w := range want {
		got := plan.Problems[i].String()
		if !strings.HasPrefix(got, w) || strings.Contains(got, "\n") {
			t.Errorf("problem %d = %q, want it to start with %q on one line", i, got, w)
		}
	}
}

// TestRolesUnknownColumn: an explicit role naming a column the header
// lacks is an error that names it and the header's line; the defaults
// for device and parameter are optional, the group is not.
func TestRolesUnknownColumn(t *testing.T) {
	desc := "file,condition,bias\nx.csv,fresh,1\n"
	_, err := ReadCSV(strings.NewReader(desc), "plan.csv", ".", Roles{Group: "condition", Param: "bias_V"})
	if !errors.Is(err, ErrUnknownColumn) || !strings.Contains(err.Error(), `plan.csv:1: column "bias_V"`) {
		t.Errorf("explicit unknown column: %v", err)
	}
	_, err = ReadCSV(strings.NewReader(desc), "plan.csv", ".", Roles{})
	if !errors.Is(err, ErrUnknownColumn) || !strings.Contains(err.Error(), `"group"`) {
		t.Errorf("no group column: %v", err)
	}
	plan, err := ReadCSV(strings.NewReader(desc), "plan.csv", ".", Roles{Group: "condition"})
	if err != nil || plan.ParamName != "" || plan.DeviceName != "" {
		t.Errorf("optional defaults: %+v %v", plan, err)
	}
	if _, err := ReadCSV(strings.NewReader("name,group\n"), "plan.csv", ".", Roles{}); !errors.Is(err, ErrUnknownColumn) {
		t.Errorf("no file column: %v", err)
	}
}

// TestFromPattern walks the demo directory with the named-group pattern
// of the demo's file names; the files it does not describe are noted.
func TestFromPattern(t *testing.T) {
	re := regexp.MustCompile(`(?P<device>D\d+)_(?P<group>fresh|stressed)_Vg(?P<bias_V>[0-9.]+)`)
	plan, err := FromPattern([]string{demoDir}, re, Roles{})
	if err != nil {
		t.Fatal(err)
	}
	if len(plan.Traces) != 36 || len(plan.Problems) != 0 {
		t.Fatalf("%d traces, problems %v", len(plan.Traces), plan.Problems)
	}
	for _, tr := range plan.Traces {
		if tr.Level != "0.60" && tr.Level != "0.90" && tr.Level != "1.20" {
			t.Errorf("%s: level %q (the dot before the extension must not stay)", tr.ID, tr.Level)
		}
		if !strings.HasPrefix(tr.ID, tr.Group+"/"+tr.Device+"_") {
			t.Errorf("%s: group %s device %s", tr.ID, tr.Group, tr.Device)
		}
	}
	// campaign.csv, labels.csv, mkdemo.go and the NumPy and TDMS copies
	// of two traces (named outside the pattern on purpose) are left out.
	if len(plan.Notes) != 5 {
		t.Errorf("notes %q, want 5", plan.Notes)
	}
	if _, err := FromPattern([]string{demoDir}, re, Roles{Param: "temperature_K"}); !errors.Is(err, ErrUnknownColumn) {
		t.Errorf("unknown named group: %v", err)
	}
}
