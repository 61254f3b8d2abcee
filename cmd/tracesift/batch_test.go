package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/classifier"
)

// A trace listed in a labels file that cannot be read is reported with the
// labels file's line as well as the trace's own location.
func TestTrainNamesLabelsLine(t *testing.T) {
	dir := t.TempDir()
	writeSeries(t, dir, "a.csv", "henon", "--n", "600")
	writeSeries(t, dir, "b.csv", "white", "--n", "600")
	fixture(t, dir, "bad.csv", []byte("t,value\n0,1\n1,abc\n"))
	labels := fixture(t, dir, "labels.csv", []byte("file,class\na.csv,chaotic\nb.csv,stochastic\nbad.csv,stochastic\n"))
	_, stderr, code := runCLI(t, "", "train", "--labels", labels, "--folds", "0", "-o", filepath.Join(dir, "m.model"))
	want := labels + " line 4: " + filepath.Join(dir, "bad.csv") + " line 3, column 2 (\"value\"): not a number"
	if code != exitPartial || !strings.Contains(stderr, want) {
		t.Fatalf("exit %d, stderr %q, want a line with %q", code, stderr, want)
	}
}

// compare: a group whose files all fail is named with its file count; a
// partly failed group's summary lists the files left out and why.
func TestCompareNamesFailedFiles(t *testing.T) {
	dir := t.TempDir()
	for _, g := range []string{"a", "b", "bad"} {
		os.Mkdir(filepath.Join(dir, g), 0o755)
	}
	for i, s := range []string{"1", "2", "3"} {
		writeSeries(t, dir, filepath.Join("a", "w"+s+".csv"), "white", "--n", "600", "--seed", s)
		writeSeries(t, dir, filepath.Join("b", "r"+s+".csv"), "ar1", "--n", "600", "--seed", string(rune('4'+i)))
	}
	fixture(t, dir, filepath.Join("a", "broken.csv"), []byte("t,value\n0,1\n1,abc\n"))
	fixture(t, dir, filepath.Join("bad", "x.csv"), []byte("t,value\n0,1\n"))
	fixture(t, dir, filepath.Join("bad", "y.csv"), nil)

	_, stderr, code := runCLI(t, "", "compare", "--group", "a="+filepath.Join(dir, "a"), "--group", "bad="+filepath.Join(dir, "bad"))
	if code != exitPartial || !strings.Contains(stderr, "group bad: none of its 2 files could be measured") {
		t.Errorf("all-failed group: exit %d, stderr %q", code, stderr)
	}

	out := filepath.Join(dir, "cmp")
	stdout, stderr, code := runCLI(t, "", "compare", "--group", "a="+filepath.Join(dir, "a"), "--group", "b="+filepath.Join(dir, "b"), "-o", out)
	if code != exitPartial {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(stdout, "1 files could not be measured") {
		t.Errorf("stdout does not mention the left-out file: %s", stdout)
	}
	md, _ := os.ReadFile(filepath.Join(out, "summary.md"))
	broken := filepath.Join(dir, "a", "broken.csv")
	if !strings.Contains(string(md), "## Files left out") || !strings.Contains(string(md), "`"+broken+"`: line 3, column 2 (\"value\"): not a number") {
		t.Errorf("summary.md does not list the failed file:\n%s", md)
	}
}

// surrogate --plot into a missing directory still prints the results it
// computed, then fails naming the plot path.
func TestSurrogatePlotFailureKeepsResults(t *testing.T) {
	dir := t.TempDir()
	h := writeSeries(t, dir, "h.csv", "henon", "--n", "600", "--seed", "2")
	plot := filepath.Join(dir, "no", "p.png")
	out, stderr, code := runCLI(t, "", "surrogate", "--stat", "op_ent_d4", "--count", "19", "--plot", plot, h)
	if code != exitPartial {
		t.Errorf("exit %d, want %d", code, exitPartial)
	}
	if !strings.Contains(out, "op_ent_d4") || !strings.Contains(out, "null hypothesis") {
		t.Errorf("results not printed: %q", out)
	}
	if !strings.Contains(stderr, "cannot write "+plot) || strings.Count(stderr, "\n") != 1 {
		t.Errorf("stderr %q", stderr)
	}
}

// --min-length is offered only where lowering it helps: the feature
// commands refuse a value below what their estimators need, and their
// too-short message does not suggest it; graph, which can use shorter
// traces, says how far it can go.
func TestMinLengthOnlyWhereItHelps(t *testing.T) {
	dir := t.TempDir()
	short := fixture(t, dir, "short.csv", column(100, "t,value\n", plainRow))
	for _, cmd := range []string{"classify", "features", "report", "surrogate"} {
		args := []string{cmd, "--min-length", "50", short}
		switch cmd {
		case "report":
			args = append(args, "-o", filepath.Join(dir, "r.html"))
		case "surrogate":
			args = append(args, "--stat", "op_ent_d4")
		}
		_, stderr, code := runCLI(t, "", args...)
		if code != exitUsage || !strings.Contains(stderr, "--min-length 50: this command's estimators need at least 256 samples per trace") {
			t.Errorf("%s --min-length 50: exit %d, stderr %q", cmd, code, stderr)
		}
	}
	_, stderr, _ := runCLI(t, "", "classify", short)
	if strings.Contains(stderr, "min-length") || !strings.Contains(stderr, "too short: only 100 samples, at least 256 needed") {
		t.Errorf("classify on a short trace: %q", stderr)
	}
	_, stderr, _ = runCLI(t, "", "graph", short)
	if !strings.Contains(stderr, "(--min-length can go down to 2 for this command)") {
		t.Errorf("graph on a short trace: %q", stderr)
	}
	if _, stderr, code := runCLI(t, "", "graph", "--min-length", "50", short); code != exitOK {
		t.Errorf("graph --min-length 50: exit %d: %s", code, stderr)
	}
}

// Training on the demo campaign's own labels alone works, with and without
// held-out validation; a labels set in which a feature is missing in every
// trace (no chaotic trace: no Lyapunov exponent anywhere) gives a model
// without that feature, recorded in the file and the summary, and classify
// with it neither asks for it nor notes it as replaced.
func TestTrainOnDemoLabelsAlone(t *testing.T) {
	dir := t.TempDir()
	labels := filepath.Join("..", "..", "testdata", "demo", "labels.csv")
	for _, folds := range []string{"0", "3"} {
		m := filepath.Join(dir, "demo"+folds+".model")
		if out, stderr, code := runCLI(t, "", "train", "--labels", labels, "--folds", folds, "--trees", "40", "--cv-trees", "10", "-o", m); code != exitOK {
			t.Fatalf("--folds %s: exit %d: %s%s", folds, code, stderr, out)
		}
	}

	raw, err := os.ReadFile(labels)
	if err != nil {
		t.Fatal(err)
	}
	demo, _ := filepath.Abs(filepath.Dir(labels))
	var rows []string
	for _, l := range strings.Split(strings.TrimSpace(string(raw)), "\n")[1:] {
		if !strings.HasSuffix(l, ",chaotic") {
			rows = append(rows, filepath.Join(demo, l))
		}
	}
	noChaos := fixture(t, dir, "nochaos.csv", []byte("file,class\n"+strings.Join(rows, "\n")+"\n"))
	m := filepath.Join(dir, "nochaos.model")
	out, stderr, code := runCLI(t, "", "train", "--labels", noChaos, "--folds", "0", "--trees", "40", "-o", m)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "left out of the model (missing in every training series, so classify never asks for them): nl_div_rate") {
		t.Errorf("training summary does not report the dropped feature:\n%s", out)
	}
	model, err := classifier.Load(m)
	if err != nil || len(model.Training.Dropped) == 0 || model.Training.Dropped[0] != "nl_div_rate" {
		t.Fatalf("model: err %v, dropped %v", err, model.Training.Dropped)
	}
	stdout, stderr, code := runCLI(t, "", "classify", "--model", m, "--format", "json", filepath.Join(demo, "stressed", "D01_stressed_Vg1.20.csv"))
	if code != exitOK {
		t.Fatalf("classify: exit %d: %s", code, stderr)
	}
	var line struct{ Warnings []string }
	if err := json.Unmarshal([]byte(stdout), &line); err != nil {
		t.Fatal(err)
	}
	for _, w := range line.Warnings {
		if strings.Contains(w, "nl_div_rate") {
			t.Errorf("classify mentions the dropped feature: %q", w)
		}
	}
}

