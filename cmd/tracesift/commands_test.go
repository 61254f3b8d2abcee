package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/models"
)

// writeSeries writes a generated series as a CSV file and returns its path.
func writeSeries(t *testing.T, dir, name string, args ...string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	all := append([]string{"generate"}, args...)
	all = append(all, "-o", p)
	if _, stderr, code := runCLI(t, "", all...); code != exitOK {
		t.Fatalf("generate %v: %s", args, stderr)
	}
	return p
}

func TestFeaturesFormats(t *testing.T) {
	dir := t.TempDir()
	h := writeSeries(t, dir, "henon.csv", "henon", "--n", "2000", "--seed", "3")
	out, _, code := runCLI(t, "", "features", h)
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	for _, n := range coreFeatures {
		if !strings.Contains(out, n) {
			t.Errorf("table lacks core feature %s", n)
		}
	}
	out, _, _ = runCLI(t, "", "features", "--format", "json", "--all", h)
	var line struct {
		File     string              `json:"file"`
		Features map[string]*float64 `json:"features"`
		Missing  map[string]string   `json:"missing"`
	}
	if err := json.Unmarshal([]byte(out), &line); err != nil {
		t.Fatalf("%v: %s", err, out)
	}
	// --all: the schema's features and the extended families (rn_*, opn_*).
	if line.File != h || len(line.Features) != len(features.AllNames()) {
		t.Fatalf("json file %q with %d features, want %q and %d", line.File, len(line.Features), h, len(features.AllNames()))
	}
	for name, v := range line.Features {
		if (v == nil) != (line.Missing[name] != "") {
			t.Errorf("%s: value %v, missing reason %q", name, v, line.Missing[name])
		}
	}
	// A file named twice is measured once (the batch is de-duplicated).
	out, _, _ = runCLI(t, "", "features", "--format", "csv", h, h)
	rows := strings.Split(strings.TrimSpace(out), "\n")
	if len(rows) != 2 || !strings.HasPrefix(rows[0], "file,samples,nl_div_rate,") {
		t.Fatalf("csv: %q", out)
	}
}

func TestFeaturesBatchGoesOnAfterABadFile(t *testing.T) {
	dir := t.TempDir()
	good := writeSeries(t, dir, "ar1.csv", "ar1", "--n", "1000")
	bad := filepath.Join(dir, "bad.csv")
	os.WriteFile(bad, []byte("t,value\n0,1\n1,abc\n"), 0o644)
	out, stderr, code := runCLI(t, "", "features", "--format", "json", bad, good)
	if code != exitPartial {
		t.Fatalf("exit %d, want %d", code, exitPartial)
	}
	if !strings.Contains(stderr, "bad.csv line 3") || !strings.Contains(out, `"file":"`+good+`"`) {
		t.Fatalf("stderr %q, stdout %q", stderr, out)
	}
}

func TestFeaturesOutputFileIsAtomic(t *testing.T) {
	dir := t.TempDir()
	good := writeSeries(t, dir, "w.csv", "white", "--n", "600")
	out := filepath.Join(dir, "f.csv")
	if _, stderr, code := runCLI(t, "", "features", "--format", "csv", "-o", out, good); code != exitOK {
		t.Fatal(stderr)
	}
	if b, _ := os.ReadFile(out); !strings.HasPrefix(string(b), "file,samples,") {
		t.Fatalf("output %q", b)
	}
}

func TestSurrogateJSON(t *testing.T) {
	dir := t.TempDir()
	h := writeSeries(t, dir, "henon.csv", "henon", "--n", "1000", "--seed", "2")
	out, stderr, code := runCLI(t, "", "surrogate", h, "--method", "iaaft", "--count", "19", "--stat", "nl_trev_1", "--format", "json", "--side", "upper")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var rep struct {
		File  string                   `json:"file"`
		Tests []map[string]interface{} `json:"tests"`
	}
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatal(err)
	}
	if len(rep.Tests) != 1 {
		t.Fatalf("tests: %v", rep.Tests)
	}
	for _, k := range []string{"stat", "observed", "mean", "sd", "z", "p", "method", "count"} {
		if _, ok := rep.Tests[0][k]; !ok {
			t.Errorf("test result lacks key %q", k)
		}
	}
	// Hénon's time asymmetry (|A| ≈ 0.7, far outside what IAAFT surrogates
	// of a linear process give) is rejected at the smallest p 19 surrogates
	// allow one-sided: 1/20 (Theiler et al. 1992 rank test).
	if p := rep.Tests[0]["p"].(float64); p != 0.05 {
		t.Errorf("p = %v, want 1/(19+1)", p)
	}
}

