// Package echo renders file content for error messages and recognises
// binary data, so that every reader of the project quotes what it found in
// the same short, one-line way and refuses binary input with the same rule.
package echo

import (
	"bytes"
	"strconv"
	"unicode/utf8"
)

// MaxChars bounds the file content echoed in an error message, in
// characters (with the quotes when quoted), so that a message stays one
// readable line whatever the file holds.
const MaxChars = 60

// Quote quotes s with strconv.Quote; when that is longer than MaxChars
// characters, it quotes the longest prefix of whole characters whose quoted
// form fits, followed by "…".
func Quote(s string) string {
	q := strconv.Quote(s)
	if utf8.RuneCountInString(q) <= MaxChars {
		return q
	}
	w, i := 2, 0 // characters so far (the quotes), bytes of s taken
	for i < len(s) {
		_, size := utf8.DecodeRuneInString(s[i:])
		k := utf8.RuneCountInString(strconv.Quote(s[i:i+size])) - 2
		if w+k > MaxChars {
			break
		}
		w, i = w+k, i+size
	}
	return strconv.Quote(s[:i]) + "…"
}

// Clip returns s cut to its first MaxChars−1 characters and "…" when it is
// longer than MaxChars characters.
func Clip(s string) string {
	if utf8.RuneCountInString(s) <= MaxChars {
		return s
	}
	n := 0
	for i := range s {
		if n == MaxChars-1 {
			return s[:i] + "…"
		}
		n++
	}
	return s
}

// Rule of Binary: a block is binary when more than BinaryShare of its bytes,
// and at least BinaryMin of them, are not text. Text in a legacy 8-bit
// encoding has a few invalid UTF-8 bytes; raw samples about half (a
// screening rule, common practice).
const (
	BinaryShare = 0.3
	BinaryMin   = 4
)

// Binary reports whether the first block b of a file is not text: it holds
// a NUL byte, or non-text bytes (NonText control characters and bytes of
// invalid UTF-8) by the rule above. final says the file ends with b, so an
// incomplete UTF-8 sequence at its end is invalid rather than cut by the
// block's end.
func Binary(b []byte, final bool) bool {
	if bytes.IndexByte(b, 0) >= 0 {
		return true
	}
	bad := 0
	for i := 0; i < len(b); {
		c := b[i]
		if c < utf8.RuneSelf {
			if NonText(c) {
				bad++
			}
			i++
			continue
		}
		r, size := utf8.DecodeRune(b[i:])
		if r == utf8.RuneError && size == 1 {
			if !final && !utf8.FullRune(b[i:]) {
				break // a character cut by the end of the block
			}
			bad++
		}
		i += size
	}
	return bad >= BinaryMin && float64(bad) > BinaryShare*float64(len(b))
}

// NonText reports whether an ASCII byte is a control character that text
// does not hold: all but tab, line feed, vertical tab, form feed, carriage
// return and the DOS end-of-file mark ^Z.
func NonText(c byte) bool {
	switch c {
	case '\t', '\n', '\v', '\f', '\r', 0x1a:
		return false
	}
	return c < 0x20 || c == 0x7f
}
