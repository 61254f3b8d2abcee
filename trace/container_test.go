package trace

import (
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestReferenceWriters reads the files written by general-purpose
// reference writers in testdata/formats (NumPy 1.24.2 numpy.save,
// numpy.savez and numpy.savez_compressed; Python 3.11.2's wave module
// for PCM WAV; SciPy 1.10.1 scipy.io.wavfile.write for float WAV; see
// make_golden.py and VERSIONS there) and checks every sample bit for bit
// against the values the writer was given, printed with Python's repr
// (shortest round-trip text), and the sampling interval against 1/rate
// as Python computes it.
func TestReferenceWriters(t *testing.T) {
	dir := filepath.Join("..", "testdata", "formats")
	f, err := os.Open(filepath.Join(dir, "manifest.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) < 19 {
		t.Fatalf("manifest has %d rows", len(rows))
	}
	for _, row := range rows[1:] {
		name, column := row[0], row[1]
		interval, _ := strconv.ParseFloat(row[2], 64)
		t.Run(name, func(t *testing.T) {
			tr, err := ReadFile(filepath.Join(dir, name), Options{Column: column})
			if err != nil {
				t.Fatal(err)
			}
			want := expectCSV(t, filepath.Join(dir, name+".expect.csv"))
			if len(tr.Values) != len(want) {
				t.Fatalf("%d samples, want %d", len(tr.Values), len(want))
			}
			for i := range want {
				if math.Float64bits(tr.Values[i]) != math.Float64bits(want[i]) {
					t.Fatalf("sample %d = %v, want %v", i+1, tr.Values[i], want[i])
				}
			}
			if tr.Interval != interval {
				t.Errorf("interval %v, want %v", tr.Interval, interval)
			}
			wantFormat := Format(strings.TrimPrefix(filepath.Ext(name), "."))
			if tr.Format != wantFormat {
				t.Errorf("format %q, want %q", tr.Format, wantFormat)
			}
			if column == "" && len(tr.Warnings) > 0 && !strings.HasSuffix(name, ".npz") {
				t.Errorf("warnings %q", tr.Warnings)
			}
		})
	}
}

// expectCSV reads one value per line.
func expectCSV(t *testing.T, path string) []float64 {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var out []float64
	for _, line := range strings.Fields(string(b)) {
		v, err := strconv.ParseFloat(line, 64)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, v)
	}
	return out
}
