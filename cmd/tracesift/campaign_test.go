package main

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"slices"
	"strings"
	"testing"
)

// surveyFast are the flags that keep the demo survey quick in tests: the
// increment family and two HVG metrics, two surrogates per method.
var surveyFast = []string{"--metrics", "increments,hv_tail_exprate,hv_clust_mean", "--surrogates", "2", "--seed", "3"}

// demoCampaign copies the demo campaign description into a temporary
// directory with links to the demo's trace directories, so descriptions
// written there name the traces exactly as testdata/demo/campaign.csv
// does; it returns the directory and the description's rows.
func demoCampaign(t *testing.T) (string, [][]string) {
	t.Helper()
	dir := t.TempDir()
	demo, err := filepath.Abs(filepath.Join("..", "..", "testdata", "demo"))
	if err != nil {
		t.Fatal(err)
	}
	for _, sub := range []string{"fresh", "stressed"} {
		if err := os.Symlink(filepath.Join(demo, sub), filepath.Join(dir, sub)); err != nil {
			t.Skipf("symlinks unavailable: %v", err)
		}
	}
	f, err := os.Open(filepath.Join(demo, "campaign.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return dir, rows
}

func writeCSV(t *testing.T, path string, rows [][]string) {
	t.Helper()
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	w.WriteAll(rows)
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
}

// outputs reads every file below dir, by relative path.
func outputs(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	out := map[string][]byte{}
	err := filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		rel, _ := filepath.Rel(dir, p)
		b, err := os.ReadFile(p)
		out[filepath.ToSlash(rel)] = b
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// TestSurveyDemo runs the demo campaign through the command once whole
// (one worker) and once split by device into two runs (all workers) that
// only write their per-trace tables; the statistics from the concatenated
// tables (--from) must be the one run's outputs byte for byte — tables,
// tests, Markdown pages, figures and the HTML report. This also shows that the results do
// not depend on the number of workers or on how a campaign is split.
func TestSurveyDemo(t *testing.T) {
	dir, rows := demoCampaign(t)
	writeCSV(t, filepath.Join(dir, "campaign.csv"), rows)
	var part1, part2 [][]string
	part1, part2 = append(part1, rows[0]), append(part2, rows[0])
	for _, r := range rows[1:] {
		if r[1] <= "D03" {
			part1 = append(part1, r)
		} else {
			part2 = append(part2, r)
		}
	}
	writeCSV(t, filepath.Join(dir, "part1.csv"), part1)
	writeCSV(t, filepath.Join(dir, "part2.csv"), part2)

	whole := filepath.Join(dir, "whole")
	procs := runtime.GOMAXPROCS(1)
	out, errOut, code := runCLI(t, "", append([]string{"survey", filepath.Join(dir, "campaign.csv"), "-o", whole, "--title", "demo"}, surveyFast...)...)
	runtime.GOMAXPROCS(procs)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "surveyed 36 traces in 2 groups at 3 levels") {
		t.Errorf("stdout: %q", out)
	}
	for i, part := range []string{"part1", "part2"} {
		_, errOut, code := runCLI(t, "", append([]string{"survey", filepath.Join(dir, part+".csv"), "--tables-only", "-o", filepath.Join(dir, part)}, surveyFast...)...)
		if code != exitOK {
			t.Fatalf("part %d: exit %d: %s", i+1, code, errOut)
		}
	}
	var merged []byte
	for _, part := range []string{"part2", "part1"} { // in either order, headers included
		b, err := os.ReadFile(filepath.Join(dir, part, "traces.csv"))
		if err != nil {
			t.Fatal(err)
		}
		merged = append(merged, b...)
	}
	if err := os.WriteFile(filepath.Join(dir, "merged.csv"), merged, 0o644); err != nil {
		t.Fatal(err)
	}
	fromDir := filepath.Join(dir, "from")
	if _, errOut, code := runCLI(t, "", "survey", "--from", filepath.Join(dir, "merged.csv"), "-o", fromDir, "--title", "demo"); code != exitOK {
		t.Fatalf("--from: exit %d: %s", code, errOut)
	}

	// The same campaign in three shards (--shard K/3, by trace), their
	// journals collated into one per-trace table, the statistics from it.
	var journals []string
	for k := range 3 {
		part := filepath.Join(dir, fmt.Sprintf("shard%d", k))
		_, errOut, code := runCLI(t, "", append([]string{"survey", filepath.Join(dir, "campaign.csv"), "--tables-only", "--shard", fmt.Sprintf("%d/3", k), "-o", part}, surveyFast...)...)
		if code != exitOK {
			t.Fatalf("shard %d: exit %d: %s", k, code, errOut)
		}
		journals = append(journals, part)
	}
	collated := filepath.Join(dir, "collated.csv")
	if _, errOut, code := runCLI(t, "", append([]string{"collate", "-o", collated}, journals...)...); code != exitOK {
		t.Fatalf("collate: exit %d: %s", code, errOut)
	}
	shardDir := filepath.Join(dir, "fromshards")
	if _, errOut, code := runCLI(t, "", "survey", "--from", collated, "-o", shardDir, "--title", "demo"); code != exitOK {
		t.Fatalf("--from the collated shards: exit %d: %s", code, errOut)
	}

	a, b, c := outputs(t, whole), outputs(t, fromDir), outputs(t, shardDir)
	delete(a, surveyJournal) // the run's record, not a result
	names := make([]string, 0, len(a))
	for n := range a {
		names = append(names, n)
	}
	slices.Sort(names)
	for _, n := range []string{"traces.csv", "traces.jsonl", "tests.csv", "tests.jsonl", "distributions.csv", "summary.md", "level_0.60.md", "level_0.90.md", "level_1.20.md", "figures/dx_kurt_ex.png", "report.html"} {
		if len(a[n]) == 0 {
			t.Errorf("%s missing or empty; outputs %q", n, names)
		}
	}
	if len(a) != len(b) || len(a) != len(c) {
		t.Errorf("one run wrote %d files, the merged tables %d, the collated shards %d", len(a), len(b), len(c))
	}
	for _, n := range names {
		if !bytes.Equal(a[n], b[n]) {
			t.Errorf("%s differs between the one run and the merged tables", n)
		}
		if !bytes.Equal(a[n], c[n]) {
			t.Errorf("%s differs between the one run and the collated shards", n)
		}
	}

	// Content: every question answered, the families that cannot reach
	// significance with 6 devices named, the caution printed.
	sum := string(a["summary.md"])
	for _, want := range []string{"## Warnings", "per-trace rank tests", "groups/signed-rank", "## Trend with bias_V", caution, "[level_0.60.md](level_0.60.md)"} {
		if !strings.Contains(sum, want) {
			t.Errorf("summary.md lacks %q", want)
		}
	}
	tests := string(a["tests.csv"])
	for _, fam := range []string{"groups/ks", "groups/mann-whitney", "groups/signed-rank", "trend/spearman", "surrogate/shuffle", "surrogate/gauss", "surrogate/iaaft", "trace/fresh/D01_fresh_Vg0.60.csv", "distribution/permutation-ks", "distribution/permutation-chi2", "distribution/paired-flip-ks"} {
		if !strings.Contains(tests, "\n"+fam+",") {
			t.Errorf("tests.csv has no family %s", fam)
		}
	}
	level := string(a["level_1.20.md"])
	for _, want := range []string{"## stressed against fresh", "### shuffle", "### gauss", "### iaaft", "## Pooled distributions", "hvg_clustering | stressed vs fresh", "one per distinct value", caution} {
		if !strings.Contains(level, want) {
			t.Errorf("level_1.20.md lacks %q", want)
		}
	}
	// HVG clustering coefficients take few discrete values: binned on them.
	if !strings.Contains(string(a["distributions.csv"]), "\nhvg_clustering,fresh,0.60,6,true,") {
		t.Errorf("distributions.csv does not bin the HVG clustering of fresh at 0.60 on its distinct values")
	}
	// The report: a verdict per trace from the embedded model, in the
	// grid and in the table (3 classes each).
	page := string(a["report.html"])
	if n := strings.Count(page, `<span class="v" tabindex="0"`); n != 36 {
		t.Errorf("report.html: %d verdicts in the grid, want 36", n)
	}
	if !strings.Contains(page, "embedded default model") || !strings.Contains(page, "<h1>demo</h1>") {
		t.Error("report.html does not name the model and the title")
	}
	if n := strings.Count(string(a["traces.csv"]), "\nverdict,"); n != 36*3 {
		t.Errorf("%d verdict rows, want %d", n, 36*3)
	}
	// 36 traces × 6 metrics (4 increment features and 2 HVG ones) × (1
	// original + 3 methods) metric rows.
	if n := strings.Count(string(a["traces.csv"]), "\nmetric,"); n != 36*6*4 {
		t.Errorf("%d metric rows, want %d", n, 36*6*4)
	}
}

// TestSurveyBadCampaign: unusable rows are reported one line each with
// the description's name and line, the rest is analysed and the exit
// status is 1; a column named by a flag that the description lacks is a
// usage error (exit 2).
func TestSurveyBadCampaign(t *testing.T) {
	dir, rows := demoCampaign(t)
	bad := append([][]string{rows[0]}, rows[1:]...)
	bad[3] = []string{"fresh/D09_fresh_Vg0.60.csv", "D09", "fresh", "0.60", "0.05"}
	bad[5] = append(slices.Clone(bad[5]), "surplus")
	writeCSV(t, filepath.Join(dir, "bad.csv"), bad)
	_, errOut, code := runCLI(t, "", append([]string{"survey", filepath.Join(dir, "bad.csv"), "-o", filepath.Join(dir, "out"), "--no-figures"}, surveyFast...)...)
	if code != exitPartial {
		t.Fatalf("exit %d, want %d: %s", code, exitPartial, errOut)
	}
	name := filepath.Join(dir, "bad.csv")
	for _, want := range []string{
		"tracesift: " + name + ":4: fresh/D09_fresh_Vg0.60.csv: no such file\n",
		"tracesift: " + name + ":6: 6 fields: field 6 is in no column",
	} {
		if !strings.Contains(errOut, want) {
			t.Errorf("stderr lacks %q:\n%s", want, errOut)
		}
	}
	sum, err := os.ReadFile(filepath.Join(dir, "out", "summary.md"))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(sum), "34 traces") || !strings.Contains(string(sum), "## Left out") {
		t.Errorf("summary does not show the 34 usable traces and the left-out rows")
	}

	_, errOut, code = runCLI(t, "", "survey", filepath.Join(dir, "bad.csv"), "--param-column", "temperature_K", "-o", filepath.Join(dir, "out2"))
	if code != exitUsage || !strings.Contains(errOut, `:1: column "temperature_K" not in the header (columns: file, device, group, bias_V, drain_V)`) {
		t.Errorf("unknown column: exit %d, %q", code, errOut)
	}
	_, errOut, code = runCLI(t, "", "survey", "-o", filepath.Join(dir, "out3"))
	if code != exitUsage {
		t.Errorf("no campaign: exit %d, %q", code, errOut)
	}
}
