package main

import (
	"encoding/binary"
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/internal/columnar/arrowcheck"
)

// formatsDir holds the reference files of the binary readers
// (testdata/formats/make_golden.py: NumPy 1.24.2, Python 3.11.2's wave
// module, SciPy 1.10.1).
var formatsDir = filepath.Join("..", "..", "testdata", "formats")

// interleavedTDMS renders one TDMS segment (NI, "TDMS File Format
// Internal Structure") holding two DBL channels, g/noise and g/x,
// interleaved (kTocInterleavedData), x being the samples of interest.
func interleavedTDMS(x []float64) []byte {
	le := binary.LittleEndian
	str := func(b []byte, s string) []byte { return append(le.AppendUint32(b, uint32(len(s))), s...) }
	meta := le.AppendUint32(nil, 2)
	for _, path := range []string{"/'g'/'noise'", "/'g'/'x'"} {
		meta = str(meta, path)
		meta = le.AppendUint32(meta, 20)
		meta = le.AppendUint32(meta, 10) // tdsTypeDoubleFloat
		meta = le.AppendUint32(meta, 1)
		meta = le.AppendUint64(meta, uint64(len(x)))
		meta = le.AppendUint32(meta, 0)
	}
	var raw []byte
	for i, v := range x {
		raw = le.AppendUint64(raw, math.Float64bits(float64(i%7)))
		raw = le.AppendUint64(raw, math.Float64bits(v))
	}
	b := le.AppendUint32([]byte("TDSm"), 1<<1|1<<2|1<<3|1<<5)
	b = le.AppendUint32(b, 4713)
	b = le.AppendUint64(b, uint64(len(meta)+len(raw)))
	b = le.AppendUint64(b, uint64(len(meta)))
	return append(append(b, meta...), raw...)
}

