package trace

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
)

// noNUL returns n float32-exact values none of whose little-endian bytes
// is 0, as raw samples from an instrument might be.
func noNUL(n int) []float64 {
	out := make([]float64, 0, n)
	for i := 0; len(out) < n; i++ {
		v := math.Float32frombits(0x3f800001 + uint32(i)*0x01010101%0x007fffff)
		b := math.Float32bits(v)
		if b&0xff != 0 && b&0xff00 != 0 && b&0xff0000 != 0 && b>>24 != 0 {
			out = append(out, float64(v))
		}
	}
	return out
}

// semiRows renders n ';'-delimited time/value rows with decimal commas,
// except row k (0-based), which is s.
func semiRows(n, k int, s string) string {
	return rows(n, func(i int) string {
		if i == k {
			return s
		}
		return strings.ReplaceAll(fmt.Sprintf("%d;%g", i, val(i)), ".", ",")
	})
}

// header renders the names c1 … cn joined by commas.
func header(n int) string {
	names := make([]string, n)
	for i := range names {
		names[i] = fmt.Sprintf("c%d", i+1)
	}
	return strings.Join(names, ",")
}

// tv renders a time/value row with the test values.
func tv(i int) string { return fmt.Sprintf("%d,%g", i, val(i)) }

// replaceRow renders n rows with tv, except row k (0-based), which is s.
func replaceRow(n, k int, s string) string {
	return rows(n, func(i int) string {
		if i == k {
			return s
		}
		return tv(i)
	})
}

