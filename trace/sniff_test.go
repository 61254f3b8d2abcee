package trace

import (
	"bytes"
	"errors"
	"io"
	"strings"
	"testing"
	"testing/iotest"
)

func TestBinaryDetail(t *testing.T) {
	latin1 := "Zeit (s);Strom (\xb5A)\n" + strings.Repeat("0,001;1,5\n", 100) // µ in ISO 8859-1
	cases := []struct {
		name  string
		block string
		final bool
		want  string // "" for text
	}{
		{"plain text", "t,x\n0,1.5\n1,2.5\n", true, ""},
		{"Latin-1 header", latin1, true, ""},
		{"control characters of text", "t\tx\r\n0\t1\v\f\n\x1a", true, ""},
		{"one odd byte in a tiny file", "1\xff\n", true, ""},
		// 3 non-text bytes of 4: the share is high but the count below
		// binaryMin.
		{"three odd bytes", "\x01\x02\x03\n", true, ""},
		{"four odd bytes", "\x01\x02\x03\x04\n", true, rawHint},
		{"one NUL", "t,x\n0,1\x00\n", true, rawHint},
		// 30 of 100 bytes non-text is not more than binaryShare; 31 is.
		{"share at the limit", strings.Repeat("\x01", 30) + strings.Repeat("1", 70), true, ""},
		{"share above the limit", strings.Repeat("\x01", 31) + strings.Repeat("1", 69), true, rawHint},
		{"invalid UTF-8 counts", strings.Repeat("\xff", 31) + strings.Repeat("1", 69), true, rawHint},
		// "µ" is C2 B5; a block that ends after C2 is cut, not invalid.
		{"character cut by the block end", strings.Repeat("\xc2\xb5", 3) + "\xc2", false, ""},
		{"incomplete character at the end", "\x01\x01\x01\xc2", true, rawHint},
		{"incomplete character at the block end", "\x01\x01\x01\xc2", false, ""},
		{"UTF-16LE", "t\x00,\x00x\x00\n\x001\x00,\x002\x00\n\x00", true, utf16Hint},
		{"UTF-16BE", "\x00t\x00,\x00x\x00\n\x001\x00,\x002\x00\n", true, utf16Hint},
		{"16-bit integers", "\x05\x00\x06\x00\x07\x00\x08\x00", true, rawHint},
		{"all NUL", strings.Repeat("\x00", 64), true, rawHint},
	}
	for _, c := range cases {
		if got := binaryDetail([]byte(c.block), c.final); got != c.want {
			t.Errorf("%s: %q, want %q", c.name, got, c.want)
		}
	}
}

// TestSniffKeepsStream: the bytes read to look at the first block reach the
// parser, and an error met while reading that block is reported by the
// line reader where it occurs (not lost, not reported before the lines
// that came first).
func TestSniffKeepsStream(t *testing.T) {
	text := "t,x\n" + rows(2000, tv) // several blocks
	tr, err := Read(strings.NewReader(text), Options{Name: "demo.csv"})
	if err != nil || len(tr.Values) != 2000 || tr.Values[1999] != val(1999) {
		t.Fatalf("read %d values, err %v", len(tr.Values), err)
	}
	boom := errors.New("device unplugged")
	r := io.MultiReader(strings.NewReader("t,x\n0,1\n1,2\n"), iotest.ErrReader(boom))
	_, err = Read(r, Options{Name: "demo.csv"})
	var e *Error
	if !errors.Is(err, boom) || !errors.As(err, &e) || e.Line != 4 {
		t.Fatalf("err %v, want %v at line 4", err, boom)
	}
	if got, want := err.Error(), "demo.csv line 4: device unplugged"; got != want {
		t.Fatalf("message %q, want %q", got, want)
	}
}

// TestCounts: the too-short and too-large errors carry their numbers, so a
// caller can tell how short and phrase its own advice.
func TestCounts(t *testing.T) {
	cases := []struct {
		name         string
		in           []byte
		opts         Options
		err          error
		count, limit int
	}{
		{"text", []byte(rows(120, tv)), Options{}, ErrTooShort, 120, DefaultMinLength},
		{"after dropping", []byte(replaceRow(10, 3, "3,")), Options{MinLength: 10, NaN: NaNDrop}, ErrTooShort, 9, 10},
		{"raw", rawF64(vals(100)), Options{Format: FormatF64LE, MinLength: 101}, ErrTooShort, 100, 101},
		{"text too large", []byte(rows(300, tv)), Options{MaxSamples: 100}, ErrTooLarge, 101, 100},
		{"raw too large", rawF32(vals(300)), Options{Format: FormatF32LE, MaxSamples: 100}, ErrTooLarge, 300, 100},
	}
	for _, c := range cases {
		_, err := Read(bytes.NewReader(c.in), c.opts)
		var e *Error
		if !errors.Is(err, c.err) || !errors.As(err, &e) {
			t.Fatalf("%s: err %v, want %v", c.name, err, c.err)
		}
		if e.Count != c.count || e.Limit != c.limit {
			t.Errorf("%s: Count %d, Limit %d; want %d, %d (%v)", c.name, e.Count, e.Limit, c.count, c.limit, err)
		}
	}
	// Other errors leave both at 0.
	_, err := Read(strings.NewReader("t,x\n"+replaceRow(300, 15, "15,x")), Options{})
	var e *Error
	if !errors.As(err, &e) || e.Count != 0 || e.Limit != 0 {
		t.Fatalf("err %v: Count %d, Limit %d", err, e.Count, e.Limit)
	}
}
