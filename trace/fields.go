package trace

import (
	"bytes"
	"math"
	"strconv"
)

// wsDelim stands for "any run of spaces and tabs" as a delimiter.
const wsDelim = ' '

// tokenClass sorts a field into what it can mean.
type tokenClass uint8

const (
	tokText    tokenClass = iota // not a number
	tokNumber                    // parses as a float (possibly NaN or ±Inf)
	tokMissing                   // empty, NA, N/A, null: a missing value
)

func isBlank(c byte) bool { return c == ' ' || c == '\t' }

// trimBlank strips spaces and tabs at both ends.
func trimBlank(b []byte) []byte {
	i, j := 0, len(b)
	for i < j && isBlank(b[i]) {
		i++
	}
	for j > i && isBlank(b[j-1]) {
		j--
	}
	return b[i:j]
}

// closeQuote returns the index of the quote that closes a quoted field
// whose content starts at i ("" inside is an escaped quote), or len(b)
// when the quote is never closed.
func closeQuote(b []byte, i int) int {
	for {
		k := bytes.IndexByte(b[i:], '"')
		if k < 0 {
			return len(b)
		}
		i += k
		if i+1 < len(b) && b[i+1] == '"' {
			i += 2
			continue
		}
		return i
	}
}

// splitFields appends the fields of line separated by delim (',', ';',
// '\t' or wsDelim) to dst[:0] and returns it. Fields are sub-slices of
// line (no copy). Spaces (and, except for tab-delimited lines, tabs)
// around a field are trimmed. A field that starts with a double quote runs
// to the closing quote and loses the quotes; escaped "" pairs stay as they
// are (numbers never contain them; header names are unescaped later).
// Text after a closing quote makes the field keep its raw form, so it will
// not parse as a number.
func splitFields(line []byte, delim byte, dst [][]byte) [][]byte {
	dst = dst[:0]
	n := len(line)
	if delim == wsDelim {
		i := 0
		for {
			for i < n && isBlank(line[i]) {
				i++
			}
			if i >= n {
				return dst
			}
			if line[i] == '"' {
				j := closeQuote(line, i+1)
				if j+1 >= n || isBlank(line[j+1]) {
					dst = append(dst, line[i+1:j])
					i = j + 1
					continue
				}
			}
			j := i
			for j < n && !isBlank(line[j]) {
				j++
			}
			dst = append(dst, line[i:j])
			i = j
		}
	}
	start := 0
	for {
		i := start
		for i < n && (line[i] == ' ' || (line[i] == '\t' && delim != '\t')) {
			i++
		}
		if i < n && line[i] == '"' {
			j := closeQuote(line, i+1)
			k := j + 1
			for k < n && (line[k] == ' ' || (line[k] == '\t' && delim != '\t')) {
				k++
			}
			if k >= n || line[k] == delim {
				dst = append(dst, line[i+1:min(j, n)])
				if k >= n {
					return dst
				}
				start = k + 1
				continue
			}
			// Junk after the closing quote: fall through and keep the raw
			// text up to the next delimiter after the quote.
			e := bytes.IndexByte(line[j+1:], delim)
			if e < 0 {
				dst = append(dst, trimBlank(line[start:]))
				return dst
			}
			dst = append(dst, trimBlank(line[start:j+1+e]))
			start = j + 1 + e + 1
			continue
		}
		k := bytes.IndexByte(line[start:], delim)
		if k < 0 {
			dst = append(dst, trimBlank(line[start:]))
			return dst
		}
		dst = append(dst, trimBlank(line[start:start+k]))
		start += k + 1
	}
}

// isMissing reports whether a field marks a missing value: empty, NA, N/A
// or null (any case).
func isMissing(b []byte) bool {
	switch len(b) {
	case 0:
		return true
	case 2:
		return (b[0]|0x20) == 'n' && (b[1]|0x20) == 'a'
	case 3:
		return (b[0]|0x20) == 'n' && b[1] == '/' && (b[2]|0x20) == 'a'
	case 4:
		return (b[0]|0x20) == 'n' && (b[1]|0x20) == 'u' && (b[2]|0x20) == 'l' && (b[3]|0x20) == 'l'
	}
	return false
}

// parseField classifies b and, for numbers, returns the value. With
// decComma a single ',' in a field without '.' is read as the decimal
// point ("1,25E-6" = 1.25e-6). A well-formed number beyond the float64
// range comes back as ±Inf (non-finite), like strconv does.
func parseField(b []byte, decComma bool) (float64, tokenClass) {
	if len(b) == 0 {
		return math.NaN(), tokMissing
	}
	// Cheap rejection of obvious words before strconv: a number starts
	// with a digit, sign or point, or is nan/inf/infinity.
	c := b[0]
	if !(c >= '0' && c <= '9' || c == '-' || c == '+' || c == '.' || c == ',' ||
		c|0x20 == 'n' || c|0x20 == 'i') {
		return 0, tokText
	}
	if decComma {
		if k := bytes.IndexByte(b, ','); k >= 0 {
			if bytes.IndexByte(b[k+1:], ',') >= 0 || bytes.IndexByte(b, '.') >= 0 || len(b) > 64 {
				return 0, tokText
			}
			var buf [64]byte
			n := copy(buf[:], b)
			buf[k] = '.'
			return parseFloat(buf[:n])
		}
	}
	return parseFloat(b)
}

func parseFloat(b []byte) (float64, tokenClass) {
	v, err := strconv.ParseFloat(string(b), 64)
	if err != nil {
		if ne, ok := err.(*strconv.NumError); ok && ne.Err == strconv.ErrRange {
			return v, tokNumber // ±Inf for overflow, 0 or subnormal for underflow
		}
		if isMissing(b) {
			return math.NaN(), tokMissing
		}
		return 0, tokText
	}
	// strconv accepts hexadecimal floats and "0x" prefixes; they are
	// numbers too, which is harmless.
	return v, tokNumber
}

// decimalResolution returns the base-10 exponent of the last printed
// digit of a number field, e.g. -3 for "0.001" and "1.000e-3"'s -6, so
// that rounding of printed time stamps can be told from real jitter. It
// returns math.MinInt16 when it cannot tell (hex floats, odd exponents).
func decimalResolution(b []byte) int16 {
	point, exp := -1, len(b)
	for i, c := range b {
		switch c {
		case '.', ',':
			point = i
		case 'e', 'E':
			exp = i
		case 'x', 'X':
			return math.MinInt16
		}
		if exp < len(b) {
			break
		}
	}
	e := 0
	if exp < len(b) {
		s := b[exp+1:]
		neg := false
		if len(s) > 0 && (s[0] == '-' || s[0] == '+') {
			neg = s[0] == '-'
			s = s[1:]
		}
		if len(s) == 0 || len(s) > 4 {
			return math.MinInt16
		}
		for _, c := range s {
			if c < '0' || c > '9' {
				return math.MinInt16
			}
			e = 10*e + int(c-'0')
		}
		if neg {
			e = -e
		}
	}
	dec := 0
	if point >= 0 {
		dec = exp - point - 1
	}
	return int16(max(e-dec, -20000))
}