func TestSurrogateUsageErrors(t *testing.T) {
	dir := t.TempDir()
	h := writeSeries(t, dir, "h.csv", "henon", "--n", "500")
	for _, c := range [][]string{
		{"surrogate", h},
		{"surrogate", h, "--stat", "nosuch"},
		{"surrogate", h, "--stat", "nl_trev_1", "--method", "magic"},
		{"surrogate", h, "--stat", "nl_trev_1", "--count", "0"},
	} {
		if _, stderr, code := runCLI(t, "", c...); code != exitUsage || strings.Count(strings.TrimSpace(stderr), "\n") != 0 {
			t.Errorf("%v: exit %d, stderr %q", c[2:], code, stderr)
		}
	}
}

func TestEmbeddedModelMatchesCatalogue(t *testing.T) {
	m, err := loadModel("")
	if err != nil {
		t.Fatalf("embedded default model: %v (rebuild with %s)", err, models.DefaultCommand)
	}
	if m.Config.Schema != currentSchema() {
		t.Fatalf("embedded model schema %+v, catalogue %+v", m.Config.Schema, currentSchema())
	}
	if strings.Join(m.Features, ",") != strings.Join(features.Names(), ",") {
		t.Fatal("embedded model features differ from the catalogue")
	}
}

func TestClassifyJSONKeysAndScaleInvariance(t *testing.T) {
	dir := t.TempDir()
	x := writeSeries(t, dir, "h.csv", "henon", "--n", "3000", "--seed", "4")
	// The same series in other units: every value times 1e-6 plus an offset.
	b, _ := os.ReadFile(x)
	var scaled bytes.Buffer
	for i, line := range strings.Split(strings.TrimSpace(string(b)), "\n") {
		if i == 0 {
			scaled.WriteString("t,Id (A)\n")
			continue
		}
		tcol, v, _ := strings.Cut(line, ",")
		var f float64
		json.Unmarshal([]byte(v), &f)
		scaled.WriteString(tcol + "," + full(f*1e-6+3e-6) + "\n")
	}
	y := filepath.Join(dir, "h_amps.csv")
	os.WriteFile(y, scaled.Bytes(), 0o644)
	out, stderr, code := runCLI(t, "", "classify", "--format", "json", x, y)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if len(lines) != 2 {
		t.Fatalf("%d lines", len(lines))
	}
	var got [2]map[string]interface{}
	for i, l := range lines {
		if err := json.Unmarshal([]byte(l), &got[i]); err != nil {
			t.Fatal(err)
		}
		for _, k := range []string{"file", "class", "probabilities", "warnings", "novelty"} {
			if _, ok := got[i][k]; !ok {
				t.Errorf("classify JSON lacks %q", k)
			}
		}
		// The novelty measure names what decides "unlike the training set".
		nv := got[i]["novelty"].(map[string]interface{})
		for _, k := range []string{"distance", "percentile", "limit", "k", "nearest"} {
			if _, ok := nv[k]; !ok {
				t.Errorf("novelty lacks %q: %v", k, nv)
			}
		}
		sum := 0.0
		for _, p := range got[i]["probabilities"].(map[string]interface{}) {
			sum += p.(float64)
		}
		if math.Abs(sum-1) > 1e-9 {
			t.Errorf("probabilities sum to %v", sum)
		}
	}
	if got[0]["class"] != got[1]["class"] || !equalJSON(got[0]["probabilities"], got[1]["probabilities"]) || !equalJSON(got[0]["novelty"], got[1]["novelty"]) {
		t.Errorf("units changed the verdict: %v vs %v", got[0], got[1])
	}
}

func equalJSON(a, b interface{}) bool {
	x, _ := json.Marshal(a)
	y, _ := json.Marshal(b)
	return bytes.Equal(x, y)
}

