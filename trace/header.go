package trace

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// headerName turns a raw header field into readable text: "" escapes are
// undone and bytes that are not valid UTF-8 are read as Latin-1 (so "µA"
// written by an old Windows export survives).
func headerName(b []byte) string {
	s := string(b)
	if strings.Contains(s, `""`) {
		s = strings.ReplaceAll(s, `""`, `"`)
	}
	if !utf8.ValidString(s) {
		r := make([]rune, 0, len(s))
		for i := 0; i < len(s); i++ {
			r = append(r, rune(s[i]))
		}
		s = string(r)
	}
	return strings.TrimSpace(s)
}

// splitUnit separates a header into name and unit:
//
//	"Id (A)" and "Id [A]" → "Id", "A"  (unit in trailing brackets)
//	"Id/A"                → "Id", "A"  (unit after the last '/', when it is
//	                                    one short word without spaces)
//	anything else         → the whole text, ""  ("Id_A" is just a name)
func splitUnit(h string) (name, unit string) {
	h = strings.TrimSpace(h)
	for _, p := range [...]struct{ open, close byte }{{'(', ')'}, {'[', ']'}} {
		if strings.HasSuffix(h, string(p.close)) {
			if k := strings.LastIndexByte(h, p.open); k > 0 {
				name = strings.TrimSpace(h[:k])
				unit = strings.TrimSpace(h[k+1 : len(h)-1])
				if name != "" {
					return name, unit
				}
			}
		}
	}
	if k := strings.LastIndexByte(h, '/'); k > 0 && k < len(h)-1 {
		u := strings.TrimSpace(h[k+1:])
		n := strings.TrimSpace(h[:k])
		if n != "" && u != "" && utf8.RuneCountInString(u) <= 8 && !strings.ContainsAny(u, " \t/") {
			return n, u
		}
	}
	return h, ""
}

// words lower-cases a name and splits it at everything that is not a
// letter or digit: "Time_s" → ["time", "s"].
func words(name string) []string {
	return strings.FieldsFunc(strings.ToLower(name), func(r rune) bool {
		return !unicode.IsLetter(r) && !unicode.IsDigit(r)
	})
}

// timeWords are first words of a header that names a time axis.
var timeWords = map[string]bool{
	"t": true, "time": true, "times": true, "timestamp": true, "elapsed": true,
	"s": true, "sec": true, "secs": true, "second": true, "seconds": true,
	"ms": true, "us": true, "µs": true, "μs": true, "ns": true, "ps": true,
	"zeit": true, "temps": true, "tiempo": true, "tempo": true,
}

// timeUnits are units that mark a time axis.
var timeUnits = map[string]bool{
	"s": true, "sec": true, "ms": true, "us": true, "µs": true, "μs": true,
	"ns": true, "ps": true, "min": true, "h": true,
}

// isTimeUnit reports whether a header unit is a unit of time.
func isTimeUnit(u string) bool { return timeUnits[strings.ToLower(strings.TrimSpace(u))] }

// indexWords are first words of a header that names a sample counter.
var indexWords = map[string]bool{
	"index": true, "idx": true, "sample": true, "samples": true, "n": true,
	"no": true, "nr": true, "num": true, "number": true, "point": true,
	"points": true, "pt": true, "i": true, "k": true, "step": true,
	"iteration": true, "iter": true, "count": true, "sequence": true, "seq": true,
}

// isTimeName reports whether a header (name without unit) names a time
// axis: its first word is one of t, time, times, timestamp, elapsed, s,
// sec, secs, second, seconds, ms, us, µs, ns, ps (or time in German,
// French, Spanish, Italian), or any word is "time".
func isTimeName(name string) bool {
	w := words(name)
	if len(w) == 0 {
		return false
	}
	if timeWords[w[0]] {
		return true
	}
	for _, x := range w {
		if x == "time" {
			return true
		}
	}
	return false
}

// isIndexName reports whether a header names a sample counter: "#" or a
// first word among index, idx, sample(s), n, no, nr, num, number,
// point(s), pt, i, k, step, iteration, iter, count, sequence, seq.
func isIndexName(name string) bool {
	if strings.TrimSpace(name) == "#" {
		return true
	}
	w := words(name)
	return len(w) > 0 && indexWords[w[0]]
}
