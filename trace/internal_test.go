package trace

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

func TestMedianMatchesSort(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for n := 1; n <= 200; n++ {
		x := make([]float64, n)
		for i := range x {
			x[i] = float64(rng.IntN(20)) // many ties stress the partition
		}
		s := slices.Clone(x)
		slices.Sort(s)
		// Reference: the median of the sorted copy (definition).
		want := s[n/2]
		if n%2 == 0 {
			want = (s[n/2-1] + s[n/2]) / 2
		}
		if got := median(x); got != want {
			t.Fatalf("n=%d: median %v, want %v", n, got, want)
		}
	}
}

func TestIntervalRule(t *testing.T) {
	even := func(n int, step float64) []float64 {
		x := make([]float64, n)
		for i := range x {
			x[i] = float64(i) * step
		}
		return x
	}
	cases := []struct {
		name   string
		t      []float64
		res    []int16
		delta  float64
		uneven bool
	}{
		// Exact stamps: the interval is the span over n−1 (definition).
		{"even", even(11, 0.5), nil, 0.5, false},
		// A jitter of 2e-3·Δ exceeds UnevenTolerance = 1e-3 with exact stamps.
		{"jitter", []float64{0, 1, 2.002, 3, 4}, nil, 1, true},
		// The same jitter is within the rounding of stamps printed to 1e-2.
		{"jitter within printed rounding", []float64{0, 1, 2.002, 3, 4}, []int16{-2, -2, -2, -2, -2}, 1, false},
		// A missing sample (a step of 2Δ) is uneven even with coarse
		// stamps, because the rounding allowance is capped at Δ/2.
		{"gap with integer stamps", []float64{0, 1, 2, 4, 5}, []int16{0, 0, 0, 0, 0}, 1, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			d, u, _, _ := interval(c.t, c.res)
			if u != c.uneven || math.Abs(d-c.delta) > 1e-12 {
				t.Errorf("interval = %v, uneven %v; want %v, %v", d, u, c.delta, c.uneven)
			}
		})
	}
}

func TestDecimalResolution(t *testing.T) {
	for _, c := range []struct {
		in   string
		want int16
	}{
		{"0.001", -3}, {"12", 0}, {"1e-3", -3}, {"-5.000000e-04", -10}, {"1,25E-6", -8},
		{"1.5E+02", 1}, {"0x1p-2", math.MinInt16}, {"1e", math.MinInt16},
	} {
		if got := decimalResolution([]byte(c.in)); got != c.want {
			t.Errorf("decimalResolution(%q) = %d, want %d", c.in, got, c.want)
		}
	}
}

func TestSplitUnitAndNames(t *testing.T) {
	for _, c := range []struct{ in, name, unit string }{
		{"Id (A)", "Id", "A"}, {"Id [A]", "Id", "A"}, {"Id/A", "Id", "A"}, {"Id_A", "Id_A", ""},
		{"Time (s)", "Time", "s"}, {"I (µA)", "I", "µA"}, {"(A)", "(A)", ""}, {"a/b c", "a/b c", ""},
		{"Vout/V", "Vout", "V"}, {"x", "x", ""},
	} {
		if n, u := splitUnit(c.in); n != c.name || u != c.unit {
			t.Errorf("splitUnit(%q) = %q, %q; want %q, %q", c.in, n, u, c.name, c.unit)
		}
	}
	for _, s := range []string{"t", "Time", "time_s", "TIMESTAMP", "Elapsed time", "Zeit", "ms"} {
		if !isTimeName(s) {
			t.Errorf("isTimeName(%q) = false", s)
		}
	}
	for _, s := range []string{"Id", "x", "Vg", "status", "Tension"} {
		if isTimeName(s) {
			t.Errorf("isTimeName(%q) = true", s)
		}
	}
	for _, s := range []string{"Sample", "index", "#", "No.", "n"} {
		if !isIndexName(s) {
			t.Errorf("isIndexName(%q) = false", s)
		}
	}
}