func TestClassifyRejectsDamagedModel(t *testing.T) {
	dir := t.TempDir()
	x := writeSeries(t, dir, "w.csv", "white", "--n", "600")
	bad := filepath.Join(dir, "bad.model")
	os.WriteFile(bad, []byte("TSFOREST\x01\x00garbage"), 0o644)
	_, stderr, code := runCLI(t, "", "classify", "--model", bad, x)
	if code == exitOK || !strings.Contains(stderr, "bad.model") {
		t.Fatalf("exit %d, stderr %q", code, stderr)
	}
}

func TestTrainFromLabelsIsReproducible(t *testing.T) {
	dir := t.TempDir()
	var rows []string
	for i, sys := range []string{"henon", "logistic", "white", "ar1", "sine", "sawtooth"} {
		for s := 0; s < 3; s++ {
			name := sys + string(rune('a'+s)) + ".csv"
			writeSeries(t, dir, name, sys, "--n", "800", "--seed", string(rune('1'+s+i)))
			cl, _ := classOf(sys)
			rows = append(rows, name+","+cl)
		}
	}
	labels := filepath.Join(dir, "labels.csv")
	os.WriteFile(labels, []byte("file,class\n"+strings.Join(rows, "\n")+"\n"), 0o644)
	m1, m2 := filepath.Join(dir, "a.model"), filepath.Join(dir, "b.model")
	for _, m := range []string{m1, m2} {
		if out, stderr, code := runCLI(t, "", "train", "--labels", labels, "--folds", "3", "--trees", "15", "-o", m); code != exitOK {
			t.Fatalf("exit %d: %s %s", code, stderr, out)
		}
	}
	a, _ := os.ReadFile(m1)
	b, _ := os.ReadFile(m2)
	if len(a) == 0 || !bytes.Equal(a, b) {
		t.Fatal("the same labels and seed gave different model files")
	}
	m, err := classifier.Load(m1)
	if err != nil || m.Validation == nil || m.Validation.Overall.Rows != 18 || m.Training.Rows != 18 {
		t.Fatalf("model %v, err %v", m, err)
	}
}

func classOf(system string) (string, error) {
	switch system {
	case "henon", "logistic":
		return "chaotic", nil
	case "sine", "sawtooth":
		return "regular", nil
	}
	return "stochastic", nil
}

func TestTrainLabelErrors(t *testing.T) {
	dir := t.TempDir()
	writeSeries(t, dir, "a.csv", "white", "--n", "600")
	cases := []struct{ labels, want string }{
		{"file,class\na.csv,turbulent\n", `line 2: labels: unknown class "turbulent"`},
		{"file,class\nmissing.csv,chaotic\n", "line 2: missing.csv: no such file"},
	}
	for _, c := range cases {
		p := filepath.Join(dir, "labels.csv")
		os.WriteFile(p, []byte(c.labels), 0o644)
		_, stderr, code := runCLI(t, "", "train", "--labels", p, "-o", filepath.Join(dir, "m.model"))
		if code == exitOK || !strings.Contains(stderr, c.want) {
			t.Errorf("%q: exit %d, stderr %q, want %q", c.labels, code, stderr, c.want)
		}
		if _, err := os.Stat(filepath.Join(dir, "m.model")); err == nil {
			t.Errorf("%q: a model was written despite the error", c.labels)
		}
	}
	for _, args := range [][]string{
		{"train", "-o", "x.model"},
		{"train", "--reference"},
		{"train", "--reference", "--labels", "l.csv", "-o", "x"},
		{"train", "--with-reference", "-o", "x"},
	} {
		if _, _, code := runCLI(t, "", args...); code != exitUsage {
			t.Errorf("%v: exit %d, want usage error", args, code)
		}
	}
}