// Batches draw a progress bar on a terminal (here a buffer standing in for
// one) with the count and the rate, and none on a buffer that is neither a
// terminal nor a file.
func TestBatchProgress(t *testing.T) {
	dir := t.TempDir()
	a := writeSeries(t, dir, "a.csv", "white", "--n", "600", "--seed", "1")
	b := writeSeries(t, dir, "b.csv", "white", "--n", "600", "--seed", "2")
	for _, cmd := range []string{"features", "classify"} {
		var out, errb bytes.Buffer
		code := runEnv(&env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb, terminal: true}, []string{cmd, a, b})
		if code != exitOK || !strings.Contains(errb.String(), "traces") || !strings.Contains(errb.String(), "/2, ") || !strings.Contains(errb.String(), "traces/") {
			t.Errorf("%s on a terminal: exit %d, stderr %q", cmd, code, errb.String())
		}
		if _, stderr, _ := runCLI(t, "", cmd, a, b); stderr != "" {
			t.Errorf("%s without a terminal: stderr %q", cmd, stderr)
		}
	}
}

// classify --help states each recording warning's rule and measured
// detection limit, from the same table the classifier's tests check.
func TestClassifyHelpStatesWarningLimits(t *testing.T) {
	out, _, code := runCLI(t, "", "classify", "--help")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	flat := strings.Join(strings.Fields(out), " ")
	for _, l := range classifier.RecordingWarningLimits() {
		if !strings.Contains(flat, l.Warning+":") {
			t.Errorf("help does not state the %q warning", l.Warning)
		}
	}
	for _, want := range []string{"drift: the least-squares straight line", "5% of the s.d. from n=60000"} {
		if !strings.Contains(flat, want) {
			t.Errorf("help lacks %q", want)
		}
	}
}

// graph shows its stages on a terminal.
func TestGraphProgress(t *testing.T) {
	w := writeSeries(t, t.TempDir(), "w.csv", "white", "--n", "3000")
	var out, errb bytes.Buffer
	if code := runEnv(&env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb, terminal: true}, []string{"graph", "--kind", "hvg", w}); code != exitOK {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(errb.String(), "graph") || !strings.Contains(errb.String(), "/2, ") {
		t.Errorf("stderr %q", errb.String())
	}
}
