package main

import (
	"bytes"
	"compress/gzip"
	"encoding/binary"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/classifier"
	"github.com/tracesift/tracesift/features"
	"github.com/tracesift/tracesift/internal/journal"
	"github.com/tracesift/tracesift/models"
)

// The bad-input catalogue: every kind of bad (and awkward but valid) input
// through every command that reads traces, asserting the exit status, the
// one-line message and exactly which output files exist afterwards. Its
// parts: bad trace files (each command), bad model files (the commands
// taking --model), outputs in a missing directory, and batches mixing good
// and bad files.
func TestBadInputCatalogue(t *testing.T) {
	t.Run("inputs", testBadInputs)
	t.Run("models", testBadModels)
	t.Run("output in a missing directory", testOutputInMissingDirectory)
	t.Run("mixed batch", testMixedBatch)
	t.Run("batch sources, shards and journals", testBatchMisuse)
}

// catalogueInput is one input of the catalogue. make writes it under dir and
// returns its path; reason is a piece of the one-line message it must give
// ("" for an input that must be read without complaint).
type catalogueInput struct {
	name   string
	make   func(t *testing.T, dir string) string
	reason string
}

// fixture writes content to dir/name.
func fixture(t *testing.T, dir, name string, content []byte) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := os.WriteFile(p, content, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// column returns a header and n rows of an AR(1)-like deterministic
// sequence (a logistic-map orbit, so every command has something to
// measure), each row built by format(i, value).
func column(n int, header string, format func(i int, v float64) string) []byte {
	var b strings.Builder
	if header != "" {
		b.WriteString(header)
	}
	x := 0.3
	for i := 0; i < n; i++ {
		x = 3.9 * x * (1 - x)
		b.WriteString(format(i, x))
	}
	return []byte(b.String())
}

func plainRow(i int, v float64) string { return fmt.Sprintf("%d,%.9f\n", i, v) }

func catalogueInputs() []catalogueInput {
	text := func(name string, content []byte) func(*testing.T, string) string {
		return func(t *testing.T, dir string) string { return fixture(t, dir, name, content) }
	}
	const n = 400
	return []catalogueInput{
		{"empty", text("empty.csv", nil), "empty.csv: no data"},
		{"header only", text("header.csv", []byte("t,value\n")), "header but no data rows"},
		{"non-numeric", text("nonnum.csv", column(n, "t,value\n", func(i int, v float64) string {
			if i == 2 {
				return "2,abc\n"
			}
			return plainRow(i, v)
		})), "nonnum.csv line 4"},
		{"NaN", text("nan.csv", column(n, "t,value\n", func(i int, v float64) string {
			if i == 5 {
				return "5,NaN\n"
			}
			return plainRow(i, v)
		})), "non-finite"},
		{"Inf", text("inf.csv", column(n, "t,value\n", func(i int, v float64) string {
			if i == 7 {
				return "7,+Inf\n"
			}
			return plainRow(i, v)
		})), "non-finite"},
		{"constant", text("constant.csv", column(n, "t,value\n", func(i int, _ float64) string { return fmt.Sprintf("%d,1.5\n", i) })), "constant"},
		{"short", text("short.csv", column(100, "t,value\n", plainRow)), "too short"},
		{"ragged", text("ragged.csv", column(n, "t,value\n", func(i int, v float64) string {
			if i == 9 {
				return "9\n"
			}
			return plainRow(i, v)
		})), "ragged row"},
		{"mixed delimiters", text("mixed.csv", column(n, "t,value\n", func(i int, v float64) string {
			if i >= 50 {
				return fmt.Sprintf("%d;%.9f\n", i, v)
			}
			return plainRow(i, v)
		})), "';'"},
		{"decimal comma", text("comma.csv", column(n, "t;value\n", func(i int, v float64) string {
			return strings.Replace(fmt.Sprintf("%d;%.9f\n", i, v), ".", ",", 1)
		})), ""},
		{"BOM", text("bom.csv", append([]byte("\ufeff"), column(n, "t,value\n", plainRow)...)), ""},
		{"CRLF", text("crlf.csv", column(n, "t,value\r\n", func(i int, v float64) string {
			return strings.Replace(plainRow(i, v), "\n", "\r\n", 1)
		})), ""},
		{"truncated gzip", func(t *testing.T, dir string) string {
			var b bytes.Buffer
			zw := gzip.NewWriter(&b)
			zw.Write(column(5000, "t,value\n", plainRow))
			zw.Close()
			return fixture(t, dir, "cut.csv.gz", b.Bytes()[:b.Len()/2])
		}, "cut off"},
		{"directory", func(t *testing.T, dir string) string {
			p := filepath.Join(dir, "adir.csv")
			os.Mkdir(p, 0o755)
			return p
		}, "is a directory"},
		{"missing path", func(_ *testing.T, dir string) string { return filepath.Join(dir, "absent.csv") }, "no such file"},
		{"huge line", text("huge.csv", append([]byte("t,value\n0,"), bytes.Repeat([]byte("1"), 17<<20)...)), "line too long"},
		{"binary", text("blob.csv", bytes.Repeat([]byte{0, 0, 0x40, 0x9f, 0, 1, 0xff, 0x7f}, 4096)), "looks binary"},
		// Binary containers (the reference files of testdata/formats, some
		// damaged; offsets as in trace.TestContainerErrors).
		{"npy", text("f8.npy", reference("f8.npy", nil)), ""},
		{"truncated npy", text("cut.npy", reference("f8.npy", func(b []byte) []byte { return b[:200] })),
			"cut.npy byte 200: truncated: the <f8 array of shape (300,) needs 2400 bytes of data, the file holds 72"},
		{"npy of wrong dtype", text("complex.npy", reference("f8.npy", func(b []byte) []byte {
			return bytes.Replace(b, []byte("'<f8'"), []byte("'<c8'"), 1) // 300 complex64 need the same 2400 bytes
		})), `complex.npy byte 10: unsupported content: dtype "<c8"`},
		{"npz cut off", text("cut.npz", reference("run.npz", func(b []byte) []byte { return b[:3000] })),
			"cut.npz: malformed file: NPZ (zip) archive"},
		{"bad TDMS lead-in", text("bad.tdms", reference("../demo/D03-stressed-1.20V.tdms", func(b []byte) []byte {
			seg2 := 28 + binary.LittleEndian.Uint64(b[12:]) // lead-in, 377 bytes of meta data, 1024 doubles: 8597
			copy(b[seg2:], "TDSx")
			return b
		})), `bad.tdms segment 2, byte 8597: malformed file: lead-in tag "TDSx", want "TDSm"`},
		{"WAV with bad header", text("bad.wav", reference("pcm16.wav", func(b []byte) []byte {
			b[32] = 3 // block alignment 3 for one 16-bit channel
			return b
		})), "bad.wav byte 32: malformed file: block alignment 3, want 1 channels × 2 bytes = 2"},
	}
}

// reference returns a file of testdata/formats, changed by damage when
// it is not nil.
func reference(name string, damage func([]byte) []byte) []byte {
	b, err := os.ReadFile(filepath.Join("..", "..", "testdata", "formats", name))
	if err != nil {
		panic(err)
	}
	if damage != nil {
		b = damage(b)
	}
	return b
}

// catalogueCommand runs one command on one input path; it returns the
// arguments and the output files the command writes when it succeeds.
type catalogueCommand struct {
	name string
	args func(dir, in string) (args, outputs []string)
	// extra is the number of stderr lines a failed single input adds to
	// its own error line (a count of failed inputs, a summary of what was
	// or was not written).
	extra int
	// special holds, per input, the message piece and extra lines where
	// the command treats that input differently (compare takes a
	// directory as a group; train checks that labelled files exist
	// before reading any).
	special map[string]special
}

type special struct {
	reason string
	extra  int
}

func catalogueCommands(goodDir, goodA, goodB string) []catalogueCommand {
	return []catalogueCommand{
		{"classify", func(dir, in string) ([]string, []string) {
			out := filepath.Join(dir, "verdicts.txt")
			return []string{"classify", "-o", out, in}, []string{out}
		}, 1, map[string]special{
			"directory": {"adir.csv holds no trace files", 0}, // walked: an empty directory
		}},
		{"features", func(dir, in string) ([]string, []string) {
			out := filepath.Join(dir, "features.csv")
			return []string{"features", "--format", "csv", "-o", out, in}, []string{out}
		}, 1, map[string]special{
			"directory": {"adir.csv holds no trace files", 0},
		}},
		{"graph", func(dir, in string) ([]string, []string) {
			out := filepath.Join(dir, "edges.csv")
			return []string{"graph", "--kind", "hvg", "--no-paths", "--edges", out, in}, []string{out}
		}, 0, nil},
		{"report", func(dir, in string) ([]string, []string) {
			out := filepath.Join(dir, "report.html")
			return []string{"report", "--surrogates", "-1", "-o", out, in}, []string{out}
		}, 0, nil},
		{"compare", func(dir, in string) ([]string, []string) {
			out := filepath.Join(dir, "cmp")
			return []string{"compare", "--group", "A=" + in, "--group", "B=" + goodDir, "-o", out},
				[]string{filepath.Join(out, "summary.md"), filepath.Join(out, "comparison.csv")}
		}, 2, map[string]special{
			"directory":    {"adir.csv holds no trace files", 0},
			"missing path": {"absent.csv: no such file", 0},
		}},
		{"train", func(dir, in string) ([]string, []string) {
			labels := filepath.Join(dir, "labels.csv")
			os.WriteFile(labels, []byte("file,class\n"+goodA+",chaotic\n"+in+",stochastic\n"+goodB+",stochastic\n"), 0o644)
			out := filepath.Join(dir, "lab.model")
			return []string{"train", "--labels", labels, "--folds", "0", "--trees", "10", "-o", out}, []string{out}
		}, 2, map[string]special{
			"missing path": {"labels.csv line 3: ", 0},
		}},
	}
}

// checkStderr asserts that stderr is want lines, each a "tracesift: "
// line, and that the first names reason.
func checkStderr(t *testing.T, what, stderr, reason string, want int) {
	t.Helper()
	lines := strings.Split(strings.TrimRight(stderr, "\n"), "\n")
	if stderr == "" {
		lines = nil
	}
	if len(lines) != want {
		t.Errorf("%s: %d stderr lines, want %d:\n%s", what, len(lines), want, stderr)
		return
	}
	for _, l := range lines {
		if !strings.HasPrefix(l, "tracesift: ") || len(l) > 400 {
			t.Errorf("%s: stderr line %q is not a short tracesift: line", what, l)
		}
	}
	if want > 0 && !strings.Contains(lines[0], reason) {
		t.Errorf("%s: message %q does not say %q", what, lines[0], reason)
	}
}

func checkOutputs(t *testing.T, what string, outputs []string, exist bool) {
	t.Helper()
	for _, p := range outputs {
		_, err := os.Stat(p)
		if exist && err != nil {
			t.Errorf("%s: output %s missing", what, filepath.Base(p))
		}
		if !exist && err == nil {
			t.Errorf("%s: output %s written although the input failed", what, filepath.Base(p))
		}
	}
}

func testBadInputs(t *testing.T) {
	if testing.Short() {
		t.Skip("the catalogue runs every command on every input (about 30 s)")
	}
	root := t.TempDir()
	goodDir := filepath.Join(root, "good")
	os.Mkdir(goodDir, 0o755)
	goodA := writeSeries(t, goodDir, "henon.csv", "henon", "--n", "600", "--seed", "3")
	goodB := writeSeries(t, goodDir, "white.csv", "white", "--n", "600", "--seed", "4")
	cmds := catalogueCommands(goodDir, goodA, goodB)
	for _, in := range catalogueInputs() {
		for _, c := range cmds {
			what := c.name + " on " + in.name
			dir := filepath.Join(root, strings.ReplaceAll(what, " ", "_"))
			os.Mkdir(dir, 0o755)
			p := in.make(t, dir)
			args, outputs := c.args(dir, p)
			_, stderr, code := runCLI(t, "", args...)
			if in.reason == "" {
				if code != exitOK {
					t.Errorf("%s: exit %d on a valid input: %s", what, code, stderr)
				}
				checkOutputs(t, what, outputs, true)
				continue
			}
			if code != exitPartial {
				t.Errorf("%s: exit %d, want %d", what, code, exitPartial)
			}
			reason, extra := in.reason, c.extra
			if sp, ok := c.special[in.name]; ok {
				reason, extra = sp.reason, sp.extra
			}
			checkStderr(t, what, stderr, reason, 1+extra)
			checkOutputs(t, what, outputs, false)
		}
	}
}

// A model file that is damaged, that names a feature this program does not
// compute, or that was trained on another feature schema is refused with one line naming the file, by every command
// that takes --model; nothing is written.
func testBadModels(t *testing.T) {
	dir := t.TempDir()
	good := writeSeries(t, dir, "w.csv", "white", "--n", "600")
	damaged := fixture(t, dir, "damaged.model", []byte("TSFOREST\x01\x00garbage"))
	m, err := classifier.Read(bytes.NewReader(models.Default()))
	if err != nil {
		t.Fatal(err)
	}
	m.Features[0] = "feature_from_the_future"
	foreign := filepath.Join(dir, "foreign.model")
	if err := m.Save(foreign); err != nil {
		t.Fatal(err)
	}
	m.Features[0] = features.Names()[0]
	m.Config.Schema.Version, m.Config.Schema.Hash = 1, "0123456789abcdef"
	oldSchema := filepath.Join(dir, "oldschema.model")
	if err := m.Save(oldSchema); err != nil {
		t.Fatal(err)
	}
	for _, mf := range []struct{ path, reason string }{
		{damaged, "damaged.model"},
		{foreign, `"feature_from_the_future"`},
		{oldSchema, "trained on feature schema v1"},
	} {
		for _, cmd := range []string{"classify", "report"} {
			out := filepath.Join(dir, cmd+".out")
			what := cmd + " with " + filepath.Base(mf.path)
			_, stderr, code := runCLI(t, "", cmd, "--model", mf.path, "-o", out, good)
			if code == exitOK {
				t.Errorf("%s: exit 0", what)
			}
			checkStderr(t, what, stderr, mf.reason, 1)
			if !strings.Contains(stderr, filepath.Base(mf.path)) {
				t.Errorf("%s: message %q does not name the model file", what, stderr)
			}
			checkOutputs(t, what, []string{out}, false)
		}
	}
}

// An output path in a missing directory is reported with the path the user
// gave (not a temporary file name) before any work is done.
func testOutputInMissingDirectory(t *testing.T) {
	dir := t.TempDir()
	good := writeSeries(t, dir, "w.csv", "white", "--n", "600")
	writeSeries(t, dir, "h.csv", "henon", "--n", "600")
	labels := fixture(t, dir, "labels.csv", []byte("file,class\nw.csv,stochastic\nh.csv,chaotic\n"))
	missing := filepath.Join(dir, "no", "such")
	for _, args := range [][]string{
		{"classify", "-o", filepath.Join(missing, "v.txt"), good},
		{"features", "-o", filepath.Join(missing, "f.csv"), good},
		{"graph", "--kind", "hvg", "--edges", filepath.Join(missing, "e.csv"), good},
		{"report", "--surrogates", "-1", "-o", filepath.Join(missing, "r.html"), good},
		{"generate", "henon", "-o", filepath.Join(missing, "h.csv")},
		{"train", "--labels", labels, "--folds", "0", "--trees", "5", "-o", filepath.Join(missing, "m.model")},
	} {
		_, stderr, code := runCLI(t, "", args...)
		if code == exitOK {
			t.Errorf("%v: exit 0", args)
		}
		checkStderr(t, args[0], stderr, "directory "+missing+" does not exist", 1)
		if strings.Contains(stderr, ".tmp") {
			t.Errorf("%v: message names a temporary file: %s", args, stderr)
		}
	}
}

// A batch with good and bad files writes the good results to -o, lists the
// failures and says what was written; exit status 1. An earlier file of the
// same name is replaced by this run's good results.
func testMixedBatch(t *testing.T) {
	dir := t.TempDir()
	a := writeSeries(t, dir, "a.csv", "white", "--n", "600", "--seed", "1")
	b := writeSeries(t, dir, "b.csv", "henon", "--n", "600", "--seed", "2")
	bad := fixture(t, dir, "nonnum.csv", []byte("t,value\n0,1\n1,abc\n"))
	for _, c := range []struct {
		cmd  []string
		good func(string) bool
	}{
		{[]string{"features", "--format", "csv"}, func(s string) bool {
			return strings.Count(s, "\n") == 3 && strings.Contains(s, a) && strings.Contains(s, b)
		}},
		{[]string{"classify", "--format", "json"}, func(s string) bool {
			return strings.Count(s, "\n") == 2 && strings.Contains(s, a) && strings.Contains(s, b)
		}},
		{[]string{"classify"}, func(s string) bool { return strings.Contains(s, a) && strings.Contains(s, b) }},
	} {
		out := filepath.Join(dir, "out.txt")
		os.WriteFile(out, []byte("previous run\n"), 0o644)
		args := append(append(append([]string{}, c.cmd...), "-o", out), a, bad, b)
		_, stderr, code := runCLI(t, "", args...)
		if code != exitPartial {
			t.Errorf("%v: exit %d, want %d", c.cmd, code, exitPartial)
		}
		got, _ := os.ReadFile(out)
		if !c.good(string(got)) || strings.Contains(string(got), "nonnum") || strings.Contains(string(got), "previous run") {
			t.Errorf("%v: output file holds %q", c.cmd, got)
		}
		// The journal holds the failure as one record: file, line, reason.
		ix, err := journal.Open(out + ".journal")
		if err != nil {
			t.Fatal(err)
		}
		if en, ok := ix.Lookup(bad); !ok || en.Failure == nil || en.Failure.Line != 3 || !strings.Contains(en.Failure.Reason, "nonnum.csv line 3, column 2") || ix.Len() != 3 {
			t.Errorf("%v: journal record of the bad file %+v (%d records)", c.cmd, en, ix.Len())
		}
		ix.Close()
		want := []string{"nonnum.csv line 3", "1 of 3 inputs failed", "wrote the results of 2 of 3 inputs to " + out}
		lines := strings.Split(strings.TrimSpace(stderr), "\n")
		if len(lines) != len(want) {
			t.Errorf("%v: stderr %q", c.cmd, stderr)
			continue
		}
		for i, w := range want {
			if !strings.Contains(lines[i], w) {
				t.Errorf("%v: stderr line %d %q, want it to say %q", c.cmd, i+1, lines[i], w)
			}
		}
	}
	// train refuses a labels file with a bad trace as a whole: no model.
	labels := fixture(t, dir, "labels.csv", []byte("file,class\na.csv,stochastic\nb.csv,chaotic\nnonnum.csv,stochastic\n"))
	model := filepath.Join(dir, "m.model")
	_, stderr, code := runCLI(t, "", "train", "--labels", labels, "--folds", "0", "--trees", "5", "-o", model)
	if _, err := os.Stat(model); code != exitPartial || err == nil || !strings.Contains(stderr, "labels.csv line 4: ") {
		t.Errorf("train on a mixed labels file: exit %d, model written %v, stderr %q", code, err == nil, stderr)
	}
	// When every input fails the file is not written and the line says an
	// existing one was kept.
	out := filepath.Join(dir, "kept.csv")
	os.WriteFile(out, []byte("previous run\n"), 0o644)
	_, stderr, code = runCLI(t, "", "features", "-o", out, bad)
	if got, _ := os.ReadFile(out); code != exitPartial || string(got) != "previous run\n" ||
		!strings.Contains(stderr, out+" not written: no input could be processed; the existing file was left unchanged") {
		t.Errorf("all failed: exit %d, file %q, stderr %q", code, got, stderr)
	}
}

// Misused batch sources, shards and journals: each is one line naming the
// problem, exit 2 for a usage error and 1 otherwise, and no output file.
func testBatchMisuse(t *testing.T) {
	dir := t.TempDir()
	good := writeSeries(t, dir, "w.csv", "white", "--n", "600")
	nofile := fixture(t, dir, "nofile.csv", []byte("path,group\nw.csv,a\n"))
	other := filepath.Join(dir, "v.txt")
	if _, stderr, code := runCLI(t, "", "classify", "-o", other, good); code != exitOK {
		t.Fatalf("classify: %s", stderr)
	}
	feat := filepath.Join(dir, "f.csv")
	if _, stderr, code := runCLI(t, "", "features", "-o", feat, good); code != exitOK {
		t.Fatalf("features: %s", stderr)
	}
	held := filepath.Join(dir, "held.csv")
	w, err := journal.Create(held + ".journal")
	if err != nil {
		t.Fatal(err)
	}
	defer w.Close()
	out := filepath.Join(dir, "out.csv")
	for _, c := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"features", "--include", "[", dir}, exitUsage, "--include: bad pattern \"[\""},
		{[]string{"features", "--files-from", filepath.Join(dir, "nolist.txt")}, exitPartial, "--files-from: open " + filepath.Join(dir, "nolist.txt")},
		{[]string{"features", "--campaign", nofile}, exitUsage, "no file column (columns path, group)"},
		{[]string{"features", "--files-from", "-", "-"}, exitUsage, "stdin cannot be both"},
		{[]string{"features", "--resume", good}, exitUsage, "--resume needs a journal"},
		{[]string{"features", "--no-journal", "--resume", "-o", out, good}, exitUsage, "--no-journal contradicts"},
		{[]string{"features", "--shard", "2/2", good}, exitUsage, "--shard \"2/2\""},
		{[]string{"features", "-o", held, good}, exitPartial, "in use by another run"},
		{[]string{"features", "--resume", "-o", out, "--journal", other + ".journal", good}, exitUsage, "holds a classify run, not features"},
		{[]string{"collate", "-o", out, feat + ".journal", other + ".journal"}, exitPartial, "holds a classify run"},
		{[]string{"collate", "-o", out, good}, exitPartial, "not a tracesift journal"},
		{[]string{"collate", "-o", out, feat, feat + ".journal"}, exitUsage, "given twice"},
		{[]string{"survey", "--shard", "0/2", "-o", filepath.Join(dir, "s"), filepath.Join("..", "..", "testdata", "demo", "campaign.csv")}, exitUsage, "add --tables-only"},
	} {
		what := strings.Join(c.args, " ")
		_, stderr, code := runCLI(t, "", c.args...)
		if code != c.code {
			t.Errorf("%s: exit %d, want %d", what, code, c.code)
		}
		checkStderr(t, what, stderr, c.want, 1)
		checkOutputs(t, what, []string{out, held}, false)
	}
}
