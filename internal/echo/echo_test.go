package echo

import (
	"strings"
	"testing"
	"unicode/utf8"
)

func TestQuoteAndClip(t *testing.T) {
	long := strings.Repeat("ab\x00", 40)
	q := Quote(long)
	if utf8.RuneCountInString(q) > MaxChars+1 || !strings.HasSuffix(q, "…") || !strings.HasPrefix(q, `"ab\x00`) {
		t.Errorf("Quote(long) = %q", q)
	}
	if got := Quote("short"); got != `"short"` {
		t.Errorf("Quote(short) = %q", got)
	}
	c := Clip(strings.Repeat("é", 100))
	if utf8.RuneCountInString(c) != MaxChars || !strings.HasSuffix(c, "…") {
		t.Errorf("Clip = %q (%d characters)", c, utf8.RuneCountInString(c))
	}
	if got := Clip("x"); got != "x" {
		t.Errorf("Clip(x) = %q", got)
	}
}

func TestBinary(t *testing.T) {
	cases := []struct {
		name  string
		b     []byte
		final bool
		want  bool
	}{
		{"csv", []byte("t,value\n0,1.5\n1,2.5\n"), true, false},
		{"latin-1 text", []byte("temp\xe9rature,valeur\n1,2\n3,4\n5,6\n"), true, false},
		{"NUL", []byte("1,2\n\x003,4\n"), true, true},
		{"float64 samples", []byte{0x9a, 0x99, 0x99, 0x99, 0x99, 0x99, 0xf1, 0x3f, 0x33, 0x33, 0x33, 0x33, 0x33, 0x33, 0xf3, 0x3f}, true, true},
		{"cut character at a block end", []byte("1,2\n3,\xc3"), false, false},
	}
	for _, c := range cases {
		if got := Binary(c.b, c.final); got != c.want {
			t.Errorf("%s: Binary = %v, want %v", c.name, got, c.want)
		}
	}
}

func TestQuoteCases(t *testing.T) {
	cases := []struct{ in, want string }{
		{"1.2.3", `"1.2.3"`},
		{strings.Repeat("a", 58), `"` + strings.Repeat("a", 58) + `"`},
		{strings.Repeat("a", 59), `"` + strings.Repeat("a", 58) + `"…`},
		// Each control byte quotes to 4 characters: 14 of them fill 56 of
		// the 58 places, the 15th does not fit.
		{strings.Repeat("\x01", 400), `"` + strings.Repeat(`\x01`, 14) + `"…`},
		{"ab" + strings.Repeat("\xff", 100), `"ab` + strings.Repeat(`\xff`, 14) + `"…`},
		// Whole characters: "µ" is one character of two bytes.
		{strings.Repeat("µ", 80), `"` + strings.Repeat("µ", 58) + `"…`},
		{strings.Repeat("a", 57) + `"b`, `"` + strings.Repeat("a", 57) + `"…`},
	}
	for _, c := range cases {
		if got := Quote(c.in); got != c.want {
			t.Errorf("Quote(%.20q…)\n got %s\nwant %s", c.in, got, c.want)
		}
	}
}
