package trace

import (
	"bytes"
	"compress/gzip"
	"encoding/binary"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"unicode/utf16"
)

// val is the i-th test value: (37·i mod 101)/8, a non-constant sequence
// whose decimal text is exact in binary, so parsed values compare with ==.
func val(i int) float64 { return float64((37*i)%101) / 8 }

// vals returns val(0..n-1).
func vals(n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = val(i)
	}
	return v
}

// rows renders n lines with f(i), each ended by "\n".
func rows(n int, f func(i int) string) string {
	var b strings.Builder
	for i := range n {
		b.WriteString(f(i))
		b.WriteByte('\n')
	}
	return b.String()
}

func gz(t testing.TB, s string) []byte {
	t.Helper()
	var b bytes.Buffer
	w := gzip.NewWriter(&b)
	if _, err := w.Write([]byte(s)); err != nil {
		t.Fatal(err)
	}
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

func rawF32(x []float64) []byte {
	b := make([]byte, 4*len(x))
	for i, v := range x {
		binary.LittleEndian.PutUint32(b[4*i:], math.Float32bits(float32(v)))
	}
	return b
}

func rawF64(x []float64) []byte {
	b := make([]byte, 8*len(x))
	for i, v := range x {
		binary.LittleEndian.PutUint64(b[8*i:], math.Float64bits(v))
	}
	return b
}

func utf16LE(s string) []byte {
	u := utf16.Encode([]rune(s))
	b := []byte{0xff, 0xfe}
	for _, c := range u {
		b = append(b, byte(c), byte(c>>8))
	}
	return b
}

// want describes the expected Trace of a successful read. Zero fields
// are not checked except Values, Interval and ColumnIndex, which always
// are.
type want struct {
	values      []float64
	interval    float64 // exact expected interval (0 = none)
	intervalTol float64 // relative tolerance for printed stamps
	uneven      bool
	timeCol     int
	column      string
	unit        string
	timeUnit    string
	colIndex    int
	columns     int
	firstLine   int
	nonFinite   int
	warnings    []string // substrings that must each occur in some warning
	noWarnings  bool
}

func TestReadFormats(t *testing.T) {
	const n = 20
	opts := Options{MinLength: n, Name: "t.csv"}
	v := vals(n)
	tt := func(i int) float64 { return 0.5 + 0.25*float64(i) } // exact time stamps
	cases := []struct {
		name string
		in   []byte
		opts Options
		want want
	}{
		{"single column", []byte(rows(n, func(i int) string { return fmt.Sprint(val(i)) })), opts,
			want{values: v, colIndex: 1, columns: 1, firstLine: 1, noWarnings: true}},
		{"comma header time", []byte("time,Id (A)\n" + rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, timeCol: 1, column: "Id", unit: "A", colIndex: 2, columns: 2, firstLine: 2, noWarnings: true}},
		{"comma no header monotone first column is time", []byte(rows(n, func(i int) string { return fmt.Sprintf("%g, %g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, timeCol: 1, colIndex: 2, columns: 2, noWarnings: true}},
		{"comma no header two signals", []byte(rows(n, func(i int) string { return fmt.Sprintf("%g,%g", val(i), tt(i)) })), opts,
			want{values: v, colIndex: 1, columns: 2, warnings: []string{"using column 1 of 2 value columns"}}},
		{"semicolon", []byte("t;x\n" + rows(n, func(i int) string { return fmt.Sprintf("%g;%g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "x", colIndex: 2}},
		{"semicolon decimal comma", []byte("Zeit [s];Id [A]\n" + rows(n, func(i int) string {
			return strings.ReplaceAll(fmt.Sprintf("%g;%g", tt(i), val(i)), ".", ",")
		})), opts, want{values: v, interval: 0.25, column: "Id", unit: "A", timeUnit: "s", colIndex: 2}},
		{"semicolon decimal comma exponent", []byte(rows(n, func(i int) string {
			return strings.ReplaceAll(fmt.Sprintf("%.3f;%.6E", 0.001*float64(i), val(i)*1e-6), ".", ",")
		})), opts, want{values: scaled(v, 1e-6), interval: 0.001, intervalTol: 1e-9, colIndex: 2}},
		{"tab with spaces in names", []byte("Time (s)\tDrain current (uA)\n" + rows(n, func(i int) string { return fmt.Sprintf("%g\t%g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "Drain current", unit: "uA", timeUnit: "s", colIndex: 2}},
		{"tab decimal comma", []byte(rows(n, func(i int) string { return strings.ReplaceAll(fmt.Sprintf("%g\t%g", tt(i), val(i)), ".", ",") })), opts,
			want{values: v, interval: 0.25, colIndex: 2}},
		{"whitespace aligned", []byte("  t       value\n" + rows(n, func(i int) string { return fmt.Sprintf("  %-8g  %8g  ", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "value", colIndex: 2, firstLine: 2}},
		{"hash comments", []byte("# a\n  # b\n" + rows(n, func(i int) string { return fmt.Sprint(val(i)) }) + "# trailing\n"), opts,
			want{values: v, colIndex: 1, firstLine: 3, noWarnings: true}},
		{"percent comments", []byte("% MATLAB\n" + rows(n, func(i int) string { return fmt.Sprint(val(i)) }) + "% end\n"), opts,
			want{values: v, colIndex: 1, firstLine: 2}},
		{"semicolon comments in comma file", []byte("; ini-style\n" + rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) }) + "; end\n"), opts,
			want{values: v, interval: 0.25, colIndex: 2, firstLine: 2}},
		{"slash comments", []byte("// c-style\n" + rows(n, func(i int) string { return fmt.Sprint(val(i)) }) + "// end\n"), opts,
			want{values: v, colIndex: 1, firstLine: 2}},
		{"comments and blanks inside table", []byte("x\n" + rows(n, func(i int) string {
			if i == 7 {
				return "# pause\n\n" + fmt.Sprint(val(i))
			}
			return fmt.Sprint(val(i))
		})), opts, want{values: v, column: "x", colIndex: 1, firstLine: 2}},
		{"preamble with delimiters", []byte("Instrument: Synthetic 9000\nDate,2026-01-01\nSamples,20\nOperator,A, B\n\nTime,Id\n" +
			rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "Id", colIndex: 2, firstLine: 7, noWarnings: true}},
		{"preamble without header", []byte("Date,2026-01-01\nNote: no header\n" +
			rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, colIndex: 2, firstLine: 3}},
		{"numeric preamble skipped with warning", []byte("20\n0.25\n" +
			rows(n, func(i int) string { return fmt.Sprintf("%g %g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, colIndex: 2, firstLine: 3, warnings: []string{"ignored 2 numeric line(s) before the table (lines 1–2)"}}},
		{"uneven time column", []byte(rows(n, func(i int) string {
			ti := tt(i)
			if i >= 10 {
				ti += 0.25 // one sample missing
			}
			return fmt.Sprintf("%g,%g", ti, val(i))
		})), opts, want{values: v, interval: 0.25, uneven: true, colIndex: 2, warnings: []string{"steps range from 0.25 to 0.5"}}},
		{"printed rounding is not unevenness", []byte(rows(n, func(i int) string {
			// Step 1/3 printed as "1.000333e+03": the last digit is 1e-3,
			// so printed steps are 0.333 or 0.334, a spread of 3e-3·Δ,
			// above UnevenTolerance; the rounding allowance must keep this
			// even. Interval = (t_last − t_0)/(n−1) is then off by at most
			// 1e-3/19 ≈ 5.3e-5 absolute = 1.6e-4 relative.
			return fmt.Sprintf("%.6e,%g", 1e3+float64(i)/3, val(i))
		})), opts, want{values: v, interval: 1.0 / 3, intervalTol: 1.6e-4, colIndex: 2, noWarnings: true}},
		{"index column", []byte("Sample,Id\n" + rows(n, func(i int) string { return fmt.Sprintf("%d,%g", i, val(i)) })), opts,
			want{values: v, colIndex: 2, column: "Id", noWarnings: true}},
		{"three columns warns", []byte("t,Id,Ig\n" + rows(n, func(i int) string { return fmt.Sprintf("%g,%g,7", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, colIndex: 2, column: "Id", columns: 3, warnings: []string{`using column 2 ("Id") of 2 value columns`}}},
		{"column by name", []byte("t,Id,Ig\n" + rows(n, func(i int) string { return fmt.Sprintf("%g,7,%g", tt(i), val(i)) })), Options{MinLength: n, Column: "Ig"},
			want{values: v, interval: 0.25, colIndex: 3, column: "Ig", noWarnings: true}},
		{"column by name without unit, any case", []byte("t (s),Id (A),Ig (A)\n" + rows(n, func(i int) string { return fmt.Sprintf("%g,7,%g", tt(i), val(i)) })), Options{MinLength: n, Column: "ig"},
			want{values: v, interval: 0.25, colIndex: 3, column: "Ig", unit: "A", timeUnit: "s"}},
		{"column by full header", []byte("t,Id/A,Ig/A\n" + rows(n, func(i int) string { return fmt.Sprintf("%g,%g,7", tt(i), val(i)) })), Options{MinLength: n, Column: "Id/A"},
			want{values: v, interval: 0.25, colIndex: 2, column: "Id", unit: "A"}},
		{"column by 1-based index", []byte(rows(n, func(i int) string { return fmt.Sprintf("%g,7,%g", tt(i), val(i)) })), Options{MinLength: n, Column: "3"},
			want{values: v, interval: 0.25, colIndex: 3}},
		{"column 1 explicitly means no time axis", []byte(rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) })), Options{MinLength: n, Column: "1"},
			want{values: func() []float64 {
				x := make([]float64, n)
				for i := range x {
					x[i] = tt(i)
				}
				return x
			}(), colIndex: 1}},
		{"underscore is part of the name", []byte("t,Id_A\n" + rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "Id_A", colIndex: 2}},
		{"quoted fields", []byte("\"Time (s)\",\"Id, drain (A)\"\n" + rows(n, func(i int) string { return fmt.Sprintf("\"%g\",\"%g\"", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "Id, drain", unit: "A", colIndex: 2}},
		{"quoted whitespace header", []byte("\"Time (s)\" \"Id (A)\"\n" + rows(n, func(i int) string { return fmt.Sprintf("%g \"%g\"", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "Id", unit: "A", colIndex: 2}},
		{"CRLF", []byte(strings.ReplaceAll("t,x\n"+rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) }), "\n", "\r\n")), opts,
			want{values: v, interval: 0.25, column: "x", colIndex: 2}},
		{"lone CR", []byte(strings.ReplaceAll("t,x\n"+rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) }), "\n", "\r")), opts,
			want{values: v, interval: 0.25, column: "x", colIndex: 2, firstLine: 2}},
		{"UTF-8 BOM", []byte("\xef\xbb\xbfTime,x\n" + rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "x", colIndex: 2}},
		{"UTF-16LE with BOM", utf16LE("Time\tId (µA)\r\n" + strings.ReplaceAll(rows(n, func(i int) string { return fmt.Sprintf("%g\t%g", tt(i), val(i)) }), "\n", "\r\n")), opts,
			want{values: v, interval: 0.25, column: "Id", unit: "µA", colIndex: 2}},
		{"Latin-1 header", []byte("t;I (\xb5A)\n" + rows(n, func(i int) string { return fmt.Sprintf("%g;%g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "I", unit: "µA", colIndex: 2}},
		{"trailing delimiter", []byte("t;x;\n" + rows(n, func(i int) string { return fmt.Sprintf("%g;%g;", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "x", colIndex: 2, columns: 2, noWarnings: true}},
		{"footer ignored", []byte("x\n" + rows(n, func(i int) string { return fmt.Sprint(val(i)) }) + "END OF DATA\nTotal: 20\n"), opts,
			want{values: v, colIndex: 1, warnings: []string{"ignored the text lines from line 22"}}},
		{"gzip by magic bytes", gz(t, "t,x\n"+rows(n, func(i int) string { return fmt.Sprintf("%g,%g", tt(i), val(i)) })), opts,
			want{values: v, interval: 0.25, column: "x", colIndex: 2}},
		{"raw f32le", rawF32(v), Options{MinLength: n, Format: FormatF32LE},
			want{values: v, colIndex: 1, columns: 1}},
		{"raw f64le", rawF64(v), Options{MinLength: n, Format: "F64LE"},
			want{values: v, colIndex: 1, columns: 1}},
		{"raw f64le gzip", gz(t, string(rawF64(v))), Options{MinLength: n, Format: FormatF64LE},
			want{values: v, colIndex: 1}},
		{"NaN dropped", []byte(rows(n+2, func(i int) string {
			switch i {
			case 3:
				return "3,NaN"
			case 9:
				return "9,"
			}
			j := i
			if i > 3 {
				j--
			}
			if i > 9 {
				j--
			}
			return fmt.Sprintf("%d,%g", i, val(j))
		})), Options{MinLength: n, NaN: NaNDrop},
			want{values: v, interval: 1, uneven: true, colIndex: 2, nonFinite: 2, warnings: []string{"dropped 2 non-finite or missing value(s), the first at line 4"}}},
		{"NaN interpolated", []byte("x\nNA\n1\ninf\n-Inf\n4\nnull\n" + rows(n-6, func(i int) string { return fmt.Sprint(val(i)) }) + "nan\n"), Options{MinLength: n, NaN: NaNInterpolate},
			// linear in the index between finite neighbours; ends take the
			// nearest finite value (definition of NaNInterpolate)
			want{values: append([]float64{1, 1, 2, 3, 4, 4 + (val(0)-4)/2}, append(vals(n-6), val(n-7))...), colIndex: 1, nonFinite: 5,
				warnings: []string{"interpolated 5 non-finite or missing value(s), the first at line 2"}}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			tr, err := Read(bytes.NewReader(c.in), c.opts)
			if err != nil {
				t.Fatalf("Read: %v", err)
			}
			check(t, tr, c.want)
		})
	}
}

func scaled(x []float64, a float64) []float64 {
	y := make([]float64, len(x))
	for i, v := range x {
		y[i] = v * a
	}
	return y
}

func check(t *testing.T, tr Trace, w want) {
	t.Helper()
	if len(tr.Values) != len(w.values) {
		t.Fatalf("got %d values %v, want %d %v", len(tr.Values), tr.Values, len(w.values), w.values)
	}
	for i := range w.values {
		// Exact: decimal text of these values parses to the same float64
		// (strconv round-trip); decimal-comma/exponent cases compare the
		// parse of the same digits.
		if tr.Values[i] != w.values[i] && math.Abs(tr.Values[i]-w.values[i]) > 1e-15*math.Abs(w.values[i]) {
			t.Fatalf("value %d = %v, want %v", i, tr.Values[i], w.values[i])
		}
	}
	if w.intervalTol == 0 {
		if tr.Interval != w.interval {
			t.Errorf("Interval = %v, want %v", tr.Interval, w.interval)
		}
	} else if math.Abs(tr.Interval-w.interval) > w.intervalTol*w.interval {
		t.Errorf("Interval = %v, want %v ± %g rel", tr.Interval, w.interval, w.intervalTol)
	}
	if tr.Uneven != w.uneven {
		t.Errorf("Uneven = %v, want %v (warnings %q)", tr.Uneven, w.uneven, tr.Warnings)
	}
	if w.interval != 0 && w.timeCol == 0 {
		w.timeCol = 1
	}
	if tr.TimeColumn != w.timeCol {
		t.Errorf("TimeColumn = %d, want %d", tr.TimeColumn, w.timeCol)
	}
	if tr.ColumnIndex != w.colIndex {
		t.Errorf("ColumnIndex = %d, want %d", tr.ColumnIndex, w.colIndex)
	}
	for _, f := range []struct{ name, got, want string }{
		{"Column", tr.Column, w.column}, {"Unit", tr.Unit, w.unit}, {"TimeUnit", tr.TimeUnit, w.timeUnit},
	} {
		if f.want != "" && f.got != f.want {
			t.Errorf("%s = %q, want %q", f.name, f.got, f.want)
		}
	}
	if w.columns != 0 && tr.Columns != w.columns {
		t.Errorf("Columns = %d, want %d", tr.Columns, w.columns)
	}
	if w.firstLine != 0 && tr.FirstLine != w.firstLine {
		t.Errorf("FirstLine = %d, want %d", tr.FirstLine, w.firstLine)
	}
	if tr.NonFinite != w.nonFinite {
		t.Errorf("NonFinite = %d, want %d", tr.NonFinite, w.nonFinite)
	}
	for _, s := range w.warnings {
		if !slices.ContainsFunc(tr.Warnings, func(x string) bool { return strings.Contains(x, s) }) {
			t.Errorf("no warning contains %q; warnings: %q", s, tr.Warnings)
		}
	}
	if w.noWarnings && len(tr.Warnings) > 0 {
		t.Errorf("unexpected warnings %q", tr.Warnings)
	}
}

// TestReadFixtures reads the committed example files in testdata/trace.
func TestReadFixtures(t *testing.T) {
	dir := filepath.Join("..", "testdata", "trace")
	logistic := make([]float64, 300)
	x := 0.3
	for i := range logistic { // the generator of the fixtures: logistic map r = 4 from 0.3
		x = 4 * x * (1 - x)
		logistic[i] = x
	}
	t.Run("oscilloscope export with preamble", func(t *testing.T) {
		tr, err := ReadFile(filepath.Join(dir, "scope_preamble.csv"), Options{})
		if err != nil {
			t.Fatal(err)
		}
		// Stamps printed as %.6e with step 1e-8: the resolution term
		// (1e-13 .. 1e-14) keeps the rounding from counting as uneven.
		want := want{values: scaled(logistic, 0), interval: 1e-8, intervalTol: 1e-6, column: "CH1", unit: "A",
			colIndex: 2, columns: 2, firstLine: 11, noWarnings: true}
		for i, v := range logistic {
			want.values[i], _ = parseFloat(fmt.Appendf(nil, "%.6e", 1e-6*(1+0.1*v)))
		}
		check(t, tr, want)
		if tr.Source != filepath.Join(dir, "scope_preamble.csv") {
			t.Errorf("Source = %q", tr.Source)
		}
	})
	t.Run("semicolon decimal comma with BOM", func(t *testing.T) {
		tr, err := ReadFile(filepath.Join(dir, "semicolon_decimal_comma.csv"), Options{})
		if err != nil {
			t.Fatal(err)
		}
		w := want{values: make([]float64, 300), interval: 0.001, intervalTol: 1e-9, column: "Id", unit: "A", timeUnit: "s",
			colIndex: 2, columns: 3, firstLine: 5, warnings: []string{`using column 2 ("Id [A]") of 2 value columns`}}
		for i, v := range logistic {
			w.values[i], _ = parseFloat(fmt.Appendf(nil, "%.4E", 1e-6*(1+0.1*v)))
		}
		check(t, tr, w)
	})
	t.Run("gzip whitespace with comments", func(t *testing.T) {
		tr, err := ReadFile(filepath.Join(dir, "logistic.txt.gz"), Options{})
		if err != nil {
			t.Fatal(err)
		}
		// %.17g round-trips float64 exactly (IEEE 754: 17 significant
		// digits suffice), so the values equal the generator's.
		check(t, tr, want{values: logistic, interval: 1, column: "value", colIndex: 2, firstLine: 4, noWarnings: true})
	})
}

func TestReadFileStdinAndErrors(t *testing.T) {
	in := "x\n" + rows(300, func(i int) string { return fmt.Sprint(val(i)) })
	f, err := os.CreateTemp(t.TempDir(), "stdin")
	if err != nil {
		t.Fatal(err)
	}
	f.WriteString(in)
	f.Seek(0, 0)
	old := os.Stdin
	os.Stdin = f
	defer func() { os.Stdin = old }()
	tr, err := ReadFile("-", Options{})
	if err != nil {
		t.Fatal(err)
	}
	if tr.Source != "stdin" || len(tr.Values) != 300 || tr.Column != "x" {
		t.Errorf("got Source %q, %d values, column %q", tr.Source, len(tr.Values), tr.Column)
	}
	// A missing file is an *Error naming the path.
	_, err = ReadFile(filepath.Join(t.TempDir(), "nope.csv"), Options{})
	if e, ok := err.(*Error); !ok || !os.IsNotExist(e.Err) || !strings.Contains(err.Error(), "nope.csv") {
		t.Errorf("missing file: %v", err)
	}
	// A .gz name over plain text is read, with a warning.
	p := filepath.Join(t.TempDir(), "plain.csv.gz")
	os.WriteFile(p, []byte(in), 0o644)
	tr, err = ReadFile(p, Options{})
	if err != nil || len(tr.Values) != 300 || len(tr.Warnings) != 1 || !strings.Contains(tr.Warnings[0], ".gz") {
		t.Errorf("plain .gz: %v, %q", err, tr.Warnings)
	}
}

// TestReadLongLine checks that lines well beyond the scanner's initial
// 64 KiB buffer are read (many columns).
func TestReadLongLine(t *testing.T) {
	head := strings.Repeat("1.0000000000,", 20000) // 260 kB of extra columns
	in := rows(20, func(i int) string { return fmt.Sprintf("%d,%s%g", i, head, val(i)) })
	tr, err := Read(strings.NewReader(in), Options{Column: "20002", MinLength: 20})
	if err != nil {
		t.Fatal(err)
	}
	check(t, tr, want{values: vals(20), interval: 1, colIndex: 20002, columns: 20002})
}