func TestReadErrors(t *testing.T) {
	const name = "demo.csv"
	gzText := gz(t, rows(3000, func(i int) string { return fmt.Sprint(val(i)) }))
	gzRaw := gz(t, string(rawF64(vals(5000))))
	cases := []struct {
		name string
		in   []byte
		opts Options
		err  error
		msg  string // the whole expected message
	}{
		{"empty", nil, Options{}, ErrEmpty,
			"demo.csv: no data: the input is empty or holds only comments and blank lines"},
		{"only comments", []byte("# a\n\n% b\n;c\n"), Options{}, ErrEmpty,
			"demo.csv: no data: the input is empty or holds only comments and blank lines"},
		{"header only", []byte("Time,Id\n"), Options{}, ErrHeaderOnly,
			`demo.csv line 1: header but no data rows: "Time,Id"`},
		{"preamble and header only", []byte("Instrument: X\nTime,Id\n# end\n"), Options{}, ErrHeaderOnly,
			`demo.csv line 2: header but no data rows: "Time,Id"`},
		{"not a number in table", []byte("Time,Id\n" + replaceRow(300, 15, "15,1.2.3")), Options{}, ErrNotNumeric,
			`demo.csv line 17, column 2 ("Id"): not a number: "1.2.3"`},
		{"not a number in time column", []byte("Time,Id\n" + replaceRow(300, 15, "1O,1.5")), Options{}, ErrNotNumeric,
			`demo.csv line 17, column 1 ("Time"): not a number: "1O"`},
		{"not a number among first rows", []byte("t,x\n" + replaceRow(300, 1, "1,x")), Options{}, ErrNotNumeric,
			`demo.csv line 3, column 2 ("x"): not a number: "x"`},
		{"no numeric line", []byte("a,b\n1.2.3,4\n"), Options{}, ErrNotNumeric,
			`demo.csv line 2, column 1: not a number: "1.2.3" (no line of the input is a row of numbers)`},
		{"binary", []byte("ab\x00\x01\n"), Options{}, ErrBinary,
			"demo.csv: looks binary (not delimited text): for raw samples use format f32le or f64le"},
		// Before the first-block check, a file of NULs without a line end
		// ran into the line length limit.
		{"all NUL", make([]byte, MaxLineBytes+1), Options{}, ErrBinary,
			"demo.csv: looks binary (not delimited text): for raw samples use format f32le or f64le"},
		{"all NUL as csv", make([]byte, 5000), Options{Format: FormatCSV}, ErrBinary,
			"demo.csv: looks binary (not delimited text): for raw samples use format f32le or f64le"},
		{"raw samples without NUL bytes", rawF32(noNUL(2000)), Options{}, ErrBinary,
			"demo.csv: looks binary (not delimited text): for raw samples use format f32le or f64le"},
		{"raw samples gzipped", gz(t, string(rawF32(noNUL(2000)))), Options{}, ErrBinary,
			"demo.csv: looks binary (not delimited text): for raw samples use format f32le or f64le"},
		{"UTF-16 without byte-order mark", utf16LE("t,x\n" + rows(300, tv))[2:], Options{}, ErrBinary,
			"demo.csv: looks binary (not delimited text): every other byte is NUL, as in UTF-16 text without a byte-order mark; save it as UTF-8"},
		{"NUL bytes after the first block", []byte(rows(80, func(i int) string { return "# " + strings.Repeat("-", 60) }) + "\x00\x01\x02\n" + rows(300, tv)), Options{}, ErrBinary,
			"demo.csv line 81: looks binary (not delimited text): NUL bytes in the line"},
		{"NaN rejected", []byte("Time,Id\n" + replaceRow(300, 15, "15,NaN")), Options{}, ErrNonFinite,
			`demo.csv line 17, column 2 ("Id"): non-finite or missing value: "NaN" (set --nan drop or --nan interpolate to accept such values)`},
		{"Inf and empty rejected", []byte("Time,Id\n" + replaceRow(300, 15, "15,-Inf") + "300,\n"), Options{}, ErrNonFinite,
			`demo.csv line 17, column 2 ("Id"): non-finite or missing value: "-Inf", 2 such values in all (set --nan drop or --nan interpolate to accept them)`},
		{"overflow rejected", []byte(replaceRow(300, 4, "4,1e999")), Options{}, ErrNonFinite,
			`demo.csv line 5, column 2: non-finite or missing value: "1e999" (set --nan drop or --nan interpolate to accept such values)`},
		{"all NaN even when dropping", []byte(rows(300, func(i int) string { return "NaN" })), Options{NaN: NaNDrop}, ErrNonFinite,
			`demo.csv line 1, column 1: non-finite or missing value: all 300 values are non-finite or missing, the first is "NaN"`},
		{"raw NaN", rawF64(append(vals(300), math.NaN())), Options{Format: FormatF64LE}, ErrNonFinite,
			`demo.csv sample 301: non-finite or missing value: NaN (set --nan drop or --nan interpolate to accept such values)`},
		{"constant", []byte("x (V)\n" + rows(300, func(int) string { return "1.5" })), Options{}, ErrConstant,
			`demo.csv column 1 ("x (V)"): constant series: all 300 values equal 1.5`},
		{"constant after dropping", []byte(rows(300, func(i int) string {
			if i == 7 {
				return "nan"
			}
			return "2"
		})), Options{NaN: NaNDrop}, ErrConstant,
			`demo.csv column 1: constant series: all 299 values equal 2`},
		{"decimal commas hint", []byte(rows(300, func(i int) string { return fmt.Sprintf("0,%03d", i%7) })), Options{}, ErrConstant,
			"demo.csv column 1: constant series: all 300 values equal 0 (if the commas are decimal commas, export with ';' or tab as the delimiter)"},
		{"too short", []byte(rows(120, func(i int) string { return fmt.Sprint(val(i)) })), Options{}, ErrTooShort,
			"demo.csv: too short: only 120 samples, at least 256 needed"},
		{"too short after dropping", []byte(replaceRow(10, 3, "3,")), Options{MinLength: 10, NaN: NaNDrop}, ErrTooShort,
			"demo.csv: too short: only 9 samples, at least 10 needed"},
		{"one row", []byte("1,2,3,4,5,6,7,8\n"), Options{}, ErrTooShort,
			"demo.csv: too short: only 1 sample, at least 256 needed (the data are one row of 8 values; put one value per line)"},
		{"raw too short", rawF32(vals(100)), Options{Format: FormatF32LE}, ErrTooShort,
			"demo.csv: too short: only 100 samples, at least 256 needed"},
		{"ragged", []byte("t,x\n" + replaceRow(300, 15, "15,1,2")), Options{}, ErrRagged,
			"demo.csv line 17: ragged row: 3 fields where the table has 2 (as from line 2)"},
		{"ragged short row", []byte("t;x\n" + strings.ReplaceAll(replaceRow(300, 200, "200"), ",", ";")), Options{}, ErrRagged,
			"demo.csv line 202: ragged row: 1 field where the table has 2 (as from line 2)"},
		{"ragged among first rows", []byte("t,x\n" + replaceRow(300, 1, "1,1,2")), Options{}, ErrRagged,
			"demo.csv line 3: ragged row: 3 fields where the table has 2 (as from line 2)"},
		{"footer followed by data", []byte("t,x\n" + replaceRow(300, 100, "Pause") + "END\n"), Options{}, ErrRagged,
			"demo.csv line 102: ragged row: 1 field where the table has 2 (as from line 2)"},
		{"delimiter changes", []byte("t,x\n" + replaceRow(300, 55, "55;1.5")), Options{}, ErrRagged,
			"demo.csv line 57: ragged row: 1 field where the table has 2 (this line seems to use ';' where the file uses ',')"},
		{"delimiter changes among first rows", []byte("t,x\n" + replaceRow(300, 1, "1;1.5")), Options{}, ErrRagged,
			"demo.csv line 3: ragged row: 1 field where the table has 2 (this line seems to use ';' where the file uses ',')"},
		{"tab in a ';' table", []byte(semiRows(300, 200, "200\t1,5")), Options{}, ErrRagged,
			"demo.csv line 201: ragged row: 1 field where the table has 2 (this line seems to use tabs where the file uses ';')"},
		{"spaces in a ',' table", []byte(replaceRow(300, 200, "200 1.5")), Options{}, ErrRagged,
			"demo.csv line 201: ragged row: 1 field where the table has 2 (this line seems to use spaces where the file uses ',')"},
		{"',' in a blank-separated table", []byte(strings.ReplaceAll(replaceRow(300, 200, "200;1.5"), ",", " ")), Options{}, ErrRagged,
			"demo.csv line 201: ragged row: 1 field where the table has 2 (this line seems to use ';' where the file uses spaces)"},
		{"trailing delimiters", []byte(rows(300, func(i int) string {
			if i == 40 {
				return "40,1.5,"
			}
			return fmt.Sprintf("%d;%g;", i, val(i))
		})), Options{}, ErrRagged,
			"demo.csv line 41: ragged row: 1 field where the table has 2 (this line seems to use ',' where the file uses ';')"},
		// With decimal commas "1,5" is one value: a short row, not a
		// comma-delimited one.
		{"decimal comma in a short row", []byte("t;x\n" + semiRows(300, 200, "1,5")), Options{}, ErrRagged,
			"demo.csv line 202: ragged row: 1 field where the table has 2 (as from line 2)"},
		{"other delimiter, other width", []byte("t,x\n" + replaceRow(300, 55, "55;1.5;2")), Options{}, ErrRagged,
			"demo.csv line 57: ragged row: 1 field where the table has 2 (as from line 2)"},
		{"long field shortened", []byte("t,x\n" + replaceRow(300, 15, "15,"+strings.Repeat("1.2.", 30))), Options{}, ErrNotNumeric,
			`demo.csv line 17, column 2 ("x"): not a number: "` + strings.Repeat("1.2.", 14) + `1."…`},
		{"long name shortened", []byte("t," + strings.Repeat("µ", 80) + "\n" + replaceRow(300, 15, "15,x")), Options{}, ErrNotNumeric,
			`demo.csv line 17, column 2 ("` + strings.Repeat("µ", 58) + `"…): not a number: "x"`},
		{"many columns listed in part", []byte(header(20) + "\n" + rows(300, func(i int) string { return strings.TrimSuffix(strings.Repeat(tv(i)+",", 10), ",") })), Options{Column: "Ig"}, ErrNoColumn,
			`demo.csv line 1: no such column: "Ig"; available: 1 "c1", 2 "c2", 3 "c3", 4 "c4", 5 "c5", 6 "c6", 7 "c7", 8 "c8", 9 "c9", 10 "c10", 11 "c11", 12 "c12" and 8 more`},
		{"too large text", []byte(rows(300, tv)), Options{MaxSamples: 100}, ErrTooLarge,
			"demo.csv line 101: too large: more than 100 samples (the MaxSamples limit)"},
		{"too large raw", rawF32(vals(300)), Options{Format: FormatF32LE, MaxSamples: 100}, ErrTooLarge,
			"demo.csv: too large: 300 or more samples, more than the MaxSamples limit 100"},
		{"raw length", append(rawF32(vals(300)), 1, 2, 3), Options{Format: FormatF32LE}, ErrTruncated,
			"demo.csv: truncated: 1203 bytes is not a whole number of 4-byte f32le samples (3 byte(s) left over)"},
		{"gzip cut in the middle", gzText[:len(gzText)/2], Options{}, ErrTruncated,
			""}, // the line depends on the compressor; checked below
		{"gzip trailer missing", gzText[:len(gzText)-4], Options{}, ErrTruncated,
			"demo.csv line 3001: truncated: the stream ends early (file cut off?)"},
		{"gzip header cut", gzText[:5], Options{}, ErrTruncated,
			"demo.csv: truncated: gzip header cut off"},
		{"raw gzip cut", gzRaw[:len(gzRaw)/2], Options{Format: FormatF64LE}, ErrTruncated,
			""},
		{"column name missing", []byte("Time (s),Id (A)\n" + rows(300, tv)), Options{Column: "Ig"}, ErrNoColumn,
			`demo.csv line 1: no such column: "Ig"; available: 1 "Time (s)", 2 "Id (A)"`},
		{"column index too big", []byte("Time (s),Id (A)\n" + rows(300, tv)), Options{Column: "5"}, ErrNoColumn,
			`demo.csv line 1: no such column: column 5; available: 1 "Time (s)", 2 "Id (A)"`},
		{"column index 0", []byte(rows(300, tv)), Options{Column: "0"}, ErrNoColumn,
			"demo.csv: no such column: column 0: columns are numbered from 1"},
		{"column name without header", []byte("# no header\n" + rows(300, tv)), Options{Column: "Id"}, ErrNoColumn,
			`demo.csv line 2: no such column: "Id": the table has 2 column(s) and no header, so choose by number 1–2`},
		{"raw has one column", rawF32(vals(300)), Options{Format: FormatF32LE, Column: "2"}, ErrNoColumn,
			`demo.csv: no such column: "2": raw f32le input has a single column 1`},
		{"line too long", append([]byte("1\n2\n"), bytes.Repeat([]byte("1"), MaxLineBytes+10)...), Options{}, ErrLineTooLong,
			"demo.csv line 3: line too long: longer than 16 MiB"},
		{"bad format", []byte("1\n"), Options{Format: "xml"}, ErrOption,
			`demo.csv: invalid option: format "xml" (want auto, csv, f32le, f64le, npy, npz, tdms or wav)`},
		{"bad NaN policy", []byte("1\n"), Options{NaN: "zero"}, ErrOption,
			`demo.csv: invalid option: NaN policy "zero" (want reject, drop or interpolate)`},
		{"negative min length", []byte("1\n"), Options{MinLength: -1}, ErrOption,
			"demo.csv: invalid option: minimum length -1 is negative"},
		{"negative max samples", []byte("1\n"), Options{MaxSamples: -1}, ErrOption,
			"demo.csv: invalid option: maximum samples -1 is negative"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			c.opts.Name = name
			tr, err := Read(bytes.NewReader(c.in), c.opts)
			if err == nil {
				t.Fatalf("no error; read %d values", len(tr.Values))
			}
			if !errors.Is(err, c.err) {
				t.Errorf("error %v is not %v", err, c.err)
			}
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("error %v (%T) is not an *Error", err, err)
			}
			if e.File != name || !strings.HasPrefix(err.Error(), name) {
				t.Errorf("error does not name the file first: %q", err)
			}
			if strings.Contains(err.Error(), "\n") {
				t.Errorf("message spans lines: %q", err)
			}
			if c.msg != "" && err.Error() != c.msg {
				t.Errorf("message\n got %s\nwant %s", err, c.msg)
			}
			if c.msg == "" && e.Line == 0 && e.Sample == 0 {
				t.Errorf("truncated stream error names no line or sample: %s", err)
			}
			// The located fields agree with the message.
			if e.Line > 0 && !strings.Contains(err.Error(), fmt.Sprintf(" line %d", e.Line)) ||
				e.Column > 0 && !strings.Contains(err.Error(), fmt.Sprintf("column %d", e.Column)) {
				t.Errorf("fields %+v disagree with message %q", *e, err)
			}
		})
	}
}