// TestReadMore covers layouts beyond the main table: header shapes,
// spreadsheet blank rows, time axes that are not usable, file handles.
func TestReadMore(t *testing.T) {
	const n = 20
	v := vals(n)
	o := Options{MinLength: n}
	cases := []struct {
		name string
		in   string
		opts Options
		want want
	}{
		{"aligned header with spaces", "Time (s)    Id (A)\n" + rows(n, func(i int) string { return fmt.Sprintf("%d    %g", i, val(i)) }), o,
			want{values: v, interval: 1, column: "Id", unit: "A", timeUnit: "s", colIndex: 2}},
		{"single column header with spaces", "Drain current (A)\n" + rows(n, func(i int) string { return fmt.Sprint(val(i)) }), o,
			want{values: v, column: "Drain current", unit: "A", colIndex: 1}},
		{"spreadsheet blank rows", "Title,,\n,,\nt,Id,Ig\n" + rows(n, func(i int) string {
			if i == 5 {
				return ",,\n" + fmt.Sprintf("%d,%g,0", i, val(i))
			}
			return fmt.Sprintf("%d,%g,0", i, val(i))
		}), o, want{values: v, interval: 1, column: "Id", colIndex: 2, firstLine: 4}},
		{"time named but not increasing", "time,x\n" + rows(n, func(i int) string { return fmt.Sprintf("%d,%g", i%5, val(i)) }), o,
			want{values: v, colIndex: 2, column: "x", warnings: []string{`time column 1 ("time") is not strictly increasing (line 7)`}}},
		{"increasing first column with another name is an axis", "Vg,Id\n" + rows(n, func(i int) string { return fmt.Sprintf("%g,%g", 0.1*float64(i), val(i)) }), o,
			want{values: v, interval: 0.1, intervalTol: 1e-12, colIndex: 2, column: "Id", noWarnings: true}},
		{"time axis beyond float range", rows(n, func(i int) string {
			f := float64(i) / (n - 1) // stamps from -1.5e308 to 1.5e308: finite, span is not
			return fmt.Sprintf("%g,%g", -1.5e308*(1-f)+1.5e308*f, val(i))
		}), o,
			want{values: v, colIndex: 2, warnings: []string{"spans more than the float64 range"}}},
		{"duplicate column names", "t,x,x\n" + rows(n, func(i int) string { return fmt.Sprintf("%d,%g,0", i, val(i)) }), Options{MinLength: n, Column: "x"},
			want{values: v, interval: 1, colIndex: 2, warnings: []string{`several columns are named "x"; using column 2`}}},
		{"UTF-16BE", string(utf16BE("t;x\n" + rows(n, func(i int) string { return fmt.Sprintf("%d;%g", i, val(i)) }))), o,
			want{values: v, interval: 1, column: "x", colIndex: 2}},
		{"NA right after the header is data", "x\nNA\n" + rows(n-1, func(i int) string { return fmt.Sprint(val(i + 1)) }), Options{MinLength: n, NaN: NaNInterpolate},
			want{values: append([]float64{val(1)}, v[1:]...), colIndex: 1, column: "x", firstLine: 2, nonFinite: 1}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			tr, err := Read(strings.NewReader(c.in), c.opts)
			if err != nil {
				t.Fatal(err)
			}
			check(t, tr, c.want)
		})
	}

	t.Run("os.File reader", func(t *testing.T) {
		p := filepath.Join(t.TempDir(), "x.csv")
		os.WriteFile(p, []byte(rows(300, tv)), 0o644)
		f, err := os.Open(p)
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		tr, err := Read(f, Options{})
		if err != nil || len(tr.Values) != 300 || tr.Source != "input" {
			t.Errorf("%v, %d values, source %q", err, len(tr.Values), tr.Source)
		}
	})
	t.Run("directory", func(t *testing.T) {
		dir := t.TempDir()
		_, err := ReadFile(dir, Options{})
		if err == nil || !strings.HasPrefix(err.Error(), dir+": is a directory") {
			t.Errorf("got %v", err)
		}
	})
}

func utf16BE(s string) []byte {
	le := utf16LE(s)
	b := []byte{0xfe, 0xff}
	for i := 2; i+1 < len(le); i += 2 {
		b = append(b, le[i+1], le[i])
	}
	return b
}