// featureRow runs `features --all --format csv` on one input and returns
// the header and the values of its row after the file column.
func featureRow(t *testing.T, in string, extra ...string) ([]string, []string) {
	t.Helper()
	out, errOut, code := runCLI(t, "", append([]string{"features", "--all", "--format", "csv", in}, extra...)...)
	if code != exitOK {
		t.Fatalf("features %s: exit %d: %s", in, code, errOut)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(rows) != 2 {
		t.Fatalf("features %s: %d rows, %v", in, len(rows), err)
	}
	return rows[0][1:], rows[1][1:]
}

// TestFormatsSameFeatures: the same samples saved as CSV, NPY, NPZ, TDMS
// and WAV give the same feature vector, every value printed at full
// precision (so bit for bit). The float series is the logistic-map orbit
// of testdata/formats (f8.npy, member current of run.npz, and a TDMS
// channel written here); the integer series is the one of i2.npy and
// pcm16.wav. Each reference is the series as text, one value per line.
func TestFormatsSameFeatures(t *testing.T) {
	dir := t.TempDir()
	x := readExpect(t, filepath.Join(formatsDir, "f8.npy.expect.csv"))
	tdms := filepath.Join(dir, "x.tdms")
	if err := os.WriteFile(tdms, interleavedTDMS(x), 0o644); err != nil {
		t.Fatal(err)
	}
	type input struct {
		path string
		args []string
	}
	for _, group := range []struct {
		reference string
		same      []input
	}{
		{"f8.npy.expect.csv", []input{
			{filepath.Join(formatsDir, "f8.npy"), nil},
			{filepath.Join(formatsDir, "run.npz"), []string{"--column", "current"}},
			{tdms, []string{"--column", "g/x"}},
			{tdms, []string{"--input-format", "tdms", "--column", "2"}},
		}},
		{"i2.npy.expect.csv", []input{
			{filepath.Join(formatsDir, "pcm16.wav"), nil},
			{filepath.Join(formatsDir, "i2.npy"), []string{"--input-format", "npy"}},
		}},
	} {
		head, want := featureRow(t, filepath.Join(formatsDir, group.reference))
		if measured := len(slices.DeleteFunc(slices.Clone(want), func(s string) bool { return s == "" })); measured < 30 {
			t.Fatalf("%s: only %d features measured: %q", group.reference, measured, want)
		}
		for _, in := range group.same {
			gotHead, got := featureRow(t, in.path, in.args...)
			if !slices.Equal(gotHead, head) {
				t.Fatalf("%s: header differs", in.path)
			}
			for i := range want {
				if got[i] != want[i] {
					t.Errorf("%s %v: %s = %s, the CSV gives %s", filepath.Base(in.path), in.args, head[i], got[i], want[i])
				}
			}
		}
	}
}

func readExpect(t *testing.T, path string) []float64 {
	t.Helper()
	tr, err := readTrace(&env{}, path, &inputOptions{format: "auto", nan: "reject", minLength: 1, floor: 1})
	if err != nil {
		t.Fatal(err)
	}
	return tr.Values
}

// TestParquetTables: every table the tool writes as CSV also comes out as
// Parquet with --format parquet, and Apache Arrow's Parquet reader
// (arrow-go v18.9.0, an independent implementation) reads back exactly
// the CSV's columns and values (internal/columnar/arrowcheck): the
// features table, the survey's traces, tests and distributions, and
// compare's comparison and curves.
func TestParquetTables(t *testing.T) {
	dir := t.TempDir()
	check := func(csvPath, parquetPath string) {
		t.Helper()
		c, err := os.ReadFile(csvPath)
		if err != nil {
			t.Fatal(err)
		}
		p, err := os.ReadFile(parquetPath)
		if err != nil {
			t.Fatal(err)
		}
		n, err := arrowcheck.Compare(c, p)
		if err != nil {
			t.Fatalf("%s: %v", filepath.Base(parquetPath), err)
		}
		if n == 0 {
			t.Errorf("%s: no cells", filepath.Base(parquetPath))
		}
	}

	// features, one good and one bad input: the good row is written.
	good := filepath.Join(formatsDir, "f8.npy")
	bad := fixture(t, dir, "bad.npy", []byte("\x93NUMPY\x01\x00"))
	fcsv, fpq := filepath.Join(dir, "f.csv"), filepath.Join(dir, "f.parquet")
	runCLI(t, "", "features", "--all", "--format", "csv", "-o", fcsv, good, bad, filepath.Join(formatsDir, "pcm24.wav"))
	_, errOut, code := runCLI(t, "", "features", "--all", "--format", "parquet", "-o", fpq, good, bad, filepath.Join(formatsDir, "pcm24.wav"))
	if code != exitPartial || !strings.Contains(errOut, "bad.npy") {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	check(fcsv, fpq)
	if _, errOut, code := runCLI(t, "", "features", "--format", "parquet", good); code != exitUsage || !strings.Contains(errOut, "-o FILE") {
		t.Errorf("parquet to stdout: exit %d: %s", code, errOut)
	}

	// survey: three devices fresh and stressed at one bias.
	cdir, rows := demoCampaign(t)
	small := [][]string{rows[0]}
	for _, r := range rows[1:] {
		if r[1] <= "D03" && strings.HasPrefix(r[3], "1.2") {
			small = append(small, r)
		}
	}
	writeCSV(t, filepath.Join(cdir, "small.csv"), small)
	sdir := filepath.Join(dir, "survey")
	if _, errOut, code := runCLI(t, "", append([]string{"survey", filepath.Join(cdir, "small.csv"), "--format", "parquet", "--no-figures", "-o", sdir}, surveyFast...)...); code != exitOK {
		t.Fatalf("survey: exit %d: %s", code, errOut)
	}
	for _, name := range []string{"traces", "tests", "distributions"} {
		check(filepath.Join(sdir, name+".csv"), filepath.Join(sdir, name+".parquet"))
	}

	// compare: two groups of three short traces with a parameter.
	for g, system := range map[string]string{"a": "white", "b": "henon"} {
		os.Mkdir(filepath.Join(dir, g), 0o755)
		for _, p := range []string{"1", "2", "3"} {
			writeSeries(t, filepath.Join(dir, g), "t_p"+p+".csv", system, "--n", "400", "--seed", p)
		}
	}
	cmp := filepath.Join(dir, "cmp")
	if _, errOut, code := runCLI(t, "", "compare", "--group", "A="+filepath.Join(dir, "a"), "--group", "B="+filepath.Join(dir, "b"),
		"--param", "p([0-9]+)", "--format", "parquet", "-o", cmp); code != exitOK {
		t.Fatalf("compare: exit %d: %s", code, errOut)
	}
	for _, name := range []string{"comparison", "curves"} {
		check(filepath.Join(cmp, name+".csv"), filepath.Join(cmp, name+".parquet"))
	}
}