func TestGraphCommand(t *testing.T) {
	dir := t.TempDir()
	w := writeSeries(t, dir, "w.csv", "white", "--n", "3000", "--seed", "8")
	edges := filepath.Join(dir, "e.csv")
	gml := filepath.Join(dir, "g.graphml")
	out, stderr, code := runCLI(t, "", "graph", w, "--kind", "hvg", "--format", "json", "--edges", edges, "--graphml", gml)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var r struct {
		Metrics struct {
			Edges      int64    `json:"edges"`
			MeanDegree float64  `json:"mean_degree"`
			Lambda     *float64 `json:"lambda"`
		} `json:"metrics"`
	}
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatal(err)
	}
	// HVG of an i.i.d. series: mean degree → 4 (Luque et al., Phys. Rev. E
	// 80 (2009) 046103); at n = 3000 the finite-size mean is 4 − O(ln n/n).
	if math.Abs(r.Metrics.MeanDegree-4) > 0.02 || r.Metrics.Lambda == nil {
		t.Errorf("HVG of white noise: mean degree %v, lambda %v", r.Metrics.MeanDegree, r.Metrics.Lambda)
	}
	b, _ := os.ReadFile(edges)
	lines := strings.Split(strings.TrimSpace(string(b)), "\n")
	if lines[0] != "source,target" || int64(len(lines)-1) != r.Metrics.Edges {
		t.Errorf("edge list: header %q, %d rows, metrics say %d edges", lines[0], len(lines)-1, r.Metrics.Edges)
	}
	if g, _ := os.ReadFile(gml); !strings.Contains(string(g), "<graphml") {
		t.Error("GraphML file lacks the graphml element")
	}
	out, _, code = runCLI(t, "", "graph", w)
	if code != exitOK || !strings.Contains(out, "NVG of 3000 samples") || !strings.Contains(out, "modularity") {
		t.Errorf("table: %q", out)
	}
	if _, _, code := runCLI(t, "", "graph", w, "--kind", "tree"); code != exitUsage {
		t.Errorf("--kind tree: exit %d", code)
	}
}

func TestCompareSameAndDifferentProcesses(t *testing.T) {
	dir := t.TempDir()
	mk := func(group, system string, seed0 int) {
		os.MkdirAll(filepath.Join(dir, group), 0o755)
		for i := 0; i < 7; i++ {
			writeSeries(t, dir, filepath.Join(group, system+"_Vg"+[]string{"0.6", "0.9"}[i%2]+"_"+string(rune('a'+i))+".csv"),
				system, "--n", "700", "--seed", fmt.Sprint(seed0+i))
		}
	}
	mk("a", "white", 100)
	mk("b", "white", 200)
	mk("c", "ar1", 300)
	g := func(name string) string { return name + "=" + filepath.Join(dir, name) }

	// Same process: after Holm adjustment across the 17 core features no
	// difference should survive (family-wise error ≤ α by construction).
	out, stderr, code := runCLI(t, "", "compare", "--group", g("a"), "--group", g("b"), "-o", filepath.Join(dir, "same"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "no feature differs") {
		t.Errorf("same process: %s", out)
	}
	// White noise versus AR(1) φ = 0.9: DFA α 0.5 vs ≈1 at these scales
	// (Peng et al. 1994) and many other features differ.
	out, _, _ = runCLI(t, "", "compare", "--group", g("a"), "--group", g("c"), "--param", `Vg([0-9.]+)`, "-o", filepath.Join(dir, "diff"))
	if !strings.Contains(out, "sc_fluct_a1") {
		t.Errorf("white vs AR(1): sc_fluct_a1 not found to differ: %s", out)
	}
	for _, f := range []string{"summary.md", "comparison.csv", "comparison.json", "effects.png", "curves.png", "curves.csv", "hvg_local_clustering.png", "nvg_degree.png"} {
		if st, err := os.Stat(filepath.Join(dir, "diff", f)); err != nil || st.Size() == 0 {
			t.Errorf("%s missing or empty: %v", f, err)
		}
	}
	if _, _, code := runCLI(t, "", "compare", "--group", g("a")); code != exitUsage {
		t.Errorf("one group: exit %d, want usage error", code)
	}
}

func TestParseParam(t *testing.T) {
	re := regexp.MustCompile(`Vg([0-9.,]+)`)
	cases := map[string]float64{"D03_stressed_Vg0.90.csv": 0.9, "Vg1,2_x.csv": 1.2, "Vg1.csv": 1}
	for name, want := range cases {
		if got := parseParam(re, name); got != want {
			t.Errorf("%s: %v, want %v", name, got, want)
		}
	}
	if !math.IsNaN(parseParam(re, "nothing.csv")) {
		t.Error("no match should give NaN")
	}
}
