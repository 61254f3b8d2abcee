package demo

import (
	"math"
	"path/filepath"
	"testing"

	"github.com/tracesift/tracesift/trace"
)

// TestNativeFiles reads the committed NumPy and TDMS demo files and the
// CSV traces they copy: the same samples bit for bit (both hold the
// current at Digits significant digits), and from the TDMS file the
// sampling interval (wf_increment) and unit (unit_string) the CSV's time
// column and header give.
func TestNativeFiles(t *testing.T) {
	names, traces := NativeFiles()
	if len(names) != 2 {
		t.Fatalf("%d native files", len(names))
	}
	for i, name := range names {
		t.Run(name, func(t *testing.T) {
			bin, err := trace.ReadFile(filepath.Join(committed, name), trace.Options{})
			if err != nil {
				t.Fatal(err)
			}
			csv, err := trace.ReadFile(filepath.Join(committed, filepath.FromSlash(traces[i])), trace.Options{})
			if err != nil {
				t.Fatal(err)
			}
			if len(bin.Values) != len(csv.Values) || len(bin.Values) != 4096 {
				t.Fatalf("%d samples, the CSV has %d", len(bin.Values), len(csv.Values))
			}
			for k := range csv.Values {
				if math.Float64bits(bin.Values[k]) != math.Float64bits(csv.Values[k]) {
					t.Fatalf("sample %d: %v, the CSV has %v", k+1, bin.Values[k], csv.Values[k])
				}
			}
			if len(bin.Warnings) != 0 {
				t.Errorf("warnings %q", bin.Warnings)
			}
			if bin.Format == trace.FormatTDMS {
				// wf_increment is Interval exactly; the CSV's interval is
				// derived from printed stamps, equal to it within rounding.
				if bin.Interval != Interval || bin.Unit != "A" || bin.TimeUnit != "s" || math.Abs(csv.Interval-Interval) > 1e-15 {
					t.Errorf("interval %v %s, unit %q (CSV: %v)", bin.Interval, bin.TimeUnit, bin.Unit, csv.Interval)
				}
			}
		})
	}
}
