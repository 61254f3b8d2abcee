package trace

import (
	"bytes"
	"compress/gzip"
	"errors"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// FuzzRead checks that Read never panics and that whatever it accepts is
// a valid trace: finite, non-constant values, at least MinLength of them,
// a sane interval and column numbers, and that every error is an *Error
// with a one-line message.
func FuzzRead(f *testing.F) {
	// The fixtures, cut to their first 512 bytes (preamble, header and some
	// rows) so that the fuzzer's minimisation of them stays quick; the
	// gzip fixture is re-compressed from its first 512 bytes.
	files, _ := filepath.Glob(filepath.Join("..", "testdata", "trace", "*"))
	for _, p := range files {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		if zr, err := gzip.NewReader(bytes.NewReader(b)); err == nil {
			plain, _ := io.ReadAll(io.LimitReader(zr, 512))
			f.Add(gz(f, string(plain)), uint8(0))
			continue
		}
		f.Add(b[:min(len(b), 512)], uint8(0))
		f.Add(b[:min(len(b), 512)], uint8(4))
	}
	for _, s := range []string{
		"t,x\n0,1\n1,2\n2,3\n3,1\n",
		"Date,2026-01-01\nTime;Id\n0,1;2,5\n0,2;2,75\n0,3;NaN\n0,4;1\n",
		"# c\n\"a\" \"b\"\n1 2\n2 NA\n3 4\n4 5\nEND\n",
		"x\r\n1\r\n2\r\n\r\n3\r\n",
		"\xef\xbb\xbfTime (s)\tI (\xb5A)\n1\t1,5\n2\t2,5\n3\t1,5\n",
		";h;v;\n1;2;\n3;4;\n5;6;\n",
		"1,2,3\n4,5\n6,7,8\n",
		"t,x\n0,1\n1,2\n2;3\n3,1\n4 5\n5\t6\n",       // delimiter changes
		"t;x;\n0;1,5;\n1;2,5;\n2,3,\n3;1;\n",         // trailing delimiters
		"t\x00,\x00x\x00\n\x000\x00,\x001\x00\n\x00", // UTF-16LE without byte-order mark
		"\x01\x02\x03\x04\x05\n1\n2\n",
		"1\n2\n\xc2",
	} {
		for mode := range uint8(12) {
			f.Add([]byte(s), mode)
		}
	}
	f.Add(rawF32([]float64{1, 2, math.NaN(), 4}), uint8(2+4))
	f.Add(rawF64([]float64{1, 2, 3, math.Inf(1)}), uint8(3+8))
	f.Add(gz(f, "1\n2\n3\n"), uint8(0))
	f.Add(make([]byte, 5000), uint8(0))                                      // all NUL
	f.Add(rawF32(noNUL(1100)), uint8(0))                                     // raw samples read as text
	f.Add([]byte(strings.Repeat("# a comment\n", 400)+"1\x002\n"), uint8(0)) // NUL after the first block
	f.Fuzz(func(t *testing.T, data []byte, mode uint8) {
		formats := [...]Format{FormatAuto, FormatCSV, FormatF32LE, FormatF64LE}
		policies := [...]NaNPolicy{NaNReject, NaNDrop, NaNInterpolate}
		columns := [...]string{"", "2", "x", "1"}
		opts := Options{
			Format:    formats[mode%4],
			NaN:       policies[(mode/4)%3],
			Column:    columns[(mode/12)%4],
			MinLength: 2,
			Name:      "fuzz",
		}
		tr, err := Read(bytes.NewReader(data), opts)
		checkRead(t, tr, err, opts)
	})
}

// checkRead fails t unless err is an *Error with a one-line message, or
// tr is a valid trace: finite, non-constant values, at least MinLength of
// them, a sane interval and column numbers.
func checkRead(t *testing.T, tr Trace, err error, opts Options) {
	t.Helper()
	if err != nil {
		var e *Error
		if !errors.As(err, &e) {
			t.Fatalf("error %v (%T) is not an *Error", err, err)
		}
		if bytes.ContainsAny([]byte(err.Error()), "\n\r") {
			t.Fatalf("multi-line message %q", err)
		}
		return
	}
	if len(tr.Values) < opts.MinLength {
		t.Fatalf("%d values < MinLength %d", len(tr.Values), opts.MinLength)
	}
	constant := true
	for _, v := range tr.Values {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("non-finite value %v accepted", v)
		}
		constant = constant && v == tr.Values[0]
	}
	if constant {
		t.Fatalf("constant series accepted")
	}
	if tr.Interval < 0 || math.IsNaN(tr.Interval) || math.IsInf(tr.Interval, 0) {
		t.Fatalf("Interval = %v", tr.Interval)
	}
	if tr.Format == FormatCSV && (tr.Interval > 0) != (tr.TimeColumn == 1) {
		t.Fatalf("Interval %v with TimeColumn %d", tr.Interval, tr.TimeColumn)
	}
	if tr.ColumnIndex < 1 || tr.ColumnIndex > tr.Columns || tr.ColumnIndex == tr.TimeColumn {
		t.Fatalf("ColumnIndex %d of %d (time %d)", tr.ColumnIndex, tr.Columns, tr.TimeColumn)
	}
}
